/**
 * Element volumes and centroids by the element's own volume quadrature: V = ∫ det J dξ,
 * c = ∫ x det J dξ / V, with the volume rule of the type's registry record. Four-node elements
 * (tet4: det J constant) use the closed form of src/model/elements/tetVolume.ts.
 * Volumes are in model length³; a negative volume means an inverted element (readers reorient
 * those, so it should not happen on a loaded model).
 */
import { ELEMENT_TYPES, elementType } from '../model/elementTypes.ts'
import { sixTetVolume } from '../model/elements/tetVolume.ts'
import type { ElementBlock, Mesh } from '../model/model.ts'
import { tabulateElement } from './shapeFunctions.ts'
import type { ElementTable } from './shapeFunctions.ts'
import { isStraightTet10 } from './straightTet10.ts'

/** Volume of every element, Float64Array(E) indexed by global element index. */
export function elementVolumes(mesh: Mesh): Float64Array {
  const out = new Float64Array(mesh.elementCount)
  elementVolumesAndCentroids(mesh, out, null)
  return out
}

/** Volume centroid of every element, Float64Array(3·E). */
export function elementCentroids(mesh: Mesh): Float64Array {
  const c = new Float64Array(3 * mesh.elementCount)
  elementVolumesAndCentroids(mesh, new Float64Array(mesh.elementCount), c)
  return c
}

/**
 * Fills outVolume (E) and, when given, outCentroid (3·E). Returns outVolume. hex8 (its rule in
 * monomial form, `hexElement`) and straight-sided tet10 (the corner tetrahedron's closed forms,
 * straightTet10.ts) take shortcuts equal to the volume rule's result to round-off; `general` sends them through the rule
 * (the reference the tests compare with).
 */
export function elementVolumesAndCentroids(mesh: Mesh, outVolume: Float64Array, outCentroid: Float64Array | null, general = false): Float64Array {
  const x = mesh.coords
  for (const b of mesh.blocks) {
    const conn = b.conn, off = b.offset
    const topo = elementType(b.type)
    if (topo.nodeCount === 4) {
      const corners = tetCorners
      const count = conn.length / 4
      for (let e = 0; e < count; e++) corners(outVolume, outCentroid, off + e, x, conn, 4 * e)
      continue
    }
    const nn = topo.nodeCount
    const tab = tabulateElement(b.type, topo.volumeRule)
    const xs = new Float64Array(3 * nn)
    const count = conn.length / nn
    const one = elementByRule, straight = isStraightTet10, hex = hexElement
    if (b.type === 'tet10' && !general) {
      // straight-sided: the corner tetrahedron's closed forms (straightTet10.ts); curved: the rule
      const corners = tetCorners
      for (let e = 0; e < count; e++) {
        const base = 10 * e
        if (straight(x, conn, base)) corners(outVolume, outCentroid, off + e, x, conn, base)
        else one(outVolume, outCentroid, off + e, x, conn, base, nn, tab, xs)
      }
      continue
    }
    if (b.type === 'hex8' && !general) {
      for (let e = 0; e < count; e++) hex(outVolume, outCentroid, off + e, x, conn, 8 * e)
      continue
    }
    for (let e = 0; e < count; e++) one(outVolume, outCentroid, off + e, x, conn, e * nn, nn, tab, xs)
  }
  return outVolume
}

/**
 * The closed forms of a tetrahedron with corners conn[base .. base + 4): volume (tetVolume.ts)
 * and, when wanted, the corner mean as centroid (det J constant).
 */
function tetCorners(outVolume: Float64Array, outCentroid: Float64Array | null, ge: number, x: Float64Array, conn: Int32Array, base: number): void {
  // Imported kernel into a local once (see readNumericTable: getters under a CommonJS transform).
  const six = sixTetVolume
  const p0 = 3 * conn[base], p1 = 3 * conn[base + 1], p2 = 3 * conn[base + 2], p3 = 3 * conn[base + 3]
  outVolume[ge] = six(x, p0, p1, p2, p3) / 6
  if (outCentroid) {
    const g = 3 * ge
    outCentroid[g] = (x[p0] + x[p1] + x[p2] + x[p3]) / 4
    outCentroid[g + 1] = (x[p0 + 1] + x[p1 + 1] + x[p2 + 1] + x[p3 + 1]) / 4
    outCentroid[g + 2] = (x[p0 + 2] + x[p1 + 2] + x[p2 + 2] + x[p3 + 2]) / 4
  }
}

