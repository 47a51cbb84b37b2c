import { MathUtils, Quaternion, Vector3 } from 'three'
import type { PerspectiveCamera } from 'three'

/** Default direction from the target to the camera: a three-quarter view from above, z up. */
export const DEFAULT_VIEW_DIRECTION = new Vector3(1, -1.35, 0.9).normalize()

const Z_UP = new Vector3(0, 0, 1)

/**
 * The screen's up direction for a model: against its body force when it has one (gravity points
 * down on screen, as an engineer draws a rock mass or a dam), else +z (common practice).
 */
export function upForBodyForce(b: readonly [number, number, number]): Vector3 {
  const v = new Vector3(-b[0], -b[1], -b[2])
  return v.lengthSq() > 0 && Number.isFinite(v.lengthSq()) ? v.normalize() : Z_UP.clone()
}

/** The default three-quarter view direction turned so that +z goes to `up`. */
export function defaultViewDirection(up: Vector3): Vector3 {
  return DEFAULT_VIEW_DIRECTION.clone().applyQuaternion(new Quaternion().setFromUnitVectors(Z_UP, up))
}

/**
 * Distance from a sphere's centre at which a perspective camera sees all of it: the sphere must
 * fit the narrower of the vertical and horizontal fields of view (tangent cone, so
 * d = r / sin(half-angle)), with a small margin.
 */
export function fitDistance(radius: number, fovDeg: number, aspect: number, margin = 1.08): number {
  const v = MathUtils.degToRad(fovDeg) / 2
  const h = Math.atan(Math.tan(v) * (aspect > 0 ? aspect : 1))
  return (margin * radius) / Math.sin(Math.min(v, h))
}

/**
 * Moves `camera` so the sphere (centre, radius; model length units) fills the view, keeping the
 * current viewing direction (from `target` to the camera) or the default one, and sets near/far
 * planes around the model. Returns the new target (the centre).
 */
export function frameSphere(camera: PerspectiveCamera, target: Vector3, center: Vector3, radius: number, keepDirection = true, fallbackDirection = DEFAULT_VIEW_DIRECTION): Vector3 {
  const r = radius > 0 && Number.isFinite(radius) ? radius : 1
  const dir = new Vector3().subVectors(camera.position, target)
  if (!keepDirection || !(dir.lengthSq() > 0) || !Number.isFinite(dir.lengthSq())) dir.copy(fallbackDirection)
  dir.normalize()
  const d = fitDistance(r, camera.fov, camera.aspect)
  camera.position.copy(center).addScaledVector(dir, d)
  setClipPlanes(camera, r)
  camera.lookAt(center)
  camera.updateProjectionMatrix()
  return center.clone()
}

/** Near and far planes for a model of the given radius: wide enough to zoom far in and out. */
export function setClipPlanes(camera: PerspectiveCamera, radius: number): void {
  const r = radius > 0 && Number.isFinite(radius) ? radius : 1
  camera.near = r / 1000
  camera.far = r * 1000
  camera.updateProjectionMatrix()
}
