/**
 * Element volumes and centroids by the element's own volume quadrature: V = ∫ det J dξ,
 * c = ∫ x det J dξ / V, with the volume rule of the type's registry record. Four-node elements
 * (tet4: det J constant) use the closed form of src/model/elements/tetVolume.ts.
 * Volumes are in model length³; a negative volume means an inverted element (readers reorient
 * those, so it should not happen on a loaded model).
 */
import { elementType } from '../model/elementTypes.ts'
import { sixTetVolume } from '../model/elements/tetVolume.ts'
import type { Mesh } from '../model/model.ts'
import { tabulateElement } from './shapeFunctions.ts'

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

/** Fills outVolume (E) and, when given, outCentroid (3·E). Returns outVolume. */
export function elementVolumesAndCentroids(mesh: Mesh, outVolume: Float64Array, outCentroid: Float64Array | null): Float64Array {
  const x = mesh.coords
  for (const b of mesh.blocks) {
    const conn = b.conn, off = b.offset
    const topo = elementType(b.type)
    if (topo.nodeCount === 4) {
      // Imported kernel into a local once (see readNumericTable: getters under a CommonJS transform).
      const six = sixTetVolume
      const count = conn.length / 4
      for (let e = 0; e < count; e++) {
        const p0 = 3 * conn[4 * e], p1 = 3 * conn[4 * e + 1], p2 = 3 * conn[4 * e + 2], p3 = 3 * conn[4 * e + 3]
        outVolume[off + e] = six(x, p0, p1, p2, p3) / 6
        if (outCentroid) {
          const g = 3 * (off + e)
          outCentroid[g] = (x[p0] + x[p1] + x[p2] + x[p3]) / 4
          outCentroid[g + 1] = (x[p0 + 1] + x[p1 + 1] + x[p2 + 1] + x[p3 + 1]) / 4
          outCentroid[g + 2] = (x[p0 + 2] + x[p1 + 2] + x[p2 + 2] + x[p3 + 2]) / 4
        }
      }
      continue
    }
    const nn = topo.nodeCount
    const tab = tabulateElement(b.type, topo.volumeRule)
    const nq = tab.pointCount, V = tab.values, D = tab.derivs, W = tab.weights
    const xs = new Float64Array(3 * nn)
    const count = conn.length / nn
    for (let e = 0; e < count; e++) {
      for (let a = 0; a < nn; a++) {
        const p = 3 * conn[e * nn + a]
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
      outVolume[off + e] = vol
      if (outCentroid) {
        const g = 3 * (off + e)
        // Zero volume: fall back to the node mean so the centroid stays finite.
        if (vol !== 0) { outCentroid[g] = cx / vol; outCentroid[g + 1] = cy / vol; outCentroid[g + 2] = cz / vol } else {
          let mx = 0, my = 0, mz = 0
          for (let a = 0; a < nn; a++) { mx += xs[3 * a]; my += xs[3 * a + 1]; mz += xs[3 * a + 2] }
          outCentroid[g] = mx / nn; outCentroid[g + 1] = my / nn; outCentroid[g + 2] = mz / nn
        }
      }
    }
  }
  return outVolume
}
