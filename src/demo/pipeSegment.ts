import type { ModelUnits } from '../model/units.ts'
import type { Vec3 } from '../model/model.ts'
import { addFaceLoads } from './consistentLoads.ts'
import { hexBoundaryFaces, selectFaces } from './hexFaces.ts'
import { extrudeQuads, gradedSteps, holeRing, minQuadArea } from './quadMesh.ts'
import type { ElasticProblem } from './solveElastic.ts'

/**
 * Demo scenario (invented for the demo): a thick steel pipe segment, welded at one end to a stiff
 * flange, under internal pressure and an end load — a part where a line through the wall and its
 * linearisation make sense. The axis is z; the pipe spans inner radius a to outer radius b and
 * z ∈ [0, L]. Supports: every node of the end z = 0 held (the weld to the flange). Loads: the
 * pressure p on the bore (t = −p n); on the free end z = L the closed-end thrust of the pressure
 * (the cap's force p·(bore area) spread evenly over the end face: axial stress p a²/(b² − a²))
 * and a transverse force Q along x, spread evenly. The mesh is a quadrilateral annulus
 * (src/demo/quadMesh.ts, holeRing with a circular outline) swept along z in layers that grow
 * away from the flange, where the wall bends. Units: mm, MPa, N.
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
  return level <= 0 ? { around: 24, through: 3, along: 10 } : { around: 48, through: 6, along: 24 }
}

export interface PipeScenario {
  readonly spec: PipeSpec
  readonly units: ModelUnits
  readonly bodyForce: Vec3
  readonly problem: ElasticProblem
  /** Bore area and end-face area of the faceted mesh (mm²): the loads are spread over these. */
  readonly boreArea: number
  readonly endArea: number
  /** The loads as applied: axial thrust (N) and transverse force (N) on the free end. */
  readonly thrust: number
  readonly transverse: number
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
  // Layers grow geometrically away from the flange (first one 2 % of the length): the wall bends
  // near the weld over a length of about √(r t).
  const s = gradedSteps(spec.along, 0.02)
  const N = coords.length / 3
  for (let i = 0; i < N; i++) coords[3 * i + 2] = L * s[Math.round((coords[3 * i + 2] / L) * spec.along)]
  const tol = 1e-9 * L
  const fixed = new Uint8Array(3 * N)
  for (let i = 0; i < N; i++) if (Math.abs(coords[3 * i + 2]) < tol) fixed.fill(1, 3 * i, 3 * i + 3)
  const load = new Float64Array(3 * N)
  const faces = hexBoundaryFaces(conn, N)
  const bore = selectFaces(faces, coords, (x, y) => Math.abs(Math.hypot(x, y) - a) < 1e-6 * a)
  const end = selectFaces(faces, coords, (_x, _y, z) => Math.abs(z - L) < tol)
  const p = spec.pressure
  addFaceLoads(load, coords, bore, (t, _x, _y, _z, nx, ny, nz) => { t[0] = -p * nx; t[1] = -p * ny; t[2] = -p * nz })
  const boreArea = polygonArea(n, a), endArea = polygonArea(n, b) - boreArea
  const axial = (p * boreArea) / endArea, shear = spec.endForce / endArea
  const applied = addFaceLoads(load, coords, end, (t) => { t[0] = shear; t[1] = 0; t[2] = axial })
  return {
    spec, units: { length: 'mm', stress: 'MPa' }, bodyForce: [0, 0, 0],
    problem: { coords, conn, E: spec.E, nu: spec.nu, fixed, load },
    boreArea, endArea, thrust: applied[2], transverse: applied[0],
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
  return 'Invented demo data, not a real product: a thick steel pipe segment, ' +
    `${2 * a} mm bore (inner radius a = ${a} mm), ${b - a} mm wall (outer radius b = ${b} mm), ${L} mm long along z, ` +
    'welded at z = 0 to a stiff flange (every node of that end held). ' +
    `Internal pressure ${p} MPa on the bore; the free end carries the closed-end thrust of the pressure (${f1((p * Math.PI * a * a) / 1000)} kN, spread evenly over the end face) ` +
    `and a transverse load of ${f1(spec.endForce / 1000)} kN along x. Linear elastic steel (E = ${spec.E / 1000} GPa, ν = ${spec.nu}). ` +
    `To compare with, away from the ends, the Lamé solution (Timoshenko & Goodier, Theory of Elasticity, §28): hoop stress p(b² + a²)/(b² − a²) = ${f1(l.hoopInner)} MPa at the bore, ` +
    `2pa²/(b² − a²) = ${f1(l.hoopOuter)} MPa at the outside, its mean through the wall (the membrane hoop stress) p·a/(b − a) = ${f1(l.hoopMembrane)} MPa, ` +
    `and the axial stress of the thrust pa²/(b² − a²) = ${f1(l.axial)} MPa; the transverse load adds axial bending stress that grows towards the flange, where the wall also bends locally. ` +
    'Stresses solved by the Tractus demo generator (hex8 elements, nodal stress by superconvergent patch recovery). Units: mm, MPa, N. ' +
    'To linearise through the wall: cut across z, pick two points on the section face near the bore and the outside, and move the ends to the surfaces.'
}
