/**
 * Quadratic elements checked before anything is drawn: a mid-edge node listed in another order
 * than ours lands on the wrong edge and gives a wrong picture without a word, so every element of
 * a quadratic type must pass two tests, generic over the type's topology (its corner edges with
 * their mid-edge node in src/model/elementTypes.ts, its shape functions and volume rule in
 * src/mechanics), so a type added to the registry is checked without a change here.
 *
 * 1. Each mid-edge node lies within MID_EDGE_TOLERANCE × |edge| of the midpoint of its edge's
 *    corners. A curved edge on a circle of radius R with chord h bows its midpoint out by the
 *    sagitta R − √(R² − h²/4) ≈ h²/(8R) (common practice): 0.125 h even for h = R, an edge
 *    spanning 57° of arc, far coarser than any mesh that resolves a curve. At 0.25 h the edge
 *    would span 106°. The bound is inclusive, so the quarter-point elements of fracture mechanics
 *    (mid-edge node at a quarter of the edge: Barsoum, IJNME 10 (1976)) still load. A node listed
 *    in another order sits on another edge: for two edges with a common corner, the distance
 *    between their midpoints is half their third edge (the midline of a triangle), 0.5 h in a
 *    regular element. A sliver whose third edge is short slips through this test, as does its
 *    small distortion; the next test still sees a fold.
 * 2. The Jacobian determinant det(∂x/∂ξ) is positive at every point of the type's volume rule:
 *    the map from the reference element does not fold. The readers have already made the corner
 *    volume positive (src/io/elementOrientation.ts), so a non-positive value here means a fold.
 *    Shortcut: where every mid-edge node sits at its edge's midpoint (to STRAIGHT relative to
 *    the edge: the decimal round-off of a written midpoint) and the corners form a simplex (4
 *    corners), the quadratic map is the affine map of the corners (quadratic shape functions
 *    reproduce linear fields), whose det J is the constant 6V > 0: nothing to evaluate. Most
 *    elements of a solver's mesh are such; only curved ones pay for the quadrature loop.
 *
 * Units: coordinates in model length units. `conn` holds 0-based node indices, nodeCount per
 * element, in our local node order. Linear types are not checked (O(elements) only for quadratic
 * types).
 */
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import type { ElementTypeName } from '../model/elementTypes.ts'
import { volumeRule } from '../mechanics/quadrature.ts'
import { shapeDerivatives } from '../mechanics/shapeFunctions.ts'

/** A mid-edge node may lie this fraction of its edge's length from the edge's midpoint. */
export const MID_EDGE_TOLERANCE = 0.25
/** A mid-edge node this close to its edge's midpoint (relative to the edge) counts as straight. */
const STRAIGHT = 1e-10

/** The first element of a block that fails (index within the block). */
export interface QuadraticFinding {
  readonly element: number
  readonly kind: 'mid-edge' | 'jacobian'
  /** Index into the type's `edges` of the offending mid-edge node (for 'jacobian': the node farthest off its midpoint, relative to its edge). */
  readonly edge: number
  /** Distance of that mid-edge node from its edge's midpoint, and the edge's length. */
  readonly offset: number
  readonly edgeLength: number
  /** 'jacobian': the quadrature point (index into the volume rule) and det J there. */
  readonly point: number
  readonly detJ: number
}

/**
 * Checks every element of one block; returns the first failure, or null. Linear types return
 * null at once.
 */
