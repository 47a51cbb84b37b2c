/**
 * Messages between the app and the engine worker. Everything here crosses the worker boundary by
 * structured clone; typed arrays inside replies are moved with transfer (never copied as JSON).
 * Units: model units throughout (see src/app/store.ts).
 */
import type { Vec3 } from '../src/model/model.ts'
import type { ComputeOptions } from '../src/app/computeOptions.ts'
import type { SectionPlane, SectionResult } from '../src/mechanics/types.ts'
import type {
  AppError, ArrowBuffers, ArrowMode, AuditSummary, ModelSummary, ProbeRay, ProbeResult, Progress,
  SectionBuffers, SurfaceBuffers,
} from '../src/app/store.ts'

/** One file of a model: name plus bytes (binary container) or text (CSV, JSON). */
export interface EngineFile {
  readonly name: string
  readonly data: ArrayBuffer | string
}

/**
 * A generated model: `block` is a tet4 box carrying the end-loaded cantilever stress field of
 * Timoshenko & Goodier §21 (smooth, in equilibrium), with at least `elements` elements.
 */
export interface SyntheticSpec {
  readonly kind: 'block'
  readonly elements: number
}

export type ModelSource =
  | { readonly kind: 'files'; readonly files: readonly EngineFile[]; readonly label?: string }
  | { readonly kind: 'synthetic'; readonly spec: SyntheticSpec }

export interface LoadedModel {
  readonly summary: ModelSummary
  readonly surface: SurfaceBuffers
  readonly audit: AuditSummary
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
}

export interface ProbeRequest {
  readonly ray: ProbeRay
  /** The section in use (or null); the hidden side cannot be picked. */
  readonly section: { readonly plane: SectionPlane; readonly hide: 'positive' | 'negative' | 'none' } | null
}

export type ProgressCallback = (p: Progress) => void

/**
 * A row of parallel sections along unit normal `normal` (see src/mechanics/sectionSweep.ts):
 * section k lies on the plane x·m = offsets[k]. `offsets` length units; axial, shear1, shear2
 * force units (S·L²); torque, bending1, bending2 moment units (S·L³), section axes per section,
 * moments about each section's centroid; `freeBodyRelative` dimensionless; `empty[k]` = 1 where
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
  readonly empty: Uint8Array
}

export interface EngineApi {
  /** Sets how the engine may use the machine (see src/app/computeOptions.ts); before any job. */
  configure(options: ComputeOptions): void
  load(source: ModelSource, onProgress?: ProgressCallback): Promise<Outcome<LoadedModel>>
  surfaceArrows(req: ArrowRequest): Promise<ArrowBuffers | null>
  cut(plane: SectionPlane, arrows: ArrowRequest): Promise<Outcome<CutReply>>
  probe(req: ProbeRequest): Promise<ProbeResult | null>
  /** Sections along `normal`; `from`/`to` default to the model's extent along it (length units). */
  sweep(normal: Vec3, count: number, from?: number, to?: number): Promise<Outcome<SweepReply>>
  /** Test hook: throws an unexpected (non-input) error inside the worker. */
  crash(kind?: 'throw' | 'memory'): Promise<void>
  dispose(): void
}

export type { Vec3 }
