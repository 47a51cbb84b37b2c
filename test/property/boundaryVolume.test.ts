/**
 * The body's volume and centroid from its boundary faces (boundaryVolume.ts, the divergence
 * theorem: V = ⅓∮ x·n dA, ∫ x_i dV = ½∮ x_i² n_i dA; common practice) equal the sums over its
 * elements (bodyVolume: each element by its own volume rule, exact for the geometry here) to
 * round-off: seeded random meshes of every element type, distorted, rotated and moved far from the
 * origin, and random assemblies of boxes of mixed types with nodes shared or meshed apart.
 * Quadratic elements keep straight boundary faces (mid-edge nodes at their edges' midpoints) where
 * the face path is taken; a curved boundary face sends the body to the element sums unchanged,
 * and curved elements inside a straight boundary are held to element rules exact for their first
 * moment. The seed is printed.
 */
import { describe, expect, it } from 'vitest'
import { bodyVolume, bodyVolumeOf } from '../../src/mechanics/balanceAudit.ts'
import { boundaryVolume } from '../../src/mechanics/boundaryVolume.ts'
import { assemblyBalance, partNumbers, partSubmesh } from '../../src/mechanics/partBalance.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { elementByRule } from '../../src/mechanics/elementVolume.ts'
import { tabulateElement } from '../../src/mechanics/shapeFunctions.ts'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { ELEMENT_TYPES, ELEMENT_TYPE_NAMES } from '../../src/model/elementTypes.ts'
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import { tensorRule, tetRule } from '../../src/model/elements/quadratureRules.ts'
import type { Mesh, Vec3 } from '../../src/model/model.ts'
import { randomAssembly } from '../helpers/assemblies.ts'
import { mulberry32, rotateMesh, rotationFromUniforms } from '../helpers/rotation.ts'

const SEED = 20261203
const TOL = 1e-12

/** Largest coordinate extent of the mesh: the size the centroid's error is measured against. */
function sizeOf(mesh: Mesh): number {
  const lo = [Infinity, Infinity, Infinity], hi = [-Infinity, -Infinity, -Infinity]
  for (let i = 0; i < mesh.nodeCount; i++) for (let k = 0; k < 3; k++) {
    lo[k] = Math.min(lo[k], mesh.coords[3 * i + k]); hi[k] = Math.max(hi[k], mesh.coords[3 * i + k])
  }
  return Math.max(hi[0] - lo[0], hi[1] - lo[1], hi[2] - lo[2])
}

/** Moves every node by up to `amount` in each coordinate, then puts mid-edge nodes back at their edges' midpoints. */
function distort(mesh: Mesh, rnd: () => number, amount: number): Mesh {
  const c = Float64Array.from(mesh.coords)
  for (let i = 0; i < c.length; i++) c[i] += amount * (2 * rnd() - 1)
  straighten(c, mesh)
  return { ...mesh, coords: c }
}

/** Mid-edge nodes to the midpoints of their edges (every quadratic block). */
function straighten(c: Float64Array, mesh: Mesh): void {
  for (const b of mesh.blocks) {
    const t = ELEMENT_TYPES[b.type]
    if (!t.quadratic) continue
    for (let e = 0; e < b.ids.length; e++) for (const [a, q, m] of t.edges) {
      const na = b.conn[t.nodeCount * e + a], nb = b.conn[t.nodeCount * e + q], nm = b.conn[t.nodeCount * e + m]
      for (let k = 0; k < 3; k++) c[3 * nm + k] = (c[3 * na + k] + c[3 * nb + k]) / 2
    }
  }
}

/**
 * The mesh rotated by a random rotation and moved by `shift`; mid-edge nodes put back at their
 * edges' midpoints in the new coordinates unless `keepMidNodes` (rounding would curve them).
 */
function moved(mesh: Mesh, rnd: () => number, shift: Vec3, keepMidNodes = false): Mesh {
  const r = rotateMesh(mesh, rotationFromUniforms(rnd(), rnd(), rnd()))
  const c = r.coords
  for (let i = 0; i < mesh.nodeCount; i++) for (let k = 0; k < 3; k++) c[3 * i + k] += shift[k]
  if (!keepMidNodes) straighten(c, r)
  return r
}

