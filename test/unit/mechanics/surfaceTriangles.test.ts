import { describe, expect, it } from 'vitest'
import { buildSurfaceTriangles, fillVertexPatch, finiteRange, SURFACE_QUANTITIES } from '../../../src/mechanics/surfaceTriangles.ts'
import type { BoundaryFaces, NodalInvariants, SurfaceTractions } from '../../../src/mechanics/types.ts'
import { FACE_KIND_CODE, FACE_KINDS, FACE_NODE_COUNT } from '../../../src/model/elementTypes.ts'
import type { FaceKind } from '../../../src/model/elementTypes.ts'

/**
 * Four flat faces in the plane z = 0 with outward normal +z, one of each kind, side 2, placed
 * side by side along x; mid nodes at edge midpoints. Face areas: triangles 2, quads 4 (elementary
 * geometry). Every per-slot value is distinct, so a wrong slot or node lookup shows.
 */
function fixture(): { coords: Float64Array; faces: BoundaryFaces; tractions: SurfaceTractions; invariants: NodalInvariants } {
  const kinds: FaceKind[] = ['tri3', 'quad4', 'tri6', 'quad8']
  const pts: number[][] = []
  const faceNodes: number[][] = []
  kinds.forEach((k, f) => {
    const x0 = 3 * f
    const corners = k.startsWith('tri') ? [[x0, 0], [x0 + 2, 0], [x0, 2]] : [[x0, 0], [x0 + 2, 0], [x0 + 2, 2], [x0, 2]]
    const list = corners.map((c) => { pts.push([c[0], c[1], 0]); return pts.length - 1 })
    if (k === 'tri6' || k === 'quad8') {
      const nc = corners.length
      for (let i = 0; i < nc; i++) {
        const a = corners[i], b = corners[(i + 1) % nc]
        pts.push([(a[0] + b[0]) / 2, (a[1] + b[1]) / 2, 0])
        list.push(pts.length - 1)
      }
    }
    faceNodes.push(list)
  })
  const F = kinds.length, N = pts.length
  const coords = new Float64Array(pts.flat())
  // Stride of the per-face-node arrays: the largest face present (quad8, 8 nodes).
  const slots = Math.max(...kinds.map((k) => FACE_NODE_COUNT[k]))
  const nodes = new Int32Array(slots * F).fill(-1)
  faceNodes.forEach((l, f) => l.forEach((n, a) => { nodes[slots * f + a] = n }))
  const faces: BoundaryFaces = {
    count: F,
    slots,
    elem: new Int32Array([5, 6, 7, 8]),
    localFace: new Uint8Array(F),
    kind: new Uint8Array(kinds.map((k) => FACE_KIND_CODE[k])),
    nodes,
    area: new Float64Array([2, 4, 2, 4]),
    normal: new Float64Array(kinds.flatMap(() => [0, 0, 1])),
    centroid: new Float64Array(3 * F),
  }
  const S = slots * F
  const slotVal = (off: number) => Float64Array.from({ length: S }, (_, i) => (nodes[i] < 0 ? NaN : off + i))
  const tractions: SurfaceTractions = {
    nodeNormal: Float64Array.from({ length: 3 * S }, (_, i) => (i % 3 === 2 ? 1 : 0)),
    nodeTraction: new Float64Array(3 * S),
    nodeNormalTraction: slotVal(-100),
    nodeShear: slotVal(1000),
    nodeMagnitude: slotVal(2000),
    force: new Float64Array(3 * F), moment: new Float64Array(3 * F),
    meanNormal: new Float64Array(F), meanShear: new Float64Array(F), meanMagnitude: new Float64Array(F),
  }
  const invariants: NodalInvariants = {
    principal: Float64Array.from({ length: 3 * N }, (_, i) => 10 * i),
    directions: new Float64Array(9 * N),
    vonMises: Float64Array.from({ length: N }, (_, i) => 500 + i),
    tresca: new Float64Array(N), mean: new Float64Array(N),
  }
  return { coords, faces, tractions, invariants }
}

