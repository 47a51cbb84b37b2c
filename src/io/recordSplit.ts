/**
 * Where a CSV file (its bytes) may be cut into pieces that are read apart (on several cores) and give the same
 * rows, and the same messages, as one reading from the start.
 *
 * The rule: a piece ends just after a line end (LF; CR where the file has no LF at all) that lies
 * outside quotes, that is after an even number of quote characters counted from the start of the
 * rows (`from`, past the header). RFC 4180 writes a quote inside a quoted field as two quotes, so
 * the parity of all quotes before a point says whether the point is inside a quoted field, and a
 * line end inside one (which RFC 4180 allows) is never taken as a boundary. A stray quote inside an
 * unquoted field flips the parity too: the cut then moves on to a later line end, or the file stays
 * whole, which costs speed, never a different result. Each piece starts at the beginning of a line,
 * so the reader's state there (start of a record, line number) is known: `line` is the 1-based
 * line number at the piece's start, counted as the cursor counts (LF, CR LF and a lone CR each end
 * one line).
 *
 * The search: cut points are aimed at equal shares of the bytes; from each aim the next line
 * end outside quotes is found by stepping from quote to quote and line end to line end with
 * indexOf (a native scan), after counting the quotes before the aim the same way. A file without
 * quotes costs one indexOf for the quotes and one per cut for the line end; the line numbers cost
 * one indexOf per line end before the last cut.
 */

const CH_LF = 10, CH_CR = 13, CH_QUOTE = 34

/** One piece of a file: bytes [start, end), starting on line `line` (1-based). */
export interface TextPiece {
  readonly start: number
  readonly end: number
  readonly line: number
}

/**
 * Cuts bytes[from..] (starting on line `fromLine`) into at most `pieces` pieces of about equal
 * length at line ends outside quotes. Always returns at least one piece; fewer than asked when
 * the file is short or a quoted stretch swallows a cut.
 */
export function splitAtRecords(bytes: Uint8Array, from: number, fromLine: number, pieces: number): TextPiece[] {
  const out: TextPiece[] = []
  let start = from, line = fromLine
  for (const cut of [...recordCuts(bytes, from, pieces), bytes.length]) {
    if (cut <= start) continue
    out.push({ start, end: cut, line })
    line += lineEndsIn(bytes, start, cut)
    start = cut
  }
  if (out.length === 0) out.push({ start: from, end: bytes.length, line: fromLine })
  return out
}

/**
 * The cut points of splitAtRecords (ascending, each inside (from, bytes.length)), without the line
 * numbers; `lastShare` is the last piece's share of the bytes (the others share the rest).
 */
export function recordCuts(bytes: Uint8Array, from: number, pieces: number, lastShare = 1 / pieces): number[] {
  const len = bytes.length
  const eol = lineEndOf(bytes, from)
  const cuts: number[] = []
  // Quotes counted so far (all before `nextQuote`), for the parity at each aim.
  let quotes = 0
  let nextQuote = bytes.indexOf(CH_QUOTE, from)
  // The pieces before the last share what the last leaves (all equal by default).
  const before = (1 - lastShare) / (pieces - 1)
  for (let k = 1; k < pieces; k++) {
    const aim = Math.max(from + Math.floor((len - from) * before * k), cuts.length ? cuts[cuts.length - 1] : from)
    // Parity up to the aim.
    while (nextQuote >= 0 && nextQuote < aim) { quotes++; nextQuote = bytes.indexOf(CH_QUOTE, nextQuote + 1) }
    // Step to the first line end at or after the aim with an even count of quotes before it.
    let p = aim, cut = -1
    for (;;) {
      const e = bytes.indexOf(eol, p)
      if (e < 0) break
      while (nextQuote >= 0 && nextQuote < e) { quotes++; nextQuote = bytes.indexOf(CH_QUOTE, nextQuote + 1) }
      if ((quotes & 1) === 0) { cut = e + 1; break }
      p = e + 1
    }
    if (cut < 0 || cut >= len) break
    if (cuts.length === 0 || cut > cuts[cuts.length - 1]) cuts.push(cut)
  }
  return cuts
}

