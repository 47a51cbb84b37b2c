/**
 * Reading a bundle's large tables in pieces with no model-size copy: the bytes streamed to the
 * helper threads through a small ring of shared bytes, the rows written by every thread straight
 * into the table's final arrays (SharedArrayBuffer). Pure, like csvPieces.ts, which takes this way
 * when every lane offers it (`PieceLane.stream`) and SharedArrayBuffer exists; the other way
 * (pieces sent as copies of their bytes, rows sent back and joined) stays for lanes that cannot
 * block.
 *
 * Why (measured on the 2-core VMs here, DEVELOPERS.md "What bounds what"): the first write to a
 * fresh page costs about 15–27 µs per 4 KiB, about as much as parsing the CSV that fills it. The
 * other way makes fresh memory on the calling thread (the lane's piece copied, the rows joined
 * into new arrays), and with the text the readers once parsed, once more in the lane (its piece
 * decoded into one large string): slower than one thread for tet10 and hex8. Here:
 * - a lane's piece goes in chunks of at most `slotBytes` through a ring of SLOTS reused slots (a
 *   copy at memory speed); the lane copies a chunk into one reused buffer and parses it there: no
 *   fresh memory for the file's bytes;
 * - each table's arrays are made once, shared, and every thread writes its piece's rows into its
 *   own range of them, so each first-touches only its own pages, at the same time as the others;
 * - the lanes read the first pieces of the file, this thread the last (MAIN_SHARE of it), all at
 *   once: each piece's rows start at a row set from the sampled row estimates (estimateRecordCount)
 *   of the pieces before it, with a fifth again as room, and a piece after the first counts its
 *   lines from 1. Each piece says how many lines it held; joinPieces then shifts every later
 *   piece's row lines (and its error's line) by the lines before it. A lane, once its piece is
 *   read, moves its rows to the end of its room, next to the next piece's (packRight), while
 *   this thread still reads; with more than one lane the gaps left are closed up on this thread.
 *   So every row and message carries its true line, and no thread waits for, or makes, a count
 *   of another piece's line ends (a pass over the lanes' bytes on this thread, a tenth of its
 *   time, before). The last piece has half its estimate again as
 *   room to the arrays' end: pages never written are never touched, so the room costs address
 *   space only.
 * A table whose rows outrun the arrays, a record longer than a slot, or a lane that stalls or
 * fails ends the read in pieces: the caller reads on one thread (the same model, only slower).
 *
 * Ring layout (Int32 control words, then the slots): HEAD chunks published by this thread, TAIL
 * chunks consumed by the lane, STOP set to end early, SLOT_SIZE the bytes of a slot; per slot: table (or END), byte length, and
 * the piece's first row, room and first line, and the chunk's byte offset in the file (for the
 * offsets messages name). Chunk n uses slot n % SLOTS. Chunks end at record boundaries
 * (recordSplit.ts).
 */
import { InputError, isInputError } from '../model/errors.ts'
import { createCursor, estimateRecordCount, moveCursor } from './csvCursor.ts'
import { finishNumericTable, openNumericTable, readNumericRows } from './csvTable.ts'
import type { NumericPieceSetup, NumericRows, NumericTable } from './csvTable.ts'
import { NODE_COUNTS, TYPE_NAMES, concatInt, finishElementTable, openElementTable, permuteNodes, readElementPiece, readElementRows, typeLookup } from './readElementTable.ts'
import type { Blocks, ElementPieceSetup, ElementTable, RawElementBlock, TypeLookup } from './readElementTable.ts'
import { lastRecordEnd, lineEndOf, recordCuts } from './recordSplit.ts'
import type { PieceError, TableOutcome, TableRequest } from './csvPieces.ts'
import { sourceBytes } from './csvBytes.ts'
import type { CsvSource } from './csvBytes.ts'

