/**
 * Values along a line (src/mechanics/lineSampling.ts, lineAnalysis.ts) and the point location
 * under them (elementGrid.ts, pointLocation.ts):
 * - at nodes the line reads the nodal stress; inside an element it reads Σ Nₐ σₐ, the element's
 *   own shape-function interpolation (checked against the registry's functions at a known ξ);
 * - on a face shared by two elements nodal stress gives the same value from either element,
 *   element-nodal stress the mean of the two elements' values;
 * - points outside the body are gaps (NaN everywhere, never zero);
 * - the grid finds exactly the elements a brute-force search over every element finds (seeded);
 * - the material part: ends on, inside and outside the surface, a line that leaves the body, a
 *   line wholly outside, and the line stretched to the wall's surfaces.
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { ELEMENT_TYPE_NAMES, ELEMENT_TYPES, elementType } from '../../../src/model/elementTypes.ts'
import type { ElementTypeName } from '../../../src/model/elementTypes.ts'
import type { Mesh, Vec3 } from '../../../src/model/model.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import type { StressField } from '../../../src/model/stressField.ts'
import { createMesh } from '../../../src/model/createMesh.ts'
import { buildElementGrid } from '../../../src/mechanics/elementGrid.ts'
import { allocatePointHits, locatePoint, locationTolerance } from '../../../src/mechanics/pointLocation.ts'
import { invertElementMap } from '../../../src/mechanics/mapInversion.ts'
import { sampleLine } from '../../../src/mechanics/lineSampling.ts'
import { analyseLine, lineThroughWall } from '../../../src/mechanics/lineAnalysis.ts'
import { mulberry32 } from '../../../src/mechanics/seededRandom.ts'
import { elementNodalCopy } from '../../helpers/elementNodal.ts'

/** A seeded random nodal field (no structure: interpolation is the only way to reproduce it). */
function randomStress(mesh: Mesh, seed: number): Float64Array {
  const r = mulberry32(seed)
  return Float64Array.from({ length: 6 * mesh.nodeCount }, () => 200 * r() - 100)
}

function sample(mesh: Mesh, field: StressField, from: Vec3, to: Vec3, points: number, displacement: Float64Array | null = null) {
  const grid = buildElementGrid(mesh)
  return sampleLine(mesh, grid, field, displacement, from, to, points, locationTolerance(grid))
}

