/**
 * Orientation of elements from their corner geometry: the signed volume decides whether an
 * element is inverted (negative) or degenerate (|V| ≤ 1e-12 · d³, d = diagonal of the corners'
 * bounding box). Inverted elements are mirrored by their type's mirror permutation (the element
 * registry, src/model/elementTypes.ts), which reverses the orientation and keeps every mid-edge
 * node on its edge.
 *
 * Signed volume: types with four corners use the triple product (x2-x1)×(x3-x1)·(x4-x1)/6. The
 * others (hexahedra, wedges, pyramids) use the divergence theorem on the registry's corner faces:
 * each face, split into triangles about its centre (quads) and oriented outward, forms a cone
 * with the corner centroid; the cone volumes add up to the volume of the closed polyhedron those
 * flat triangles bound (common practice; exact for planar faces, a consistent symmetric split for
 * warped ones), and to minus it when the element is inside out. For a pyramid that polyhedron is
 * the cone from the apex over the base split about its centre (with the apex as origin the side
 * triangles add nothing; the sum does not depend on the origin).
 */
import { elementType } from '../model/elementTypes.ts'
import type { ElementTypeName } from '../model/elementTypes.ts'
import { sixTetVolume, tripleProduct } from '../model/elements/tetVolume.ts'
import { firstIndexOutside } from './indexRange.ts'

/** Relative volume below which an element counts as degenerate. */
export const DEGENERATE_RELATIVE_VOLUME = 1e-12

/**
 * Writes the signed corner volume to out[0] and the corner bounding-box diagonal to out[1] for the
 * element whose nodes start at conn[base]. `scratch` holds at least 24 numbers.
 */
export function measureElement(out: Float64Array, scratch: Float64Array, coords: Float64Array, conn: Int32Array, base: number, type: ElementTypeName): Float64Array {
  const topo = elementType(type)
  const nc = topo.cornerCount
  // Corners relative to their centroid: smaller numbers, less cancellation.
  let cx = 0, cy = 0, cz = 0
  let minX = Infinity, minY = Infinity, minZ = Infinity, maxX = -Infinity, maxY = -Infinity, maxZ = -Infinity
  for (let a = 0; a < nc; a++) {
    const p = 3 * conn[base + a]
    const x = coords[p], y = coords[p + 1], z = coords[p + 2]
    scratch[3 * a] = x; scratch[3 * a + 1] = y; scratch[3 * a + 2] = z
    cx += x; cy += y; cz += z
    if (x < minX) minX = x; if (x > maxX) maxX = x
    if (y < minY) minY = y; if (y > maxY) maxY = y
    if (z < minZ) minZ = z; if (z > maxZ) maxZ = z
  }
  cx /= nc; cy /= nc; cz /= nc
  for (let a = 0; a < nc; a++) { scratch[3 * a] -= cx; scratch[3 * a + 1] -= cy; scratch[3 * a + 2] -= cz }
  const dx = maxX - minX, dy = maxY - minY, dz = maxZ - minZ
  out[1] = Math.sqrt(dx * dx + dy * dy + dz * dz)
  if (nc === 4) {
    out[0] = sixTetVolume(scratch, 0, 3, 6, 9) / 6
    return out
  }
  const v6 = cornerFaceSum(scratch, topo.cornerFaces)
  out[0] = v6 / 6
  return out
}

/**
 * Six times the volume of the closed polyhedron of the corner faces (`faces`: 4 corner numbers a
 * face, -1 for a triangle's fourth), corners 3 a number in `s`, as cones from the origin: a
 * triangle a·(b×c); a quad split into four triangles about its centre m = (a+b+c+d)/4, whose
 * four cones sum to m·(a×b + b×c + c×d + d×a) = m·((c-a)×(d-b)), one cross product a face.
 */
