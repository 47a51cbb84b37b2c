import { describe, expect, it } from 'vitest'
import { nodalStressField } from '../../src/model/stressField.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { mulberry32 } from '../../src/mechanics/seededRandom.ts'
import { ELEMENT_TYPE_NAMES, ELEMENT_TYPES } from '../../src/model/elementTypes.ts'
import type { Vec3 } from '../../src/model/model.ts'
import {
  cross, EXACT_FIELDS, exactFields, exactPolygon, integratePolygonExact, singleElement, stressOf,
} from '../helpers/sectionElements.ts'
import { cutNodal, nodalStress, norm, rotateModel, rotateVec } from '../helpers/sectionMeshes.ts'
import { rotationFromUniforms } from '../helpers/rotation.ts'

// Section integrals by each element's own shape functions (issue 18): a field the element
// represents exactly must be integrated exactly over any section of an element whose map is
// affine, for every type of the registry.
const ZERO: Vec3 = [0, 0, 0]
const SEED = 20261218

describe('single elements: the closed forms of issue 18', () => {
  // Unit cube [0,1]³ as one element: x = ξ/2 + 1/2.
  const half: Vec3 = [0.5, 0.5, 0.5]
  it('hex8, σzz = x·y (trilinear): the plane z = 0.5 carries ∫∫ x y dx dy = 1/4', () => {
    const mesh = singleElement('hex8', half, half)
    const { result: r } = cutNodal(mesh, nodalStress(mesh, (x, y) => [0, 0, x * y, 0, 0, 0]), ZERO, { point: [0, 0, 0.5], normal: [0, 0, 1] })
    expect(Math.abs(r.force[2] - 0.25)).toBeLessThan(1e-14) // elementary calculus
  })
  it('hex20, σzz = x²: the plane z = 0.5 carries ∫₀¹ x² dx = 1/3, its bottom face with normal -z -1/3', () => {
    const mesh = singleElement('hex20', half, half)
    const s = nodalStress(mesh, (x) => [0, 0, x * x, 0, 0, 0])
    expect(Math.abs(cutNodal(mesh, s, ZERO, { point: [0, 0, 0.5], normal: [0, 0, 1] }).result.force[2] - 1 / 3)).toBeLessThan(1e-14)
    expect(Math.abs(cutNodal(mesh, s, ZERO, { point: [0, 0, 0], normal: [0, 0, -1] }).result.force[2] + 1 / 3)).toBeLessThan(1e-14)
  })
  it('tet10 unit tetrahedron, σzz = x²: face z = 0 (normal -z) -1/12, plane z = 0.25 0.75⁴/12', () => {
    const mesh = singleElement('tet10', [1, 1, 1], ZERO)
    const s = nodalStress(mesh, (x) => [0, 0, x * x, 0, 0, 0])
    // ∫ x² over the triangle x, y ≥ 0, x + y ≤ c is c⁴/12 (elementary calculus)
    expect(Math.abs(cutNodal(mesh, s, ZERO, { point: [0, 0, 0], normal: [0, 0, -1] }).result.force[2] + 1 / 12)).toBeLessThan(1e-14)
    expect(Math.abs(cutNodal(mesh, s, ZERO, { point: [0, 0, 0.25], normal: [0, 0, 1] }).result.force[2] - 0.75 ** 4 / 12)).toBeLessThan(1e-14)
  })
  it('hex20, σzz = x²yz (serendipity, degree 4): its moments need the degree-5 rule', () => {
    // plane x = 0.6, normal +x: t = σ e_x has no z part; take σxz = x² y z instead, so t_z = x² y z
    // and M about the centroid (0.6, 0.5, 0.5) has M_y = -∫ (x-cx) t_z... = 0 on the plane and
    // M_x = ∫ (y - 1/2) t_z dA = 0.36 ∫∫ (y - 1/2) y z dy dz = 0.36 · (1/12) · (1/2) = 0.015.
    const mesh = singleElement('hex20', half, half)
    const s = nodalStress(mesh, (x, y, z) => [0, 0, 0, 0, 0, x * x * y * z])
    const r = cutNodal(mesh, s, ZERO, { point: [0.6, 0, 0], normal: [1, 0, 0] }).result
    expect(Math.abs(r.force[2] - 0.36 / 4)).toBeLessThan(1e-14) // 0.36 ∫∫ y z = 0.36/4
    expect(Math.abs(r.moment[0] - 0.015)).toBeLessThan(1e-14)
  })
})

