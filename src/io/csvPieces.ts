/**
 * Reading a bundle's large tables in pieces on several threads. Pure: the threads themselves are
 * handed in as lanes (worker_threads in the command line and the benchmarks, src/cli/csvLanes.ts;
 * the engine's pool of Web Workers in the browser, workers/kernelPool.ts), so this file runs
 * anywhere and the tests run it with in-process lanes.
 *
 * For each table the calling thread finds the dialect and reads the header (csvTable.ts,
 * readElementTable.ts), then cuts the rows into one piece per lane at record boundaries
 * (recordSplit.ts: line ends outside quotes), each with the line number it starts on. Piece 0
 * of every table is read here, piece k by lane k: every piece's rows come back with absolute
 * line numbers and its messages name the file and the very line a one-thread reading names.
 * The pieces' rows are joined in file order; the ids are resolved after that, by the bundle's
 * assembly (readCsvBundle.ts), exactly as for a one-thread reading.
 *
 * Errors: a piece that meets an input error returns it as a value; the table's error is that of
 * its first failing piece (the one a one-thread reading would have met first), thrown only when
 * the assembly asks for that table, so the bundle's messages come in the one-thread order. A lane
 * that fails otherwise (a worker that died) makes the whole read fall back to one thread: the
 * pieces are a speed-up, never a new way to fail.
 */
import { InputError, isInputError } from '../model/errors.ts'
import type { InputErrorKind, InputErrorWhere } from '../model/errors.ts'
import { finishNumericTable, openNumericTable, readNumericPiece } from './csvTable.ts'
import type { NumericPieceSetup, NumericRows, NumericTable, NumericTableSpec } from './csvTable.ts'
import { finishElementTable, openElementTable, readElementPiece } from './readElementTable.ts'
import type { ElementPieceSetup, ElementTable, ElementTableSpec, RawElementBlock } from './readElementTable.ts'
import { splitAtRecords } from './recordSplit.ts'
import { sourceBytes } from './csvBytes.ts'
import type { CsvSource } from './csvBytes.ts'
import { canBlock, readTablesStreamed } from './csvPieceStream.ts'
import type { StreamLane } from './csvPieceStream.ts'

/**
 * One piece to read: bytes[start, end) (whole lines), the line it starts on and its table's
 * setup. A piece for another thread travels as a copy of its bytes alone (start 0), moved by
 * transfer; this thread reads its own piece in the file's bytes.
 */
export type PieceJob = (
  | { readonly kind: 'numeric'; readonly setup: NumericPieceSetup }
  | { readonly kind: 'elements'; readonly setup: ElementPieceSetup }
) & {
  readonly bytes: Uint8Array; readonly start: number; readonly end: number; readonly line: number
  /** Where bytes[0] lies in the file (a copy of the piece's bytes starts at the piece), for messages. */
  readonly offset: number
}

/** An input error as plain data (it crosses a thread boundary). */
export interface PieceError {
  readonly kind: InputErrorKind
  readonly message: string
  readonly where: InputErrorWhere
}

export type PieceOutcome =
  | { readonly ok: true; readonly rows?: NumericRows; readonly blocks?: RawElementBlock[] }
  | { readonly ok: false; readonly error: PieceError }

/**
 * A helper thread: reads the jobs it is given, in order. Rejects when the thread fails. `stream`,
 * where the thread may block and share memory, reads its pieces as they are streamed to it
 * (csvPieceStream.ts), the way taken when every lane has it.
 */
export type PieceLane = ((jobs: readonly PieceJob[]) => Promise<readonly PieceOutcome[]>) & { readonly stream?: StreamLane }

/** Reads one piece (what a lane's thread runs). Input errors come back as values; anything else is thrown. */
export function readPiece(job: PieceJob): PieceOutcome {
  const { bytes, start, end } = job
  try {
    return job.kind === 'numeric'
      ? { ok: true, rows: readNumericPiece(job.setup, bytes, start, end, job.line, job.offset) }
      : { ok: true, blocks: readElementPiece(job.setup, bytes, start, end, job.line, job.offset) }
  } catch (e) {
    if (!isInputError(e)) throw e
    // The message without the "file, line n: " prefix: InputError writes it again from `where`.
    return { ok: false, error: { kind: e.kind, message: bareMessage(e), where: e.where } }
  }
}

/** The buffers of a lane's jobs' bytes (each a piece's own copy), to move to the lane by transfer. */
export function jobBuffers(jobs: readonly PieceJob[]): ArrayBuffer[] {
  return jobs.map((j) => j.bytes.buffer as ArrayBuffer)
}

/** The buffers of a piece's result, to move back by transfer. */
export function pieceBuffers(o: PieceOutcome): ArrayBuffer[] {
  if (!o.ok) return []
  const out = new Set<ArrayBuffer>()
  if (o.rows) for (const a of [o.rows.ids, o.rows.values, o.rows.lines, o.rows.ids2]) if (a) out.add(a.buffer as ArrayBuffer)
  if (o.blocks) for (const b of o.blocks) for (const a of [b.nodeIds, b.ids, b.lines, b.part]) if (a) out.add(a.buffer as ArrayBuffer)
  return [...out]
}