/**
 * One element by the volume rule of its type (`tab` = tabulateElement(type, volumeRule)): its
 * volume to outVolume[ge] and, when given, its centroid to outCentroid[3ge ..]; `xs` is scratch of
 * 3·nn. The balance audit calls it for the curved elements of a type it otherwise takes in closed form.
 */
export function elementByRule(
  outVolume: Float64Array, outCentroid: Float64Array | null, ge: number, x: Float64Array, conn: Int32Array, base: number, nn: number,
  tab: ElementTable, xs: Float64Array,
): void {
  const nq = tab.pointCount, V = tab.values, D = tab.derivs, W = tab.weights
  for (let a = 0; a < nn; a++) {
    const p = 3 * conn[base + a]
    xs[3 * a] = x[p]; xs[3 * a + 1] = x[p + 1]; xs[3 * a + 2] = x[p + 2]
  }
  let vol = 0, cx = 0, cy = 0, cz = 0
  for (let q = 0; q < nq; q++) {
    // J[i][k] = ∂x_i/∂ξ_k.
    let j00 = 0, j01 = 0, j02 = 0, j10 = 0, j11 = 0, j12 = 0, j20 = 0, j21 = 0, j22 = 0
    let px = 0, py = 0, pz = 0
    const dof = 3 * q * nn, vo = q * nn
    for (let a = 0; a < nn; a++) {
      const d0 = D[dof + 3 * a], d1 = D[dof + 3 * a + 1], d2 = D[dof + 3 * a + 2]
      const ax = xs[3 * a], ay = xs[3 * a + 1], az = xs[3 * a + 2]
      j00 += ax * d0; j01 += ax * d1; j02 += ax * d2
      j10 += ay * d0; j11 += ay * d1; j12 += ay * d2
      j20 += az * d0; j21 += az * d1; j22 += az * d2
      const Na = V[vo + a]
      px += Na * ax; py += Na * ay; pz += Na * az
    }
    const det = j00 * (j11 * j22 - j12 * j21) - j01 * (j10 * j22 - j12 * j20) + j02 * (j10 * j21 - j11 * j20)
    const dV = det * W[q]
    vol += dV; cx += px * dV; cy += py * dV; cz += pz * dV
  }
  outVolume[ge] = vol
  if (outCentroid) {
    const g = 3 * ge
    // Zero volume: fall back to the node mean so the centroid stays finite.
    if (vol !== 0) { outCentroid[g] = cx / vol; outCentroid[g + 1] = cy / vol; outCentroid[g + 2] = cz / vol } else {
      let mx = 0, my = 0, mz = 0
      for (let a = 0; a < nn; a++) { mx += xs[3 * a]; my += xs[3 * a + 1]; mz += xs[3 * a + 2] }
      outCentroid[g] = mx / nn; outCentroid[g + 1] = my / nn; outCentroid[g + 2] = mz / nn
    }
  }
}

/** The 2×2×2 Gauss–Legendre abscissa ±1/√3 (weights 1; the hex8 volume rule). */
const G = 1 / Math.sqrt(3)

/**
 * One hex8 in monomial form with the 2×2×2 Gauss rule (the type's own volume rule, exact: det J
 * has degree ≤ 2 and x det J ≤ 3 per direction). The map x(ξ) = Σ_k c_k m_k(ξ), m = (1, ξ, η, ζ,
 * ξη, ηζ, ξζ, ξηζ), c_k = Σ_a m_k(ξ_a) x_a / 8 over the corners ξ_a = ±1 (N_a = (1 + ξ ξ_a)(1 +
 * η η_a)(1 + ζ ζ_a) / 8 expanded), its coefficients by one butterfly a coordinate (sums and
 * differences of the ξ pairs, then along η, then ζ: 23 additions instead of 64 multiply-adds; as
 * trilinearMonomials.ts) into locals. At each point the Jacobian's columns are c1 + c4 η + c6 ζ +
 * c7 ηζ, c2 + c4 ξ + c5 ζ + c7 ξζ, c3 + c5 η + c6 ξ + c7 ξη, so a point costs a few dozen
 * operations instead of eight shape functions with their 24 derivatives. Coordinates relative to
 * node 0 (no digits lost far from the origin).
 */
