/**
 * Inversion of an element's isoparametric map x(ξ) = Σₐ Nₐ(ξ) xₐ: the reference point ξ of a
 * physical point p, by Newton's method in the type's reference domain (the element registry,
 * src/model/elementTypes.ts, holds its shape functions, centroid and clamp). The one inversion of
 * Tractus: the probe, the point location of lines and the interpolation of displacement at
 * section vertices all come here.
 *
 * Guarded:
 * - every iterate is clamped into the closed reference domain, so the functions are never
 *   evaluated outside it (the pyramid's rational functions are 0/0 above the apex);
 * - a singular Jacobian stops the iteration at the current iterate;
 * - a second start from the reference point of the node nearest to p is tried when the first,
 *   from the centroid, does not reach p but ends within a quarter of the element's size of it
 *   (Newton on a strongly distorted element may stall on the boundary of the domain from a far
 *   start; a point farther away is outside the element, and point location meets many of those).
 * The answer is the clamped ξ and the distance |x(ξ) − p| (model length units): zero to round-off
 * when p lies in the element (its interior or boundary), the distance to the point x(ξ) of the
 * element the iteration ended at otherwise. Callers decide "inside" by comparing it with a
 * tolerance of their own scale.
 *
 * Units: coordinates in model length units; ξ dimensionless. `coords` is the mesh's Float64Array(3N),
 * `conn` a block's connectivity, `base` = local element index × nodes per element.
 * Nothing allocates: the scratch arrays below are sized once by the registry.
 */
import { ELEMENT_TYPE_LIST } from '../model/elementTypes.ts'
import type { ElementTopology } from '../model/elementTypes.ts'

const MAX_NODES = Math.max(...ELEMENT_TYPE_LIST.map((t) => t.nodeCount))
const N = new Float64Array(MAX_NODES), dN = new Float64Array(3 * MAX_NODES)

/** Newton iterations per start; an affine map needs one, a well-shaped quadratic element a few. */
const MAX_ITERATIONS = 30

/**
 * Writes the reference coordinates of p in the element into `outXi` (3 numbers) and returns
 * |x(ξ) − p| (length units). See the file comment for the guards.
 */
export function invertElementMap(
  outXi: Float64Array | number[], topo: ElementTopology, coords: Float64Array, conn: Int32Array, base: number,
  px: number, py: number, pz: number,
): number {
  const c = topo.domain.centroid
  outXi[0] = c[0]; outXi[1] = c[1]; outXi[2] = c[2]
  const first = newton(outXi, topo, coords, conn, base, px, py, pz)
  // Zero to round-off: nothing to gain from a second start.
  if (first === 0) return 0
  // Second start: the reference point of the node nearest to p (when p may still be inside).
  const nn = topo.nodeCount
  let best = 0, bestD = Infinity, size = 0
  const n0 = conn[base]
  for (let a = 0; a < nn; a++) {
    const n = conn[base + a]
    const d = (coords[3 * n] - px) ** 2 + (coords[3 * n + 1] - py) ** 2 + (coords[3 * n + 2] - pz) ** 2
    if (d < bestD) { bestD = d; best = a }
    size = Math.max(size, Math.abs(coords[3 * n] - coords[3 * n0]), Math.abs(coords[3 * n + 1] - coords[3 * n0 + 1]), Math.abs(coords[3 * n + 2] - coords[3 * n0 + 2]))
  }
  if (first > 0.25 * size) return first
  const x0 = outXi[0], x1 = outXi[1], x2 = outXi[2]
  const r = topo.refCoords[best]
  // Start a little inside the domain: at a vertex several faces meet and the clamp pins the step.
  outXi[0] = 0.9 * r[0] + 0.1 * c[0]; outXi[1] = 0.9 * r[1] + 0.1 * c[1]; outXi[2] = 0.9 * r[2] + 0.1 * c[2]
  const second = newton(outXi, topo, coords, conn, base, px, py, pz)
  if (second < first) return second
  outXi[0] = x0; outXi[1] = x1; outXi[2] = x2
  return first
}

/** Newton from the ξ in `xi` (changed in place); returns |x(ξ) − p| at the end. */
function newton(
  xi: Float64Array | number[], topo: ElementTopology, coords: Float64Array, conn: Int32Array, base: number,
  px: number, py: number, pz: number,
): number {
  const nn = topo.nodeCount, domain = topo.domain
  let dist = Infinity
  // `settled`: the last step moved ξ by round-off only; one more pass measures the distance there.
  let settled = false
  for (let it = 0; it <= MAX_ITERATIONS; it++) {
    topo.shapeValues(xi[0], xi[1], xi[2], N)
    topo.shapeDerivatives(xi[0], xi[1], xi[2], dN)
    let rx = -px, ry = -py, rz = -pz
    let j00 = 0, j01 = 0, j02 = 0, j10 = 0, j11 = 0, j12 = 0, j20 = 0, j21 = 0, j22 = 0
    for (let a = 0; a < nn; a++) {
      const n = conn[base + a]
      const X = coords[3 * n], Y = coords[3 * n + 1], Z = coords[3 * n + 2]
      const w = N[a]
      rx += w * X; ry += w * Y; rz += w * Z
      const d0 = dN[3 * a], d1 = dN[3 * a + 1], d2 = dN[3 * a + 2]
      j00 += X * d0; j01 += X * d1; j02 += X * d2
      j10 += Y * d0; j11 += Y * d1; j12 += Y * d2
      j20 += Z * d0; j21 += Z * d1; j22 += Z * d2
    }
    dist = Math.sqrt(rx * rx + ry * ry + rz * rz)
    // The last pass only measures the distance at the final iterate.
    if (settled || it === MAX_ITERATIONS || dist === 0) break
    const c00 = j11 * j22 - j12 * j21, c01 = j02 * j21 - j01 * j22, c02 = j01 * j12 - j02 * j11
    const det = j00 * c00 + j10 * c01 + j20 * c02
    if (!(Math.abs(det) > 0)) break // singular map: keep the current iterate
    const c10 = j12 * j20 - j10 * j22, c11 = j00 * j22 - j02 * j20, c12 = j02 * j10 - j00 * j12
    const c20 = j10 * j21 - j11 * j20, c21 = j01 * j20 - j00 * j21, c22 = j00 * j11 - j01 * j10
    const dx = (c00 * rx + c01 * ry + c02 * rz) / det
    const dy = (c10 * rx + c11 * ry + c12 * rz) / det
    const dz = (c20 * rx + c21 * ry + c22 * rz) / det
    const o0 = xi[0], o1 = xi[1], o2 = xi[2]
    xi[0] = o0 - dx; xi[1] = o1 - dy; xi[2] = o2 - dz
    domain.clamp(xi)
    // Converged when the (clamped) step is below round-off of the reference coordinates; a step
    // that the clamp cancels means the iterate sits on the boundary nearest p: stop there too.
    settled = Math.abs(xi[0] - o0) + Math.abs(xi[1] - o1) + Math.abs(xi[2] - o2) < 1e-14
  }
  return dist
}
