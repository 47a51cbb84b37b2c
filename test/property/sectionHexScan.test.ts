/**
 * The hexahedron scan of repeated cuts along one normal (scanHexes, sectionCut.ts: after a block
 * was cut twice along a normal, later cuts read one corner per element and skip those farther
 * from the plane than the measured spread of corner distances) against the plain scan of every
 * corner: each cut of a sequence along one normal is compared, bit for bit, with the same cut of
 * a fresh copy of the mesh (new arrays, so its one cut takes the plain scan). Seeded random
 * distorted hex8 blocks, rotated and moved far from the origin (a wider snap band), cut at random
 * offsets; a hex20 block and a mixed box (the scan takes every type with eight corners); and, on
 * a block whose node layers are flat, cuts exactly through a layer of nodes (the distances there
 * are snapped to 0, the case where the band matters).
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { createMesh } from '../../src/model/createMesh.ts'
import type { Mesh, Vec3 } from '../../src/model/model.ts'
import { mulberry32 } from '../../src/mechanics/seededRandom.ts'
import { anyBox, cutNodal, nodalStress, rotateModel, rotationFromQuaternion } from '../helpers/sectionMeshes.ts'

const SEED = 20261203

/** A fresh copy of a mesh (new coordinate and connectivity arrays). */
function copyOf(mesh: Mesh): Mesh {
  return createMesh(mesh.coords.slice(), mesh.blocks.map((b) => ({ type: b.type, conn: b.conn.slice() })))
}

/** The cut of `mesh` equals, bit for bit, the same cut of a fresh copy (whose one cut scans every corner). */
function expectPlainScan(mesh: Mesh, stress: Float64Array, point: Vec3, normal: Vec3): void {
  const fast = cutNodal(mesh, stress, [0, 0, 0], { point, normal }).result
  const plain = cutNodal(copyOf(mesh), stress, [0, 0, 0], { point, normal }).result
  expect(fast.cutElements).toBe(plain.cutElements)
  expect(fast.area).toBe(plain.area)
  expect(fast.force).toEqual(plain.force)
  expect(fast.moment).toEqual(plain.moment)
}

/** A rigid turn of a box by a random rotation, its stress from `field`, and a random unit normal maker. */
function turned(box: Mesh, rnd: () => number): { mesh: Mesh; stress: Float64Array; normal: () => Vec3 } {
  const q = [rnd() - 0.5, rnd() - 0.5, rnd() - 0.5, rnd() - 0.5]
  const { mesh } = rotateModel(box, new Float64Array(6 * box.nodeCount), rotationFromQuaternion(q[0], q[1], q[2], q[3]))
  const normal = (): Vec3 => {
    const v: Vec3 = [2 * rnd() - 1, 2 * rnd() - 1, 2 * rnd() - 1]
    const l = Math.hypot(...v)
    return [v[0] / l, v[1] / l, v[2] / l]
  }
  return { mesh, stress: nodalStress(mesh, field), normal }
}

/** A smooth, not polynomial stress field (invented for the test). */
const field = (x: number, y: number, z: number): number[] => [
  1 + Math.sin(x) * Math.cos(2 * y), 0.5 * x * z, -0.3 + y * y, 0.2 * Math.cos(z), 0.1 * x, 0.4 * y * z,
]

describe(`repeated hex8 cuts along one normal = the plain scan (seed ${SEED})`, () => {
  it('random distorted blocks, rotated and far from the origin, random normals and offsets', () => {
    console.log(`sectionHexScan: seed ${SEED}`)
    const rnd = mulberry32(SEED)
    let cuts = 0
    for (let model = 0; model < 6; model++) {
      const n = 3 + Math.floor(3 * rnd())
      const box = boxMesh({ nx: n, ny: n + 1, nz: n, lx: 1, ly: 1.3, lz: 0.8 }, 'hex8')
      const x = box.coords
      // every node jittered (boundary too), by up to 0.2 of a cell
      for (let i = 0; i < x.length; i++) x[i] += (0.2 / n) * (2 * rnd() - 1)
      const shift = model % 2 === 0 ? 1e5 : 0
      for (let i = 0; i < x.length; i++) x[i] += shift
      const { mesh, stress, normal: unit } = turned(box, rnd)
      // the block's centre, about which the planes pass
      const c = [0, 0, 0]
      for (let i = 0; i < mesh.nodeCount; i++) for (let k = 0; k < 3; k++) c[k] += mesh.coords[3 * i + k] / mesh.nodeCount
      for (let dir = 0; dir < 3; dir++) {
        const normal = unit()
        for (let cut = 0; cut < 8; cut++) {
          const s = 0.9 * (2 * rnd() - 1)
          expectPlainScan(mesh, stress, [c[0] + s * normal[0], c[1] + s * normal[1], c[2] + s * normal[2]], normal)
          cuts++
        }
      }
    }
    expect(cuts).toBe(6 * 3 * 8)
  })

  it('hex20 and a mixed box (hex8 beside other types), rotated, along random normals', () => {
    const rnd = mulberry32(SEED + 2)
    for (const kind of ['hex20', 'mixed'] as const) {
      const { mesh, stress, normal: unit } = turned(anyBox(kind, 4, 3, 3, 2, 1.5, 1), rnd)
      for (let dir = 0; dir < 2; dir++) {
        const normal = unit()
        for (let cut = 0; cut < 6; cut++) {
          const p = 1.2 * (2 * rnd() - 1)
          expectPlainScan(mesh, stress, [p * normal[0], p * normal[1], p * normal[2]], normal)
        }
      }
    }
  })

  it('a block with flat node layers, cut through its layers and between them along one normal', () => {
    const mesh = boxMesh({ nx: 4, ny: 3, nz: 5, lx: 2, ly: 1.5, lz: 2.5 }, 'hex8')
    const rnd = mulberry32(SEED + 1)
    // jitter within the layers only (x and y), so every layer z = k/2 stays a plane of nodes
    for (let i = 0; i < mesh.coords.length; i += 3) { mesh.coords[i] += 0.05 * (2 * rnd() - 1); mesh.coords[i + 1] += 0.05 * (2 * rnd() - 1) }
    const stress = nodalStress(mesh, field)
    const normal: Vec3 = [0, 0, 1]
    for (const z of [0.5, 1, 0.75, 1.5, 2, 0.5, 1.25, 2.5, 0, 1]) expectPlainScan(mesh, stress, [1, 0.7, z], normal)
  })
})