/** Slots of a lane's ring. */
export const SLOTS = 16
const HEAD = 0, TAIL = 1, STOP = 2, SLOT_SIZE = 3, META = 4, META_WORDS = 6
const END = -1
const CONTROL_BYTES = 4 * (META + META_WORDS * SLOTS)
/** This thread's share of a table: it also feeds the rings and joins. */
export const MAIN_SHARE = 0.5
/** Rows the arrays hold over the sampled row estimate (estimateRecordCount): this thread's piece, the last. */
const ROOM = 1.5
/** The room of a lane's piece over its sampled row estimate (itself about a tenth over the line count). */
const PIECE_ROOM = 1.2

/**
 * Sizes of the stream (tests make them small to cut tables at many points): the bytes of a slot,
 * and the bytes this thread reads between two fills of the rings.
 */
export const streamSizes = { slotBytes: 96 * 1024, ownSlice: 256 * 1024 }

/** Reads that ended in tables, and reads that ended early (the caller then read on one thread): for tests, which check the way taken. */
export const streamCounts = { read: 0, stopped: 0 }
/** A lane that consumes nothing for this long is taken as failed (ms). */
const STALL_MS = 30_000

/** A table's shared arrays, whole. Element rows of `type` go to `block`; rows of other types (rare) into arrays of the piece's own. */
export type StreamOut =
  | { readonly kind: 'numeric'; readonly rows: NumericRows }
  | { readonly kind: 'elements'; readonly type: number; readonly block: { readonly nodeIds: Int32Array; readonly ids: Int32Array; readonly lines: Int32Array; readonly part: Int32Array | null } | null }

/** A table as a lane reads its pieces: how, and into which arrays. */
export type StreamTable = ({ readonly kind: 'numeric'; readonly setup: NumericPieceSetup } | { readonly kind: 'elements'; readonly setup: ElementPieceSetup }) & { readonly out: StreamOut }

/** What a lane is handed: its ring and the tables of the read (null: none of its pieces). */
export interface StreamSetup {
  readonly ring: SharedArrayBuffer
  readonly tables: readonly (StreamTable | null)[]
}

/** What a piece read: rows written in place, and rows of other element types. */
export type StreamPieceResult =
  | { readonly ok: true; readonly placed: number; readonly from: number; readonly rest: RawElementBlock[]; readonly line: number }
  | { readonly ok: false; readonly error: PieceError }

/** A lane's answer: per table its piece's result (null where it had none), or `stopped` when it was told to stop or its rows outran their room. */
export type StreamResult = { readonly stopped: true } | { readonly stopped: false; readonly pieces: readonly (StreamPieceResult | null)[] }

/** A helper thread that reads the chunks of its ring as they come (it blocks: a worker thread). */
export type StreamLane = (setup: StreamSetup) => Promise<StreamResult>

/**
 * True when this thread may block on Atomics.wait, as the streamed read does while a lane's ring
 * is full: worker threads and Node's main thread, not a page's main thread. The check comes before
 * the value is compared, so the probe never waits.
 */
export function canBlock(): boolean {
  if (typeof SharedArrayBuffer === 'undefined' || typeof Atomics === 'undefined') return false
  try {
    Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 1, 0)
    return true
  } catch {
    return false
  }
}

/** The buffers of a lane's answer that are its own (rows of other element types), to move back by transfer. */
export function streamBuffers(r: StreamResult): ArrayBuffer[] {
  if (r.stopped) return []
  return r.pieces.flatMap((p) => (p && p.ok ? p.rest.flatMap((b) => [b.nodeIds, b.ids, b.lines, ...(b.part ? [b.part] : [])].map((a) => a.buffer as ArrayBuffer)) : []))
}

/** Thrown inside a piece reader when its rows outrun their room. */
class OutOfRoom extends Error {}

