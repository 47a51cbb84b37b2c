import { Raycaster, Vector2 } from 'three'
import type { Camera, Ray } from 'three'

const _raycaster = new Raycaster()
const _ndc = new Vector2()

/**
 * The world ray under a pointer position (client pixels) for `camera` drawn into `element`.
 * World coordinates are model coordinates (the scene applies no transform to the model).
 * Returns a shared Ray: copy it before the next call.
 */
export function rayFromPointer(clientX: number, clientY: number, element: HTMLElement, camera: Camera): Ray {
  const rect = element.getBoundingClientRect()
  const w = rect.width > 0 ? rect.width : 1, h = rect.height > 0 ? rect.height : 1
  _ndc.set(((clientX - rect.left) / w) * 2 - 1, -((clientY - rect.top) / h) * 2 + 1)
  _raycaster.setFromCamera(_ndc, camera)
  return _raycaster.ray
}
