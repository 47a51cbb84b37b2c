/**
 * The fast path of the region labelling against the plain one: a cut of linear tetrahedra
 * records each tet4's corners sorted with their sides (recordTet, sectionRegions.ts) and
 * labelRegions then reads those instead of the connectivity and the node distances. Both
 * records hold the same elements in the same order; the labels and the region count must be
 * identical, on random assemblies (tet4 boxes beside tet10, hex8 and wedge6 boxes, shared nodes
 * or meshed apart with coincident nodes, one part or several), random planes and planes through
 * node layers, rotated meshes, all elements or a random selection. The plain labelling is itself
 * checked against the definition in regionLabels.test.ts. A last case cuts a block whose
 * elements come in random order, so the crossed faces waiting for their twin outgrow the face
 * table (it grows while a run of tetrahedra is labelled): one region, and the same labels by
 * both paths. Seeded; the seed is printed.
 */
import { describe, expect, it } from 'vitest'
import { nodeDistances } from '../../src/mechanics/sectionCut.ts'
import { createCutRecord, labelRegions, recordElement, recordTet } from '../../src/mechanics/sectionRegions.ts'
import type { CutRecord } from '../../src/mechanics/sectionRegions.ts'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { createMesh } from '../../src/model/createMesh.ts'
import { ELEMENT_TYPES } from '../../src/model/elementTypes.ts'
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import type { Mesh, Vec3 } from '../../src/model/model.ts'
import { assembly } from '../helpers/assemblies.ts'
import type { PieceSpec } from '../helpers/assemblies.ts'
import { mulberry32, rotateMesh, rotationFromUniforms } from '../helpers/rotation.ts'

const SEED = 20261203

/** Both records of one cut: every element with corners on both sides (d < 0 and d ≥ 0), in order; `fast` records tet4 by recordTet. */
function records(mesh: Mesh, d: Float64Array): { plain: CutRecord; fast: CutRecord } {
  const plain = createCutRecord(), fast = createCutRecord()
  mesh.blocks.forEach((b, bi) => {
    const topo = ELEMENT_TYPES[b.type], nn = topo.nodeCount
    for (let e = 0; e < b.ids.length; e++) {
      let below = 0
      for (let k = 0; k < topo.cornerCount; k++) if (d[b.conn[nn * e + k]] < 0) below++
      if (below === 0 || below === topo.cornerCount) continue
      recordElement(plain, bi, e, false)
      if (b.type === 'tet4') {
        const c = b.conn, o = 4 * e
        recordTet(fast, bi, e, c[o], c[o + 1], c[o + 2], c[o + 3], d[c[o]], d[c[o + 1]], d[c[o + 2]], d[c[o + 3]])
      } else recordElement(fast, bi, e, false)
    }
  })
  return { plain, fast }
}

/** Labels of the selection by the plain and the fast record; expects them equal and returns the count. */
function sameLabels(mesh: Mesh, d: Float64Array, pick: (i: number) => boolean): number {
  const { plain, fast } = records(mesh, d)
  expect(fast.n).toBe(plain.n)
  const sel = new Int32Array(plain.n)
  let n = 0
  for (let i = 0; i < plain.n; i++) if (pick(i)) sel[n++] = i
  const a = new Int32Array(n), b = new Int32Array(n)
  const countPlain = labelRegions(a, sel, n, plain, mesh, d)
  const countFast = labelRegions(b, sel, n, fast, mesh, d)
  expect(countFast).toBe(countPlain)
  expect(Array.from(b)).toEqual(Array.from(a))
  return countPlain
}

const OTHERS: readonly ElementTypeName[] = ['tet10', 'hex8', 'wedge6']