function hexElement(outVolume: Float64Array, outCentroid: Float64Array | null, ge: number, x: Float64Array, conn: Int32Array, base: number): void {
  const q0 = 3 * conn[base], q1 = 3 * conn[base + 1], q2 = 3 * conn[base + 2], q3 = 3 * conn[base + 3]
  const q4 = 3 * conn[base + 4], q5 = 3 * conn[base + 5], q6 = 3 * conn[base + 6], q7 = 3 * conn[base + 7]
  const ox = x[q0], oy = x[q0 + 1], oz = x[q0 + 2]
  // x: relative corners, then the butterfly (the coefficients c_k)
  const x1 = x[q1] - ox, x2 = x[q2] - ox, x3 = x[q3] - ox, x4 = x[q4] - ox, x5 = x[q5] - ox, x6 = x[q6] - ox, x7 = x[q7] - ox
  const xs01 = x1, xd01 = x1, xs32 = x3 + x2, xd32 = x2 - x3, xs45 = x4 + x5, xd45 = x5 - x4, xs76 = x7 + x6, xd76 = x6 - x7
  const xa0 = xs01 + xs32, xa2 = xs32 - xs01, xa1 = xd01 + xd32, xa4 = xd32 - xd01, xb0 = xs45 + xs76, xb2 = xs76 - xs45, xb1 = xd45 + xd76, xb4 = xd76 - xd45
  const xc0 = 0.125 * (xa0 + xb0), xc1 = 0.125 * (xa1 + xb1), xc2 = 0.125 * (xa2 + xb2), xc3 = 0.125 * (xb0 - xa0)
  const xc4 = 0.125 * (xa4 + xb4), xc5 = 0.125 * (xb2 - xa2), xc6 = 0.125 * (xb1 - xa1), xc7 = 0.125 * (xb4 - xa4)
  // y: relative corners, then the butterfly (the coefficients c_k)
  const y1 = x[q1 + 1] - oy, y2 = x[q2 + 1] - oy, y3 = x[q3 + 1] - oy, y4 = x[q4 + 1] - oy, y5 = x[q5 + 1] - oy, y6 = x[q6 + 1] - oy, y7 = x[q7 + 1] - oy
  const ys01 = y1, yd01 = y1, ys32 = y3 + y2, yd32 = y2 - y3, ys45 = y4 + y5, yd45 = y5 - y4, ys76 = y7 + y6, yd76 = y6 - y7
  const ya0 = ys01 + ys32, ya2 = ys32 - ys01, ya1 = yd01 + yd32, ya4 = yd32 - yd01, yb0 = ys45 + ys76, yb2 = ys76 - ys45, yb1 = yd45 + yd76, yb4 = yd76 - yd45
  const yc0 = 0.125 * (ya0 + yb0), yc1 = 0.125 * (ya1 + yb1), yc2 = 0.125 * (ya2 + yb2), yc3 = 0.125 * (yb0 - ya0)
  const yc4 = 0.125 * (ya4 + yb4), yc5 = 0.125 * (yb2 - ya2), yc6 = 0.125 * (yb1 - ya1), yc7 = 0.125 * (yb4 - ya4)
  // z: relative corners, then the butterfly (the coefficients c_k)
  const z1 = x[q1 + 2] - oz, z2 = x[q2 + 2] - oz, z3 = x[q3 + 2] - oz, z4 = x[q4 + 2] - oz, z5 = x[q5 + 2] - oz, z6 = x[q6 + 2] - oz, z7 = x[q7 + 2] - oz
  const zs01 = z1, zd01 = z1, zs32 = z3 + z2, zd32 = z2 - z3, zs45 = z4 + z5, zd45 = z5 - z4, zs76 = z7 + z6, zd76 = z6 - z7
  const za0 = zs01 + zs32, za2 = zs32 - zs01, za1 = zd01 + zd32, za4 = zd32 - zd01, zb0 = zs45 + zs76, zb2 = zs76 - zs45, zb1 = zd45 + zd76, zb4 = zd76 - zd45
  const zc0 = 0.125 * (za0 + zb0), zc1 = 0.125 * (za1 + zb1), zc2 = 0.125 * (za2 + zb2), zc3 = 0.125 * (zb0 - za0)
  const zc4 = 0.125 * (za4 + zb4), zc5 = 0.125 * (zb2 - za2), zc6 = 0.125 * (zb1 - za1), zc7 = 0.125 * (zb4 - za4)
  let vol = 0, cx = 0, cy = 0, cz = 0
  for (let s = 0; s < 8; s++) {
    const a = s & 1 ? G : -G, b = s & 2 ? G : -G, d = s & 4 ? G : -G
    const ab = a * b, bd = b * d, ad = a * d
    const j00 = xc1 + xc4 * b + xc6 * d + xc7 * bd, j01 = xc2 + xc4 * a + xc5 * d + xc7 * ad, j02 = xc3 + xc5 * b + xc6 * a + xc7 * ab
    const j10 = yc1 + yc4 * b + yc6 * d + yc7 * bd, j11 = yc2 + yc4 * a + yc5 * d + yc7 * ad, j12 = yc3 + yc5 * b + yc6 * a + yc7 * ab
    const j20 = zc1 + zc4 * b + zc6 * d + zc7 * bd, j21 = zc2 + zc4 * a + zc5 * d + zc7 * ad, j22 = zc3 + zc5 * b + zc6 * a + zc7 * ab
    const det = j00 * (j11 * j22 - j12 * j21) - j01 * (j10 * j22 - j12 * j20) + j02 * (j10 * j21 - j11 * j20)
    vol += det
    if (outCentroid) {
      const abd = ab * d
      cx += det * (xc0 + xc1 * a + xc2 * b + xc3 * d + xc4 * ab + xc5 * bd + xc6 * ad + xc7 * abd)
      cy += det * (yc0 + yc1 * a + yc2 * b + yc3 * d + yc4 * ab + yc5 * bd + yc6 * ad + yc7 * abd)
      cz += det * (zc0 + zc1 * a + zc2 * b + zc3 * d + zc4 * ab + zc5 * bd + zc6 * ad + zc7 * abd)
    }
  }
  outVolume[ge] = vol
  if (outCentroid) {
    const g = 3 * ge
    if (vol !== 0) { outCentroid[g] = ox + cx / vol; outCentroid[g + 1] = oy + cy / vol; outCentroid[g + 2] = oz + cz / vol } else {
      // zero volume: the node mean, as the general path
      let mx = 0, my = 0, mz = 0
      for (let k = 0; k < 8; k++) { const p = 3 * conn[base + k]; mx += x[p]; my += x[p + 1]; mz += x[p + 2] }
      outCentroid[g] = mx / 8; outCentroid[g + 1] = my / 8; outCentroid[g + 2] = mz / 8
    }
  }
}

