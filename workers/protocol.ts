/**
 * The worker protocol: every type that crosses the boundary between the app and the engine worker,
 * in one place. Requests and replies travel by structured clone; typed arrays inside replies are
 * moved with transfer (never copied as JSON). The app's store (src/state) keeps these records as
 * they arrive, so it imports its types from here; this file imports nothing from the UI.
 *
 * Units: unless a doc comment says otherwise, every number is in MODEL units (length L and stress
 * S of the model's units; force S·L², moment S·L³). Conversion to a display system happens only
 * where a value is shown.
 */
import type { BalanceVerdict } from '../src/mechanics/balanceVerdict.ts'
export type { BalanceVerdict, BalanceVerdictKind } from '../src/mechanics/balanceVerdict.ts'
import type { Vec3 } from '../src/model/model.ts'
import type { LengthUnit, ModelUnits, StressUnit } from '../src/model/units.ts'
import type { Plane } from '../src/mechanics/plane.ts'
import type { BodyBalance, LoadPatch, SectionResult } from '../src/mechanics/types.ts'
import type { SurfaceQuantity, SurfaceTriangles } from '../src/mechanics/surfaceTriangles.ts'
import type { SurfaceClusters } from '../src/mechanics/surfaceClusters.ts'
import type { ArrowMode, ArrowSamples } from '../src/mechanics/arrowSampling.ts'
import type { ComponentAxes } from '../src/mechanics/componentAxes.ts'
import type { ComponentQuantity, ComponentScalars } from '../src/mechanics/componentScalars.ts'
import type { EquivalentCriterion, Linearisation } from '../src/mechanics/linearisation.ts'
import type { ScalarExtremes } from '../src/mechanics/scalarExtremes.ts'
import type { SectionAxesChoice, SectionAxesKind } from '../src/mechanics/sectionAxes.ts'
import type { InterfaceRecord, PartRecord } from '../src/mechanics/partBalance.ts'
import type { Combination } from '../src/model/loadCases.ts'
import type { EnvelopeEntry, ResultantEnvelope } from '../src/mechanics/sectionEnvelope.ts'
import type { SweepCases } from '../src/mechanics/sweepEnvelope.ts'

export type { ArrowMode, Plane, SectionAxesChoice, SectionAxesKind, SurfaceQuantity, Vec3 }
export type { ComponentAxes, ComponentQuantity, EquivalentCriterion, Linearisation, ScalarExtremes }

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
  /** The files the model was read from, for traceability (absent for a generated model). */
  readonly inputs?: readonly InputFileRecord[]
  /**
   * True while the files' digests are still being computed (they start after the model's first
   * picture: EngineApi.inputDigests); `inputs` then has names and sizes only.
   */
  readonly digestsPending?: boolean
  /** Whether the stress came per node or per element node. */
  readonly stressLayout?: 'nodal' | 'element-nodal'
  // --- intake ---
  /** False when the files declare no units (or only one): the top bar and the model card say so. */
  readonly unitsDeclared?: boolean
  // --- load cases ---
  /** The model's load cases in order (one, `default`, for a model without cases) and its combinations. */
  readonly cases?: readonly CaseInfo[]
  readonly combinations?: readonly Combination[]
  /** The case or combination whose fields everything shows. */
  readonly shownCase?: string
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
 *   (compare with the highlighted patch in the shader);
 * - `triangleFace`: Uint32Array(T), boundary-face index of each triangle (picking, patches).
 */
export type SurfaceBuffers = Omit<SurfaceTriangles, 'faceVertexStart' | 'bounds'> & {
  /** Optional feature-edge segments, Float32Array(6·S), length units (src/mechanics/featureEdges.ts). */
  readonly edges?: Float32Array
  /**
   * Optional clusters of consecutive triangles with a bounding sphere and a normal cone each
   * (src/mechanics/surfaceClusters.ts: `start` Int32Array(K + 1), `bounds` Float32Array(8·K)); the
   * triangles are then in spatial order, and no cluster crosses a part's range (`partTriangles`).
   */
  readonly clusters?: SurfaceClusters
}

