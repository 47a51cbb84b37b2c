/**
 * Demo scenario: a bracket plate held to a base plate by four bolts (invented for the demo).
 * Units: mm, MPa, N.
 *
 * Plan area 160 × 120 mm centred on the origin, plates stacked along z: the base plate
 * (0 ≤ z ≤ 12) is held at its underside (every node on z = 0 fixed: it stands for a stiff
 * foundation), a 2 mm gap (12 ≤ z ≤ 14) keeps the plates apart so only the bolts carry load
 * across it, and the bracket plate (14 ≤ z ≤ 24) is pulled up (+z) by a uniform traction on a
 * 30 × 30 mm patch of its top face centred at (25, 0): off the bolt group's centre, so the bolts
 * nearer the load carry more. The bolts are square shanks 10 × 10 mm at (±50, ±35), running
 * through both plates and the gap, bonded to the plates by shared nodes (no heads, nuts or
 * contact: an idealisation that a reviewer of a real joint would not accept without preload and
 * contact, stated in the description).
 *
 * Parts: 1 base plate, 2 bracket plate, 3–6 bolts A–D (A at (+50, +35), B (+50, −35),
 * C (−50, −35), D (−50, +35)).
 *
 * Mesh: a structured hex8 grid of `cell` mm in plan (a divisor of 5 so the bolt squares fall on
 * grid lines), `plateLayers` layers through each plate and two across the gap; gap cells exist
 * only under the bolts.
 */
import type { Vec3 } from '../model/model.ts'
import type { ModelUnits } from '../model/units.ts'
import { addFaceLoads } from './consistentLoads.ts'
import type { HexFaces } from './hexFaces.ts'
import type { ElasticProblem } from './solveElastic.ts'

export interface BracketSpec {
  /** Plan cell size (mm); 5 / cell must be a whole number. */
  readonly cell: number
  /** Element layers through each plate. */
  readonly plateLayers: number
  /** Pull (N), along +z. */
  readonly load: number
  readonly E: number
  readonly nu: number
}

export const BRACKET_DEFAULTS: BracketSpec = { cell: 2.5, plateLayers: 3, load: 40_000, E: 210_000, nu: 0.3 }

/** Geometry (mm), fixed: the description and the statics speak of it. */
export const BRACKET_GEOMETRY = {
  halfX: 80, halfY: 60, base: 12, gap: 2, bracket: 10,
  bolts: [[50, 35], [50, -35], [-50, -35], [-50, 35]] as readonly (readonly [number, number])[],
  boltHalf: 5,
  patch: { x: 25, y: 0, half: 15 },
} as const

export const BRACKET_PART_NAMES: Readonly<Record<number, string>> = {
  1: 'base plate', 2: 'bracket plate', 3: 'bolt A (+50, +35)', 4: 'bolt B (+50, −35)', 5: 'bolt C (−50, −35)', 6: 'bolt D (−50, +35)',
}

export const BRACKET_DESCRIPTION =
  'Invented demo: a 10 mm bracket plate held to a 12 mm base plate by four 10 × 10 mm bolts, pulled up by 40 kN ' +
  'on a 30 × 30 mm patch 25 mm off the bolt group\'s centre. Linear elastic steel (E = 210 GPa, ν = 0.3), solved ' +
  'with hex8 elements; bolts bonded to both plates, no preload, no contact between the plates (a 2 mm gap). ' +
  'The elastic bolt-group method (rigid plate) gives 15 kN in bolts A and B and 5 kN in C and D; the plates ' +
  'are not rigid, so the section forces through the bolts differ from it. Not a design of a real joint.'

/**
 * The model card's text with the figures of the solved model: the elastic bolt-group tensions
 * (rigid plate) and the section force through each bolt at mid-gap (N, bolts A–D in order).
 */
