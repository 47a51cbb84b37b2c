/**
 * The probe's map inversion (workers/probe.ts) for every registered type. Isoparametric elements
 * interpolate the coordinates with the same functions as the field, so a stress field linear in
 * x, y, z is reproduced exactly at any point inside an element, however the element is shaped
 * (common practice: the isoparametric patch-test property). The probe must therefore read the
 * linear field back at points it has to find by inverting x(ξ): inside, on faces, at corners and
 * at the pyramid's apex, where the rational functions are 0/0.
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { extractBoundaryFaces } from '../../../src/mechanics/boundaryFaces.ts'
import { ELEMENT_TYPE_NAMES, ELEMENT_TYPES } from '../../../src/model/elementTypes.ts'
import type { Mesh, Vec3 } from '../../../src/model/model.ts'
import { probeModel, stressInElement } from '../../../workers/probe.ts'
import { stressField } from '../../helpers/mappedMeshes.ts'

/** σ_k = c_k + g_k · x: linear in position, so every element reproduces it exactly. */
const linear = (x: number, y: number, z: number): number[] =>
  [0, 1, 2, 3, 4, 5].map((k) => 10 * (k + 1) + (k - 2.5) * x + 3 * Math.sin(k) * y - (2 + k) * z)

/** A 2 × 2 × 1 box of `type` with every node moved by a fixed pseudo-random amount (seed 3). */
function jittered(type: (typeof ELEMENT_TYPE_NAMES)[number]): Mesh {
  const m = boxMesh({ nx: 2, ny: 2, nz: 1, lx: 2, ly: 2, lz: 1 }, type)
  let s = 3
  const rnd = (): number => { s = (s * 16807) % 2147483647; return s / 2147483647 - 0.5 }
  const coords = m.coords.map((v) => v + 0.08 * rnd())
  // Mid-edge nodes back onto their straight edges, so elements stay well shaped.
  for (const b of m.blocks) {
    const t = ELEMENT_TYPES[b.type], nn = t.nodeCount
    for (let e = 0; e < b.ids.length; e++) for (const [a, c, mid] of t.edges) {
      if (mid < 0) continue
      for (let k = 0; k < 3; k++) coords[3 * b.conn[e * nn + mid] + k] = (coords[3 * b.conn[e * nn + a] + k] + coords[3 * b.conn[e * nn + c] + k]) / 2
    }
  }
  return { ...m, coords }
}

describe.each(ELEMENT_TYPE_NAMES)('probe in %s elements', (type) => {
  const mesh = jittered(type)
  const stress = stressField(mesh, (x, y, z) => linear(x, y, z))
  const t = ELEMENT_TYPES[type]
  const b = mesh.blocks[0], nn = t.nodeCount
  const N = new Float64Array(nn), out = new Float64Array(6)

  it('reads a linear field back exactly inside, on faces, at corners (and at the apex)', () => {
    // Reference points: sampled inside, the corners (the apex among them), face centres.
    const refs: number[][] = []
    for (const [u, v, w] of [[0.2, 0.7, 0.4], [0.9, 0.1, 0.8], [0.5, 0.5, 0.5], [0.05, 0.95, 0.97]]) {
      const p = [0, 0, 0]; t.domain.fromUnitCube(p, u, v, w); refs.push(p)
    }
    for (let a = 0; a < t.cornerCount; a++) refs.push([...t.refCoords[a]])
    for (const f of t.faces) {
      const nc = f.length === 3 || f.length === 6 ? 3 : 4
      refs.push([0, 1, 2].map((k) => f.slice(0, nc).reduce((s, a) => s + t.refCoords[a][k], 0) / nc))
    }
    let worst = 0
    for (let e = 0; e < b.ids.length; e++) {
      for (const r of refs) {
        t.shapeValues(r[0], r[1], r[2], N)
        const x: Vec3 = [0, 0, 0]
        for (let a = 0; a < nn; a++) for (let k = 0; k < 3; k++) x[k] += N[a] * mesh.coords[3 * b.conn[e * nn + a] + k]
        stressInElement(mesh, stress, b.offset + e, x, out)
        const want = linear(...x)
        for (let k = 0; k < 6; k++) worst = Math.max(worst, Math.abs(out[k] - want[k]))
      }
    }
    expect(worst).toBeLessThan(1e-9)
  })

  it('a pick ray straight down hits the top surface and reads the field there', () => {
    // An unjittered box: its quadrilateral faces are flat, so the flat triangles the ray is
    // intersected with are the faces themselves (a warped face would put the hit off the element).
    const box = boxMesh({ nx: 2, ny: 2, nz: 1, lx: 2, ly: 2, lz: 1 }, type)
    const boxStress = stressField(box, (x, y, z) => linear(x, y, z))
    const faces = extractBoundaryFaces(box)
    for (const [px, py] of [[0.4, 0.3], [1.3, 1.7], [1.01, 0.52]]) {
      const hit = probeModel(box, boxStress, faces, null, { ray: { origin: [px, py, 5], direction: [0, 0, -1] }, section: null })
      expect(hit).not.toBeNull()
      expect(hit!.where).toBe('surface')
      const [x, y, z] = hit!.position
      expect(Math.abs(x - px) + Math.abs(y - py)).toBeLessThan(1e-12)
      expect(z).toBeCloseTo(1, 14)
      const want = linear(x, y, z)
      for (let k = 0; k < 6; k++) expect(Math.abs(hit!.stress[k] - want[k])).toBeLessThan(1e-9)
    }
  })
})

describe('probe errors', () => {
  it('an element index outside the mesh is an error, not a zero stress', () => {
    const mesh = boxMesh({ nx: 1, ny: 1, nz: 1, lx: 1, ly: 1, lz: 1 }, 'pyramid5')
    expect(() => stressInElement(mesh, new Float64Array(6 * mesh.nodeCount), 99, [0, 0, 0], new Float64Array(6))).toThrow(/element index 99/)
  })
})

describe('probe on the deformed shape', () => {
  // A shear displacement u = (γ z, 0, 0) (a homogeneous deformation; Malvern 1969, ch. 4) drawn at
  // scale s moves the top face z = 1 by s·γ along x: a ray straight down at x = px meets the drawn
  // top over the material point x = px − s·γ, and the probe reads that point.
  it('reads the material point under the drawn surface, and its displacement', () => {
    for (const type of ['hex8', 'tet10'] as const) {
      const box = boxMesh({ nx: 2, ny: 2, nz: 1, lx: 2, ly: 2, lz: 1 }, type)
      const stress = stressField(box, (x, y, z) => linear(x, y, z))
      const u = new Float64Array(3 * box.nodeCount)
      for (let i = 0; i < box.nodeCount; i++) u[3 * i] = 1e-3 * box.coords[3 * i + 2]
      const faces = extractBoundaryFaces(box)
      const s = 200, px = 1.3, py = 0.7
      const hit = probeModel(box, stress, faces, null, { ray: { origin: [px, py, 5], direction: [0, 0, -1] }, section: null, deformScale: s }, u)!
      expect(hit.position[0]).toBeCloseTo(px - s * 1e-3, 12)
      expect(hit.position[1]).toBeCloseTo(py, 12)
      expect(hit.position[2]).toBeCloseTo(1, 12)
      expect(hit.displacement![0]).toBeCloseTo(1e-3, 12)
      const want = linear(...hit.position)
      for (let k = 0; k < 6; k++) expect(Math.abs(hit.stress[k] - want[k])).toBeLessThan(1e-9)
    }
  })
})
