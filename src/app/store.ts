/**
 * The one app store (zustand). The scene reads it and writes back only what the user does in the
 * scene (section drag, probe ray, camera); the app owns every other field. No business logic here:
 * actions only set fields; the worker client (src/app/engine.ts) reacts to the requests.
 *
 * Units: unless a doc comment says otherwise, every number is in MODEL units (length L and stress S
 * of `model.units`; force S·L², moment S·L³). Conversion to the display system happens only when a
 * value is shown (src/model/units.ts `toDisplay`), so switching SI/US never touches buffers.
 *
 * Buffers arrive from the worker as transferables; treat them as immutable (replace, never mutate),
 * so a React/r3f component can key its geometry on the array identity.
 */
import { create } from 'zustand'
import type { Vec3 } from '../model/model.ts'
import type { ModelUnits, UnitSystem } from '../model/units.ts'
import type { BodyBalance, LoadPatch, SectionResult } from '../mechanics/types.ts'
import { SURFACE_QUANTITIES } from '../mechanics/surfaceTriangles.ts'
import type { SurfaceQuantity, SurfaceTriangles } from '../mechanics/surfaceTriangles.ts'

/** Scalar quantities the surface can be coloured by (the worker's buffer builder defines them). */
export type QuantityName = SurfaceQuantity
export const QUANTITY_NAMES: readonly QuantityName[] = SURFACE_QUANTITIES

/**
 * Published colour map names (viridis/cividis sequential, ColorBrewer RdBu/PuOr diverging).
 * Tables: src/app/colourMaps.ts `colourMapTable(name, 256)` (RGBA8, low end first), shared by the
 * shader and the colour bar. Map t = (value - range[0]) / (range[1] - range[0]) clamped to [0, 1].
 */
export type ColourMapName = 'viridis' | 'cividis' | 'RdBu' | 'PuOr'

/** Summary of the loaded model (no O(elements) data). */
export interface ModelSummary {
  /** Model name as given by the file (plain text; render as React text only, never as HTML). */
  readonly name: string
  readonly description: string
  readonly units: ModelUnits
  readonly nodeCount: number
  readonly elementCount: number
  readonly boundaryFaceCount: number
  /** Element count per type name, e.g. {tet10: 1200}. */
  readonly elementTypes: Readonly<Record<string, number>>
  /** Axis-aligned bounds, length units. */
  readonly bounds: { readonly min: Vec3; readonly max: Vec3 }
  /** Body force ρb, stress / length. */
  readonly bodyForce: Vec3
  /** What the reader fixed or noticed, in words. */
  readonly warnings: readonly string[]
  /** Where it came from: 'demo:<id>', 'synthetic:<spec>', or 'files:<names>'. */
  readonly source: string
  /**
   * How the load was computed: wall time per stage in the engine (ms, in order; a stage the pool
   * ran beside the others shows only the wait for it), the pool workers the element-parallel
   * kernels ran on (0: the engine alone) with the hand-over used ('shared' memory, 'copy', or
   * 'none'), plus why the pool stood down if it did.
   */
  readonly compute?: {
    readonly stagesMs: readonly (readonly [string, number])[]
    readonly workers: number
    readonly sharing: 'shared' | 'copy' | 'none'
    readonly fallback?: string
  }
}

/**
 * Boundary-surface triangles. Vertices are per face node (not shared between faces), because the
 * traction jumps across face edges. Quadratic faces are split into flat sub-triangles.
 * - `positions`, `normals`: Float32Array(3·V), length units / unit outward normals;
 * - `index`: Uint32Array(3·T) into the vertices;
 * - `scalars[q]`: Float32Array(V) per quantity, in stress units, except `balanceIndicator`
 *   (dimensionless, the element's |residual|/gross, constant over the element's faces);
 * - `ranges[q]`: [min, max] of `scalars[q]` (finite values only);
 * - `patch`: Float32Array(V), load-patch id of the vertex's face, -1 on the free surface
 *   (compare with `highlightedPatch` in the shader);
 * - `triangleFace`: Uint32Array(T), boundary-face index of each triangle (picking, patches).
 */
export type SurfaceBuffers = Omit<SurfaceTriangles, 'faceVertexStart' | 'bounds'> & {
  /** Optional feature-edge segments, Float32Array(6·S), length units (src/mechanics/featureEdges.ts). */
  readonly edges?: Float32Array
}