export function checkQuadraticBlock(coords: Float64Array, type: ElementTypeName, conn: Int32Array, plain = false): QuadraticFinding | null {
  const topo = ELEMENT_TYPES[type]
  if (!topo.quadratic) return null
  const nn = topo.nodeCount
  const edges = topo.edges.filter((e) => e[2] >= 0)
  const ne = edges.length
  const edgeNodes = Int32Array.from(edges.flat())
  // Shape-function derivatives at the points of the volume rule, tabulated once per block:
  // dN[(q·nn + a)·3 + k] = ∂N_a/∂ξ_k at point q.
  const rule = volumeRule(type)
  const nq = rule.weights.length
  const dN = new Float64Array(nq * nn * 3)
  const d = new Float64Array(nn * 3)
  for (let q = 0; q < nq; q++) {
    shapeDerivatives(type, rule.points[3 * q], rule.points[3 * q + 1], rule.points[3 * q + 2], d)
    dN.set(d, q * nn * 3)
  }
  const tol2 = MID_EDGE_TOLERANCE * MID_EDGE_TOLERANCE
  const straight2 = STRAIGHT * STRAIGHT
  const simplex = topo.cornerCount === 4
  const x = new Float64Array(nn * 3)
  const count = (conn.length / nn) | 0
  // tet10 in our node order: the straight elements are skipped by a loop written out for them.
  const tet10 = !plain && nn === 10 && simplex && ne === 6 && edgeNodes.every((v, i) => v === TET10_EDGES[i])
  for (let e = 0; e < count; e++) {
    if (tet10) {
      e = nextCurvedTet10(coords, conn, e, count, straight2)
      if (e >= count) break
    }
    const base = e * nn
    // First the mid-edge offsets straight from the coordinates (most elements stop here), then,
    // for curved ones only, the element's nodes gathered for the Jacobian.
    let curved = false
    for (let i = 0; i < ne; i++) {
      const a = 3 * conn[base + edgeNodes[3 * i]], b = 3 * conn[base + edgeNodes[3 * i + 1]], m = 3 * conn[base + edgeNodes[3 * i + 2]]
      const xa = coords[a], ya = coords[a + 1], za = coords[a + 2], xb = coords[b], yb = coords[b + 1], zb = coords[b + 2]
      const ex = xb - xa, ey = yb - ya, ez = zb - za
      const ox = coords[m] - 0.5 * (xa + xb), oy = coords[m + 1] - 0.5 * (ya + yb), oz = coords[m + 2] - 0.5 * (za + zb)
      const l2 = ex * ex + ey * ey + ez * ez, o2 = ox * ox + oy * oy + oz * oz
      if (o2 > tol2 * l2) return finding(e, 'mid-edge', i, o2, l2, -1, 0)
      if (o2 > straight2 * l2) curved = true
    }
    // Straight-sided simplex: det J = 6V > 0 everywhere (see the file's opening comment).
    if (simplex && !curved) continue
    for (let a = 0; a < nn; a++) {
      const p = 3 * conn[base + a]
      x[3 * a] = coords[p]; x[3 * a + 1] = coords[p + 1]; x[3 * a + 2] = coords[p + 2]
    }
    for (let q = 0; q < nq; q++) {
      let j00 = 0, j01 = 0, j02 = 0, j10 = 0, j11 = 0, j12 = 0, j20 = 0, j21 = 0, j22 = 0
      const o = q * nn * 3
      for (let a = 0; a < nn; a++) {
        const da = o + 3 * a
        const d0 = dN[da], d1 = dN[da + 1], d2 = dN[da + 2]
        const xa = x[3 * a], ya = x[3 * a + 1], za = x[3 * a + 2]
        j00 += xa * d0; j01 += xa * d1; j02 += xa * d2
        j10 += ya * d0; j11 += ya * d1; j12 += ya * d2
        j20 += za * d0; j21 += za * d1; j22 += za * d2
      }
      const det = j00 * (j11 * j22 - j12 * j21) - j01 * (j10 * j22 - j12 * j20) + j02 * (j10 * j21 - j11 * j20)
      // Not `det <= 0` alone: NaN from non-finite coordinates counts as a fold too.
      if (!(det > 0)) {
        const worst = worstEdge(x, edgeNodes, ne)
        const a = 3 * edgeNodes[3 * worst], b = 3 * edgeNodes[3 * worst + 1], m = 3 * edgeNodes[3 * worst + 2]
        const l2 = (x[b] - x[a]) ** 2 + (x[b + 1] - x[a + 1]) ** 2 + (x[b + 2] - x[a + 2]) ** 2
        const o2 = (x[m] - 0.5 * (x[a] + x[b])) ** 2 + (x[m + 1] - 0.5 * (x[a + 1] + x[b + 1])) ** 2 + (x[m + 2] - 0.5 * (x[a + 2] + x[b + 2])) ** 2
        return finding(e, 'jacobian', worst, o2, l2, q, det)
      }
    }
  }
  return null
}

/** tet10's corner edges with their mid-edge nodes, (a, b, mid) in our order. */
const TET10_EDGES = [0, 1, 4, 1, 2, 5, 2, 0, 6, 0, 3, 7, 1, 3, 8, 2, 3, 9]

/** o2 − s·l2 for one edge: the mid-edge node's squared offset from the midpoint against s × the squared edge. */
function edgeExcess(ax: number, ay: number, az: number, bx: number, by: number, bz: number, mx: number, my: number, mz: number, s: number): number {
  const ex = bx - ax, ey = by - ay, ez = bz - az
  const ox = mx - 0.5 * (ax + bx), oy = my - 0.5 * (ay + by), oz = mz - 0.5 * (az + bz)
  return ox * ox + oy * oy + oz * oz - s * (ex * ex + ey * ey + ez * ez)
}

/**
 * The first tet10 element from `from` on with a mid-edge node off its midpoint by more than
 * √straight2 × its edge (`count` if none): the ten nodes gathered once into locals (the generic
 * loop reads each corner three times). Such elements go through the generic loop, which also
 * finds the ones off by more than the tolerance.
 */
