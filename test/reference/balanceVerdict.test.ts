/**
 * The balance verdict tells mesh error from model error (balanceVerdict.ts) on results solved
 * independently of the kernels under test: the demo's hex8 elastic solver with patch recovery.
 * - a cantilever under an end shear and a column under its own weight, each coarse and refined:
 *   sound results, verdict `mesh` although their residuals reach 15 % of the gross load;
 * - the column's stress with its body force missing or doubled: `model`, and the body force the
 *   stress balances reads back the weight per unit volume (static Cauchy equation
 *   div σ + ρb = 0, Malvern 1969, ch. 3: the element residuals sum to ∫ (ρb_declared − ρb_true) dV);
 * - a stress file from another node numbering (the rows shuffled): `model`.
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { addBodyLoads, addFaceLoads } from '../../src/demo/consistentLoads.ts'
import { hexBoundaryFaces, selectFaces } from '../../src/demo/hexFaces.ts'
import { solveElastic } from '../../src/demo/solveElastic.ts'
import { decideBalance } from '../../src/mechanics/balanceVerdict.ts'
import type { Mesh, Vec3 } from '../../src/model/model.ts'
import { runCore } from '../helpers/pipeline.ts'

const E = 1000, NU = 0.3, WEIGHT = 1 // N/m³ in the column (invented test values)

function solved(kind: 'cantilever' | 'column', n: number): { mesh: Mesh; stress: Float64Array; b: Vec3 } {
  const mesh = kind === 'cantilever'
    ? boxMesh({ nx: 10 * n, ny: n, nz: n, lx: 10, ly: 1, lz: 1 }, 'hex8')
    : boxMesh({ nx: n, ny: n, nz: 3 * n, lx: 1, ly: 1, lz: 3 }, 'hex8')
  const N = mesh.nodeCount, coords = mesh.coords, conn = mesh.blocks[0].conn
  const fixed = new Uint8Array(3 * N), load = new Float64Array(3 * N)
  const axis = kind === 'cantilever' ? 0 : 2
  for (let i = 0; i < N; i++) if (coords[3 * i + axis] < 1e-9) fixed[3 * i] = fixed[3 * i + 1] = fixed[3 * i + 2] = 1
  const b: Vec3 = kind === 'column' ? [0, 0, -WEIGHT] : [0, 0, 0]
  if (kind === 'cantilever') {
    const tip = selectFaces(hexBoundaryFaces(conn, N), coords, (x) => x > 10 - 1e-9)
    addFaceLoads(load, coords, tip, (t) => { t[0] = 0; t[1] = -1; t[2] = 0 })
  } else {
    addBodyLoads(load, coords, conn, b)
  }
  return { mesh, stress: solveElastic({ coords, conn, E, nu: NU, fixed, load }).stress, b }
}

function verdictOf(mesh: Mesh, stress: Float64Array, b: Vec3) {
  const r = runCore(mesh, stress, b)
  return { body: r.body, split: r.verdict }
}

describe('balance verdict on independently solved results', () => {
  for (const kind of ['cantilever', 'column'] as const) {
    for (const n of [2, 4]) {
      it(`${kind}, ${n} elements across: sound result reads as mesh error`, () => {
        const { mesh, stress, b } = solved(kind, n)
        const { body, split } = verdictOf(mesh, stress, b)
        console.log(`${kind} n=${n}: residual ${(100 * body.relative).toFixed(1)} %, ${split.verdict.reason}`)
        expect(body.relative).toBeGreaterThan(0.01) // not trivially balanced: the rule has work to do
        expect(split.verdict.kind).toBe('mesh')
        expect(split.coherence).toBeLessThan(0.5)
      })
    }
  }

  for (const [label, factor] of [['missing', 0], ['doubled', 2]] as const) {
    it(`column with its body force ${label}: model error, the implied body force is the weight`, () => {
      const { mesh, stress } = solved('column', 4)
      const declared: Vec3 = [0, 0, -WEIGHT * factor]
      const { split } = verdictOf(mesh, stress, declared)
      expect(split.verdict.kind).toBe('model')
      expect(split.verdict.reason).toMatch(/body force/)
      // the stress carries the true weight per unit volume, within the discretisation (5 %)
      expect(split.impliedBodyForce[2] / -WEIGHT).toBeGreaterThan(0.95)
      expect(split.impliedBodyForce[2] / -WEIGHT).toBeLessThan(1.05)
      expect(Math.hypot(split.impliedBodyForce[0], split.impliedBodyForce[1])).toBeLessThan(1e-9)
    })
  }

  for (const kind of ['cantilever', 'column'] as const) {
    it(`${kind} with a stress file from another node numbering: model error`, () => {
      const { mesh, stress, b } = solved(kind, 2)
      const N = mesh.nodeCount, shuffled = new Float64Array(stress.length)
      for (let i = 0; i < N; i++) { const j = (i * 7919 + 13) % N; shuffled.set(stress.subarray(6 * j, 6 * j + 6), 6 * i) }
      const { split } = verdictOf(mesh, shuffled, b)
      expect(split.verdict.kind).toBe('model')
      expect(split.verdict.reason).toMatch(/another mesh/)
    })
  }

  it('the rule, branch by branch', () => {
    const base = { total: 0.05, free: 0.03, load: 0.02, freeLevel: 0.02, median: 0.02, coherence: 0.2, declared: [0, 0, 0] as Vec3, implied: [0, 0, 0] as Vec3 }
    expect(decideBalance({ ...base, total: 0.005 }).kind).toBe('mesh')
    expect(decideBalance({ ...base, coherence: 0.95 }).kind).toBe('model')
    expect(decideBalance({ ...base, median: 0.3 }).kind).toBe('model')
    expect(decideBalance({ ...base, freeLevel: 0.3 }).reason).toMatch(/free surface carries a mean traction of 30 %/)
    expect(decideBalance(base).kind).toBe('mesh')
    expect(decideBalance({ ...base, median: 0.15 }).kind).toBe('inconclusive')
    // NaN figures never read as balanced
    expect(decideBalance({ ...base, total: NaN }).kind).not.toBe('mesh')
  })
})
