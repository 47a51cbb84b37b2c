import { CylinderGeometry, InstancedBufferAttribute, InstancedMesh, Matrix4, Mesh, MeshBasicMaterial } from 'three'
import type { Object3D } from 'three'
import { unitArrowGeometry } from './arrowGeometry.ts'
import { createArrowMaterial } from './arrowMaterial.ts'
import { rawColour } from './rawColour.ts'
import { flatMaterial } from './SectionHandle.tsx'
import { HALO, HANDLE } from './sceneLook.ts'
import { textSprite } from './textSprite.ts'

/**
 * Stand-ins for what switching the section on draws for the first time, drawn in the surface's
 * warm-up frames after the first picture (SurfaceMesh.tsx), so that the switch finds their
 * shaders compiled. On software WebGL a new shader and render state costs a compile in the GPU
 * process, which the main thread waits for when it reads the frame back: without these, the frame
 * that first shows a section at 10^7 elements took about 0.2 s longer than the same frame later
 * (measured). Each stand-in has the material, render state and vertex layout of the real object
 * (the handle's flat colour drawn over everything on both sides, the section triad's arrow, its
 * labels' sprite, the section arrows' instanced material without clipping planes), scaled to
 * nothing, so it draws no pixel. `step` 1 goes with the surface's back-pass warm frame, 2 with
 * the section face's. They are made once and kept for the page's life, never disposed: three.js
 * deletes a shader program when the last material using it is disposed, and the real objects
 * would then compile it again.
 */
export function sectionWarmObjects(step: 1 | 2): readonly Object3D[] {
  return (made[step] ??= makeObjects(step))
}
const made: { 1?: Object3D[]; 2?: Object3D[] } = {}

function makeObjects(step: 1 | 2): Object3D[] {
  const nothing = new Matrix4().makeScale(0, 0, 0)
  if (step === 1) {
    const railGeometry = new CylinderGeometry(1, 1, 1, 8, 1, true)
    const handle = new Mesh(railGeometry, flatMaterial(HANDLE))
    const triadMaterial = new MeshBasicMaterial({ color: rawColour(HALO), depthTest: false, depthWrite: false, toneMapped: false })
    const triad = new Mesh(unitArrowGeometry(), triadMaterial)
    const label = textSprite(' ', HALO)
    const objects: Object3D[] = [handle, triad, label]
    for (const o of objects) { o.scale.set(0, 0, 0); o.frustumCulled = false; o.raycast = () => {} }
    return objects
  }
  const material = createArrowMaterial([])
  const arrows = new InstancedMesh(unitArrowGeometry(), material, 1)
  arrows.instanceColor = new InstancedBufferAttribute(new Float32Array(3), 3)
  arrows.setMatrixAt(0, nothing)
  arrows.frustumCulled = false
  arrows.raycast = () => {}
  return [arrows]
}
