/**
 * Cauchy's formula on a uniform stress state (Malvern, Introduction to the Mechanics of a
 * Continuous Medium, 1969, ch. 3): on every boundary face t = σn exactly; every element and the
 * whole body are in balance to round-off (∮ σn dA = σ ∮ n dA = 0); the moment of the surface
 * tractions vanishes (σ symmetric). Each case is also run rotated (x' = Qx, σ' = QσQᵀ): face
 * forces and moments rotate with the body, F' = QF, M' = QM (objectivity).
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../src/model/boxMesh.ts'
import type { BoxSpec } from '../../src/model/boxMesh.ts'
import { mixedBoxMesh, mixedLayout } from '../../src/demo/mixedMesh.ts'
import { ELEMENT_TYPE_LIST, ELEMENT_TYPE_NAMES, FACE_KINDS } from '../../src/model/elementTypes.ts'
import type { Mesh } from '../../src/model/model.ts'
import { quarterCylinder } from '../helpers/mappedMeshes.ts'
import { maxAbs, runCore } from '../helpers/pipeline.ts'
import { mulberry32, rotateMesh, rotateStress, rotateStressField, rotateVec, rotationFromUniforms } from '../helpers/rotation.ts'

const SEED = Number(process.env.TRACTUS_SEED ?? 4711)
const SIGMA = [120, -35, 60, 25, -18, 42]
const spec = { nx: 3, ny: 2, nz: 2, lx: 3, ly: 1.5, lz: 2, x0: 0.5, y0: -1, z0: 2 }

const columns: BoxSpec = { nx: 3, ny: 2, nz: 2, lx: 3, ly: 1.5, lz: 2 }
const layers: BoxSpec = { nx: 2, ny: 2, nz: 3, lx: 2, ly: 2, lz: 3 }
/** Mixed meshes (src/demo/mixedMesh.ts) with their box surface area 2(ab + bc + ca). */
const mixed: [string, () => Mesh, number][] = [
  ['mixed hex8 + wedge6 columns', () => mixedBoxMesh(columns, (i) => (i === 1 ? 'wedge6' : 'hex8')), 2 * (3 * 1.5 + 1.5 * 2 + 2 * 3)],
  ['mixed wedge6 + tet4 layers', () => mixedBoxMesh(layers, (_i, _j, k) => (k === 0 ? 'wedge6' : 'tet4')), 2 * (2 * 2 + 2 * 3 + 3 * 2)],
  ['conforming mix of hex8, pyramid5, tet4, wedge6', () => mixedBoxMesh(layers, mixedLayout(layers)), 2 * (2 * 2 + 2 * 3 + 3 * 2)],
  ['conforming mix of hex20, pyramid13, tet10, wedge15', () => mixedBoxMesh(layers, mixedLayout(layers), true), 2 * (2 * 2 + 2 * 3 + 3 * 2)],
]
const cases: [string, () => Mesh][] = [
  ...ELEMENT_TYPE_NAMES.map((t): [string, () => Mesh] => [`${t} box`, () => boxMesh(spec, t)]),
  ...mixed.map(([name, make]): [string, () => Mesh] => [name, make]),
  // Curved quadratic elements: the box's mid-edge nodes land on the arcs.
  ...ELEMENT_TYPE_LIST.filter((t) => t.quadratic).map((t): [string, () => Mesh] =>
    [`curved ${t.name} quarter cylinder`, () => quarterCylinder({ a: 1, b: 2, length: 1, nr: 2, ntheta: 3, nz: 1 }, t.name)]),
]

function uniform(mesh: Mesh, s: readonly number[]): Float64Array {
  const out = new Float64Array(6 * mesh.nodeCount)
  for (let i = 0; i < mesh.nodeCount; i++) out.set(s, 6 * i)
  return out
}

