/**
 * Load-entry patches: where does load enter or leave the body?
 *
 * The rule (ours, stated here so a reader can reproduce every number):
 * 1. Reference stress σ_ref = the 95th percentile of the nodal von Mises stress over all nodes
 *    (the display invariants, NodalInvariants.vonMises, so element-nodal stress needs no path here).
 *    A high percentile rather than the maximum, so one singular node (a re-entrant corner, a
 *    point load) does not decide what counts as "loaded".
 * 2. A boundary face is loaded when its mean traction magnitude ∫|t| dA / A exceeds
 *    threshold = `threshold` · σ_ref (`threshold` defaults to 0.05, i.e. 5 %). When σ_ref = 0
 *    (an unstressed body) nothing is loaded.
 * 3. Loaded faces that share an edge (two corner nodes) belong to the same patch (union–find
 *    over typed arrays; edges matched by bucketing on their smaller node).
 * 4. Per patch: face count, area, area centroid c, force ∫ t dA, moment ∫ (x - c) × t dA,
 *    peak |t| at its face nodes, mean ∫|t| dA / area. Patches are sorted by |force|,
 *    largest first, and numbered 0, 1, ... in that order.
 * 5. Every other boundary face is the nominally free surface: its area, mean |t|, that mean
 *    relative to σ_ref, and its peak nodal |t| tell how far the result is from traction-free.
 */
import { FACE_KINDS } from '../model/elementTypes.ts'
import type { Mesh, Vec3 } from '../model/model.ts'
import { percentiles } from './balanceAudit.ts'
import type { BoundaryFaces, LoadPatch, LoadPatches, SurfaceTractions } from './types.ts'
import { momentAbout } from './vec3.ts'

/** Corners and nodes per face kind code, read once from the element registry. */
const CORNERS_BY_CODE = FACE_KINDS.map((k) => k.cornerCount)
const NODES_BY_CODE = FACE_KINDS.map((k) => k.nodeCount)

export interface LoadPatchOptions {
  /** Fraction of the reference stress above which a face's mean |t| counts as loaded (default 0.05). */
  readonly threshold?: number
}

/**
 * The patches of `faces` (boundary faces of `mesh`) from their `tractions`; `vonMises` (N) is the
 * nodal von Mises stress the reference stress is taken from (NodalInvariants.vonMises).
 */
