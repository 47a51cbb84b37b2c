/**
 * The shared face quadrature point against exact integrals of flat faces (analytic geometry,
 * common practice): the vector area of a triangle is ½ (x1 − x0) × (x2 − x0), that of any
 * four-node face ½ (x2 − x0) × (x3 − x1) (the bilinear patch's x_u × x_v is linear in u and v, which
 * the 2×2 rule integrates exactly); the area centroid of a triangle or a parallelogram is the mean
 * of its corners; and an isoparametric face reproduces a linear stress field exactly (the
 * completeness of the Lagrange and serendipity families; Zienkiewicz & Taylor, The Finite Element
 * Method vol. 1, the chapter on shape functions, from memory). Faces are tilted so no axis is special; quadratic faces have their
 * mid-edge nodes at the edge midpoints (flat, straight-sided).
 */
import { describe, expect, it } from 'vitest'
import { FACE_KIND_BY_CODE, FACE_NODE_COUNT } from '../../../src/model/elementTypes.ts'
import { faceQuadratureTables } from '../../../src/mechanics/boundaryFaces.ts'
import { FQP_AREA, FQP_SIZE, FQP_STRESS, FQP_X, createFacePoints, faceQuadraturePoints } from '../../../src/mechanics/faceQuadraturePoint.ts'
import { cross } from '../../../src/mechanics/vec3.ts'
import { rotationFromUniforms, rotateVec } from '../../helpers/rotation.ts'

type V = [number, number, number]
const Q = rotationFromUniforms(0.3, 0.7, 0.2)
const sub = (a: V, b: V): V => [a[0] - b[0], a[1] - b[1], a[2] - b[2]]
const mid = (a: V, b: V): V => [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2, (a[2] + b[2]) / 2]

/** Corner coordinates (tilted), then mid-edge nodes in face order for the quadratic kinds. */
function faceNodes(kind: string, corners: V[]): V[] {
  const c = corners.map((p) => rotateVec(Q, p) as V)
  if (kind === 'tri3' || kind === 'quad4') return c
  return [...c, ...c.map((p, i) => mid(p, c[(i + 1) % c.length]))]
}

/** σ(x): a linear field. */
const sigma = (x: V): number[] => [1 + x[0], 2 - x[1], 3 * x[2], x[0] + x[1], -x[2], 0.5 * x[0]]

describe('faceQuadraturePoints', () => {
  const tables = faceQuadratureTables()
  FACE_KIND_BY_CODE.forEach((kind, code) => {
    it(`${kind}: vector area, centroid and a linear stress field are exact on a flat face`, () => {
      const tri = FACE_NODE_COUNT[kind] === 3 || FACE_NODE_COUNT[kind] === 6
      // A general quadrilateral for the vector area, a parallelogram for the centroid.
      const general: V[] = tri ? [[0, 0, 0], [2, 0.2, 0], [0.5, 1.5, 0]] : [[0, 0, 0], [2, 0.3, 0], [2.4, 1.7, 0.4], [-0.2, 1.1, 0]]
      const para: V[] = tri ? general : [[0, 0, 0], [2, 0.3, 0], [2.5, 1.5, 0], [0.5, 1.2, 0]]
      for (const [corners, isPara] of [[general, false], [para, true]] as const) {
        const nodes = faceNodes(kind, corners as V[])
        const t = tables[code]
        const xs = Float64Array.from(nodes.flat())
        const ss = Float64Array.from(nodes.flatMap(sigma))
        const qp = createFacePoints(tables)
        expect(faceQuadraturePoints(qp, t, xs, ss, true)).toBe(qp)
        const sum: V = [0, 0, 0], moment: V = [0, 0, 0]
        let area = 0
        for (let q = 0; q < t.pointCount; q++) {
          const r = FQP_SIZE * q, w = t.weights[q]
          const a: V = [qp[r + FQP_AREA], qp[r + FQP_AREA + 1], qp[r + FQP_AREA + 2]]
          const dA = Math.hypot(...a) * w
          for (let k = 0; k < 3; k++) { sum[k] += a[k] * w; moment[k] += qp[r + FQP_X + k] * dA }
          area += dA
          const x: V = [qp[r + FQP_X], qp[r + FQP_X + 1], qp[r + FQP_X + 2]]
          sigma(x).forEach((s, k) => expect(qp[r + FQP_STRESS + k]).toBeCloseTo(s, 12))
        }
        const c = nodes.slice(0, tri ? 3 : 4)
        const exact = tri ? cross([0, 0, 0], sub(c[1], c[0]), sub(c[2], c[0])) : cross([0, 0, 0], sub(c[2], c[0]), sub(c[3], c[1]))
        for (let k = 0; k < 3; k++) expect(sum[k]).toBeCloseTo(exact[k] / 2, 12)
        if (isPara) {
          const mean = [0, 1, 2].map((k) => c.reduce((s, p) => s + p[k], 0) / c.length)
          for (let k = 0; k < 3; k++) expect(moment[k] / area).toBeCloseTo(mean[k], 12)
        }
      }
    })
  })

  it('without stress rows or position those slots are left as they were; the area vector is always there', () => {
    const t = tables[0]
    const qp = createFacePoints([t]).fill(7)
    expect(qp.length).toBe(FQP_SIZE * t.pointCount)
    faceQuadraturePoints(qp, t, Float64Array.from([0, 0, 0, 1, 0, 0, 0, 1, 0]), null, false)
    for (let q = 0; q < t.pointCount; q++) {
      const r = FQP_SIZE * q
      expect(Array.from(qp.subarray(r + FQP_STRESS, r + FQP_SIZE))).toEqual([7, 7, 7, 7, 7, 7])
      expect(Array.from(qp.subarray(r + FQP_X, r + FQP_X + 3))).toEqual([7, 7, 7])
      expect(Array.from(qp.subarray(r + FQP_AREA, r + FQP_AREA + 3))).toEqual([0, 0, 1])
    }
  })
})
