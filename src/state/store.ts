/**
 * The one store of the app (zustand): what the cards and the scene both read, and the named
 * actions that change it. Actions only change fields: no worker calls, no O(elements) work. The
 * engine client (src/app/engineClient.ts) watches the store and turns requests into worker jobs
 * (a new plane, a drag step, a probe ray, new arrow settings), then reports the replies through
 * the actions of the "engine replies" group below.
 *
 * Units: unless a doc comment says otherwise, every number is in MODEL units (length L and stress S
 * of `model.units`; force S·L², moment S·L³). Conversion to the display system happens only when a
 * value is shown (src/model/units.ts `toDisplay`), so switching SI/US never touches buffers.
 *
 * Buffers arrive from the worker as transferables; treat them as immutable (replace, never mutate),
 * so a React/r3f component can key its geometry on the array identity.
 *
 * Read it with narrow selectors (`useStore((s) => s.quantity)`), never the whole state, so a
 * component renders again only when what it shows changes.
 */
import { create } from 'zustand'
import { createStore } from 'zustand/vanilla'
import type { StateCreator, StoreApi } from 'zustand'
import type { Vec3 } from '../model/model.ts'
import type { UnitSystem } from '../model/units.ts'
import { modelDisplayUnits } from '../model/units.ts'
import { isInputError } from '../model/errors.ts'
import { checkPoint, unitNormal } from '../mechanics/plane.ts'
import type { SectionResult } from '../mechanics/types.ts'
import { SURFACE_QUANTITIES } from '../mechanics/surfaceTriangles.ts'
import type {
  AppError, ArrowBuffers, ArrowMode, AuditSummary, CutInfo, InputFileRecord, LoadedModel, ModelSummary, PatchRule, ProbeRay, ProbeResult, Progress,
  SectionAxesChoice, SectionBuffers, SurfaceBuffers, SurfaceQuantity,
} from '../../workers/protocol.ts'
import { LOAD_PATCH_DEFAULTS } from '../mechanics/loadPatches.ts'

/** The patch rule of a new session: the defaults of src/mechanics/loadPatches.ts. */
export const DEFAULT_PATCH_RULE: PatchRule = { ...LOAD_PATCH_DEFAULTS }
import { defaultMapFor, isSignedQuantity, modelSphere } from './selectors.ts'
import { createSweepSlice } from './sweepSlice.ts'
import { createIntakeSlice } from './intakeSlice.ts'
import type { IntakeSlice } from './intakeSlice.ts'
import type { SweepSlice } from './sweepSlice.ts'
// Lines, the deformed shape and stress components: two slices of their own.
import { createLineSlice } from './lineSlice.ts'
import type { LineSlice } from './lineSlice.ts'
import { createShapeSlice, shapeOfLoad } from './shapeSlice.ts'
import { caseStateOfLoad, createCaseSlice } from './caseSlice.ts'
import type { CaseSlice } from './caseSlice.ts'
import type { ShapeSlice } from './shapeSlice.ts'
import { assemblyOfLoad, createAssemblySlice } from './assemblySlice.ts'
import type { AssemblySlice } from './assemblySlice.ts'
import type { ComponentQuantity } from '../mechanics/componentScalars.ts'

/**
 * Scalar quantities the surface can be coloured by: the tractions and invariants of the surface
 * buffers (QUANTITY_NAMES, keys 1–7) and the stress and displacement components of the shape
 * slice (src/mechanics/componentScalars.ts). The worker's buffer builders define them.
 */
export type QuantityName = SurfaceQuantity | ComponentQuantity
export const QUANTITY_NAMES: readonly SurfaceQuantity[] = SURFACE_QUANTITIES

/**
 * Published colour map names (viridis/cividis sequential, ColorBrewer RdBu/PuOr diverging).
 * Tables: src/scene/colourMaps.ts `colourMapTable(name, 256)` (RGBA8, low end first), shared by the
 * shader and the colour bar. Map t = (value - range[0]) / (range[1] - range[0]) clamped to [0, 1].
 */
export type ColourMapName = 'viridis' | 'cividis' | 'RdBu' | 'PuOr'
export const COLOUR_MAP_NAMES: readonly ColourMapName[] = ['viridis', 'cividis', 'RdBu', 'PuOr']

