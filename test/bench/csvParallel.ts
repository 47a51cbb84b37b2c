/**
 * The CSV read in pieces on worker threads (src/io/csvPieces.ts, streamed by csvPieceStream.ts
 * through src/cli/csvLanes.ts, as the command line reads a large bundle) against the one-thread
 * read of the same texts, runs interleaved so both see the same load; wall times (the point is
 * the second core) with the load average beside them. The workers are started once and reused;
 * their start-up is reported apart (`startMs`). Checks (the same model bit for bit) run outside
 * the timed runs.
 *
 * On a busy machine the wall time says little, so the CPU time of each thread is measured too
 * (Linux: /proc/thread-self/stat for this thread, the process's CPU time less that for the
 * workers): `vsOneThreadCpu` is the one-thread read's CPU time over that of the busier side, the
 * speed-up two free cores would give if neither side waited for the other (the read waits only
 * at its end, for the slower side).
 * Run alone: npx tsx test/bench/csvParallel.ts [elements=1000000] [type=tet4] [runs=3]
 */
import { readFileSync } from 'node:fs'
import os from 'node:os'
import { fileURLToPath } from 'node:url'
import { readCsvBundle, readCsvBundleInPieces, writeCsvBundle } from '../../src/io/index.ts'
import { asDiskFiles, bytesOfFiles } from './diskFiles.ts'
import type { CsvFile, ReadModel } from '../../src/io/index.ts'
import type { Model } from '../../src/model/model.ts'
import { startCsvLanes } from '../../src/cli/csvLanes.ts'
import type { CsvLanes } from '../../src/cli/csvLanes.ts'
import { median, settle } from './timing.ts'
import { syntheticModel } from './syntheticModel.ts'

export interface ParallelCsvFigure {
  /** Median wall time of the read in pieces (ms). */
  medianMs: number
  mbPerS: number
  /** One-thread median over pieces median, from the interleaved runs. */
  vsOneThread: number
  oneThreadMs: number
  /** Threads reading: this one and the workers. */
  threads: number
  runs: number
  /** Load average (1 min) at the start and the end of the runs. */
  loadAverage: [number, number]
  /** Same model as the one-thread read (coordinates, connectivity, stress, ids). */
  same: boolean
  /** Medians of the CPU time (ms) of the one-thread read, and of the read in pieces on this thread and on the workers (null where the thread's time cannot be read). */
  oneThreadCpuMs: number
  mainCpuMs: number | null
  lanesCpuMs: number | null
  /** One-thread CPU time over the busier side's (median over the runs), or null. */
  vsOneThreadCpu: number | null
}

/** CPU time of the calling thread (ms), from /proc/thread-self/stat (Linux, 10 ms ticks), or null. */
function threadCpuMs(): number | null {
  try {
    const f = readFileSync('/proc/thread-self/stat', 'utf8').split(') ')[1].split(' ')
    // Fields 14 and 15 of stat (utime, stime) in clock ticks of 10 ms.
    return (Number(f[11]) + Number(f[12])) * 10
  } catch {
    return null
  }
}

function processCpuMs(): number {
  const c = process.cpuUsage()
  return (c.user + c.system) / 1e3
}

function sameModel(a: ReadModel, b: ReadModel): boolean {
  const eq = (x: ArrayLike<number>, y: ArrayLike<number>) => x.length === y.length && Array.prototype.every.call(x, (v: number, i: number) => Object.is(v, y[i]))
  return eq(a.mesh.coords, b.mesh.coords) && eq(a.mesh.nodeIds, b.mesh.nodeIds) && eq(a.stress, b.stress)
    && a.mesh.blocks.length === b.mesh.blocks.length && a.mesh.blocks.every((x, k) => eq(x.conn, b.mesh.blocks[k].conn) && eq(x.ids, b.mesh.blocks[k].ids))
}

/** Starts the worker threads once (one per core but this one) and says how long they took to come up. */
export async function startBenchLanes(): Promise<{ lanes: CsvLanes; startMs: number; up: boolean }> {
  const t = performance.now()
  const lanes = startCsvLanes()
  const up = await lanes.readyWithin(60_000)
  return { lanes, startMs: performance.now() - t, up }
}

export async function benchCsvParallel(model: Model, lanes: CsvLanes, runs = 3): Promise<ParallelCsvFigure> {
  const files: CsvFile[] = asDiskFiles(writeCsvBundle(model))
  const bytes = bytesOfFiles(files)
  const load0 = os.loadavg()[0]
  // Warm-up of both paths (the workers' code too: the first type benched finds them cold, and
  // their compile jobs would count as the lanes' CPU time), and the check.
  const one0 = readCsvBundle(files)
  const same = sameModel(one0, await readCsvBundleInPieces(files, {}, lanes.lanes))
  readCsvBundle(files)
  await readCsvBundleInPieces(files, {}, lanes.lanes)
  const oneMs: number[] = [], piecesMs: number[] = [], oneCpu: number[] = [], mainCpu: number[] = [], lanesCpu: number[] = [], ratioCpu: number[] = []
  for (let r = 0; r < runs; r++) {
    // before each read a collection and its background sweeping, as in timing.ts: the last
    // read's model is not freed inside the next
    settle()
    let t = performance.now(), c = processCpuMs()
    readCsvBundle(files)
    oneMs.push(performance.now() - t)
    oneCpu.push(processCpuMs() - c)
    settle()
    const m = threadCpuMs()
    t = performance.now(); c = processCpuMs()
    await readCsvBundleInPieces(files, {}, lanes.lanes)
    piecesMs.push(performance.now() - t)
    const all = processCpuMs() - c, main = m === null ? null : threadCpuMs()! - m
    if (main !== null) {
      mainCpu.push(main); lanesCpu.push(all - main)
      ratioCpu.push(oneCpu[r] / Math.max(main, all - main))
    }
  }
  const medianMs = median(piecesMs), oneThreadMs = median(oneMs)
  return {
    medianMs, mbPerS: bytes / 1e3 / medianMs, vsOneThread: oneThreadMs / medianMs, oneThreadMs, threads: lanes.lanes.length + 1, runs,
    loadAverage: [load0, os.loadavg()[0]], same,
    oneThreadCpuMs: median(oneCpu), mainCpuMs: mainCpu.length ? median(mainCpu) : null, lanesCpuMs: lanesCpu.length ? median(lanesCpu) : null,
    vsOneThreadCpu: ratioCpu.length ? median(ratioCpu) : null,
  }
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const elements = Number(process.argv[2] ?? 1e6)
  const type = (process.argv[3] ?? 'tet4') as 'tet4' | 'tet10' | 'hex8'
  const { lanes, startMs, up } = await startBenchLanes()
  const fig = await benchCsvParallel(syntheticModel(type, elements, 20261201), lanes, Number(process.argv[4] ?? 3))
  await lanes.close()
  console.log(JSON.stringify({ bench: 'csvParallel', type, elements, startMs, up, ...fig }))
}