/** A piece's reader: parses whole-record ranges of bytes in order, rows into the piece's range of the arrays. */
interface PieceReader {
  /** Reads bytes[start, end) (whole records), continuing the piece; the next call starts at `end`. `offset`: where bytes[0] lies in the file. */
  read(bytes: Uint8Array, start: number, end: number, offset: number): void
  /**
   * Moves the rows written so far to the end of the piece's room, next to the rows of the piece
   * after it (a lane does this once its piece is read, while this thread still reads its own).
   */
  packRight(): void
  /** Rows written in place and the row they start at, rows of other element types, and the line the piece ends on (counted from its first). */
  result(): { placed: number; from: number; rest: RawElementBlock[]; line: number }
}

/** A table's arrays with the numbers each holds a row, as moveRows takes them. */
type RowArrays = readonly { readonly a: Int32Array | Float64Array; readonly width: number }[]

/** The arrays of numeric rows (`nv` values a row). */
function numericArrays(o: NumericRows, nv: number): RowArrays {
  return [{ a: o.ids, width: 1 }, { a: o.lines, width: 1 }, { a: o.values, width: nv }, ...(o.ids2 ? [{ a: o.ids2, width: 1 }] : [])]
}

/** The arrays of an element block of `nn` nodes an element. */
function blockArrays(b: { readonly nodeIds: Int32Array; readonly ids: Int32Array; readonly lines: Int32Array; readonly part: Int32Array | null }, nn: number): RowArrays {
  return [{ a: b.nodeIds, width: nn }, { a: b.ids, width: 1 }, { a: b.lines, width: 1 }, ...(b.part ? [{ a: b.part, width: 1 }] : [])]
}

/** Moves rows [from, from + n) of each array (`width` numbers a row) `by` rows on. */
function moveRows(arrays: RowArrays, from: number, n: number, by: number): void {
  if (by !== 0 && n > 0) for (const { a, width } of arrays) a.copyWithin((from + by) * width, from * width, (from + n) * width)
}

/** The reader of a piece whose rows start at row `at` of the table's arrays (room for `cap`) and whose bytes start on line `line`. */
function pieceReader(table: StreamTable, at: number, cap: number, line: number): PieceReader {
  const end = at + Math.max(0, cap)
  if (table.kind === 'numeric') {
    const s = table.setup
    const out = (table.out as Extract<StreamOut, { kind: 'numeric' }>).rows
    let placed = 0, first = at
    return {
      read(bytes, start, stop, offset) {
        const cur = createCursor(s.file, bytes, s.separator, s.decimal, offset)
        moveCursor(cur, start, line)
        const from = at + placed
        const into: NumericRows = {
          rows: 0, ids: out.ids.subarray(from, end), lines: out.lines.subarray(from, end),
          values: out.values.subarray(from * s.nv, end * s.nv), ids2: out.ids2 ? out.ids2.subarray(from, end) : null,
        }
        const r = readNumericRows(cur, s.slotOf, s.nf, s.nv, s.names, s.twoIds, stop, into)
        if (r.ids !== into.ids) throw new OutOfRoom()
        placed += r.rows
        // The readers stop at `stop`, a line start (nextRecord's limit): the next slice's line.
        line = cur.line
      },
      packRight() {
        const by = end - (at + placed)
        moveRows(numericArrays(out, s.nv), at, placed, by)
        first = at + by
      },
      result: () => ({ placed, from: first, rest: [], line }),
    }
  }
  const s = table.setup
  const o = table.out as Extract<StreamOut, { kind: 'elements' }>
  const nn = o.type >= 0 ? NODE_COUNTS[o.type] : 0
  const b = o.block
  const seeded = b ? { nodeIds: b.nodeIds.subarray(at * nn, end * nn), ids: b.ids.subarray(at, end), lines: b.lines.subarray(at, end), part: b.part ? b.part.subarray(at, end) : new Int32Array(0), count: 0 } : null
  const ids = seeded?.ids
  let first = at
  const grown: Blocks = { byType: [], order: [], estimate: 1024, hasPart: s.cols.hasPart }
  if (seeded) grown.byType[o.type] = seeded
  const lookup: TypeLookup = typeLookup(s.spec.types)
  return {
    read(bytes, start, stop, offset) {
      const cur = createCursor(s.file, bytes, s.separator, s.decimal, offset)
      moveCursor(cur, start, line)
      readElementRows(cur, s.cols, s.header, lookup, s.spec, grown, stop)
      // Grown past its room: room() gave the block new arrays.
      if (seeded && seeded.ids !== ids) throw new OutOfRoom()
      line = cur.line
    },
    packRight() {
      if (!seeded || !b) return
      const by = end - (at + seeded.count)
      moveRows(blockArrays(b, nn), at, seeded.count, by)
      first = at + by
    },
    result() {
      // Other types' rows, trimmed, in their order of first appearance; model.json's node order is applied after the join.
      const rest = grown.order.filter((t) => t !== o.type || !seeded).map((t) => {
        const g = grown.byType[t]!
        return { type: TYPE_NAMES[t], nodeIds: g.nodeIds.slice(0, g.count * NODE_COUNTS[t]), ids: g.ids.slice(0, g.count), part: s.cols.hasPart ? g.part.slice(0, g.count) : null, lines: g.lines.slice(0, g.count) }
      })
      return { placed: seeded ? seeded.count : 0, from: first, rest, line }
    },
  }
}