describe('every registered type has exactly represented test fields', () => {
  it.each([...ELEMENT_TYPE_NAMES])('%s', (type) => {
    // a new type must say which fields its shape functions hold (test/helpers/sectionElements.ts)
    expect(EXACT_FIELDS[type], `add '${type}' to EXACT_FIELDS in test/helpers/sectionElements.ts`).toBeDefined()
  })
})

/** Planes through one element: each face (outward normal), oblique interior planes, planes through node triples. */
function planesOf(type: (typeof ELEMENT_TYPE_NAMES)[number], mesh: ReturnType<typeof singleElement>, rnd: () => number) {
  const topo = ELEMENT_TYPES[type], x = mesh.coords
  const X = (a: number): Vec3 => [x[3 * a], x[3 * a + 1], x[3 * a + 2]]
  const centre = [0, 1, 2].map((k) => Array.from({ length: topo.cornerCount }, (_, a) => X(a)[k]).reduce((s, v) => s + v, 0) / topo.cornerCount) as Vec3
  const planes: { what: string; point: Vec3; normal: Vec3 }[] = []
  topo.faces.forEach((f, i) => {
    const a = X(f[0]), b = X(f[1]), c = X(f[2])
    const n = cross([b[0] - a[0], b[1] - a[1], b[2] - a[2]], [c[0] - a[0], c[1] - a[1], c[2] - a[2]])
    planes.push({ what: `face ${i}`, point: a, normal: n })
  })
  for (let k = 0; k < 3; k++) {
    const n: Vec3 = [2 * rnd() - 1, 2 * rnd() - 1, 2 * rnd() - 1]
    const p: Vec3 = [0, 1, 2].map((j) => centre[j] + 0.05 * (2 * rnd() - 1)) as Vec3
    planes.push({ what: `oblique ${k}`, point: p, normal: n })
  }
  // through three nodes (corners and mid-edge nodes) that are not all on one face
  let tries = 0
  while (planes.filter((q) => q.what.startsWith('nodes')).length < 3 && tries++ < 200) {
    const i = Math.floor(rnd() * topo.nodeCount), j = Math.floor(rnd() * topo.nodeCount), k = Math.floor(rnd() * topo.nodeCount)
    const A = X(i), B = X(j), C = X(k)
    const n = cross([B[0] - A[0], B[1] - A[1], B[2] - A[2]], [C[0] - A[0], C[1] - A[1], C[2] - A[2]])
    if (norm(n) < 1e-6) continue
    const d = (a: number) => { const q = X(a); return (q[0] - A[0]) * n[0] + (q[1] - A[1]) * n[1] + (q[2] - A[2]) * n[2] }
    const signs = Array.from({ length: topo.cornerCount }, (_, a) => d(a))
    if (!(signs.some((v) => v < -1e-9 * norm(n)) && signs.some((v) => v > 1e-9 * norm(n)))) continue // a face plane or outside
    planes.push({ what: `nodes ${i},${j},${k}`, point: A, normal: n })
  }
  return planes
}