export function bracketDescription(spec: BracketSpec, elastic: readonly number[], section: readonly number[], applied: number): string {
  const kN = (v: number) => (v / 1000).toFixed(1)
  const names = ['A', 'B', 'C', 'D']
  const pairs = names.map((n, i) => `${n} ${kN(elastic[i])} kN / ${kN(section[i])} kN`).join(', ')
  return 'Invented demo, not a design of a real joint: a 10 mm bracket plate (part 2) held to a 12 mm base plate (part 1) ' +
    `by four 10 × 10 mm square bolts (parts 3–6: A at (+50, +35), B (+50, −35), C (−50, −35), D (−50, +35) mm), pulled up by ${kN(spec.load)} kN ` +
    'on a 30 × 30 mm patch centred 25 mm off the bolt group\'s centre towards A and B. The base plate\'s underside is held. ' +
    `Linear elastic steel (E = ${spec.E / 1000} GPa, ν = ${spec.nu}), hex8 elements of ${spec.cell} mm, nodal stress by patch recovery; ` +
    'the bolts are bonded to both plates by shared nodes, with no heads, preload or contact, and a 2 mm gap keeps the plates apart, ' +
    'so only the bolts carry load between them. Bolt tensions, elastic bolt-group method (rigid plate, load along the bolt axes: ' +
    'P/n + M·yᵢ/Σyⱼ²; Shigley, Mechanical Engineering Design, bolted joints, from memory) against the section force through each bolt at mid-gap ' +
    `(cut at z = 13 mm, its regions): ${pairs}. They differ because the plates are not rigid: the bracket plate bends between the bolts, ` +
    'and the bonded shanks also carry bending and shear, which the method leaves out. The four section forces add to ' +
    `${kN(section.reduce((a, b) => a + b, 0))} kN against ${kN(applied)} kN applied: nodal stress recovered across the bonded joints ` +
    'on a coarse mesh (2 × 2 elements across a bolt). For the same reason the interfaces between bolts and plates, whose load ' +
    'passes as shear across the bonded joints, read well below the bolt forces (about half here): read the bolts on sections. Units: mm, MPa, N.'
}

export interface BracketScenario {
  readonly spec: BracketSpec
  readonly problem: ElasticProblem
  /** Part number per element (1 base, 2 bracket, 3–6 bolts). */
  readonly part: Int32Array
  readonly units: ModelUnits
  readonly bodyForce: Vec3
  /** The applied resultant (N) and the load patch's centroid (mm). */
  readonly applied: Vec3
  readonly loadPoint: Vec3
}

/** Which bolt (0–3) a plan cell with centre (x, y) lies in, or -1. */
function boltAt(x: number, y: number): number {
  const g = BRACKET_GEOMETRY
  for (let b = 0; b < g.bolts.length; b++) {
    if (Math.abs(x - g.bolts[b][0]) < g.boltHalf && Math.abs(y - g.bolts[b][1]) < g.boltHalf) return b
  }
  return -1
}