/** An input error as it travels between threads (the message without the place prefix InputError writes from `where`). */
function pieceError(e: InputError): PieceError {
  const again = new InputError(e.kind, '', e.where).message
  return { kind: e.kind, message: e.message.startsWith(again) ? e.message.slice(again.length) : e.message, where: e.where }
}

/**
 * The lane's side: reads the chunks of its ring until the end mark, each with its table's piece
 * reader. Blocks its thread (Atomics.wait) while the ring is empty.
 */
export function readStreamedPieces(setup: StreamSetup): StreamResult {
  const ctrl = new Int32Array(setup.ring, 0, META + META_WORDS * SLOTS)
  try {
    return readRing(setup, ctrl)
  } catch (e) {
    // Not an input error: the calling thread stops waiting for this lane and reads on one thread.
    Atomics.store(ctrl, STOP, 1)
    Atomics.notify(ctrl, TAIL)
    throw e
  }
}

function readRing(setup: StreamSetup, ctrl: Int32Array): StreamResult {
  const bytes = new Uint8Array(setup.ring, CONTROL_BYTES)
  const slotBytes = ctrl[SLOT_SIZE]
  // A private copy of each chunk (one slot, reused): the reader parses ordinary memory only.
  const own = new Uint8Array(slotBytes)
  const readers: (PieceReader | null)[] = setup.tables.map(() => null)
  const errors: (PieceError | null)[] = setup.tables.map(() => null)
  for (let n = 0; ; n++) {
    while (Atomics.load(ctrl, HEAD) === n) {
      if (Atomics.load(ctrl, STOP)) return { stopped: true }
      Atomics.wait(ctrl, HEAD, n, 1000)
    }
    if (Atomics.load(ctrl, STOP)) return { stopped: true }
    const slot = n % SLOTS, m = META + META_WORDS * slot
    const t = ctrl[m], length = ctrl[m + 1]
    if (t === END) break
    if (!errors[t]) {
      const table = setup.tables[t]!
      const reader = readers[t] ?? (readers[t] = pieceReader(table, ctrl[m + 2], ctrl[m + 3], ctrl[m + 4]))
      own.set(bytes.subarray(slot * slotBytes, slot * slotBytes + length))
      try {
        reader.read(own, 0, length, ctrl[m + 5])
      } catch (e) {
        if (e instanceof OutOfRoom) { Atomics.store(ctrl, STOP, 1); return { stopped: true } }
        if (!isInputError(e)) throw e
        errors[t] = pieceError(e)
      }
    }
    Atomics.store(ctrl, TAIL, n + 1)
    Atomics.notify(ctrl, TAIL)
  }
  // Each piece's rows next to the next piece's, here and now rather than on the calling thread after.
  readers.forEach((r, t) => { if (r && !errors[t]) r.packRight() })
  return {
    stopped: false,
    pieces: readers.map((r, t) => (errors[t] ? { ok: false, error: errors[t]! } : r ? { ok: true, ...r.result() } : null)),
  }
}