function expectSameBody(mesh: Mesh, want: { volume: number; centroid: Vec3 }, label: string): void {
  const got = boundaryVolume(mesh.coords, extractBoundaryFaces(mesh))
  expect(got, label).not.toBeNull()
  expect(Math.abs(got!.volume - want.volume), label).toBeLessThanOrEqual(TOL * Math.abs(want.volume))
  // relative to the body's size, or to the centroid's distance from the origin where that is
  // larger (its coordinates carry no more digits)
  const scale = Math.max(sizeOf(mesh), Math.hypot(...want.centroid))
  for (let k = 0; k < 3; k++) expect(Math.abs(got!.centroid[k] - want.centroid[k]), `${label} centroid ${k}`).toBeLessThanOrEqual(TOL * scale)
}

describe(`boundaryVolume against the element sums (seed ${SEED})`, () => {
  console.log(`boundaryVolume property seed ${SEED}`)
  const rnd = mulberry32(SEED)

  for (const type of ELEMENT_TYPE_NAMES) {
    it(`${type}: distorted, rotated, far from the origin`, () => {
      for (let trial = 0; trial < 4; trial++) {
        const lx = 0.5 + rnd(), ly = 0.5 + rnd(), lz = 0.5 + rnd()
        const box = boxMesh({ nx: 3, ny: 2, nz: 2, lx, ly, lz }, type)
        const h = Math.min(lx / 3, ly / 2, lz / 2)
        // far from the origin: 10^4 sizes; 10^2 for quadratic types, whose mid-edge nodes
        // would otherwise be off their edges' midpoints by more than the straightness test allows
        const far = trial % 2 === 0 ? 0 : ELEMENT_TYPES[type].quadratic ? 1e2 : 1e4
        const mesh = moved(distort(box, rnd, 0.12 * h), rnd, [far * rnd(), -far * rnd(), far])
        expectSameBody(mesh, bodyVolume(mesh), `${type} trial ${trial}`)
      }
    })
  }

  it('random assemblies of mixed types, nodes shared or meshed apart, distorted and rotated', () => {
    let apart = 0
    for (let trial = 0; trial < 24; trial++) {
      const { mesh: asm, merged } = randomAssembly(rnd)
      if (!merged) apart++
      const mesh = moved(distort(asm, rnd, 0.08), rnd, [100 * rnd(), 100 * rnd(), -100 * rnd()])
      expectSameBody(mesh, bodyVolume(mesh), `assembly ${trial} (${merged ? 'shared nodes' : 'meshed apart'})`)
    }
    expect(apart).toBeGreaterThan(0)
  })

  it('each part of a random assembly: its volume and centroid from its own boundary (outer faces and sides between parts) equal its element sums', () => {
    for (let trial = 0; trial < 24; trial++) {
      const { mesh: asm, merged } = randomAssembly(rnd)
      const mesh = moved(distort(asm, rnd, 0.08), rnd, [100 * rnd(), -100 * rnd(), 100 * rnd()])
      const field = nodalStressField(mesh, new Float64Array(6 * mesh.nodeCount))
      const parts = assemblyBalance(mesh, field, () => [0, 0, 0]).parts
      expect(parts.map((p) => p.part)).toEqual(partNumbers(mesh))
      for (const p of parts) {
        const want = bodyVolume(partSubmesh(mesh, field, p.part).mesh), label = `assembly ${trial} (${merged ? 'shared nodes' : 'meshed apart'}) part ${p.part}`
        expect(Math.abs(p.volume - want.volume), label).toBeLessThanOrEqual(TOL * want.volume)
        const scale = Math.max(sizeOf(mesh), Math.hypot(...want.centroid))
        for (let k = 0; k < 3; k++) expect(Math.abs(p.balance.centroid[k] - want.centroid[k]), `${label} centroid ${k}`).toBeLessThanOrEqual(TOL * scale)
      }
    }
  })

  it('a part with a curved boundary face: every part by its element sums, in element order (bodyVolume of its sub-mesh, bit for bit)', () => {
    const { mesh: asm } = randomAssembly(rnd)
    const box = boxMesh({ nx: 2, ny: 1, nz: 1, lx: 2, ly: 1, lz: 1, x0: 0, y0: 0, z0: 5 }, 'tet10')
    const c = Float64Array.from(box.coords)
    for (let i = 0; i < c.length; i++) c[i] += 0.03 * (2 * rnd() - 1)
    // the assembly beside a curved tet10 box of part 9 (its own nodes)
    const n0 = asm.nodeCount, coords = new Float64Array(3 * (n0 + box.nodeCount))
    coords.set(asm.coords); coords.set(c, 3 * n0)
    let offset = asm.elementCount
    const blocks = [...asm.blocks, ...box.blocks.map((b) => {
      const blk = { ...b, conn: b.conn.map((n) => n + n0), part: new Int32Array(b.ids.length).fill(9), offset }
      offset += b.ids.length
      return blk
    })]
    const mesh = { ...asm, coords, nodeCount: n0 + box.nodeCount, nodeIds: Int32Array.from({ length: n0 + box.nodeCount }, (_, i) => i + 1), elementCount: offset, blocks }
    const field = nodalStressField(mesh, new Float64Array(6 * mesh.nodeCount))
    for (const p of assemblyBalance(mesh, field, () => [0, 0, 0]).parts) {
      const want = bodyVolume(partSubmesh(mesh, field, p.part).mesh)
      expect(p.volume, `part ${p.part}`).toBe(want.volume)
      expect(p.balance.centroid, `part ${p.part}`).toEqual(want.centroid)
    }
  })

  for (const type of ['tet10', 'hex20', 'wedge15', 'pyramid13'] as const) {
    it(`${type}: a curved boundary face sends the body to the element sums`, () => {
      const box = boxMesh({ nx: 2, ny: 2, nz: 1, lx: 1, ly: 1, lz: 0.5 }, type)
      const c = Float64Array.from(box.coords)
      // every node moved, mid-edge nodes included: the faces curve
      for (let i = 0; i < c.length; i++) c[i] += 0.03 * (2 * rnd() - 1)
      const mesh = { ...box, coords: c }
      const faces = extractBoundaryFaces(mesh)
      expect(boundaryVolume(mesh.coords, faces)).toBeNull()
      expect(bodyVolumeOf(mesh, faces)).toEqual(bodyVolume(mesh))
    })
  }

  // tet10: x det J has degree 5 (tetrahedron rule of degree 5); hex20: degree 7 per direction (4×4×4 Gauss).
  const EXACT_RULES: readonly [ElementTypeName, ReturnType<typeof tetRule>][] = [['tet10', tetRule(5)], ['hex20', tensorRule(4, 3)]]
  for (const [type, rule] of EXACT_RULES) {
    it(`${type}: curved elements inside a straight boundary match element sums by a rule exact for their first moment`, () => {
      const box = boxMesh({ nx: 3, ny: 3, nz: 3, lx: 1, ly: 1, lz: 1 }, type)
      const onBoundary = new Uint8Array(box.nodeCount)
      const faces0 = extractBoundaryFaces(box)
      for (let i = 0; i < faces0.nodes.length; i++) if (faces0.nodes[i] >= 0) onBoundary[faces0.nodes[i]] = 1
      const c = Float64Array.from(box.coords)
      let curved = 0
      for (let i = 0; i < box.nodeCount; i++) if (!onBoundary[i]) { curved++; for (let k = 0; k < 3; k++) c[3 * i + k] += 0.05 * (2 * rnd() - 1) }
      expect(curved).toBeGreaterThan(0)
      const mesh = moved({ ...box, coords: c }, rnd, [10, -20, 30], true)
      const b = mesh.blocks[0], nn = ELEMENT_TYPES[type].nodeCount, tab = tabulateElement(type, rule)
      const vol = new Float64Array(1), cen = new Float64Array(3), xs = new Float64Array(3 * nn)
      let V = 0
      const m = [0, 0, 0]
      for (let e = 0; e < b.ids.length; e++) {
        elementByRule(vol, cen, 0, mesh.coords, b.conn, nn * e, nn, tab, xs)
        V += vol[0]
        for (let k = 0; k < 3; k++) m[k] += vol[0] * cen[k]
      }
      expectSameBody(mesh, { volume: V, centroid: [m[0] / V, m[1] / V, m[2] / V] }, type)
    })
  }
})