describe('line values', () => {
  for (const type of ELEMENT_TYPE_NAMES) {
    it(`${type}: at nodes the nodal stress, inside the shape-function interpolation`, () => {
      const mesh = boxMesh({ nx: 2, ny: 2, nz: 2, lx: 2, ly: 2, lz: 2 }, type)
      const stress = randomStress(mesh, 1601)
      const field = nodalStressField(mesh, stress)
      // Along the grid line y = z = 1: nodes at x = 0, 1, 2 (and mid-edge nodes at 0.5, 1.5 in quadratic types).
      const quadratic = ELEMENT_TYPES[type].quadratic
      const s = sample(mesh, field, [0, 1, 1], [2, 1, 1], quadratic ? 5 : 3)
      for (let i = 0; i < s.count; i++) {
        const node = findNode(mesh, s.points[3 * i], 1, 1)
        expect(node, `a node at x = ${s.points[3 * i]}`).toBeGreaterThanOrEqual(0)
        for (let k = 0; k < 6; k++) expect(s.stress[6 * i + k]).toBeCloseTo(stress[6 * node + k], 9)
        expect(s.held[i]).toBeGreaterThan(0)
      }
      // Inside element 0 at a known reference point: Σ Nₐ σₐ.
      const topo = elementType(type), b = mesh.blocks[0], nn = topo.nodeCount
      const xi = [0, 0, 0]
      topo.domain.fromUnitCube(xi, 0.31, 0.57, 0.23)
      const N = topo.shapeValues(xi[0], xi[1], xi[2], new Float64Array(nn))
      const p: Vec3 = [0, 0, 0], want = [0, 0, 0, 0, 0, 0]
      for (let a = 0; a < nn; a++) {
        const n = b.conn[a]
        for (let k = 0; k < 3; k++) p[k] += N[a] * mesh.coords[3 * n + k]
        for (let k = 0; k < 6; k++) want[k] += N[a] * stress[6 * n + k]
      }
      const one = sample(mesh, field, p, [p[0] + 1e-3, p[1], p[2]], 2)
      for (let k = 0; k < 6; k++) expect(one.stress[k]).toBeCloseTo(want[k], 9)
    })
  }

  it('on a shared face: nodal stress alike from either element, element-nodal stress averaged', () => {
    // Two hex8 side by side along x; the face x = 1 is shared.
    const mesh = boxMesh({ nx: 2, ny: 1, nz: 1, lx: 2, ly: 1, lz: 1 }, 'hex8')
    const stress = randomStress(mesh, 77)
    const nodal = sample(mesh, nodalStressField(mesh, stress), [1, 0.3, 0.6], [1.5, 0.3, 0.6], 2)
    expect(nodal.held[0]).toBe(2)
    // Either element's interpolation at the face: the face's own bilinear interpolation.
    const grid = buildElementGrid(mesh)
    const hits = locatePoint(allocatePointHits(), mesh, grid, 1, 0.3, 0.6, locationTolerance(grid))
    expect(hits.count).toBe(2)
    // Element-nodal: each element's rows are the nodal rows plus an offset of its own.
    const en = elementNodalCopy(mesh, stress)
    const values = en.values.slice()
    for (let e = 0; e < 2; e++) for (let a = 0; a < 8; a++) for (let k = 0; k < 6; k++) values[6 * en.rows[0][8 * e + a] + k] += e === 0 ? 10 * (k + 1) : -4 * (k + 1)
    const s = sample(mesh, { ...en, values }, [1, 0.3, 0.6], [1.5, 0.3, 0.6], 2)
    expect(s.held[0]).toBe(2)
    // Mean of (nodal + 10(k+1)) and (nodal − 4(k+1)) = nodal + 3(k+1).
    for (let k = 0; k < 6; k++) expect(s.stress[k]).toBeCloseTo(nodal.stress[k] + 3 * (k + 1), 9)
    // Inside element 1 only its own values count.
    for (let k = 0; k < 6; k++) expect(s.stress[6 + k]).toBeCloseTo(nodal.stress[6 + k] - 4 * (k + 1), 9)
  })

  it('points outside the body are gaps: NaN in every array, never zero', () => {
    const mesh = boxMesh({ nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1 }, 'tet4')
    const disp = Float64Array.from({ length: 3 * mesh.nodeCount }, (_, i) => i % 3)
    const s = sample(mesh, nodalStressField(mesh, randomStress(mesh, 5)), [-1, 0.5, 0.5], [2, 0.5, 0.5], 7, disp)
    // x = −1, −0.5, 0, 0.5, 1, 1.5, 2: the first two and the last two are outside.
    expect(Array.from(s.held, (h) => h > 0)).toEqual([false, false, true, true, true, false, false])
    for (const i of [0, 1, 5, 6]) {
      expect(Array.from(s.stress.subarray(6 * i, 6 * i + 6)).every(Number.isNaN)).toBe(true)
      expect(Number.isNaN(s.vonMises[i])).toBe(true)
      expect(Array.from(s.principal.subarray(3 * i, 3 * i + 3)).every(Number.isNaN)).toBe(true)
      expect(Array.from(s.displacement!.subarray(3 * i, 3 * i + 3)).every(Number.isNaN)).toBe(true)
    }
    expect(s.vonMises[3]).toBeGreaterThan(0)
    expect(s.length).toBe(3)
    expect(s.distance[6]).toBe(3)
  })
})

function findNode(mesh: Mesh, x: number, y: number, z: number): number {
  for (let i = 0; i < mesh.nodeCount; i++) {
    if (Math.abs(mesh.coords[3 * i] - x) + Math.abs(mesh.coords[3 * i + 1] - y) + Math.abs(mesh.coords[3 * i + 2] - z) < 1e-12) return i
  }
  return -1
}

describe('point location', () => {
  for (const type of ['tet4', 'hex20', 'pyramid5', 'wedge15'] as ElementTypeName[]) {
    it(`${type}: the grid finds what a search over every element finds (seeded points)`, () => {
      const seed = 4242
      console.log(`point location seed ${seed}`)
      const rnd = mulberry32(seed)
      const box = boxMesh({ nx: 3, ny: 2, nz: 2, lx: 3, ly: 2, lz: 2 }, type)
      // Jitter the grid nodes a little (mid-edge nodes follow: they stay at their edges' midpoints).
      const coords = box.coords.slice()
      const topo = elementType(type)
      for (let i = 0; i < (3 + 1) * (2 + 1) * (2 + 1); i++) for (let k = 0; k < 3; k++) {
        const onBoundary = [coords[3 * i] === 0 || coords[3 * i] === 3, coords[3 * i + 1] === 0 || coords[3 * i + 1] === 2, coords[3 * i + 2] === 0 || coords[3 * i + 2] === 2]
        if (!onBoundary[k]) coords[3 * i + k] += 0.2 * (rnd() - 0.5)
      }
      for (const [a, c, mid] of topo.edges) {
        if (mid < 0) continue
        for (let e = 0; e < box.blocks[0].ids.length; e++) {
          const conn = box.blocks[0].conn, nn = topo.nodeCount
          for (let k = 0; k < 3; k++) coords[3 * conn[e * nn + mid] + k] = (coords[3 * conn[e * nn + a] + k] + coords[3 * conn[e * nn + c] + k]) / 2
        }
      }
      const mesh = createMesh(coords, [{ type, conn: box.blocks[0].conn }])
      const grid = buildElementGrid(mesh)
      const tol = locationTolerance(grid)
      const hits = allocatePointHits()
      const xi = new Float64Array(3)
      const conn = mesh.blocks[0].conn, nn = topo.nodeCount
      for (let q = 0; q < 200; q++) {
        const p: Vec3 = [3.4 * rnd() - 0.2, 2.4 * rnd() - 0.2, 2.4 * rnd() - 0.2]
        locatePoint(hits, mesh, grid, p[0], p[1], p[2], tol)
        const found = Array.from(hits.elem.subarray(0, hits.count)).sort((x, y) => x - y)
        const brute: number[] = []
        for (let e = 0; e < mesh.elementCount; e++) if (invertElementMap(xi, topo, mesh.coords, conn, e * nn, ...p) <= tol) brute.push(e)
        expect(found).toEqual(brute)
        // Inside the box a point lies in exactly one element (away from faces, which random points miss).
        const inside = p.every((v, k) => v > 0 && v < [3, 2, 2][k])
        expect(found.length).toBe(inside ? 1 : 0)
      }
    })
  }
})

