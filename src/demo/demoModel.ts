import { createMesh } from '../model/createMesh.ts'
import type { Model, Vec3 } from '../model/model.ts'
import type { ModelUnits } from '../model/units.ts'

/**
 * Rounds every value to `digits` significant figures, in place: the demo files then carry
 * no more digits than the solution is worth (the discretisation error is far larger), which
 * keeps the CSV bundle small, and the CSV and native files hold the same numbers.
 */
export function roundSignificant(values: Float64Array, digits: number): Float64Array {
  for (let i = 0; i < values.length; i++) {
    const v = values[i]
    // Zero and non-finite values have no digits to drop.
    if (v === 0 || !Number.isFinite(v)) continue
    values[i] = Number(v.toPrecision(digits))
  }
  return values
}

/** The Model record of a solved hex8 demo scenario (arrays are taken, not copied). */
export function demoModel(name: string, description: string, units: ModelUnits, bodyForce: Vec3, coords: Float64Array, conn: Int32Array, stress: Float64Array, displacement: Float64Array): Model {
  return {
    name, description, units, bodyForce, warnings: [],
    mesh: createMesh(coords, [{ type: 'hex8', conn }]),
    stress, displacement,
  }
}
