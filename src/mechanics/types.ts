/**
 * Result records of the mechanics kernels. This file is the contract between the kernels, the
 * worker, the CLI and the app: fields may be added, never renamed or removed without updating
 * every user. All values are in model units (length L, stress S, force S·L², moment S·L³).
 */
import type { Vec3 } from '../model/model.ts'
import type { Plane } from './plane.ts'
import type { SectionAxes } from './sectionAxes.ts'

/**
 * The largest stride of per-face-node arrays (a quad8 face): an upper bound for `BoundaryFaces.slots`,
 * e.g. for scratch buffers sized once for any face.
 */
export const FACE_SLOTS = 8

/**
 * Boundary faces: faces used by exactly one element, oriented outward.
 * - `elem`: global element index; `localFace`: face number in the element's topology.
 * - `slots`: stride of every per-face-node array (`nodes` here and the node arrays of
 *   SurfaceTractions): the largest node count of the face kinds the mesh's element types have
 *   (tri3 3, quad4 4, tri6 6, quad8 8; 3 for a mesh without elements). A fixed stride of 8 would
 *   waste 5 of 8 slots on an all-tet4 mesh.
 * - `kind`: FACE_KIND_CODE of the face; `nodes`: Int32Array(slots·F), the face's node indices,
 *   corners first then mid-edge nodes, counter-clockwise seen from outside, padded with -1.
 * - `area`: face area (quadrature over the curved face for quadratic faces).
 * - `normal`: Float64Array(3·F), unit area-weighted mean outward normal.
 * - `centroid`: Float64Array(3·F), area centroid.
 */
export interface BoundaryFaces {
  readonly count: number
  readonly slots: number
  readonly elem: Int32Array
  readonly localFace: Uint8Array
  readonly kind: Uint8Array
  readonly nodes: Int32Array
  readonly area: Float64Array
  readonly normal: Float64Array
  readonly centroid: Float64Array
}

/**
 * Tractions on the boundary faces, t = σn (n outward unit normal), tension positive.
 * Per face node slot (`faces.slots` per face, the stride of `faces.nodes`; NaN in unused slots):
 * - `nodeNormal` (3·slots·F): unit outward normal at that node of the face (curved faces differ per node);
 * - `nodeTraction` (3·slots·F): t at that node; `nodeNormalTraction` (slots·F): t_n = n·t;
 *   `nodeShear` (slots·F): |t - t_n n|; `nodeMagnitude` (slots·F): |t|.
 * Per face, integrated with the face's quadrature rule:
 * - `force` (3·F): ∫ t dA; `moment` (3·F): ∫ x × t dA about the origin;
 * - `meanNormal` (F): ∫ t_n dA / A; `meanShear` (F): ∫ |τ| dA / A; `meanMagnitude` (F): ∫ |t| dA / A.
 */
export interface SurfaceTractions {
  readonly nodeNormal: Float64Array
  readonly nodeTraction: Float64Array
  readonly nodeNormalTraction: Float64Array
  readonly nodeShear: Float64Array
  readonly nodeMagnitude: Float64Array
  readonly force: Float64Array
  readonly moment: Float64Array
  readonly meanNormal: Float64Array
  readonly meanShear: Float64Array
  readonly meanMagnitude: Float64Array
}

/**
 * Stress invariants at nodes (N nodes):
 * - `principal` (3·N): σ1 ≥ σ2 ≥ σ3; `directions` (9·N): unit eigenvectors, row i for σi;
 * - `vonMises`, `tresca` (= σ1 - σ3), `mean` (= (σxx+σyy+σzz)/3), each Float64Array(N).
 */
export interface NodalInvariants {
  readonly principal: Float64Array
  readonly directions: Float64Array
  readonly vonMises: Float64Array
  readonly tresca: Float64Array
  readonly mean: Float64Array
}

/** Resultant force and moment with the residual relative to a gross load (dimensionless). */
export interface BalanceFigure {
  readonly force: Vec3
  readonly moment: Vec3
  /** |force| / gross, where gross is half the sum of |face force| plus |∫ρb dV| as documented. */
  readonly relative: number
  readonly gross: number
}

