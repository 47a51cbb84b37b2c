/**
 * The two conforming mixed meshes (src/demo/mixedMesh.ts): one of hex8, pyramid5, tet4 and wedge6,
 * one of hex20, pyramid13, tet10 and wedge15, in a 2 × 1.5 × 3 box. Checks:
 * - conformity (elementary geometry): the boundary is exactly the box surface, 2(ab + bc + ca);
 * - Cauchy's formula on a uniform stress state (Malvern, Introduction to the Mechanics of a
 *   Continuous Medium, 1969, ch. 3): t = σn at every boundary face node, face force σ·n·A, every
 *   element and the whole body in balance to round-off, every section F = σm·A with no moment
 *   about its centroid; also rotated (x' = Qx, σ' = QσQᵀ: F' = QF);
 * - the readers: CSV bundle and .tractus container give the model back bit for bit.
 */
import { nodalStressField } from '../../src/model/stressField.ts'
import { describe, expect, it } from 'vitest'
import type { BoxSpec } from '../../src/model/boxMesh.ts'
import { mixedBoxMesh, mixedLayout } from '../../src/demo/mixedMesh.ts'
import { checkBlockOrientation } from '../../src/io/elementOrientation.ts'
import { readNative, writeNative } from '../../src/io/nativeContainer.ts'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import { writeCsvBundle } from '../../src/io/writeCsvBundle.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { FACE_KINDS } from '../../src/model/elementTypes.ts'
import type { Mesh, Model, Vec3 } from '../../src/model/model.ts'
import { expectSameModel } from '../io/sameModel.ts'
import { maxAbs, runCore } from '../helpers/pipeline.ts'
import { mulberry32, rotateMesh, rotateStress, rotateVec, rotationFromUniforms } from '../helpers/rotation.ts'

const SEED = Number(process.env.TRACTUS_SEED ?? 1992)
const SIGMA = [120, -35, 60, 25, -18, 42]
const spec: BoxSpec = { nx: 2, ny: 2, nz: 3, lx: 2, ly: 1.5, lz: 3, x0: 0.25, y0: -0.5, z0: 1 }
const AREA = 2 * (2 * 1.5 + 1.5 * 3 + 3 * 2)

const meshes: [string, Mesh, string[]][] = [
  ['linear', mixedBoxMesh(spec, mixedLayout(spec)), ['tet4', 'hex8', 'wedge6', 'pyramid5']],
  ['quadratic', mixedBoxMesh(spec, mixedLayout(spec), true), ['tet10', 'hex20', 'pyramid13', 'wedge15']],
]

function uniform(mesh: Mesh, s: readonly number[]): Float64Array {
  const out = new Float64Array(6 * mesh.nodeCount)
  for (let i = 0; i < mesh.nodeCount; i++) out.set(s, 6 * i)
  return out
}

const sigmaN = (s: readonly number[], n: readonly number[]): number[] =>
  [s[0] * n[0] + s[3] * n[1] + s[5] * n[2], s[3] * n[0] + s[1] * n[1] + s[4] * n[2], s[5] * n[0] + s[4] * n[1] + s[2] * n[2]]