function cornerFaceSum(s: Float64Array, faces: Int32Array): number {
  let v6 = 0
  for (let f = 0; f < faces.length; f += 4) {
    const a = 3 * faces[f], b = 3 * faces[f + 1], c = 3 * faces[f + 2], d4 = faces[f + 3]
    if (d4 < 0) {
      v6 += s[a] * (s[b + 1] * s[c + 2] - s[b + 2] * s[c + 1])
        + s[a + 1] * (s[b + 2] * s[c] - s[b] * s[c + 2])
        + s[a + 2] * (s[b] * s[c + 1] - s[b + 1] * s[c])
      continue
    }
    const d = 3 * d4
    const ux = s[c] - s[a], uy = s[c + 1] - s[a + 1], uz = s[c + 2] - s[a + 2]
    const wx = s[d] - s[b], wy = s[d + 1] - s[b + 1], wz = s[d + 2] - s[b + 2]
    const mx = s[a] + s[b] + s[c] + s[d], my = s[a + 1] + s[b + 1] + s[c + 1] + s[d + 1], mz = s[a + 2] + s[b + 2] + s[c + 2] + s[d + 2]
    v6 += (mx * (uy * wz - uz * wy) + my * (uz * wx - ux * wz) + mz * (ux * wy - uy * wx)) / 4
  }
  return v6
}

/** Result of checking one block: local indices of inverted elements, first degenerate one or -1. */
export interface BlockOrientation {
  readonly inverted: Int32Array
  readonly degenerate: number
  /** Signed volume and bounding diagonal of the degenerate element, for the message. */
  readonly degenerateVolume: number
  readonly degenerateSize: number
  /**
   * With a node limit given: whether some index of the block lies outside 0..limit-1 (found in
   * the same pass, which reads every index anyway; the caller finds the position with
   * firstIndexOutside). The check stops there and says nothing of the other elements.
   */
  readonly outside?: boolean
}

/**
 * Checks every element of a block; stops at the first degenerate one. Does not change `conn`.
 * With `nodeLimit` (the node count) every index is also checked to lie in 0..nodeLimit-1, in the
 * same pass for tetrahedra (tet4, tet10) and the hexahedron, by firstIndexOutside first for the
 * other types; an index outside stops the check with `outside` set.
 */
export function checkBlockOrientation(coords: Float64Array, type: ElementTypeName, conn: Int32Array, nodeLimit = -1): BlockOrientation {
  const topo = elementType(type)
  const nn = topo.nodeCount
  if (topo.cornerCount === 4) return checkTetOrientation(coords, conn, nn, type, nodeLimit)
  if (nodeLimit >= 0 && !(topo.cornerCount === 8 && nn === 8 && sameTable(topo.cornerFaces, HEX_CORNER_FACES)) && firstIndexOutside(conn, nodeLimit) >= 0) return OUTSIDE
  return checkPolyhedronOrientation(coords, conn, nn, type, nodeLimit)
}

/** The result of a check stopped at an index outside the node range. */
const OUTSIDE: BlockOrientation = { inverted: new Int32Array(0), degenerate: -1, degenerateVolume: 0, degenerateSize: 0, outside: true }

/**
 * Whether the nodes base .. base+nn-1 of conn from `from` on are all in 0..limit-1 (a limit below 0:
 * no check). One unsigned compare a node: (n >>> 0) maps negative indices above 2^31.
 */
function nodesInside(conn: Int32Array, base: number, from: number, nn: number, limit: number): boolean {
  if (limit < 0) return true
  for (let a = from; a < nn; a++) if ((conn[base + a] >>> 0) >= limit) return false
  return true
}

/**
 * checkBlockOrientation for types with more than four corners (hexahedra, wedges, pyramids), with
 * the fast acceptance of checkTetOrientation: the six-fold volume T of measureElement's closed
 * polyhedron, taken with coordinates relative to corner 0 instead of the centroid (the sum does
 * not depend on the origin: the vector areas of a closed surface sum to zero), and D² = Σ_k
 * (Σ_a |x_ak − x_0k|)², which bounds the squared bounding diagonal (each extent max − min is at
 * most that sum) and every relative coordinate. One pass over the corners, no bounding box and no
 * centring pass. T is a sum of a few hundred products of numbers at most 4D apart, so its rounding
 * is below 10⁻¹² D³; an element with T² > (6·10⁻⁶)² D⁶ is accepted on T's sign at once, and only
 * the others (very flat elements; overflow and underflow) are measured by measureElement.
 */
