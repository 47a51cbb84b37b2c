/**
 * Tables of figures shared by the cards, the snapshot and the CSV/JSON exports, so all three
 * show the same numbers. Each row keeps the raw model-unit value (`model`) and the displayed one.
 */
import type { LoadPatch, SectionResult } from '../mechanics/types.ts'
import type { ModelUnits, Quantity, UnitSystem } from '../model/units.ts'
import { convert, unitLabel } from './format.ts'
import type { ModelSummary } from '../../workers/protocol.ts'

export interface FigureRow {
  readonly key: string
  readonly label: string
  /** Value in model units. */
  readonly model: number
  /** Value in the display system. */
  readonly value: number
  readonly unit: string
}

function row(key: string, label: string, v: number, q: Quantity | null, units: ModelUnits, system: UnitSystem): FigureRow {
  return { key, label, model: v, value: q ? convert(v, units, q, system) : v, unit: q ? unitLabel(q, system) : '–' }
}

/** Section resultant in section axes, then in x/y/z, then area, centroid and free-body balance. */
export function sectionRows(r: SectionResult, units: ModelUnits, system: UnitSystem): FigureRow[] {
  const R = (k: string, l: string, v: number, q: Quantity | null): FigureRow => row(k, l, v, q, units, system)
  return [
    R('axial', 'Axial force N', r.axial, 'force'),
    R('shear1', 'Shear force V₁', r.shear[0], 'force'),
    R('shear2', 'Shear force V₂', r.shear[1], 'force'),
    R('torque', 'Torque T', r.torque, 'moment'),
    R('bending1', 'Bending moment M₁', r.bending[0], 'moment'),
    R('bending2', 'Bending moment M₂', r.bending[1], 'moment'),
    R('Fx', 'Force Fx', r.force[0], 'force'),
    R('Fy', 'Force Fy', r.force[1], 'force'),
    R('Fz', 'Force Fz', r.force[2], 'force'),
    R('Mx', 'Moment Mx', r.moment[0], 'moment'),
    R('My', 'Moment My', r.moment[1], 'moment'),
    R('Mz', 'Moment Mz', r.moment[2], 'moment'),
    R('area', 'Area', r.area, 'area'),
    R('cx', 'Centroid x', r.centroid[0], 'length'),
    R('cy', 'Centroid y', r.centroid[1], 'length'),
    R('cz', 'Centroid z', r.centroid[2], 'length'),
    R('I1', 'Second moment I₁', r.secondMoments.I1, 'secondMoment'),
    R('I2', 'Second moment I₂', r.secondMoments.I2, 'secondMoment'),
    R('fbF', 'Free body |residual force|', Math.hypot(...r.freeBody.force), 'force'),
    R('fbM', 'Free body |residual moment|', Math.hypot(...r.freeBody.moment), 'moment'),
    R('fbRel', 'Free body residual / gross', r.freeBody.relative, null),
    R('fbRelM', 'Free body moment residual / (gross · L)', r.freeBody.momentRelative, null),
  ]
}

export interface PatchRow {
  readonly id: number
  readonly faces: number
  readonly area: number
  readonly centroid: [number, number, number]
  readonly force: [number, number, number]
  readonly forceMagnitude: number
  readonly peak: number
  readonly mean: number
}

export function patchRow(p: LoadPatch, units: ModelUnits, system: UnitSystem): PatchRow {
  const L = (v: number): number => convert(v, units, 'length', system)
  const F = (v: number): number => convert(v, units, 'force', system)
  const S = (v: number): number => convert(v, units, 'stress', system)
  return {
    id: p.id, faces: p.faceCount, area: convert(p.area, units, 'area', system),
    centroid: [L(p.centroid[0]), L(p.centroid[1]), L(p.centroid[2])],
    force: [F(p.force[0]), F(p.force[1]), F(p.force[2])],
    forceMagnitude: F(Math.hypot(...p.force)), peak: S(p.peak), mean: S(p.mean),
  }
}

/** CSV field: quote when needed, and defuse leading formula characters for spreadsheets. */
function csvField(s: string | number): string {
  let t = String(s)
  if (/^[=+\-@]/.test(t) && typeof s === 'string') t = "'" + t
  return /[",\n\r]/.test(t) ? `"${t.replace(/"/g, '""')}"` : t
}

export function sectionCsv(m: ModelSummary, r: SectionResult, system: UnitSystem): string {
  const lines = [
    `# Tractus section resultant: ${m.name.replace(/[\r\n]/g, ' ')}`,
    `# plane point ${r.plane.point.join(' ')} normal ${r.plane.normal.join(' ')} (model units ${m.units.length}); moment about ${r.about.join(' ')}`,
    'quantity,value,unit',
  ]
  for (const row of sectionRows(r, m.units, system)) lines.push([csvField(row.label), csvField(row.value), csvField(row.unit)].join(','))
  return lines.join('\n') + '\n'
}

export function sectionJson(m: ModelSummary, r: SectionResult, system: UnitSystem): string {
  const rows = sectionRows(r, m.units, system)
  return JSON.stringify({
    model: m.name, modelUnits: m.units, displayUnits: system,
    plane: r.plane, about: r.about, axes: r.axes, empty: r.empty, cutElements: r.cutElements,
    figures: Object.fromEntries(rows.map((x) => [x.key, { value: x.value, unit: x.unit, modelValue: x.model }])),
  }, null, 2)
}

export function patchesCsv(m: ModelSummary, patches: readonly LoadPatch[], system: UnitSystem): string {
  const L = unitLabel('length', system), A = unitLabel('area', system), F = unitLabel('force', system), S = unitLabel('stress', system)
  const head = ['patch', 'faces', `area ${A}`, `cx ${L}`, `cy ${L}`, `cz ${L}`, `Fx ${F}`, `Fy ${F}`, `Fz ${F}`, `|F| ${F}`, `peak |t| ${S}`, `mean |t| ${S}`]
  const lines = [`# Tractus load-entry patches: ${m.name.replace(/[\r\n]/g, ' ')}`, head.map(csvField).join(',')]
  for (const p of patches) {
    const r = patchRow(p, m.units, system)
    lines.push([r.id, r.faces, r.area, ...r.centroid, ...r.force, r.forceMagnitude, r.peak, r.mean].map(csvField).join(','))
  }
  return lines.join('\n') + '\n'
}

export function patchesJson(m: ModelSummary, patches: readonly LoadPatch[], system: UnitSystem): string {
  return JSON.stringify({
    model: m.name, displayUnits: system,
    units: { length: unitLabel('length', system), area: unitLabel('area', system), force: unitLabel('force', system), stress: unitLabel('stress', system) },
    patches: patches.map((p) => patchRow(p, m.units, system)),
  }, null, 2)
}

/** Starts a download of text or a blob under `name` (object URL, revoked afterwards). */
export function download(name: string, data: string | Blob, type = 'text/plain'): void {
  const blob = typeof data === 'string' ? new Blob([data], { type }) : data
  const url = URL.createObjectURL(blob)
  const a = document.createElement('a')
  a.href = url
  a.download = name
  document.body.appendChild(a)
  a.click()
  a.remove()
  setTimeout(() => URL.revokeObjectURL(url), 10_000)
}

/** A file-name-safe stem from a model name. */
export function fileStem(name: string): string {
  return (name.replace(/[^A-Za-z0-9_-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'model')
}
