import { useEffect, useMemo } from 'react'
import { Plane, Vector3 } from 'three'
import { useThree } from '@react-three/fiber'
import { useStore } from '../state/store.ts'
import { resolvedHide, sectionShown } from '../state/selectors.ts'
import { NOWHERE, sectionClipPlane } from './sectionClipPlane.ts'

/**
 * A clipping-plane array for the materials that hide a side of the section (the surface and its
 * arrows; never the section face), out of reach until the section is shown (sectionShown). The
 * plane is updated in place, never replaced.
 */
export function useClippingPlanes(): Plane[] {
  const planes = useMemo(() => [new Plane(new Vector3(0, 0, 1), NOWHERE)], [])
  const invalidate = useThree((s) => s.invalidate)
  const section = useStore((s) => s.section)
  const shown = useStore(sectionShown)
  // 'auto' hides the side the camera is on; the store's camera changes at the end of each move.
  const hide = useStore((s) => resolvedHide(s.section, s.camera))
  useEffect(() => {
    const p = planes[0], nx = p.normal.x, ny = p.normal.y, nz = p.normal.z, c = p.constant
    sectionClipPlane(p, { ...section, enabled: shown, hide })
    // a new frame only when the plane moved: on software WebGL any frame of a large model costs
    // the rasteriser (switching the section on changes the plane only when its cut arrives)
    if (p.normal.x !== nx || p.normal.y !== ny || p.normal.z !== nz || p.constant !== c) invalidate()
  }, [planes, section, shown, hide, invalidate])
  return planes
}