function checkPolyhedronOrientation(x: Float64Array, conn: Int32Array, nn: number, type: ElementTypeName, nodeLimit: number): BlockOrientation {
  const topo = elementType(type)
  const nc = topo.cornerCount
  const faces = topo.cornerFaces, faceSum = cornerFaceSum
  if (nc === 8 && sameTable(faces, HEX_CORNER_FACES)) return checkHexOrientation(x, conn, nn, type, nn === 8 ? nodeLimit : -1)
  const count = (conn.length / nn) | 0
  const run = new OrientationRun(), inv = run.inv
  const limit2 = FAST_ACCEPT_RELATIVE * FAST_ACCEPT_RELATIVE * 36
  const s = new Float64Array(3 * nc)
  for (let e = 0; e < count; e++) {
    const b = nn * e
    const p0 = 3 * conn[b]
    const x0 = x[p0], y0 = x[p0 + 1], z0 = x[p0 + 2]
    let sx = 0, sy = 0, sz = 0
    for (let a = 1; a < nc; a++) {
      const p = 3 * conn[b + a]
      const dx = x[p] - x0, dy = x[p + 1] - y0, dz = x[p + 2] - z0
      s[3 * a] = dx; s[3 * a + 1] = dy; s[3 * a + 2] = dz
      sx += Math.abs(dx); sy += Math.abs(dy); sz += Math.abs(dz)
    }
    const v6 = faceSum(s, faces)
    const D2 = sx * sx + sy * sy + sz * sz
    if (v6 * v6 > limit2 * D2 * D2 * D2) {
      if (v6 < 0) inv.push(e)
      continue
    }
    const stop = run.exact(x, conn, b, type, e)
    if (stop) return stop
  }
  return run.result()
}

/** The hexahedron's corner faces in the registry (outward, corners 0-7), for which checkHexOrientation is written out. */
const HEX_CORNER_FACES = [0, 3, 2, 1, 4, 5, 6, 7, 0, 1, 5, 4, 1, 2, 6, 5, 2, 3, 7, 6, 3, 0, 4, 7]

function sameTable(a: Int32Array, b: readonly number[]): boolean {
  return a.length === b.length && b.every((v, i) => a[i] === v)
}

/**
 * checkPolyhedronOrientation for the hexahedron (HEX_CORNER_FACES), the corners in locals relative
 * to corner 0 and the volume in closed form (below): about 70 operations an element instead of 200.
 */
function checkHexOrientation(x: Float64Array, conn: Int32Array, nn: number, type: ElementTypeName, nodeLimit: number): BlockOrientation {
  const count = (conn.length / nn) | 0
  const run = new OrientationRun(), inv = run.inv
  const limit2 = FAST_ACCEPT_RELATIVE * FAST_ACCEPT_RELATIVE * 36
  // without a limit, one above every unsigned 32-bit index
  const lim = nodeLimit < 0 ? 4294967296 : nodeLimit
  for (let e = 0; e < count; e++) {
    const b = nn * e
    const n0 = conn[b], n1 = conn[b + 1], n2 = conn[b + 2], n3 = conn[b + 3], n4 = conn[b + 4], n5 = conn[b + 5], n6 = conn[b + 6], n7 = conn[b + 7]
    // the node range (unsigned: negative indices land above 2^31), on the indices loaded anyway
    if ((n0 >>> 0) >= lim || (n1 >>> 0) >= lim || (n2 >>> 0) >= lim || (n3 >>> 0) >= lim || (n4 >>> 0) >= lim || (n5 >>> 0) >= lim || (n6 >>> 0) >= lim || (n7 >>> 0) >= lim) return OUTSIDE
    const p0 = 3 * n0, p1 = 3 * n1, p2 = 3 * n2, p3 = 3 * n3
    const p4 = 3 * n4, p5 = 3 * n5, p6 = 3 * n6, p7 = 3 * n7
    const x0 = x[p0], y0 = x[p0 + 1], z0 = x[p0 + 2]
    const x1 = x[p1] - x0, y1 = x[p1 + 1] - y0, z1 = x[p1 + 2] - z0
    const x2 = x[p2] - x0, y2 = x[p2 + 1] - y0, z2 = x[p2 + 2] - z0
    const x3 = x[p3] - x0, y3 = x[p3 + 1] - y0, z3 = x[p3 + 2] - z0
    const x4 = x[p4] - x0, y4 = x[p4 + 1] - y0, z4 = x[p4 + 2] - z0
    const x5 = x[p5] - x0, y5 = x[p5 + 1] - y0, z5 = x[p5 + 2] - z0
    const x6 = x[p6] - x0, y6 = x[p6 + 1] - y0, z6 = x[p6 + 2] - z0
    const x7 = x[p7] - x0, y7 = x[p7 + 1] - y0, z7 = x[p7 + 2] - z0
    // Six times the volume as three triple products of diagonals (Grandy, 'Efficient computation
    // of volume of hexahedral cells', LLNL UCRL-ID-128886 (1997), from memory): the exact volume
    // of the trilinear hexahedron, which is that of measureElement's split faces (the cone over a
    // bilinear face from any apex equals the four cones of its split about the centre).
    const ax = x3 - x1 + x7 - x2, ay = y3 - y1 + y7 - y2, az = z3 - z1 + z7 - z2
    const bx = x6 - x3, by = y6 - y3, bz = z6 - z3
    const cx = x4 - x3 + x5 - x7, cy = y4 - y3 + y5 - y7, cz = z4 - z3 + z5 - z7
    const dx = x6 - x4, dy = y6 - y4, dz = z6 - z4
    const ex = x1 - x4 + x2 - x5, ey = y1 - y4 + y2 - y5, ez = z1 - z4 + z2 - z5
    const fx = x6 - x1, fy = y6 - y1, fz = z6 - z1
    const v6 = 0.5 * (
      ax * (by * z2 - bz * y2) + ay * (bz * x2 - bx * z2) + az * (bx * y2 - by * x2)
      + cx * (dy * z7 - dz * y7) + cy * (dz * x7 - dx * z7) + cz * (dx * y7 - dy * x7)
      + ex * (fy * z5 - fz * y5) + ey * (fz * x5 - fx * z5) + ez * (fx * y5 - fy * x5))
    const sx = Math.abs(x1) + Math.abs(x2) + Math.abs(x3) + Math.abs(x4) + Math.abs(x5) + Math.abs(x6) + Math.abs(x7)
    const sy = Math.abs(y1) + Math.abs(y2) + Math.abs(y3) + Math.abs(y4) + Math.abs(y5) + Math.abs(y6) + Math.abs(y7)
    const sz = Math.abs(z1) + Math.abs(z2) + Math.abs(z3) + Math.abs(z4) + Math.abs(z5) + Math.abs(z6) + Math.abs(z7)
    const D2 = sx * sx + sy * sy + sz * sz
    if (v6 * v6 > limit2 * D2 * D2 * D2) {
      if (v6 < 0) inv.push(e)
      continue
    }
    const stop = run.exact(x, conn, b, type, e)
    if (stop) return stop
  }
  return run.result()
}