describe('the material part of a line', () => {
  const mesh = boxMesh({ nx: 4, ny: 2, nz: 2, lx: 4, ly: 1, lz: 1 }, 'hex8')
  const field = nodalStressField(mesh, randomStress(mesh, 9))
  const grid = buildElementGrid(mesh)
  const run = (from: Vec3, to: Vec3) => analyseLine(mesh, grid, field, null, { from, to, points: 9 })

  it('ends on the surfaces: linearised over the whole line, no warning', () => {
    const r = run([1.3, 0, 0.4], [1.3, 1, 0.4])
    expect(r.refused).toBeNull()
    expect(r.warnings).toEqual([])
    expect(r.linearisation!.thickness).toBeCloseTo(1, 10)
  })

  it('an end within the tolerance off the surface is moved onto it, with a note', () => {
    const r = run([1.3, -0.01, 0.4], [1.3, 1.005, 0.4])
    expect(r.refused).toBeNull()
    expect(r.linearisation!.thickness).toBeCloseTo(1, 10)
    // The line is 1.015 long: 0.01 and 0.005 of it are 0.985 % and 0.493 %.
    expect(r.warnings.join(' ')).toMatch(/start of the line lay 0\.985 % of the line's length outside the surface/)
    expect(r.warnings.join(' ')).toMatch(/end of the line lay 0\.493 % of the line's length outside the surface/)
  })

  it('an end inside the body is kept with a warning (not through the whole wall)', () => {
    const r = run([1.3, 0.3, 0.4], [1.3, 1, 0.4])
    expect(r.refused).toBeNull()
    expect(r.linearisation!.thickness).toBeCloseTo(0.7, 10)
    expect(r.warnings.join(' ')).toMatch(/start of the line lies inside the body/)
  })

  it('an end outside the body beyond the tolerance is refused', () => {
    const r = run([1.3, -0.5, 0.4], [1.3, 1, 0.4])
    expect(r.linearisation).toBeNull()
    expect(r.refused).toMatch(/start of the line lies outside the body/)
  })

  it('a line that leaves the body between its ends is refused; its samples show the gap', () => {
    // An L-shaped body: two boxes joined along x ∈ [0, 1]; the line runs from one arm to the other through air.
    const l = createMesh(Float64Array.from([
      ...boxMesh({ nx: 1, ny: 1, nz: 1, lx: 1, ly: 1, lz: 1 }, 'hex8').coords,
      ...boxMesh({ nx: 1, ny: 1, nz: 1, lx: 1, ly: 1, lz: 1, x0: 2 }, 'hex8').coords,
    ]), [{ type: 'hex8', conn: Int32Array.from([0, 1, 3, 2, 4, 5, 7, 6, 8, 9, 11, 10, 12, 13, 15, 14]) }])
    const g = buildElementGrid(l)
    const r = analyseLine(l, g, nodalStressField(l, randomStress(l, 3)), null, { from: [0, 0.5, 0.5], to: [3, 0.5, 0.5], points: 7 })
    // Material ends at x = 1 of a line from x = 0 to 3: a third of its length.
    expect(r.refused).toMatch(/leaves the body at 33\.3 % of its length from the start/)
    expect(Array.from(r.samples.held, (h) => h > 0)).toEqual([true, true, true, false, true, true, true])
  })

  it('a line wholly outside says so', () => {
    const r = run([0, 3, 0], [4, 3, 1])
    expect(r.outside).toBe(true)
    expect(r.linearisation).toBeNull()
  })

  it('stretched to the wall surfaces from a line inside the wall', () => {
    const w = lineThroughWall(mesh, grid, [1.3, 0.4, 0.4], [1.3, 0.6, 0.4])!
    expect(w.from[1]).toBeCloseTo(0, 10)
    expect(w.to[1]).toBeCloseTo(1, 10)
    expect(w.from[0]).toBe(1.3)
    expect(lineThroughWall(mesh, grid, [0, 3, 0], [1, 3, 0])).toBeNull()
  })
})
