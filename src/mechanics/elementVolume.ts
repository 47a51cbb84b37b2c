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

/**
 * Monomial coefficients of the hex8 map: x(ξ) = Σ_k c_k m_k(ξ) with m = (1, ξ, η, ζ, ξη, ηζ, ξζ,
 * ξηζ); c_k = Σ_a HEX_MONO[8k + a] x_a, HEX_MONO[8k + a] = m_k(ξ_a) / 8 over the corners ξ_a = ±1
 * (N_a = (1 + ξ ξ_a)(1 + η η_a)(1 + ζ ζ_a) / 8 expanded).
 */
const HEX_MONO = (() => {
  const ref = ELEMENT_TYPES.hex8.refCoords, t = new Float64Array(64)
  for (let a = 0; a < 8; a++) {
    const [p, q, r] = ref[a]
    const m = [1, p, q, r, p * q, q * r, p * r, p * q * r]
    for (let k = 0; k < 8; k++) t[8 * k + a] = m[k] / 8
  }
  return t
})()
const HEX_C = new Float64Array(24)
/** The 2×2×2 Gauss–Legendre abscissa ±1/√3 (weights 1; the hex8 volume rule). */
const G = 1 / Math.sqrt(3)

/**
 * One hex8 in monomial form with the 2×2×2 Gauss rule (the type's own volume rule, exact: det J
 * has degree ≤ 2 and x det J ≤ 3 per direction): at each point the Jacobian's columns are
 * c1 + c4 η + c6 ζ + c7 ηζ, c2 + c4 ξ + c5 ζ + c7 ξζ, c3 + c5 η + c6 ξ + c7 ξη, so a point costs a
 * few dozen operations instead of eight shape functions with their 24 derivatives. Coordinates
 * relative to node 0 (no digits lost far from the origin).
 */
function hexElement(outVolume: Float64Array, outCentroid: Float64Array | null, ge: number, x: Float64Array, conn: Int32Array, base: number): void {
  const o = 3 * conn[base]
  const ox = x[o], oy = x[o + 1], oz = x[o + 2]
  const c = HEX_C, M = HEX_MONO
  c.fill(0)
  for (let a = 0; a < 8; a++) {
    const p = 3 * conn[base + a]
    const ax = x[p] - ox, ay = x[p + 1] - oy, az = x[p + 2] - oz
    for (let k = 0; k < 8; k++) {
      const w = M[8 * k + a]
      c[3 * k] += w * ax; c[3 * k + 1] += w * ay; c[3 * k + 2] += w * az
    }
  }
  let vol = 0, cx = 0, cy = 0, cz = 0
  for (let s = 0; s < 8; s++) {
    const a = s & 1 ? G : -G, b = s & 2 ? G : -G, d = s & 4 ? G : -G
    const ab = a * b, bd = b * d, ad = a * d
    const j00 = c[3] + c[12] * b + c[18] * d + c[21] * bd, j01 = c[6] + c[12] * a + c[15] * d + c[21] * ad, j02 = c[9] + c[15] * b + c[18] * a + c[21] * ab
    const j10 = c[4] + c[13] * b + c[19] * d + c[22] * bd, j11 = c[7] + c[13] * a + c[16] * d + c[22] * ad, j12 = c[10] + c[16] * b + c[19] * a + c[22] * ab
    const j20 = c[5] + c[14] * b + c[20] * d + c[23] * bd, j21 = c[8] + c[14] * a + c[17] * d + c[23] * ad, j22 = c[11] + c[17] * b + c[20] * a + c[23] * ab
    const det = j00 * (j11 * j22 - j12 * j21) - j01 * (j10 * j22 - j12 * j20) + j02 * (j10 * j21 - j11 * j20)
    vol += det
    if (outCentroid) {
      const abd = ab * d
      cx += det * (c[0] + c[3] * a + c[6] * b + c[9] * d + c[12] * ab + c[15] * bd + c[18] * ad + c[21] * abd)
      cy += det * (c[1] + c[4] * a + c[7] * b + c[10] * d + c[13] * ab + c[16] * bd + c[19] * ad + c[22] * abd)
      cz += det * (c[2] + c[5] * a + c[8] * b + c[11] * d + c[14] * ab + c[17] * bd + c[20] * ad + c[23] * abd)
    }
  }
  outVolume[ge] = vol
  if (outCentroid) {
    const g = 3 * ge
    if (vol !== 0) { outCentroid[g] = ox + cx / vol; outCentroid[g + 1] = oy + cy / vol; outCentroid[g + 2] = oz + cz / vol } else {
      // zero volume: the node mean, as the general path
      let mx = 0, my = 0, mz = 0
      for (let a = 0; a < 8; a++) { const p = 3 * conn[base + a]; mx += x[p]; my += x[p + 1]; mz += x[p + 2] }
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
