/**
 * A worker thread of the command line and the benchmarks that reads pieces of CSV tables
 * (src/io/csvPieces.ts) and moves their rows back by transfer. Keeps nothing between messages.
 * Started through csvPieceWorker.mjs; says "ready" once its code is loaded.
 */
import { parentPort } from 'node:worker_threads'
import { pieceBuffers, readPiece } from '../io/csvPieces.ts'
import type { PieceJob } from '../io/csvPieces.ts'

parentPort!.on('message', (msg: { id: number; jobs: PieceJob[] }) => {
  try {
    const out = msg.jobs.map(readPiece)
    parentPort!.postMessage({ id: msg.id, out }, out.flatMap(pieceBuffers))
  } catch (e) {
    parentPort!.postMessage({ id: msg.id, failure: e instanceof Error ? e.message : String(e) })
  }
})

parentPort!.postMessage({ ready: true })
