/**
 * The stress jump at nodes: how much the elements meeting at a node disagree about its stress,
 * a map of where the mesh is too coarse for the field it carries. Element-nodal (unaveraged)
 * stress only; for nodal stress every element reads the node's one value and the jump is zero.
 *
 * Definition (ours): within one part p, let σ̄ₚ(n) be the mean of the element-node values of the
 * elements of p at node n. The jump of p at n is
 *
 *     Jₚ(n) = max over elements e of p at n of  vM(σₑ(n) − σ̄ₚ(n))  /  max(vM(σ̄ₚ(n)), 0.01·σ_ref)
 *
 * with vM the von Mises value of a stress tensor (of the deviation here, so a jump in pressure
 * alone does not count: a difference in hydrostatic stress is not what a coarse mesh shows first
 * in a von Mises plot), and σ_ref the model's reference stress (the 95th percentile of the nodal
 * von Mises, as for the load-entry patches). The floor of 1 % of σ_ref keeps nodes where the
 * stress is near zero (a neutral axis) from reading as large jumps over round-off. J(n) is the
 * largest Jₚ(n) over the parts at n: the jump across a joint between parts is physics (another
 * material, a contact), not mesh error, and is left out by averaging within each part only.
 * Dimensionless: 0.1 means the elements at the node disagree by a tenth of its stress.
 *
 * Layout: `out` Float32Array(N) (single precision is plenty for a colour), 0 at nodes no element
 * uses. Cost: the element-nodes ordered by part once (counting sort: a node and a row index
 * each, 8 bytes an element-node), then two passes over them and one over the part's nodes;
 * work arrays of 6N + 3N numbers, no allocation in the loops.
 */
import type { Mesh } from '../model/model.ts'
import type { StressField } from '../model/stressField.ts'

/** Share of the reference stress below which a node's own stress no longer scales its jump. */
export const STRESS_JUMP_FLOOR = 0.01

export function allocateStressJump(nodeCount: number): Float32Array {
  return new Float32Array(nodeCount)
}

/** von Mises of the 6-vector at a[o..o+5] (xx, yy, zz, xy, yz, xz). */
function vm(a: Float64Array, o: number): number {
  const dxy = a[o] - a[o + 1], dyz = a[o + 1] - a[o + 2], dzx = a[o + 2] - a[o]
  return Math.sqrt(0.5 * (dxy * dxy + dyz * dyz + dzx * dzx) + 3 * (a[o + 3] * a[o + 3] + a[o + 4] * a[o + 4] + a[o + 5] * a[o + 5]))
}

/** The stress jump J(n) of `field` on `mesh` into `out` (see the file's opening comment). */
export function computeStressJump(out: Float32Array, mesh: Mesh, field: StressField, referenceStress: number): Float32Array {
  const N = mesh.nodeCount
  out.fill(0)
  if (field.layout === 'nodal') return out // every element reads the node's one value
  const floor = STRESS_JUMP_FLOOR * Math.max(0, referenceStress)
  const v = field.values
  const blocks = mesh.blocks

  // Element-nodes ordered by part (counting sort over the distinct part numbers): the node and
  // the stress row of each, so the passes below run over one part's element-nodes in a row.
  const slotOfPart = new Map<number, number>()
  const slotOfBlockElement = blocks.map((b) => {
    const slots = new Int32Array(b.ids.length)
    for (let e = 0; e < b.ids.length; e++) {
      const p = b.part ? b.part[e] : 0
      let s = slotOfPart.get(p)
      if (s === undefined) { s = slotOfPart.size; slotOfPart.set(p, s) }
      slots[e] = s
    }
    return slots
  })
  const P = slotOfPart.size
  const start = new Int32Array(P + 1)
  blocks.forEach((b, k) => {
    const nn = b.conn.length / Math.max(1, b.ids.length), slots = slotOfBlockElement[k]
    for (let e = 0; e < b.ids.length; e++) start[slots[e] + 1] += nn
  })
  for (let s = 0; s < P; s++) start[s + 1] += start[s]
  const nodeOf = new Int32Array(start[P]), rowOf = new Int32Array(start[P])
  const fill = start.slice(0, P)
  blocks.forEach((b, k) => {
    const E = b.ids.length, nn = E > 0 ? b.conn.length / E : 0, slots = slotOfBlockElement[k], conn = b.conn, rows = field.rows[k]
    for (let e = 0, i = 0; e < E; e++) {
      let at = fill[slots[e]]
      for (let end = i + nn; i < end; i++, at++) { nodeOf[at] = conn[i]; rowOf[at] = rows[i] }
      fill[slots[e]] = at
    }
  })

  const sum = new Float64Array(6 * N)
  const count = new Int32Array(N)
  const worst = new Float64Array(N)
  const touched = new Int32Array(N)
  for (let s = 0; s < P; s++) {
    let T = 0
    // Pass 1: the part's mean at each of its nodes.
    for (let i = start[s]; i < start[s + 1]; i++) {
      const n = nodeOf[i], r = 6 * rowOf[i], o = 6 * n
      if (count[n] === 0) touched[T++] = n
      count[n]++
      sum[o] += v[r]; sum[o + 1] += v[r + 1]; sum[o + 2] += v[r + 2]
      sum[o + 3] += v[r + 3]; sum[o + 4] += v[r + 4]; sum[o + 5] += v[r + 5]
    }
    for (let t = 0; t < T; t++) {
      const n = touched[t], o = 6 * n, w = 1 / count[n]
      sum[o] *= w; sum[o + 1] *= w; sum[o + 2] *= w; sum[o + 3] *= w; sum[o + 4] *= w; sum[o + 5] *= w
    }
    // Pass 2: the largest deviation of an element's value from the mean.
    for (let i = start[s]; i < start[s + 1]; i++) {
      const n = nodeOf[i], r = 6 * rowOf[i], o = 6 * n
      const xx = v[r] - sum[o], yy = v[r + 1] - sum[o + 1], zz = v[r + 2] - sum[o + 2]
      const xy = v[r + 3] - sum[o + 3], yz = v[r + 4] - sum[o + 4], xz = v[r + 5] - sum[o + 5]
      // von Mises squared of the deviation; the root is taken once per node below.
      const a = xx - yy, b = yy - zz, c = zz - xx
      const dev2 = 0.5 * (a * a + b * b + c * c) + 3 * (xy * xy + yz * yz + xz * xz)
      if (dev2 > worst[n]) worst[n] = dev2
    }
  // Pass 3: scale, keep the largest over the parts, and clear the work arrays for the next part.
    for (let t = 0; t < T; t++) {
      const n = touched[t], o = 6 * n
      const scale = Math.max(vm(sum, o), floor)
      // A node whose stress and deviation are both zero (an unloaded part) has no jump.
      const dev = Math.sqrt(worst[n])
      const j = dev > 0 ? (scale > 0 ? dev / scale : Infinity) : 0
      if (j > out[n]) out[n] = j
      count[n] = 0; worst[n] = 0
      sum[o] = 0; sum[o + 1] = 0; sum[o + 2] = 0; sum[o + 3] = 0; sum[o + 4] = 0; sum[o + 5] = 0
    }
  }
  return out
}
