/**
 * The element registry (src/model/elementTypes.ts): every record is checked against facts that do
 * not depend on the code that uses it. Topology: a corner polyhedron is closed (every edge on two
 * faces) and satisfies Euler's V - E + F = 2; faces point away from the reference centroid; the
 * reference element's volume is that of its domain (elementary geometry: tetrahedron 1/6, cube 8,
 * wedge 1/2 · 2, pyramid 4 · 1/3); mid-edge nodes sit at their edge midpoints. Node orders of the
 * new types are the ones the README states (1-based there, 0-based here).
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { measureElement, reorientElements } from '../../../src/io/elementOrientation.ts'
import { volumeRule } from '../../../src/mechanics/quadrature.ts'
import { shapeValues, tabulateElement } from '../../../src/mechanics/shapeFunctions.ts'
import { createMesh } from '../../../src/model/createMesh.ts'
import { elementType, ELEMENT_TYPE_NAMES, ELEMENT_TYPES, FACE_KIND_CODE, FACE_KINDS, FACE_NODE_COUNT, faceKind, faceKindOf, isElementTypeName } from '../../../src/model/elementTypes.ts'
import type { ElementTypeName, FaceKind } from '../../../src/model/elementTypes.ts'
import { isInputError } from '../../../src/model/errors.ts'

/** Cube corners 0-7 of the unit cell (hex8 order) and its centre 8, as used by `cubeCells`. */
const CELL = [[0, 0, 0], [1, 0, 0], [1, 1, 0], [0, 1, 0], [0, 0, 1], [1, 0, 1], [1, 1, 1], [0, 1, 1], [0.5, 0.5, 0.5]]

function volumeOf(type: ElementTypeName, points: readonly (readonly number[])[]): number {
  const coords = Float64Array.from(points.flat())
  const out = new Float64Array(2)
  measureElement(out, new Float64Array(24), coords, Int32Array.from(points.keys()), 0, type)
  return out[0]
}

describe('element codes', () => {
  it('the first five never change; pyramid5, pyramid13 and wedge15 take 6, 7 and 8; all distinct', () => {
    const codes = Object.fromEntries(ELEMENT_TYPE_NAMES.map((t) => [t, ELEMENT_TYPES[t].code]))
    expect(codes).toEqual({ tet4: 1, tet10: 2, hex8: 3, hex20: 4, wedge6: 5, pyramid5: 6, pyramid13: 7, wedge15: 8 })
    expect(FACE_KINDS.map((k) => [k.name, k.code])).toEqual([['tri3', 0], ['tri6', 1], ['quad4', 2], ['quad8', 3]])
    expect(FACE_KIND_CODE).toEqual({ tri3: 0, tri6: 1, quad4: 2, quad8: 3 })
  })
})

describe('an unknown type is an error, never a default', () => {
  const bad = 'brick8' as ElementTypeName
  const expectUnknown = (f: () => unknown): void => {
    let err: unknown = null
    try { f() } catch (e) { err = e }
    expect(isInputError(err)).toBe(true)
    expect((err as Error).message).toContain('unknown element type "brick8"; known types: tet4, tet10, hex8, hex20, wedge6, pyramid5, pyramid13, wedge15')
  }
  it('in the registry, the shape functions, the rules, the meshers, the orientation test', () => {
    expect(isElementTypeName('brick8')).toBe(false)
    expect(isElementTypeName('toString')).toBe(false)
    expectUnknown(() => elementType('brick8'))
    expectUnknown(() => shapeValues(bad, 0, 0, 0, new Float64Array(8)))
    expectUnknown(() => volumeRule(bad))
    expectUnknown(() => tabulateElement(bad, volumeRule('hex8')))
    expectUnknown(() => boxMesh({ nx: 1, ny: 1, nz: 1, lx: 1, ly: 1, lz: 1 }, bad))
    expectUnknown(() => createMesh(new Float64Array(24), [{ type: bad, conn: new Int32Array(8) }]))
    expectUnknown(() => measureElement(new Float64Array(2), new Float64Array(24), new Float64Array(24), new Int32Array(8), 0, bad))
    expectUnknown(() => reorientElements(new Int32Array(8), bad, new Int32Array(1)))
    expect(() => faceKind('hex' as FaceKind)).toThrow(/unknown face kind "hex"/)
    expect(() => faceKindOf(4)).toThrow(/unknown face kind code 4/)
  })
})