/** Elements per chunk of volumeChunks (2 MB of temporaries). */
const VOLUME_CHUNK = 1 << 16

/**
 * Volumes and centroids of the mesh's elements a chunk at a time, in element order, without 32
 * bytes per element of temporaries: `visit(block, first, n, volume, centroid)` gets the block,
 * the chunk's first element in it and its count, and the chunk's volumes (n) and centroids (3n)
 * in scratch reused by the next chunk.
 */
export function volumeChunks(
  mesh: Mesh, visit: (block: ElementBlock, first: number, n: number, volume: Float64Array, centroid: Float64Array) => void,
): void {
  const chunk = Math.max(1, Math.min(VOLUME_CHUNK, mesh.elementCount))
  const vol = new Float64Array(chunk), cen = new Float64Array(3 * chunk)
  for (const b of mesh.blocks) {
    const nn = ELEMENT_TYPES[b.type].nodeCount
    const count = b.conn.length / nn
    for (let s = 0; s < count; s += chunk) {
      const n = Math.min(chunk, count - s)
      const piece: Mesh = { coords: mesh.coords, nodeIds: mesh.nodeIds, nodeCount: mesh.nodeCount, elementCount: n,
        blocks: [{ type: b.type, conn: b.conn.subarray(s * nn, (s + n) * nn), ids: b.ids.subarray(s, s + n), part: null, offset: 0 }] }
      elementVolumesAndCentroids(piece, vol, cen)
      visit(b, s, n, vol, cen)
    }
  }
}