/**
 * Instanced arrows, already decimated by area to at most the requested budget:
 * - `origins`: Float32Array(3·A), length units, the arrow's tail;
 * - `vectors`: Float32Array(3·A), stress units (traction, its normal part or its shear part
 *   according to `mode`);
 * - `normals`: Float32Array(3·A), unit outward face normal (or section normal m) at each arrow;
 * - `magnitudes`: Float32Array(A) = |vectors|, stress units; `maxMagnitude` their maximum;
 * - `normalTraction`: Float32Array(A), signed normal traction t̄·n (stress units, tension +),
 *   whatever the mode: what the arrows are coloured by.
 * (This is the ArrowSamples record of src/mechanics/arrowSampling.ts, passed through.)
 * Drawn length = scale · |v| / maxMagnitude · 0.08 · (diagonal of the model bounds).
 */
export interface ArrowBuffers extends Pick<ArrowSamples, 'mode' | 'origins' | 'vectors' | 'normals' | 'magnitudes' | 'maxMagnitude' | 'normalTraction'> {
  /**
   * Float32Array(3·A), length units: the displacement the deformed shape moves each arrow's
   * origin by (the mean over its face's nodes, or its section polygon's vertices); absent
   * when the model has no displacement.
   */
  readonly displacement?: Float32Array
}

/**
 * A section face to draw: triangles of points carrying the traction σm of the section.
 * - `positions`: Float32Array(3·V) length units; `index`: Uint32Array(3·T);
 * - `normalTraction`: Float32Array(V) = m·(σm), stress units, tension positive;
 * - `shearTraction`: Float32Array(V) = |σm - (m·σm)m|, stress units;
 * - `displacement`: Float32Array(3·V), length units, at each point (the deformed shape); absent without displacement.
 */
export interface SectionFaceArrays {
  readonly positions: Float32Array
  readonly index: Uint32Array
  readonly normalTraction: Float32Array
  readonly shearTraction: Float32Array
  readonly displacement?: Float32Array
}

/**
 * The filled section face: triangulated cut polygons (or, for a drag step that asked for the
 * light face only, its coarser face), with
 * - `ranges`: [min, max] of each traction over the full face; `arrows`: traction σm on the
 *   section, same rules as surface arrows;
 * - `light`: the coarser face of about 2·10^4 triangles (workers/sectionFace.ts), when asked
 *   for and the face has more: a software renderer draws it while the plane is dragged.
 */
export interface SectionBuffers extends SectionFaceArrays {
  readonly ranges: { readonly normalTraction: readonly [number, number]; readonly shearTraction: readonly [number, number] }
  readonly arrows: ArrowBuffers
  readonly light?: SectionFaceArrays
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
  /** Net force ∫ t dA over the nominally free surface (force units). */
  readonly freeSurfaceForce: Vec3
  /** Mesh error or model error, with its reason in words (src/mechanics/balanceVerdict.ts). */
  readonly verdict: BalanceVerdict
  /** The patches' lower threshold (stress units), the fractions of the reference stress, and the feature angle (degrees). */
  readonly lowerThreshold: number
  readonly fractions: { readonly threshold: number; readonly lowerThreshold: number }
  readonly featureAngle: number
  /** The least balanced elements, largest indicator first (src/mechanics/leastBalanced.ts). */
  readonly leastBalanced: readonly LeastBalancedElement[]
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
  /** Displacement at the point (length units), when the model has it. */
  readonly displacement?: Vec3
}

/** A user-facing error (shown by the error card): message plus where, when known. */
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

/**
 * How the engine may use the machine (a diagnostic setting read from the page address by
 * src/app/computeOptions.ts).
 */
export interface ComputeOptions {
  /** Workers for element-parallel kernels; absent = one per core (at most 4). */
  readonly threads?: number
  /** 'copy' forces the copying hand-over; absent = shared memory where the page allows it. */
  readonly sharing?: 'copy'
}

/**
 * A generated model: `block` is a tet4 box carrying the end-loaded cantilever stress field of
 * Timoshenko & Goodier §21 (smooth, in equilibrium), with at least `elements` elements.
 */
export interface SyntheticSpec {
  readonly kind: 'block'
  readonly elements: number
}

/**
 * Largest generated block (elements), so a typed link cannot exhaust memory: 10^7 tet4 is the
 * size the browser test opens (about 0.35 GB of model arrays, as much again for the analysis).
 */
export const MAX_SYNTHETIC_ELEMENTS = 10_000_000

/**
 * One file of a model: name plus bytes (binary container) or text (CSV, JSON), or the user's file
 * itself (a Blob: a handle, not its bytes), which the worker reads in slices (workers/inputFiles.ts).
 */
export interface EngineFile {
  readonly name: string
  readonly data: ArrayBuffer | string | Blob
}