export type TableRequest =
  | { readonly kind: 'numeric'; readonly file: CsvSource; readonly spec: NumericTableSpec }
  | { readonly kind: 'elements'; readonly file: CsvSource; readonly spec: ElementTableSpec }

export type TableOutcome =
  | { readonly ok: true; readonly table: NumericTable | ElementTable }
  | { readonly ok: false; readonly error: InputError }

/**
 * Reads the tables in pieces over the calling thread and `lanes`; per file object its table or
 * its input error. null when a lane failed (the caller then reads on one thread).
 */
export async function readTablesInPieces<F extends CsvSource>(requests: readonly (TableRequest & { readonly file: F })[], lanes: readonly PieceLane[]): Promise<Map<F, TableOutcome> | null> {
  if (lanes.length && lanes.every((l) => l.stream) && canBlock()) return readTablesStreamed(requests, lanes.map((l) => l.stream!))
  const P = lanes.length + 1
  interface Opened { readonly request: TableRequest & { readonly file: F }; readonly open: ReturnType<typeof openNumericTable> | ReturnType<typeof openElementTable> | null; readonly error: InputError | null; readonly pieces: number }
  const opened: Opened[] = []
  const laneJobs: PieceJob[][] = lanes.map(() => [])
  const localJobs: PieceJob[] = []
  for (const r of requests) {
    try {
      // The bytes once: a file may read them from disk on each access (src/cli/loadModel.ts).
      const bytes = sourceBytes(r.file)
      const open = r.kind === 'numeric' ? openNumericTable(r.file.name, bytes, r.spec) : openElementTable(r.file.name, bytes, r.spec)
      const pieces = splitAtRecords(bytes, open.cur.pos, open.cur.line, P)
      pieces.forEach((p, k) => {
        // This thread reads its piece in place; a lane gets a copy of its bytes, moved by transfer.
        const piece = k === 0 ? { bytes, start: p.start, end: p.end, offset: 0 } : { bytes: bytes.slice(p.start, p.end), start: 0, end: p.end - p.start, offset: p.start }
        const job: PieceJob = r.kind === 'numeric'
          ? { kind: 'numeric', setup: (open as ReturnType<typeof openNumericTable>).setup, ...piece, line: p.line }
          : { kind: 'elements', setup: (open as ReturnType<typeof openElementTable>).setup, ...piece, line: p.line }
        ;(k === 0 ? localJobs : laneJobs[k - 1]).push(job)
      })
      opened.push({ request: r, open, error: null, pieces: pieces.length })
    } catch (e) {
      if (!isInputError(e)) throw e
      opened.push({ request: r, open: null, error: e, pieces: 0 })
    }
  }
  // Send the lanes their pieces first, then read this thread's while they work.
  const sent = lanes.map((lane, k) => (laneJobs[k].length ? lane(laneJobs[k]) : Promise.resolve([])))
  sent.forEach((p) => p.catch(() => undefined))
  const local = localJobs.map(readPiece)
  let remote: (readonly PieceOutcome[])[]
  try {
    remote = await Promise.all(sent)
  } catch {
    return null
  }
  // Piece k of table t: local[t'] for k = 0, else the next result of lane k - 1 (jobs were queued in table order).
  const next = remote.map(() => 0)
  let nextLocal = 0
  const out = new Map<F, TableOutcome>()
  for (const o of opened) {
    if (!o.open) { out.set(o.request.file, { ok: false, error: o.error! }); continue }
    const results: PieceOutcome[] = []
    for (let k = 0; k < o.pieces; k++) results.push(k === 0 ? local[nextLocal++] : remote[k - 1][next[k - 1]++])
    const failed = results.find((r) => !r.ok)
    if (failed && !failed.ok) {
      out.set(o.request.file, { ok: false, error: new InputError(failed.error.kind, failed.error.message, failed.error.where) })
      continue
    }
    try {
      const table = o.request.kind === 'numeric'
        ? finishNumericTable(o.open as ReturnType<typeof openNumericTable>, results.map((r) => (r as { rows: NumericRows }).rows))
        : finishElementTable(o.open as ReturnType<typeof openElementTable>, results.map((r) => (r as { blocks: RawElementBlock[] }).blocks))
      out.set(o.request.file, { ok: true, table })
    } catch (e) {
      if (!isInputError(e)) throw e
      out.set(o.request.file, { ok: false, error: e })
    }
  }
  return out
}

/** An InputError's message without the place prefix its constructor wrote from `where`. */
function bareMessage(e: InputError): string {
  const again = new InputError(e.kind, '', e.where).message
  return e.message.startsWith(again) ? e.message.slice(again.length) : e.message
}
