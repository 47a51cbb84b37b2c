/**
 * Worker threads for reading CSV tables in pieces (src/io/csvPieces.ts) in the command line and
 * the benchmarks: one lane per extra core (at most `max`). Workers start at once, so they load
 * their code while the files are read from disk. A worker that fails rejects its lane's call, and
 * the reader then reads on one thread.
 */
import os from 'node:os'
import { Worker } from 'node:worker_threads'
import { jobBuffers } from '../io/csvPieces.ts'
import type { PieceJob, PieceLane, PieceOutcome } from '../io/csvPieces.ts'
import type { StreamLane, StreamResult, StreamSetup } from '../io/csvPieceStream.ts'

/** Bundles below this many characters are read on one thread: starting a worker costs more. */
export const PIECES_MIN_CHARS = 16 * 2 ** 20

export interface CsvLanes {
  readonly lanes: readonly PieceLane[]
  /** True once every worker has loaded its code, false if one failed or `ms` passed first. */
  readyWithin(ms: number): Promise<boolean>
  /** Ends the workers (the process may then exit). */
  close(): Promise<void>
}

/** Starts `count` piece workers (default: one per core but this thread's, at most 3). */
export function startCsvLanes(count = Math.min(3, Math.max(0, availableCores() - 1))): CsvLanes {
  const workers: Worker[] = []
  const lanes: PieceLane[] = []
  const ready: Promise<boolean>[] = []
  for (let k = 0; k < count; k++) {
    const w = new Worker(new URL('./csvPieceWorker.mjs', import.meta.url))
    w.unref()
    workers.push(w)
    let nextId = 0
    let dead: Error | null = null
    let up: (ok: boolean) => void = () => undefined
    ready.push(new Promise<boolean>((r) => { up = r }))
    const failAll = (e: Error) => { dead = dead ?? e; up(false); for (const p of waiting.values()) p.reject(e); waiting.clear() }
    const waiting = new Map<number, { resolve: (o: never) => void; reject: (e: Error) => void }>()
    w.on('message', (m: { id: number; ready?: boolean; out?: PieceOutcome[]; streamed?: StreamResult; failure?: string }) => {
      if (m.ready) { up(true); return }
      const p = waiting.get(m.id)
      if (!p) return
      waiting.delete(m.id)
      const answer = m.out ?? m.streamed
      if (answer) p.resolve(answer as never); else p.reject(new Error(m.failure ?? 'a CSV worker failed'))
      if (waiting.size === 0) w.unref()
    })
    w.on('error', (e) => failAll(e))
    w.on('exit', (code) => failAll(new Error(`a CSV worker stopped (exit ${code})`)))
    const call = <T>(message: { jobs: readonly PieceJob[] } | { stream: StreamSetup }, transfer: ArrayBuffer[]) => new Promise<T>((resolve, reject) => {
      if (dead) { reject(dead); return }
      const id = nextId++
      waiting.set(id, { resolve: resolve as (o: never) => void, reject })
      // Held while it works, so the process waits for the answer.
      w.ref()
      w.postMessage({ id, ...message }, transfer)
    })
    // The ring and the shared arrays are shared by the message itself (nothing to transfer).
    const stream: StreamLane = (setup) => call<StreamResult>({ stream: setup }, [])
    lanes.push(Object.assign((jobs: readonly PieceJob[]) => call<readonly PieceOutcome[]>({ jobs }, jobBuffers(jobs)), { stream }))
  }
  return {
    lanes,
    async readyWithin(ms) {
      let timer: ReturnType<typeof setTimeout> | undefined
      const late = new Promise<boolean>((r) => { timer = setTimeout(() => r(false), ms) })
      const ok = await Promise.race([Promise.all(ready).then((r) => r.every(Boolean)), late])
      clearTimeout(timer)
      return ok
    },
    close: async () => { await Promise.all(workers.map((w) => w.terminate())) },
  }
}

function availableCores(): number {
  return typeof os.availableParallelism === 'function' ? os.availableParallelism() : os.cpus().length
}