/**
 * The plain path: measureElement on every element. Not used by the readers; the tests show that
 * the fast paths above decide every element the same.
 */
export function checkBlockOrientationPlain(coords: Float64Array, type: ElementTypeName, conn: Int32Array): BlockOrientation {
  const nn = elementType(type).nodeCount
  const count = (conn.length / nn) | 0
  const run = new OrientationRun()
  for (let e = 0; e < count; e++) {
    const stop = run.exact(coords, conn, e * nn, type, e)
    if (stop) return stop
  }
  return run.result()
}

/**
 * The tetrahedron case of checkBlockOrientation (tet4 and tet10: corners first, nn nodes each) in
 * one loop, without a scratch array per element and without the bounding box (its min/max
 * compares mispredict on every element). With u, v, w the edges from corner 0, each extent max - min is at most |u_x| + |v_x|
 * + |w_x| (and so for y, z), so D² = Σ (those sums)² ≥ d², and |u|, |v|, |w| ≤ D. An element whose
 * six-fold volume T = u·(v×w) from the raw coordinates has T² > (6·10⁻⁶)² D⁶ is accepted at once:
 * its volume is a million times above the degeneracy threshold, and the rounding of T or of
 * measureElement's centred form (a few ε D³) cannot flip its sign, so the exact test would say
 * the same. Only elements below that bound (very flat ones; none in a sane mesh; overflow and
 * underflow land here too) are measured exactly by measureElement, which alone decides them.
 */
