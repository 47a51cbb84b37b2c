/**
 * Views the user asks for by button or key: along an axis, isometric, the whole model, and
 * straight at the section. Each is a request to the scene's camera (the store's `requestView`);
 * the scene frames the sphere in the part of the view the cards leave open.
 */
import type { Vec3 } from '../model/model.ts'
import { modelSphere, resolvedHide } from '../state/selectors.ts'
import { useStore } from '../state/store.ts'

export type ViewName = '+x' | '-x' | '+y' | '-y' | '+z' | '-z' | 'iso'

/** Look direction (from the camera to the model) of each view: '+x' looks along +x, from the −x side. */
const ALONG: Readonly<Record<Exclude<ViewName, 'iso'>, Vec3>> = {
  '+x': [1, 0, 0], '-x': [-1, 0, 0], '+y': [0, 1, 0], '-y': [0, -1, 0], '+z': [0, 0, 1], '-z': [0, 0, -1],
}

/**
 * The isometric look direction for a model whose screen up is `up` (unit; +z without gravity):
 * along −(1, −1, 1)/√3 with z turned onto `up` (the three axes foreshortened alike), so the view
 * comes from the front right and above as the default three-quarter view does.
 */
export function isometricAlong(up: Vec3): Vec3 {
  const d: Vec3 = [-1 / Math.sqrt(3), 1 / Math.sqrt(3), -1 / Math.sqrt(3)]
  const [ux, uy, uz] = up
  // Turn z onto up (Rodrigues' rotation about z × up).
  const c = uz, kx = -uy, ky = ux
  const s = Math.hypot(kx, ky)
  if (s < 1e-12) return c > 0 ? d : [d[0], -d[1], -d[2]]
  const ax = kx / s, ay = ky / s
  const dot = ax * d[0] + ay * d[1]
  const cross: Vec3 = [ay * d[2], -ax * d[2], ax * d[1] - ay * d[0]]
  return [0, 1, 2].map((i) => d[i] * c + cross[i] * s + [ax, ay, 0][i] * dot * (1 - c)) as Vec3
}

/** Screen up of the model: against its body force, else +z (as the scene's camera rig). */
function modelUp(b: readonly number[]): Vec3 {
  const l = Math.hypot(b[0], b[1], b[2])
  return l > 0 && Number.isFinite(l) ? [-b[0] / l, -b[1] / l, -b[2] / l] : [0, 0, 1]
}

export function showView(name: ViewName): void {
  const st = useStore.getState()
  if (!st.model) return
  const { center, radius } = modelSphere(st.model.bounds)
  const along = name === 'iso' ? isometricAlong(modelUp(st.model.bodyForce)) : ALONG[name]
  st.requestView({ frame: { center, radius, along } })
}

export function frameModel(): void {
  const st = useStore.getState()
  if (!st.model) return
  const { center, radius } = modelSphere(st.model.bounds)
  st.requestView({ frame: { center, radius } })
}

/**
 * Straight at the cut face that shows: the camera goes to the hidden side of the plane (with the
 * side nearer the camera hidden, the side it is on) and looks along the normal at the section's
 * centroid, framing the section.
 */
export function lookAtSection(): void {
  const st = useStore.getState()
  const r = st.sectionResult
  if (!st.model || !r || r.empty || !st.section.enabled) return
  const n = r.plane.normal
  const hide = resolvedHide(st.section, st.camera)
  // Hiding +n shows the −n piece, whose cut face looks along +n: the camera sits on the +n side
  // and looks along −n (and the other way round).
  const along: Vec3 = hide === 'negative' ? [n[0], n[1], n[2]] : [-n[0], -n[1], -n[2]]
  const radius = 1.3 * Math.sqrt(2 * r.secondMoments.J / r.area) + 1e-12
  st.requestView({ frame: { center: r.centroid, radius, along } })
}
