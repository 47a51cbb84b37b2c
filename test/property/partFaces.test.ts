/**
 * Every part's boundary built at once (partBoundaries: the whole body's faces plus the faces
 * between parts, partFaces.ts) against the plain computation it replaces: one sub-mesh per part
 * (partSubmesh), its own boundary extraction, tractions and computeBodyBalance. On random
 * assemblies (boxes of six element types on a unit lattice, some sharing nodes, some meshed apart,
 * some boxes with a random part per element, half of them rotated; element-nodal and nodal
 * stress, a body force per part):
 * - each part's boundary faces are the sub-mesh's, as (element id, local face), in the same order;
 * - each part's volume, centroid, residual force and moment, and gross load equal the sub-mesh's
 *   to 1e-12 relative (the same additions in the same order: in practice to the last bit);
 * - the interfaces equal a plain pairing of the per-part faces (every pair compared: the same
 *   sorted corner nodes, or corners within INTERFACE_TOL of the face size), to 1e-12 relative;
 * - the engine's call (the load's faces, tractions and interface labels reused) equals the
 *   command line's (everything computed here).
 * Seeded; the seed is printed.
 */
import { describe, expect, it } from 'vitest'
import { facesBetweenParts } from '../../src/mechanics/partFaces.ts'
import { recordedPartPairs } from '../../src/mechanics/partPairs.ts'
import { INTERFACE_TOL, assemblyBalance, partBoundaries, partNumbers, partSides, partSubmesh } from '../../src/mechanics/partBalance.ts'
import type { AssemblyBalance } from '../../src/mechanics/partBalance.ts'
import { coincidentInterfaceFaces } from '../../src/mechanics/interfaceFaces.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { computeBodyBalance } from '../../src/mechanics/balanceAudit.ts'
import { faceCornerCount } from '../../src/mechanics/freeBody.ts'
import { elementIdOf } from '../../src/model/elementId.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import type { StressField } from '../../src/model/stressField.ts'
import type { Mesh, Vec3 } from '../../src/model/model.ts'
import type { BoundaryFaces, SurfaceTractions } from '../../src/mechanics/types.ts'
import { randomAssembly } from '../helpers/assemblies.ts'
import { mulberry32, rotateMesh, rotationFromUniforms } from '../helpers/rotation.ts'

const SEED = 20261203
/** A random assembly (assemblies.ts); some of its blocks then get a random part per element. */
function randomParts(rnd: () => number): { mesh: Mesh; merged: boolean } {
  const { mesh, merged } = randomAssembly(rnd)
  // parts within a box: faces between parts inside one block (shared nodes)
  for (const b of mesh.blocks) if (b.part && rnd() < 0.3) for (let e = 0; e < b.part.length; e++) if (rnd() < 0.5) b.part[e] = 4 + Math.floor(2 * rnd())
  return { mesh, merged }
}

/** Random element-nodal stress: each element's nodes their own values (the two sides of a face differ). */
function randomElementNodal(mesh: Mesh, rnd: () => number): StressField {
  let total = 0
  for (const b of mesh.blocks) total += b.conn.length
  const values = Float64Array.from({ length: 6 * total }, () => 2 * rnd() - 1)
  let next = 0
  const rows = mesh.blocks.map((b) => Int32Array.from({ length: b.conn.length }, () => next++))
  return { values, rows, layout: 'element-nodal' }
}

const near = (a: number, b: number, scale: number) => Math.abs(a - b) <= 1e-12 * Math.max(scale, 1e-300)
const nearVec = (a: readonly number[], b: readonly number[], scale: number) => a.every((v, i) => near(v, b[i], scale))

interface PartPlain { part: number; mesh: Mesh; faces: BoundaryFaces; tractions: SurfaceTractions }

