/**
 * The face a cut reply carries (workers/sectionFace.ts): the full fill triangles, and for a
 * software renderer a light face when the face is larger than it ('also': both; 'only', a drag
 * step: the light one in the full one's place). The full face is buildSectionTriangles' own (its
 * tests check it against the cut), the light one coarsenSectionFill's (its tests check the
 * clustering); here: which face goes where, and that both keep the full face's colour ranges.
 */
import { describe, expect, it } from 'vitest'
import { LIGHT_FACE_TRIANGLES, sectionFace } from '../../../workers/sectionFace.ts'
import { buildSectionTriangles } from '../../../src/mechanics/sectionTriangles.ts'
import type { Vec3 } from '../../../src/model/model.ts'
import { anyBox, cutNodal, nodalStress } from '../../helpers/sectionMeshes.ts'

const normal: Vec3 = [0.3, 1, 0.2]
const mesh = anyBox('tet4', 10, 10, 10, 1, 1, 1)
const stress = nodalStress(mesh, (x, y, z) => [x, y - z, 1, 0.2 * x, 0.1, -y])
const polygons = cutNodal(mesh, stress, [0, 0, 0], { point: [0.5, 0.5, 0.5], normal }, { polygons: true }).polygons!
const T = polygons.fill.index.length / 3
const full = buildSectionTriangles(polygons, normal)
const small = Math.floor(T / 8)

describe('sectionFace', () => {
  it('is the full face alone without a light face asked for, or when the face is no larger than the light one', () => {
    expect(LIGHT_FACE_TRIANGLES).toBe(20_000)
    for (const [mode, triangles] of [[undefined, small], ['also', T], ['only', T], ['also', undefined]] as const) {
      const f = sectionFace(polygons, normal, mode, undefined, false, triangles)
      expect(f.light).toBeNull()
      expect(f.face.index).toEqual(full.index)
      expect(f.face.normalTraction).toEqual(full.normalTraction)
      expect(f.triangleElement).toEqual(full.triangleElement)
      expect(f.face.displacement).toBeUndefined()
      expect(f.ranges).toEqual(full.ranges)
    }
  })

  it('adds the light face to the full one (also), or sends it in its place (only), with the full face\'s ranges', () => {
    const also = sectionFace(polygons, normal, 'also', undefined, false, small)
    expect(also.face.index).toEqual(full.index)
    expect(also.light!.index.length / 3).toBeLessThanOrEqual(1.5 * small)
    expect(also.ranges).toEqual(full.ranges)
    const only = sectionFace(polygons, normal, 'only', undefined, false, small)
    expect(only.light).toBeNull()
    expect(only.face.index).toEqual(also.light!.index)
    expect(only.face.positions).toEqual(also.light!.positions)
    expect(only.triangleElement).toBeNull()
    expect(only.ranges).toEqual(full.ranges)
  })

  it('keeps the full face where the reply marks regions on it', () => {
    const f = sectionFace(polygons, normal, 'only', undefined, true, small)
    expect(f.face.index).toEqual(full.index)
    expect(f.triangleElement!.length).toBe(T)
  })

  it('carries the displacement of its points, full or light', () => {
    const V = polygons.fill.positions.length / 3
    const u = new Float64Array(3 * V).fill(0.25)
    const f = sectionFace(polygons, normal, 'also', u, false, small)
    expect(f.face.displacement!.length).toBe(3 * V)
    expect(f.light!.displacement!.length).toBe(f.light!.positions.length)
    expect(Array.from(f.light!.displacement!).every((v) => Math.abs(v - 0.25) < 1e-7)).toBe(true)
  })
})
