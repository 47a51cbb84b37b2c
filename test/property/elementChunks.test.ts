/**
 * The element chunks (elementChunks.ts) against the plain scan: for random assemblies of every
 * element type (shared nodes or meshed apart, rotated, moved far from the origin, elements in
 * their generated order or shuffled), random planes and planes through nodes (node layers on
 * axis-aligned planes, also far from the origin, where the runs' 32-bit boxes round most), random
 * chunk and run sizes, the elements findCutInChunks finds in the runs the plane meets are
 * exactly those a scan of every element finds (cutElements, sectionCut.ts), in the same order;
 * and a whole cut (resultants, free body, regions, drawn polygons) with the chunks equals the cut
 * without them bit for bit. Seeded; the seed is printed.
 */
import { describe, expect, it } from 'vitest'
import { cutElements, cutSection, nodeDistances } from '../../src/mechanics/sectionCut.ts'
import { buildElementChunks, chunksMet, findCutInChunks } from '../../src/mechanics/elementChunks.ts'
import { unitNormal } from '../../src/mechanics/plane.ts'
import { createMesh } from '../../src/model/createMesh.ts'
import { ELEMENT_TYPES } from '../../src/model/elementTypes.ts'
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import type { Mesh, Vec3 } from '../../src/model/model.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
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
  return { ...mesh, coords: Float64Array.from(mesh.coords, (v, i) => v + by[i % 3]) }
}

/** The same mesh with each block's elements in random order (neighbours far apart in the numbering). */
function shuffled(mesh: Mesh, rnd: () => number): Mesh {
  return createMesh(mesh.coords, mesh.blocks.map((b) => {
    const nn = ELEMENT_TYPES[b.type].nodeCount, E = b.conn.length / nn
    const order = Array.from({ length: E }, (_, i) => i).sort(() => rnd() - 0.5)
    const conn = new Int32Array(b.conn.length)
    order.forEach((src, e) => conn.set(b.conn.subarray(nn * src, nn * src + nn), nn * e))
    return { type: b.type, conn }
  }))
}

describe(`element chunks: the cut elements in the chunks met are those of a full scan (seed ${SEED})`, () => {
  console.log(`element chunks seed ${SEED}`)
  const rnd = mulberry32(SEED)
  for (let trial = 0; trial < 40; trial++) {
    let mesh = randomAssembly(rnd)
    const rotated = trial % 3 === 1, far = trial % 4 === 2, mixed = trial % 5 === 3
    if (mixed) mesh = shuffled(mesh, rnd)
    if (rotated) mesh = rotateMesh(mesh, rotationFromUniforms(rnd(), rnd(), rnd()))
    if (far) mesh = moved(mesh, [1e5, -3e4, 2e3])
    it(`trial ${trial}: ${mesh.elementCount} elements of ${mesh.blocks.map((b) => b.type).join(', ')}${rotated ? ', rotated' : ''}${far ? ', far from the origin' : ''}${mixed ? ', shuffled' : ''}`, () => {
      // chunks of a few elements, so that the small meshes have many
      const chunks = buildElementChunks(mesh, 1 + Math.floor(7 * rnd()), 1 + Math.floor(3 * rnd()))
      const field = nodalStressField(mesh, Float64Array.from({ length: 6 * mesh.nodeCount }, () => 2 * rnd() - 1))
      const d = new Float64Array(mesh.nodeCount)
      for (let plane = 0; plane < 12; plane++) {
        const axis = Math.floor(3 * rnd())
        const onNodes = !rotated && plane % 2 === 0
        const raw: Vec3 = onNodes ? [axis === 0 ? 1 : 0, axis === 1 ? 1 : 0, axis === 2 ? 1 : 0] : [rnd() - 0.5, rnd() - 0.5, rnd() - 0.5]
        const m = unitNormal(raw)
        const node = Math.floor(rnd() * mesh.nodeCount)
        const point: Vec3 = plane % 4 < 2
          ? [mesh.coords[3 * node], mesh.coords[3 * node + 1], mesh.coords[3 * node + 2]]
          : [mesh.coords[3 * node] + 2 * (rnd() - 0.5), mesh.coords[3 * node + 1] + 2 * (rnd() - 0.5), mesh.coords[3 * node + 2] + 2 * (rnd() - 0.5)]
        nodeDistances(d, mesh.coords, mesh.nodeCount, point, m)
        const { items, n } = chunksMet(chunks, m, point)
        for (let i = 1; i < n; i++) expect(items[i]).toBeGreaterThan(items[i - 1])
        mesh.blocks.forEach((b, bi) => {
          const topo = ELEMENT_TYPES[b.type]
          const full = cutElements(d, b.conn, b.conn.length / topo.nodeCount, topo.nodeCount, topo.cornerCount)
          const want = Array.from(full.items.subarray(0, full.n))
          const out = new Int32Array(b.conn.length / topo.nodeCount)
          const k = findCutInChunks(out, d, b.conn, topo.nodeCount, topo.cornerCount, chunks, items, n, bi)
          expect(Array.from(out.subarray(0, k))).toEqual(want)
        })
        if (plane % 3 === 0) {
          const options = { polygons: true, regions: true }
          const plain = cutSection(mesh, field, [0, 0, -7], { point, normal: raw }, options)
          const fast = cutSection(mesh, field, [0, 0, -7], { point, normal: raw }, { ...options, chunks })
          expect(fast).toEqual(plain)
        }
      }
    })
  }

  it('the runs inside the chunks scan a fraction of what whole chunks would (elements numbered along the cut normal)', () => {
    // 64 hex8 in a row along x, then the next row: a chunk of 64 is one whole row, a run of 16 a quarter
    const mesh = assembly([{ box: { nx: 64, ny: 8, nz: 2, lx: 64, ly: 8, lz: 2 }, type: 'hex8', part: 1 }], true)
    const chunks = buildElementChunks(mesh)
    const { n } = chunksMet(chunks, [1, 0, 0], [20.5, 0, 0])
    const scanned = Array.from(chunksMet(chunks, [1, 0, 0], [20.5, 0, 0]).items.subarray(0, n)).reduce((s, run) => {
      const ch = Math.floor(run / chunks.runsPerChunk)
      return s + Math.min(chunks.sub, chunks.first[ch] + chunks.count[ch] - (chunks.first[ch] + chunks.sub * (run - chunks.runsPerChunk * ch)))
    }, 0)
    // the plane x = 20.5 cuts one element in each of the 16 rows: every chunk is met, and in
    // each only its second run (cells 16 to 31)
    expect(chunks.count.length).toBe(16)
    expect(n).toBe(16)
    expect(scanned).toBe(16 * 16)
  })

  it('a plane beyond the body meets no chunk; one through it meets some', () => {
    const mesh = assembly([{ box: { nx: 4, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1 }, type: 'hex8', part: 1 }], true)
    const chunks = buildElementChunks(mesh, 2)
    expect(chunksMet(chunks, [1, 0, 0], [5, 0, 0]).n).toBe(0)
    expect(chunksMet(chunks, [1, 0, 0], [-5, 0, 0]).n).toBe(0)
    const through = chunksMet(chunks, [1, 0, 0], [0.3, 0, 0]).n
    expect(through).toBeGreaterThan(0)
    expect(through).toBeLessThan(chunks.count.length)
  })
})