describe.each(ELEMENT_TYPE_NAMES)('%s record', (type) => {
  const t = ELEMENT_TYPES[type]
  const corners = t.refCoords.slice(0, t.cornerCount)

  it('nodes: corners first, each mid-edge node at its edge midpoint, face kinds fit the face lists', () => {
    expect(t.refCoords.length).toBe(t.nodeCount)
    expect(t.nodeCount).toBe(t.cornerCount + (t.quadratic ? t.edges.length : 0))
    for (const [a, b, m] of t.edges) {
      expect(a < t.cornerCount && b < t.cornerCount).toBe(true)
      if (!t.quadratic) { expect(m).toBe(-1); continue }
      for (let k = 0; k < 3; k++) expect(t.refCoords[m][k]).toBe((t.refCoords[a][k] + t.refCoords[b][k]) / 2)
    }
    t.faces.forEach((f, i) => {
      expect(f.length).toBe(FACE_NODE_COUNT[t.faceKinds[i]])
      const nc = faceKind(t.faceKinds[i]).cornerCount
      for (let c = 0; c < 4; c++) expect(t.cornerFaces[4 * i + c]).toBe(c < nc ? f[c] : -1)
      expect(faceKind(t.faceKinds[i]).quadratic).toBe(t.quadratic)
    })
  })

  it('corner polyhedron: closed, Euler V - E + F = 2, faces outward, volume of the reference domain', () => {
    const edgeUses = new Map<string, number>()
    for (const f of t.faces) {
      const nc = f.length === 3 || f.length === 6 ? 3 : 4
      for (let k = 0; k < nc; k++) {
        const a = f[k], b = f[(k + 1) % nc]
        const e = t.edges.find(([x, y]) => (x === a && y === b) || (x === b && y === a))
        expect(e, `${type}: face edge (${a}, ${b})`).toBeDefined()
        if (t.quadratic) expect(f[nc + k]).toBe(e![2])
        const key = `${Math.min(a, b)},${Math.max(a, b)}`
        edgeUses.set(key, (edgeUses.get(key) ?? 0) + 1)
      }
      // Right-hand normal of the first three corners points away from the domain's centroid.
      const [p, q, r] = [0, 1, 2].map((k) => t.refCoords[f[k]])
      const u = [0, 1, 2].map((k) => q[k] - p[k]), v = [0, 1, 2].map((k) => r[k] - p[k])
      const n = [u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]]
      const c = t.domain.centroid
      expect(n[0] * (p[0] - c[0]) + n[1] * (p[1] - c[1]) + n[2] * (p[2] - c[2])).toBeGreaterThan(0)
    }
    expect(edgeUses.size).toBe(t.edges.length)
    for (const uses of edgeUses.values()) expect(uses).toBe(2)
    expect(t.cornerCount - t.edges.length + t.faces.length).toBe(2)
    expect(volumeOf(type, corners)).toBeCloseTo(t.domain.volume, 14)
  })

  it('mirror: reverses the volume, is its own inverse, keeps mid-edge nodes on their edges', () => {
    const mirrored = t.mirror.map((i) => t.refCoords[i])
    expect(volumeOf(type, mirrored.slice(0, t.cornerCount))).toBeCloseTo(-t.domain.volume, 14)
    expect(t.mirror.map((i) => t.mirror[i])).toEqual(t.refCoords.map((_, i) => i))
    for (const [a, b, m] of t.edges) {
      if (m < 0) continue
      for (let k = 0; k < 3; k++) expect(mirrored[m][k]).toBe((mirrored[a][k] + mirrored[b][k]) / 2)
    }
  })

  it('reference domain: centroid, volume rule points and sampled points lie inside; clamp moves outside points onto it', () => {
    const d = t.domain
    const inside = (p: readonly number[]): boolean => {
      const q = [...p]
      d.clamp(q)
      return q.every((x, k) => Math.abs(x - p[k]) < 1e-15)
    }
    expect(inside(d.centroid)).toBe(true)
    const r = t.volumeRule
    for (let q = 0; q < r.weights.length; q++) expect(inside([r.points[3 * q], r.points[3 * q + 1], r.points[3 * q + 2]])).toBe(true)
    const p = [0, 0, 0]
    for (const [u, v, w] of [[0.1, 0.9, 0.5], [0.99, 0.01, 0.3], [0.5, 0.5, 0.999]]) { d.fromUnitCube(p, u, v, w); expect(inside(p)).toBe(true) }
    // Far outside: the clamped point is inside, and a second clamp does not move it.
    for (const far of [[5, -3, 2], [-2, -2, -2], [0.1, 0.1, 7]]) {
      const q = [...far]
      d.clamp(q)
      expect(inside(q)).toBe(true)
      expect(inside(far)).toBe(false)
    }
    // The corners are in the closed domain.
    for (const c of corners) expect(inside(c)).toBe(true)
  })

  it('grid fill: positively oriented elements that fill the unit cell', () => {
    const lin = elementType(t.linear)
    let total = 0
    for (const cell of lin.cubeCells) {
      const v = volumeOf(lin.name, cell.map((a) => CELL[a]))
      expect(v).toBeGreaterThan(0)
      total += v
    }
    expect(total).toBeCloseTo(1, 14)
  })
})

