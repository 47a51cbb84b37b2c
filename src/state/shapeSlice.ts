/**
 * The shape slice of the one store: the deformed shape (shown or not, its scale, the undeformed
 * outline), the axes the stress and displacement components are shown in (global or cylindrical
 * about a line), the component scalars the engine built for those axes, and the extremes
 * markers. A new model brings its own buffers (`shapeOfLoad`, called by modelLoaded) and keeps
 * the user's choices.
 *
 * Units: model units (scale dimensionless; axis point length units, axis any non-zero vector).
 */
import type { StateCreator } from 'zustand'
import { isInputError } from '../model/errors.ts'
import { checkAxes, GLOBAL_AXES } from '../mechanics/componentAxes.ts'
import type { ComponentAxes, ComponentBuffers, DeformationBuffers, LoadedModel, ScalarExtremes, SurfaceQuantity } from '../../workers/protocol.ts'
import type { TractusState } from './store.ts'

/**
 * The deformed shape: `shown`; `scale` 'auto' (the largest displacement drawn as 5 % of the
 * model's diagonal) or a typed factor (dimensionless, finite, ≥ 0); `outline`: the undeformed
 * feature edges drawn too.
 */
export interface DeformationState {
  readonly shown: boolean
  readonly scale: 'auto' | number
  readonly outline: boolean
}

export interface ShapeSlice {
  readonly deformation: DeformationState
  /** Displacement buffers of the model, null without displacement. */
  readonly deformationBuffers: DeformationBuffers | null
  /** Axes of the component quantities, the probe and the line read-out. */
  readonly componentAxes: ComponentAxes
  /** The last axes input refused (a zero axis), in words; null once a good one is taken. */
  readonly axesError: string | null
  /** Component scalars of the surface, for `components.axes` (the engine answers a change of axes). */
  readonly components: ComponentBuffers | null
  /** Extremes of the base surface quantities (components carry their own). */
  readonly surfaceExtremes: Readonly<Record<SurfaceQuantity, ScalarExtremes>> | null
  readonly extremesShown: boolean
  setDeformation: (patch: Partial<DeformationState>) => void
  /** Axes of the components; a zero or non-finite axis is refused (axesError says why). */
  setComponentAxes: (axes: ComponentAxes) => void
  /** Engine reply: the component scalars for some axes. */
  componentsShown: (c: ComponentBuffers) => void
  setExtremesShown: (shown: boolean) => void
}

export const DEFAULT_DEFORMATION: DeformationState = { shown: false, scale: 'auto', outline: true }

/** The slice's fields a loaded model sets (its buffers; the user's choices stay). */
export function shapeOfLoad(loaded: Pick<LoadedModel, 'extras'>): Pick<ShapeSlice, 'deformationBuffers' | 'components' | 'surfaceExtremes'> {
  const x = loaded.extras
  return { deformationBuffers: x?.deformation ?? null, components: x?.components ?? null, surfaceExtremes: x?.extremes ?? null }
}

export const createShapeSlice: StateCreator<TractusState, [], [], ShapeSlice> = (set, get) => ({
  deformation: DEFAULT_DEFORMATION,
  deformationBuffers: null,
  componentAxes: GLOBAL_AXES,
  axesError: null,
  components: null,
  surfaceExtremes: null,
  extremesShown: false,
  setDeformation: (patch) => {
    const scale = patch.scale
    // A typed scale must be a finite non-negative number; anything else keeps the previous one.
    if (scale !== undefined && scale !== 'auto' && !(Number.isFinite(scale) && scale >= 0)) return
    set({ deformation: { ...get().deformation, ...patch } })
  },
  setComponentAxes: (axes) => {
    try {
      set({ componentAxes: checkAxes(axes), axesError: null })
    } catch (e) {
      if (!isInputError(e)) throw e
      set({ axesError: e.message })
    }
  },
  componentsShown: (components) => set({ components }),
  setExtremesShown: (extremesShown) => set({ extremesShown }),
})