/** A table planned: its pieces' ranges (the last this thread's), shared arrays, and where each piece's rows start once known. */
interface Plan {
  readonly request: TableRequest
  readonly bytes: Uint8Array
  readonly ranges: { readonly start: number; readonly end: number }[]
  readonly open: ReturnType<typeof openNumericTable> | ReturnType<typeof openElementTable>
  readonly table: StreamTable
  /** Rows the arrays hold. */
  readonly rows: number
  /**
   * Per piece the row its rows start at, set from the row estimates (each piece has room for its
   * own), and the line it starts on: the first row's for the first piece; 1 for the others, whose
   * lines are counted from there and shifted once the pieces before them have said how many
   * lines they hold (joinPieces).
   */
  readonly at: number[]
  readonly line: number[]
  readonly eol: number
}

/** A lane's feed: where its next chunk comes from, and its ring. */
interface Feed {
  readonly ctrl: Int32Array
  readonly bytes: Uint8Array
  readonly slotBytes: number
  published: number
  table: number
  pos: number
  done: boolean
}

/**
 * Reads the tables over the calling thread and `lanes` (each a StreamLane): per file object its
 * table or input error, or null when the read in pieces ended early (a lane failed or stalled,
 * rows outran their room); the caller then reads on one thread.
 */
export async function readTablesStreamed<F extends CsvSource>(requests: readonly (TableRequest & { readonly file: F })[], lanes: readonly StreamLane[]): Promise<Map<F, TableOutcome> | null> {
  const P = lanes.length + 1
  const out = new Map<F, TableOutcome>()
  const plans: (Plan | null)[] = requests.map((r) => {
    try {
      return planTable(r, P)
    } catch (e) {
      if (!isInputError(e)) throw e
      out.set(r.file, { ok: false, error: e })
      return null
    }
  })
  const { slotBytes, ownSlice } = streamSizes
  const feeds: Feed[] = lanes.map(() => {
    const ring = new SharedArrayBuffer(CONTROL_BYTES + SLOTS * slotBytes)
    const ctrl = new Int32Array(ring, 0, META + META_WORDS * SLOTS)
    ctrl[SLOT_SIZE] = slotBytes
    return { ctrl, bytes: new Uint8Array(ring, CONTROL_BYTES), slotBytes, published: 0, table: 0, pos: -1, done: false }
  })
  const answers = lanes.map((lane, k) => lane({ ring: feeds[k].ctrl.buffer as SharedArrayBuffer, tables: plans.map((p) => (p && p.ranges.length - 1 > k ? p.table : null)) }))
  // A lane that fails before reading its ring is seen here (on this thread's event loop, let run while it waits).
  let failed = false
  answers.forEach((a) => a.catch(() => { failed = true }))
  const stopAll = () => { for (const f of feeds) { Atomics.store(f.ctrl, STOP, 1); Atomics.notify(f.ctrl, HEAD) } }
  const fill = () => fillRings(feeds, plans)

  const own: (PieceReader | null)[] = plans.map(() => null)
  const ownErrors: (InputError | null)[] = plans.map(() => null)
  try {
    for (let t = 0; t < plans.length; t++) {
      const p = plans[t]
      if (!p) continue
      // This thread's piece, a slice at a time, the rings filled between slices.
      const last = p.ranges.length - 1
      const reader = own[t] = pieceReader(p.table, p.at[last], p.rows - p.at[last], p.line[last])
      const { start, end } = p.ranges[last]
      for (let a = start; a < end;) {
        const b = a + ownSlice >= end ? end : lastRecordEnd(p.bytes, a, a + ownSlice, p.eol)
        const stop = b > a ? b : end
        try {
          reader.read(p.bytes, a, stop, 0)
        } catch (e) {
          if (!isInputError(e)) throw e
          ownErrors[t] = e
          break
        }
        a = stop
        fill()
      }
    }
    // This thread's pieces read: send the rest, waiting for room.
    let progress = performance.now(), yielded = progress
    while (feeds.some((f) => !f.done)) {
      if (fill()) { progress = performance.now(); continue }
      const f = feeds.find((x) => !x.done && x.published - Atomics.load(x.ctrl, TAIL) >= SLOTS)
      if (f) Atomics.wait(f.ctrl, TAIL, Atomics.load(f.ctrl, TAIL), 20)
      if (performance.now() - yielded > 100) { await new Promise((r) => setTimeout(r, 0)); yielded = performance.now() }
      if (failed || feeds.some((x) => Atomics.load(x.ctrl, STOP)) || performance.now() - progress > STALL_MS) throw new OutOfRoom()
    }
  } catch (e) {
    stopAll()
    await Promise.allSettled(answers)
    if (e instanceof OutOfRoom) { streamCounts.stopped++; return null }
    throw e
  }
  let results: StreamResult[]
  try {
    results = await Promise.all(answers)
  } catch {
    streamCounts.stopped++
    return null
  }
  if (results.some((r) => r.stopped)) { streamCounts.stopped++; return null }
  streamCounts.read++
  plans.forEach((p, t) => {
    if (!p) return
    const file = (p.request as TableRequest & { readonly file: F }).file
    try {
      const pieces: StreamPieceResult[] = []
      for (let k = 0; k < p.ranges.length - 1; k++) pieces.push((results[k] as Extract<StreamResult, { stopped: false }>).pieces[t]!)
      pieces.push(ownErrors[t] ? { ok: false, error: pieceError(ownErrors[t]!) } : { ok: true, ...own[t]!.result() })
      out.set(file, { ok: true, table: joinPieces(p, pieces) })
    } catch (e) {
      if (!isInputError(e)) throw e
      out.set(file, { ok: false, error: e })
    }
  })
  return out
}