export type ModelSource =
  | {
    readonly kind: 'files'; readonly files: readonly EngineFile[]; readonly label?: string; readonly inputs?: readonly InputFileRecord[]
    // --- intake: units chosen when opening, for those the files do not declare ---
    readonly units?: { readonly length?: LengthUnit; readonly stress?: StressUnit }
  }
  | { readonly kind: 'synthetic'; readonly spec: SyntheticSpec }

export interface LoadedModel {
  readonly summary: ModelSummary
  readonly surface: SurfaceBuffers
  readonly audit: AuditSummary
  /** Lines, deformed shape and components (the block at the end of this file); absent from older engines' replies. */
  readonly extras?: LoadExtras
  // --- assemblies ---
  /** Parts, their balance and interfaces; absent when the model has one part. */
  readonly assembly?: AssemblySummary
}

/**
 * What a case switch sends (showCase): a load's reply without what does not depend on the case.
 * The surface's positions, normals, triangles, triangle faces and feature edges stay those of the
 * load (the scene keeps them on the GPU and replaces the scalar it shows); the assembly's
 * triangle groups, part colours and interface mesh stay too, its parts and interfaces are the
 * case's.
 */
export interface CaseShown {
  readonly summary: ModelSummary
  readonly surface: Pick<SurfaceBuffers, 'scalars' | 'ranges' | 'patch'>
  readonly audit: AuditSummary
  readonly extras?: LoadExtras
  readonly assembly?: Pick<AssemblySummary, 'parts' | 'interfaces'>
}

/** Either a value or a user-facing error; input problems come back as values, not exceptions. */
export type Outcome<T> = { readonly ok: true; readonly value: T } | { readonly ok: false; readonly error: AppError }

export interface ArrowRequest {
  readonly mode: ArrowMode
  /** Largest arrow count (count). */
  readonly budget: number
}

export interface CutReply {
  readonly result: SectionResult
  readonly buffers: SectionBuffers | null
  /** Time the engine spent on this cut (ms): the section, its triangles and arrows. */
  readonly computeMs: number
  readonly info?: CutInfo
  // --- assemblies ---
  /**
   * With regions: the section's triangles (`buffers.index`) are grouped by region, region k
   * (result.regions order) from triangle regionTriangles[k] to regionTriangles[k + 1] − 1; the
   * polygons outside a limit come last.
   */
  readonly regionTriangles?: Int32Array
}

export interface ProbeRequest {
  readonly ray: ProbeRay
  /** The section in use (or null); the hidden side cannot be picked. */
  readonly section: { readonly plane: Plane; readonly hide: 'positive' | 'negative' | 'none' } | null
  /**
   * Scale of the deformed shape on screen (0 or absent: undeformed). The ray then meets the
   * surface and the section as drawn, moved by scale × displacement, and the probe reads the
   * material point under the hit.
   */
  readonly deformScale?: number
}

export type ProgressCallback = (p: Progress) => void

/** The six section quantities a sweep reply carries as series, in section axes. */
export type SeriesKey = 'axial' | 'shear1' | 'shear2' | 'torque' | 'bending1' | 'bending2'

/**
 * A row of parallel sections along unit normal `normal` (see src/mechanics/sectionSweep.ts):
 * section k lies on the plane x·m = offsets[k]. `offsets` length units; axial, shear1, shear2
 * force units (S·L²); torque, bending1, bending2 moment units (S·L³), section axes per section,
 * moments about each section's centroid; `freeBodyRelative` (force residual / gross) and
 * `freeBodyMomentRelative` (moment residual / (gross · L), see freeBody.ts) dimensionless; `empty[k]` = 1 where
 * plane k misses the body (its figures are 0). `extent`: [min, max] of x·m over the nodes (L).
 */
export interface SweepReply {
  readonly normal: Vec3
  readonly extent: readonly [number, number]
  readonly offsets: Float64Array
  readonly axial: Float64Array
  readonly shear1: Float64Array
  readonly shear2: Float64Array
  readonly torque: Float64Array
  readonly bending1: Float64Array
  readonly bending2: Float64Array
  readonly freeBodyRelative: Float64Array
  readonly freeBodyMomentRelative: Float64Array
  readonly empty: Uint8Array
  /** The section axes of every section: one kind and one reference (unit) for the whole sweep. */
  readonly axes: { readonly kind: SectionAxesKind; readonly reference: Vec3 }
  /**
   * Every load case and combination (the model's and the app's) at the same sections, and the
   * envelope per section (src/mechanics/sweepEnvelope.ts); present when asked for and the model
   * has more than one. The free-body residuals above are the shown case's.
   */
  readonly cases?: SweepCases
}