/** The interfaces by their definition: every pair of two parts' faces compared. */
function plainInterfaces(coords: Float64Array, plain: readonly PartPlain[]): Map<string, { faces: number; area: number; fb: Vec3; fa: Vec3 }> {
  const corners = (f: BoundaryFaces, i: number) => Array.from(f.nodes.subarray(f.slots * i, f.slots * i + faceCornerCount(f.kind[i])))
  const at = (v: number) => [coords[3 * v], coords[3 * v + 1], coords[3 * v + 2]]
  const dist = (a: number[], b: number[]) => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2])
  const out = new Map<string, { faces: number; area: number; fb: Vec3; fa: Vec3 }>()
  for (let pa = 0; pa < plain.length; pa++) for (let pb = pa + 1; pb < plain.length; pb++) {
    const A = plain[pa], B = plain[pb]
    for (let i = 0; i < A.faces.count; i++) for (let j = 0; j < B.faces.count; j++) {
      const ca = corners(A.faces, i), cb = corners(B.faces, j)
      if (ca.length !== cb.length) continue
      const sameNodes = [...ca].sort((x, y) => x - y).join() === [...cb].sort((x, y) => x - y).join()
      const tol = INTERFACE_TOL * Math.sqrt(Math.min(A.faces.area[i], B.faces.area[j]))
      const coincide = !sameNodes && dist(Array.from(A.faces.centroid.subarray(3 * i, 3 * i + 3)), Array.from(B.faces.centroid.subarray(3 * j, 3 * j + 3))) <= tol &&
        ca.every((u) => cb.some((v) => dist(at(u), at(v)) <= tol))
      if (!sameNodes && !coincide) continue
      const key = `${A.part},${B.part}`
      const acc = out.get(key) ?? { faces: 0, area: 0, fb: [0, 0, 0], fa: [0, 0, 0] }
      acc.faces++
      acc.area += B.faces.area[j]
      for (let c = 0; c < 3; c++) { acc.fb[c] += B.tractions.force[3 * j + c]; acc.fa[c] += A.tractions.force[3 * i + c] }
      out.set(key, acc)
    }
  }
  return out
}

