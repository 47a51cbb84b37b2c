/**
 * The assembly step of a load (loadAssembly, workers/assembly.ts) groups the surface's triangles
 * and colours its vertices by part from each face's part, found along the faces; the plain
 * definition it stands for reads an array of every element's part. Both must give the same index
 * buffer, triangle faces, part ranges and vertex parts, bit for bit, on random assemblies of
 * several blocks and element types (shared nodes and meshed apart, some blocks with a random part
 * per element, so parts also change within a block and a part spans several blocks), nodal
 * stress. Seeded; the seed is printed.
 */
import { describe, expect, it } from 'vitest'
import type { Model } from '../../../src/model/model.ts'
import { analysisInputOf, runAnalysis } from '../../../src/mechanics/analysisPipeline.ts'
import { buildSurfaceTriangles } from '../../../src/mechanics/surfaceTriangles.ts'
import { groupTriangles } from '../../../src/mechanics/triangleGroups.ts'
import { hasSeveralParts, partNumbers } from '../../../src/mechanics/partBalance.ts'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import type { Mesh } from '../../../src/model/model.ts'
import { loadAssembly, regionTriangles } from '../../../workers/assembly.ts'
import { jumpOf } from '../../../workers/casePicture.ts'
import { randomAssembly } from '../../helpers/assemblies.ts'
import { mulberry32 } from '../../helpers/rotation.ts'

const SEED = 20261205

describe(`the surface grouped by part at load, against every element's part (seed ${SEED})`, () => {
  console.log(`load assembly seed ${SEED}`)
  const rnd = mulberry32(SEED)
  for (let trial = 0; trial < 12; trial++) {
    const { mesh, merged } = randomAssembly(rnd)
    for (const b of mesh.blocks) if (b.part && rnd() < 0.4) for (let e = 0; e < b.part.length; e++) if (rnd() < 0.5) b.part[e] = 7 + Math.floor(2 * rnd())
    it(`trial ${trial}: ${mesh.blocks.length} blocks, ${partNumbers(mesh).length} parts, ${merged ? 'shared nodes' : 'meshed apart'}`, () => {
      const stress = Float64Array.from({ length: 6 * mesh.nodeCount }, () => 2 * rnd() - 1)
      const model: Model = { name: 'parts', description: '', units: { length: 'm', stress: 'Pa' }, mesh, stress, displacement: null, bodyForce: [0, 0, -1], warnings: [] }
      const input = analysisInputOf(model)
      const r = runAnalysis(input, { balancePrecision: 'single' })
      const tri = buildSurfaceTriangles(mesh.coords, r.faces, r.tractions, r.invariants, r.elementBalance.indicator, r.loadPatches.faceLabel, jumpOf(mesh, input.stress, r.loadPatches))
      const index = tri.index.slice(), triangleFace = tri.triangleFace.slice()
      const asm = loadAssembly(model, input.stress, r.faces, r.tractions, r.loadPatches.faceLabel, index, triangleFace, tri.faceVertexStart)!
      // plain: every element's part, each triangle's rank by its face's element
      const numbers = partNumbers(mesh), rank = new Map(numbers.map((p, k) => [p, k]))
      const partOf = new Int32Array(mesh.elementCount)
      for (const b of mesh.blocks) if (b.part) partOf.set(b.part, b.offset)
      const wantIndex = tri.index.slice(), wantFace = tri.triangleFace.slice()
      const group = Int32Array.from(wantFace, (f) => rank.get(partOf[r.faces.elem[f]]) ?? -1)
      const wantRanges = groupTriangles(wantIndex, [wantFace], group, numbers.length)
      const wantVertexPart = new Float32Array(tri.faceVertexStart[r.faces.count])
      for (let f = 0; f < r.faces.count; f++) wantVertexPart.fill(rank.get(partOf[r.faces.elem[f]]) ?? -1, tri.faceVertexStart[f], tri.faceVertexStart[f + 1])
      expect(asm.partTriangles).toEqual(wantRanges)
      expect(index).toEqual(wantIndex)
      expect(triangleFace).toEqual(wantFace)
      expect(asm.vertexPart).toEqual(wantVertexPart)
      expect(asm.parts.map((p) => p.part)).toEqual(numbers)
      expect(hasSeveralParts(mesh)).toBe(true)
    })
  }
})

