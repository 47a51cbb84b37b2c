import { describe, expect, it } from 'vitest'
import {
  affineFit, createElementMap, invertElementMap, invertTrilinearPoints, loadElementMap, NEWTON_ITERATIONS, pullInside, referenceDomain,
} from '../../../src/mechanics/inverseMap.ts'
import { shapeValues } from '../../../src/mechanics/shapeFunctions.ts'
import { shapeDegree } from '../../../src/mechanics/sectionRule.ts'
import { mulberry32 } from '../../../src/mechanics/seededRandom.ts'
import { ELEMENT_TYPE_NAMES, ELEMENT_TYPES } from '../../../src/model/elementTypes.ts'
import type { ElementTypeName } from '../../../src/model/elementTypes.ts'
import { singleElement } from '../../helpers/sectionElements.ts'

const SEED = 4711

/** A random point inside the reference element: a convex combination of its corners. */
function insidePoint(type: ElementTypeName, rnd: () => number): number[] {
  const topo = ELEMENT_TYPES[type]
  const w = Array.from({ length: topo.cornerCount }, () => rnd() + 0.05)
  const s = w.reduce((a, b) => a + b)
  return [0, 1, 2].map((k) => w.reduce((acc, wc, c) => acc + (wc / s) * topo.refCoords[c][k], 0))
}

/** x(ξ) = Σ N_a(ξ) x_a of node coordinates `x` (3 per local node). */
function forward(type: ElementTypeName, x: Float64Array, xi: readonly number[]): number[] {
  const nn = ELEMENT_TYPES[type].nodeCount
  const N = shapeValues(type, xi[0], xi[1], xi[2], new Float64Array(nn))
  return [0, 1, 2].map((k) => { let v = 0; for (let a = 0; a < nn; a++) v += N[a] * x[3 * a + k]; return v })
}

