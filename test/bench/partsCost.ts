/**
 * What assemblies add to a load at about 10^6 elements: the per-part work (the part list, and with
 * two parts or more each part's boundary faces, tractions and balance and the interfaces between
 * parts, partBalance.ts, and the surface's triangles grouped by part: the engine's whole assembly
 * step at load, loadAssembly in workers/assembly.ts, with the load's own boundary faces, tractions,
 * patch labels and surface triangles; the triangles are built untimed, and not counted in the
 * load either, though the engine's load builds them) and the faces
 * against parts meshed apart (interfaceFaces.ts, run inside the patches stage), and what the
 * boundary extraction spends recording the faces between parts (partPairs.ts: the extraction
 * with the part numbers minus without them, both timed in each round), beside the whole
 * load (native read, then every stage of analysisPipeline.ts: faces, tractions, invariants,
 * element and body balance, patches, verdict). Rounds interleave the load and the part work, so a
 * load change on a shared machine hits both alike. Before each timed step a garbage collection,
 * then 50 ms for its background threads to finish (process.cpuUsage counts every thread), so no
 * step is billed for the garbage of the one before: without it the last round's model was freed
 * in the next load (about 100 ms), which made the load look longer and the parts' share smaller,
 * or in a part step that happened to collect it. Lowest and median CPU time
 * (process.cpuUsage: this process only) and wall time. `added` = (parts + interface faces) /
 * (load without them; the extraction's part in the wall-time figure is its CPU difference).
 * `npm run bench` runs it on a one-part tet4 block with a part column and on the same block as
 * four slabs of parts sharing nodes.
 * Run alone: npx tsx test/bench/partsCost.ts [parts] [rounds]
 */
import os from 'node:os'
import { fileURLToPath } from 'node:url'
import type { Model } from '../../src/model/model.ts'
import { readNative, writeNative } from '../../src/io/index.ts'
import { runAnalysis, analysisInputOf } from '../../src/mechanics/analysisPipeline.ts'
import { partNumbers } from '../../src/mechanics/partBalance.ts'
import { loadAssembly } from '../../workers/assembly.ts'
import { jumpOf } from '../../workers/casePicture.ts'
import { buildSurfaceTriangles } from '../../src/mechanics/surfaceTriangles.ts'
import type { AnalysisResult } from '../../src/mechanics/analysisPipeline.ts'
import type { StressField } from '../../src/model/stressField.ts'
import { coincidentInterfaceFaces } from '../../src/mechanics/interfaceFaces.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import type { BoundaryFaces } from '../../src/mechanics/types.ts'
import { syntheticModel } from './syntheticModel.ts'
import { settle } from './timing.ts'

export interface PartsCost {
  parts: number
  elements: number
  interfaces: number
  rounds: number
  /** Lowest and median CPU ms of: the whole load, the part work, the interface faces alone. */
  loadCpuMs: { min: number; median: number }
  partsCpuMs: { min: number; median: number }
  interfaceFacesCpuMs: { min: number; median: number }
  /**
   * What recording the faces between parts adds to the load's boundary extraction (partPairs.ts):
   * the extraction of the model minus that of the same mesh without its part numbers, lowest and
   * median CPU ms (at least 0), counted with the part work in `added…`.
   */
  extractionPartsCpuMs: { min: number; median: number }
  loadWallMs: { min: number; median: number }
  partsWallMs: { min: number; median: number }
  interfaceFacesWallMs: { min: number; median: number }
  /** (parts + interface faces + extraction's part pairs) / (load − interface faces − extraction's part pairs), from the lowest and the median CPU times. */
  addedMin: number
  addedMedian: number
  /** The same from the median wall times. */
  addedMedianWall: number
  loadAverage: number
}

/** Each boundary face's part (0 without). */
function faceParts(model: Model, faces: BoundaryFaces): Int32Array {
  const out = new Int32Array(faces.count)
  const b = model.mesh.blocks
  for (let f = 0; f < faces.count; f++) {
    let k = b.length - 1
    while (k > 0 && b[k].offset > faces.elem[f]) k--
    out[f] = b[k].part ? b[k].part![faces.elem[f] - b[k].offset] : 0
  }
  return out
}

const stat = (a: number[]) => { const s = [...a].sort((x, y) => x - y); return { min: s[0], median: s[s.length >> 1] } }

