/**
 * Element-parallel running of the balance audit: the pool in the browser runs
 * computeElementBalance on meshSlice ranges (with stressFieldSlice) writing into views of one output. Splitting must not
 * change a single bit, and single-precision storage must be the double result rounded once.
 */
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { createMesh } from '../../../src/model/createMesh.ts'
import { meshSlice, splitRanges } from '../../../src/model/meshRange.ts'
import { nodalStressField, stressFieldSlice } from '../../../src/model/stressField.ts'
import type { StressField } from '../../../src/model/stressField.ts'
import { allocateElementBalance, computeElementBalance } from '../../../src/mechanics/balanceAudit.ts'
import type { ElementBalance } from '../../../src/mechanics/types.ts'
import type { Mesh } from '../../../src/model/model.ts'
import { stressField } from '../../helpers/mappedMeshes.ts'

/** A mixed mesh: a hex8 box and a tet10 box side by side in one model (blocks of two types). */
function mixedMesh(): Mesh {
  const a = boxMesh({ nx: 3, ny: 2, nz: 2, lx: 1.5, ly: 1, lz: 1 }, 'hex8')
  const b = boxMesh({ nx: 2, ny: 2, nz: 3, lx: 1, ly: 1, lz: 1.5, x0: 2 }, 'tet10')
  const coords = new Float64Array(a.coords.length + b.coords.length)
  coords.set(a.coords); coords.set(b.coords, a.coords.length)
  const shift = a.nodeCount
  const connB = b.blocks[0].conn.map((n) => n + shift)
  return createMesh(coords, [{ type: 'hex8', conn: a.blocks[0].conn }, { type: 'tet10', conn: connB }])
}

function splitRun(mesh: Mesh, stress: StressField, parts: number, precision: 'double' | 'single'): ElementBalance {
  const out = allocateElementBalance(mesh.elementCount, precision)
  for (const [from, to] of splitRanges(mesh.elementCount, parts)) {
    const slice = meshSlice(mesh, from, to)
    computeElementBalance({
      residual: out.residual.subarray(3 * from, 3 * to), gross: out.gross.subarray(from, to), indicator: out.indicator.subarray(from, to),
    }, slice, stressFieldSlice(stress, mesh, slice, from), [0.3, -2, 1])
  }
  return out
}

describe('element balance split over element ranges', () => {
  const mesh = mixedMesh()
  // A quadratic field, so the residuals are not all zero (the audit has something to report).
  const stress = nodalStressField(mesh, stressField(mesh, (x, y, z) => [x * x, y * z, 2 * z, x * y, -x, z * z]))
  const whole = computeElementBalance(allocateElementBalance(mesh.elementCount), mesh, stress, [0.3, -2, 1])

  it('ranges cover every element once, in order, with none empty', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 5000 }), fc.integer({ min: 1, max: 64 }), (E, parts) => {
      const r = splitRanges(E, parts)
      let next = 0
      for (const [a, b] of r) { if (a !== next || b <= a) return false; next = b }
      return next === E && r.length === Math.min(parts, E)
    }), { seed: 20261201, numRuns: 300 })
  })

  it('any split gives bit-identical double-precision results (parts 1 to 9, across the block boundary)', () => {
    for (let parts = 1; parts <= 9; parts++) {
      const s = splitRun(mesh, stress, parts, 'double')
      expect(Array.from(s.residual)).toEqual(Array.from(whole.residual))
      expect(Array.from(s.gross)).toEqual(Array.from(whole.gross))
      expect(Array.from(s.indicator)).toEqual(Array.from(whole.indicator))
    }
  })

  it('single-precision storage is the double result rounded once (IEEE 754 binary32)', () => {
    const s = splitRun(mesh, stress, 4, 'single')
    expect(s.indicator).toBeInstanceOf(Float32Array)
    expect(Array.from(s.residual)).toEqual(Array.from(whole.residual, Math.fround))
    expect(Array.from(s.gross)).toEqual(Array.from(whole.gross, Math.fround))
    // The indicator is formed in double and then rounded; it is not recomputed from rounded parts.
    expect(Array.from(s.indicator)).toEqual(Array.from(whole.indicator, Math.fround))
  })

  it('a slice keeps the user ids and parts of its elements', () => {
    const s = meshSlice(mesh, 10, 20)
    expect(s.elementCount).toBe(10)
    const ids = s.blocks.flatMap((b) => Array.from(b.ids))
    expect(ids).toEqual(Array.from({ length: 10 }, (_, i) => 11 + i))
    expect(s.blocks.map((b) => b.offset)).toEqual(s.blocks.length === 1 ? [0] : [0, s.blocks[0].ids.length])
  })

  it('an output too small for the mesh is refused, not overrun', () => {
    expect(() => computeElementBalance(allocateElementBalance(3), mesh, stress, [0, 0, 0])).toThrow(RangeError)
  })
})