/** Opens a table and plans its pieces: ranges and the shared arrays. Header problems are thrown. */
function planTable(r: TableRequest, P: number): Plan {
  // The bytes once: a file may read them from disk on each access (src/cli/loadModel.ts).
  const bytes = sourceBytes(r.file)
  const open = r.kind === 'numeric' ? openNumericTable(r.file.name, bytes, r.spec) : openElementTable(r.file.name, bytes, r.spec)
  const from = open.cur.pos
  // Cut at line ends without the quote walk (-1): a quoted field never holds a line break here
  // (the cursor refuses one, PARSE_OPEN_QUOTE), so every line end ends a record or lies in a
  // record the piece that reads it refuses at its own line, the first error in file order, as a
  // one-thread read refuses it. The walk's search for quotes was a pass over the file on this
  // thread (a typed array's indexOf reads about a byte a nanosecond here).
  const bounds = [from, ...recordCuts(bytes, from, P, MAIN_SHARE, -1), bytes.length]
  const ranges = bounds.slice(1).map((e, k) => ({ start: bounds[k], end: e }))
  const eol = lineEndOf(bytes, from)
  // Each piece's rows start where the estimates of the pieces before it end, with room, so no
  // piece waits for the line ends of those before it to be counted (a pass over the lanes' bytes
  // on this thread); the lanes close the gaps (packRight).
  const at = [0]
  for (let k = 0; k < ranges.length - 1; k++) at.push(at[k] + Math.ceil(estimateRecordCount(bytes, ranges[k].start, ranges[k].end) * PIECE_ROOM) + 64)
  const rows = at[ranges.length - 1] + Math.ceil(estimateRecordCount(bytes, ranges[ranges.length - 1].start, bytes.length) * ROOM) + 1024
  const int = (n: number) => new Int32Array(new SharedArrayBuffer(4 * n))
  let table: StreamTable
  if (r.kind === 'numeric') {
    const setup = (open as ReturnType<typeof openNumericTable>).setup
    table = { kind: 'numeric', setup, out: { kind: 'numeric', rows: { rows: 0, ids: int(rows), lines: int(rows), values: new Float64Array(new SharedArrayBuffer(8 * rows * setup.nv)), ids2: setup.twoIds ? int(rows) : null } } }
  } else {
    const o = open as ReturnType<typeof openElementTable>
    const type = firstType(o, bytes, ranges[0].start, ranges[0].end)
    const nn = type >= 0 ? NODE_COUNTS[type] : 0
    const block = type >= 0 ? { nodeIds: int(rows * nn), ids: int(rows), lines: int(rows), part: o.setup.cols.hasPart ? int(rows) : null } : null
    table = { kind: 'elements', setup: o.setup, out: { kind: 'elements', type, block } }
  }
  const line = ranges.map((_, k) => (k === 0 ? open.cur.line : 1))
  return { request: r, bytes, ranges, open, table, rows, at, line, eol }
}

