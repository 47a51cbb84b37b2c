/**
 * Reported element ids are the user's ids from the blocks, never made up (src/model/elementId.ts):
 * a mesh of two blocks with ids in no particular order.
 */
import { describe, expect, it } from 'vitest'
import { createMesh } from '../../../src/model/createMesh.ts'
import { elementIdOf } from '../../../src/model/elementId.ts'

describe('elementIdOf', () => {
  const coords = Float64Array.from([0, 0, 0, 1, 0, 0, 0, 1, 0, 0, 0, 1, 1, 1, 1])
  const mesh = createMesh(coords, [
    { type: 'tet4', conn: Int32Array.from([0, 1, 2, 3]), ids: Int32Array.from([70]) },
    { type: 'tet4', conn: Int32Array.from([1, 2, 3, 4, 0, 1, 2, 4]), ids: Int32Array.from([5, 900]) },
  ])

  it('maps global element indices across blocks to the ids the user gave', () => {
    expect([0, 1, 2].map((g) => elementIdOf(mesh, g))).toEqual([70, 5, 900])
  })

  it('an index outside the mesh is a programming error, not a stand-in id', () => {
    expect(() => elementIdOf(mesh, 3)).toThrow(RangeError)
    expect(() => elementIdOf(mesh, -1)).toThrow(/outside the mesh \(3 elements\)/)
  })
})
