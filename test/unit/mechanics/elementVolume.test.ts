import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { ELEMENT_TYPE_NAMES } from '../../../src/model/elementTypes.ts'
import { elementCentroids, elementVolumes } from '../../../src/mechanics/elementVolume.ts'
import { quarterCylinder } from '../../helpers/mappedMeshes.ts'

// Volumes of a box (elementary geometry) and of a quarter annulus π(b² - a²)L/4.
describe('elementVolumes / elementCentroids', () => {
  for (const type of ELEMENT_TYPE_NAMES) {
    it(`${type}: element volumes sum to the box volume; volume-weighted centroids give its centre`, () => {
      const mesh = boxMesh({ nx: 2, ny: 3, nz: 2, lx: 1.2, ly: 0.9, lz: 2.5, x0: 1, y0: -2, z0: 0.5 }, type)
      const v = elementVolumes(mesh), c = elementCentroids(mesh)
      let V = 0
      const m = [0, 0, 0]
      for (let e = 0; e < mesh.elementCount; e++) {
        expect(v[e]).toBeGreaterThan(0)
        V += v[e]
        for (let k = 0; k < 3; k++) m[k] += v[e] * c[3 * e + k]
      }
      expect(V).toBeCloseTo(1.2 * 0.9 * 2.5, 12)
      expect(m[0] / V).toBeCloseTo(1.6, 12)
      expect(m[1] / V).toBeCloseTo(-1.55, 12)
      expect(m[2] / V).toBeCloseTo(1.75, 12)
    })
  }

  it('curved hex20 and tet10 converge to the quarter-annulus volume much faster than hex8', () => {
    const exact = (Math.PI * (4 - 1) * 0.5) / 4
    const err = (type: 'hex8' | 'hex20' | 'tet10', n: number) =>
      Math.abs(elementVolumes(quarterCylinder({ a: 1, b: 2, length: 0.5, nr: 1, ntheta: n, nz: 1 }, type)).reduce((s, x) => s + x, 0) - exact) / exact
    expect(err('hex8', 8)).toBeLessThan(err('hex8', 4) / 3.5) // chord error O(h²)
    expect(err('hex20', 8)).toBeLessThan(err('hex20', 4) / 10) // quadratic arcs O(h⁴)
    expect(err('hex20', 8)).toBeLessThan(1e-4)
    expect(err('tet10', 8)).toBeLessThan(1e-4)
  })
})