export interface ArrowSettings {
  /** Show arrows on the surface. */
  readonly surface: boolean
  /** Show arrows on the section face. */
  readonly section: boolean
  readonly mode: ArrowMode
  /** Dimensionless length factor (see ArrowBuffers for the drawn length). */
  readonly scale: number
  /** Largest number of arrows kept after decimation by area (count). */
  readonly budget: number
  /**
   * 'normal': arrows coloured by their signed normal traction tₙ on a diverging map (the surface's
   * map and range when the surface shows tₙ, else their own, with a bar of their own); 'single':
   * one colour.
   */
  readonly colour: 'normal' | 'single'
}

/**
 * The cutting plane the user controls. The plane used is point + offset·n̂ with unit normal n̂
 * (see `sectionPlaneOf`). `point` length units, `normal` any non-zero finite vector (normalised on
 * use; `setSection` refuses any other), `offset` length units along n̂. `hide`: which side of the
 * plane is hidden in the scene ('positive' = the +n side, the side whose action the resultant
 * reports; 'auto' = the side the camera is on, so the cut face looks at the camera;
 * `resolvedHide` in selectors.ts), or 'none'. `traction`: which section traction colours the fill. `dragging`: true while
 * the handle or the offset slider is held (see `beginSectionDrag`); on software WebGL the app then
 * cuts without section arrows (they return on release).
 */
export interface SectionState {
  readonly enabled: boolean
  readonly point: Vec3
  readonly normal: Vec3
  readonly offset: number
  readonly hide: 'auto' | 'positive' | 'negative' | 'none'
  readonly traction: 'normalTraction' | 'shearTraction'
  readonly dragging: boolean
}

/** Camera for the URL hash and restore: position/target length units, up unit, fov degrees. */
export interface CameraState {
  readonly position: Vec3
  readonly target: Vec3
  readonly up: Vec3
  readonly fov: number
}

/**
 * A request for the scene to move the camera; the scene applies it when `seq` changes.
 * Either an exact `camera`, or `frame` a sphere (centre length units, radius length units) to fit.
 */
export interface ViewRequest {
  readonly seq: number
  readonly camera?: CameraState
  readonly frame?: {
    readonly center: Vec3
    readonly radius: number
    /** Outward normal of what is framed, to look at it from outside; optional. */
    readonly normal?: Vec3
    /** Look exactly along this direction (from the camera to the centre), with `up` on screen when given. */
    readonly along?: Vec3
    readonly up?: Vec3
  }
}

/**
 * Renders the current view off-screen at `width`×`height` device pixels and returns a canvas
 * with the picture (no overlays); the scene registers it, the snapshot card composes overlays.
 */
export type SnapshotRenderer = (width: number, height: number) => HTMLCanvasElement | OffscreenCanvas | Promise<HTMLCanvasElement | OffscreenCanvas>

/** Colour range: 'auto' follows the data; a fixed [min, max] in the quantity's MODEL units. */
export type ColourRange = 'auto' | readonly [number, number]

/** A typed value the store refused, with the reason in words; the card marks that field. */
export interface FieldError {
  readonly field: 'normal' | 'point'
  readonly message: string
}

/**
 * How numbers are shown: a named set (SI, US customary), the model's own units, or the user's
 * own length, force and stress units (`units` holds the resolved units in every case).
 */
export type UnitPreset = 'SI' | 'US' | 'model' | 'custom'

/** What a reviewer writes on snapshots and reports (plain text, shown as text only). */
export interface ReviewFields {
  readonly title: string
  readonly project: string
  readonly author: string
  readonly checker: string
  readonly revision: string
  readonly loadCase: string
  readonly notes: string
}

export const EMPTY_REVIEW: ReviewFields = { title: '', project: '', author: '', checker: '', revision: '', loadCase: '', notes: '' }

/**
 * A link that could not be applied as it stands: it was made on the user's own files (`files`
 * lists their names; the view waits until files of those names are opened), or it names a demo
 * this build does not have.
 */
export interface LinkNotice {
  readonly kind: 'needs-files' | 'unknown-demo'
  readonly message: string
  readonly files?: readonly string[]
}

/** An element to point at in the scene (the Equilibrium card's least balanced elements): its id, centre and size (length units). */
export interface MarkedElement {
  readonly id: number
  readonly centre: Vec3
  readonly radius: number
}

/** Screen space the cards and bars cover at the edges of the scene (CSS pixels), so framing uses the open part. */
export interface ViewInsets {
  readonly top: number
  readonly right: number
  readonly bottom: number
  readonly left: number
}