/** What a sweep over every case needs: the app's combinations, and whether the envelope ranges over combinations only. */
export interface SweepCaseRequest {
  readonly combinations: readonly Combination[]
  readonly combinationsOnly?: boolean
}

// Reading the results: section axes, the patch rule, traceability, least balanced elements.

/** How a cut is resolved: its section axes (principal by default). */
/** One cut as the app asks for it (EngineApi.cut's arguments). */
export interface CutRequest {
  readonly plane: Plane
  readonly arrows: ArrowRequest
  readonly options: CutOptions
}

export interface CutOptions {
  readonly axes?: SectionAxesChoice
  // --- assemblies ---
  /** Split the cut into regions (off while dragging: the card shows them on release). */
  readonly regions?: boolean
  /** A bounded section: the figures are those of the selected polygons only. */
  readonly limit?: CutLimit | null
  /**
   * The light section face (SectionBuffers.light, for a software renderer): 'also' adds it to
   * the full face when the face is larger; 'only' (a drag step) sends it in the full face's place.
   */
  readonly lightFace?: 'also' | 'only'
}

/**
 * What the engine adds to a cut: `axesNote` when the asked-for reference was parallel to the
 * normal (the cut then used the default reference, and says so); `extent` [min, max] of x·m over
 * the nodes (length units) when the plane missed the body, so the card can say where the body is.
 */
export interface CutInfo {
  readonly axesNote?: string
  readonly extent?: readonly [number, number]
}

/**
 * The load-entry patch rule (src/mechanics/loadPatches.ts): a face above `threshold` × the
 * reference stress starts a patch, one above `lowerThreshold` × it may join one; patches split
 * where neighbouring faces' normals differ by more than `featureAngle` degrees, and between parts.
 */
export interface PatchRule {
  readonly threshold: number
  readonly lowerThreshold: number
  readonly featureAngle: number
}

/** Patches by a new rule: the audit (patches, thresholds, free surface, verdict) and the per-vertex patch labels of the surface. */
export interface PatchReply {
  readonly audit: AuditSummary
  /** Float32Array(V), like SurfaceBuffers.patch. */
  readonly patchLabel: Float32Array
}

/** One of the least balanced elements: the user's id, its indicator, its centre and size (length units; to frame it). */
export interface LeastBalancedElement {
  readonly id: number
  readonly indicator: number
  readonly centre: Vec3
  readonly radius: number
}

/** An input file as read: its name, size in bytes and SHA-256 (hex), for the report's traceability. */
export interface InputFileRecord {
  readonly name: string
  readonly bytes: number
  /** Lower-case hex SHA-256 of the bytes read; absent where the browser offers no digest. */
  readonly sha256?: string
}

/** Kinds of deliberate failure the end-to-end build's engine can be asked for (see `crash`). */
export type CrashKind = 'throw' | 'memory'

