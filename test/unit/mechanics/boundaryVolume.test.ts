import { describe, expect, it } from 'vitest'
import { bodyVolumeOf } from '../../../src/mechanics/balanceAudit.ts'
import { boundaryVolume } from '../../../src/mechanics/boundaryVolume.ts'
import { extractBoundaryFaces } from '../../../src/mechanics/boundaryFaces.ts'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { createMesh } from '../../../src/model/createMesh.ts'
import { ELEMENT_TYPE_NAMES } from '../../../src/model/elementTypes.ts'
import type { Mesh } from '../../../src/model/model.ts'

function body(mesh: Mesh) {
  const b = boundaryVolume(mesh.coords, extractBoundaryFaces(mesh))
  expect(b).not.toBeNull()
  return b!
}

// Volumes and centroids of solids from elementary geometry (common formulas), by their boundary faces alone.
describe('boundaryVolume', () => {
  for (const type of ELEMENT_TYPE_NAMES) {
    it(`${type}: a box, lx ly lz about its centre`, () => {
      const b = body(boxMesh({ nx: 2, ny: 3, nz: 2, lx: 1.2, ly: 0.9, lz: 2.5, x0: 1, y0: -2, z0: 0.5 }, type))
      expect(b.volume).toBeCloseTo(1.2 * 0.9 * 2.5, 12)
      expect(b.centroid[0]).toBeCloseTo(1.6, 12)
      expect(b.centroid[1]).toBeCloseTo(-1.55, 12)
      expect(b.centroid[2]).toBeCloseTo(1.75, 12)
    })
  }

  it('a right triangular prism (legs a, b, length L): V = abL/2, centroid (a/3, b/3, L/2) from the right angle', () => {
    const a = 2, bb = 0.75, L = 3, o = [5, -1, 2]
    const c = Float64Array.from([0, 0, 0, a, 0, 0, 0, bb, 0, 0, 0, L, a, 0, L, 0, bb, L])
    for (let i = 0; i < 6; i++) for (let k = 0; k < 3; k++) c[3 * i + k] += o[k]
    for (const mesh of [
      createMesh(c, [{ type: 'wedge6', conn: Int32Array.from([0, 1, 2, 3, 4, 5]) }]),
      // the same prism as three tetrahedra (common split of a prism)
      createMesh(c, [{ type: 'tet4', conn: Int32Array.from([0, 1, 2, 3, 1, 2, 3, 4, 2, 3, 4, 5]) }]),
    ]) {
      const b = body(mesh)
      expect(b.volume).toBeCloseTo((a * bb * L) / 2, 13)
      expect(b.centroid[0]).toBeCloseTo(o[0] + a / 3, 13)
      expect(b.centroid[1]).toBeCloseTo(o[1] + bb / 3, 13)
      expect(b.centroid[2]).toBeCloseTo(o[2] + L / 2, 13)
    }
  })

  it('a column under a warped top: 0 ≤ z ≤ h(x, y), h bilinear over the unit square (non-planar quad face)', () => {
    // corner heights h_a at (0,0) (1,0) (1,1) (0,1); with the bilinear square's mass matrix
    // ∫∫ N_a N_b = [4 2 1 2; 2 4 2 1; 1 2 4 2; 2 1 2 4]/36, ∫∫ N_a = 1/4, ∫∫ x N_a = (1, 2, 2, 1)/12
    // and ∫∫ y N_a = (1, 1, 2, 2)/12 (common practice): V = Σh/4, ∫x dV = Σ h_a ∫∫ x N_a,
    // ∫z dV = ½ ∫∫ h²
    const h = [1, 1.6, 0.7, 1.3]
    const c = Float64Array.from([0, 0, 0, 1, 0, 0, 1, 1, 0, 0, 1, 0, 0, 0, h[0], 1, 0, h[1], 1, 1, h[2], 0, 1, h[3]])
    const b = body(createMesh(c, [{ type: 'hex8', conn: Int32Array.from([0, 1, 2, 3, 4, 5, 6, 7]) }]))
    const M = [[4, 2, 1, 2], [2, 4, 2, 1], [1, 2, 4, 2], [2, 1, 2, 4]]
    const V = (h[0] + h[1] + h[2] + h[3]) / 4
    const mx = (h[0] + 2 * h[1] + 2 * h[2] + h[3]) / 12, my = (h[0] + h[1] + 2 * h[2] + 2 * h[3]) / 12
    let hh = 0
    for (let p = 0; p < 4; p++) for (let q = 0; q < 4; q++) hh += (h[p] * M[p][q] * h[q]) / 36
    expect(b.volume).toBeCloseTo(V, 14)
    expect(b.centroid[0]).toBeCloseTo(mx / V, 14)
    expect(b.centroid[1]).toBeCloseTo(my / V, 14)
    expect(b.centroid[2]).toBeCloseTo(hh / 2 / V, 14)
  })

  it('no faces: null, and bodyVolumeOf sums the elements (an empty mesh: volume 0 at the origin)', () => {
    const mesh = createMesh(new Float64Array(0), [])
    const faces = extractBoundaryFaces(mesh)
    expect(boundaryVolume(mesh.coords, faces)).toBeNull()
    expect(bodyVolumeOf(mesh, faces)).toEqual({ volume: 0, centroid: [0, 0, 0] })
  })
})