function nextCurvedTet10(x: Float64Array, conn: Int32Array, from: number, count: number, straight2: number): number {
  const d = edgeExcess
  for (let e = from; e < count; e++) {
    const b = 10 * e
    const p0 = 3 * conn[b], p1 = 3 * conn[b + 1], p2 = 3 * conn[b + 2], p3 = 3 * conn[b + 3]
    const x0 = x[p0], y0 = x[p0 + 1], z0 = x[p0 + 2], x1 = x[p1], y1 = x[p1 + 1], z1 = x[p1 + 2]
    const x2 = x[p2], y2 = x[p2 + 1], z2 = x[p2 + 2], x3 = x[p3], y3 = x[p3 + 1], z3 = x[p3 + 2]
    const m4 = 3 * conn[b + 4], m5 = 3 * conn[b + 5], m6 = 3 * conn[b + 6], m7 = 3 * conn[b + 7], m8 = 3 * conn[b + 8], m9 = 3 * conn[b + 9]
    if (d(x0, y0, z0, x1, y1, z1, x[m4], x[m4 + 1], x[m4 + 2], straight2) > 0
      || d(x1, y1, z1, x2, y2, z2, x[m5], x[m5 + 1], x[m5 + 2], straight2) > 0
      || d(x2, y2, z2, x0, y0, z0, x[m6], x[m6 + 1], x[m6 + 2], straight2) > 0
      || d(x0, y0, z0, x3, y3, z3, x[m7], x[m7 + 1], x[m7 + 2], straight2) > 0
      || d(x1, y1, z1, x3, y3, z3, x[m8], x[m8 + 1], x[m8 + 2], straight2) > 0
      || d(x2, y2, z2, x3, y3, z3, x[m9], x[m9 + 1], x[m9 + 2], straight2) > 0) return e
  }
  return count
}

/** The mid-edge node farthest off its edge's midpoint relative to the edge (x: the element's nodes, 3 a node). */
function worstEdge(x: Float64Array, edgeNodes: Int32Array, ne: number): number {
  let worst = 0, worstRel = -1
  for (let i = 0; i < ne; i++) {
    const a = 3 * edgeNodes[3 * i], b = 3 * edgeNodes[3 * i + 1], m = 3 * edgeNodes[3 * i + 2]
    const l2 = (x[b] - x[a]) ** 2 + (x[b + 1] - x[a + 1]) ** 2 + (x[b + 2] - x[a + 2]) ** 2
    const o2 = (x[m] - 0.5 * (x[a] + x[b])) ** 2 + (x[m + 1] - 0.5 * (x[a + 1] + x[b + 1])) ** 2 + (x[m + 2] - 0.5 * (x[a + 2] + x[b + 2])) ** 2
    // Relative offset o2/l2, compared without dividing by a zero length.
    if (o2 > worstRel * l2) { worstRel = l2 > 0 ? o2 / l2 : Infinity; worst = i }
  }
  return worst
}

function finding(element: number, kind: QuadraticFinding['kind'], edge: number, o2: number, l2: number, point: number, detJ: number): QuadraticFinding {
  return { element, kind, edge, offset: Math.sqrt(o2), edgeLength: Math.sqrt(l2), point, detJ }
}

/**
 * The message of a finding: the element's type, the node by the user's id, what was expected,
 * and the node order this tool reads with the model.json key that maps another.
 * `nodeIds` maps node indices to user ids.
 */
export function quadraticFindingMessage(f: QuadraticFinding, type: ElementTypeName, conn: Int32Array, nodeIds: Int32Array): string {
  const topo = ELEMENT_TYPES[type]
  const nn = topo.nodeCount
  const [a, b, m] = topo.edges.filter((e) => e[2] >= 0)[f.edge]
  const id = (local: number) => nodeIds[conn[f.element * nn + local]]
  const fmt = (v: number) => v.toPrecision(3)
  const what = f.kind === 'mid-edge'
    ? `mid-edge node ${id(m)} (node ${m + 1} of the ${type}) lies ${fmt(f.offset)} from the midpoint of its edge (${a + 1},${b + 1}) between nodes ${id(a)} and ${id(b)}, more than ${MID_EDGE_TOLERANCE} × the edge length ${fmt(f.edgeLength)}`
    : `the ${type} folds over: its Jacobian determinant is ${fmt(f.detJ)} at quadrature point ${f.point + 1}, not positive; of its mid-edge nodes, node ${id(m)} (node ${m + 1} of the ${type}) lies farthest from the midpoint of its edge (${a + 1},${b + 1}): ${fmt(f.offset)} for an edge of ${fmt(f.edgeLength)}`
  return `${what}. ${nodeOrderText(type)}; if your file lists them in another order, map yours in model.json: "nodeOrder": {"${type}": [...]} (entry k = which of your node columns, counted from 0, holds node k+1 here)`
}

/** "tet10 nodes 5-10 are the mid-edge nodes of edges (1,2) (2,3) ...", from the topology. */
export function nodeOrderText(type: ElementTypeName): string {
  const edges = ELEMENT_TYPES[type].edges.filter((e) => e[2] >= 0)
  const mids = edges.map((e) => e[2] + 1)
  const consecutive = mids.every((v, i) => i === 0 || v === mids[i - 1] + 1)
  const nodes = consecutive ? `nodes ${mids[0]}-${mids[mids.length - 1]} are` : `nodes ${mids.join(', ')} are`
  return `${type} ${nodes} the mid-edge nodes of edges ${edges.map((e) => `(${e[0] + 1},${e[1] + 1})`).join(' ')}, in this order, after the corners`
}