describe.each([...ELEMENT_TYPE_NAMES])(`%s element, exactly represented fields (seed ${SEED})`, (type) => {
  // The reference (test/helpers/sectionElements.ts): the exact polygon of plane ∩ element and a
  // collapsed Gauss product rule exact to degree 10 — exact polynomial integrals.
  const fields = exactFields(type)
  const rnd = mulberry32(SEED + type.length * 97 + type.charCodeAt(0))
  const mesh = singleElement(type, [1.3, 0.8, 1.1], [0.2, -0.4, 0.7])
  const coef = Array.from({ length: 6 }, () => fields.map(() => 2 * rnd() - 1))
  const sigma = stressOf(fields, coef)
  const stress = nodalStress(mesh, sigma)
  const planes = planesOf(type, mesh, rnd)
  const Q = rotationFromUniforms(rnd(), rnd(), rnd())
  const rot = rotateModel(mesh, stress, Q)

  it.each(planes.map((p) => [p.what, p] as const))('%s: force and moment exact to 1e-12, and turned by a random rotation', (_what, plane) => {
    const m = plane.normal.map((v) => v / norm(plane.normal)) as Vec3
    const poly = exactPolygon(mesh, plane.point, m)
    expect(poly.length).toBeGreaterThanOrEqual(3)
    const ref = integratePolygonExact(poly, m, sigma)
    const { result: r } = cutNodal(mesh, stress, ZERO, plane)
    const L = 1.5, S = Math.max(...stress.map(Math.abs)) // the size of the nodal stress
    expect(Math.abs(r.area - ref.area)).toBeLessThan(1e-12 * ref.area)
    for (let k = 0; k < 3; k++) {
      expect(Math.abs(r.force[k] - ref.force[k]), `force ${k}`).toBeLessThan(1e-12 * S * ref.area)
      expect(Math.abs(r.moment[k] - ref.moment[k]), `moment ${k}`).toBeLessThan(1e-12 * S * ref.area * L)
      expect(Math.abs(r.centroid[k] - ref.centroid[k])).toBeLessThan(1e-12 * L)
    }
    expect(r.unmappedPoints).toBe(0)
    // the same body turned: x' = Qx, σ' = QσQᵀ; the element stays affine, the figures turn with it
    const t = cutNodal(rot.mesh, rot.stress, ZERO, { point: rotateVec(Q, plane.point), normal: rotateVec(Q, m) }).result
    const QF = rotateVec(Q, ref.force), QM = rotateVec(Q, ref.moment)
    for (let k = 0; k < 3; k++) {
      expect(Math.abs(t.force[k] - QF[k]), `turned force ${k}`).toBeLessThan(1e-12 * S * ref.area)
      expect(Math.abs(t.moment[k] - QM[k]), `turned moment ${k}`).toBeLessThan(1e-12 * S * ref.area * L)
    }
  })

  // Cut and audit on the same boundary face: the audit's face integral (tractions.ts, the face's
  // own rule) and the cut's section on the plane of that face (d = 0 counts as the + side, so the
  // element lies on the - side and the section is the face) integrate the same traction σn with
  // the same shape functions; any nodal values (the face's interpolant is a polynomial of the
  // face's degree, which both rules integrate exactly) must give the same force and moment.
  it('cut on each face = the audit of that face, for arbitrary nodal stress', () => {
    const s = new Float64Array(6 * mesh.nodeCount).map(() => 2 * rnd() - 1)
    const faces = extractBoundaryFaces(mesh)
    const tr = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, nodalStressField(mesh, s), faces)
    expect(faces.count).toBe(ELEMENT_TYPES[type].faces.length)
    for (let f = 0; f < faces.count; f++) {
      const lf = faces.localFace[f], fn = ELEMENT_TYPES[type].faces[lf]
      const x = mesh.coords
      const point: Vec3 = [x[3 * fn[0]], x[3 * fn[0] + 1], x[3 * fn[0] + 2]]
      const normal: Vec3 = [faces.normal[3 * f], faces.normal[3 * f + 1], faces.normal[3 * f + 2]]
      const { result: r } = cutNodal(mesh, s, ZERO, { point, normal })
      const F: Vec3 = [tr.force[3 * f], tr.force[3 * f + 1], tr.force[3 * f + 2]]
      // audit moment is about the origin: M_c = M_0 - c × F
      const cF = cross(r.centroid, F)
      const Mc = [tr.moment[3 * f] - cF[0], tr.moment[3 * f + 1] - cF[1], tr.moment[3 * f + 2] - cF[2]]
      expect(Math.abs(r.area - faces.area[f])).toBeLessThan(1e-12 * faces.area[f])
      for (let k = 0; k < 3; k++) {
        expect(Math.abs(r.force[k] - F[k]), `face ${f} force ${k}`).toBeLessThan(1e-12 * 6 * faces.area[f])
        expect(Math.abs(r.moment[k] - Mc[k]), `face ${f} moment ${k}`).toBeLessThan(1e-12 * 6 * faces.area[f] * 1.5)
      }
    }
  })

  // A linear stress field with zero divergence and symmetric σ is in equilibrium without body
  // force (Cauchy's equations, any continuum-mechanics text): every cut-off piece balances in
  // force and in moment, and every type represents linear fields exactly.
  it('free body of a balanced linear field: force and moment residuals vanish', () => {
    const s = nodalStress(mesh, (x, y, z) => [y + z, x + z, x + y, z, x, y])
    for (const plane of planes) {
      const { result: r } = cutNodal(mesh, s, ZERO, plane)
      if (r.empty) continue
      expect(r.freeBody.relative, plane.what).toBeLessThan(1e-12)
      expect(r.freeBody.momentRelative, plane.what).toBeLessThan(1e-12)
    }
  })
})