export interface EngineApi {
  /** Sets how the engine may use the machine; before any job. */
  configure(options: ComputeOptions): void
  /** Reads and analyses a model; `rule`: the load-entry patch rule (the defaults when absent). */
  load(source: ModelSource, onProgress?: ProgressCallback, rule?: PatchRule): Promise<Outcome<LoadedModel>>
  /**
   * The app has shown the loaded model's first picture: the engine may start what follows a load
   * and is not needed for it (a large model's element chunks on the pool, then a warm-up cut), so
   * that this work does not share the cores with the picture's drawing. Not calling it costs only
   * speed: the chunks are then built by the engine at the second cut. `likelyCut`: the cut the
   * app asks for when the section is switched on as it stands (its plane, arrows and options);
   * the warm-up cut is that cut, and its reply is kept for that request (`cut` answers it at once
   * when it comes first, on the same model and case).
   */
  pictureShown(likelyCut?: CutRequest): void
  /**
   * The loaded model's input records with their SHA-256 digests, once computed (they start when
   * the first picture is shown, or when this is asked for first); null when the model was not
   * read from the user's files.
   */
  inputDigests(): Promise<readonly InputFileRecord[] | null>
  surfaceArrows(req: ArrowRequest): Promise<ArrowBuffers | null>
  cut(plane: Plane, arrows: ArrowRequest, options?: CutOptions): Promise<Outcome<CutReply>>
  probe(req: ProbeRequest): Promise<ProbeResult | null>
  /** Sections along `normal`; `from`/`to` default to the model's extent along it (length units). */
  sweep(normal: Vec3, count: number, from?: number, to?: number, axes?: SectionAxesChoice, cases?: SweepCaseRequest): Promise<Outcome<SweepReply>>
  /** The load-entry patches again, by another rule: the audit with them and the surface's patch labels. */
  patches(rule: PatchRule): Promise<Outcome<PatchReply>>
  /** The surface's stress and displacement components in `axes`. */
  components(axes: ComponentAxes): Promise<Outcome<ComponentBuffers>>
  /** Values along a line and its linearisation. */
  line(req: LineRequest): Promise<Outcome<LineReply>>
  /** The line along from → to moved to where it enters and leaves the material; null when it misses the body. */
  lineThroughWall(from: Vec3, to: Vec3): Promise<{ readonly from: Vec3; readonly to: Vec3 } | null>
  // --- load cases ---
  /**
   * Shows case or combination `name` (the model's combinations and the app's own `combinations`):
   * the analysis again on its fields, the mesh's boundary faces kept. The reply carries only what
   * the case changes (CaseShown); the surface's geometry of the load stays.
   */
  showCase(name: string, combinations: readonly Combination[], rule?: PatchRule): Promise<Outcome<CaseShown>>
  /** Every case and combination of the section `plane`, and their envelope (section and regions). */
  envelope(plane: Plane, request: EnvelopeRequest): Promise<Outcome<EnvelopeReply>>
  /**
   * Present only in the end-to-end build (`vite build --mode e2e`): throws an unexpected
   * (non-input) error, or fails an allocation, inside the worker, so the browser tests can check
   * that the app recovers. The release build leaves it out.
   */
  crash?(kind: CrashKind): Promise<void>
  dispose(): void
}

/** The engine as the app calls it: the same methods, every one asynchronous (comlink's view). */
export type EngineCalls = {
  readonly [K in keyof EngineApi]: NonNullable<EngineApi[K]> extends (...args: infer A) => infer R ? (...args: A) => Promise<Awaited<R>> : never
}

// ---------------------------------------------------------------------------------------------
// Lines, the deformed shape and stress components (one block, so it merges apart from the rest).

/**
 * What a load adds for the deformed shape, the component quantities and the extremes markers.
 * - `deformation`: null without displacement; else `surface` Float32Array(3·V) the nodal
 *   displacement at each surface vertex, `edges` Float32Array(6·S) at the feature-edge ends, and
 *   `max` the largest |u| over the nodes (length units), for the automatic scale.
 * - `components`: the component scalars in global axes (src/mechanics/componentScalars.ts).
 * - `extremes[q]`: smallest and largest value of each surface quantity and the vertex it is at.
 */
export interface LoadExtras {
  readonly deformation: DeformationBuffers | null
  readonly components: ComponentBuffers
  readonly extremes: Readonly<Record<SurfaceQuantity, ScalarExtremes>>
}

export interface DeformationBuffers {
  readonly surface: Float32Array
  readonly edges: Float32Array
  readonly max: number
}

/**
 * The surface's component scalars in `axes`: 'sxx' … 'sxz' stress components ([rr, θθ, zz, rθ,
 * θz, rz] in cylindrical axes), 'ux' 'uy' 'uz' displacement components and 'displacement' its
 * magnitude when present; Float32Array(V) each, with ranges and extremes.
 */
export type ComponentBuffers = ComponentScalars

/**
 * A line through the model: `points` samples from `from` to `to` (both included, ≥ 2),
 * `criterion` of the linearised equivalent stresses, `axes` of the components (and of the
 * linearisation frame: cylindrical axes give the hoop/meridional frame).
 */
export interface LineRequest {
  readonly from: Vec3
  readonly to: Vec3
  readonly points: number
  readonly criterion: EquivalentCriterion
  readonly axes: ComponentAxes
}

/**
 * Values along the line (P points), model units; every per-point value is NaN where the point
 * lies outside the body (`held[i]` = 0):
 * - `points` Float64Array(3P), `distance` Float64Array(P) from `from`;
 * - `stress` Float64Array(6P) global axes; `components` Float64Array(6P) in `axes`;
 * - `vonMises` Float64Array(P); `principal` Float64Array(3P) σ1 ≥ σ2 ≥ σ3;
 * - `displacement`, `displacementComponents` Float64Array(3P) or null without displacement;
 * - `linearisation` (src/mechanics/linearisation.ts) or null with the reason in `refused`;
 * - `warnings` about the ends; `outside` true when no point lies in the body.
 */