/** The byte that ends lines where a file may be cut: LF, or CR in a file without any LF. */
export function lineEndOf(bytes: Uint8Array, from = 0): 10 | 13 {
  return bytes.indexOf(CH_LF, from) >= 0 ? CH_LF : CH_CR
}

/**
 * The last record boundary in (from, before]: just after a line end (`eol`) outside quotes, with
 * bytes[from] the start of a record (even quote parity there); -1 when there is none. `quoteFree`
 * says bytes[from, before) holds no quote: one lastIndexOf then; else a walk from quote to quote
 * and line end to line end, as recordCuts steps.
 */
export function lastRecordEnd(bytes: Uint8Array, from: number, before: number, eol: number, quoteFree: boolean): number {
  if (quoteFree) {
    const e = bytes.lastIndexOf(eol, before - 1)
    return e >= from ? e + 1 : -1
  }
  let quotes = 0, best = -1
  let nextQuote = bytes.indexOf(CH_QUOTE, from)
  for (let p = from; ;) {
    const e = bytes.indexOf(eol, p)
    if (e < 0 || e >= before) return best
    while (nextQuote >= 0 && nextQuote < e) { quotes++; nextQuote = bytes.indexOf(CH_QUOTE, nextQuote + 1) }
    if ((quotes & 1) === 0) best = e + 1
    p = e + 1
  }
}

/** Line ends in bytes[a, b) as the cursor counts them: LF, CR LF and a lone CR each once. */
export function lineEndsIn(bytes: Uint8Array, a: number, b: number): number {
  let n = 0
  for (let p = bytes.indexOf(CH_LF, a); p >= 0 && p < b; p = bytes.indexOf(CH_LF, p + 1)) n++
  for (let p = bytes.indexOf(CH_CR, a); p >= 0 && p < b; p = bytes.indexOf(CH_CR, p + 1)) {
    if (p + 1 >= bytes.length || bytes[p + 1] !== CH_LF) n++
  }
  return n
}

/** True when bytes[at - 1] ends a line (or at is 0): a piece may start at `at`. */
export function startsLine(bytes: Uint8Array, at: number): boolean {
  if (at === 0) return true
  const c = bytes[at - 1]
  return c === CH_LF || (c === CH_CR && bytes[at] !== CH_LF)
}

/**
 * Counts line ends as the cursor does (LF, CR LF and a lone CR each once) over consecutive ranges
 * of one file, with native scans: LFs by indexOf, and lone CRs by indexOf only where the file has
 * a CR at all (the next CR is remembered, so a file with few CRs is not scanned again and again).
 */
export class LineEndCounter {
  private nextLf: number
  private nextCr: number
  constructor(private readonly bytes: Uint8Array, from: number) {
    this.nextLf = bytes.indexOf(CH_LF, from)
    this.nextCr = bytes.indexOf(CH_CR, from)
  }

  /** Line ends in bytes[a, b); ranges come in order, each starting at or after the last one's end. */
  count(a: number, b: number): number {
    const bytes = this.bytes
    let n = 0
    if (this.nextLf >= 0 && this.nextLf < a) this.nextLf = bytes.indexOf(CH_LF, a)
    while (this.nextLf >= 0 && this.nextLf < b) { n++; this.nextLf = bytes.indexOf(CH_LF, this.nextLf + 1) }
    if (this.nextCr >= 0 && this.nextCr < a) this.nextCr = bytes.indexOf(CH_CR, a)
    while (this.nextCr >= 0 && this.nextCr < b) {
      const p = this.nextCr
      if (p + 1 >= bytes.length || bytes[p + 1] !== CH_LF) n++
      this.nextCr = bytes.indexOf(CH_CR, p + 1)
    }
    return n
  }
}
