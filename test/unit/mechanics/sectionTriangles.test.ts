import { describe, expect, it } from 'vitest'
import { buildSectionTriangles } from '../../../src/mechanics/sectionTriangles.ts'
import type { SectionPolygons } from '../../../src/mechanics/types.ts'

describe('buildSectionTriangles', () => {
  // A triangle, a square and a regular hexagon in the plane x = 1 (m = +x), traction σm given
  // per vertex with normal part i and shear part (0, 2i, 0).
  const hex = Array.from({ length: 6 }, (_, i) => [1, 5 + Math.cos((i * Math.PI) / 3), Math.sin((i * Math.PI) / 3)])
  const verts = [[1, 0, 0], [1, 1, 0], [1, 0, 1], [1, 2, 0], [1, 3, 0], [1, 3, 1], [1, 2, 1], ...hex]
  const polygons: SectionPolygons = {
    count: 3,
    start: new Int32Array([0, 3, 7, 13]),
    positions: new Float64Array(verts.flat()),
    traction: new Float64Array(verts.flatMap((_, i) => [i, 2 * i, 0])),
    elem: new Int32Array([10, 11, 12]),
  }
  const s = buildSectionTriangles(polygons, [3, 0, 0])

  it('fans an n-gon into n - 2 triangles over its own vertices', () => {
    expect(s.positions.length).toBe(3 * 13)
    expect(s.index.length).toBe(3 * (1 + 2 + 4))
    expect(Array.from(s.triangleElement)).toEqual([10, 11, 11, 12, 12, 12, 12])
    expect(Array.from(s.index.subarray(0, 9))).toEqual([0, 1, 2, 3, 4, 5, 3, 5, 6])
    expect(s.normal).toEqual([1, 0, 0])
  })

  it('fan areas add up to the polygon areas (unit square 1, regular hexagon 3√3/2)', () => {
    // Regular hexagon of circumradius 1: area 3√3/2 (elementary geometry).
    const area = [0, 0, 0]
    for (let t = 0; t < s.triangleElement.length; t++) {
      const [a, b, c] = [s.index[3 * t], s.index[3 * t + 1], s.index[3 * t + 2]]
      const uy = s.positions[3 * b + 1] - s.positions[3 * a + 1], uz = s.positions[3 * b + 2] - s.positions[3 * a + 2]
      const vy = s.positions[3 * c + 1] - s.positions[3 * a + 1], vz = s.positions[3 * c + 2] - s.positions[3 * a + 2]
      area[s.triangleElement[t] - 10] += 0.5 * Math.abs(uy * vz - uz * vy)
    }
    expect(area[0]).toBeCloseTo(0.5, 6)
    expect(area[1]).toBeCloseTo(1, 6)
    expect(area[2]).toBeCloseTo((3 * Math.sqrt(3)) / 2, 6)
  })

  it('vertex values are m·(σm) and |σm - (m·σm)m| of the traction they came from', () => {
    for (let i = 0; i < 13; i++) {
      expect(s.normalTraction[i]).toBe(i)
      expect(s.shearTraction[i]).toBe(2 * i)
    }
    expect(s.ranges.normalTraction).toEqual([0, 12])
    expect(s.ranges.shearTraction).toEqual([0, 24])
  })

  it('no polygons give empty buffers', () => {
    const e = buildSectionTriangles({ count: 0, start: new Int32Array([0]), positions: new Float64Array(0), traction: new Float64Array(0), elem: new Int32Array(0) }, [0, 0, 1])
    expect(e.index.length).toBe(0)
    expect(e.ranges.normalTraction).toEqual([0, 0])
  })
})