describe(`inverse element map (seed ${SEED})`, () => {
  it.each([...ELEMENT_TYPE_NAMES])('%s: an affine image of the reference element is recognised as affine, a distorted one is not', (type) => {
    const mesh = singleElement(type, [1.3, 0.8, 1.1], [0.2, -0.4, 0.7])
    const em = createElementMap()
    const conn = mesh.blocks[0].conn
    expect(loadElementMap(em, referenceDomain(type), mesh.coords, conn, 0).affine).toBe(true)
    const rnd = mulberry32(SEED)
    const bent = mesh.coords.map((v) => v + 0.05 * (2 * rnd() - 1))
    // a linear simplex (shape functions of degree 1) is affine whatever its nodes
    expect(loadElementMap(em, referenceDomain(type), bent, conn, 0).affine).toBe(shapeDegree(type) <= 1)
  })

  // Self-consistency of the map (Newton's method, any numerical-analysis text): on a distorted
  // element, ξ → x(ξ) → Newton from the reference centre must return ξ.
  it.each([...ELEMENT_TYPE_NAMES])('%s: Newton recovers ξ of points of a distorted element to 1e-12', (type) => {
    const rnd = mulberry32(SEED + 1)
    const mesh = singleElement(type, [1.3, 0.8, 1.1], [0.2, -0.4, 0.7])
    const x = mesh.coords.map((v) => v + 0.06 * (2 * rnd() - 1))
    const dom = referenceDomain(type)
    const em = loadElementMap(createElementMap(), dom, x, mesh.blocks[0].conn, 0)
    em.failures = 0
    for (let k = 0; k < 20; k++) {
      const xi = insidePoint(type, rnd)
      const p = forward(type, x, xi)
      const got = Float64Array.from(dom.centre)
      expect(invertElementMap(em, p[0] - em.origin[0], p[1] - em.origin[1], p[2] - em.origin[2], got, 0)).toBe(true)
      for (let c = 0; c < 3; c++) expect(Math.abs(got[c] - xi[c])).toBeLessThan(1e-12)
    }
    expect(em.failures).toBe(0)
  })

  // The hex8 fast path (the map in monomial form) against the generic shape-function path: the
  // same polynomial, so the same ξ to round-off, and the same residual x(ξ) - x.
  it('hex8: the monomial form gives the ξ of the generic shape-function Newton to 1e-13', () => {
    const rnd = mulberry32(SEED + 7)
    const mesh = singleElement('hex8', [1.3, 0.8, 1.1], [0.2, -0.4, 0.7])
    const x = mesh.coords.map((v) => v + 0.15 * (2 * rnd() - 1))
    const dom = referenceDomain('hex8')
    const fast = loadElementMap(createElementMap(), dom, x, mesh.blocks[0].conn, 0)
    const plain = loadElementMap(createElementMap(), dom, x, mesh.blocks[0].conn, 0)
    expect(fast.trilinear).toBe(true)
    plain.trilinear = false
    for (let k = 0; k < 50; k++) {
      const xi = insidePoint('hex8', rnd)
      const p = forward('hex8', x, xi)
      const a = Float64Array.from(dom.centre), b = Float64Array.from(dom.centre)
      expect(invertElementMap(fast, p[0] - fast.origin[0], p[1] - fast.origin[1], p[2] - fast.origin[2], a, 0)).toBe(true)
      expect(invertElementMap(plain, p[0] - plain.origin[0], p[1] - plain.origin[1], p[2] - plain.origin[2], b, 0)).toBe(true)
      for (let c = 0; c < 3; c++) expect(Math.abs(a[c] - b[c])).toBeLessThan(1e-13)
    }
  })

  // The monomial coefficients (a butterfly over the corners) against the shape functions: the same
  // trilinear polynomial, so x(ξ) agrees at any ξ to round-off, here on random distorted hex8
  // far from the origin (poly is relative to em.origin).
  it(`hex8: the monomial form's coefficients reproduce Σ N_a(ξ) x_a (seed ${SEED + 8})`, () => {
    const rnd = mulberry32(SEED + 8)
    const dom = referenceDomain('hex8')
    for (let e = 0; e < 20; e++) {
      const mesh = singleElement('hex8', [0.5 + rnd(), 0.5 + rnd(), 0.5 + rnd()], [1e3 * rnd(), -1e3 * rnd(), 10 * rnd()])
      const x = mesh.coords.map((v) => v + 0.3 * (2 * rnd() - 1))
      const em = loadElementMap(createElementMap(), dom, x, mesh.blocks[0].conn, 0)
      expect(em.trilinear).toBe(true)
      const P = em.poly
      for (let k = 0; k < 10; k++) {
        const [a, b, c] = [2 * rnd() - 1, 2 * rnd() - 1, 2 * rnd() - 1]
        const m = [1, a, b, c, a * b, b * c, a * c, a * b * c]
        const want = forward('hex8', x, [a, b, c])
        for (let d = 0; d < 3; d++) {
          let got = em.origin[d]
          for (let j = 0; j < 8; j++) got += P[3 * j + d] * m[j]
          expect(Math.abs(got - want[d])).toBeLessThan(1e-12 * 1e3)
        }
      }
    }
  })

  // The batch inversion of one element's points (the section's hex8 path) against one call per
  // point: the same ξ bit for bit, the same failures and the same fallback (each point's own
  // iteration, whatever the others do), on random distorted hexahedra (rotated, far from the origin), with points
  // inside, on the faces, a little and far outside (pulled back, or not mapped), from starts that
  // are good, poor and at the centre; and on a flattened hexahedron where every point fails.
  const batchSeed = SEED + 11
  it(`hex8: invertTrilinearPoints = invertElementMap point by point, bit for bit (seed ${batchSeed})`, () => {
    console.log(`inverseMap batch: seed ${batchSeed}`)
    const rnd = mulberry32(batchSeed)
    const dom = referenceDomain('hex8')
    const conn = Int32Array.from({ length: 8 }, (_, i) => i)
    let compared = 0, notMapped = 0, flatSeen = false
    for (let e = 0; e < 60; e++) {
      // a random rotation (unit quaternion), scale, shift and corner jitter
      const qv = [rnd() - 0.5, rnd() - 0.5, rnd() - 0.5, rnd() - 0.5]
      const ql = Math.hypot(...qv)
      const [w, i, j, k] = qv.map((v) => v / ql)
      const R = [
        [1 - 2 * (j * j + k * k), 2 * (i * j - k * w), 2 * (i * k + j * w)],
        [2 * (i * j + k * w), 1 - 2 * (i * i + k * k), 2 * (j * k - i * w)],
        [2 * (i * k - j * w), 2 * (j * k + i * w), 1 - 2 * (i * i + j * j)],
      ]
      const scale = [0.5 + rnd(), 0.5 + rnd(), 0.5 + rnd()], shift = [1e3 * (rnd() - 0.5), 1e3 * (rnd() - 0.5), 1e3 * (rnd() - 0.5)]
      const jitter = e % 10 === 9 ? 0 : 0.35 * rnd()
      const flat = e === 58
      const x = new Float64Array(24)
      for (let a = 0; a < 8; a++) {
        const r = ELEMENT_TYPES.hex8.refCoords[a].map((v, c) => scale[c] * (v + jitter * (2 * rnd() - 1)) * (flat && c === 2 ? 0 : 1))
        for (let c = 0; c < 3; c++) x[3 * a + c] = shift[c] + R[c][0] * r[0] + R[c][1] * r[1] + R[c][2] * r[2]
      }
      const em = loadElementMap(createElementMap(), dom, x, conn, 0)
      if (!em.trilinear) continue
      const n = 1 + Math.floor(30 * rnd())
      const X = new Float64Array(3 * n), start = new Float64Array(3 * (n + 2))
      for (let q = 0; q < n; q++) {
        const kind = rnd()
        const xi = kind < 0.6 ? insidePoint('hex8', rnd) : kind < 0.8 ? [2 * rnd() - 1, 2 * rnd() - 1, rnd() < 0.5 ? -1 : 1] : kind < 0.95 ? [2.6 * rnd() - 1.3, 2.6 * rnd() - 1.3, 2.6 * rnd() - 1.3] : [30 * rnd(), -20, 5]
        const p = forward('hex8', x, xi)
        for (let c = 0; c < 3; c++) X[3 * q + c] = p[c] - em.origin[c]
        const s = rnd()
        for (let c = 0; c < 3; c++) start[3 * (q + 2) + c] = s < 0.3 ? 0 : s < 0.7 ? xi[c] + 0.2 * (2 * rnd() - 1) : 2 * rnd() - 1
      }
      // the batch, from index 2 on (the caller's offset), against one call per point
      const batch = start.slice(), single = start.slice()
      em.failures = 0
      const failed = invertTrilinearPoints(em, X, batch, 6, n)
      expect(em.failures).toBe(failed)
      em.failures = 0
      for (let q = 0; q < n; q++) invertElementMap(em, X[3 * q], X[3 * q + 1], X[3 * q + 2], single, 3 * (q + 2))
      expect(em.failures).toBe(failed)
      expect(Array.from(batch)).toEqual(Array.from(single))
      compared += n
      notMapped += failed
      if (flat) { expect(failed).toBe(n); flatSeen = true }
    }
    expect(compared).toBeGreaterThan(500)
    expect(notMapped).toBeGreaterThan(0)
    expect(flatSeen).toBe(true)
  })

  // loadElementMap settles a hex8 with a large non-linear monomial coefficient without the affine
  // fit: the decision must be the fit's, on parallelepipeds (rotated, far from the origin) with
  // corner deviations from none through round-off and the fit's tolerance to plain distortion.
  const affineSeed = SEED + 12
  it(`hex8: the affine decision of loadElementMap = affineFit (seed ${affineSeed})`, () => {
    console.log(`inverseMap hex8 affine decision: seed ${affineSeed}`)
    const rnd = mulberry32(affineSeed)
    const dom = referenceDomain('hex8')
    const conn = Int32Array.from({ length: 8 }, (_, i) => i)
    const seen = { affine: 0, not: 0 }
    for (const dev of [0, 1e-16, 1e-14, 1e-13, 5e-13, 1e-12, 3e-12, 1e-11, 1e-10, 1e-9, 1e-8, 1e-3, 0.2]) {
      for (let e = 0; e < 12; e++) {
        // a random parallelepiped: x = o + A ξ with a random (well-conditioned) A, then deviations
        const A = Array.from({ length: 9 }, () => 2 * rnd() - 1)
        for (let k = 0; k < 3; k++) A[4 * k] += 2
        const o = [1e4 * (rnd() - 0.5), 1e4 * (rnd() - 0.5), 1e4 * (rnd() - 0.5)]
        const x = new Float64Array(24)
        for (let a = 0; a < 8; a++) {
          const r = ELEMENT_TYPES.hex8.refCoords[a]
          for (let c = 0; c < 3; c++) x[3 * a + c] = o[c] + A[3 * c] * r[0] + A[3 * c + 1] * r[1] + A[3 * c + 2] * r[2] + dev * 3 * (2 * rnd() - 1)
        }
        const em = loadElementMap(createElementMap(), dom, x, conn, 0)
        const fit = affineFit(em, dom)
        expect(em.affine).toBe(fit)
        expect(em.trilinear).toBe(!fit)
        if (fit) seen.affine++; else seen.not++
      }
    }
    expect(seen.affine).toBeGreaterThan(20)
    expect(seen.not).toBeGreaterThan(20)
  })

  it('a flattened (zero-volume) hex8 or a point far outside is counted as not mapped, never NaN', () => {
    const type = 'hex8'
    const dom = referenceDomain(type)
    const flat = singleElement(type, [1, 1, 1], [0, 0, 0]).coords.map((v, i) => (i % 3 === 2 ? 0 : v))
    const em = loadElementMap(createElementMap(), dom, flat, Int32Array.from({ length: 8 }, (_, i) => i), 0)
    em.failures = 0
    const xi = Float64Array.from([0.3, -0.2, 0.1])
    expect(invertElementMap(em, 0.2, 0.1, 0.5, xi, 0)).toBe(false)
    expect(em.failures).toBe(1)
    for (const v of xi) expect(Number.isFinite(v)).toBe(true)
    // far outside a sound element: iterates are held in the grown element, the cap ends it
    const cube = singleElement(type, [1, 1, 1], [0, 0, 0])
    const em2 = loadElementMap(createElementMap(), dom, cube.coords, cube.blocks[0].conn, 0)
    em2.failures = 0
    const far = Float64Array.from([0, 0, 0])
    expect(invertElementMap(em2, 40 - em2.origin[0], 0, 0, far, 0)).toBe(false)
    expect(em2.failures).toBe(1)
    // the fallback is the start estimate pulled into the reference element
    for (const v of far) expect(Math.abs(v)).toBeLessThanOrEqual(1)
    expect(NEWTON_ITERATIONS).toBeGreaterThan(3)
  })

  it.each([...ELEMENT_TYPE_NAMES])('%s: pullInside moves an outside point onto the boundary toward the centre', (type) => {
    const dom = referenceDomain(type)
    const out = new Float64Array(3)
    const far = [dom.centre[0] + 3 * dom.size, dom.centre[1] - 2 * dom.size, dom.centre[2] + dom.size]
    pullInside(dom, 0, far[0], far[1], far[2], out)
    // on the boundary: the largest face excess is 0; on the segment from the centre
    let worst = -Infinity
    for (let f = 0; f < dom.planes.length; f += 4) worst = Math.max(worst, dom.planes[f] * out[0] + dom.planes[f + 1] * out[1] + dom.planes[f + 2] * out[2] - dom.planes[f + 3])
    expect(Math.abs(worst)).toBeLessThan(1e-12)
    const d = far.map((v, k) => v - dom.centre[k]), e = [0, 1, 2].map((k) => out[k] - dom.centre[k])
    const cr = [d[1] * e[2] - d[2] * e[1], d[2] * e[0] - d[0] * e[2], d[0] * e[1] - d[1] * e[0]]
    expect(Math.hypot(...cr)).toBeLessThan(1e-12 * Math.hypot(...d))
    // a point inside stays where it is
    pullInside(dom, 0, dom.centre[0], dom.centre[1], dom.centre[2], out)
    expect(Array.from(out)).toEqual(Array.from(dom.centre))
  })
})
