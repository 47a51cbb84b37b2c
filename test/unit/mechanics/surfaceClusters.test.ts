/**
 * Surface clusters (surfaceClusters.ts) on hand-counted cases: a unit cube's twelve triangles
 * sort into its six faces, each face one cluster with a flat normal cone and a sphere holding its
 * corners; ranges and the size limit cut clusters where they must.
 */
import { describe, expect, it } from 'vitest'
import { CLUSTER_STRIDE, sortTrianglesSpatially, surfaceClusters } from '../../../src/mechanics/surfaceClusters.ts'

/** The unit cube's surface: 8 corners, 12 triangles wound counter-clockwise from outside, in a shuffled order. */
function cube() {
  const positions = new Float32Array([0, 0, 0, 1, 0, 0, 1, 1, 0, 0, 1, 0, 0, 0, 1, 1, 0, 1, 1, 1, 1, 0, 1, 1])
  const quads = [[0, 3, 2, 1], [4, 5, 6, 7], [0, 1, 5, 4], [2, 3, 7, 6], [1, 2, 6, 5], [0, 4, 7, 3]] // −z +z −y +y +x −x
  const tris: number[][] = []
  for (const [a, b, c, d] of quads) tris.push([a, b, c], [a, c, d])
  const order = [7, 2, 11, 0, 5, 9, 3, 10, 1, 6, 8, 4]
  const index = Uint32Array.from(order.flatMap((t) => tris[t]))
  const face = Uint32Array.from(order)
  return { positions, index, face, tris }
}

describe('surface clusters', () => {
  it('a unit cube: six clusters, one per face, flat cones along the outward normals', () => {
    const { positions, index, face, tris } = cube()
    sortTrianglesSpatially(positions, index, [face])
    // every triangle still present, and its carried face number moved with it
    for (let t = 0; t < 12; t++) expect(Array.from(index.subarray(3 * t, 3 * t + 3))).toEqual(tris[face[t]])
    const c = surfaceClusters(positions, index, null, 100)
    expect(Array.from(c.start)).toEqual([0, 2, 4, 6, 8, 10, 12])
    const axes = new Set<string>()
    for (let k = 0; k < 6; k++) {
      const b = c.bounds.subarray(CLUSTER_STRIDE * k, CLUSTER_STRIDE * (k + 1))
      // a face's centre and half its diagonal (√2 / 2), grown by the outward rounding
      expect(b[3]).toBeCloseTo(Math.SQRT1_2, 5)
      expect(b[3]).toBeGreaterThanOrEqual(Math.SQRT1_2)
      expect(b[7]).toBeGreaterThan(0.9999)
      expect(b[7]).toBeLessThan(1)
      const axis = [b[4], b[5], b[6]].map((v) => Math.round(v))
      expect(Math.hypot(...axis)).toBe(1)
      // the centre lies on the face the axis points out of: coordinate 1 for +, 0 for −
      const i = axis.findIndex((v) => v !== 0)
      expect(b[i]).toBe(axis[i] > 0 ? 1 : 0)
      axes.add(axis.join(','))
    }
    expect(axes.size).toBe(6)
  })

  it('ranges and the size limit cut clusters; a cluster never crosses a range', () => {
    const { positions, index, face } = cube()
    sortTrianglesSpatially(positions, index, [face])
    // ranges [0, 3), [3, 12): the second face is split by the range's edge
    const c = surfaceClusters(positions, index, Int32Array.of(0, 3, 12), 100)
    expect(Array.from(c.start)).toEqual([0, 2, 3, 4, 6, 8, 10, 12])
    const one = surfaceClusters(positions, index, null, 1)
    expect(Array.from(one.start)).toEqual([...Array(13).keys()])
  })

  it('degenerate triangles get no cone', () => {
    const positions = new Float32Array([0, 0, 0, 1, 0, 0, 2, 0, 0])
    const index = Uint32Array.of(0, 1, 2)
    const c = surfaceClusters(positions, index, null)
    expect(c.bounds[7]).toBe(-1)
    expect(c.bounds[3]).toBeGreaterThanOrEqual(1)
  })
})
