import { createMesh } from '../model/createMesh.ts'
import { nodalStressField } from '../model/stressField.ts'
import { cutSection } from '../mechanics/sectionCut.ts'
import { buildElementGrid } from '../mechanics/elementGrid.ts'
import { analyseLine } from '../mechanics/lineAnalysis.ts'
import type { PipeScenario } from './pipeSegment.ts'
import { pipeLame } from './pipeSegment.ts'

/**
 * Checks of a solved pipe segment (N, N·mm, MPa; relative errors dimensionless):
 * - statics of a section at mid-length (free body of the free end, common practice): it carries
 *   the thrust along z, the transverse force along x and the moment Q·(L − z) about y;
 * - a radial line through the wall at mid-length on the +y side, where the transverse load's
 *   bending stress vanishes: its linearised hoop stress against the Lamé mean p·a/(b − a) and
 *   its hoop stress at the bore against p(b² + a²)/(b² − a²) (Timoshenko & Goodier §28).
 */
export interface PipeStatics {
  readonly z: number
  readonly axialError: number
  readonly shearError: number
  readonly momentError: number
  readonly membraneHoop: number
  readonly membraneHoopError: number
  readonly boreHoop: number
  readonly boreHoopError: number
  readonly bendingHoop: number
  /** The Lamé bending hoop stress at the bore, (6B/t²)[(a + b)(b − a)/(2ab) − ln(b/a)] with B = p a² b²/(b² − a²). */
  readonly bendingHoopLame: number
}

export function pipeStatics(sc: PipeScenario, stress: Float64Array): PipeStatics {
  const { coords, conn } = sc.problem
  const { length: L, inner: a, outer: b } = sc.spec
  const mesh = createMesh(coords, [{ type: 'hex8', conn }])
  // The layer nearest mid-length: a cut along element faces.
  let z = L / 2, best = Infinity
  for (let i = 0; i < coords.length; i += 3) if (Math.abs(coords[i + 2] - L / 2) < best) { best = Math.abs(coords[i + 2] - L / 2); z = coords[i + 2] }
  const { result } = cutSection(mesh, nodalStressField(mesh, stress), [0, 0, 0], { point: [0, 0, z], normal: [0, 0, 1] }, { about: [0, 0, z] })
  const Q = sc.transverse, M = Q * (L - z)
  const lame = pipeLame(sc.spec)
  const p = sc.spec.pressure, B = (p * a * a * b * b) / (b * b - a * a)
  const line = analyseLine(mesh, buildElementGrid(mesh), nodalStressField(mesh, stress), null, {
    from: [0, a, z], to: [0, b, z], points: 21, axes: { kind: 'cylindrical', origin: [0, 0, 0], axis: [0, 0, 1] },
  })
  const lin = line.linearisation
  const membraneHoop = lin ? lin.membraneLocal[1] : NaN
  const boreHoop = line.components[1]
  return {
    z,
    axialError: Math.abs(result.force[2] - sc.thrust) / sc.thrust,
    shearError: Math.abs(result.force[0] - Q) / Q,
    // Free body of the free end: Q along x at arm L − z is balanced by the −z side's action on
    // it, so the +z side exerts Q·(L − z) about +y on the −z side.
    momentError: Math.abs(result.moment[1] - M) / M,
    membraneHoop, membraneHoopError: Math.abs(membraneHoop - lame.hoopMembrane) / lame.hoopMembrane,
    boreHoop, boreHoopError: Math.abs(boreHoop - lame.hoopInner) / lame.hoopInner,
    bendingHoop: lin ? lin.bendingLocal[1] : NaN,
    bendingHoopLame: ((6 * B) / ((b - a) ** 2)) * (((a + b) * (b - a)) / (2 * a * b) - Math.log(b / a)),
  }
}
