import { Vector3 } from 'three'
import type { Plane } from 'three'
import { sectionPlaneOf } from '../state/selectors.ts'
import type { SectionState } from '../state/store.ts'

/** Offset that puts the plane beyond any model: nothing is clipped, yet the shader keeps its plane. */
export const NOWHERE = 1e30

/**
 * Writes the clipping plane that hides one side of the section into `out` (three.js clips where
 * n·x + c < 0). With no section or `hide: 'none'` the plane moves out of reach instead of being
 * removed, so the shader programs keep their clipping variant and never recompile. `hide` must be
 * resolved ('auto' to a side: selectors.ts `resolvedHide`).
 */
export function sectionClipPlane(out: Plane, s: SectionState & { readonly hide: 'positive' | 'negative' | 'none' }): Plane {
  if (!s.enabled || s.hide === 'none') return out.set(new Vector3(0, 0, 1), NOWHERE)
  const { point, normal } = sectionPlaneOf(s)
  const d = normal[0] * point[0] + normal[1] * point[1] + normal[2] * point[2]
  // Hide +m: keep m·x - d ≤ 0, i.e. clip where -(m·x) + d < 0.
  if (s.hide === 'positive') return out.set(new Vector3(-normal[0], -normal[1], -normal[2]), d)
  return out.set(new Vector3(normal[0], normal[1], normal[2]), -d)
}
