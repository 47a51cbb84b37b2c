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
 * The part of the view the cards and bars leave open: insets in CSS pixels from each edge of a
 * view `width` × `height` pixels.
 */
export interface OpenView {
  readonly width: number
  readonly height: number
  readonly insets: { readonly top: number; readonly right: number; readonly bottom: number; readonly left: number }
}

/**
 * Moves `camera` so the sphere (centre, radius; model length units) fills the view, keeping the
 * current viewing direction (from `target` to the camera) or the default one, and sets near/far
 * planes around the model. With `open`, the sphere fills the part of the view the cards leave
 * open and sits in its middle: the camera moves sideways (target with it) by the insets' offset.
 * Returns the new target (the centre, or the centre moved with the camera).
 */
export function frameSphere(camera: PerspectiveCamera, target: Vector3, center: Vector3, radius: number, keepDirection = true, fallbackDirection = DEFAULT_VIEW_DIRECTION, open?: OpenView): Vector3 {
  const r = radius > 0 && Number.isFinite(radius) ? radius : 1
  const dir = new Vector3().subVectors(camera.position, target)
  if (!keepDirection || !(dir.lengthSq() > 0) || !Number.isFinite(dir.lengthSq())) dir.copy(fallbackDirection)
  dir.normalize()
  const box = openBox(open)
  // The open part of the view as its own field of view: vertical half-angle atan(tan(v)·h/H).
  const v = MathUtils.degToRad(camera.fov) / 2
  const fov = box ? MathUtils.radToDeg(2 * Math.atan(Math.tan(v) * box.h)) : camera.fov
  const aspect = box ? camera.aspect * box.w / box.h : camera.aspect
  const d = fitDistance(r, fov, aspect)
  const aim = center.clone()
  camera.position.copy(center).addScaledVector(dir, d)
  camera.lookAt(center)
  if (box) {
    // Shift camera and aim together, so the centre lands in the middle of the open part: a point
    // at screen offset (dx, dy) in fractions of half the view lies at d·tan(v)·(dx·aspect, dy).
    camera.updateMatrixWorld()
    const right = new Vector3().setFromMatrixColumn(camera.matrixWorld, 0)
    const up = new Vector3().setFromMatrixColumn(camera.matrixWorld, 1)
    const half = d * Math.tan(v)
    const shift = right.multiplyScalar(-box.dx * half * camera.aspect).addScaledVector(up, -box.dy * half)
    camera.position.add(shift)
    aim.add(shift)
  }
  setClipPlanes(camera, r)
  camera.lookAt(aim)
  camera.updateProjectionMatrix()
  return aim
}

/** The open part as fractions of the view (w, h) and the offset of its middle from the view's (dx, dy; in half-views, y up); null when all is open. */
function openBox(open: OpenView | undefined): { w: number; h: number; dx: number; dy: number } | null {
  if (!open || !(open.width > 0) || !(open.height > 0)) return null
  const { top, right, bottom, left } = open.insets
  if (top + right + bottom + left <= 0) return null
  const W = open.width, H = open.height
  const w = Math.max(0.2, (W - left - right) / W), h = Math.max(0.2, (H - top - bottom) / H)
  return { w, h, dx: (left - right) / W, dy: (bottom - top) / H }
}

/** Near and far planes for a model of the given radius: wide enough to zoom far in and out. */
export function setClipPlanes(camera: PerspectiveCamera, radius: number): void {
  const r = radius > 0 && Number.isFinite(radius) ? radius : 1
  camera.near = r / 1000
  camera.far = r * 1000
  camera.updateProjectionMatrix()
}