describe.each(meshes)('conforming mixed mesh (%s)', (_name, mesh, types) => {
  it(`holds ${types.join(', ')}, all positively oriented, and its boundary is the box surface`, () => {
    expect(mesh.blocks.map((b) => b.type)).toEqual(types)
    for (const b of mesh.blocks) {
      const o = checkBlockOrientation(mesh.coords, b.type, b.conn)
      expect(o.degenerate).toBe(-1)
      expect(o.inverted.length).toBe(0)
    }
    const { faces, body } = runCore(mesh, uniform(mesh, SIGMA))
    expect(faces.area.reduce((a, b) => a + b, 0)).toBeCloseTo(AREA, 12)
    expect(body.volume).toBeCloseTo(2 * 1.5 * 3, 12)
    // Every boundary face lies in a side of the box, normal along that side's axis.
    const lo = [0.25, -0.5, 1], hi = [2.25, 1, 4]
    for (let f = 0; f < faces.count; f++) {
      const side = [0, 1, 2].find((d) => Math.abs(Math.abs(faces.normal[3 * f + d]) - 1) < 1e-14)
      expect(side).toBeDefined()
      const c = faces.centroid[3 * f + side!]
      expect(Math.min(Math.abs(c - lo[side!]), Math.abs(c - hi[side!]))).toBeLessThan(1e-14)
    }
  })

  it(`uniform stress: t = σn at every face node, face force σ·n·A, zero element and body residual (rotation seed ${SEED})`, () => {
    const rnd = mulberry32(SEED)
    const Q = rotationFromUniforms(rnd(), rnd(), rnd())
    for (const [m, s] of [[mesh, SIGMA], [rotateMesh(mesh, Q), rotateStress(Q, SIGMA)]] as const) {
      const { faces, tractions, elements, body } = runCore(m, uniform(m, s))
      const scale = maxAbs(s)
      for (let f = 0; f < faces.count; f++) {
        const n = [faces.normal[3 * f], faces.normal[3 * f + 1], faces.normal[3 * f + 2]], A = faces.area[f]
        const t = sigmaN(s, n)
        for (let k = 0; k < 3; k++) expect(Math.abs(tractions.force[3 * f + k] - t[k] * A)).toBeLessThan(1e-12 * scale * A)
        for (let a = 0; a < FACE_KINDS[faces.kind[f]].nodeCount; a++) {
          const slot = faces.slots * f + a
          const tn = sigmaN(s, [tractions.nodeNormal[3 * slot], tractions.nodeNormal[3 * slot + 1], tractions.nodeNormal[3 * slot + 2]])
          for (let k = 0; k < 3; k++) expect(Math.abs(tractions.nodeTraction[3 * slot + k] - tn[k])).toBeLessThan(1e-12 * scale)
        }
      }
      expect(maxAbs(elements.indicator)).toBeLessThan(1e-12)
      expect(body.relative).toBeLessThan(1e-12)
      expect(Math.hypot(...body.moment)).toBeLessThan(1e-12 * body.gross * 3)
    }
  })

  it('sections: F = σm·A over the exact cut area, no moment about the centroid, free body in balance; rotated too', () => {
    const rnd = mulberry32(SEED + 1)
    const Q = rotationFromUniforms(rnd(), rnd(), rnd())
    // Planes through the box (bounds x 0.25..2.25, y -0.5..1, z 1..4) with their exact cut areas
    // (elementary geometry): across x, across y, across z through the pyramid and tet layers, and
    // the vertical diagonal plane x - y = 0.75 (it crosses the whole y range: a 1.5·√2 by 3 rectangle).
    const planes: [Vec3, Vec3, number][] = [
      [[1.1, 0, 2], [1, 0, 0], 1.5 * 3],
      [[1, 0.37, 2], [0, 1, 0], 2 * 3],
      [[1, 0, 2.3], [0, 0, 1], 2 * 1.5],
      [[1, 0, 3.61], [0, 0, -1], 2 * 1.5],
      [[1.25, 0.5, 2], [Math.SQRT1_2, -Math.SQRT1_2, 0], 1.5 * Math.SQRT2 * 3],
    ]
    const stress = uniform(mesh, SIGMA)
    const rotated = rotateMesh(mesh, Q), rotatedStress = uniform(rotated, rotateStress(Q, SIGMA))
    for (const [p, n, area] of planes) {
      const { result: r } = cutSection(mesh, nodalStressField(mesh, stress), [0, 0, 0], { point: p, normal: n })
      expect(r.area).toBeCloseTo(area, 12)
      const t = sigmaN(SIGMA, r.plane.normal)
      for (let k = 0; k < 3; k++) expect(Math.abs(r.force[k] - t[k] * area)).toBeLessThan(1e-12 * maxAbs(SIGMA) * area)
      expect(Math.hypot(...r.moment)).toBeLessThan(1e-12 * maxAbs(SIGMA) * area * 3)
      expect(r.freeBody.relative).toBeLessThan(1e-10)
      const rq = cutSection(rotated, nodalStressField(rotated, rotatedStress), [0, 0, 0], { point: rotateVec(Q, p), normal: rotateVec(Q, n) }).result
      const F = rotateVec(Q, r.force)
      for (let k = 0; k < 3; k++) expect(Math.abs(rq.force[k] - F[k])).toBeLessThan(1e-11 * maxAbs(SIGMA) * area)
    }
  })

  it('CSV bundle and .tractus container give the model back bit for bit, and it runs the same', () => {
    const model: Model = {
      name: 'mixed', description: 'conforming mixed mesh, uniform stress', units: { length: 'm', stress: 'Pa' },
      mesh, stress: uniform(mesh, SIGMA), displacement: null, bodyForce: [0, 0, 0], warnings: [],
    }
    const fromCsv = readCsvBundle(writeCsvBundle(model))
    expectSameModel(model, fromCsv)
    expect(fromCsv.warnings).toEqual([])
    const fromNative = readNative(writeNative(fromCsv))
    expectSameModel(fromCsv, fromNative)
    const r = runCore(fromNative.mesh, fromNative.stress)
    expect(maxAbs(r.elements.indicator)).toBeLessThan(1e-12)
    expect(r.body.relative).toBeLessThan(1e-12)
  })
})

describe('mixed mesh layouts that cannot conform are refused', () => {
  it('a hex8 on top of tetrahedra (a quadrilateral against two triangles) is an error naming the face', () => {
    const s: BoxSpec = { nx: 1, ny: 1, nz: 2, lx: 1, ly: 1, lz: 2 }
    expect(() => mixedBoxMesh(s, (_i, _j, k) => (k === 0 ? 'tet4' : 'hex8'))).toThrow(/not conforming: the face through .* belongs to 1 element/)
  })
  it('a quadratic type as a cell fill is an error (the quadratic option makes the twins)', () => {
    const s: BoxSpec = { nx: 1, ny: 1, nz: 1, lx: 1, ly: 1, lz: 1 }
    expect(() => mixedBoxMesh(s, () => 'hex20')).toThrow(/linear type/)
  })
})
