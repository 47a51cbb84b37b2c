import type { ElementTypeName } from './elementTypes.ts'
import type { ModelUnits } from './units.ts'
import type { Combination, LoadCase } from './loadCases.ts'
import type { StressField } from './stressField.ts'

/**
 * One block of elements of a single type.
 * - `conn`: Int32Array(count · nodeCount), 0-based node indices into the mesh, local node order
 *   of `elementType(type)` (src/model/elementTypes.ts), positively oriented (the reader reorients inverted elements).
 * - `ids`: the user's element ids, so every message and export speaks them.
 * - `part`: optional part number per element (0 when none was given).
 * - `offset`: global element index of this block's first element. Global element indices run
 *   0..elementCount-1 over the blocks in order; per-element outputs use them.
 */
export interface ElementBlock {
  readonly type: ElementTypeName
  readonly conn: Int32Array
  readonly ids: Int32Array
  readonly part: Int32Array | null
  readonly offset: number
}

/**
 * The mesh. Coordinates in model length units, `coords` = Float64Array(3·N) as x,y,z per node.
 * `nodeIds` holds the user's node ids (index = 0-based node index).
 */
export interface Mesh {
  readonly coords: Float64Array
  readonly nodeIds: Int32Array
  readonly blocks: readonly ElementBlock[]
  readonly nodeCount: number
  readonly elementCount: number
}

/** Vector of three numbers [x, y, z]. */
export type Vec3 = [number, number, number]

/**
 * A loaded model.
 * - `stress`: nodal Cauchy stress, Float64Array(6·N), order xx, yy, zz, xy, yz, xz, tension
 *   positive, in model stress units.
 * - `displacement`: optional Float64Array(3·N) in model length units.
 * - `bodyForce`: ρ·b, force per unit volume in model units (stress / length); zero by default.
 * - `warnings`: what the reader fixed or noticed (reoriented elements and the like), in words.
 */
export interface Model {
  readonly name: string
  readonly description: string
  readonly units: ModelUnits
  readonly mesh: Mesh
  readonly stress: Float64Array
  readonly displacement: Float64Array | null
  readonly bodyForce: Vec3
  readonly warnings: readonly string[]
  // --- element-nodal: the unaveraged field when the input gave one value per element and node
  // (layout 'element-nodal'); `stress` is then its display average per part. Reach it through
  // modelStressField(model) (src/model/stressField.ts), never directly. ---
  readonly stressField?: StressField
  // --- assemblies: part names and per-part body force from model.json (absent: none given) ---
  readonly parts?: readonly PartInfo[]
  // --- load cases (loadCases.ts): every case's fields and the combinations; stress etc. above are those of cases[0] ---
  readonly cases?: readonly LoadCase[]
  readonly combinations?: readonly Combination[]
}

/** A named part (model.json "parts"): its number, name, and its own ρb when it has one (overrides the model's). */
export interface PartInfo {
  readonly part: number
  readonly name: string
  readonly bodyForce: Vec3 | null
}

/** Stress component order in every 6-vector. */
export const STRESS_COMPONENTS = ['xx', 'yy', 'zz', 'xy', 'yz', 'xz'] as const
