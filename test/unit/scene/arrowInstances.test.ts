import { describe, expect, it } from 'vitest'
import { InstancedBufferAttribute, InstancedMesh, Matrix4, Vector3, BufferGeometry, MeshBasicMaterial } from 'three'
import { writeArrowInstances } from '../../../src/scene/arrowInstances.ts'
import type { ArrowBuffers } from '../../../workers/protocol.ts'

/** Where the unit arrow's tail (0,0,0) and tip (0,1,0) land under instance i's matrix. */
function ends(mesh: InstancedMesh, i: number): { tail: Vector3; tip: Vector3 } {
  const m = new Matrix4()
  mesh.getMatrixAt(i, m)
  return { tail: new Vector3(0, 0, 0).applyMatrix4(m), tip: new Vector3(0, 1, 0).applyMatrix4(m) }
}

describe('writeArrowInstances', () => {
  // Two arrows at (1, 2, 3) on a face with outward normal +z: one pulls (t along +z, 10 stress
  // units), one pushes (t along -z, 5 units). Largest drawn length 2.
  const arrows = {
    mode: 'full', maxMagnitude: 10,
    origins: new Float32Array([1, 2, 3, 1, 2, 3]),
    vectors: new Float32Array([0, 0, 10, 0, 0, -5]),
    magnitudes: new Float32Array([10, 5]),
    normals: new Float32Array([0, 0, 1, 0, 0, 1]),
    normalTraction: new Float32Array([10, -5]),
  } as ArrowBuffers & { normals: Float32Array }
  const mesh = new InstancedMesh(new BufferGeometry(), new MeshBasicMaterial(), 2)
  mesh.instanceColor = new InstancedBufferAttribute(new Float32Array(6), 3)
  writeArrowInstances(mesh, arrows, 2, 0.05, 'viridis', [-10, 10])

  it('a pulling arrow starts at its point; length ∝ magnitude', () => {
    const { tail, tip } = ends(mesh, 0)
    expect(tail.distanceTo(new Vector3(1, 2, 3))).toBeLessThan(1e-6)
    expect(tip.distanceTo(new Vector3(1, 2, 5))).toBeLessThan(1e-6)
  })

  it('a pushing arrow ends at its point, outside the body', () => {
    const { tail, tip } = ends(mesh, 1)
    expect(tip.distanceTo(new Vector3(1, 2, 3))).toBeLessThan(1e-6)
    expect(tail.distanceTo(new Vector3(1, 2, 4))).toBeLessThan(1e-6)
  })

  it('colours by signed normal traction over the range: +10 of ±10 gets the top entry (viridis #fde725, from memory)', () => {
    const c = mesh.instanceColor!.array
    expect(Math.round(c[0] * 255)).toBe(0xfd)
    expect(Math.round(c[1] * 255)).toBe(0xe7)
    expect(Math.round(c[2] * 255)).toBe(0x25)
    // −5 of ±10 lies a quarter of the way up: not the top entry.
    expect(Math.round(c[3] * 255)).not.toBe(0xfd)
  })

  it('a shared reference magnitude sets the length: 10 units at reference 20 are drawn half as long', () => {
    const m2 = new InstancedMesh(new BufferGeometry(), new MeshBasicMaterial(), 2)
    writeArrowInstances(m2, arrows, 2, 0.05, 'viridis', null, 20)
    const { tail, tip } = ends(m2, 0)
    expect(tip.distanceTo(tail)).toBeCloseTo(1, 6)
  })
})
