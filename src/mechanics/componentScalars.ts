/**
 * Colour quantities of the boundary surface beyond the tractions and invariants
 * (surfaceTriangles.ts): the six stress components and the displacement components in the chosen
 * axes (componentAxes.ts: global x, y, z or cylindrical r, θ, z about a line), and the
 * displacement magnitude. Built in the worker, one Float32Array per quantity, on the vertices of
 * the surface buffers (per face node, in face order, as buildSurfaceTriangles lays them out), so
 * the scene swaps an attribute to show one.
 *
 * Record (V surface vertices):
 * - `axes`: the axes the components are in;
 * - `scalars[q]`: Float32Array(V): 'sxx' … 'sxz' the stress components [xx, yy, zz, xy, yz, xz]
 *   (in cylindrical axes [rr, θθ, zz, rθ, θz, rz]), model stress units, from the nodal display
 *   stress; 'ux', 'uy', 'uz' the displacement components ([u_r, u_θ, u_z]) and 'displacement'
 *   its magnitude, model length units, only when the model has displacement;
 * - `ranges[q]`: [min, max] over the finite values; `extremes[q]`: where they are (scalarExtremes).
 */
import { FACE_KINDS } from '../model/elementTypes.ts'
import type { ComponentAxes } from './componentAxes.ts'
import { basisAt, rotateStressInto, rotateVectorInto } from './componentAxes.ts'
import type { ScalarExtremes } from './scalarExtremes.ts'
import { scalarExtremes } from './scalarExtremes.ts'
import type { BoundaryFaces } from './types.ts'

export const STRESS_COMPONENTS = ['sxx', 'syy', 'szz', 'sxy', 'syz', 'sxz'] as const
export const DISPLACEMENT_COMPONENTS = ['ux', 'uy', 'uz'] as const

export type StressComponent = (typeof STRESS_COMPONENTS)[number]
export type DisplacementQuantity = (typeof DISPLACEMENT_COMPONENTS)[number] | 'displacement'
export type ComponentQuantity = StressComponent | DisplacementQuantity

export const COMPONENT_QUANTITIES: readonly ComponentQuantity[] = [...STRESS_COMPONENTS, 'displacement', ...DISPLACEMENT_COMPONENTS]

export interface ComponentScalars {
  readonly axes: ComponentAxes
  readonly scalars: Partial<Record<ComponentQuantity, Float32Array>>
  readonly ranges: Partial<Record<ComponentQuantity, readonly [number, number]>>
  readonly extremes: Partial<Record<ComponentQuantity, ScalarExtremes>>
}

const NODES_OF_KIND = FACE_KINDS.map((k) => k.nodeCount)

/** Surface vertex count of `faces` (the layout of buildSurfaceTriangles). */
export function surfaceVertexCount(faces: BoundaryFaces): number {
  let V = 0
  for (let f = 0; f < faces.count; f++) V += NODES_OF_KIND[faces.kind[f]]
  return V
}

/**
 * The component scalars on the surface of `faces`. `stress`: nodal display stress (6N);
 * `displacement`: nodal displacement (3N) or null; `coords` the node coordinates (3N), where the
 * cylindrical basis is taken. `axes` must be checked (componentAxes.checkAxes).
 */
export function buildComponentScalars(
  faces: BoundaryFaces, coords: Float64Array, stress: Float64Array, displacement: Float64Array | null, axes: ComponentAxes,
): ComponentScalars {
  const V = surfaceVertexCount(faces)
  const s = STRESS_COMPONENTS.map(() => new Float32Array(V))
  const u = displacement ? DISPLACEMENT_COMPONENTS.map(() => new Float32Array(V)) : null
  const mag = displacement ? new Float32Array(V) : null
  const R = new Float64Array(9), S = new Float64Array(6), U = new Float64Array(3)
  const nodes = faces.nodes, slots = faces.slots
  let v = 0
  for (let f = 0; f < faces.count; f++) {
    const nv = NODES_OF_KIND[faces.kind[f]]
    for (let a = 0; a < nv; a++, v++) {
      const n = nodes[f * slots + a]
      basisAt(R, axes, coords[3 * n], coords[3 * n + 1], coords[3 * n + 2])
      rotateStressInto(S, 0, stress, 6 * n, R)
      for (let k = 0; k < 6; k++) s[k][v] = S[k]
      if (u && mag && displacement) {
        rotateVectorInto(U, 0, displacement, 3 * n, R)
        u[0][v] = U[0]; u[1][v] = U[1]; u[2][v] = U[2]
        mag[v] = Math.hypot(displacement[3 * n], displacement[3 * n + 1], displacement[3 * n + 2])
      }
    }
  }
  const scalars: Partial<Record<ComponentQuantity, Float32Array>> = {}
  STRESS_COMPONENTS.forEach((q, k) => { scalars[q] = s[k] })
  if (u && mag) {
    DISPLACEMENT_COMPONENTS.forEach((q, k) => { scalars[q] = u[k] })
    scalars.displacement = mag
  }
  const ranges: Partial<Record<ComponentQuantity, readonly [number, number]>> = {}
  const extremes: Partial<Record<ComponentQuantity, ScalarExtremes>> = {}
  for (const q of COMPONENT_QUANTITIES) {
    const values = scalars[q]
    if (!values) continue
    const x = scalarExtremes(values)
    extremes[q] = x
    ranges[q] = x.minIndex < 0 ? [0, 0] : [x.min, x.max]
  }
  return { axes, scalars, ranges, extremes }
}
