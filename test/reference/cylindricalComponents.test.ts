/**
 * Stress and displacement components in cylindrical axes (src/mechanics/componentAxes.ts, the
 * surface scalars of componentScalars.ts and the line read-out of lineAnalysis.ts) on the Lamé
 * thick cylinder (Timoshenko & Goodier, Theory of Elasticity, 3rd ed. 1970, §28):
 * σr = A − B/r², σθ = A + B/r², σz uniform, no shear, and the radial displacement
 * u_r = (1/E)[(1 − ν)A r + (1 + ν)B/r] − ν σz r/E (plane strain-free ends: the generalised plane
 * stress form with uniform σz; only its being radial matters here). The nodal field is the exact
 * one, so the components read back exactly at every surface vertex and line point, also with the
 * whole model rotated (seeded) and the axis rotated with it.
 */
import { describe, expect, it } from 'vitest'
import type { Vec3 } from '../../src/model/model.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { buildComponentScalars } from '../../src/mechanics/componentScalars.ts'
import { checkAxes } from '../../src/mechanics/componentAxes.ts'
import type { ComponentAxes } from '../../src/mechanics/componentAxes.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { buildElementGrid } from '../../src/mechanics/elementGrid.ts'
import { analyseLine } from '../../src/mechanics/lineAnalysis.ts'
import { FACE_KINDS } from '../../src/model/elementTypes.ts'
import { polarToCartesian, quarterCylinder, stressField } from '../helpers/mappedMeshes.ts'
import { mulberry32, rotateMesh, rotateStressField, rotateVec, rotationFromUniforms } from '../helpers/rotation.ts'
import type { Mat3 } from '../helpers/rotation.ts'

const a = 1, b = 2, p = 100, E = 2e5, nu = 0.3
const A = (p * a * a) / (b * b - a * a), B = (p * a * a * b * b) / (b * b - a * a), SZ = A
const ur = (r: number): number => ((1 - nu) * A * r + ((1 + nu) * B) / r) / E - (nu * SZ * r) / E

const IDENTITY: Mat3 = [1, 0, 0, 0, 1, 0, 0, 0, 1]

function model(Q: Mat3) {
  const base = quarterCylinder({ a, b, length: 0.5, nr: 3, ntheta: 6, nz: 2 }, 'hex20')
  const stress = stressField(base, (x, y) => { const r2 = x * x + y * y; return polarToCartesian(A - B / r2, A + B / r2, 0, Math.atan2(y, x), SZ) })
  const disp = new Float64Array(3 * base.nodeCount)
  for (let i = 0; i < base.nodeCount; i++) {
    const x = base.coords[3 * i], y = base.coords[3 * i + 1], r = Math.hypot(x, y)
    disp[3 * i] = (ur(r) * x) / r; disp[3 * i + 1] = (ur(r) * y) / r
  }
  const mesh = rotateMesh(base, Q)
  const u = new Float64Array(disp.length)
  for (let i = 0; i < base.nodeCount; i++) u.set(rotateVec(Q, disp, 3 * i), 3 * i)
  const axes: ComponentAxes = checkAxes({ kind: 'cylindrical', origin: rotateVec(Q, [0, 0, 0]), axis: rotateVec(Q, [0, 0, 1]) })
  return { base, mesh, stress: rotateStressField(Q, stress), u, axes }
}

describe('cylindrical components of the Lamé field', () => {
  const seed = 2816
  console.log(`cylindrical components rotation seed ${seed}`)
  const rnd = mulberry32(seed)
  for (const [label, Q] of [['as given', IDENTITY], ['rotated', rotationFromUniforms(rnd(), rnd(), rnd())]] as const) {
    it(`on the surface vertices equal σr, σθ, σz and u_r (${label})`, () => {
      const { base, mesh, stress, u, axes } = model(Q)
      const faces = extractBoundaryFaces(mesh)
      const c = buildComponentScalars(faces, mesh.coords, stress, u, axes)
      let v = 0, worst = 0, worstU = 0
      for (let f = 0; f < faces.count; f++) {
        for (let k = 0; k < FACE_KINDS[faces.kind[f]].nodeCount; k++, v++) {
          const n = faces.nodes[f * faces.slots + k]
          const r2 = base.coords[3 * n] ** 2 + base.coords[3 * n + 1] ** 2
          const want = [A - B / r2, A + B / r2, SZ, 0, 0, 0]
          const got = [c.scalars.sxx![v], c.scalars.syy![v], c.scalars.szz![v], c.scalars.sxy![v], c.scalars.syz![v], c.scalars.sxz![v]]
          worst = Math.max(worst, ...got.map((g, i) => Math.abs(g - want[i]) / p))
          worstU = Math.max(worstU, Math.abs(c.scalars.ux![v] - ur(Math.sqrt(r2))) / ur(a), Math.abs(c.scalars.uy![v]) / ur(a), Math.abs(c.scalars.uz![v]) / ur(a))
        }
      }
      expect(v).toBeGreaterThan(100)
      // Single precision buffers: 1e-6 of the pressure.
      expect(worst).toBeLessThan(1e-6)
      expect(worstU).toBeLessThan(1e-6)
      expect(c.ranges.syy![1]).toBeCloseTo(A + B / (a * a), 3) // the inner wall's hoop stress
    })

    it(`along a radial line equal σr, σθ, σz (${label})`, () => {
      const { mesh, stress, u, axes } = model(Q)
      const th = 0.7
      const from = rotateVec(Q, [1.05 * Math.cos(th), 1.05 * Math.sin(th), 0.31]) as Vec3, to = rotateVec(Q, [1.95 * Math.cos(th), 1.95 * Math.sin(th), 0.31]) as Vec3
      const r = analyseLine(mesh, buildElementGrid(mesh), nodalStressField(mesh, stress), u, { from, to, points: 10, axes })
      for (let i = 0; i < 10; i++) {
        const rad = 1.05 + (0.9 * i) / 9, r2 = rad * rad
        const want = [A - B / r2, A + B / r2, SZ, 0, 0, 0]
        // Quadratic interpolation of 1/r² between nodes: close, not exact (hex20, 3 elements
        // through the wall; measured at most 5.7e-3 p).
        for (let k = 0; k < 6; k++) expect(Math.abs(r.components[6 * i + k] - want[k])).toBeLessThan(1e-2 * p)
        expect(Math.abs(r.displacementComponents![3 * i] - ur(rad))).toBeLessThan(1e-3 * ur(a))
        expect(Math.abs(r.displacementComponents![3 * i + 1])).toBeLessThan(1e-4 * ur(a))
      }
    })
  }
})
