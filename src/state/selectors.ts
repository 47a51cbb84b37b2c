/**
 * Values derived from the store's fields, for the cards, the scene and the engine client alike.
 * Pure functions of the state (no store access, type imports only), so a selector can call them and tests can too.
 */
import type { Plane } from '../mechanics/plane.ts'
import { unitNormal } from '../mechanics/plane.ts'
import { COMPONENT_QUANTITIES } from '../mechanics/componentScalars.ts'
import type { ComponentQuantity } from '../mechanics/componentScalars.ts'
import { autoDeformationScale } from '../mechanics/deformation.ts'
import type { ModelSummary, ScalarExtremes } from '../../workers/protocol.ts'
import type { CameraState, ColourMapName, QuantityName, SectionState, TractusData, TractusState } from './store.ts'

/** Signed quantities get a diverging map centred on zero; magnitudes a sequential one. */
export function isSignedQuantity(q: QuantityName): boolean {
  return q === 'normalTraction' || q === 'principal1' || q === 'principal3' || (isComponentQuantity(q) && q !== 'displacement')
}

/** True for the quantities of the shape slice (stress and displacement components, |u|). */
export function isComponentQuantity(q: QuantityName): q is ComponentQuantity {
  return (COMPONENT_QUANTITIES as readonly string[]).includes(q)
}

export function defaultMapFor(q: QuantityName): ColourMapName {
  return isSignedQuantity(q) ? 'RdBu' : 'viridis'
}

/**
 * The plane in use: unit normal, point moved by `offset` along it (length units). The store
 * refuses a zero or non-finite normal (`setSection`), so this never meets one.
 */
export function sectionPlaneOf(s: SectionState): Plane {
  const n = unitNormal(s.normal, 'section normal')
  const [px, py, pz] = s.point
  return { point: [px + s.offset * n[0], py + s.offset * n[1], pz + s.offset * n[2]], normal: n }
}

/** The colour range in use for the current quantity (model units), resolving 'auto'. */
export function activeRange(s: Pick<TractusData, 'range' | 'quantity' | 'surface'> & Partial<Pick<TractusState, 'components'>>): readonly [number, number] {
  if (s.range !== 'auto') return s.range
  const q = s.quantity
  const r = (isComponentQuantity(q) ? s.components?.ranges[q] : s.surface?.ranges[q]) ?? [0, 1]
  if (isSignedQuantity(s.quantity)) {
    // Diverging maps centre on zero: a symmetric range keeps white at zero.
    const a = Math.max(Math.abs(r[0]), Math.abs(r[1])) || 1
    return [-a, a]
  }
  return r[0] === r[1] ? [r[0], r[0] + 1] : r
}

/** The model's bounding sphere from the summary bounds: centre, radius and diagonal (length units). */
export function modelSphere(bounds: { readonly min: readonly number[]; readonly max: readonly number[] }): { center: [number, number, number]; radius: number; diagonal: number } {
  const { min, max } = bounds
  const diagonal = Math.hypot(max[0] - min[0], max[1] - min[1], max[2] - min[2]) || 1
  return { center: [(min[0] + max[0]) / 2, (min[1] + max[1]) / 2, (min[2] + max[2]) / 2], radius: diagonal / 2, diagonal }
}

// ---- Lines, the deformed shape and stress components ----

/** The per-vertex values of the current quantity (surface buffers or component scalars), or null. */
export function quantityScalars(s: Pick<TractusState, 'quantity' | 'surface' | 'components'>): Float32Array | null {
  const q = s.quantity
  return (isComponentQuantity(q) ? s.components?.scalars[q] : s.surface?.scalars[q]) ?? null
}

/** Where the current quantity is smallest and largest on the surface (vertex indices), or null. */
export function quantityExtremes(s: Pick<TractusState, 'quantity' | 'components' | 'surfaceExtremes'>): ScalarExtremes | null {
  const q = s.quantity
  return (isComponentQuantity(q) ? s.components?.extremes[q] : s.surfaceExtremes?.[q]) ?? null
}

/**
 * The factor the deformed shape is drawn with (dimensionless): 0 when it is off or the model has
 * no displacement; the automatic one draws the largest displacement as 5 % of the diagonal.
 */
export function deformScaleOf(s: Pick<TractusState, 'deformation' | 'deformationBuffers' | 'model'>): number {
  const d = s.deformationBuffers
  if (!s.deformation.shown || !d || !s.model) return 0
  if (s.deformation.scale !== 'auto') return s.deformation.scale
  return autoDeformationScale(d.max, modelSphere(s.model.bounds).diagonal)
}

/**
 * Whether the scene shows the section: switched on, and its first cut has arrived. Until then the
 * picture stays as it was (no clipping, no handle), so switching the section on draws one new
 * frame with everything in it rather than one with the clipped body and another with the cut: on
 * software WebGL every frame of a large model costs the rasteriser, and the main thread waits for
 * it. A plane that misses the body still sends an (empty) result; a drag keeps the last result.
 */
export function sectionShown(s: { readonly section: SectionState; readonly sectionResult: unknown }): boolean {
  return s.section.enabled && s.sectionResult !== null
}

/**
 * The side of the section hidden in the scene: `hide`, with 'auto' resolved to the side the
 * camera is on (so the cut face, which looks towards the hidden side, faces the camera); the +n
 * side before any camera is known.
 */
export function resolvedHide(s: SectionState, camera: CameraState | null): 'positive' | 'negative' | 'none' {
  if (s.hide !== 'auto') return s.hide
  if (!camera) return 'positive'
  const { point, normal } = sectionPlaneOf(s)
  const c = camera.position
  const side = (c[0] - point[0]) * normal[0] + (c[1] - point[1]) * normal[1] + (c[2] - point[2]) * normal[2]
  return side >= 0 ? 'positive' : 'negative'
}

/**
 * The model's summary with its input files' digests where they have come (they are computed after
 * the first picture: ModelSummary.digestsPending), for the report, the snapshot and the view link;
 * the store's `model` itself is left as loaded (effects keyed on it belong to a new model).
 */
export function modelWithInputs(st: Pick<TractusData, 'model' | 'inputDigests'>): ModelSummary | null {
  const m = st.model
  if (!m || !st.inputDigests || !m.digestsPending) return m
  const { digestsPending: _pending, ...rest } = m
  return { ...rest, inputs: st.inputDigests }
}
