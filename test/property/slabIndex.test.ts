/**
 * The slab index (slabIndex.ts) against the plain scan: for random assemblies of every element
 * type (shared nodes or meshed apart, rotated, moved far from the origin), random planes of the
 * index's normal and planes through node layers, the elements findCutAmong finds among the
 * index's candidates are exactly those a scan of every element finds (cutElements, sectionCut.ts),
 * in the same order; the candidates are ascending and unique. Seeded; the seed is printed.
 */
import { describe, expect, it } from 'vitest'
import { cutElements, nodeDistances } from '../../src/mechanics/sectionCut.ts'
import { buildSlabIndex, findCutAmong, slabCandidates } from '../../src/mechanics/slabIndex.ts'
import { ELEMENT_TYPES } from '../../src/model/elementTypes.ts'
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import type { Mesh, Vec3 } from '../../src/model/model.ts'
import { assembly } from '../helpers/assemblies.ts'
import type { PieceSpec } from '../helpers/assemblies.ts'
import { mulberry32, rotateMesh, rotationFromUniforms } from '../helpers/rotation.ts'

const SEED = 20261204
const TYPES = Object.keys(ELEMENT_TYPES) as ElementTypeName[]

function randomAssembly(rnd: () => number): Mesh {
  const seen = new Set<string>()
  const pieces: PieceSpec[] = []
  const count = 1 + Math.floor(4 * rnd())
  for (let p = 0; p < count; p++) {
    const at = [Math.floor(3 * rnd()), Math.floor(2 * rnd()), Math.floor(2 * rnd())]
    if (seen.has(at.join(','))) continue
    seen.add(at.join(','))
    const n = 1 + Math.floor(3 * rnd())
    pieces.push({ box: { nx: n, ny: 2, nz: 1 + Math.floor(2 * rnd()), lx: 1, ly: 1, lz: 1, x0: at[0], y0: at[1], z0: at[2] }, type: TYPES[Math.floor(rnd() * TYPES.length)], part: 1 })
  }
  return assembly(pieces, rnd() < 0.5)
}

function moved(mesh: Mesh, by: Vec3): Mesh {
  const coords = Float64Array.from(mesh.coords, (v, i) => v + by[i % 3])
  return { ...mesh, coords }
}

describe(`slab index: the cut elements among its candidates are those of a full scan (seed ${SEED})`, () => {
  console.log(`slab index seed ${SEED}`)
  const rnd = mulberry32(SEED)
  for (let trial = 0; trial < 40; trial++) {
    let mesh = randomAssembly(rnd)
    const rotated = trial % 3 === 1, far = trial % 4 === 2
    if (rotated) mesh = rotateMesh(mesh, rotationFromUniforms(rnd(), rnd(), rnd()))
    if (far) mesh = moved(mesh, [1e5, -3e4, 2e3])
    it(`trial ${trial}: ${mesh.elementCount} elements of ${mesh.blocks.map((b) => b.type).join(', ')}${rotated ? ', rotated' : ''}${far ? ', far from the origin' : ''}`, () => {
      const axis = Math.floor(3 * rnd())
      const onNodes = !rotated && trial % 2 === 0
      const raw: Vec3 = onNodes ? [axis === 0 ? 1 : 0, axis === 1 ? 1 : 0, axis === 2 ? 1 : 0] : [rnd() - 0.5, rnd() - 0.5, rnd() - 0.5]
      const l = Math.hypot(...raw)
      const m: Vec3 = [raw[0] / l, raw[1] / l, raw[2] / l]
      const index = buildSlabIndex(mesh, m)
      const d = new Float64Array(mesh.nodeCount)
      for (let plane = 0; plane < 12; plane++) {
        // through a node (a node layer on the axis-aligned planes), or anywhere over and beyond the body
        const node = Math.floor(rnd() * mesh.nodeCount)
        const point: Vec3 = plane % 2 === 0
          ? [mesh.coords[3 * node], mesh.coords[3 * node + 1], mesh.coords[3 * node + 2]]
          : [mesh.coords[3 * node] + 2 * (rnd() - 0.5), mesh.coords[3 * node + 1] + 2 * (rnd() - 0.5), mesh.coords[3 * node + 2] + 2 * (rnd() - 0.5)]
        nodeDistances(d, mesh.coords, mesh.nodeCount, point, m)
        const { items, n } = slabCandidates(index, point[0] * m[0] + point[1] * m[1] + point[2] * m[2])
        for (let i = 1; i < n; i++) expect(items[i]).toBeGreaterThan(items[i - 1])
        for (const b of mesh.blocks) {
          const topo = ELEMENT_TYPES[b.type]
          const full = cutElements(d, b.conn, b.conn.length / topo.nodeCount, topo.nodeCount, topo.cornerCount)
          const want = Array.from(full.items.subarray(0, full.n))
          const out = new Int32Array(b.conn.length / topo.nodeCount)
          const k = findCutAmong(out, d, b.conn, topo.nodeCount, topo.cornerCount, items, n, b.offset)
          expect(Array.from(out.subarray(0, k))).toEqual(want)
        }
      }
    })
  }

  it('an empty mesh and a plane beyond the body give no candidates', () => {
    const mesh = assembly([{ box: { nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1 }, type: 'hex8', part: 1 }], true)
    const index = buildSlabIndex(mesh, [1, 0, 0])
    expect(slabCandidates(index, 5).n).toBe(0)
    expect(slabCandidates(index, -5).n).toBe(0)
    expect(slabCandidates(index, 0.5).n).toBeGreaterThan(0)
    const empty = buildSlabIndex({ ...mesh, elementCount: 0, blocks: [] }, [0, 0, 1])
    expect(slabCandidates(empty, 0).n).toBe(0)
  })
})
