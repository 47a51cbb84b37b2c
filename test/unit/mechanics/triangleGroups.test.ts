/**
 * Triangle groups (triangleGroups.ts): a counting sort of triangles by group, stable, with the
 * carried per-triangle arrays moving with their triangles; checked against a plain stable sort
 * (Array.prototype.sort is stable by ECMA-262 since ES2019). Seeded; the seed is printed.
 */
import { expect, it } from 'vitest'
import { groupTriangles } from '../../../src/mechanics/triangleGroups.ts'
import { mulberry32 } from '../../helpers/rotation.ts'

const SEED = 1416

it(`groups triangles stably, carried arrays follow, none last (seed ${SEED})`, () => {
  console.log(`triangle groups seed ${SEED}`)
  const rnd = mulberry32(SEED)
  const T = 500, G = 7
  const index = Uint32Array.from({ length: 3 * T }, (_, k) => k)
  const face = Uint32Array.from({ length: T }, (_, t) => 1000 + t)
  const group = Int32Array.from({ length: T }, () => Math.floor(rnd() * (G + 1)) - 1) // -1: none
  const expected = [...Array(T).keys()].sort((a, b) => (group[a] < 0 ? G : group[a]) - (group[b] < 0 ? G : group[b]))
  const offsets = groupTriangles(index, [face], group, G)
  expect(offsets.length).toBe(G + 2)
  expect(offsets[G + 1]).toBe(T)
  expected.forEach((t, k) => {
    expect(face[k]).toBe(1000 + t)
    expect([index[3 * k], index[3 * k + 1], index[3 * k + 2]]).toEqual([3 * t, 3 * t + 1, 3 * t + 2])
  })
  for (let g = 0; g < G; g++) for (let k = offsets[g]; k < offsets[g + 1]; k++) expect(group[face[k] - 1000]).toBe(g)
})