function checkTetOrientation(x: Float64Array, conn: Int32Array, nn: number, type: ElementTypeName, nodeLimit: number): BlockOrientation {
  const count = (conn.length / nn) | 0
  const run = new OrientationRun(), inv = run.inv
  const limit2 = FAST_ACCEPT_RELATIVE * FAST_ACCEPT_RELATIVE * 36
  // Imported kernel into a local once (see readNumericTable: getters under a CommonJS transform).
  const triple = tripleProduct, inside = nodesInside
  // without a limit, one above every unsigned 32-bit index
  const lim = nodeLimit < 0 ? 4294967296 : nodeLimit
  for (let e = 0; e < count; e++) {
    const b = nn * e
    const n0 = conn[b], n1 = conn[b + 1], n2 = conn[b + 2], n3 = conn[b + 3]
    // the node range on the corners loaded anyway (unsigned: negative indices land above 2^31),
    // then on the other nodes of a quadratic element
    if ((n0 >>> 0) >= lim || (n1 >>> 0) >= lim || (n2 >>> 0) >= lim || (n3 >>> 0) >= lim || (nn > 4 && !inside(conn, b, 4, nn, nodeLimit))) return OUTSIDE
    const p0 = 3 * n0, p1 = 3 * n1, p2 = 3 * n2, p3 = 3 * n3
    const x0 = x[p0], y0 = x[p0 + 1], z0 = x[p0 + 2]
    const ux = x[p1] - x0, uy = x[p1 + 1] - y0, uz = x[p1 + 2] - z0
    const vx = x[p2] - x0, vy = x[p2 + 1] - y0, vz = x[p2 + 2] - z0
    const wx = x[p3] - x0, wy = x[p3 + 1] - y0, wz = x[p3 + 2] - z0
    const t = triple(ux, uy, uz, vx, vy, vz, wx, wy, wz)
    const sx = Math.abs(ux) + Math.abs(vx) + Math.abs(wx)
    const sy = Math.abs(uy) + Math.abs(vy) + Math.abs(wy)
    const sz = Math.abs(uz) + Math.abs(vz) + Math.abs(wz)
    const D2 = sx * sx + sy * sy + sz * sz
    if (t * t > limit2 * D2 * D2 * D2) {
      if (t < 0) inv.push(e)
      continue
    }
    const stop = run.exact(x, conn, b, type, e)
    if (stop) return stop
  }
  return run.result()
}

/** Relative volume (V / D³) above which a tetrahedron is accepted without the exact measurement. */
const FAST_ACCEPT_RELATIVE = 1e-6

/** Growing list of inverted element indices (usually empty). */
class InvertedList {
  private a = new Int32Array(16)
  private n = 0
  push(e: number): void {
    if (this.n === this.a.length) { const g = new Int32Array(2 * this.n); g.set(this.a); this.a = g }
    this.a[this.n++] = e
  }
  done(): Int32Array { return this.a.slice(0, this.n) }
}

/**
 * One block's orientation check in progress: the inverted elements so far, and the exact
 * decision (measureElement) for an element the fast tests did not accept.
 */
class OrientationRun {
  readonly inv = new InvertedList()
  private out: Float64Array | null = null
  private scratch: Float64Array | null = null
  /** Decides element e (nodes from conn[base]) by measureElement: the block's result when it is degenerate, else null. */
  exact(x: Float64Array, conn: Int32Array, base: number, type: ElementTypeName, e: number): BlockOrientation | null {
    const out = (this.out ??= new Float64Array(2))
    measureElement(out, (this.scratch ??= new Float64Array(24)), x, conn, base, type)
    const v = out[0], d = out[1]
    // Also catches NaN volumes (never from finite coordinates, but never trusted either).
    if (!(Math.abs(v) > DEGENERATE_RELATIVE_VOLUME * d * d * d)) {
      return { inverted: this.inv.done(), degenerate: e, degenerateVolume: v, degenerateSize: d }
    }
    if (v < 0) this.inv.push(e)
    return null
  }
  result(): BlockOrientation {
    return { inverted: this.inv.done(), degenerate: -1, degenerateVolume: 0, degenerateSize: 0 }
  }
}

/** Mirrors the listed elements of a block in place (the type's mirror permutation in the registry). */
export function reorientElements(conn: Int32Array, type: ElementTypeName, elements: Int32Array): void {
  const perm = elementType(type).mirror
  const nn = perm.length
  const tmp = new Int32Array(nn)
  for (let i = 0; i < elements.length; i++) {
    const base = elements[i] * nn
    for (let a = 0; a < nn; a++) tmp[a] = conn[base + perm[a]]
    conn.set(tmp, base)
  }
}

/** The warning for reoriented elements: the first 10 ids and a count of the rest. */
export function reorientedWarning(ids: readonly number[], total: number): string {
  const shown = ids.slice(0, 10).join(', ')
  const rest = total > 10 ? ` and ${total - 10} more` : ''
  return `reoriented ${total} inverted element${total === 1 ? '' : 's'} (negative volume, local nodes mirrored): ${shown}${rest}`
}
