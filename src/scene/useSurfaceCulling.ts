import { useEffect, useMemo } from 'react'
import type { BufferGeometry, Camera, Plane } from 'three'
import { useThree } from '@react-three/fiber'
import type { SurfaceBuffers } from '../../workers/protocol.ts'
import { visibleClusterRuns } from './clusterVisibility.ts'
import type { ClusterView } from './clusterVisibility.ts'
import { NOWHERE } from './sectionClipPlane.ts'

type SceneHook = (renderer: unknown, scene: unknown, camera: Camera, target: unknown) => void

/** One pass over the surface: its geometry (sharing the surface's attributes) and the faces it culls (+1 back, −1 front). */
export interface CulledPass {
  readonly geometry: BufferGeometry
  readonly facing: 1 | -1
}

/**
 * Draws only the surface's clusters that can show (clusterVisibility.ts), for every
 * render and the camera it uses (the screen and the snapshots alike): before the renderer lists
 * what to draw (the scene's onBeforeRender), each pass's geometry gets one group per run of
 * consecutive clusters that face its way, lie on the kept side of the clipping plane and belong to
 * a shown part. `ranges` are the shown parts' triangle ranges (null: all). With `exact` false (the
 * deformed shape, whose vertices the shader moves away from the clusters' bounds) only the parts
 * decide. The surface is drawn untransformed (its mesh's world matrix is the identity), so the
 * clusters' bounds and the camera share one frame. Without clusters the groups are the ranges, or
 * none (the whole index).
 */
export function useSurfaceCulling(
  passes: readonly CulledPass[], clusters: SurfaceBuffers['clusters'], ranges: readonly (readonly [number, number])[] | null,
  planes: Plane[], exact: boolean,
): void {
  const scene = useThree((s) => s.scene)
  const invalidate = useThree((s) => s.invalidate)
  // the clusters of shown parts (a cluster never crosses a part's range)
  const shown = useMemo(() => {
    if (!clusters || !ranges) return null
    const K = clusters.start.length - 1, flags = new Uint8Array(K)
    for (let k = 0; k < K; k++) {
      const t = clusters.start[k]
      for (const [first, count] of ranges) if (t >= first && t < first + count) { flags[k] = 1; break }
    }
    return flags
  }, [clusters, ranges])

  useEffect(() => {
    if (clusters) return
    // no clusters: the shown parts' ranges as groups, or the whole index
    for (const { geometry } of passes) {
      geometry.clearGroups()
      if (ranges) for (const [first, count] of ranges) geometry.addGroup(3 * first, 3 * count, 0)
    }
    invalidate()
  }, [passes, clusters, ranges, invalidate])

  useEffect(() => {
    if (!clusters) return
    const runs = new Int32Array(2 * Math.max(1, clusters.start.length - 1))
    const eye = [0, 0, 0], direction = [0, 0, -1], plane = [0, 0, 1, 0]
    const update = (camera: Camera): void => {
      const e = camera.matrixWorld.elements
      const perspective = (camera as { isPerspectiveCamera?: boolean }).isPerspectiveCamera === true
      eye[0] = e[12]; eye[1] = e[13]; eye[2] = e[14]
      // a camera looks along its −z axis
      direction[0] = -e[8]; direction[1] = -e[9]; direction[2] = -e[10]
      const p = planes[0]
      const clipping = exact && p !== undefined && Math.abs(p.constant) < NOWHERE / 2
      if (clipping) { plane[0] = p.normal.x; plane[1] = p.normal.y; plane[2] = p.normal.z; plane[3] = p.constant }
      for (const { geometry, facing } of passes) {
        const view: ClusterView = { eye: perspective ? eye : null, direction, facing: exact ? facing : 0, plane: clipping ? plane : null }
        const n = visibleClusterRuns(clusters.start, clusters.bounds, view, shown, runs)
        geometry.clearGroups()
        for (let r = 0; r < n; r++) geometry.addGroup(3 * runs[2 * r], 3 * runs[2 * r + 1], 0)
      }
    }
    // the scene's hook as the renderer calls it: (renderer, scene, camera, render target)
    const hooked = scene as unknown as { onBeforeRender: SceneHook }
    const before = hooked.onBeforeRender
    hooked.onBeforeRender = function (this: unknown, renderer, sc, camera, target) {
      before.call(this, renderer, sc, camera, target)
      update(camera)
    }
    invalidate()
    return () => { hooked.onBeforeRender = before }
  }, [scene, passes, clusters, shown, planes, exact, invalidate])
}
