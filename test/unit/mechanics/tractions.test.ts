import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { extractBoundaryFaces } from '../../../src/mechanics/boundaryFaces.ts'
import { ELEMENT_TYPE_NAMES, FACE_KINDS } from '../../../src/model/elementTypes.ts'
import { allocateSurfaceTractions, computeSurfaceTractions, tractionAt } from '../../../src/mechanics/tractions.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'

// Cauchy's formula t = σn (Malvern 1969, ch. 3) on a box under a linear stress field.
describe('computeSurfaceTractions', () => {
  it('tractionAt is σn with the component order xx, yy, zz, xy, yz, xz', () => {
    const t = tractionAt([0, 0, 0], [1, 2, 3, 4, 5, 6], [1, 0, 0])
    expect(t).toEqual([1, 4, 6])
    expect(tractionAt(new Float64Array(3), [1, 2, 3, 4, 5, 6], [0, 1, 0])).toEqual(Float64Array.from([4, 2, 5]))
    expect(tractionAt([0, 0, 0], [1, 2, 3, 4, 5, 6], [0, 0, 1])).toEqual([6, 5, 3])
  })

  it('a linear σxx(z) on the face x = L integrates to the exact force and moment (every element type: flat faces)', () => {
    for (const type of ELEMENT_TYPE_NAMES) {
      const mesh = boxMesh({ nx: 2, ny: 2, nz: 3, lx: 2, ly: 1, lz: 3 }, type)
      const N = mesh.nodeCount
      const stress = new Float64Array(6 * N)
      // σxx = a + b z: on x = 2 (area 1×3) F_x = ∫(a + b z) dA = 3a + 4.5b; M_y = ∫ z σxx dA.
      const a = 2, b = 0.5
      for (let i = 0; i < N; i++) stress[6 * i] = a + b * mesh.coords[3 * i + 2]
      const faces = extractBoundaryFaces(mesh)
      const tr = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, nodalStressField(mesh, stress), faces)
      let Fx = 0, My = 0, Mz = 0
      for (let f = 0; f < faces.count; f++) {
        if (Math.abs(faces.centroid[3 * f] - 2) > 1e-12) continue
        Fx += tr.force[3 * f]; My += tr.moment[3 * f + 1]; Mz += tr.moment[3 * f + 2]
        const nn = FACE_KINDS[faces.kind[f]].nodeCount
        for (let s = 0; s < nn; s++) {
          const slot = faces.slots * f + s
          const z = mesh.coords[3 * faces.nodes[slot] + 2]
          expect(tr.nodeNormalTraction[slot]).toBeCloseTo(a + b * z, 13)
          expect(tr.nodeShear[slot]).toBeCloseTo(0, 13)
        }
        for (let s = nn; s < faces.slots; s++) expect(Number.isNaN(tr.nodeMagnitude[faces.slots * f + s])).toBe(true)
      }
      // ∫ z (a + b z) dz over 0..3 times width 1: a·4.5 + b·9; M = x × t: M_y = z·t_x.
      expect(Fx).toBeCloseTo(3 * a + 4.5 * b, 12)
      expect(My).toBeCloseTo(4.5 * a + 9 * b, 12)
      // M_z = -y t_x: ∫ y dA = 0.5·3 → -(a·1.5 + b·0.5·4.5)
      expect(Mz).toBeCloseTo(-(1.5 * a + 0.5 * 4.5 * b), 12)
    }
  })
})