describe('hasSeveralParts reads as partNumbers(mesh).length >= 2', () => {
  const box = boxMesh({ nx: 3, ny: 1, nz: 1, lx: 3, ly: 1, lz: 1 }, 'hex8')
  const b = box.blocks[0]
  const empty = { ...b, conn: new Int32Array(0), ids: new Int32Array(0), offset: 3 }
  const withParts = (...blocks: Mesh['blocks']): Mesh => ({ ...box, blocks })
  const cases: [string, Mesh][] = [
    ['one block without parts', box],
    ['one block, one part', withParts({ ...b, part: Int32Array.of(3, 3, 3) })],
    ['one block, two parts', withParts({ ...b, part: Int32Array.of(3, 4, 4) })],
    ['one block, its first and last element alike, another part between', withParts({ ...b, part: Int32Array.of(3, 4, 3) })],
    ['no part numbers beside part 0', withParts({ ...b, part: null }, { ...empty, part: Int32Array.of() }, { ...b, part: Int32Array.of(0, 0, 0), offset: 3 })],
    ['no part numbers beside part 5', withParts({ ...b, part: null }, { ...b, part: Int32Array.of(5, 5, 5), offset: 3 })],
    ['an empty block without part numbers beside part 5', withParts({ ...b, part: Int32Array.of(5, 5, 5) }, { ...empty, part: null })],
    ['an empty block with part numbers beside part 5', withParts({ ...b, part: Int32Array.of(5, 5, 5) }, { ...empty, part: Int32Array.of() })],
  ]
  for (const [name, mesh] of cases) it(name, () => expect(hasSeveralParts(mesh)).toBe(partNumbers(mesh).length >= 2))
})

// regionTriangles walks the labels beside the triangles (the order a cut makes them) and asks a
// map only where that order breaks: against the map for every triangle, on labels in the cut's
// order, shuffled, and with triangles of elements not labelled (a limit's selection).
describe('regionTriangles', () => {
  const plain = (element: Int32Array, region: Int32Array, count: number, index: Uint32Array, tri: Int32Array) => {
    const regionOf = new Map<number, number>()
    for (let s = 0; s < element.length; s++) regionOf.set(element[s], region[s])
    const group = Int32Array.from(tri, (e) => regionOf.get(e) ?? -1)
    return groupTriangles(index, [tri], group, count)
  }
  let seed = 20261203
  const rnd = () => { seed = (seed * 1103515245 + 12345) >>> 0; return seed / 4294967296 }
  for (const order of ['cut', 'shuffled', 'with unlabelled elements'] as const) {
    it(`gives the map's grouping, labels ${order}`, () => {
      for (let trial = 0; trial < 20; trial++) {
        const cut = 1 + Math.floor(60 * rnd()), count = 1 + Math.floor(4 * rnd())
        const elements = Array.from({ length: cut }, (_, i) => 1000 * trial + 7 * i + Math.floor(5 * rnd()))
        // polygons in the cut's order, 1 to 6 triangles each
        const tri: number[] = []
        for (const e of elements) for (let k = 0, m = 1 + Math.floor(6 * rnd()); k < m; k++) tri.push(e)
        let labelled = elements.slice()
        if (order === 'with unlabelled elements') labelled = labelled.filter(() => rnd() < 0.6)
        if (order === 'shuffled') for (let i = labelled.length - 1; i > 0; i--) { const j = Math.floor(rnd() * (i + 1)); [labelled[i], labelled[j]] = [labelled[j], labelled[i]] }
        const element = Int32Array.from(labelled), region = Int32Array.from(labelled, () => Math.floor(count * rnd()))
        const T = tri.length, index = Uint32Array.from({ length: 3 * T }, (_, i) => i)
        const a = { index: index.slice(), tri: Int32Array.from(tri) }, b = { index: index.slice(), tri: Int32Array.from(tri) }
        const got = regionTriangles({ element, region }, count, a.index, a.tri)
        const want = plain(element, region, count, b.index, b.tri)
        expect(Array.from(got)).toEqual(Array.from(want))
        expect(Array.from(a.index)).toEqual(Array.from(b.index))
        expect(Array.from(a.tri)).toEqual(Array.from(b.tri))
      }
    })
  }
})