describe(`uniform stress on every element type (rotation seed ${SEED})`, () => {
  const rnd = mulberry32(SEED)
  for (const [name, make] of cases) {
    const Q = rotationFromUniforms(rnd(), rnd(), rnd())
    it(name, () => {
      const mesh = make()
      const run = (m: Mesh, s: number[]) => {
        const r = runCore(m, uniform(m, s))
        const { faces, tractions } = r
        const scale = maxAbs(s)
        let tErr = 0, nErr = 0
        for (let f = 0; f < faces.count; f++) {
          const nn = FACE_KINDS[faces.kind[f]].nodeCount
          for (let a = 0; a < nn; a++) {
            const k = faces.slots * f + a
            const n = [tractions.nodeNormal[3 * k], tractions.nodeNormal[3 * k + 1], tractions.nodeNormal[3 * k + 2]]
            const t = [s[0] * n[0] + s[3] * n[1] + s[5] * n[2], s[3] * n[0] + s[1] * n[1] + s[4] * n[2], s[5] * n[0] + s[4] * n[1] + s[2] * n[2]]
            for (let c = 0; c < 3; c++) tErr = Math.max(tErr, Math.abs(tractions.nodeTraction[3 * k + c] - t[c]))
            nErr = Math.max(nErr, Math.abs(Math.hypot(n[0], n[1], n[2]) - 1))
          }
        }
        expect(tErr).toBeLessThan(1e-12 * scale)
        expect(nErr).toBeLessThan(1e-14)
        // Element balance: residual / gross at round-off for every element.
        expect(maxAbs(r.elements.indicator)).toBeLessThan(1e-12)
        // Whole body: force and moment about the centroid vanish.
        expect(r.body.relative).toBeLessThan(1e-12)
        const L = Math.cbrt(r.body.volume)
        expect(Math.hypot(...r.body.moment)).toBeLessThan(1e-12 * r.body.gross * L)
        return r
      }
      const r0 = run(mesh, SIGMA)
      // Rotated copy: same topology, so face f corresponds to face f.
      const r1 = run(rotateMesh(mesh, Q), rotateStress(Q, SIGMA))
      expect(r1.faces.count).toBe(r0.faces.count)
      const fScale = maxAbs(r0.tractions.force), mScale = maxAbs(r0.tractions.moment)
      let fErr = 0, mErr = 0, tnErr = 0, aErr = 0
      for (let f = 0; f < r0.faces.count; f++) {
        const F = rotateVec(Q, r0.tractions.force, 3 * f), M = rotateVec(Q, r0.tractions.moment, 3 * f)
        for (let c = 0; c < 3; c++) {
          fErr = Math.max(fErr, Math.abs(r1.tractions.force[3 * f + c] - F[c]))
          mErr = Math.max(mErr, Math.abs(r1.tractions.moment[3 * f + c] - M[c]))
        }
        tnErr = Math.max(tnErr, Math.abs(r1.tractions.meanNormal[f] - r0.tractions.meanNormal[f]))
        aErr = Math.max(aErr, Math.abs(r1.faces.area[f] - r0.faces.area[f]))
      }
      expect(fErr).toBeLessThan(1e-12 * fScale)
      expect(mErr).toBeLessThan(1e-11 * mScale)
      expect(tnErr).toBeLessThan(1e-10 * maxAbs(SIGMA))
      expect(aErr).toBeLessThan(1e-12 * maxAbs(r0.faces.area))
      // Rotating the stress field node by node gives the same as rotating the constant.
      expect(maxAbs(rotateStressField(Q, uniform(mesh, SIGMA)).map((v, i) => v - rotateStress(Q, SIGMA)[i % 6]))).toBeLessThan(1e-12)
    })
  }

  it('the mixed meshes conform: their boundary is exactly the box surface', () => {
    for (const [, make, area] of mixed) {
      const mesh = make()
      const { faces } = runCore(mesh, uniform(mesh, SIGMA))
      expect(mesh.blocks.length).toBeGreaterThanOrEqual(2)
      expect(faces.area.reduce((a, b) => a + b, 0)).toBeCloseTo(area, 12)
    }
  })

  it('flat faces: face force = σ·n·A exactly', () => {
    const mesh = boxMesh(spec, 'hex20')
    const { faces, tractions } = runCore(mesh, uniform(mesh, SIGMA))
    for (let f = 0; f < faces.count; f++) {
      const n = [faces.normal[3 * f], faces.normal[3 * f + 1], faces.normal[3 * f + 2]], A = faces.area[f]
      const t = [SIGMA[0] * n[0] + SIGMA[3] * n[1] + SIGMA[5] * n[2], SIGMA[3] * n[0] + SIGMA[1] * n[1] + SIGMA[4] * n[2], SIGMA[5] * n[0] + SIGMA[4] * n[1] + SIGMA[2] * n[2]]
      for (let c = 0; c < 3; c++) expect(tractions.force[3 * f + c]).toBeCloseTo(t[c] * A, 10)
    }
  })
})
