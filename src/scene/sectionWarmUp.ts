import { CylinderGeometry, InstancedBufferAttribute, InstancedMesh, Matrix4, Mesh, MeshBasicMaterial } from 'three'
import type { Object3D } from 'three'
import { unitArrowGeometry } from './arrowGeometry.ts'
import { createArrowMaterial } from './arrowMaterial.ts'
import { rawColour } from './rawColour.ts'
import { flatMaterial } from './SectionHandle.tsx'
import { HALO, HANDLE } from './sceneLook.ts'
import { textSprite } from './textSprite.ts'

/**
 * Stand-ins for what switching the section on draws for the first time besides the surface's back
 * pass and the section face, drawn among the page's first frames (FirstDrawWarmUp.tsx), so that
 * the switch finds their shaders compiled. On software WebGL a new shader and render state costs
 * a compile in the GPU process, which the main thread waits for when it reads the frame back:
 * without these, the frame that first shows a section at 10^7 elements took about 0.2 s longer
 * than the same frame later (measured). Each stand-in has the material, render state and vertex
 * layout of the real object (the handle's flat colour drawn over everything on both sides, the
 * section triad's arrow, its labels' sprite, the section arrows' instanced material without
 * clipping planes); FirstDrawWarmUp.tsx scales them to nothing, so they draw no pixel. Three
 * kinds, each drawn in a frame of its own: 1 the handle, 2 the triad and its label, 3 the arrows.
 * The caller makes them once and keeps them for the page's life, never disposed: three.js deletes
 * a shader program when the last material using it is disposed, and the real objects would then
 * compile it again.
 */
export function sectionWarmObjects(kind: 1 | 2 | 3): Object3D[] {
  if (kind === 1) return [new Mesh(new CylinderGeometry(1, 1, 1, 8, 1, true), flatMaterial(HANDLE))]
  if (kind === 2) {
    const triadMaterial = new MeshBasicMaterial({ color: rawColour(HALO), depthTest: false, depthWrite: false, toneMapped: false })
    return [new Mesh(unitArrowGeometry(), triadMaterial), textSprite(' ', HALO)]
  }
  const arrows = new InstancedMesh(unitArrowGeometry(), createArrowMaterial([]), 1)
  arrows.instanceColor = new InstancedBufferAttribute(new Float32Array(3), 3)
  arrows.setMatrixAt(0, new Matrix4().makeScale(0, 0, 0))
  return [arrows]
}