export function partsCost(model: Model, rounds = 5): PartsCost {
  const bytes = writeNative(model)
  let interfaces = 0
  const load = () => {
    const m = readNative(bytes, 'bench.tractus')
    const input = analysisInputOf(m)
    return { m, stress: input.stress, r: runAnalysis(input, { balancePrecision: 'single' }) }
  }
  // the surface triangles of the load (untimed: the engine builds them with or without parts)
  const triangles = (m: Model, stress: StressField, r: AnalysisResult) =>
    buildSurfaceTriangles(m.mesh.coords, r.faces, r.tractions, r.invariants, r.elementBalance.indicator, r.loadPatches.faceLabel, jumpOf(m.mesh, stress, r.loadPatches))
  // the engine's assembly step (loadAssembly): the part list, and the assembly only with two parts or more
  const parts = (m: Model, stress: StressField, r: AnalysisResult, tri: ReturnType<typeof triangles>) => {
    const asm = loadAssembly(m, stress, r.faces, r.tractions, r.loadPatches.faceLabel, tri.index, tri.triangleFace, tri.faceVertexStart)
    if (!asm) return 0
    interfaces = asm.interfaces.length
    return asm.parts.length
  }
  const timed = <T>(fn: () => T): { value: T; cpu: number; wall: number } => {
    settle()
    const c0 = process.cpuUsage(), w0 = performance.now()
    const value = fn()
    const c = process.cpuUsage(c0)
    return { value, cpu: (c.user + c.system) / 1000, wall: performance.now() - w0 }
  }
  // the same mesh without part numbers: its extraction records no pairs between parts
  const onePart = (m: Model): Model['mesh'] => ({ ...m.mesh, blocks: m.mesh.blocks.map((b) => ({ ...b, part: null })) })
  const loadCpu: number[] = [], partsCpu: number[] = [], faceCpu: number[] = [], loadWall: number[] = [], partsWall: number[] = [], faceWall: number[] = []
  const withPairs: number[] = [], withoutPairs: number[] = []
  for (let i = 0; i < rounds + 1; i++) {
    const l = timed(load)
    const tri = triangles(l.value.m, l.value.stress, l.value.r)
    const p = timed(() => parts(l.value.m, l.value.stress, l.value.r, tri))
    const fp = faceParts(l.value.m, l.value.r.faces)
    const f = timed(() => coincidentInterfaceFaces(l.value.m.mesh.coords, l.value.r.faces, fp))
    const plain = onePart(l.value.m)
    // one untimed extraction first: the first of a pair pays the first touch of its temporaries'
    // memory, which the second reuses (measured: 13–31 ms of difference with no pair to record)
    extractBoundaryFaces(plain)
    const xw = timed(() => extractBoundaryFaces(l.value.m.mesh)), xo = timed(() => extractBoundaryFaces(plain))
    if (i === 0) continue // warm-up
    withPairs.push(xw.cpu); withoutPairs.push(xo.cpu)
    loadCpu.push(l.cpu); partsCpu.push(p.cpu); faceCpu.push(f.cpu); loadWall.push(l.wall); partsWall.push(p.wall); faceWall.push(f.wall)
  }
  const L = stat(loadCpu), P = stat(partsCpu), F = stat(faceCpu), LW = stat(loadWall), PW = stat(partsWall), FW = stat(faceWall)
  const XW = stat(withPairs), XO = stat(withoutPairs)
  const X = { min: Math.max(0, XW.min - XO.min), median: Math.max(0, XW.median - XO.median) }
  return {
    parts: partNumbers(model.mesh).length, elements: model.mesh.elementCount, interfaces, rounds,
    loadCpuMs: L, partsCpuMs: P, interfaceFacesCpuMs: F, extractionPartsCpuMs: X, loadWallMs: LW, partsWallMs: PW, interfaceFacesWallMs: FW,
    addedMin: (P.min + F.min + X.min) / (L.min - F.min - X.min), addedMedian: (P.median + F.median + X.median) / (L.median - F.median - X.median),
    addedMedianWall: (PW.median + FW.median + X.median) / (LW.median - FW.median - X.median),
    loadAverage: os.loadavg()[0],
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const parts = Number(process.argv[2] ?? 4), rounds = Number(process.argv[3] ?? 5)
  const r = partsCost(syntheticModel('tet4', 1e6, 20261201, 0.1, parts), rounds)
  console.log(`tet4, ${r.elements} elements, ${r.parts} part(s), ${r.interfaces} interface(s): load ${r.loadCpuMs.min.toFixed(0)} / ${r.loadCpuMs.median.toFixed(0)} ms CPU (min / median), parts ${r.partsCpuMs.min.toFixed(1)} / ${r.partsCpuMs.median.toFixed(1)} ms, interface faces ${r.interfaceFacesCpuMs.min.toFixed(1)} / ${r.interfaceFacesCpuMs.median.toFixed(1)} ms, pairs in the extraction ${r.extractionPartsCpuMs.min.toFixed(1)} / ${r.extractionPartsCpuMs.median.toFixed(1)} ms: +${(100 * r.addedMin).toFixed(0)} % / +${(100 * r.addedMedian).toFixed(0)} %; wall: parts ${r.partsWallMs.min.toFixed(1)} / ${r.partsWallMs.median.toFixed(1)} ms, +${(100 * r.addedMedianWall).toFixed(0)} % (median); load average ${r.loadAverage.toFixed(1)}`)
  console.log(JSON.stringify(r))
}