/** The type (index) of the first element row of bytes[start, end), or -1 (none, or the row is bad: its error comes from the read). */
function firstType(o: ReturnType<typeof openElementTable>, bytes: Uint8Array, start: number, end: number): number {
  const e = bytes.indexOf(lineEndOf(bytes, start), start)
  try {
    const blocks = readElementPiece(o.setup, bytes, start, e < 0 || e >= end ? end : e + 1, o.cur.line)
    return blocks.length ? TYPE_NAMES.indexOf(blocks[0].type) : -1
  } catch (err) {
    if (!isInputError(err)) throw err
    return -1
  }
}

/** Sends each lane its next chunks while its ring has room and its piece's first row is known; true when anything was sent. */
function fillRings(feeds: Feed[], plans: readonly (Plan | null)[]): boolean {
  let sent = false
  for (let k = 0; k < feeds.length; k++) {
    const f = feeds[k]
    while (!f.done && f.published - Atomics.load(f.ctrl, TAIL) < SLOTS) {
      const slot = f.published % SLOTS, m = META + META_WORDS * slot
      // The next table this lane has a piece of (lane k reads piece k; the last piece is this thread's).
      let p = plans[f.table]
      while (f.table < plans.length && (!p || p.ranges.length - 1 <= k || (f.pos >= 0 && f.pos >= p.ranges[k].end))) { f.table++; f.pos = -1; p = plans[f.table] }
      if (f.table >= plans.length) {
        f.ctrl[m] = END
        f.done = true
      } else {
        const plan = p!
        const range = plan.ranges[k]
        if (f.pos < 0) f.pos = range.start
        const a = f.pos
        // Whole records of at most a slot's bytes, copied into the slot.
        const b = range.end - a <= f.slotBytes ? range.end : lastRecordEnd(plan.bytes, a, a + f.slotBytes, plan.eol)
        // A record longer than a slot: not for this way of reading.
        if (b <= a) { Atomics.store(f.ctrl, STOP, 1); f.done = true; return sent }
        f.bytes.set(plan.bytes.subarray(a, b), slot * f.slotBytes)
        f.ctrl[m] = f.table
        f.ctrl[m + 1] = b - a
        f.ctrl[m + 2] = plan.at[k]
        f.ctrl[m + 3] = plan.at[k + 1] - plan.at[k]
        f.ctrl[m + 4] = plan.line[k]
        f.ctrl[m + 5] = a
        f.pos = b
      }
      Atomics.store(f.ctrl, HEAD, f.published + 1)
      Atomics.notify(f.ctrl, HEAD)
      f.published++
      sent = true
    }
  }
  return sent
}

/**
 * A table from its pieces: the first failing piece's error, else each piece's rows closed up
 * against the rows before it (a piece's rows start where its lines do, so only blank and comment
 * lines leave a gap) and the arrays as views of the shared ones.
 */