/**
 * Instanced arrows, already decimated by area to at most `ArrowSettings.budget`:
 * - `origins`: Float32Array(3·A), length units, the arrow's tail;
 * - `vectors`: Float32Array(3·A), stress units (traction, its normal part or its shear part
 *   according to `mode`);
 * - `normals`: Float32Array(3·A), unit outward face normal (or section normal m) at each arrow;
 * - `magnitudes`: Float32Array(A) = |vectors|, stress units; `maxMagnitude` their maximum.
 * (This is the ArrowSamples record of src/mechanics/arrowSampling.ts, passed through.)
 * Drawn length = scale · |v| / maxMagnitude · 0.08 · (diagonal of the model bounds).
 */
export interface ArrowBuffers {
  readonly mode: ArrowMode
  readonly origins: Float32Array
  readonly vectors: Float32Array
  readonly normals: Float32Array
  readonly magnitudes: Float32Array
  readonly maxMagnitude: number
}

/**
 * The filled section face: triangulated cut polygons.
 * - `positions`: Float32Array(3·V) length units; `index`: Uint32Array(3·T);
 * - `normalTraction`: Float32Array(V) = m·(σm), stress units, tension positive;
 * - `shearTraction`: Float32Array(V) = |σm - (m·σm)m|, stress units;
 * - `ranges`: [min, max] of each; `arrows`: traction σm on the section, same rules as surface arrows.
 */
export interface SectionBuffers {
  readonly positions: Float32Array
  readonly index: Uint32Array
  readonly normalTraction: Float32Array
  readonly shearTraction: Float32Array
  readonly ranges: { readonly normalTraction: readonly [number, number]; readonly shearTraction: readonly [number, number] }
  readonly arrows: ArrowBuffers
}

export type ArrowMode = 'full' | 'normal' | 'shear'

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
  /** 'magnitude': arrows coloured by |v| with the current colour map; 'single': one colour. */
  readonly colour: 'magnitude' | 'single'
}

/**
 * The cutting plane the user controls. The plane used is point + offset·n̂ with unit normal n̂
 * (see `sectionPlaneOf`). `point` length units, `normal` any non-zero vector (normalised on use),
 * `offset` length units along n̂. `hide`: which side of the plane is hidden in the scene
 * ('positive' = the +n side, the side whose action the resultant reports), or 'none'.
 * `traction`: which section traction colours the fill. `dragging`: true while the handle or the
 * offset slider moves; on software WebGL the app then cuts without section arrows (they return on
 * release), and a slider drag moves `offset` only together with its cut result.
 */
export interface SectionState {
  readonly enabled: boolean
  readonly point: Vec3
  readonly normal: Vec3
  readonly offset: number
  readonly hide: 'positive' | 'negative' | 'none'
  readonly traction: 'normalTraction' | 'shearTraction'
  readonly dragging: boolean
}

/** Whole-body audit. Figures in model units; `indicator` percentiles dimensionless. */
export interface AuditSummary {
  readonly body: BodyBalance
  /** Percentiles 50/95/100 of the element balance indicator (dimensionless). */
  readonly indicator: { readonly p50: number; readonly p95: number; readonly max: number }
  readonly patches: readonly LoadPatch[]
  /** Threshold and reference stress used to find patches (stress units). */
  readonly threshold: number
  readonly referenceStress: number
  /** Traction left on the free surface: area L², mean/peak S, relative dimensionless. */
  readonly freeSurface: { readonly area: number; readonly mean: number; readonly relative: number; readonly peak: number }
}

/** A pick ray in model coordinates (length units; direction need not be unit). */
export interface ProbeRay {
  readonly origin: Vec3
  readonly direction: Vec3
}

/**
 * What the probe read at the picked point. `stress` 6 components xx,yy,zz,xy,yz,xz (S),
 * `principal` σ1 ≥ σ2 ≥ σ3 (S), `vonMises` (S), `normal` unit outward normal (or the section
 * normal m), `traction` σn (S), its `normalTraction` (S) and `shearTraction` magnitude (S).
 * `where`: 'surface' or 'section'; `elementId`: the user's element id.
 */
export interface ProbeResult {
  readonly where: 'surface' | 'section'
  readonly position: Vec3
  readonly elementId: number
  readonly stress: readonly [number, number, number, number, number, number]
  readonly principal: Vec3
  readonly vonMises: number
  readonly normal: Vec3
  readonly traction: Vec3
  readonly normalTraction: number
  readonly shearTraction: number
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
  readonly frame?: { readonly center: Vec3; readonly radius: number; /** Outward normal of what is framed, to look at it from outside; optional. */ readonly normal?: Vec3 }
}

/**
 * Renders the current view off-screen at `width`×`height` device pixels and returns a canvas
 * with the picture (no overlays); the scene registers it, the snapshot card composes overlays.
 */
