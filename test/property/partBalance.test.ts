/**
 * Properties of parts and interfaces: Newton's third law on every interface of a uniform-stress
 * assembly (t = σn on both sides with opposite normals: F_ab = −F_ba to round-off; Malvern 1969,
 * ch. 3), everything turning with a rigidly rotated model (objectivity of t = σn), the mismatch of
 * element-nodal stress that differs across an interface, per-part residuals summing to the
 * whole-body residual plus the mismatches, and the free body of a cut limited to whole parts.
 * Seeded; the seed is printed.
 */
import { describe, expect, it } from 'vitest'
import { assemblyBalance } from '../../src/mechanics/partBalance.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { computeBodyBalance } from '../../src/mechanics/balanceAudit.ts'
import { ELEMENT_TYPES } from '../../src/model/elementTypes.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import type { StressField } from '../../src/model/stressField.ts'
import type { Mesh, Vec3 } from '../../src/model/model.ts'
import { assembly } from '../helpers/assemblies.ts'
import { mulberry32, rotateMesh, rotateStressField, rotateVec, rotationFromUniforms } from '../helpers/rotation.ts'
import { nodalStress, uniformStress } from '../helpers/sectionMeshes.ts'

const SEED = 1415
const ZERO: Vec3 = [0, 0, 0]
const cross = (a: readonly number[], b: readonly number[]): Vec3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]]

/** An element-nodal field: each element's nodes carry f(x, part) of their own element (built here, not read). */
function elementNodalField(mesh: Mesh, f: (x: number, y: number, z: number, part: number) => readonly number[]): StressField {
  let rowsTotal = 0
  for (const b of mesh.blocks) rowsTotal += b.conn.length
  const values = new Float64Array(6 * rowsTotal)
  const rows: Int32Array[] = []
  let next = 0
  for (const b of mesh.blocks) {
    const nn = ELEMENT_TYPES[b.type].nodeCount, r = new Int32Array(b.conn.length)
    for (let e = 0; e < b.ids.length; e++) for (let k = 0; k < nn; k++) {
      const n = b.conn[nn * e + k], row = next++
      r[nn * e + k] = row
      values.set(f(mesh.coords[3 * n], mesh.coords[3 * n + 1], mesh.coords[3 * n + 2], b.part ? b.part[e] : 0), 6 * row)
    }
    rows.push(r)
  }
  return { values, rows, layout: 'element-nodal' }
}