/**
 * Element balance audit (E elements): `residual` (3·E) = ∮ σn dA + ∫ ρb dV over each element,
 * `gross` (E) = half the sum of |∫ σn dA| over the element's faces (plus |∫ρb dV| / 2),
 * `indicator` (E) = |residual| / gross (0 where gross is 0).
 * The caller chooses the storage: double precision (the default, used by the reference tests to
 * check quadrature exactness) or single precision (the app and the command line: sums are still
 * formed in double, seven significant digits are ample for figures that are read and ranked, and
 * at 10^6 elements this halves the 40 MB the three arrays take in double).
 */
export interface ElementBalance {
  readonly residual: Float64Array | Float32Array
  readonly gross: Float64Array | Float32Array
  readonly indicator: Float64Array | Float32Array
}

/** Whole-body balance: surface integral of t plus body force, moment about `about` (the volume centroid). */
export interface BodyBalance extends BalanceFigure {
  readonly about: Vec3
  readonly volume: number
  readonly centroid: Vec3
  readonly surfaceForce: Vec3
  readonly bodyForceTotal: Vec3
}

/** A load-entry patch: edge-connected boundary faces that carry load. */
export interface LoadPatch {
  readonly id: number
  readonly faceCount: number
  /** Part number of its faces (a patch never spans two parts; 0 where the model has no parts). */
  readonly part: number
  readonly area: number
  readonly centroid: Vec3
  /**
   * Area-weighted mean outward normal ∫ n dA / area: a unit vector for a flat patch, shorter for
   * a curved one (zero for a closed surface). Used to look at the patch from outside.
   */
  readonly normal: Vec3
  /** ∫ t dA over the patch. */
  readonly force: Vec3
  /** ∫ (x - centroid) × t dA over the patch. */
  readonly moment: Vec3
  /** Largest |t| at a face node of the patch. */
  readonly peak: number
  /** ∫ |t| dA / area. */
  readonly mean: number
}

export interface LoadPatches {
  readonly patches: readonly LoadPatch[]
  /** Int32Array(F): patch id per boundary face, -1 for the nominally free surface, -2 for a face against another part (interfaceFaces.ts). */
  readonly faceLabel: Int32Array
  /**
   * The thresholds used, in stress units (a face above `threshold` starts a patch, one above
   * `lowerThreshold` may join one), the reference stress they were derived from, the fractions
   * of it they are, and the feature angle (degrees) at which patches split.
   */
  readonly threshold: number
  readonly lowerThreshold: number
  readonly fractions: { readonly threshold: number; readonly lowerThreshold: number }
  readonly featureAngle: number
  readonly referenceStress: number
  /**
   * Traction left on the nominally free surface: area, ∫|t| dA / area (mean), its ratio to the
   * reference stress (`relative`), and the largest |t| at a free face node (`peak`).
   */
  readonly freeSurface: { readonly area: number; readonly mean: number; readonly relative: number; readonly peak: number }
}

/** A section plane through `point` with unit `normal` m; the one plane type lives in plane.ts (unit normal, checked input). */
export type SectionPlane = Plane

/**
 * Section result by the section convention of DEVELOPERS.md (Conventions): force and moment the material on the +m side
 * exerts on the material on the -m side: F = ∫ σm dA, M = ∫ (x - about) × σm dA.
 * Section axes (sectionAxes.ts): e3 = m, e1/e2 the principal axes of the section area (I1 ≥ I2;
 * where I1 and I2 are within 1 %, e1 follows the reference direction) or the reference axes (e1 the
 * projection of the reference direction onto the plane); `axes` says which.
 * `axial` = F·e3, `shear` = [F·e1, F·e2], `torque` = M·e3, `bending` = [M·e1, M·e2].
 * `freeBody`: residual of the cut-off piece on the -m side (boundary tractions clipped by the plane
 * + body force on the clipped volume + section resultant), relative to that piece's gross load.
 * `empty` is true when the plane misses the body (all figures zero then).
 */