describe(`every part's boundary at once against one extraction per part (seed ${SEED})`, () => {
  console.log(`part faces seed ${SEED}`)
  const rnd = mulberry32(SEED)
  for (let trial = 0; trial < 30; trial++) {
    const { mesh: flat, merged } = randomParts(rnd)
    const mesh = trial % 2 ? rotateMesh(flat, rotationFromUniforms(rnd(), rnd(), rnd())) : flat
    const nodal = trial % 3 === 0
    it(`trial ${trial}: ${mesh.elementCount} elements, ${partNumbers(mesh).length} parts, ${merged ? 'shared nodes' : 'meshed apart'}, ${nodal ? 'nodal' : 'element-nodal'} stress`, () => {
      const field = nodal
        ? nodalStressField(mesh, Float64Array.from({ length: 6 * mesh.nodeCount }, () => 2 * rnd() - 1))
        : randomElementNodal(mesh, rnd)
      const numbers = partNumbers(mesh)
      const rho = new Map(numbers.map((p): [number, Vec3] => [p, [rnd() - 0.5, rnd() - 0.5, rnd() - 0.5]]))
      const bodyForce = (p: number): Vec3 => rho.get(p)!
      // the plain computation: one sub-mesh per part
      const plain: PartPlain[] = numbers.map((p) => {
        const sub = partSubmesh(mesh, field, p)
        const faces = extractBoundaryFaces(sub.mesh)
        return { part: p, mesh: sub.mesh, faces, tractions: computeSurfaceTractions(allocateSurfaceTractions(faces), sub.mesh, sub.field, faces) }
      })
      // the engine's call: the whole body's faces, tractions and interface labels given
      const faces = extractBoundaryFaces(mesh)
      const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, field, faces)
      const facePart = Int32Array.from(faces.elem, (g) => { const b = mesh.blocks.find((x) => g >= x.offset && g < x.offset + x.ids.length)!; return b.part ? b.part[g - b.offset] : 0 })
      const against = coincidentInterfaceFaces(mesh.coords, faces, facePart)
      const body = { faces, tractions, against }

      // faces: the same (element id, local face), in the same order
      const bounds = partBoundaries(mesh, field, body)
      expect(bounds.numbers).toEqual(numbers)
      plain.forEach((pp, k) => {
        const sides = partSides(bounds, k)
        const got = Array.from(sides, (s) => {
          const [set, f] = s < bounds.outer.count ? [bounds.outer, s] : [bounds.inner, s - bounds.outer.count]
          return `${elementIdOf(mesh, set.elem[f])}:${set.localFace[f]}`
        })
        const want = Array.from({ length: pp.faces.count }, (_, f) => `${elementIdOf(pp.mesh, pp.faces.elem[f])}:${pp.faces.localFace[f]}`)
        expect(got).toEqual(want)
      })

      // balances: the same to 1e-12 relative
      const check = (asm: AssemblyBalance) => {
        expect(asm.parts.map((p) => p.part)).toEqual(numbers)
        plain.forEach((pp, k) => {
          const want = computeBodyBalance(pp.mesh, pp.faces, pp.tractions, bodyForce(pp.part))
          const got = asm.parts[k]
          expect(got.elements).toBe(pp.mesh.elementCount)
          const L = Math.cbrt(Math.abs(want.volume)) + Math.max(...want.centroid.map(Math.abs))
          expect(near(got.volume, want.volume, Math.abs(want.volume))).toBe(true)
          expect(nearVec(got.balance.about, want.about, L)).toBe(true)
          expect(near(got.balance.gross, want.gross, want.gross)).toBe(true)
          expect(nearVec(got.balance.force, want.force, want.gross)).toBe(true)
          expect(nearVec(got.balance.moment, want.moment, want.gross * L)).toBe(true)
          expect(near(got.balance.relative, want.relative, 1)).toBe(true)
        })
        // interfaces: the plain pairing of the per-part faces
        const ref = plainInterfaces(mesh.coords, plain)
        expect(asm.interfaces.map((i) => i.parts.join())).toEqual([...ref.keys()])
        for (const i of asm.interfaces) {
          const r = ref.get(i.parts.join())!
          expect(i.faces).toBe(r.faces)
          expect(near(i.area, r.area, r.area)).toBe(true)
          expect(nearVec(i.force, r.fb, i.gross)).toBe(true)
          expect(nearVec(i.reverseForce, r.fa, i.gross)).toBe(true)
        }
      }
      const engine = assemblyBalance(mesh, field, bodyForce, new Map(), body)
      const command = assemblyBalance(mesh, field, bodyForce)
      check(engine)
      check(command)
      expect(command.interfaces).toEqual(engine.interfaces)
      expect(command.parts).toEqual(engine.parts)
    })
  }

  // The faces between parts from the pairs the extraction recorded (partPairs.ts) against the
  // matching by node marks (partFaces.ts) that a mesh without a record gets: the same sides, in
  // the same order, with the same twins, bit for bit.
  it('the faces between parts recorded by the extraction equal those matched by node marks, bit for bit', () => {
    const rnd = mulberry32(SEED + 1)
    let compared = 0
    for (let trial = 0; trial < 30; trial++) {
      const { mesh } = randomParts(rnd)
      const plain = { ...mesh }
      const marked = facesBetweenParts(plain)
      expect(recordedPartPairs(plain)).toBeNull()
      extractBoundaryFaces(mesh)
      const pairs = recordedPartPairs(mesh)
      if (partNumbers(mesh).length < 2) { expect(pairs).toBeNull(); expect(marked.faces.count).toBe(0); continue }
      expect(pairs, `trial ${trial}`).not.toBeNull()
      expect(pairs!.length).toBe(marked.faces.count)
      const recorded = facesBetweenParts(mesh)
      const { faces: a, twin: ta } = marked, { faces: b, twin: tb } = recorded
      expect(b.count).toBe(a.count)
      expect(Array.from(b.elem)).toEqual(Array.from(a.elem))
      expect(Array.from(b.localFace)).toEqual(Array.from(a.localFace))
      expect(Array.from(b.kind)).toEqual(Array.from(a.kind))
      expect(Array.from(b.nodes)).toEqual(Array.from(a.nodes))
      expect(Array.from(b.area)).toEqual(Array.from(a.area))
      expect(Array.from(b.normal)).toEqual(Array.from(a.normal))
      expect(Array.from(tb)).toEqual(Array.from(ta))
      compared += a.count
    }
    expect(compared).toBeGreaterThan(100)
  })
})