/** The fields of the store (no actions). */
export interface TractusData {
  readonly model: ModelSummary | null
  /**
   * The model's input records with their digests, once computed after the first picture
   * (ModelSummary.digestsPending; read through `modelWithInputs`, selectors.ts). Apart from
   * `model`, so that the summary object is replaced only by a new model or case.
   */
  readonly inputDigests: readonly InputFileRecord[] | null
  readonly surface: SurfaceBuffers | null
  readonly arrows: ArrowBuffers | null
  readonly sectionBuffers: SectionBuffers | null

  readonly quantity: QuantityName
  readonly range: ColourRange
  /** Map for the current quantity: sequential for magnitudes, diverging for signed (see setQuantity). */
  readonly colourMap: ColourMapName
  readonly arrowSettings: ArrowSettings

  readonly section: SectionState
  /** The offset the drag asks for while the section is dragged (length units), else null. */
  readonly sectionDrag: { readonly offset: number } | null
  /** The last section input the store refused (a zero normal, say), until a good one arrives. */
  readonly sectionInputError: FieldError | null
  readonly sectionResult: SectionResult | null
  readonly audit: AuditSummary | null
  /** Load-patch id to highlight, -1 for none. */
  readonly highlightedPatch: number
  readonly probeRay: ProbeRay | null
  readonly probe: ProbeResult | null

  readonly units: UnitSystem
  /** Last camera reported by the scene (written on the end of a camera move). */
  readonly camera: CameraState | null
  readonly viewRequest: ViewRequest | null
  readonly snapshotRenderer: SnapshotRenderer | null
  /** 'software' when WebGL reports a software renderer (SwiftShader, llvmpipe); set by the scene. */
  readonly renderer: 'hardware' | 'software' | 'unknown'

  readonly busy: boolean
  readonly progress: Progress | null
  readonly error: AppError | null
  readonly helpOpen: boolean

  // Reading the results (section axes, patch rule, display units, reviewer fields, links, layout).
  /** Section axes the cut is resolved in: principal (default) or reference, with the reference direction. */
  readonly sectionAxes: SectionAxesChoice
  /** What the engine added to the last cut: a refused reference, the body's extent when the plane missed. */
  readonly cutInfo: CutInfo | null
  /** The load-entry patch rule in use (fractions of the reference stress, feature angle in degrees). */
  readonly patchRule: PatchRule
  readonly unitPreset: UnitPreset
  readonly review: ReviewFields
  /** The cards column at its wide size (diagrams read better). */
  readonly wideCards: boolean
  readonly viewInsets: ViewInsets
  readonly linkNotice: LinkNotice | null
  readonly markedElement: MarkedElement | null
}

export interface TractusActions {
  // What the user sets in the cards, by key or through a link.
  /** Colours by `q`: the range goes back to auto, the map family follows the quantity's sign. */
  setQuantity: (q: QuantityName) => void
  setRange: (range: ColourRange) => void
  setColourMap: (map: ColourMapName) => void
  setUnits: (units: UnitSystem) => void
  /** A link's view settings at once; a quantity without a map gets its default map. */
  applyViewSettings: (v: { quantity?: QuantityName; range?: ColourRange; colourMap?: ColourMapName; units?: UnitSystem }) => void
  setArrowSettings: (patch: Partial<ArrowSettings>) => void
  /**
   * Changes the section. A normal that is zero or not finite, or a point that is not finite, is
   * refused: the store keeps the previous plane (and so the previous cut) and records why in
   * `sectionInputError` for the card to show.
   */
  setSection: (patch: Partial<Omit<SectionState, 'dragging'>>) => void
  highlightPatch: (id: number) => void
  setHelpOpen: (open: boolean) => void
  dismissError: () => void
  showError: (error: AppError) => void

  // The section drag: the one protocol of the offset slider and the scene's handle.
  /** The slider or the handle is grabbed. */
  beginSectionDrag: () => void
  /** A drag step to `offset`: the plane shown moves only when its cut is ready (see the engine client). */
  dragSection: (offset: number) => void
  /** Released at `offset` (default: the last step); the plane takes it and a full cut follows. */
  endSectionDrag: (offset?: number) => void

