import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { createMesh } from '../../../src/model/createMesh.ts'
import { elementType, ELEMENT_TYPES, ELEMENT_TYPE_NAMES, FACE_KINDS, FACE_NODE_COUNT } from '../../../src/model/elementTypes.ts'
import type { ElementTypeName } from '../../../src/model/elementTypes.ts'
import { isInputError } from '../../../src/model/errors.ts'
import { extractBoundaryFaces, extractBoundaryFacesInParts } from '../../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions } from '../../../src/mechanics/tractions.ts'
import { mergeMeshes } from '../../helpers/sectionMeshes.ts'

// Geometry of a box (elementary): surface area 2(ab + bc + ca); the closed-surface identity
// ∮ n dA = 0 (divergence theorem, any vector-calculus text); surface centroid of a box = its centre.
describe('extractBoundaryFaces', () => {
  const spec = { nx: 3, ny: 2, nz: 4, lx: 1.5, ly: 0.8, lz: 2, x0: -0.2, y0: 0.1, z0: 1 }
  const area = 2 * (1.5 * 0.8 + 0.8 * 2 + 2 * 1.5)
  // Cells on the box sides: 3 × 2 on each z side, 3 × 4 on each y side, 2 × 4 on each x side.
  // Each cell face is one quadrilateral or two triangles, as the type's registry fill puts it.
  const cellsOnSide = [3 * 2, 3 * 2, 3 * 4, 2 * 4, 3 * 4, 2 * 4]
  const expectedCount = (type: ElementTypeName): number => {
    const t = elementType(ELEMENT_TYPES[type].linear)
    return ELEMENT_TYPES.hex8.faces.reduce((sum, side, k) => {
      const on = new Set(side)
      let n = 0
      for (const cell of t.cubeCells) for (const f of t.faces) if (f.every((a) => on.has(cell[a]))) n++
      return sum + cellsOnSide[k] * n
    }, 0)
  }
  for (const type of ELEMENT_TYPE_NAMES) {
    it(`${type} box: face count, total area, closed surface, outward normals, centroid`, () => {
      const mesh = boxMesh(spec, type)
      const f = extractBoundaryFaces(mesh)
      expect(f.count).toBe(expectedCount(type))
      let A = 0
      const s = [0, 0, 0], c = [0, 0, 0]
      for (let i = 0; i < f.count; i++) {
        A += f.area[i]
        for (let k = 0; k < 3; k++) { s[k] += f.area[i] * f.normal[3 * i + k]; c[k] += f.area[i] * f.centroid[3 * i + k] }
        // Outward: the normal points away from the box centre.
        const d = [0, 1, 2].map((k) => f.centroid[3 * i + k] - [0.55, 0.5, 2][k])
        expect(d[0] * f.normal[3 * i] + d[1] * f.normal[3 * i + 1] + d[2] * f.normal[3 * i + 2]).toBeGreaterThan(0)
        // Unit normal along an axis for a box.
        expect(Math.hypot(f.normal[3 * i], f.normal[3 * i + 1], f.normal[3 * i + 2])).toBeCloseTo(1, 14)
      }
      expect(A).toBeCloseTo(area, 12)
      for (let k = 0; k < 3; k++) expect(Math.abs(s[k])).toBeLessThan(1e-12)
      expect(c[0] / A).toBeCloseTo(0.55, 12)
      expect(c[1] / A).toBeCloseTo(0.5, 12)
      expect(c[2] / A).toBeCloseTo(2, 12)
      // Slots beyond the face's node count are padded with -1.
      for (let i = 0; i < f.count; i++) {
        const used = FACE_KINDS[f.kind[i]].nodeCount
        for (let a = used; a < f.slots; a++) expect(f.nodes[f.slots * i + a]).toBe(-1)
      }
    })
  }

  it('a conforming mixed mesh (two wedge6 beside a hex8) matches the shared quadrilateral', () => {
    const hex = boxMesh({ nx: 2, ny: 1, nz: 1, lx: 2, ly: 1, lz: 1 }, 'hex8')
    const conn = hex.blocks[0].conn
    // Split the first cell into two wedges on its bottom diagonal 0-2 (as boxMesh does); the
    // wedge side 1-2-6-5 is the quadrilateral x = 1 shared with the hex.
    const c = Array.from(conn.subarray(0, 8))
    const wedges = Int32Array.from([c[0], c[1], c[2], c[4], c[5], c[6], c[0], c[2], c[3], c[4], c[6], c[7]])
    const mesh = createMesh(hex.coords, [{ type: 'wedge6', conn: wedges }, { type: 'hex8', conn: conn.slice(8) }])
    const f = extractBoundaryFaces(mesh)
    // Wedges: 2 bottom + 2 top triangles + 3 outer quads; hex: 5 outer quads.
    expect(f.count).toBe(12)
    let A = 0
    for (let i = 0; i < f.count; i++) A += f.area[i]
    expect(A).toBeCloseTo(2 * (2 + 1 + 2), 13)
    expect(Array.from(f.elem).filter((e) => e === 2).length).toBe(5)
  })

  it('a node shared by very many faces (a fan of 80 tetrahedra around one axis) still matches', () => {
    // Nodes 0 and 1 on the axis, a ring of K nodes around it: tet (0, 1, r_i, r_i+1). Every face
    // bucketed on node 0 lands in one bucket of 3K faces (the large-bucket path).
    const K = 80
    const coords = new Float64Array(3 * (K + 2))
    coords.set([0, 0, 0, 0, 0, 1])
    for (let i = 0; i < K; i++) coords.set([Math.cos((2 * Math.PI * i) / K), Math.sin((2 * Math.PI * i) / K), 0.5], 3 * (i + 2))
    const conn = new Int32Array(4 * K)
    for (let i = 0; i < K; i++) {
      const a = 2 + i, b = 2 + ((i + 1) % K)
      // (x1-x0)×(x2-x0)·(x3-x0) > 0 for (0, a, b, 1) with the ring counter-clockwise seen from +z.
      conn.set([0, a, b, 1], 4 * i)
    }
    const f = extractBoundaryFaces(createMesh(coords, [{ type: 'tet4', conn }]))
    expect(f.count).toBe(2 * K)
    let sz = 0
    for (let i = 0; i < f.count; i++) sz += f.area[i] * f.normal[3 * i + 2]
    expect(Math.abs(sz)).toBeLessThan(1e-12)
  })

  it('reports a face shared by three elements with the element ids', () => {
    const box = boxMesh({ nx: 2, ny: 1, nz: 1, lx: 2, ly: 1, lz: 1 }, 'hex8')
    const conn = box.blocks[0].conn
    const dup = new Int32Array(24)
    dup.set(conn); dup.set(conn.subarray(0, 8), 16)
    const mesh = createMesh(box.coords, [{ type: 'hex8', conn: dup, ids: Int32Array.from([10, 20, 30]) }])
    let err: unknown
    try { extractBoundaryFaces(mesh) } catch (e) { err = e }
    expect(isInputError(err)).toBe(true)
    const msg = (err as Error).message
    expect(msg).toContain('10, 20, 30')
    expect(msg).toContain('shared by 3 elements')
  })

  it('matching in parts of the node range gives the same faces as one pass', () => {
    // Mixed blocks, and parts smaller than a bucket (a part then holds one bucket).
    const hex = boxMesh({ nx: 3, ny: 3, nz: 2, lx: 1, ly: 1, lz: 1 }, 'hex8')
    const tet = boxMesh({ nx: 3, ny: 3, nz: 2, lx: 1, ly: 1, lz: 1, z0: 1 }, 'tet4')
    const N = hex.nodeCount
    // Two boxes with their own nodes (the tet block's indices follow the hex block's).
    const coords = new Float64Array(3 * (N + tet.nodeCount))
    coords.set(hex.coords); coords.set(tet.coords, 3 * N)
    const tconn = tet.blocks[0].conn.map((n) => n + N)
    const mesh = createMesh(coords, [{ type: 'hex8', conn: hex.blocks[0].conn }, { type: 'tet4', conn: tconn }])
    const one = extractBoundaryFaces(mesh)
    for (const [part, maxParts] of [[1, Infinity], [5, Infinity], [17, Infinity], [64, Infinity], [1, 8], [5, 3]]) {
      const f = extractBoundaryFacesInParts(mesh, part, maxParts)
      expect(f.count).toBe(one.count)
      expect(Array.from(f.elem)).toEqual(Array.from(one.elem))
      expect(Array.from(f.localFace)).toEqual(Array.from(one.localFace))
      expect(Array.from(f.nodes)).toEqual(Array.from(one.nodes))
    }
    expect(() => extractBoundaryFacesInParts(createMesh(hex.coords, [{ type: 'hex8', conn: new Int32Array([...hex.blocks[0].conn.subarray(0, 8), ...hex.blocks[0].conn.subarray(0, 16)]) }]), 3)).toThrow(/shared by 3 elements/)
  })
})

