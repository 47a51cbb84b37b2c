import { describe, expect, it } from 'vitest'
import { ELEMENT_TYPES, ELEMENT_TYPE_NAMES, FACE_KINDS, FACE_NODE_COUNT } from '../../../src/model/elementTypes.ts'
import type { ElementTypeName } from '../../../src/model/elementTypes.ts'
import { faceRefCoords, faceShapeDerivatives, faceShapeValues, shapeDerivatives, shapeValues } from '../../../src/mechanics/shapeFunctions.ts'

// Checks below are the defining properties of interpolation functions (common practice; e.g.
// Zienkiewicz & Taylor, The Finite Element Method, vol. 1, ch. on standard elements).

/**
 * Deterministic sample points inside the type's reference domain: seeded points of the unit cube
 * through the domain's collapsed-cube map, kept off the faces (the finite differences below step
 * 1e-6 to either side).
 */
function samplePoints(type: ElementTypeName): [number, number, number][] {
  const out: [number, number, number][] = []
  let s = 12345
  const rnd = (): number => { s = (s * 1103515245 + 12345) % 2147483648; return 0.01 + 0.98 * (s / 2147483648) }
  for (let i = 0; i < 20; i++) {
    const p: [number, number, number] = [0, 0, 0]
    ELEMENT_TYPES[type].domain.fromUnitCube(p, rnd(), rnd(), rnd())
    out.push(p)
  }
  return out
}

describe('element shape functions', () => {
  for (const type of ELEMENT_TYPE_NAMES) {
    const topo = ELEMENT_TYPES[type]
    const nn = topo.nodeCount
    const N = new Float64Array(nn), D = new Float64Array(3 * nn), Np = new Float64Array(nn), Nm = new Float64Array(nn)

    it(`${type}: Kronecker delta at the reference nodes`, () => {
      topo.refCoords.forEach(([x, y, z], b) => {
        shapeValues(type, x, y, z, N)
        for (let a = 0; a < nn; a++) expect(Math.abs(N[a] - (a === b ? 1 : 0))).toBeLessThan(1e-15)
      })
    })

    it(`${type}: partition of unity, derivatives sum to zero and match finite differences`, () => {
      const h = 1e-6
      for (const p of samplePoints(type)) {
        shapeValues(type, p[0], p[1], p[2], N)
        shapeDerivatives(type, p[0], p[1], p[2], D)
        expect(Math.abs(N.reduce((s, v) => s + v, 0) - 1)).toBeLessThan(1e-14)
        for (let k = 0; k < 3; k++) {
          let ds = 0
          const pp = [...p] as [number, number, number], pm = [...p] as [number, number, number]
          pp[k] += h; pm[k] -= h
          shapeValues(type, pp[0], pp[1], pp[2], Np)
          shapeValues(type, pm[0], pm[1], pm[2], Nm)
          for (let a = 0; a < nn; a++) {
            ds += D[3 * a + k]
            expect(Math.abs(D[3 * a + k] - (Np[a] - Nm[a]) / (2 * h))).toBeLessThan(1e-8)
          }
          expect(Math.abs(ds)).toBeLessThan(1e-13)
        }
      }
    })

    it(`${type}: reproduces ${topo.quadratic ? 'quadratic' : 'linear'} fields and their gradients`, () => {
      // Fields the element's space contains: linear for all; every quadratic type here holds the
      // complete quadratic in ξ, η, ζ (tet10 Lagrange; hex20 and wedge15 serendipity; pyramid13
      // rational, whose three extra functions come on top of the ten quadratic monomials).
      const f = (x: number, y: number, z: number): number =>
        0.3 + 1.1 * x - 0.7 * y + 0.4 * z + (topo.quadratic ? 0.5 * x * x - 0.9 * x * y + 0.2 * z * z + 0.6 * y * z - 0.3 * x * z + 0.8 * y * y : 0)
      const grad = (x: number, y: number, z: number): number[] => [
        1.1 + (topo.quadratic ? x - 0.9 * y - 0.3 * z : 0),
        -0.7 + (topo.quadratic ? -0.9 * x + 0.6 * z + 1.6 * y : 0),
        0.4 + (topo.quadratic ? 0.4 * z + 0.6 * y - 0.3 * x : 0),
      ]
      const nodal = topo.refCoords.map(([x, y, z]) => f(x, y, z))
      for (const p of samplePoints(type)) {
        shapeValues(type, p[0], p[1], p[2], N)
        shapeDerivatives(type, p[0], p[1], p[2], D)
        let v = 0
        const g = [0, 0, 0]
        for (let a = 0; a < nn; a++) { v += N[a] * nodal[a]; for (let k = 0; k < 3; k++) g[k] += D[3 * a + k] * nodal[a] }
        expect(Math.abs(v - f(...p))).toBeLessThan(1e-13)
        const ge = grad(...p)
        for (let k = 0; k < 3; k++) expect(Math.abs(g[k] - ge[k])).toBeLessThan(1e-12)
      }
    })
  }

  it('wedge6 reproduces the bilinear field ξζ it contains', () => {
    const N = new Float64Array(6)
    const nodal = ELEMENT_TYPES.wedge6.refCoords.map(([x, , z]) => x * z)
    shapeValues('wedge6', 0.2, 0.3, 0.4, N)
    expect(nodal.reduce((s, v, a) => s + v * N[a], 0)).toBeCloseTo(0.08, 14)
  })
})

