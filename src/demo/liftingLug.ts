import type { ModelUnits } from '../model/units.ts'
import type { Vec3 } from '../model/model.ts'
import { addFaceLoads } from './consistentLoads.ts'
import { hexBoundaryFaces, selectFaces } from './hexFaces.ts'
import { extrudeQuads, gradedSteps, holeRing, mergeQuadMeshes, minQuadArea, squareOutline } from './quadMesh.ts'
import type { QuadMesh } from './quadMesh.ts'
import type { ElasticProblem } from './solveElastic.ts'

/**
 * Demo scenario: a steel lifting lug (invented for the demo). Plate in the x-y plane, thickness
 * along z, base on y = 0 welded to a stiff deck (base nodes held, see `baseHold`), symmetric about x = 0.
 * Outline: a shank tapering from the base width to twice the head radius, a straight stretch up
 * to the hole centre, a semicircular head round the pin hole. The pin pulls at `angleDeg` from
 * the plate's axis of symmetry (+y), in the plate's plane; its load reaches the hole as a
 * cosine contact pressure p(ψ) = p0 cos(πψ/(2ψ0)) over |ψ| ≤ ψ0 around the load direction.
 * Units: mm, MPa, N.
 */
export interface LugSpec {
  /** Base width, hole-centre height, head radius, hole radius, plate thickness (mm). */
  readonly baseWidth: number
  readonly holeHeight: number
  readonly headRadius: number
  readonly holeRadius: number
  readonly thickness: number
  /** Pin load (N), its angle from +y toward +x (degrees), half-angle of the contact arc (degrees). */
  readonly load: number
  readonly angleDeg: number
  readonly contactHalfAngleDeg: number
  /** Young's modulus (MPa) and Poisson's ratio. */
  readonly E: number
  readonly nu: number
  /** Mesh: divisions per 45° of hole, radial divisions of the head ring, shank rows, layers through the thickness. */
  readonly perSector: number
  readonly ringDivisions: number
  readonly shankRows: number
  readonly layers: number
  /** First radial step of the head ring at the hole, as a fraction of the step round the hole. */
  readonly ringFirstStep: number
  /**
   * How the weld holds the base: 'in-plane' holds x and y at every base node and z along the
   * base's mid-thickness line (the plate may thin by Poisson's ratio at the weld, which keeps the
   * artificial edge singularity of a full clamp off the plate's faces); 'full' holds x, y, z at
   * every base node.
   */
  readonly baseHold: 'in-plane' | 'full'
}

export const LUG_DEFAULTS: LugSpec = {
  baseWidth: 200, holeHeight: 200, headRadius: 80, holeRadius: 22.5, thickness: 20,
  load: 50_000, angleDeg: 30, contactHalfAngleDeg: 60,
  E: 210_000, nu: 0.3,
  perSector: 16, ringDivisions: 24, shankRows: 24, layers: 6, ringFirstStep: 0.5, baseHold: 'in-plane',
}

/** The sling angles of the demo's load cases (degrees from the lug's axis); the design angle first. */
export const LUG_SLING_ANGLES: readonly number[] = [30, 0, 60]

/** Mesh sizes of the lug by refinement level: 0 coarse (tests), 1 the committed demo, 2 finer. */
export function lugMeshLevel(level: number): Pick<LugSpec, 'perSector' | 'ringDivisions' | 'shankRows' | 'layers'> {
  switch (level) {
    case 0: return { perSector: 4, ringDivisions: 6, shankRows: 6, layers: 2 }
    case 1: return { perSector: 8, ringDivisions: 12, shankRows: 12, layers: 4 }
    case 2: return { perSector: 16, ringDivisions: 24, shankRows: 24, layers: 6 }
    default: return { perSector: 32, ringDivisions: 48, shankRows: 48, layers: 12 }
  }
}

export interface LugScenario {
  readonly spec: LugSpec
  readonly units: ModelUnits
  readonly bodyForce: Vec3
  readonly problem: ElasticProblem
  /** Resultant of the nodal pin loads (N) and its moment about the hole centre (N·mm). */
  readonly pinForce: Vec3
  readonly pinMomentAboutHole: Vec3
  /** Hole centre at mid-thickness (mm). */
  readonly holeCentre: Vec3
  /** Height of the shank's top edge, where the head ring starts (mm). */
  readonly shankTop: number
  /** Height of each shank row of nodes (mm): section planes that follow element faces. */
  readonly rowHeights: Float64Array
}