// Node counts of the face kinds (tri3 3, quad4 4, tri6 6, quad8 8): common practice for these
// Lagrange and serendipity faces. The stride is the largest face kind the mesh's element types have.
describe('per-face-node stride (slots)', () => {
  const spec = { nx: 2, ny: 1, nz: 1, lx: 2, ly: 1, lz: 1 }
  // The stride is the node count of the type's largest face kind.
  const cases = ELEMENT_TYPE_NAMES.map((t) => [t, Math.max(...ELEMENT_TYPES[t].faceKinds.map((k) => FACE_NODE_COUNT[k]))] as const)
  it.each(cases)('a %s box has %i slots per face, and its arrays use that stride', (type, slots) => {
    const mesh = boxMesh(spec, type)
    const f = extractBoundaryFaces(mesh)
    expect(f.slots).toBe(slots)
    expect(f.nodes.length).toBe(slots * f.count)
    const t = allocateSurfaceTractions(f)
    expect(t.nodeMagnitude.length).toBe(slots * f.count)
    expect(t.nodeNormal.length).toBe(3 * slots * f.count)
  })

  it('a mixed tet4 + hex20 mesh takes the largest face (quad8): 8 slots, tri3 faces padded with -1', () => {
    const mesh = mergeMeshes([boxMesh(spec, 'tet4'), boxMesh({ ...spec, z0: 3 }, 'hex20')])
    const f = extractBoundaryFaces(mesh)
    expect(f.slots).toBe(8)
    let tri = 0
    for (let i = 0; i < f.count; i++) {
      if (f.kind[i] !== 0) continue
      tri++
      for (let a = 3; a < 8; a++) expect(f.nodes[8 * i + a]).toBe(-1)
    }
    expect(tri).toBe(2 * 2 * (2 * 1 + 1 * 1 + 2 * 1))
  })

  it('a mesh without elements has 3 slots and no faces', () => {
    const f = extractBoundaryFaces(createMesh(new Float64Array(3), []))
    expect(f.slots).toBe(3)
    expect(f.count).toBe(0)
  })
})
