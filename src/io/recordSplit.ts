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
 * indexOf, after counting the quotes before the aim the same way. A file without quotes costs
 * one indexOf for the quotes (a pass over the file: a typed array's indexOf reads about a byte a
 * nanosecond here) and one per cut for the line end; the line numbers cost one LineEndCounter
 * pass (four bytes at a time) up to the last cut.
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
  const counter = new LineEndCounter(bytes)
  for (const cut of [...recordCuts(bytes, from, pieces), bytes.length]) {
    if (cut <= start) continue
    out.push({ start, end: cut, line })
    line += counter.count(start, cut)
    start = cut
  }
  if (out.length === 0) out.push({ start: from, end: bytes.length, line: fromLine })
  return out
}

/**
 * The cut points of splitAtRecords (ascending, each inside (from, bytes.length)), without the line
 * numbers; `lastShare` is the last piece's share of the bytes (the others share the rest);
 * `firstQuote` the first quote at or after `from`, -1 to cut at line ends without the quote
 * walk (csvPieceStream.ts says when that is the same).
 */
export function recordCuts(bytes: Uint8Array, from: number, pieces: number, lastShare = 1 / pieces, firstQuote = bytes.indexOf(CH_QUOTE, from)): number[] {
  const len = bytes.length
  const eol = lineEndOf(bytes, from)
  const cuts: number[] = []
  // Quotes counted so far (all before `nextQuote`), for the parity at each aim.
  let quotes = 0
  let nextQuote = firstQuote
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
 * The last line end (`eol`) in [from, before), as the boundary just after it; -1 when there is
 * none. For csvPieceStream.ts, which cuts at line ends without the quote walk (it says why).
 */
export function lastRecordEnd(bytes: Uint8Array, from: number, before: number, eol: number): number {
  const e = bytes.lastIndexOf(eol, before - 1)
  return e >= from ? e + 1 : -1
}

/** Line ends in bytes[a, b) as the cursor counts them: LF, CR LF and a lone CR each once. */
export function lineEndsIn(bytes: Uint8Array, a: number, b: number): number {
  return new LineEndCounter(bytes).count(a, b)
}

/** True when bytes[at - 1] ends a line (or at is 0): a piece may start at `at`. */
export function startsLine(bytes: Uint8Array, at: number): boolean {
  if (at === 0) return true
  const c = bytes[at - 1]
  return c === CH_LF || (c === CH_CR && bytes[at] !== CH_LF)
}

/**
 * Counts line ends as the cursor does (LF, CR LF and a lone CR each once) over ranges of one
 * file, four bytes at a time: a word's bytes equal to LF are the zero bytes of word XOR
 * 0x0A0A0A0A, found exactly by ((x & 0x7F7F7F7F) + 0x7F7F7F7F | x) having no high bit (the
 * carry-free zero-byte test, Warren, "Hacker's Delight", 2nd ed., section 6-1) and counted with
 * one multiply; a word with a CR (the same test on XOR 0x0D0D0D0D) is looked at byte by byte for
 * lone CRs. One pass, no search ahead: a typed array's indexOf reads about a byte a nanosecond
 * here, and one call a line cost a tenth of the read.
 */
export class LineEndCounter {
  /** The bytes as words from the first byte on a 4-byte boundary (`head` bytes in). */
  private readonly words: Int32Array
  private readonly head: number
  constructor(private readonly bytes: Uint8Array) {
    this.head = (4 - (bytes.byteOffset & 3)) & 3
    this.words = bytes.length >= this.head + 4 ? new Int32Array(bytes.buffer, bytes.byteOffset + this.head, (bytes.length - this.head) >> 2) : new Int32Array(0)
  }

  /** Line ends in bytes[a, b). */
  count(a: number, b: number): number {
    const bytes = this.bytes, words = this.words, head = this.head
    let n = 0
    // Bytes one at a time up to a word boundary, words, then the bytes after the last whole word.
    let i = a
    while (i < b && ((i - head) & 3) !== 0) n += endsAt(bytes, i++)
    if (i >= head && i < b) {
      const w0 = (i - head) >> 2, w1 = Math.max(w0, (b - head) >> 2)
      for (let w = w0; w < w1; w++) {
        const word = words[w]
        const x = word ^ 0x0a0a0a0a
        // `| 0` keeps the sums in 32-bit integers (a carry out of the top byte is dropped).
        const lf = ~((((x & 0x7f7f7f7f) + 0x7f7f7f7f) | 0) | x) & 0x80808080
        n += Math.imul(lf >>> 7, 0x01010101) >>> 24
        const r = word ^ 0x0d0d0d0d
        if ((((r - 0x01010101) | 0) & ~r & 0x80808080) !== 0) {
          for (let j = head + 4 * w, e = j + 4; j < e; j++) if (bytes[j] === CH_CR && bytes[j + 1] !== CH_LF) n++
        }
      }
      i = Math.max(i, head + 4 * w1)
    }
    while (i < b) n += endsAt(bytes, i++)
    return n
  }
}

/** 1 when bytes[i] ends a line as the cursor counts (an LF, or a CR not before an LF), else 0. */
function endsAt(bytes: Uint8Array, i: number): number {
  const c = bytes[i]
  return c === CH_LF || (c === CH_CR && bytes[i + 1] !== CH_LF) ? 1 : 0
}