export function findLoadPatches(mesh: Mesh, faces: BoundaryFaces, tractions: SurfaceTractions, vonMises: ArrayLike<number>, options: LoadPatchOptions = {}): LoadPatches {
  const fraction = options.threshold ?? 0.05
  const N = mesh.nodeCount, F = faces.count
  if (vonMises.length !== N) throw new RangeError(`${vonMises.length} nodal von Mises values for ${N} nodes`)
  const ref = N > 0 ? percentiles(vonMises, [95])[0] : 0
  const referenceStress = Number.isFinite(ref) ? ref : 0
  const threshold = fraction * referenceStress

  const meanMag = tractions.meanMagnitude
  const loaded = new Uint8Array(F)
  for (let f = 0; f < F; f++) if (referenceStress > 0 && meanMag[f] > threshold) loaded[f] = 1

  // Union–find over loaded faces.
  const parent = new Int32Array(F)
  for (let f = 0; f < F; f++) parent[f] = f
  const find = (a: number): number => {
    while (parent[a] !== a) { parent[a] = parent[parent[a]]; a = parent[a] }
    return a
  }

  // Edges of loaded faces bucketed by their smaller node (CSR), each with its larger node.
  const nodes = faces.nodes, kind = faces.kind, S = faces.slots
  const start = new Int32Array(N + 1)
  let edgeCount = 0
  for (let f = 0; f < F; f++) {
    if (!loaded[f]) continue
    const nc = CORNERS_BY_CODE[kind[f]], o = S * f
    for (let c = 0; c < nc; c++) {
      const a = nodes[o + c], b = nodes[o + (c + 1) % nc]
      start[(a < b ? a : b) + 1]++
      edgeCount++
    }
  }
  for (let i = 0; i < N; i++) start[i + 1] += start[i]
  const cursor = start.slice(0, N)
  const edgeFace = new Int32Array(edgeCount), edgeOther = new Int32Array(edgeCount)
  for (let f = 0; f < F; f++) {
    if (!loaded[f]) continue
    const nc = CORNERS_BY_CODE[kind[f]], o = S * f
    for (let c = 0; c < nc; c++) {
      const a = nodes[o + c], b = nodes[o + (c + 1) % nc]
      const lo = a < b ? a : b, hi = a < b ? b : a
      const p = cursor[lo]++
      edgeFace[p] = f; edgeOther[p] = hi
    }
  }
  for (let n = 0; n < N; n++) {
    // Buckets are small (the loaded faces around one node): pairwise matching is cheapest.
    const s = start[n], t = start[n + 1]
    for (let i = s; i < t; i++) for (let j = i + 1; j < t; j++) {
      if (edgeOther[i] !== edgeOther[j]) continue
      const ra = find(edgeFace[i]), rb = find(edgeFace[j])
      if (ra !== rb) parent[ra < rb ? rb : ra] = ra < rb ? ra : rb
    }
  }

  // Accumulate per root.
  const rootIndex = new Int32Array(F).fill(-1)
  let P = 0
  for (let f = 0; f < F; f++) if (loaded[f]) { const r = find(f); if (rootIndex[r] < 0) rootIndex[r] = P++ }
  const cnt = new Int32Array(P), area = new Float64Array(P), cen = new Float64Array(3 * P), nrm = new Float64Array(3 * P)
  const force = new Float64Array(3 * P), mom = new Float64Array(3 * P), peak = new Float64Array(P), magInt = new Float64Array(P)
  const nodeMag = tractions.nodeMagnitude
  let freeArea = 0, freeInt = 0, freePeak = 0
  for (let f = 0; f < F; f++) {
    const A = faces.area[f]
    let pk = 0
    const nn = NODES_BY_CODE[kind[f]]
    for (let a = 0; a < nn; a++) { const m = nodeMag[S * f + a]; if (m > pk) pk = m }
    if (!loaded[f]) {
      freeArea += A; freeInt += meanMag[f] * A
      if (pk > freePeak) freePeak = pk
      continue
    }
    const p = rootIndex[find(f)]
    cnt[p]++
    area[p] += A
    for (let k = 0; k < 3; k++) {
      cen[3 * p + k] += A * faces.centroid[3 * f + k]
      nrm[3 * p + k] += A * faces.normal[3 * f + k]
      force[3 * p + k] += tractions.force[3 * f + k]
      mom[3 * p + k] += tractions.moment[3 * f + k]
    }
    magInt[p] += meanMag[f] * A
    if (pk > peak[p]) peak[p] = pk
  }

  const patches: LoadPatch[] = []
  for (let p = 0; p < P; p++) {
    const A = area[p]
    const c: Vec3 = A > 0 ? [cen[3 * p] / A, cen[3 * p + 1] / A, cen[3 * p + 2] / A] : [0, 0, 0]
    const Fv: Vec3 = [force[3 * p], force[3 * p + 1], force[3 * p + 2]]
    // Moment about the patch centroid: M_c = M_0 - c × F.
    const M = momentAbout<Vec3>([0, 0, 0], mom.subarray(3 * p, 3 * p + 3), c, Fv)
    const n: Vec3 = A > 0 ? [nrm[3 * p] / A, nrm[3 * p + 1] / A, nrm[3 * p + 2] / A] : [0, 0, 0]
    patches.push({ id: p, faceCount: cnt[p], area: A, centroid: c, normal: n, force: Fv, moment: M, peak: peak[p], mean: A > 0 ? magInt[p] / A : 0 })
  }
  // Sort by |force| descending (ties by area, then by first face) and renumber.
  const order = patches.map((_, i) => i).sort((a, b) =>
    Math.hypot(...patches[b].force) - Math.hypot(...patches[a].force) || patches[b].area - patches[a].area || a - b)
  const newId = new Int32Array(P)
  order.forEach((old, rank) => { newId[old] = rank })
  const sorted = order.map((old, rank) => ({ ...patches[old], id: rank }))
  const faceLabel = new Int32Array(F).fill(-1)
  for (let f = 0; f < F; f++) if (loaded[f]) faceLabel[f] = newId[rootIndex[find(f)]]

  const freeMean = freeArea > 0 ? freeInt / freeArea : 0
  return {
    patches: sorted,
    faceLabel,
    threshold,
    referenceStress,
    freeSurface: { area: freeArea, mean: freeMean, relative: referenceStress > 0 ? freeMean / referenceStress : 0, peak: freePeak },
  }
}
