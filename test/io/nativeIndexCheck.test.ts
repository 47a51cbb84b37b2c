/**
 * The node-range check of the native reader, folded into the orientation pass for tet4, tet10
 * and hex8 (elementOrientation.ts): every index outside 0..N-1, at a corner or at a mid-edge node,
 * early or late in the block, is refused with the same message as the separate scan
 * (firstIndexOutside, indexRange.ts) gives, and it comes before a degenerate element or a
 * negative part found elsewhere in the block. Positions and values are seeded (the seed is
 * printed).
 */
import { describe, expect, it } from 'vitest'
import { InputError } from '../../src/model/errors.ts'
import { readNative, writeNative } from '../../src/io/nativeContainer.ts'
import { firstIndexOutside } from '../../src/io/indexRange.ts'
import { checkBlockOrientation } from '../../src/io/elementOrientation.ts'
import { mulberry32 } from '../../src/mechanics/seededRandom.ts'
import { syntheticModel } from '../bench/syntheticModel.ts'
import { patchArrayValue } from './nativePatch.ts'

function readError(bytes: Uint8Array): InputError {
  try { readNative(bytes, 'block.tractus') } catch (e) { if (e instanceof InputError) return e; throw e }
  throw new Error('the read did not fail')
}

describe('node range checked in the orientation pass', () => {
  const seed = 20261204
  for (const type of ['tet4', 'tet10', 'hex8'] as const) {
    it(`${type}: indices outside the node range are refused like the separate scan refuses them (seed ${seed})`, () => {
      console.log(`nativeIndexCheck ${type}: seed ${seed}`)
      const model = syntheticModel(type, 300, seed)
      const good = writeNative(model)
      const conn = model.mesh.blocks[0].conn, N = model.mesh.nodeCount, nn = conn.length / model.mesh.elementCount
      const rnd = mulberry32(seed)
      for (let k = 0; k < 12; k++) {
        // every local node position in turn (mid-edge nodes included), a random element
        const at = nn * Math.floor(rnd() * model.mesh.elementCount) + (k % nn)
        const value = k % 3 === 0 ? -1 - Math.floor(1000 * rnd()) : N + Math.floor(1000 * rnd())
        const e = readError(patchArrayValue(good, 'block0.conn', at, value))
        expect(e.kind).toBe('missing-node')
        expect(e.message).toContain(`node index ${value} is outside 0..${N - 1}`)
        expect(e.message).toContain(`element ${model.mesh.blocks[0].ids[Math.floor(at / nn)]}`)
        // the orientation pass alone says outside, as the scan does
        const bad = conn.slice(); bad[at] = value
        expect(checkBlockOrientation(model.mesh.coords, type, bad, N).outside).toBe(true)
        expect(firstIndexOutside(bad, N)).toBe(at)
      }
      expect(checkBlockOrientation(model.mesh.coords, type, conn, N).outside).toBeFalsy()
    })
  }

  it('an index outside is reported before a degenerate element earlier in the block', () => {
    const model = syntheticModel('tet4', 300, seed)
    const conn = model.mesh.blocks[0].conn, N = model.mesh.nodeCount
    // element 0 flattened (its fourth corner onto its first), element 40 with an index outside
    let bytes = patchArrayValue(writeNative(model), 'block0.conn', 3, conn[0])
    bytes = patchArrayValue(bytes, 'block0.conn', 4 * 40 + 1, N + 5)
    const e = readError(bytes)
    expect(e.kind).toBe('missing-node')
    expect(e.message).toContain(`node index ${N + 5}`)
  })
})