describe(`parts and interfaces (seed ${SEED})`, () => {
  console.log(`parts and interfaces property seed ${SEED}`)
  const rnd = mulberry32(SEED)

  for (const merge of [true, false]) {
    it(`uniform stress: interfaces equal and opposite, everything rotates (shared nodes: ${merge})`, () => {
      const mesh = assembly([
        { box: { nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1 }, type: 'hex8', part: 1 },
        { box: { nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1, z0: 1 }, type: merge ? 'hex8' : 'hex20', part: 2 },
        { box: { nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1, x0: 1 }, type: 'wedge6', part: 3 },
      ], merge)
      const s6 = Array.from({ length: 6 }, () => 2 * rnd() - 1)
      const stress = uniformStress(mesh, s6)
      const asm = assemblyBalance(mesh, nodalStressField(mesh, stress), () => ZERO)
      expect(asm.interfaces.map((i) => i.parts)).toEqual([[1, 2], [1, 3]])
      for (const i of asm.interfaces) {
        const scale = Math.hypot(...i.force)
        for (let k = 0; k < 3; k++) expect(Math.abs(i.force[k] + i.reverseForce[k])).toBeLessThan(1e-13 * Math.max(scale, 1))
        expect(i.mismatch).toBeLessThan(1e-12)
        expect(i.area).toBeCloseTo(1, 12)
      }
      for (const p of asm.parts) expect(p.balance.relative).toBeLessThan(1e-12)
      const Q = rotationFromUniforms(rnd(), rnd(), rnd())
      const rm = rotateMesh(mesh, Q)
      const rot = assemblyBalance(rm, nodalStressField(rm, rotateStressField(Q, stress)), () => ZERO)
      asm.interfaces.forEach((i, k) => {
        const j = rot.interfaces[k]
        expect(j.parts).toEqual(i.parts)
        const f = rotateVec(Q, i.force), c = rotateVec(Q, i.centroid), m = rotateVec(Q, i.moment)
        for (let a = 0; a < 3; a++) {
          expect(Math.abs(j.force[a] - f[a])).toBeLessThan(1e-12)
          expect(Math.abs(j.centroid[a] - c[a])).toBeLessThan(1e-12)
          expect(Math.abs(j.moment[a] - m[a])).toBeLessThan(1e-12)
        }
        expect(j.area).toBeCloseTo(i.area, 12)
      })
      asm.parts.forEach((p, k) => {
        expect(rot.parts[k].volume).toBeCloseTo(p.volume, 12)
        const a = rotateVec(Q, p.balance.about)
        for (let c = 0; c < 3; c++) expect(Math.abs(rot.parts[k].balance.about[c] - a[c])).toBeLessThan(1e-12)
      })
    })
  }

  it('element-nodal stress that jumps across the interface: a mismatch, and the sums still close', () => {
    // two-part column, σzz = W (z − 2) in part 1 and W (z − 2) + δ in part 2: from part 2's side
    // the interface carries (−W + δ)·(−1) per unit area, from part 1's −W·(+1): the two differ by δ A
    const W = 7.7e-5, delta = 0.3 * W * (1 + rnd())
    const mesh = assembly([
      { box: { nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1 }, type: 'hex8', part: 1 },
      { box: { nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1, z0: 1 }, type: 'hex8', part: 2 },
    ], true)
    const field = elementNodalField(mesh, (_x, _y, z, part) => [0, 0, W * (z - 2) + (part === 2 ? delta : 0), 0, 0, 0])
    const b: Vec3 = [0, 0, -W]
    const asm = assemblyBalance(mesh, field, () => b)
    expect(asm.interfaces.length).toBe(1)
    const i = asm.interfaces[0]
    expect(i.force[2]).toBeCloseTo(W - delta, 15)
    expect(i.reverseForce[2]).toBeCloseTo(-W, 15)
    // mismatch = |F_ab + F_ba| / (mean of ∫|t| dA over both sides)
    const expected = delta / (0.5 * (Math.abs(W - delta) + W))
    expect(i.mismatch).toBeCloseTo(expected, 10)
    expect(i.mismatch).toBeGreaterThan(0.1)
    // Σ part residuals = whole-body residual + Σ (F_ab + F_ba)
    const faces = extractBoundaryFaces(mesh)
    const whole = computeBodyBalance(mesh, faces, computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, field, faces), b)
    const F: Vec3 = [0, 0, 0], M: Vec3 = [0, 0, 0], O: Vec3 = [0.1, 0.2, 0.3]
    for (const p of asm.parts) {
      const arm = cross([p.balance.about[0] - O[0], p.balance.about[1] - O[1], p.balance.about[2] - O[2]], p.balance.force)
      for (let k = 0; k < 3; k++) { F[k] += p.balance.force[k]; M[k] += p.balance.moment[k] + arm[k] }
    }
    const armW = cross([whole.about[0] - O[0], whole.about[1] - O[1], whole.about[2] - O[2]], whole.force)
    const armI = cross([i.centroid[0] - O[0], i.centroid[1] - O[1], i.centroid[2] - O[2]], [i.force[0] + i.reverseForce[0], i.force[1] + i.reverseForce[1], i.force[2] + i.reverseForce[2]])
    for (let k = 0; k < 3; k++) {
      expect(Math.abs(F[k] - (whole.force[k] + i.force[k] + i.reverseForce[k]))).toBeLessThan(1e-15)
      // uniform jump over a flat interface: the mismatch's moment is that of its resultant at the centroid
      expect(Math.abs(M[k] - (whole.moment[k] + armW[k] + armI[k]))).toBeLessThan(1e-15)
    }
  })

  it('a cut limited to whole parts has a free body, its faces against other parts included', () => {
    const W = 7.7e-5
    const mesh = assembly([
      { box: { nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1 }, type: 'hex8', part: 1 },
      { box: { nx: 2, ny: 2, nz: 4, lx: 1, ly: 1, lz: 1, z0: 1 }, type: 'hex8', part: 2 },
    ], true)
    const stress = nodalStress(mesh, (_x, _y, z) => [0, 0, W * (z - 2), 0, 0, 0])
    const field = nodalStressField(mesh, stress)
    const b: Vec3 = [0, 0, -W]
    const plane = { point: [0.2, 0.3, 1.5] as Vec3, normal: [0, 0, 1] as Vec3 }
    // part 2 below the plane: its section above, the interface with part 1 below, its weight
    const r = cutSection(mesh, field, b, plane, { limit: { parts: [2] } }).result
    expect(r.freeBodyDefined).toBe(true)
    expect(r.force[2]).toBeCloseTo(W * (1.5 - 2), 15)
    expect(r.freeBody.relative).toBeLessThan(1e-12)
    // both parts: the same as the whole plane
    const all = cutSection(mesh, field, b, plane, { limit: { parts: [1, 2] } }).result
    const whole = cutSection(mesh, field, b, plane).result
    expect(all.freeBody.force[2]).toBeCloseTo(whole.freeBody.force[2], 15)
    expect(all.freeBody.gross).toBeCloseTo(whole.freeBody.gross, 15)
  })
})
