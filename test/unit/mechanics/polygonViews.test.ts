/**
 * The section polygons handed out as views of the cut's kept arrays (cutSection's polygonViews,
 * sectionDrawing.ts), as the engine asks for them while a section is dragged: the same polygons
 * as the copies every other caller gets, bit for bit, for every element type; a cut's views stay
 * whole through the next cut (the two sets are used by turns); and readyPolygonViews leaves them
 * whole while it makes room. Against the copies of the same code: the copies' own values are
 * checked against closed forms in sectionTriangles.test.ts and the reference tests.
 */
import { describe, expect, it } from 'vitest'
import { cutSection } from '../../../src/mechanics/sectionCut.ts'
import { readyPolygonViews } from '../../../src/mechanics/sectionDrawing.ts'
import type { SectionPolygons } from '../../../src/mechanics/types.ts'
import { ELEMENT_TYPE_NAMES } from '../../../src/model/elementTypes.ts'
import type { Mesh, Vec3 } from '../../../src/model/model.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import { anyBox, nodalStress } from '../../helpers/sectionMeshes.ts'

const ZERO: Vec3 = [0, 0, 0]

function cut(mesh: Mesh, offset: number, polygonViews: boolean): SectionPolygons {
  const field = nodalStressField(mesh, nodalStress(mesh, (x, y, z) => [1 + x, 2 - y, 3 * z, 0.5, 0.25 * x, -1]))
  return cutSection(mesh, field, ZERO, { point: [offset, 0.3, 0.2], normal: [1, 2, 3] }, { polygons: true, polygonViews }).polygons!
}

/** A deep copy of the polygons' arrays (the views' content at this moment). */
function snapshot(p: SectionPolygons) {
  return JSON.parse(JSON.stringify({ ...p, fill: { ...p.fill } }, (_, v) => (ArrayBuffer.isView(v) ? Array.from(v as Float64Array) : v)))
}

describe('section polygons as views of the kept arrays', () => {
  it.each([...ELEMENT_TYPE_NAMES])('%s: the views hold the same polygons as the copies, bit for bit', (type) => {
    const mesh = anyBox(type, 3, 2, 2, 3, 2, 2)
    for (const offset of [0.6, 1.4, 2.1]) {
      const copies = cut(mesh, offset, false)
      const views = cut(mesh, offset, true)
      expect(views.count).toBeGreaterThan(0)
      expect(Number.isFinite(views.traction[0]) && Number.isFinite(views.force[0])).toBe(true)
      expect(snapshot(views)).toEqual(snapshot(copies))
    }
  })

  it("a cut's views stay whole through the next cut and through readyPolygonViews", () => {
    const mesh = anyBox('tet4', 6, 4, 4, 3, 2, 2)
    const first = cut(mesh, 1.1, true)
    const before = snapshot(first)
    const second = cut(mesh, 1.9, true)
    expect(snapshot(second)).not.toEqual(before)
    expect(snapshot(first)).toEqual(before)
    readyPolygonViews()
    expect(snapshot(first)).toEqual(before)
    // a copying cut in between uses storage of its own
    cut(mesh, 0.7, false)
    expect(snapshot(second)).toEqual(snapshot(cut(mesh, 1.9, false)))
  })
})
