/**
 * Where a CSV text may be cut into pieces that are read apart (on several cores) and give the same
 * rows, and the same messages, as one reading from the start.
 *
 * The rule: a piece ends just after a line end (LF; CR where the text has no LF at all) that lies
 * outside quotes, that is after an even number of quote characters counted from the start of the
 * rows (`from`, past the header). RFC 4180 writes a quote inside a quoted field as two quotes, so
 * the parity of all quotes before a point says whether the point is inside a quoted field, and a
 * line end inside one (which RFC 4180 allows) is never taken as a boundary. A stray quote inside an
 * unquoted field flips the parity too: the cut then moves on to a later line end, or the text stays
 * whole, which costs speed, never a different result. Each piece starts at the beginning of a line,
 * so the reader's state there (start of a record, line number) is known: `line` is the 1-based
 * line number at the piece's start, counted as the cursor counts (LF, CR LF and a lone CR each end
 * one line).
 *
 * The search: cut points are aimed at equal shares of the characters; from each aim the next line
 * end outside quotes is found by stepping from quote to quote and line end to line end with
 * indexOf (a native scan), after counting the quotes before the aim the same way. A text without
 * quotes costs one indexOf for the quotes and one per cut for the line end; the line numbers cost
 * one indexOf per line end before the last cut.
 */

const CH_LF = 10, CH_CR = 13

/** One piece of a text: characters [start, end), starting on line `line` (1-based). */
export interface TextPiece {
  readonly start: number
  readonly end: number
  readonly line: number
}

/**
 * Cuts text[from..] (starting on line `fromLine`) into at most `pieces` pieces of about equal
 * length at line ends outside quotes. Always returns at least one piece; fewer than asked when
 * the text is short or a quoted stretch swallows a cut.
 */
export function splitAtRecords(text: string, from: number, fromLine: number, pieces: number): TextPiece[] {
  const len = text.length
  const eol = text.indexOf('\n', from) >= 0 ? '\n' : '\r'
  const cuts: number[] = []
  // Quotes counted so far (all before `nextQuote`), for the parity at each aim.
  let quotes = 0
  let nextQuote = text.indexOf('"', from)
  for (let k = 1; k < pieces; k++) {
    const aim = Math.max(from + Math.floor(((len - from) * k) / pieces), cuts.length ? cuts[cuts.length - 1] : from)
    // Parity up to the aim.
    while (nextQuote >= 0 && nextQuote < aim) { quotes++; nextQuote = text.indexOf('"', nextQuote + 1) }
    // Step to the first line end at or after the aim with an even count of quotes before it.
    let p = aim, cut = -1
    for (;;) {
      const e = text.indexOf(eol, p)
      if (e < 0) break
      while (nextQuote >= 0 && nextQuote < e) { quotes++; nextQuote = text.indexOf('"', nextQuote + 1) }
      if ((quotes & 1) === 0) { cut = e + 1; break }
      p = e + 1
    }
    if (cut < 0 || cut >= len) break
    if (cuts.length === 0 || cut > cuts[cuts.length - 1]) cuts.push(cut)
  }
  const out: TextPiece[] = []
  let start = from, line = fromLine
  for (const cut of [...cuts, len]) {
    if (cut <= start) continue
    out.push({ start, end: cut, line })
    line += lineEndsIn(text, start, cut)
    start = cut
  }
  if (out.length === 0) out.push({ start: from, end: len, line: fromLine })
  return out
}

/** Line ends in text[a, b) as the cursor counts them: LF, CR LF and a lone CR each once. */
export function lineEndsIn(text: string, a: number, b: number): number {
  let n = 0
  for (let p = text.indexOf('\n', a); p >= 0 && p < b; p = text.indexOf('\n', p + 1)) n++
  for (let p = text.indexOf('\r', a); p >= 0 && p < b; p = text.indexOf('\r', p + 1)) {
    if (p + 1 >= text.length || text.charCodeAt(p + 1) !== CH_LF) n++
  }
  return n
}

/** True when text[at - 1] ends a line (or at is 0): a piece may start at `at`. */
export function startsLine(text: string, at: number): boolean {
  if (at === 0) return true
  const c = text.charCodeAt(at - 1)
  return c === CH_LF || (c === CH_CR && text.charCodeAt(at) !== CH_LF)
}