describe('face shape functions', () => {
  for (const kind of FACE_KINDS.map((k) => k.name)) {
    const nn = FACE_NODE_COUNT[kind]
    const ref = faceRefCoords(kind)
    const N = new Float64Array(nn), D = new Float64Array(2 * nn), Np = new Float64Array(nn), Nm = new Float64Array(nn)
    const tri = kind === 'tri3' || kind === 'tri6'
    const quadratic = kind === 'tri6' || kind === 'quad8'
    const pts: [number, number][] = tri ? [[0.1, 0.2], [0.5, 0.3], [0.05, 0.9], [1 / 3, 1 / 3]] : [[0.1, -0.7], [0.5, 0.3], [-0.95, 0.9], [0, 0]]

    it(`${kind}: Kronecker delta, partition of unity, finite-difference derivatives`, () => {
      for (let b = 0; b < nn; b++) {
        faceShapeValues(kind, ref[2 * b], ref[2 * b + 1], N)
        for (let a = 0; a < nn; a++) expect(Math.abs(N[a] - (a === b ? 1 : 0))).toBeLessThan(1e-15)
      }
      const h = 1e-6
      for (const [u, v] of pts) {
        faceShapeValues(kind, u, v, N)
        faceShapeDerivatives(kind, u, v, D)
        expect(Math.abs(N.reduce((s, x) => s + x, 0) - 1)).toBeLessThan(1e-14)
        for (let k = 0; k < 2; k++) {
          faceShapeValues(kind, u + (k === 0 ? h : 0), v + (k === 1 ? h : 0), Np)
          faceShapeValues(kind, u - (k === 0 ? h : 0), v - (k === 1 ? h : 0), Nm)
          for (let a = 0; a < nn; a++) expect(Math.abs(D[2 * a + k] - (Np[a] - Nm[a]) / (2 * h))).toBeLessThan(1e-8)
        }
      }
    })

    it(`${kind}: reproduces ${quadratic ? 'quadratic' : 'linear'} fields`, () => {
      const f = (u: number, v: number): number => 0.2 - 0.4 * u + 1.3 * v + (quadratic ? 0.7 * u * u - 0.5 * u * v + 0.9 * v * v : 0)
      for (const [u, v] of pts) {
        faceShapeValues(kind, u, v, N)
        let s = 0
        for (let a = 0; a < nn; a++) s += N[a] * f(ref[2 * a], ref[2 * a + 1])
        expect(Math.abs(s - f(u, v))).toBeLessThan(1e-14)
      }
    })
  }

  it('element faces restrict the element shape functions to the face shape functions', () => {
    // On each face, the element's interpolation must equal the face's own (conformity).
    for (const type of ELEMENT_TYPE_NAMES) {
      const topo = ELEMENT_TYPES[type]
      const Ne = new Float64Array(topo.nodeCount)
      topo.faces.forEach((face, fi) => {
        const kind = topo.faceKinds[fi]
        const nf = FACE_NODE_COUNT[kind]
        const Nf = new Float64Array(nf)
        for (const [u, v] of kind.startsWith('tri') ? [[0.2, 0.3], [0.6, 0.1]] : [[0.3, -0.4], [-0.8, 0.5]]) {
          faceShapeValues(kind, u, v, Nf)
          const x = [0, 0, 0]
          for (let a = 0; a < nf; a++) for (let k = 0; k < 3; k++) x[k] += Nf[a] * topo.refCoords[face[a]][k]
          shapeValues(type, x[0], x[1], x[2], Ne)
          for (let a = 0; a < nf; a++) expect(Math.abs(Ne[face[a]] - Nf[a])).toBeLessThan(1e-14)
          const onFace = new Set(face)
          for (let a = 0; a < topo.nodeCount; a++) if (!onFace.has(a)) expect(Math.abs(Ne[a])).toBeLessThan(1e-14)
        }
      })
    }
  })
})

