import type { ModelUnits } from '../model/units.ts'
import type { Vec3 } from '../model/model.ts'
import { addFaceLoads } from './consistentLoads.ts'
import { hexBoundaryFaces, selectFaces } from './hexFaces.ts'
import { extrudeQuads, holeRing, minQuadArea } from './quadMesh.ts'
import type { ElasticProblem } from './solveElastic.ts'

/**
 * Demo scenario (invented for the demo): a segment cut out of a long thick-walled steel pipe
 * under internal pressure, with an end load — a part where a line through the wall and its
 * linearisation make sense. The axis is z; the segment spans inner radius a to outer radius b and
 * z ∈ [0, L]. Loads: the pressure p on the bore (t = −p n); on each cut end the closed-end thrust
 * of the pressure (the caps' force p·(bore area), spread evenly: axial stress p a²/(b² − a²)),
 * outward; a transverse force Q along +x spread evenly over the end z = L, and at z = 0 what the
 * pipe beyond holds it with: −Q spread evenly and the bending moment Q·L as an axial stress
 * linear in x. The loads balance exactly (the consistent nodal loads integrate them exactly on
 * the faceted ends), so the segment is only held against rigid motion: three points of the end
 * z = 0 (3 + 2 + 1 components, statically determinate: the reactions are round-off).
 * The mesh is a quadrilateral annulus (src/demo/quadMesh.ts, holeRing with a circular outline)
 * swept along z. Units: mm, MPa, N.
 */
export interface PipeSpec {
  /** Inner and outer radius, length (mm). */
  readonly inner: number
  readonly outer: number
  readonly length: number
  /** Internal pressure (MPa) and transverse end force (N). */
  readonly pressure: number
  readonly endForce: number
  /** Young's modulus (MPa) and Poisson's ratio. */
  readonly E: number
  readonly nu: number
  /** Elements around (a multiple of 8), through the wall, and along the axis. */
  readonly around: number
  readonly through: number
  readonly along: number
}

export const PIPE_DEFAULTS: PipeSpec = {
  inner: 100, outer: 130, length: 600, pressure: 20, endForce: 100e3, E: 210e3, nu: 0.3,
  around: 48, through: 6, along: 24,
}

/** Mesh sizes by refinement level: 0 coarse (tests), 1 the committed demo. */
export function pipeMeshLevel(level: number): Pick<PipeSpec, 'around' | 'through' | 'along'> {
  return level <= 0 ? { around: 24, through: 3, along: 8 } : { around: 48, through: 6, along: 20 }
}

export interface PipeScenario {
  readonly spec: PipeSpec
  readonly units: ModelUnits
  readonly bodyForce: Vec3
  readonly problem: ElasticProblem
  /** Bore area and end-face area of the faceted mesh (mm²): the loads are spread over these. */
  readonly boreArea: number
  readonly endArea: number
  /** The loads as applied on the end z = L: axial thrust (N) and transverse force (N). */
  readonly thrust: number
  readonly transverse: number
  /** Sum of all nodal loads (N): zero to round-off (the loads balance). */
  readonly netLoad: Vec3
}

/** Area of a regular n-gon of circumradius r. */
function polygonArea(n: number, r: number): number {
  return 0.5 * n * r * r * Math.sin((2 * Math.PI) / n)
}

