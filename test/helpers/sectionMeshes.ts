/**
 * Meshes and fields for the section tests: uniform and analytic nodal stress, rigid rotation of a
 * model, merged multi-type blocks, and a thick-walled cylinder (annulus × height) in hex8 or tet4.
 * Geometry only; the expected values live beside each check in the tests.
 */
import { boxMesh } from '../../src/model/boxMesh.ts'
import { createMesh } from '../../src/model/createMesh.ts'
import type { BlockInput } from '../../src/model/createMesh.ts'
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import type { Mesh, Vec3 } from '../../src/model/model.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import type { CutSectionOptions } from '../../src/mechanics/sectionCut.ts'
import { sweepSections } from '../../src/mechanics/sectionSweep.ts'
import type { SweepOptions } from '../../src/mechanics/sectionSweep.ts'
import type { SectionPlane } from '../../src/mechanics/types.ts'

import { rotateMesh, rotateStressField, rotateVec } from './rotation.ts'
import type { Mat3 } from './rotation.ts'
export { rotateVec }
export type { Mat3 }

/** Nodal stress from a function of position (xx, yy, zz, xy, yz, xz per node). */
export function nodalStress(mesh: Mesh, f: (x: number, y: number, z: number) => readonly number[]): Float64Array {
  const s = new Float64Array(6 * mesh.nodeCount)
  for (let i = 0; i < mesh.nodeCount; i++) {
    const v = f(mesh.coords[3 * i], mesh.coords[3 * i + 1], mesh.coords[3 * i + 2])
    for (let c = 0; c < 6; c++) s[6 * i + c] = v[c]
  }
  return s
}

export function uniformStress(mesh: Mesh, s6: readonly number[]): Float64Array {
  return nodalStress(mesh, () => s6)
}

/** σm for a stress 6-vector (Cauchy's formula). */
export function tractionOf(s: readonly number[], m: readonly number[]): Vec3 {
  return [
    s[0] * m[0] + s[3] * m[1] + s[5] * m[2],
    s[3] * m[0] + s[1] * m[1] + s[4] * m[2],
    s[5] * m[0] + s[4] * m[1] + s[2] * m[2],
  ]
}

/** Rotation matrix (row-major) from a unit quaternion made of four numbers (normalised here). */
export function rotationFromQuaternion(q0: number, q1: number, q2: number, q3: number): Mat3 {
  const l = Math.hypot(q0, q1, q2, q3)
  const w = q0 / l, x = q1 / l, y = q2 / l, z = q3 / l
  return [
    1 - 2 * (y * y + z * z), 2 * (x * y - w * z), 2 * (x * z + w * y),
    2 * (x * y + w * z), 1 - 2 * (x * x + z * z), 2 * (y * z - w * x),
    2 * (x * z - w * y), 2 * (y * z + w * x), 1 - 2 * (x * x + y * y),
  ]
}

/** The same body turned rigidly by Q: coordinates x' = Qx, stress σ' = QσQᵀ. */
export function rotateModel(mesh: Mesh, stress: Float64Array, Q: Mat3): { mesh: Mesh; stress: Float64Array } {
  return { mesh: rotateMesh(mesh, Q), stress: rotateStressField(Q, stress) }
}

/** Scales every coordinate by k (for the scale-invariance checks). */
export function scaleMesh(mesh: Mesh, k: number): Mesh {
  return { ...mesh, coords: mesh.coords.map((v) => v * k) }
}

/**
 * Several meshes joined into one with coincident nodes merged (by coordinates rounded to 1e-9 of
 * the overall size), one block per input block. Used for the mixed-type box.
 */
export function mergeMeshes(meshes: readonly Mesh[]): Mesh {
  let size = 0
  for (const m of meshes) for (const v of m.coords) size = Math.max(size, Math.abs(v))
  const tol = 1e-9 * (size || 1)
  const key = (x: number, y: number, z: number) => `${Math.round(x / tol)},${Math.round(y / tol)},${Math.round(z / tol)}`
  const index = new Map<string, number>()
  const coords: number[] = []
  const blocks: BlockInput[] = []
  for (const m of meshes) {
    const map = new Int32Array(m.nodeCount)
    for (let i = 0; i < m.nodeCount; i++) {
      const k = key(m.coords[3 * i], m.coords[3 * i + 1], m.coords[3 * i + 2])
      let j = index.get(k)
      if (j === undefined) {
        j = coords.length / 3
        index.set(k, j)
        coords.push(m.coords[3 * i], m.coords[3 * i + 1], m.coords[3 * i + 2])
      }
      map[i] = j
    }
    for (const b of m.blocks) blocks.push({ type: b.type, conn: b.conn.map((n) => map[n]) })
  }
  return createMesh(Float64Array.from(coords), blocks)
}

/**
 * The box [0,lx]×[0,ly]×[0,lz] of `nx` cells in x made of three slabs of hex8, wedge6 and tet4
 * (nodes shared where slabs meet; the tet4 slab's faces split the neighbouring quads, which is a
 * geometric match, enough for the uniform-stress checks).
 */