// The rational pyramid functions of Bedrosian, "Shape functions and integration formulas for
// three-dimensional finite element analysis", IJNME 35 (1992), written from memory in
// src/model/elements/pyramids.ts and checked here and above (Kronecker delta, partition of
// unity, face traces). The apex limits are elementary calculus on those formulas.
describe('pyramids: the rational terms and the apex', () => {
  const APEX = 4
  for (const type of ['pyramid5', 'pyramid13'] as const) {
    const topo = ELEMENT_TYPES[type]
    const nn = topo.nodeCount
    const N = new Float64Array(nn), D = new Float64Array(3 * nn), Np = new Float64Array(nn), Nm = new Float64Array(nn)
    const Da = new Float64Array(3 * nn)

    it(`${type}: values tend to the apex's Kronecker values, linearly in the distance`, () => {
      for (const eps of [1e-2, 1e-5, 1e-9, 1e-14]) {
        for (const [a, b] of [[0.9, -0.7], [-1, 1], [0.3, 0.05], [0, 0]]) {
          shapeValues(type, a * eps, b * eps, 1 - eps, N)
          for (let k = 0; k < nn; k++) expect(Math.abs(N[k] - (k === APEX ? 1 : 0))).toBeLessThan(8 * eps + 1e-15)
        }
      }
      shapeValues(type, 0, 0, 1, N)
      for (let k = 0; k < nn; k++) expect(N[k] === (k === APEX ? 1 : 0)).toBe(true) // exactly, -0 included
    })

    it(`${type}: derivatives near the apex match finite differences (steps inside the pyramid)`, () => {
      for (const s of [1e-2, 1e-4]) {
        for (const [a, b] of [[0.5, -0.3], [-0.8, 0.9], [0.1, 0.6]]) {
          const p = [a * s, b * s, 1 - s]
          const h = 1e-4 * s
          shapeDerivatives(type, p[0], p[1], p[2], D)
          for (let k = 0; k < 3; k++) {
            const pp = [...p], pm = [...p]
            pp[k] += h; pm[k] -= h
            shapeValues(type, pp[0], pp[1], pp[2], Np)
            shapeValues(type, pm[0], pm[1], pm[2], Nm)
            for (let m = 0; m < nn; m++) expect(Math.abs(D[3 * m + k] - (Np[m] - Nm[m]) / (2 * h))).toBeLessThan(1e-6)
          }
        }
      }
    })

    it(`${type}: at the apex the derivatives are the limit along the axis, the mean over the nearby cross-sections`, () => {
      shapeDerivatives(type, 0, 0, 1, Da)
      for (const v of Da) expect(Number.isFinite(v)).toBe(true)
      // Along the axis the rational terms vanish: the derivatives converge to the apex values.
      for (const eps of [1e-3, 1e-6, 1e-9]) {
        shapeDerivatives(type, 0, 0, 1 - eps, D)
        for (let m = 0; m < 3 * nn; m++) expect(Math.abs(D[m] - Da[m])).toBeLessThan(5 * eps)
      }
      // Off the axis they depend on the direction, but their mean over a cross-section s = ε
      // (a 40 × 40 midpoint grid of the square |ξ|, |η| ≤ ε) tends to the same values.
      const eps = 1e-6, n = 40
      const mean = new Float64Array(3 * nn)
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
        shapeDerivatives(type, eps * (-1 + (2 * i + 1) / n), eps * (-1 + (2 * j + 1) / n), 1 - eps, D)
        for (let m = 0; m < 3 * nn; m++) mean[m] += D[m] / (n * n)
      }
      for (let m = 0; m < 3 * nn; m++) expect(Math.abs(mean[m] - Da[m])).toBeLessThan(1e-5)
      // One-sided difference down the axis from the apex.
      const h = 1e-7
      shapeValues(type, 0, 0, 1, Np)
      shapeValues(type, 0, 0, 1 - h, Nm)
      for (let m = 0; m < nn; m++) expect(Math.abs(Da[3 * m + 2] - (Np[m] - Nm[m]) / h)).toBeLessThan(1e-6)
    })
  }

  it('pyramid5 holds the rational function ξη/(1 - ζ) besides the linear ones (its value at the apex is the limit 0)', () => {
    const topo = ELEMENT_TYPES.pyramid5
    const N = new Float64Array(5)
    const nodal = topo.refCoords.map(([x, y, z]) => (z < 1 ? (x * y) / (1 - z) : 0))
    for (const p of samplePoints('pyramid5')) {
      shapeValues('pyramid5', p[0], p[1], p[2], N)
      expect(Math.abs(nodal.reduce((s, v, a) => s + v * N[a], 0) - (p[0] * p[1]) / (1 - p[2]))).toBeLessThan(1e-14)
    }
  })

  it('pyramid13 reproduces the ten quadratic monomials and no cubic one', () => {
    const topo = ELEMENT_TYPES.pyramid13
    const N = new Float64Array(13)
    const reproduced: string[] = []
    for (let a = 0; a <= 3; a++) for (let b = 0; a + b <= 3; b++) for (let c = 0; a + b + c <= 3; c++) {
      let err = 0
      for (const p of samplePoints('pyramid13')) {
        shapeValues('pyramid13', p[0], p[1], p[2], N)
        const s = topo.refCoords.reduce((acc, r, k) => acc + N[k] * r[0] ** a * r[1] ** b * r[2] ** c, 0)
        err = Math.max(err, Math.abs(s - p[0] ** a * p[1] ** b * p[2] ** c))
      }
      if (err < 1e-13) reproduced.push(`${a}${b}${c}`)
    }
    expect(reproduced.sort()).toEqual(['000', '001', '002', '010', '011', '020', '100', '101', '110', '200'])
  })
})
