/**
 * faceLoads (partBalance.ts): the face integrals of the tractions (force, moment, mean |t|) a
 * chunk of faces at a time through a reused scratch, against computeSurfaceTractions over all the
 * faces at once (the plain computation it stands for): equal to the last bit, on every element
 * type, nodal and element-nodal stress, with more faces than one chunk, and with a mesh of wider
 * faces after a narrower one (the scratch grows) and a narrower one after it (it is reused); its
 * output in fresh arrays and in kept ones.
 */
import { describe, expect, it } from 'vitest'
import { faceLoads } from '../../../src/mechanics/partBalance.ts'
import { extractBoundaryFaces } from '../../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../../src/mechanics/tractions.ts'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { ELEMENT_TYPES } from '../../../src/model/elementTypes.ts'
import type { ElementTypeName } from '../../../src/model/elementTypes.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import type { StressField } from '../../../src/model/stressField.ts'
import type { Mesh } from '../../../src/model/model.ts'
import { mulberry32 } from '../../helpers/rotation.ts'

const SEED = 20261204

function elementNodal(mesh: Mesh, rnd: () => number): StressField {
  let total = 0
  for (const b of mesh.blocks) total += b.conn.length
  const values = Float64Array.from({ length: 6 * total }, () => 2 * rnd() - 1)
  let next = 0
  return { values, rows: mesh.blocks.map((b) => Int32Array.from({ length: b.conn.length }, () => next++)), layout: 'element-nodal' }
}

describe(`faceLoads against computeSurfaceTractions (seed ${SEED})`, () => {
  console.log(`face loads seed ${SEED}`)
  const rnd = mulberry32(SEED)
  // narrow faces, then the widest, then narrow again: the scratch grows once, then is reused
  const types = Object.keys(ELEMENT_TYPES) as ElementTypeName[]
  for (const type of [...types, ...types]) {
    for (const nodal of [true, false]) {
      it(`${type}, ${nodal ? 'nodal' : 'element-nodal'} stress`, () => {
        // about 2 500 boundary faces or more: more than one chunk (2 048 faces)
        const n = 21
        const mesh = boxMesh({ nx: n, ny: n, nz: n, lx: 1, ly: 2, lz: 3 }, type)
        const field = nodal ? nodalStressField(mesh, Float64Array.from({ length: 6 * mesh.nodeCount }, () => 2 * rnd() - 1)) : elementNodal(mesh, rnd)
        const faces = extractBoundaryFaces(mesh)
        expect(faces.count).toBeGreaterThan(2048)
        const want = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, field, faces)
        // fresh output arrays, and the kept ones (stale values from the type before)
        for (const reuse of [false, true]) {
          const got = faceLoads(mesh, field, faces, reuse)
          expect(got.force).toEqual(want.force)
          expect(got.moment).toEqual(want.moment)
          expect(got.meanMagnitude).toEqual(want.meanMagnitude)
        }
      })
    }
  }
})