export type SnapshotRenderer = (width: number, height: number) => HTMLCanvasElement | OffscreenCanvas | Promise<HTMLCanvasElement | OffscreenCanvas>

/** A user-facing error shown by the error card: message plus where, when known. */
export interface AppError {
  readonly message: string
  readonly file?: string
  readonly line?: number
  /** Short hint on what to fix, when there is one. */
  readonly hint?: string
}

export interface Progress {
  /** Stage in words, e.g. "Reading files", "Boundary faces", "Tractions". */
  readonly stage: string
  /** 0..1 within the whole job. */
  readonly fraction: number
}

/** Colour range: 'auto' follows the data; a fixed [min, max] in the quantity's MODEL units. */
export type ColourRange = 'auto' | readonly [number, number]

export interface TractusState {
  readonly model: ModelSummary | null
  readonly surface: SurfaceBuffers | null
  readonly arrows: ArrowBuffers | null
  readonly sectionBuffers: SectionBuffers | null

  readonly quantity: QuantityName
  readonly range: ColourRange
  /** Map for the current quantity: set by the app (sequential for magnitudes, diverging for signed). */
  readonly colourMap: ColourMapName
  readonly arrowSettings: ArrowSettings

  readonly section: SectionState
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
  readonly cautionAcknowledged: boolean
  readonly helpOpen: boolean

  set: (patch: Partial<TractusState>) => void
  setSection: (patch: Partial<SectionState>) => void
  setArrowSettings: (patch: Partial<ArrowSettings>) => void
  /** Scene: the user clicked; the app asks the worker to intersect. */
  requestProbe: (ray: ProbeRay) => void
  /** Ask the scene to move the camera. */
  requestView: (req: Omit<ViewRequest, 'seq'>) => void
}

export const DEFAULT_SECTION: SectionState = {
  enabled: false, point: [0, 0, 0], normal: [1, 0, 0], offset: 0, hide: 'positive', traction: 'normalTraction', dragging: false,
}

export const DEFAULT_ARROWS: ArrowSettings = {
  surface: false, section: true, mode: 'full', scale: 1, budget: 1500, colour: 'magnitude',
}

/** Signed quantities get a diverging map centred on zero; magnitudes a sequential one. */
export function isSignedQuantity(q: QuantityName): boolean {
  return q === 'normalTraction' || q === 'principal1' || q === 'principal3'
}

export function defaultMapFor(q: QuantityName): ColourMapName {
  return isSignedQuantity(q) ? 'RdBu' : 'viridis'
}

export const useStore = create<TractusState>()((set, get) => ({
  model: null,
  surface: null,
  arrows: null,
  sectionBuffers: null,
  quantity: 'normalTraction',
  range: 'auto',
  colourMap: 'RdBu',
  arrowSettings: DEFAULT_ARROWS,
  section: DEFAULT_SECTION,
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
  cautionAcknowledged: false,
  helpOpen: false,
  set: (patch) => set(patch),
  setSection: (patch) => set({ section: { ...get().section, ...patch } }),
  setArrowSettings: (patch) => set({ arrowSettings: { ...get().arrowSettings, ...patch } }),
  requestProbe: (ray) => set({ probeRay: ray }),
  requestView: (req) => set({ viewRequest: { ...req, seq: (get().viewRequest?.seq ?? 0) + 1 } }),
}))

/** The plane in use: unit normal, point moved by `offset` along it. Falls back to +x for a zero normal. */
export function sectionPlaneOf(s: SectionState): { point: Vec3; normal: Vec3 } {
  let [nx, ny, nz] = s.normal
  const len = Math.hypot(nx, ny, nz)
  if (!(len > 0) || !Number.isFinite(len)) { nx = 1; ny = 0; nz = 0 } else { nx /= len; ny /= len; nz /= len }
  const [px, py, pz] = s.point
  return { point: [px + s.offset * nx, py + s.offset * ny, pz + s.offset * nz], normal: [nx, ny, nz] }
}

/** The colour range in use for the current quantity (model units), resolving 'auto'. */
export function activeRange(s: Pick<TractusState, 'range' | 'quantity' | 'surface'>): readonly [number, number] {
  if (s.range !== 'auto') return s.range
  const r = s.surface?.ranges[s.quantity] ?? [0, 1]
  if (isSignedQuantity(s.quantity)) {
    // Diverging maps centre on zero: a symmetric range keeps white at zero.
    const a = Math.max(Math.abs(r[0]), Math.abs(r[1])) || 1
    return [-a, a]
  }
  return r[0] === r[1] ? [r[0], r[0] + 1] : r
}
