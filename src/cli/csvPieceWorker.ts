/**
 * A worker thread of the command line and the benchmarks that reads pieces of CSV tables
 * (src/io/csvPieces.ts) and moves their rows back by transfer, or reads the pieces streamed to it
 * into shared arrays (src/io/csvPieceStream.ts). Keeps nothing between messages.
 * Started through csvPieceWorker.mjs; says "ready" once its code is loaded.
 */
import { parentPort } from 'node:worker_threads'
import { pieceBuffers, readPiece } from '../io/csvPieces.ts'
import type { PieceJob } from '../io/csvPieces.ts'
import { readStreamedPieces, streamBuffers } from '../io/csvPieceStream.ts'
import type { StreamSetup } from '../io/csvPieceStream.ts'

parentPort!.on('message', (msg: { id: number; jobs?: PieceJob[]; stream?: StreamSetup }) => {
  try {
    if (msg.stream) {
      const streamed = readStreamedPieces(msg.stream)
      parentPort!.postMessage({ id: msg.id, streamed }, streamBuffers(streamed))
      return
    }
    const out = msg.jobs!.map(readPiece)
    parentPort!.postMessage({ id: msg.id, out }, out.flatMap(pieceBuffers))
  } catch (e) {
    parentPort!.postMessage({ id: msg.id, failure: e instanceof Error ? e.message : String(e) })
  }
})

parentPort!.postMessage({ ready: true })