export function buildPipeSegment(spec: PipeSpec = PIPE_DEFAULTS): PipeScenario {
  const { inner: a, outer: b, length: L, around: n } = spec
  if (n % 8 !== 0) throw new RangeError('the pipe mesher needs a multiple of 8 elements around')
  const plane = holeRing(0, 0, a, n / 8, spec.through, (k) => [b * Math.cos((2 * Math.PI * k) / n), b * Math.sin((2 * Math.PI * k) / n)], 1 / spec.through)
  if (!(minQuadArea(plane) > 0)) throw new RangeError('pipe mesh has an inverted quad')
  const { coords, conn } = extrudeQuads(plane, L, spec.along)
  const N = coords.length / 3
  const tol = 1e-9 * L
  // Held against rigid motion only: (a, 0, 0) in x, y, z; (−a, 0, 0) in y, z; (0, a, 0) in z.
  const fixed = new Uint8Array(3 * N)
  const hold = (x: number, y: number, dofs: number[]): void => {
    for (let i = 0; i < N; i++) {
      if (Math.abs(coords[3 * i] - x) < 1e-6 * a && Math.abs(coords[3 * i + 1] - y) < 1e-6 * a && Math.abs(coords[3 * i + 2]) < tol) for (const d of dofs) fixed[3 * i + d] = 1
    }
  }
  hold(a, 0, [0, 1, 2]); hold(-a, 0, [1, 2]); hold(0, a, [2])
  const load = new Float64Array(3 * N)
  const faces = hexBoundaryFaces(conn, N)
  const bore = selectFaces(faces, coords, (x, y) => Math.abs(Math.hypot(x, y) - a) < 1e-6 * a)
  const far = selectFaces(faces, coords, (_x, _y, z) => Math.abs(z - L) < tol)
  const near = selectFaces(faces, coords, (_x, _y, z) => Math.abs(z) < tol)
  const p = spec.pressure, Q = spec.endForce
  addFaceLoads(load, coords, bore, (t, _x, _y, _z, nx, ny, nz) => { t[0] = -p * nx; t[1] = -p * ny; t[2] = -p * nz })
  const boreArea = polygonArea(n, a), endArea = polygonArea(n, b) - boreArea
  const axial = (p * boreArea) / endArea, shear = Q / endArea
  const applied = addFaceLoads(load, coords, far, (t) => { t[0] = shear; t[1] = 0; t[2] = axial })
  // The second moment of the faceted end about y, ∫ x² dA, from consistent loads of t_z = x
  // (Σ xₐ fₐ = ∫ x t dA exactly: the 2×2 rule integrates x² det J on these flat quads).
  const unit = new Float64Array(3 * N)
  addFaceLoads(unit, coords, near, (t, x) => { t[0] = 0; t[1] = 0; t[2] = x })
  let I = 0
  for (let i = 0; i < N; i++) I += coords[3 * i] * unit[3 * i + 2]
  const k = (Q * L) / I
  addFaceLoads(load, coords, near, (t, x) => { t[0] = -shear; t[1] = 0; t[2] = -axial + k * x })
  const net: Vec3 = [0, 0, 0]
  for (let i = 0; i < N; i++) for (let c = 0; c < 3; c++) net[c] += load[3 * i + c]
  return {
    spec, units: { length: 'mm', stress: 'MPa' }, bodyForce: [0, 0, 0],
    problem: { coords, conn, E: spec.E, nu: spec.nu, fixed, load },
    boreArea, endArea, thrust: applied[2], transverse: applied[0], netLoad: net,
  }
}

/** The Lamé figures the model card quotes (Timoshenko & Goodier, Theory of Elasticity, §28). */
export function pipeLame(spec: PipeSpec): { hoopInner: number; hoopOuter: number; hoopMembrane: number; axial: number } {
  const { inner: a, outer: b, pressure: p } = spec
  return {
    hoopInner: (p * (b * b + a * a)) / (b * b - a * a),
    hoopOuter: (2 * p * a * a) / (b * b - a * a),
    hoopMembrane: (p * a) / (b - a),
    axial: (p * a * a) / (b * b - a * a),
  }
}

const f1 = (v: number): string => v.toFixed(1)

export function pipeDescription(spec: PipeSpec = PIPE_DEFAULTS): string {
  const l = pipeLame(spec)
  const { inner: a, outer: b, length: L, pressure: p } = spec
  return 'Invented demo data, not a real product: a segment cut out of a long thick-walled steel pipe, ' +
    `${2 * a} mm bore (inner radius a = ${a} mm), ${b - a} mm wall (outer radius b = ${b} mm), ${L} mm long along z. ` +
    `Internal pressure ${p} MPa on the bore; both cut ends carry the closed-end thrust of the pressure (${f1((p * Math.PI * a * a) / 1000)} kN, spread evenly over each end). ` +
    `The end z = ${L} mm carries a transverse load of ${f1(spec.endForce / 1000)} kN along x, and the end z = 0 what the pipe beyond holds it with (the opposite force and a bending moment of ${f1((spec.endForce * L) / 1e6)} kN·m), ` +
    'so the loads balance and the segment is held only against rigid motion (at three points). ' +
    `Linear elastic steel (E = ${spec.E / 1000} GPa, ν = ${spec.nu}). ` +
    `To compare with, away from the ends, the Lamé solution (Timoshenko & Goodier, Theory of Elasticity, §28): hoop stress p(b² + a²)/(b² − a²) = ${f1(l.hoopInner)} MPa at the bore, ` +
    `2pa²/(b² − a²) = ${f1(l.hoopOuter)} MPa at the outside, its mean through the wall (the membrane hoop stress) p·a/(b − a) = ${f1(l.hoopMembrane)} MPa, ` +
    `and the axial stress of the thrust pa²/(b² − a²) = ${f1(l.axial)} MPa; the transverse load adds axial bending stress, largest at x = ±b and growing towards z = 0, and none at x = 0. ` +
    'Stresses solved by the Tractus demo generator (hex8 elements, nodal stress by superconvergent patch recovery). Units: mm, MPa, N. ' +
    'To linearise through the wall: cut across z, pick two points on the section face near the bore and the outside, and move the ends to the surfaces.'
}
