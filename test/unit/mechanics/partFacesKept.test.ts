/**
 * The faces between parts built in kept arrays (facesBetweenParts with `reuse`, partFaces.ts: the
 * engine's load, which keeps its work arrays from one model to the next) against the same built in
 * fresh arrays: the same sides, twins and geometry, bit for bit, over a run of random assemblies
 * one after the other (larger and smaller, so the kept arrays grow and hold stale values from the
 * model before), six element types, shared nodes and meshed apart, parts changing inside blocks.
 * Seeded; the seed is printed.
 */
import { describe, expect, it } from 'vitest'
import { facesBetweenParts } from '../../../src/mechanics/partFaces.ts'
import { randomAssembly } from '../../helpers/assemblies.ts'
import { mulberry32 } from '../../helpers/rotation.ts'

const SEED = 20261206

describe(`faces between parts in kept arrays equal fresh ones (seed ${SEED})`, () => {
  console.log(`kept part faces seed ${SEED}`)
  const rnd = mulberry32(SEED)
  it('a run of 40 random assemblies', () => {
    let withSides = 0
    for (let trial = 0; trial < 40; trial++) {
      const { mesh } = randomAssembly(rnd)
      for (const b of mesh.blocks) if (b.part && rnd() < 0.5) for (let e = 0; e < b.part.length; e++) if (rnd() < 0.5) b.part[e] = 4 + Math.floor(3 * rnd())
      const fresh = facesBetweenParts(mesh)
      const kept = facesBetweenParts(mesh, null, true)
      expect(kept.faces.count).toBe(fresh.faces.count)
      if (fresh.faces.count > 0) withSides++
      expect(kept.twin).toEqual(fresh.twin)
      for (const k of ['elem', 'localFace', 'kind', 'nodes', 'area', 'normal', 'centroid'] as const) expect(kept.faces[k]).toEqual(fresh.faces[k])
    }
    expect(withSides).toBeGreaterThan(10)
  })
})
