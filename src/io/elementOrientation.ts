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
  const faces = topo.cornerFaces, faceCount = faces.length / 4
  let v6 = 0
  for (let f = 0; f < faceCount; f++) {
    const a = 3 * faces[4 * f], b = 3 * faces[4 * f + 1], c = 3 * faces[4 * f + 2], d4 = faces[4 * f + 3]
    if (d4 < 0) {
      // Triangle face: one cone with apex at the centroid (the origin here): a·(b×c).
      v6 += scratch[a] * (scratch[b + 1] * scratch[c + 2] - scratch[b + 2] * scratch[c + 1])
        + scratch[a + 1] * (scratch[b + 2] * scratch[c] - scratch[b] * scratch[c + 2])
        + scratch[a + 2] * (scratch[b] * scratch[c + 1] - scratch[b + 1] * scratch[c])
      continue
    }
    const d = 3 * d4
    // Quad face split into four triangles about its centre m = (a+b+c+d)/4: the four cones sum to
    // m·(a×b + b×c + c×d + d×a) = m·((c-a)×(d-b)), one cross product per face.
    const ux = scratch[c] - scratch[a], uy = scratch[c + 1] - scratch[a + 1], uz = scratch[c + 2] - scratch[a + 2]
    const wx = scratch[d] - scratch[b], wy = scratch[d + 1] - scratch[b + 1], wz = scratch[d + 2] - scratch[b + 2]
    const mx = scratch[a] + scratch[b] + scratch[c] + scratch[d]
    const my = scratch[a + 1] + scratch[b + 1] + scratch[c + 1] + scratch[d + 1]
    const mz = scratch[a + 2] + scratch[b + 2] + scratch[c + 2] + scratch[d + 2]
    v6 += (mx * (uy * wz - uz * wy) + my * (uz * wx - ux * wz) + mz * (ux * wy - uy * wx)) / 4
  }
  out[0] = v6 / 6
  return out
}

/** Result of checking one block: local indices of inverted elements, first degenerate one or -1. */
export interface BlockOrientation {
  readonly inverted: Int32Array
  readonly degenerate: number
  /** Signed volume and bounding diagonal of the degenerate element, for the message. */
  readonly degenerateVolume: number
  readonly degenerateSize: number
}

/** Checks every element of a block; stops at the first degenerate one. Does not change `conn`. */
export function checkBlockOrientation(coords: Float64Array, type: ElementTypeName, conn: Int32Array): BlockOrientation {
  const topo = elementType(type)
  const nn = topo.nodeCount
  if (topo.cornerCount === 4) return checkTetOrientation(coords, conn, nn, type)
  const count = (conn.length / nn) | 0
  const out = new Float64Array(2)
  const scratch = new Float64Array(24)
  const inv = new InvertedList()
  for (let e = 0; e < count; e++) {
    measureElement(out, scratch, coords, conn, e * nn, type)
    const v = out[0], d = out[1]
    // Also catches NaN volumes (never from finite coordinates, but never trusted either).
    if (!(Math.abs(v) > DEGENERATE_RELATIVE_VOLUME * d * d * d)) {
      return { inverted: inv.done(), degenerate: e, degenerateVolume: v, degenerateSize: d }
    }
    if (v < 0) inv.push(e)
  }
  return { inverted: inv.done(), degenerate: -1, degenerateVolume: 0, degenerateSize: 0 }
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
function checkTetOrientation(x: Float64Array, conn: Int32Array, nn: number, type: ElementTypeName): BlockOrientation {
  const count = (conn.length / nn) | 0
  const inv = new InvertedList()
  const limit2 = FAST_ACCEPT_RELATIVE * FAST_ACCEPT_RELATIVE * 36
  // Imported kernel into a local once (see readNumericTable: getters under a CommonJS transform).
  const triple = tripleProduct
  let out: Float64Array | null = null, scratch: Float64Array | null = null
  for (let e = 0; e < count; e++) {
    const b = nn * e
    const p0 = 3 * conn[b], p1 = 3 * conn[b + 1], p2 = 3 * conn[b + 2], p3 = 3 * conn[b + 3]
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
    out ??= new Float64Array(2)
    scratch ??= new Float64Array(24)
    measureElement(out, scratch, x, conn, b, type)
    const v = out[0], d = out[1]
    // Also catches NaN volumes (never from finite coordinates, but never trusted either).
    if (!(Math.abs(v) > DEGENERATE_RELATIVE_VOLUME * d * d * d)) {
      return { inverted: inv.done(), degenerate: e, degenerateVolume: v, degenerateSize: d }
    }
    if (v < 0) inv.push(e)
  }
  return { inverted: inv.done(), degenerate: -1, degenerateVolume: 0, degenerateSize: 0 }
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
