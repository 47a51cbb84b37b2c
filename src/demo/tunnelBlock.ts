import type { ModelUnits } from '../model/units.ts'
import type { Vec3 } from '../model/model.ts'
import { addBodyLoads, addFaceLoads } from './consistentLoads.ts'
import { hexBoundaryFaces, selectFaces } from './hexFaces.ts'
import { extrudeQuads, gradedSteps, holeRing, minQuadArea, squareOutline } from './quadMesh.ts'
import type { ElasticProblem } from './solveElastic.ts'
import { interpolateNodes } from './multigrid.ts'
import type { MultigridHierarchy, NodeInterpolation } from './multigrid.ts'

/**
 * Demo scenario: a slice of rock mass round a circular tunnel at depth (invented for the demo).
 * x horizontal, y up, z along the tunnel axis; the block spans x ∈ [-w/2, w/2], y ∈ [0, h],
 * z ∈ [0, slice], tunnel centre at (0, h/2). Loads: own weight (ρg downward), overburden pressure
 * on the top face (ρg times the depth of the top), horizontal confining pressure K0 times the local
 * vertical stress on both sides. Supports: base held vertically, the two slice faces held along z
 * (plane strain, the rock continues along the tunnel), one line of base nodes at x = 0 held along x
 * (only to remove the sideways rigid motion: the side pressures balance). Tunnel wall free.
 * Units: m, kPa, kN.
 */
export interface TunnelSpec {
  readonly width: number
  readonly height: number
  readonly slice: number
  readonly radius: number
  /** Depth of the block's top face below the ground surface (m). */
  readonly topDepth: number
  /** Density (kg/m³) and gravity (m/s²). */
  readonly density: number
  readonly gravity: number
  /** Ratio of horizontal to vertical confining stress on the sides. */
  readonly k0: number
  /** Young's modulus (kPa) and Poisson's ratio. */
  readonly E: number
  readonly nu: number
  readonly perSector: number
  readonly ringDivisions: number
  readonly layers: number
}

export const TUNNEL_DEFAULTS: TunnelSpec = {
  width: 60, height: 60, slice: 3, radius: 4, topDepth: 300, density: 2600, gravity: 9.81, k0: 0.5,
  E: 20e6, nu: 0.25, perSector: 24, ringDivisions: 48, layers: 3,
}

/** Mesh sizes by refinement level: 0 coarse (tests), 1 medium, 2 the committed demo, 3 the large variant. */
export function tunnelMeshLevel(level: number): Pick<TunnelSpec, 'perSector' | 'ringDivisions' | 'layers'> {
  switch (level) {
    case 0: return { perSector: 6, ringDivisions: 12, layers: 1 }
    case 1: return { perSector: 12, ringDivisions: 24, layers: 2 }
    case 2: return { perSector: 24, ringDivisions: 48, layers: 3 }
    default: return { perSector: 64, ringDivisions: 128, layers: 4 }
  }
}

/** First radial step of the ring, as a fraction of the shortest ray: the step round the tunnel wall. */
function firstRingStep(spec: TunnelSpec): number {
  return (2 * Math.PI * spec.radius) / (8 * spec.perSector) / (spec.width / 2 - spec.radius)
}

/**
 * Interpolation between two tunnel meshes of the same block (for a coarser level's solution as the
 * conjugate-gradient start of a finer one, and for multigrid). Both are ring meshes with nodes
 * k + 8m·j + planeNodes·layer; fields are interpolated linearly in the ring's own parameters
 * (angle index, graded radial parameter, layer height), so no point search is needed.
 */
export function tunnelInterpolation(from: TunnelSpec, to: TunnelSpec): NodeInterpolation {
  const ncA = 8 * from.perSector, nrA = from.ringDivisions, nA = ncA * (nrA + 1)
  const ncB = 8 * to.perSector, nrB = to.ringDivisions, nB = ncB * (nrB + 1)
  const sA = gradedSteps(nrA, firstRingStep(from)), sB = gradedSteps(nrB, firstRingStep(to))
  const count = nB * (to.layers + 1)
  const rowStart = new Int32Array(count + 1), col = new Int32Array(8 * count), weight = new Float64Array(8 * count)
  let q = 0
  for (let l = 0; l <= to.layers; l++) {
    const zt = (l / to.layers) * from.layers
    const l0 = Math.min(from.layers - 1, Math.floor(zt)), wz = zt - l0
    for (let j = 0; j <= nrB; j++) {
      // Radial parameter: the coarse interval holding sB[j].
      let j0 = 0
      while (j0 < nrA - 1 && sA[j0 + 1] < sB[j]) j0++
      const ws = Math.min(1, Math.max(0, (sB[j] - sA[j0]) / (sA[j0 + 1] - sA[j0])))
      for (let k = 0; k < ncB; k++) {
        const kt = (k / ncB) * ncA
        const k0 = Math.floor(kt) % ncA, k1 = (k0 + 1) % ncA, wk = kt - Math.floor(kt)
        const i = k + ncB * j + nB * l
        for (let dl = 0; dl < 2; dl++) for (let dj = 0; dj < 2; dj++) for (let dk = 0; dk < 2; dk++) {
          const w = (dl ? wz : 1 - wz) * (dj ? ws : 1 - ws) * (dk ? wk : 1 - wk)
          // Nodes that coincide in a parameter get weight 0 on the other side: skip them.
          if (w === 0) continue
          col[q] = (dk ? k1 : k0) + ncA * (j0 + dj) + nA * (l0 + dl)
          weight[q++] = w
        }
        rowStart[i + 1] = q
      }
    }
  }
  return { rowStart, col: col.slice(0, q), weight: weight.slice(0, q) }
}