export interface LineReply {
  readonly from: Vec3
  readonly to: Vec3
  readonly length: number
  readonly axes: ComponentAxes
  readonly criterion: EquivalentCriterion
  readonly points: Float64Array
  readonly distance: Float64Array
  readonly stress: Float64Array
  readonly components: Float64Array
  readonly vonMises: Float64Array
  readonly principal: Float64Array
  readonly displacement: Float64Array | null
  readonly displacementComponents: Float64Array | null
  readonly held: Uint8Array
  readonly linearisation: Linearisation | null
  readonly refused: string | null
  readonly warnings: readonly string[]
  readonly outside: boolean
}

// ---------------------------------------------------------------------------------------------
// --- assemblies --- parts, interfaces and bounded sections (src/mechanics/partBalance.ts,
// sectionRegions.ts).

/** A bounded section: parts (numbers) and/or a disc (centre projected onto the plane, radius > 0; length units). */
export interface CutLimit {
  readonly parts?: readonly number[]
  readonly within?: { readonly center: Vec3; readonly radius: number }
}

/**
 * One part (PartRecord of src/mechanics/partBalance.ts): its number, name ('' when none), element
 * count, volume (L³) and its own balance (BodyBalance, model units).
 */
export type PartSummary = PartRecord

/**
 * One interface between parts a < b (InterfaceRecord): `force` what a exerts on b (b's faces,
 * b's stress), `reverseForce` what b exerts on a, `moment` of `force` about `centroid`,
 * `mismatch` |F_ab + F_ba| / gross (dimensionless), `gross` ∫|t| dA (force), `faces` the count.
 */
export type InterfaceSummary = InterfaceRecord

/**
 * The assembly of a model with several parts:
 * - `parts` ascending by number; `interfaces` ascending by (a, b);
 * - `partTriangles` Int32Array(P + 2): the surface's triangles are grouped by part (in `parts`
 *   order), part k from partTriangles[k] to partTriangles[k + 1] − 1;
 * - `vertexPart` the part's rank at each surface vertex;
 * - `interfacePositions` Float32Array(9·T) length units, triangles of the interfaces' faces,
 *   interface i from interfaceTriangles[i] to interfaceTriangles[i + 1] − 1.
 */
export interface AssemblySummary {
  readonly parts: readonly PartSummary[]
  readonly interfaces: readonly InterfaceSummary[]
  readonly partTriangles: Int32Array
  /** Float32Array(V): the rank of each surface vertex's part in `parts` (colour by part). */
  readonly vertexPart: Float32Array
  readonly interfacePositions: Float32Array
  readonly interfaceTriangles: Int32Array
}

// --- load cases ---

export type { Combination }
export type { EnvelopeEntry, ResultantEnvelope }

/** One load case as the app lists it: name, description, ρb (stress / length) and whether it has a displacement. */
export interface CaseInfo {
  readonly name: string
  readonly description: string
  readonly bodyForce: Vec3
  readonly displacement: boolean
}

/** What the envelope of a section ranges over: the app's own combinations too, and whether over combinations only. */
export interface EnvelopeRequest {
  readonly combinations: readonly Combination[]
  readonly combinationsOnly: boolean
  readonly axes?: SectionAxesChoice
}

/** One case's (or combination's) resultant of the section in section axes: force S·L², moment S·L³ about the centroid. */
export interface CaseResultant {
  readonly name: string
  readonly kind: 'case' | 'combination'
  readonly axial: number
  readonly shear: readonly [number, number]
  readonly torque: number
  readonly bending: readonly [number, number]
}

/**
 * The envelope of a section (src/mechanics/sectionEnvelope.ts): every case and combination, then
 * per component the largest and smallest value and the case that governs each; per region
 * (largest area first) its area (L²), centroid (L), parts and envelope. `envelope` is null when
 * the plane misses the body or there is nothing to envelope.
 */
export interface EnvelopeReply {
  readonly plane: Plane
  readonly combinationsOnly: boolean
  readonly cases: readonly CaseResultant[]
  readonly envelope: ResultantEnvelope | null
  readonly regions: readonly { readonly area: number; readonly centroid: Vec3; readonly parts: readonly number[]; readonly envelope: ResultantEnvelope | null; readonly cases: readonly CaseResultant[] }[]
  readonly axes: { readonly e1: Vec3; readonly e2: Vec3; readonly e3: Vec3; readonly kind: SectionAxesKind }
  /** Time the engine spent (ms). */
  readonly computeMs: number
}