export function mixedBox(nx: number, ny: number, nz: number, lx: number, ly: number, lz: number): Mesh {
  const a = Math.max(1, Math.floor(nx / 3)), b = Math.max(1, Math.floor(nx / 3)), c = Math.max(1, nx - a - b)
  const h = lx / (a + b + c)
  return mergeMeshes([
    boxMesh({ nx: a, ny, nz, lx: a * h, ly, lz }, 'hex8'),
    boxMesh({ nx: b, ny, nz, lx: b * h, ly, lz, x0: a * h }, 'wedge6'),
    boxMesh({ nx: c, ny, nz, lx: c * h, ly, lz, x0: (a + b) * h }, 'tet4'),
  ])
}

/** A box mesh of any type, or 'mixed'. */
export type BoxKind = ElementTypeName | 'mixed'
export function anyBox(kind: BoxKind, nx: number, ny: number, nz: number, lx: number, ly: number, lz: number): Mesh {
  return kind === 'mixed' ? mixedBox(nx, ny, nz, lx, ly, lz) : boxMesh({ nx, ny, nz, lx, ly, lz }, kind)
}

const KUHN: readonly (readonly number[])[] = [
  [0, 1, 2, 6], [0, 1, 5, 6], [0, 3, 2, 6], [0, 3, 7, 6], [0, 4, 5, 6], [0, 4, 7, 6],
]

/**
 * Thick-walled cylinder a ≤ r ≤ b, 0 ≤ z ≤ lz around the z axis: nr × nt × nz cells of hex8
 * (straight edges, so the cross-section is the annulus between two regular nt-gons), or each
 * cell split into six tet4 (Kuhn's split, oriented positive).
 */
export function cylinderMesh(a: number, b: number, lz: number, nr: number, nt: number, nz: number, type: 'hex8' | 'tet4'): Mesh {
  const NR = nr + 1, NZ = nz + 1
  const node = (i: number, j: number, k: number) => i + NR * ((j % nt) + nt * k)
  const coords = new Float64Array(3 * NR * nt * NZ)
  for (let k = 0; k < NZ; k++) for (let j = 0; j < nt; j++) for (let i = 0; i < NR; i++) {
    const r = a + ((b - a) * i) / nr, t = (2 * Math.PI * j) / nt
    const p = node(i, j, k)
    coords[3 * p] = r * Math.cos(t); coords[3 * p + 1] = r * Math.sin(t); coords[3 * p + 2] = (lz * k) / nz
  }
  const hex: number[] = []
  for (let k = 0; k < nz; k++) for (let j = 0; j < nt; j++) for (let i = 0; i < nr; i++) {
    // radial × tangential = +z, so this bottom face is counter-clockwise seen from above
    hex.push(node(i, j, k), node(i + 1, j, k), node(i + 1, j + 1, k), node(i, j + 1, k),
      node(i, j, k + 1), node(i + 1, j, k + 1), node(i + 1, j + 1, k + 1), node(i, j + 1, k + 1))
  }
  if (type === 'hex8') return createMesh(coords, [{ type: 'hex8', conn: Int32Array.from(hex) }])
  const tets: number[] = []
  for (let e = 0; e < hex.length / 8; e++) {
    for (const t of KUHN) {
      const q = t.map((l) => hex[8 * e + l])
      if (tetVolume(coords, q) < 0) { const s = q[2]; q[2] = q[3]; q[3] = s }
      tets.push(...q)
    }
  }
  return createMesh(coords, [{ type: 'tet4', conn: Int32Array.from(tets) }])
}

function tetVolume(x: Float64Array, q: readonly number[]): number {
  const [a, b, c, d] = q.map((n) => 3 * n)
  const u = [x[b] - x[a], x[b + 1] - x[a + 1], x[b + 2] - x[a + 2]]
  const v = [x[c] - x[a], x[c + 1] - x[a + 1], x[c + 2] - x[a + 2]]
  const w = [x[d] - x[a], x[d + 1] - x[a + 1], x[d + 2] - x[a + 2]]
  return (u[1] * v[2] - u[2] * v[1]) * w[0] + (u[2] * v[0] - u[0] * v[2]) * w[1] + (u[0] * v[1] - u[1] * v[0]) * w[2]
}

export const norm = (v: readonly number[]) => Math.hypot(v[0], v[1], v[2])
export const sub = (a: readonly number[], b: readonly number[]): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]]

/** cutSection on nodal stress (the tests' common case): the field's rows are the connectivity. */
export function cutNodal(mesh: Mesh, stress: Float64Array, bodyForce: Vec3, plane: SectionPlane, options?: CutSectionOptions) {
  return cutSection(mesh, nodalStressField(mesh, stress), bodyForce, plane, options)
}

/** sweepSections on nodal stress. */
export function sweepNodal(mesh: Mesh, stress: Float64Array, bodyForce: Vec3, normal: Vec3, from: number, to: number, count: number, options?: SweepOptions) {
  return sweepSections(mesh, nodalStressField(mesh, stress), bodyForce, normal, from, to, count, options)
}