/** A displacement field of one tunnel mesh interpolated onto another (see tunnelInterpolation). */
export function interpolateTunnelField(from: TunnelSpec, u: Float64Array, to: TunnelSpec): Float64Array {
  const P = tunnelInterpolation(from, to)
  return interpolateNodes(new Float64Array(3 * (P.rowStart.length - 1)), P, u)
}

/**
 * The multigrid hierarchy of a tunnel mesh: the coarser refinement levels below `level`'s
 * (tunnelMeshLevel), with their supports, and the interpolations between them.
 */
export function tunnelHierarchy(base: TunnelSpec, level: number): MultigridHierarchy {
  const specs: TunnelSpec[] = []
  for (let l = 0; l < level; l++) specs.push({ ...base, ...tunnelMeshLevel(l) })
  const levels = specs.map((s) => { const p = buildTunnelBlock(s).problem; return { coords: p.coords, conn: p.conn, fixed: p.fixed } })
  const fine = { ...base, ...tunnelMeshLevel(level) }
  const transfers = specs.map((s, i) => tunnelInterpolation(s, i + 1 < specs.length ? specs[i + 1] : fine))
  return { levels, transfers }
}

export interface TunnelScenario {
  readonly spec: TunnelSpec
  readonly units: ModelUnits
  /** ρ·g downward in kPa/m (= kN/m³). */
  readonly bodyForce: Vec3
  readonly problem: ElasticProblem
  /** Unit weight ρg (kN/m³), overburden pressure on the top (kPa), vertical stress at the tunnel centre's depth (kPa). */
  readonly unitWeight: number
  readonly topPressure: number
  readonly verticalAtAxis: number
  readonly tunnelCentre: Vec3
  /** Weight of the block (kN) and overburden force on its top (kN). */
  readonly weight: number
  readonly overburdenForce: number
}

export function buildTunnelBlock(spec: TunnelSpec = TUNNEL_DEFAULTS): TunnelScenario {
  const { width: w, height: h, slice, radius: a, perSector: m } = spec
  const yc = h / 2, half = w / 2
  if (Math.abs(w - h) > 1e-12) throw new RangeError('the tunnel block mesher needs a square block')
  const plane = holeRing(0, yc, a, m, spec.ringDivisions, (k) => squareOutline(0, yc, half, m, k), firstRingStep(spec))
  if (!(minQuadArea(plane) > 0)) throw new RangeError('tunnel mesh has an inverted quad')
  const { coords, conn } = extrudeQuads(plane, slice, spec.layers)
  const N = coords.length / 3
  const gamma = (spec.density * spec.gravity) / 1000 // kN/m³ = kPa/m
  const pTop = gamma * spec.topDepth
  const tol = 1e-9 * w
  const fixed = new Uint8Array(3 * N)
  for (let n = 0; n < N; n++) {
    const x = coords[3 * n], y = coords[3 * n + 1], z = coords[3 * n + 2]
    if (Math.abs(y) < tol) { fixed[3 * n + 1] = 1; if (Math.abs(x) < tol) fixed[3 * n] = 1 }
    if (Math.abs(z) < tol || Math.abs(z - slice) < tol) fixed[3 * n + 2] = 1
  }
  const load = new Float64Array(3 * N)
  const faces = hexBoundaryFaces(conn, N)
  const top = selectFaces(faces, coords, (_x, y) => Math.abs(y - h) < tol)
  const sides = selectFaces(faces, coords, (x) => Math.abs(Math.abs(x) - half) < tol)
  addFaceLoads(load, coords, top, (t, _x, _y, _z, nx, ny, nz) => { t[0] = -pTop * nx; t[1] = -pTop * ny; t[2] = -pTop * nz })
  addFaceLoads(load, coords, sides, (t, _x, y, _z, nx, ny, nz) => {
    const p = spec.k0 * (pTop + gamma * (h - y))
    t[0] = -p * nx; t[1] = -p * ny; t[2] = -p * nz
  })
  const bodyForce: Vec3 = [0, -gamma, 0]
  const body = addBodyLoads(load, coords, conn, bodyForce)
  return {
    spec, units: { length: 'm', stress: 'kPa' }, bodyForce,
    problem: { coords, conn, E: spec.E, nu: spec.nu, fixed, load },
    unitWeight: gamma, topPressure: pTop, verticalAtAxis: pTop + gamma * (h - yc),
    tunnelCentre: [0, yc, slice / 2], weight: -body[1], overburdenForce: pTop * w * slice,
  }
}

export const TUNNEL_DESCRIPTION =
  'Invented demo data: a 3 m slice of rock mass, 60 m wide and 60 m high, round a circular tunnel of ' +
  '4 m radius at mid-height; the top of the block lies 300 m below the ground. Loads: own weight ' +
  '(ρ = 2600 kg/m³, g = 9.81 m/s², body force 25.5 kN/m³ downward), the overburden pressure on the top ' +
  '(7.65 MPa), and a horizontal confining pressure of half the local vertical stress (K0 = 0.5) on both ' +
  'sides. Base held vertically, slice faces held along the tunnel axis (plane strain), tunnel wall ' +
  'free. Linear elastic rock (E = 20 GPa, ν = 0.25). Stresses solved by the Tractus demo generator ' +
  '(hex8 elements, nodal stress by superconvergent patch recovery). Units: m, kPa, kN.'