export function buildBoltedBracket(spec: BracketSpec = BRACKET_DEFAULTS): BracketScenario {
  const g = BRACKET_GEOMETRY, h = spec.cell
  if (!Number.isInteger(5 / h)) throw new RangeError(`bracket cell ${h} mm: 5 / cell must be a whole number`)
  const nx = Math.round(2 * g.halfX / h), ny = Math.round(2 * g.halfY / h)
  // z levels: the base plate's layers, the gap, the bracket's layers
  const zs: number[] = []
  for (let k = 0; k <= spec.plateLayers; k++) zs.push(g.base * k / spec.plateLayers)
  // two layers across the gap, so the mid-gap nodes belong to the bolts alone (nodes on the plate
  // faces carry stress averaged with the plates')
  zs.push(g.base + g.gap / 2)
  for (let k = 0; k <= spec.plateLayers; k++) zs.push(g.base + g.gap + g.bracket * k / spec.plateLayers)
  const nz = zs.length
  let coords = new Float64Array(3 * (nx + 1) * (ny + 1) * nz)
  const node = (i: number, j: number, k: number) => (k * (ny + 1) + j) * (nx + 1) + i
  for (let k = 0; k < nz; k++) for (let j = 0; j <= ny; j++) for (let i = 0; i <= nx; i++) {
    const o = 3 * node(i, j, k)
    coords[o] = -g.halfX + i * h; coords[o + 1] = -g.halfY + j * h; coords[o + 2] = zs[k]
  }
  const conn: number[] = [], part: number[] = []
  const gapLayer = spec.plateLayers // layers gapLayer and gapLayer + 1 cross the gap; layer k runs from zs[k] to zs[k + 1]
  for (let k = 0; k < nz - 1; k++) for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) {
    const bolt = boltAt(-g.halfX + (i + 0.5) * h, -g.halfY + (j + 0.5) * h)
    const inGap = k === gapLayer || k === gapLayer + 1
    if (inGap && bolt < 0) continue // the gap holds only the bolts
    conn.push(node(i, j, k), node(i + 1, j, k), node(i + 1, j + 1, k), node(i, j + 1, k),
      node(i, j, k + 1), node(i + 1, j, k + 1), node(i + 1, j + 1, k + 1), node(i, j + 1, k + 1))
    part.push(bolt >= 0 ? 3 + bolt : k < gapLayer ? 1 : 2)
  }
  // the mid-gap grid nodes outside the bolts belong to no element: drop them (a node without an
  // element has no stiffness and no recovered stress)
  const keep = new Int32Array(coords.length / 3).fill(-1)
  let N = 0
  for (const n of conn) if (keep[n] < 0) keep[n] = 0
  for (let n = 0; n < keep.length; n++) if (keep[n] === 0) keep[n] = N++
  const used = new Float64Array(3 * N)
  for (let n = 0; n < keep.length; n++) if (keep[n] >= 0) used.set(coords.subarray(3 * n, 3 * n + 3), 3 * keep[n])
  coords = used
  for (let k = 0; k < conn.length; k++) conn[k] = keep[conn[k]]
  const fixed = new Uint8Array(3 * N)
  for (let n = 0; n < N; n++) if (coords[3 * n + 2] === 0) fixed[3 * n] = fixed[3 * n + 1] = fixed[3 * n + 2] = 1
  // the load patch: top-face quads of the bracket inside the patch square
  const top = nz - 1, p = g.patch
  const faceNodes: number[] = []
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) {
    const x = -g.halfX + (i + 0.5) * h, y = -g.halfY + (j + 0.5) * h
    if (Math.abs(x - p.x) < p.half && Math.abs(y - p.y) < p.half) {
      faceNodes.push(keep[node(i, j, top)], keep[node(i + 1, j, top)], keep[node(i + 1, j + 1, top)], keep[node(i, j + 1, top)])
    }
  }
  const faces: HexFaces = { count: faceNodes.length / 4, nodes: Int32Array.from(faceNodes), elem: new Int32Array(faceNodes.length / 4) }
  const q = spec.load / (2 * p.half) ** 2
  const load = new Float64Array(3 * N)
  const applied = addFaceLoads(load, coords, faces, (t) => { t[0] = 0; t[1] = 0; t[2] = q })
  return {
    spec,
    problem: { coords, conn: Int32Array.from(conn), E: spec.E, nu: spec.nu, fixed, load },
    part: Int32Array.from(part),
    units: { length: 'mm', stress: 'MPa' },
    bodyForce: [0, 0, 0],
    applied,
    loadPoint: [p.x, p.y, zs[top]],
  }
}

/**
 * The elastic method for a bolt group loaded along the bolt axes (rigid plate, equal bolts; any
 * machine-design text, e.g. Shigley's Mechanical Engineering Design, bolted joints): bolt i
 * carries P/n + M_y·x_i/Σx_j² + M_x·y_i/Σy_j² with the moments of P about the group's centroidal
 * axes, M_y = P·(x_P − x̄), M_x = P·(y_P − ȳ). Returns the tension per bolt (N).
 */
export function boltGroupTensions(P: number, loadX: number, loadY: number, bolts: readonly (readonly [number, number])[]): number[] {
  const n = bolts.length
  let cx = 0, cy = 0
  for (const [x, y] of bolts) { cx += x / n; cy += y / n }
  let sxx = 0, syy = 0
  for (const [x, y] of bolts) { sxx += (x - cx) ** 2; syy += (y - cy) ** 2 }
  return bolts.map(([x, y]) => P / n + (sxx > 0 ? P * (loadX - cx) * (x - cx) / sxx : 0) + (syy > 0 ? P * (loadY - cy) * (y - cy) / syy : 0))
}
