/**
 * The faces between parts sharing nodes (facesBetweenParts, partFaces.ts) on structured boxes whose
 * answer is counted by hand: a checkerboard of hexahedra (every interior face lies between two
 * parts: 3·(n−1)·n² faces, two sides each), slabs of Kuhn tetrahedra (two triangles per cell face
 * on each slab plane), quadratic tetrahedra (six nodes per side), one part (none). Each side lies
 * in its own element, faces out of it, and its twin is the same face seen from the other part.
 */
import { describe, expect, it } from 'vitest'
import { facesBetweenParts } from '../../../src/mechanics/partFaces.ts'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { ELEMENT_TYPES } from '../../../src/model/elementTypes.ts'
import type { ElementTypeName } from '../../../src/model/elementTypes.ts'
import type { Mesh } from '../../../src/model/model.ts'

/** A box of unit cells whose elements get part(i, j, k) of their cell. */
function partedBox(n: [number, number, number], type: ElementTypeName, part: (i: number, j: number, k: number) => number): Mesh {
  const mesh = boxMesh({ nx: n[0], ny: n[1], nz: n[2], lx: n[0], ly: n[1], lz: n[2] }, type)
  const b = mesh.blocks[0], perCell = b.ids.length / (n[0] * n[1] * n[2])
  const parts = new Int32Array(b.ids.length)
  for (let e = 0; e < parts.length; e++) {
    const cell = Math.floor(e / perCell), i = cell % n[0], j = Math.floor(cell / n[0]) % n[1], k = Math.floor(cell / (n[0] * n[1]))
    parts[e] = part(i, j, k)
  }
  return { ...mesh, blocks: [{ ...b, part: parts }] }
}

/** Checks every side against its element and its twin; returns the sides. */
function checkSides(mesh: Mesh) {
  const { faces, twin } = facesBetweenParts(mesh)
  const b = mesh.blocks[0], topo = ELEMENT_TYPES[b.type], nn = topo.nodeCount, x = mesh.coords
  for (let s = 0; s < faces.count; s++) {
    const e = faces.elem[s], t = twin[s]
    expect(twin[t]).toBe(s)
    expect(b.part![faces.elem[t]]).not.toBe(b.part![e])
    // (element, local face) order
    if (s > 0) expect(faces.elem[s - 1] * 8 + faces.localFace[s - 1]).toBeLessThan(e * 8 + faces.localFace[s])
    // the element's own face nodes, in its order
    const local = topo.faces[faces.localFace[s]]
    expect(Array.from(faces.nodes.subarray(faces.slots * s, faces.slots * s + local.length))).toEqual(local.map((a) => b.conn[nn * e + a]))
    // out of its own element: the normal points from the element's corner mean to the face
    const c = [0, 1, 2].map((k) => { let m = 0; for (let a = 0; a < topo.cornerCount; a++) m += x[3 * b.conn[nn * e + a] + k] / topo.cornerCount; return m })
    const out = [0, 1, 2].reduce((d, k) => d + faces.normal[3 * s + k] * (faces.centroid[3 * s + k] - c[k]), 0)
    expect(out).toBeGreaterThan(0)
    // the twin: the same face, the opposite normal
    for (let k = 0; k < 3; k++) {
      expect(faces.centroid[3 * t + k]).toBeCloseTo(faces.centroid[3 * s + k], 12)
      expect(faces.normal[3 * t + k]).toBeCloseTo(-faces.normal[3 * s + k], 12)
    }
    expect(faces.area[t]).toBeCloseTo(faces.area[s], 12)
  }
  return faces
}

describe('faces between parts sharing nodes', () => {
  it('a 3×3×3 checkerboard of hexahedra: every interior face, 3·2·9 = 54, two sides each, unit area', () => {
    const faces = checkSides(partedBox([3, 3, 3], 'hex8', (i, j, k) => 1 + ((i + j + k) % 2)))
    expect(faces.count).toBe(108)
    for (let s = 0; s < faces.count; s++) expect(faces.area[s]).toBeCloseTo(1, 12)
  })

  it('slabs of Kuhn tetrahedra: two triangles per cell face on each plane between parts, normals along z', () => {
    // parts change at z = 2 (1 → 2) and z = 3 (2 → 7); the plane z = 1 lies inside part 1
    const faces = checkSides(partedBox([2, 3, 4], 'tet4', (_i, _j, k) => (k < 2 ? 1 : k < 3 ? 2 : 7)))
    expect(faces.count).toBe(2 * 2 * (2 * 3 * 2))
    let area = 0
    for (let s = 0; s < faces.count; s++) {
      expect(Math.abs(faces.normal[3 * s + 2])).toBeCloseTo(1, 12)
      expect([2, 3]).toContain(Math.round(faces.centroid[3 * s + 2]))
      area += faces.area[s]
    }
    expect(area).toBeCloseTo(2 * 2 * 6, 12)
  })

  it('quadratic tetrahedra: six nodes per side, corners outward', () => {
    const faces = checkSides(partedBox([2, 2, 2], 'tet10', (i) => (i < 1 ? 3 : 5)))
    expect(faces.count).toBe(2 * 2 * 4)
    expect(faces.slots).toBe(6)
  })

  it('one part, or parts that touch no other: none', () => {
    expect(facesBetweenParts(partedBox([2, 2, 2], 'hex8', () => 4)).faces.count).toBe(0)
    expect(facesBetweenParts(boxMesh({ nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1 }, 'wedge6')).faces.count).toBe(0)
  })
})
