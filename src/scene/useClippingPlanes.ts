import { useEffect, useMemo } from 'react'
import { Plane, Vector3 } from 'three'
import { useThree } from '@react-three/fiber'
import { useStore } from '../state/store.ts'
import { resolvedHide } from '../state/selectors.ts'
import { NOWHERE, sectionClipPlane } from './sectionClipPlane.ts'

/**
 * A clipping-plane array for the materials that hide a side of the section (the surface and its
 * arrows; never the section face). The plane is updated in place, never replaced.
 */
export function useClippingPlanes(): Plane[] {
  const planes = useMemo(() => [new Plane(new Vector3(0, 0, 1), NOWHERE)], [])
  const invalidate = useThree((s) => s.invalidate)
  const section = useStore((s) => s.section)
  // 'auto' hides the side the camera is on; the store's camera changes at the end of each move.
  const hide = useStore((s) => resolvedHide(s.section, s.camera))
  useEffect(() => {
    sectionClipPlane(planes[0], { ...section, hide })
    invalidate()
  }, [planes, section, hide, invalidate])
  return planes
}