  // What the scene reports.
  /** Scene: the user clicked; the engine client asks the worker to intersect. */
  requestProbe: (ray: ProbeRay) => void
  /** Ask the scene to move the camera. */
  requestView: (req: Omit<ViewRequest, 'seq'>) => void
  cameraMoved: (camera: CameraState) => void
  /** The renderer kind; software WebGL lowers the arrow budget to what it draws quickly. */
  setRenderer: (kind: TractusData['renderer']) => void
  setSnapshotRenderer: (render: SnapshotRenderer | null) => void

  // Engine replies (called by the engine client).
  loadStarted: (opts: { keepError: boolean }) => void
  loadProgress: (p: Progress) => void
  /** The job ended without a new model; `error` (if any) goes to the error card. */
  loadEnded: (error?: AppError) => void
  /** A new model replaces the old one: its results, a fresh section through its centre, the camera framed. */
  modelLoaded: (loaded: LoadedModel) => void
  /** The input files' records with their digests, computed after the first picture (ModelSummary.digestsPending). */
  inputsDigested: (records: readonly InputFileRecord[]) => void
  surfaceArrowsShown: (arrows: ArrowBuffers | null) => void
  /** The cut of the current plane; with `offset`, a drag step's cut, and the plane moves to it; `info` what the engine added. */
  cutShown: (result: SectionResult, buffers: SectionBuffers | null, offset?: number, info?: CutInfo | null) => void
  cutCleared: () => void
  probeShown: (probe: ProbeResult | null) => void

  // Reading the results.
  setSectionAxes: (choice: SectionAxesChoice) => void
  /** A new patch rule; the engine client recomputes the patches (see `patchesShown`). */
  setPatchRule: (rule: PatchRule) => void
  /** The engine's patches for the rule in use: the audit with them, and the surface's patch labels. */
  patchesShown: (audit: AuditSummary, patchLabel: Float32Array) => void
  /** Shows numbers in a preset, or in `custom` units (a DisplayUnits record). */
  setUnitPreset: (preset: UnitPreset, custom?: Exclude<UnitSystem, 'SI' | 'US'>) => void
  setReview: (patch: Partial<ReviewFields>) => void
  setWideCards: (wide: boolean) => void
  setViewInsets: (insets: ViewInsets) => void
  setLinkNotice: (notice: LinkNotice | null) => void
  /** Points at an element in the scene (null: none). */
  markElement: (element: MarkedElement | null) => void
}

export type TractusState = TractusData & TractusActions & SweepSlice & LineSlice & ShapeSlice & IntakeSlice & AssemblySlice & CaseSlice

export const DEFAULT_SECTION: SectionState = {
  enabled: false, point: [0, 0, 0], normal: [1, 0, 0], offset: 0, hide: 'auto', traction: 'normalTraction', dragging: false,
}

export const DEFAULT_ARROWS: ArrowSettings = {
  surface: false, section: true, mode: 'full', scale: 1, budget: 1500, colour: 'normal',
}

/** Arrow count (count) used when WebGL reports a software renderer: it draws instanced arrows slowly. */
export const SOFTWARE_ARROW_BUDGET = 150

const NO_ARROWS: ArrowBuffers = {
  mode: 'full', origins: new Float32Array(0), vectors: new Float32Array(0), normals: new Float32Array(0),
  magnitudes: new Float32Array(0), maxMagnitude: 0, normalTraction: new Float32Array(0),
}

/** Why a section patch cannot be taken, or null when it can. */
function sectionPatchError(patch: Partial<SectionState>): FieldError | null {
  try {
    if (patch.normal) unitNormal(patch.normal, 'section normal')
    if (patch.point) checkPoint(patch.point, 'section point')
    return null
  } catch (e) {
    if (!isInputError(e)) throw e
    return { field: e.where.field === 'normal' ? 'normal' : 'point', message: e.message }
  }
}

const INITIAL: TractusData = {
  model: null,
  inputDigests: null,
  surface: null,
  arrows: null,
  sectionBuffers: null,
  quantity: 'normalTraction',
  range: 'auto',
  colourMap: 'RdBu',
  arrowSettings: DEFAULT_ARROWS,
  section: DEFAULT_SECTION,
  sectionDrag: null,
  sectionInputError: null,
  sectionResult: null,
  audit: null,
  highlightedPatch: -1,
  probeRay: null,
  probe: null,
  units: 'SI',
  camera: null,
  viewRequest: null,
  snapshotRenderer: null,
  renderer: 'unknown',
  busy: false,
  progress: null,
  error: null,
  helpOpen: false,
  sectionAxes: { kind: 'principal' },
  cutInfo: null,
  patchRule: DEFAULT_PATCH_RULE,
  unitPreset: 'SI',
  review: EMPTY_REVIEW,
  wideCards: false,
  viewInsets: { top: 0, right: 0, bottom: 0, left: 0 },
  linkNotice: null,
  markedElement: null,
}

