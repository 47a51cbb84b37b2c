/**
 * Finds where JSON text stops being valid, for messages: engines word JSON.parse errors
 * differently and some give no position. A small recursive-descent scan of RFC 8259's grammar,
 * run only after JSON.parse has failed. Returns the UTF-16 offset of the first bad character
 * (the text length when the text ends too early).
 */
export function jsonErrorOffset(text: string): number {
  let p = 0
  const n = text.length
  const ws = () => { while (p < n && (text[p] === ' ' || text[p] === '\t' || text[p] === '\n' || text[p] === '\r')) p++ }
  const fail = (): never => { throw p }
  const lit = (word: string) => { if (text.startsWith(word, p)) p += word.length; else fail() }
  const str = () => {
    p++
    while (p < n && text[p] !== '"') {
      const c = text.charCodeAt(p)
      if (c < 0x20) fail()
      if (text[p] === '\\') {
        p++
        if (text[p] === 'u') { if (!/^[0-9a-fA-F]{4}$/.test(text.slice(p + 1, p + 5))) fail(); p += 5; continue }
        if (!'"\\/bfnrt'.includes(text[p] ?? 'x')) fail()
      }
      p++
    }
    if (p >= n) fail()
    p++
  }
  const num = () => {
    const m = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/.exec(text.slice(p, p + 400))
    if (!m || m[0] === '' || m[0] === '-') fail()
    p += m![0].length
  }
  const value = (depth: number): void => {
    if (depth > 512) fail()
    ws()
    const c = text[p]
    if (c === '{') {
      p++; ws()
      if (text[p] === '}') { p++; return }
      for (;;) {
        ws(); if (text[p] !== '"') fail(); str(); ws()
        if (text[p] !== ':') fail(); p++
        value(depth + 1); ws()
        if (text[p] === ',') { p++; continue }
        if (text[p] === '}') { p++; return }
        fail()
      }
    }
    if (c === '[') {
      p++; ws()
      if (text[p] === ']') { p++; return }
      for (;;) {
        value(depth + 1); ws()
        if (text[p] === ',') { p++; continue }
        if (text[p] === ']') { p++; return }
        fail()
      }
    }
    if (c === '"') return str()
    if (c === 't') return lit('true')
    if (c === 'f') return lit('false')
    if (c === 'n') return lit('null')
    if (c === '-' || (c !== undefined && c >= '0' && c <= '9')) return num()
    fail()
  }
  try {
    value(0); ws()
    return p < n ? p : -1
  } catch (at) {
    return typeof at === 'number' ? Math.min(at, n) : 0
  }
}
