/**
 * The assembly's figures as tables, in display units: the regions of the cut, the parts with
 * their own balance, and the interfaces. One source for the snapshot, the app's exports and the
 * review report, so each says the same. Rows carry the model-unit values too (exports).
 */
import type { SectionResult } from '../mechanics/types.ts'
import type { AssemblySummary } from '../../workers/protocol.ts'
import type { ModelUnits, UnitSystem } from '../model/units.ts'
import { displayFactor } from '../model/units.ts'
import { formatNumber, noiseFloor, denoise, unitLabel } from './format.ts'

/** A display table: header cells (units in brackets) and rows of formatted cells. */
export interface DisplayTable {
  readonly head: readonly string[]
  readonly rows: readonly (readonly string[])[]
}

const vec = (v: readonly number[], f: number, floor = 0): string => `(${v.map((x) => formatNumber(denoise(x, floor) * f)).join(', ')})`

/** The part label: number, and name where it has one. */
export function partName(assembly: AssemblySummary | null, part: number): string {
  const n = assembly?.parts.find((p) => p.part === part)?.name
  return n ? `${part} ${n}` : String(part)
}

/** The regions of a cut: #, part, area, N, |V|, T, |Mb| (moments about each region's centroid). */
export function regionTable(r: SectionResult, assembly: AssemblySummary | null, units: ModelUnits, system: UnitSystem): DisplayTable {
  const A = displayFactor(units, 'area', system), F = displayFactor(units, 'force', system), M = displayFactor(units, 'moment', system)
  const regions = r.regions ?? []
  const fFloor = noiseFloor(regions.flatMap((g) => g.force)), mFloor = noiseFloor(regions.flatMap((g) => [g.torque, ...g.bending]))
  return {
    head: ['#', 'part', `area [${unitLabel('area', system)}]`, `N [${unitLabel('force', system)}]`, `|V| [${unitLabel('force', system)}]`, `T [${unitLabel('moment', system)}]`, `|Mb| [${unitLabel('moment', system)}]`],
    rows: regions.map((g, k) => [
      String(k + 1), g.parts.map((p) => partName(assembly, p)).join(', '), formatNumber(g.area * A), formatNumber(denoise(g.axial, fFloor) * F),
      formatNumber(denoise(Math.hypot(...g.shear), fFloor) * F), formatNumber(denoise(g.torque, mFloor) * M), formatNumber(denoise(Math.hypot(...g.bending), mFloor) * M),
    ]),
  }
}

/** The parts: number, name, elements, volume, and each part's residual force and relative residual (the load path's check). */
export function partTable(a: AssemblySummary, units: ModelUnits, system: UnitSystem): DisplayTable {
  const V = displayFactor(units, 'volume', system), F = displayFactor(units, 'force', system)
  return {
    head: ['part', 'name', 'elements', `volume [${unitLabel('volume', system)}]`, `residual force [${unitLabel('force', system)}]`, `gross load [${unitLabel('force', system)}]`, 'relative'],
    rows: a.parts.map((p) => [
      String(p.part), p.name || '—', String(p.elements), formatNumber(p.volume * V), vec(p.balance.force, F, noiseFloor([p.balance.gross])), formatNumber(p.balance.gross * F), formatNumber(p.balance.relative, 2),
    ]),
  }
}

/** The interfaces: a → b, area, centroid, force a exerts on b, moment about the centroid, mismatch. */
export function interfaceTable(a: AssemblySummary, units: ModelUnits, system: UnitSystem): DisplayTable {
  const A = displayFactor(units, 'area', system), L = displayFactor(units, 'length', system), F = displayFactor(units, 'force', system), M = displayFactor(units, 'moment', system)
  const fFloor = noiseFloor(a.interfaces.flatMap((i) => i.force)), mFloor = noiseFloor(a.interfaces.flatMap((i) => i.moment))
  return {
    head: ['parts a → b', `area [${unitLabel('area', system)}]`, `centroid [${unitLabel('length', system)}]`, `force a on b [${unitLabel('force', system)}]`, `moment [${unitLabel('moment', system)}]`, 'mismatch'],
    rows: a.interfaces.map((i) => [
      `${partName(a, i.parts[0])} → ${partName(a, i.parts[1])}`, formatNumber(i.area * A), vec(i.centroid, L), vec(i.force, F, fFloor), vec(i.moment, M, mFloor), formatNumber(i.mismatch < 1e-12 ? 0 : i.mismatch, 2),
    ]),
  }
}

/** The regions as records in model units (JSON export; the keys of `tractus cut --json`). */
export function regionRecords(r: SectionResult): object[] {
  return (r.regions ?? []).map((g) => ({
    area: g.area, centroid: [...g.centroid], force: [...g.force], moment: [...g.moment], axial: g.axial, shear: [...g.shear], torque: g.torque, bending: [...g.bending], parts: [...g.parts],
  }))
}

/** The parts and interfaces as records in model units (JSON export; the keys of `tractus parts --json`). */
export function assemblyRecords(a: AssemblySummary): object {
  return {
    parts: a.parts.map((p) => ({
      part: p.part, name: p.name, elements: p.elements, volume: p.volume,
      balance: { force: [...p.balance.force], moment: [...p.balance.moment], relative: p.balance.relative, about: [...p.balance.about], gross: p.balance.gross },
    })),
    interfaces: a.interfaces.map((i) => ({ parts: [...i.parts], area: i.area, centroid: [...i.centroid], force: [...i.force], moment: [...i.moment], mismatch: i.mismatch, faces: i.faces })),
  }
}