describe('node orders of the new types (README; 1-based there)', () => {
  it('pyramid13: faces list corners, then mid-edge nodes; mirror swaps base corners 2 and 4 with their edges', () => {
    const t = ELEMENT_TYPES.pyramid13
    expect(t.faces).toEqual([[0, 3, 2, 1, 8, 7, 6, 5], [0, 1, 4, 5, 10, 9], [1, 2, 4, 6, 11, 10], [2, 3, 4, 7, 12, 11], [3, 0, 4, 8, 9, 12]])
    expect(t.faceKinds).toEqual(['quad8', 'tri6', 'tri6', 'tri6', 'tri6'])
    expect(t.edges).toEqual([[0, 1, 5], [1, 2, 6], [2, 3, 7], [3, 0, 8], [0, 4, 9], [1, 4, 10], [2, 4, 11], [3, 4, 12]])
    expect(t.mirror).toEqual([0, 3, 2, 1, 4, 8, 7, 6, 5, 9, 12, 11, 10])
    expect(ELEMENT_TYPES.pyramid5.faceKinds).toEqual(['quad4', 'tri3', 'tri3', 'tri3', 'tri3'])
    expect(ELEMENT_TYPES.pyramid5.mirror).toEqual([0, 3, 2, 1, 4])
  })
  it('wedge15: mid-edge nodes on (1,2) (2,3) (3,1), (4,5) (5,6) (6,4), (1,4) (2,5) (3,6); mirror swaps the triangles', () => {
    const t = ELEMENT_TYPES.wedge15
    expect(t.edges.map(([a, b, m]) => [a + 1, b + 1, m + 1])).toEqual([[1, 2, 7], [2, 3, 8], [3, 1, 9], [4, 5, 10], [5, 6, 11], [6, 4, 12], [1, 4, 13], [2, 5, 14], [3, 6, 15]])
    expect(t.faces).toEqual([[0, 2, 1, 8, 7, 6], [3, 4, 5, 9, 10, 11], [0, 1, 4, 3, 6, 13, 9, 12], [1, 2, 5, 4, 7, 14, 10, 13], [2, 0, 3, 5, 8, 12, 11, 14]])
    expect(t.mirror).toEqual([3, 4, 5, 0, 1, 2, 9, 10, 11, 6, 7, 8, 12, 13, 14])
  })
  it('tet10 and hex20 keep the node orders and mirror permutations they had before the registry derived them', () => {
    expect(ELEMENT_TYPES.tet10.faces).toEqual([[0, 2, 1, 6, 5, 4], [0, 1, 3, 4, 8, 7], [1, 2, 3, 5, 9, 8], [0, 3, 2, 7, 9, 6]])
    expect(ELEMENT_TYPES.tet10.mirror).toEqual([0, 2, 1, 3, 6, 5, 4, 7, 9, 8])
    expect(ELEMENT_TYPES.hex20.faces).toEqual([
      [0, 3, 2, 1, 11, 10, 9, 8], [4, 5, 6, 7, 12, 13, 14, 15], [0, 1, 5, 4, 8, 17, 12, 16],
      [1, 2, 6, 5, 9, 18, 13, 17], [2, 3, 7, 6, 10, 19, 14, 18], [3, 0, 4, 7, 11, 16, 15, 19],
    ])
    expect(ELEMENT_TYPES.hex20.mirror).toEqual([4, 5, 6, 7, 0, 1, 2, 3, 12, 13, 14, 15, 8, 9, 10, 11, 16, 17, 18, 19])
  })
})