export function buildLiftingLug(spec: LugSpec = LUG_DEFAULTS): LugScenario {
  const { baseWidth: W, holeHeight: H, headRadius: R, holeRadius: a, thickness: t, perSector: m } = spec
  const yTop = H - R
  const hCirc = (2 * Math.PI * a) / (8 * m)
  const ring = holeRing(0, H, a, m, spec.ringDivisions, (k) => {
    // Upper half: the semicircular head; lower half: the square's sides and bottom.
    if (k <= 4 * m) { const th = (2 * Math.PI * k) / (8 * m); return [R * Math.cos(th), H + R * Math.sin(th)] }
    return squareOutline(0, H, R, m, k)
  }, Math.min(1, (spec.ringFirstStep * hCirc) / (R - a)))
  const nx = 2 * m, ny = spec.shankRows
  const xy = new Float64Array(2 * (nx + 1) * (ny + 1))
  const rowHeights = new Float64Array(ny + 1)
  // Rows close up toward the welded base, where the clamp's corner and edge stresses are steep.
  const rows = gradedSteps(ny, 0.25 / ny)
  for (let j = 0; j <= ny; j++) {
    const y = yTop * rows[j]
    rowHeights[j] = y
    const half = W / 2 + (R - W / 2) * (y / yTop)
    for (let i = 0; i <= nx; i++) { const p = i + (nx + 1) * j; xy[2 * p] = -half + (2 * half * i) / nx; xy[2 * p + 1] = y }
  }
  const quads = new Int32Array(4 * nx * ny)
  let q = 0
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) {
    const p = i + (nx + 1) * j
    quads[q++] = p; quads[q++] = p + 1; quads[q++] = p + 1 + nx + 1; quads[q++] = p + nx + 1
  }
  const shank: QuadMesh = { xy, quads }
  const plane = mergeQuadMeshes([ring, shank], 1e-6 * R)
  if (!(minQuadArea(plane) > 0)) throw new RangeError('lifting-lug mesh has an inverted quad')
  const { coords, conn } = extrudeQuads(plane, t, spec.layers)
  const N = coords.length / 3

  const fixed = new Uint8Array(3 * N)
  for (let n = 0; n < N; n++) {
    if (Math.abs(coords[3 * n + 1]) > 1e-9 * R) continue
    fixed[3 * n] = fixed[3 * n + 1] = 1
    if (spec.baseHold === 'full' || Math.abs(coords[3 * n + 2] - t / 2) < 1e-9 * t) fixed[3 * n + 2] = 1
  }

  const faces = hexBoundaryFaces(conn, N)
  const hole = selectFaces(faces, coords, (x, y) => Math.abs(Math.hypot(x, y - H) - a) < 1e-6 * a)
  const th = (spec.angleDeg * Math.PI) / 180
  const dx = Math.sin(th), dy = Math.cos(th)
  const psi0 = (spec.contactHalfAngleDeg * Math.PI) / 180
  const unit = new Float64Array(3 * N)
  const raw = addFaceLoads(unit, coords, hole, (out, x, y, _z, nx3, ny3, nz3) => {
    const rx = x, ry = y - H, r = Math.hypot(rx, ry)
    const psi = Math.acos(Math.max(-1, Math.min(1, (rx * dx + ry * dy) / r)))
    const p = psi < psi0 ? Math.cos((Math.PI * psi) / (2 * psi0)) : 0
    // Contact pressure pushes on the hole surface: t = -p n with n pointing into the hole.
    out[0] = -p * nx3; out[1] = -p * ny3; out[2] = -p * nz3
  })
  // Scale so the load's component along the pin direction is exactly the pin load; analytically
  // p0 = P / (t a I) with I = ∫ cos(πψ/2ψ0) cos ψ dψ over ±ψ0 (1.2 for ψ0 = 60°).
  const scale = spec.load / (raw[0] * dx + raw[1] * dy)
  const load = new Float64Array(3 * N)
  for (let d = 0; d < 3 * N; d++) load[d] = unit[d] * scale
  const pin: Vec3 = [0, 0, 0], mom: Vec3 = [0, 0, 0]
  const zc = t / 2
  for (let n = 0; n < N; n++) {
    const fx = load[3 * n], fy = load[3 * n + 1], fz = load[3 * n + 2]
    pin[0] += fx; pin[1] += fy; pin[2] += fz
    const rx = coords[3 * n], ry = coords[3 * n + 1] - H, rz = coords[3 * n + 2] - zc
    mom[0] += ry * fz - rz * fy; mom[1] += rz * fx - rx * fz; mom[2] += rx * fy - ry * fx
  }
  return {
    spec, units: { length: 'mm', stress: 'MPa' }, bodyForce: [0, 0, 0],
    problem: { coords, conn, E: spec.E, nu: spec.nu, fixed, load },
    pinForce: pin, pinMomentAboutHole: mom, holeCentre: [0, H, zc], shankTop: yTop, rowHeights,
  }
}

export const LUG_DESCRIPTION =
  'Invented demo data, not a real product: a steel lifting lug, 20 mm plate, 200 mm wide at the base, ' +
  'with a 45 mm pin hole whose centre is 200 mm above the base and a rounded head of 80 mm radius. ' +
  "The base is welded to a stiff deck: every base node is held in the plate's plane, and the base's " +
  'mid-thickness line also through the thickness. A pin pulls with 50 kN at 30° from the ' +
  "lug's axis of symmetry, in the plate's plane; its load reaches the hole as a cosine contact " +
  'pressure over ±60° around the pull direction. Linear elastic steel (E = 210 GPa, ν = 0.3), ' +
  'self-weight (about 60 N) left out. Stresses solved by the Tractus demo generator ' +
  '(hex8 elements, nodal stress by superconvergent patch recovery). Units: mm, MPa, N. ' +
  'Caution: lifting devices are governed by codes and standards and must be designed and checked ' +
  'by a qualified engineer; this model is an illustration, not a design check.'