describe('buildSurfaceTriangles', () => {
  const { coords, faces, tractions, invariants } = fixture()
  const indicator = new Float64Array([0, 0, 0, 0, 0, 0.5, 0.25, 0.125, 1])
  const labels = new Int32Array([-1, 2, 2, 7])
  const s = buildSurfaceTriangles(coords, faces, tractions, invariants, indicator, labels)

  it('has one vertex per face node and 1/2/4/6 sub-triangles for tri3/quad4/tri6/quad8', () => {
    // Vertex and triangle counts follow from the face kinds (common practice for splitting
    // quadratic faces through their mid nodes).
    const V = 3 + 4 + 6 + 8
    expect(s.positions.length).toBe(3 * V)
    expect(s.normals.length).toBe(3 * V)
    expect(s.index.length).toBe(3 * (1 + 2 + 4 + 6))
    expect(Array.from(s.triangleFace)).toEqual([0, 1, 1, 2, 2, 2, 2, 3, 3, 3, 3, 3, 3])
    expect(Array.from(s.faceVertexStart)).toEqual([0, 3, 7, 13, 21])
    for (const q of SURFACE_QUANTITIES) expect(s.scalars[q].length).toBe(V)
  })

  it('sub-triangles tile each flat face: their areas add up to the face area and face outward', () => {
    // Elementary geometry: the triangles cover the face without overlap, so their (signed) areas
    // sum to the face area, and each is counter-clockwise seen from +z.
    const sum = new Float64Array(faces.count)
    for (let t = 0; t < s.triangleFace.length; t++) {
      const [a, b, c] = [s.index[3 * t], s.index[3 * t + 1], s.index[3 * t + 2]]
      const ax = s.positions[3 * b] - s.positions[3 * a], ay = s.positions[3 * b + 1] - s.positions[3 * a + 1]
      const bx = s.positions[3 * c] - s.positions[3 * a], by = s.positions[3 * c + 1] - s.positions[3 * a + 1]
      const signed = 0.5 * (ax * by - ay * bx)
      expect(signed).toBeGreaterThan(0)
      sum[s.triangleFace[t]] += signed
    }
    for (let f = 0; f < faces.count; f++) expect(sum[f]).toBeCloseTo(faces.area[f], 12)
  })

  it('values at vertices equal the tractions and invariants they came from', () => {
    for (let f = 0; f < faces.count; f++) {
      const nv = FACE_KINDS[faces.kind[f]].nodeCount
      for (let a = 0; a < nv; a++) {
        const v = s.faceVertexStart[f] + a, slot = faces.slots * f + a, node = faces.nodes[slot]
        expect(s.scalars.normalTraction[v]).toBe(Math.fround(tractions.nodeNormalTraction[slot]))
        expect(s.scalars.shearTraction[v]).toBe(Math.fround(tractions.nodeShear[slot]))
        expect(s.scalars.tractionMagnitude[v]).toBe(Math.fround(tractions.nodeMagnitude[slot]))
        expect(s.scalars.vonMises[v]).toBe(Math.fround(invariants.vonMises[node]))
        expect(s.scalars.principal1[v]).toBe(Math.fround(invariants.principal[3 * node]))
        expect(s.scalars.principal3[v]).toBe(Math.fround(invariants.principal[3 * node + 2]))
        expect(s.scalars.balanceIndicator[v]).toBe(Math.fround(indicator[faces.elem[f]]))
        expect(s.patch[v]).toBe(labels[f])
        for (let k = 0; k < 3; k++) expect(s.positions[3 * v + k]).toBe(Math.fround(coords[3 * node + k]))
        expect(s.normals[3 * v + 2]).toBe(1)
      }
    }
  })

  it('ranges span the finite values; bounds span the vertices', () => {
    const V = s.patch.length
    expect(s.ranges.normalTraction[0]).toBe(-100)
    expect(s.ranges.balanceIndicator).toEqual([0.125, 1])
    expect(s.ranges.vonMises).toEqual([500, 500 + V - 1])
    expect(s.bounds.min).toEqual([0, 0, 0])
    expect(s.bounds.max).toEqual([11, 2, 0])
  })

  it('fillVertexPatch rewrites labels; no labels or indicator give -1 and 0', () => {
    const bare = buildSurfaceTriangles(coords, faces, tractions, invariants)
    expect(Array.from(bare.patch).every((v) => v === -1)).toBe(true)
    expect(Array.from(bare.scalars.balanceIndicator).every((v) => v === 0)).toBe(true)
    fillVertexPatch(bare.patch, bare.faceVertexStart, labels)
    expect(Array.from(bare.patch)).toEqual(Array.from(s.patch))
  })

  it('finiteRange skips NaN and infinities', () => {
    expect(finiteRange([NaN, 3, -Infinity, -2, Infinity])).toEqual([-2, 3])
    expect(finiteRange([NaN])).toEqual([0, 0])
  })
})