function joinPieces(p: Plan, results: readonly StreamPieceResult[]): NumericTable | ElementTable {
  // Each piece's shift from the lines it counted from to the file's: the lines of the pieces before it.
  const shift: number[] = []
  let first = p.line[0]
  results.forEach((r, k) => {
    shift.push(first - p.line[k])
    if (!r.ok) {
      const where = r.error.where.line === undefined ? r.error.where : { ...r.error.where, line: r.error.where.line + shift[k] }
      throw new InputError(r.error.kind, r.error.message, where)
    }
    first += r.line - p.line[k]
  })
  const placed = results.map((r) => (r as Extract<StreamPieceResult, { ok: true }>).placed)
  const at = results.map((r) => (r as Extract<StreamPieceResult, { ok: true }>).from)
  const shiftLines = (lines: Int32Array, k: number, from: number, n: number) => {
    if (shift[k] !== 0) for (let i = from, e = from + n; i < e; i++) lines[i] += shift[k]
  }
  // The table's rows start where the first piece's do (a lane moves its rows next to the next
  // piece's); a gap left (more than one lane) is closed by moving the later rows back.
  const base = at[0]
  let rows = 0
  const closeUp = (arrays: RowArrays) => {
    placed.forEach((n, k) => {
      moveRows(arrays, at[k], n, base + rows - at[k])
      rows += n
    })
  }
  const out = p.table.out
  if (out.kind === 'numeric') {
    const o = out.rows, nv = (p.open as ReturnType<typeof openNumericTable>).setup.nv
    placed.forEach((n, k) => shiftLines(o.lines, k, at[k], n))
    closeUp(numericArrays(o, nv))
    const table: NumericRows = { rows, ids: o.ids.subarray(base, base + rows), lines: o.lines.subarray(base, base + rows), values: o.values.subarray(base * nv, (base + rows) * nv), ids2: o.ids2 ? o.ids2.subarray(base, base + rows) : null }
    return finishNumericTable(p.open as ReturnType<typeof openNumericTable>, [table])
  }
  // Elements: the shared block of the first row's type, and the rows of any other types joined per type.
  const open = p.open as ReturnType<typeof openElementTable>
  const rest = results.map((r) => (r as Extract<StreamPieceResult, { ok: true }>).rest)
  rest.forEach((bs, k) => { for (const b of bs) shiftLines(b.lines, k, 0, b.lines.length) })
  let shared: RawElementBlock | null = null
  const firstLine: number[] = placed.map(() => Infinity)
  if (out.block) {
    const nn = NODE_COUNTS[out.type], b = out.block
    placed.forEach((n, k) => { shiftLines(b.lines, k, at[k], n); if (n) firstLine[k] = b.lines[at[k]] })
    closeUp(blockArrays(b, nn))
    if (rows) shared = { type: TYPE_NAMES[out.type], nodeIds: b.nodeIds.subarray(base * nn, (base + rows) * nn), ids: b.ids.subarray(base, base + rows), lines: b.lines.subarray(base, base + rows), part: b.part ? b.part.subarray(base, base + rows) : null }
  }
  // Blocks in order of first appearance: within a piece by each type's first line, pieces in file order.
  const order: string[] = []
  rest.forEach((bs, k) => {
    const here = bs.map((b) => ({ type: b.type as string, line: b.lines[0] }))
    if (shared && firstLine[k] !== Infinity) here.push({ type: shared.type, line: firstLine[k] })
    for (const h of here.sort((x, y) => x.line - y.line)) if (!order.includes(h.type)) order.push(h.type)
  })
  const joined: RawElementBlock[] = order.map((type) => {
    if (shared && type === shared.type) return shared
    const parts = rest.flatMap((bs) => bs.filter((b) => b.type === type))
    return { type: parts[0].type, nodeIds: concatInt(parts.map((b) => b.nodeIds)), ids: concatInt(parts.map((b) => b.ids)), part: open.setup.cols.hasPart ? concatInt(parts.map((b) => b.part!)) : null, lines: concatInt(parts.map((b) => b.lines)) }
  })
  for (const b of joined) {
    const perm = open.setup.spec.nodeOrder.get(b.type)
    if (perm) permuteNodes(b.nodeIds, perm)
  }
  return finishElementTable(open, [joined])
}