/**
 * The axis along which a box of these bounds is longest (ties in the order x, y, z): a new cut
 * goes across it, through the centre, so the first cut shows a cross-section of the part.
 */
export function longestAxis(bounds: { readonly min: readonly number[]; readonly max: readonly number[] }): Vec3 {
  const d = [0, 1, 2].map((k) => bounds.max[k] - bounds.min[k])
  const k = d[1] > d[0] && d[1] >= d[2] ? 1 : d[2] > d[0] && d[2] > d[1] ? 2 : 0
  return k === 0 ? [1, 0, 0] : k === 1 ? [0, 1, 0] : [0, 0, 1]
}

const tractusState: StateCreator<TractusState> = (set, get, api) => ({
  ...INITIAL,
  ...createSweepSlice(set, get, api),
  ...createIntakeSlice(set, get, api),
  ...createLineSlice(set, get, api),
  ...createShapeSlice(set, get, api),
  ...createAssemblySlice(set, get, api),
  ...createCaseSlice(set, get, api),

  setQuantity: (q) => {
    const st = get()
    const colourMap = isSignedQuantity(st.quantity) === isSignedQuantity(q) ? st.colourMap : defaultMapFor(q)
    set({ quantity: q, range: 'auto', colourMap })
  },
  setRange: (range) => set({ range }),
  setColourMap: (colourMap) => set({ colourMap }),
  setUnits: (units) => set({ units, unitPreset: units === 'SI' || units === 'US' ? units : 'custom' }),
  applyViewSettings: (v) => set({
    ...(v.quantity ? { quantity: v.quantity } : {}),
    ...(v.colourMap ? { colourMap: v.colourMap } : v.quantity ? { colourMap: defaultMapFor(v.quantity) } : {}),
    ...(v.units ? { units: v.units, unitPreset: v.units === 'SI' || v.units === 'US' ? v.units : 'custom' } : {}),
    ...(v.range ? { range: v.range } : {}),
  }),
  setArrowSettings: (patch) => set({ arrowSettings: { ...get().arrowSettings, ...patch } }),
  setSection: (patch) => {
    const refused = sectionPatchError(patch)
    if (refused) { set({ sectionInputError: refused }); return }
    const st = get()
    set({
      section: { ...st.section, ...patch },
      ...(st.sectionInputError && (patch.normal || patch.point) ? { sectionInputError: null } : {}),
    })
  },
  highlightPatch: (highlightedPatch) => set({ highlightedPatch }),
  setHelpOpen: (helpOpen) => set({ helpOpen }),
  dismissError: () => set({ error: null }),
  showError: (error) => set({ error }),

  beginSectionDrag: () => {
    const st = get()
    // Software WebGL pays for every arrow on every frame (the compositor waits for the picture):
    // the section arrows leave at once and return with the cut that follows the release.
    const drop = st.renderer === 'software' && st.sectionBuffers !== null && st.sectionBuffers.arrows.magnitudes.length > 0
    set({
      section: { ...st.section, dragging: true },
      sectionDrag: { offset: st.section.offset },
      ...(drop ? { sectionBuffers: { ...st.sectionBuffers!, arrows: NO_ARROWS } } : {}),
    })
  },
  dragSection: (offset) => {
    if (get().section.dragging && Number.isFinite(offset)) set({ sectionDrag: { offset } })
  },
  endSectionDrag: (offset) => {
    const st = get()
    const to = offset !== undefined && Number.isFinite(offset) ? offset : st.sectionDrag?.offset ?? st.section.offset
    set({ section: { ...st.section, offset: to, dragging: false }, sectionDrag: null })
  },

  requestProbe: (probeRay) => set({ probeRay }),
  requestView: (req) => set({ viewRequest: { ...req, seq: (get().viewRequest?.seq ?? 0) + 1 } }),
  cameraMoved: (camera) => set({ camera }),
  setRenderer: (renderer) => {
    const st = get()
    const lower = renderer === 'software' && st.renderer !== 'software' && st.arrowSettings.budget > SOFTWARE_ARROW_BUDGET
    set({ renderer, ...(lower ? { arrowSettings: { ...st.arrowSettings, budget: SOFTWARE_ARROW_BUDGET } } : {}) })
  },
  setSnapshotRenderer: (snapshotRenderer) => set({ snapshotRenderer }),

  loadStarted: ({ keepError }) => set({ busy: true, progress: { stage: 'Preparing', fraction: 0 }, ...(keepError ? {} : { error: null }) }),
  loadProgress: (progress) => set({ progress }),
  loadEnded: (error) => set({ busy: false, progress: null, ...(error ? { error } : {}) }),
  inputsDigested: (records) => {
    const m = get().model
    if (!m || !m.digestsPending) return
    // the same files, in the same order: names and sizes are checked, so a late reply never lands on another model
    const same = m.inputs !== undefined && m.inputs.length === records.length && m.inputs.every((f, i) => f.name === records[i].name && f.bytes === records[i].bytes)
    if (same) set({ inputDigests: records })
  },
  modelLoaded: (loaded) => {
    const { summary, surface, audit } = loaded
    const prev = get().section
    const { center: centre, radius } = modelSphere(summary.bounds)
    set({
      model: summary, inputDigests: null, surface, audit, arrows: null, sectionBuffers: null, sectionResult: null, probe: null, probeRay: null,
      highlightedPatch: -1, busy: false, progress: null, sectionDrag: null, sectionInputError: null, cutInfo: null, markedElement: null,
      // A new part gets a cut across its longest extent, through its centre.
      section: { ...DEFAULT_SECTION, enabled: prev.enabled, normal: longestAxis(summary.bounds), hide: prev.hide, traction: prev.traction, point: centre },
      // Old diagrams never sit on a new part.
      sweep: null, sweepCases: [],
      // Nor an old line; the new model's displacement, components and extremes come with it.
      line: { ...get().line, from: null, to: null }, linePicking: 'off', lineResult: null, lineError: null,
      ...shapeOfLoad(loaded),
      ...assemblyOfLoad(loaded),
      ...caseStateOfLoad(summary),
      // The model's own units follow the model.
      ...(get().unitPreset === 'model' ? { units: modelDisplayUnits(summary.units) } : {}),
    })
    // Frame the model first; a link applied after the load may then ask for its own camera.
    get().requestView({ frame: { center: centre, radius } })
  },
  surfaceArrowsShown: (arrows) => set({ arrows }),
  cutShown: (sectionResult, sectionBuffers, offset, cutInfo = null) => set({
    sectionResult, sectionBuffers, cutInfo, ...(offset !== undefined ? { section: { ...get().section, offset } } : {}),
  }),
  cutCleared: () => set({ sectionResult: null, sectionBuffers: null, cutInfo: null, regionTriangles: null }),
  probeShown: (probe) => set({ probe }),

  setSectionAxes: (sectionAxes) => set({ sectionAxes }),
  setPatchRule: (patchRule) => set({ patchRule }),
  patchesShown: (audit, patchLabel) => {
    const st = get()
    set({ audit, highlightedPatch: -1, ...(st.surface ? { surface: { ...st.surface, patch: patchLabel } } : {}) })
  },
  setUnitPreset: (preset, custom) => {
    const model = get().model
    if (preset === 'custom') { if (custom) set({ unitPreset: 'custom', units: custom }); return }
    if (preset === 'model') { set({ unitPreset: 'model', ...(model ? { units: modelDisplayUnits(model.units) } : {}) }); return }
    set({ unitPreset: preset, units: preset })
  },
  setReview: (patch) => set({ review: { ...get().review, ...patch } }),
  setWideCards: (wideCards) => set({ wideCards }),
  setViewInsets: (viewInsets) => {
    const v = get().viewInsets
    if (v.top !== viewInsets.top || v.right !== viewInsets.right || v.bottom !== viewInsets.bottom || v.left !== viewInsets.left) set({ viewInsets })
  },
  setLinkNotice: (linkNotice) => set({ linkNotice }),
  markElement: (markedElement) => set({ markedElement }),
})

/** A store of its own (tests, and anything that must not share the app's). */
export function createTractusStore(): StoreApi<TractusState> {
  return createStore<TractusState>()(tractusState)
}

/** The app's store: a React hook with the store's API (getState, setState, subscribe) on it. */
export const useStore = create<TractusState>()(tractusState)