const csvCell = (v: string): string => (/[",\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v)

/** The regions as CSV lines in display units, every digit (no rounding-noise rule in exports). */
export function regionCsvLines(r: SectionResult, system: UnitSystem, units: ModelUnits): string[] {
  const L = displayFactor(units, 'length', system), A = displayFactor(units, 'area', system), F = displayFactor(units, 'force', system), M = displayFactor(units, 'moment', system)
  const l = unitLabel('length', system), a = unitLabel('area', system), f = unitLabel('force', system), m = unitLabel('moment', system)
  const lines = [
    '# regions, largest force first: what the +n side exerts on the -n side, moments about each region\'s own centroid, in its own section axes',
    ['region', 'parts', `area ${a}`, `cx ${l}`, `cy ${l}`, `cz ${l}`, `Fx ${f}`, `Fy ${f}`, `Fz ${f}`, `Mx ${m}`, `My ${m}`, `Mz ${m}`, `N ${f}`, `V1 ${f}`, `V2 ${f}`, `T ${m}`, `M1 ${m}`, `M2 ${m}`].map(csvCell).join(','),
  ]
  ;(r.regions ?? []).forEach((g, k) => {
    lines.push([String(k + 1), g.parts.join(' '), g.area * A, ...g.centroid.map((v) => v * L), ...g.force.map((v) => v * F), ...g.moment.map((v) => v * M),
      g.axial * F, g.shear[0] * F, g.shear[1] * F, g.torque * M, g.bending[0] * M, g.bending[1] * M].map((v) => csvCell(String(v))).join(','))
  })
  return lines
}

/** The parts and interfaces as CSV in display units (two tables, each under a comment line). */
export function assemblyCsv(name: string, a: AssemblySummary, units: ModelUnits, system: UnitSystem): string {
  const L = displayFactor(units, 'length', system), A = displayFactor(units, 'area', system), V = displayFactor(units, 'volume', system), F = displayFactor(units, 'force', system), M = displayFactor(units, 'moment', system)
  const l = unitLabel('length', system), ar = unitLabel('area', system), v = unitLabel('volume', system), f = unitLabel('force', system), m = unitLabel('moment', system)
  const row = (cells: readonly (string | number)[]): string => cells.map((c) => csvCell(String(c))).join(',')
  const lines = [
    `# Tractus parts and interfaces: ${name.replace(/[\r\n]/g, ' ')}`,
    '# parts: each part\'s own free body (boundary including its faces against other parts): residual of the boundary tractions and the body force, moment about "about"',
    row(['part', 'name', 'elements', `volume ${v}`, `Rx ${f}`, `Ry ${f}`, `Rz ${f}`, `RMx ${m}`, `RMy ${m}`, `RMz ${m}`, `about x ${l}`, `about y ${l}`, `about z ${l}`, `gross ${f}`, 'relative']),
    ...a.parts.map((p) => row([p.part, p.name, p.elements, p.volume * V, ...p.balance.force.map((x) => x * F), ...p.balance.moment.map((x) => x * M), ...p.balance.about.map((x) => x * L), p.balance.gross * F, p.balance.relative])),
    '',
    '# interfaces: force that part a exerts on part b (b\'s faces and stress), moment about the interface centroid; mismatch |F_ab + F_ba| / gross',
    row(['a', 'b', 'faces', `area ${ar}`, `cx ${l}`, `cy ${l}`, `cz ${l}`, `Fx ${f}`, `Fy ${f}`, `Fz ${f}`, `Mx ${m}`, `My ${m}`, `Mz ${m}`, `F_ba x ${f}`, `F_ba y ${f}`, `F_ba z ${f}`, 'mismatch']),
    ...a.interfaces.map((i) => row([i.parts[0], i.parts[1], i.faces, i.area * A, ...i.centroid.map((x) => x * L), ...i.force.map((x) => x * F), ...i.moment.map((x) => x * M), ...i.reverseForce.map((x) => x * F), i.mismatch])),
  ]
  return lines.join('\n') + '\n'
}

/**
 * The load path of the assembly, one row per way a load enters a part: its external load-entry
 * patches and its interfaces (the force the other part exerts on it), then the part's residual
 * (∮ t dA + ∫ ρb dV over the part, its faces against other parts included). Forces in display units.
 */
export function loadPathTable(a: AssemblySummary, patches: readonly { id: number; part: number; force: readonly number[] }[], units: ModelUnits, system: UnitSystem): DisplayTable {
  const F = displayFactor(units, 'force', system)
  const floor = noiseFloor(a.parts.map((p) => p.balance.gross))
  const rows: string[][] = []
  for (const p of a.parts) {
    const name = partName(a, p.part)
    for (const q of patches) if (q.part === p.part) rows.push([name, `load-entry patch ${q.id}`, vec(q.force, F, floor), formatNumber(Math.hypot(...q.force) * F)])
    for (const i of a.interfaces) {
      // what the other part exerts on this one: F_ab on b, F_ba on a
      if (i.parts[1] === p.part) rows.push([name, `interface from ${partName(a, i.parts[0])}`, vec(i.force, F, floor), formatNumber(Math.hypot(...i.force) * F)])
      if (i.parts[0] === p.part) rows.push([name, `interface from ${partName(a, i.parts[1])}`, vec(i.reverseForce, F, floor), formatNumber(Math.hypot(...i.reverseForce) * F)])
    }
    rows.push([name, `residual (relative ${formatNumber(p.balance.relative, 2)})`, vec(p.balance.force, F, floor), formatNumber(Math.hypot(...p.balance.force) * F)])
  }
  return { head: ['part', 'load enters through', `force on the part [${unitLabel('force', system)}]`, `|F| [${unitLabel('force', system)}]`], rows }
}
