import { describe, expect, it } from 'vitest'
import { buildFeatureEdges } from '../../../src/mechanics/featureEdges.ts'
import { extractBoundaryFaces } from '../../../src/mechanics/boundaryFaces.ts'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { ELEMENT_TYPES, ELEMENT_TYPE_NAMES } from '../../../src/model/elementTypes.ts'

describe('buildFeatureEdges', () => {
  // A box's only creases are its 12 edges (elementary geometry): the mesh lines inside its flat
  // sides, including the diagonals of split cells, must not show.
  const spec = { nx: 3, ny: 2, nz: 4, lx: 3, ly: 1, lz: 2 }
  for (const type of ELEMENT_TYPE_NAMES) {
    it(`${type} box: only the 12 box edges, total length 4(lx + ly + lz)`, () => {
      const mesh = boxMesh(spec, type)
      const e = buildFeatureEdges(mesh.coords, extractBoundaryFaces(mesh))
      // A quadratic face's edge is drawn as two segments through its mid node.
      const perEdge = ELEMENT_TYPES[type].quadratic ? 2 : 1
      expect(e.count).toBe(4 * (spec.nx + spec.ny + spec.nz) * perEdge)
      let length = 0
      for (let s = 0; s < e.count; s++) {
        const g = e.segments.subarray(6 * s, 6 * s + 6)
        length += Math.hypot(g[3] - g[0], g[4] - g[1], g[5] - g[2])
        // Every segment lies on a box edge: at least two coordinates sit on the box's faces.
        const onFace = (v: number, l: number) => Math.abs(v) < 1e-6 || Math.abs(v - l) < 1e-6
        for (const o of [0, 3]) {
          const k = Number(onFace(g[o], spec.lx)) + Number(onFace(g[o + 1], spec.ly)) + Number(onFace(g[o + 2], spec.lz))
          expect(k).toBeGreaterThanOrEqual(2)
        }
      }
      expect(length).toBeCloseTo(4 * (spec.lx + spec.ly + spec.lz), 5)
    })
  }

  it('a crease angle above 90° hides the box edges too', () => {
    const mesh = boxMesh(spec, 'hex8')
    expect(buildFeatureEdges(mesh.coords, extractBoundaryFaces(mesh), 95).count).toBe(0)
  })
})