export interface SectionResult {
  readonly empty: boolean
  readonly plane: SectionPlane
  readonly area: number
  readonly centroid: Vec3
  readonly about: Vec3
  readonly force: Vec3
  readonly moment: Vec3
  readonly axes: SectionAxes
  /**
   * Second moments of area about the centroid: I1 about e1, I2 about e2, their product
   * I12 = ∫ (x·e1)(x·e2) dA (0 for principal axes, where I1 ≥ I2), the polar moment J = I1 + I2.
   */
  readonly secondMoments: { readonly I1: number; readonly I2: number; readonly I12: number; readonly J: number }
  readonly axial: number
  readonly shear: [number, number]
  readonly torque: number
  readonly bending: [number, number]
  readonly freeBody: FreeBodyFigure
  readonly cutElements: number
  /**
   * Section points (quadrature points, drawn midpoints) of curved elements where the element map
   * could not be inverted (inverseMap.ts): their stress is taken at a clamped linear estimate.
   * 0 on any sound mesh; a positive count names a badly shaped element near the plane.
   */
  readonly unmappedPoints: number
  // --- assemblies (sectionRegions.ts): present when the cut was asked for regions or a limit ---
  /** The cut's connected regions (of the selection, when limited), largest force first. */
  readonly regions?: readonly SectionRegion[]
  /** True when the figures are those of a part/disc selection, not the whole plane. */
  readonly limited?: boolean
  /** False where the free-body check is not defined (a bounded section); freeBody is then zero. */
  readonly freeBodyDefined?: boolean
}

/**
 * One connected region of a section: polygons of neighbouring cut elements of one part. Moments
 * about the region's own centroid; axes are the region's principal area axes (e3 = m).
 */
export interface SectionRegion extends Pick<SectionResult,
  'area' | 'centroid' | 'force' | 'moment' | 'axes' | 'secondMoments' | 'axial' | 'shear' | 'torque' | 'bending' | 'cutElements'> {
  /** The part numbers the region lies in (one, by construction; 0 when the mesh has none). */
  readonly parts: readonly number[]
}

/**
 * Free body of the piece on the -m side of a section: the residual force and moment (about the
 * section centroid) of its boundary tractions, body force and the section resultant.
 * `gross` = half the sum of |∫ t dA| over the piece's boundary faces (whole and clipped), over the
 * section's polygons (one per cut element) and |ρb| V: the load passing through the piece counted
 * with the section's traction distribution, not its resultant. `relative` = |force| / gross;
 * `momentRelative` = |moment| / (gross · size) with `size` the diagonal of the piece's bounding
 * box (model length).
 */
export interface FreeBodyFigure extends BalanceFigure {
  readonly momentRelative: number
  readonly size: number
}

/**
 * The section polygons for drawing, arrows and the probe (sectionDrawing.ts): polygon p has
 * vertices `start[p]..start[p+1]-1` in `positions` (3 per vertex, counter-clockwise about m), with
 * the traction σm at each vertex in `traction` (3 per vertex) and its reference coordinates ξ in
 * its element in `reference` (3 per vertex); `elem[p]` is the global element index it cuts.
 * Per polygon, from the cut's own quadrature: `area` (P), area `centroid` (3·P) and `force`
 * (3·P) = ∫ σm dA. `fill`: the triangles to colour (see SectionFill).
 * Stress is interpolated by the element's shape functions everywhere (DEVELOPERS.md, Conventions).
 */
export interface SectionPolygons {
  readonly count: number
  readonly start: Int32Array
  readonly positions: Float64Array
  readonly traction: Float64Array
  readonly reference: Float64Array
  readonly elem: Int32Array
  readonly area: Float64Array
  readonly centroid: Float64Array
  readonly force: Float64Array
  readonly fill: SectionFill
}

/**
 * Fill triangles of the section (V points, T triangles): `positions` (3·V) and `traction` σm
 * (3·V) per point; `index` (3·T) into them, counter-clockwise about m; `element` (T) the global
 * element index of each triangle. Points are not shared between polygons (σm jumps between
 * elements). For types whose stress is not linear, each fan triangle of a polygon is split in
 * four at its edge midpoints, which carry the element's own interpolated traction.
 */
export interface SectionFill {
  readonly positions: Float64Array
  readonly traction: Float64Array
  readonly index: Uint32Array
  readonly element: Int32Array
}