/** 2-5 boxes on a unit lattice (touching face to face), most of them tet4, random parts. */
function randomAssembly(rnd: () => number): { mesh: Mesh; merged: boolean } {
  const seen = new Set<string>()
  const pieces: PieceSpec[] = []
  const count = 2 + Math.floor(4 * rnd())
  for (let p = 0; p < count; p++) {
    const at = [Math.floor(3 * rnd()), Math.floor(2 * rnd()), Math.floor(2 * rnd())]
    const key = at.join(',')
    if (seen.has(key)) continue
    seen.add(key)
    const type = rnd() < 0.7 ? 'tet4' : OTHERS[Math.floor(rnd() * OTHERS.length)]
    pieces.push({ box: { nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1, x0: at[0], y0: at[1], z0: at[2] }, type, part: 1 + Math.floor(2 * rnd()) })
  }
  const merged = rnd() < 0.5
  return { mesh: assembly(pieces, merged), merged }
}

describe(`region labels from the recorded tetrahedra equal the plain labelling (seed ${SEED})`, () => {
  console.log(`recorded region labels seed ${SEED}`)
  const rnd = mulberry32(SEED)
  for (let trial = 0; trial < 40; trial++) {
    const { mesh: flat, merged } = randomAssembly(rnd)
    const rotated = trial % 2 === 1
    const mesh = rotated ? rotateMesh(flat, rotationFromUniforms(rnd(), rnd(), rnd())) : flat
    it(`trial ${trial}: ${mesh.elementCount} elements, ${mesh.blocks.length} blocks, ${merged ? 'shared nodes' : 'meshed apart'}${rotated ? ', rotated' : ''}`, () => {
      const c = [0, 0, 0]
      for (let i = 0; i < mesh.nodeCount; i++) for (let k = 0; k < 3; k++) c[k] += mesh.coords[3 * i + k] / mesh.nodeCount
      for (let plane = 0; plane < 6; plane++) {
        // planes through grid nodes (axis-aligned at a multiple of the half spacing) on the unrotated meshes
        const onNodes = plane % 2 === 1 && !rotated
        const axis = Math.floor(3 * rnd())
        const normal: Vec3 = onNodes ? [axis === 0 ? 1 : 0, axis === 1 ? 1 : 0, axis === 2 ? 1 : 0] : [rnd() - 0.5, rnd() - 0.5, rnd() - 0.5]
        const l = Math.hypot(...normal)
        const m: Vec3 = [normal[0] / l, normal[1] / l, normal[2] / l]
        const point: Vec3 = onNodes
          ? [0.5 * Math.round(4 * rnd()), 0.5 * Math.round(4 * rnd()), 0.5 * Math.round(4 * rnd())]
          : [c[0] + 0.5 * (rnd() - 0.5), c[1] + 0.5 * (rnd() - 0.5), c[2] + 0.5 * (rnd() - 0.5)]
        const d = new Float64Array(mesh.nodeCount)
        nodeDistances(d, mesh.coords, mesh.nodeCount, point, m)
        sameLabels(mesh, d, () => true)
        sameLabels(mesh, d, () => rnd() < 0.7)
      }
    })
  }

  it('a block in random element order: the face table grows during a run of tetrahedra, one region', () => {
    const box = boxMesh({ nx: 40, ny: 40, nz: 40, lx: 1, ly: 1, lz: 1 }, 'tet4')
    const conn = box.blocks[0].conn, E = conn.length / 4
    const order = Int32Array.from({ length: E }, (_, i) => i)
    for (let i = E - 1; i > 0; i--) { const j = Math.floor(rnd() * (i + 1)); const x = order[i]; order[i] = order[j]; order[j] = x }
    const shuffled = new Int32Array(conn.length)
    for (let e = 0; e < E; e++) for (let k = 0; k < 4; k++) shuffled[4 * e + k] = conn[4 * order[e] + k]
    const mesh = createMesh(box.coords, [{ type: 'tet4', conn: shuffled }])
    const m: Vec3 = [0.3, 0.4, 0.866]
    const l = Math.hypot(...m)
    const d = new Float64Array(mesh.nodeCount)
    nodeDistances(d, mesh.coords, mesh.nodeCount, [0.5037, 0.4969, 0.5013], [m[0] / l, m[1] / l, m[2] / l])
    expect(sameLabels(mesh, d, () => true)).toBe(1)
  })
})
