/**
 * Tables of figures shared by the cards, the snapshot, the report and the CSV/JSON exports, so
 * all show the same numbers. Each row keeps the raw model-unit value (`model`), the displayed one
 * (`value`, every digit: what CSV and JSON carry) and the one a reader sees (`shown`: `value`
 * after the rounding-noise rule of format.ts, for cards, snapshots and reports).
 */
import type { LoadPatch, SectionResult } from '../mechanics/types.ts'
import { describeAxes } from '../mechanics/sectionAxes.ts'
import type { ModelUnits, Quantity, UnitSystem } from '../model/units.ts'
import { convert, denoise, formatNumber, noiseFloor, unitLabel } from './format.ts'
import type { ModelSummary } from '../../workers/protocol.ts'
import { regionCsvLines, regionRecords } from './assemblyTables.ts'

export interface FigureRow {
  readonly key: string
  readonly label: string
  /** Value in model units. */
  readonly model: number
  /** Value in the display system, every digit (CSV, JSON). */
  readonly value: number
  /** Value in the display system after the rounding-noise rule (cards, snapshot, report). */
  readonly shown: number
  /** The family's noise floor in model units (0: none). */
  readonly floor: number
  readonly unit: string
  readonly q: Quantity | null
}

/** Section rows by family: each family's values are judged against its largest (see format.ts NOISE_FRACTION). */
const FAMILY: Readonly<Record<string, string>> = {
  axial: 'force', shear1: 'force', shear2: 'force', Fx: 'force', Fy: 'force', Fz: 'force', fbF: 'force',
  torque: 'moment', bending1: 'moment', bending2: 'moment', Mx: 'moment', My: 'moment', Mz: 'moment', fbM: 'moment',
  cx: 'length', cy: 'length', cz: 'length', I1: 'secondMoment', I2: 'secondMoment', I12: 'secondMoment',
}

/**
 * Section resultant in section axes, then in x/y/z, then area, centroid, second moments about the
 * section axes and the free-body balance. `modelSize`: the model's size (length units), which
 * coordinates are judged against for the rounding-noise rule.
 */
export function sectionRows(r: SectionResult, units: ModelUnits, system: UnitSystem, modelSize = 0): FigureRow[] {
  const raw: [string, string, number, Quantity | null][] = [
    ['axial', 'Axial force N', r.axial, 'force'],
    ['shear1', 'Shear force V₁ (along e₁)', r.shear[0], 'force'],
    ['shear2', 'Shear force V₂ (along e₂)', r.shear[1], 'force'],
    ['torque', 'Torque T (about e₃ = n)', r.torque, 'moment'],
    ['bending1', 'Bending moment M₁ (about e₁)', r.bending[0], 'moment'],
    ['bending2', 'Bending moment M₂ (about e₂)', r.bending[1], 'moment'],
    ['Fx', 'Force Fx', r.force[0], 'force'],
    ['Fy', 'Force Fy', r.force[1], 'force'],
    ['Fz', 'Force Fz', r.force[2], 'force'],
    ['Mx', 'Moment Mx', r.moment[0], 'moment'],
    ['My', 'Moment My', r.moment[1], 'moment'],
    ['Mz', 'Moment Mz', r.moment[2], 'moment'],
    ['area', 'Area', r.area, 'area'],
    ['cx', 'Centroid x', r.centroid[0], 'length'],
    ['cy', 'Centroid y', r.centroid[1], 'length'],
    ['cz', 'Centroid z', r.centroid[2], 'length'],
    ['I1', 'Second moment I₁ (about e₁)', r.secondMoments.I1, 'secondMoment'],
    ['I2', 'Second moment I₂ (about e₂)', r.secondMoments.I2, 'secondMoment'],
    ['I12', 'Product of area I₁₂', r.secondMoments.I12, 'secondMoment'],
    ['fbF', 'Free body |residual force|', Math.hypot(...r.freeBody.force), 'force'],
    ['fbM', 'Free body |residual moment|', Math.hypot(...r.freeBody.moment), 'moment'],
    ['fbRel', 'Free body residual / gross', r.freeBody.relative, null],
    ['fbRelM', 'Free body moment residual / (gross · L)', r.freeBody.momentRelative, null],
  ]
  const floors = new Map<string, number>()
  for (const fam of ['force', 'moment', 'secondMoment']) floors.set(fam, noiseFloor(raw.filter(([k]) => FAMILY[k] === fam).map(([, , v]) => v)))
  floors.set('length', noiseFloor([], modelSize))
  return raw.map(([key, label, v, q]) => {
    const floor = floors.get(FAMILY[key]) ?? 0
    const value = q ? convert(v, units, q, system) : v
    return { key, label, model: v, value, shown: q ? convert(denoise(v, floor), units, q, system) : denoise(v, floor), floor, unit: q ? unitLabel(q, system) : '–', q }
  })
}

/** A unit vector for reading, three figures, components below 1e-6 shown as 0: "(0, 0.707, 0.707)". */
export function unitVectorText(v: readonly number[]): string {
  return `(${v.map((x) => formatNumber(denoise(x, 1e-6), 3)).join(', ')})`
}

/** The section axes for reading: which kind, and e₁, e₂, e₃ as unit vectors. */
export function axesLines(r: SectionResult): { kind: string; e1: string; e2: string; e3: string } {
  return { kind: describeAxes(r.axes).replace(/\be1\b/g, 'e₁').replace(/\be2\b/g, 'e₂').replace(/\bI1\b/g, 'I₁').replace(/\bI2\b/g, 'I₂'), e1: unitVectorText(r.axes.e1), e2: unitVectorText(r.axes.e2), e3: unitVectorText(r.axes.e3) }
}

export interface PatchRow {
  readonly id: number
  readonly part: number
  readonly faces: number
  readonly area: number
  readonly centroid: [number, number, number]
  readonly force: [number, number, number]
  readonly forceMagnitude: number
  /** Moment of the patch's traction about its own centroid. */
  readonly moment: [number, number, number]
  readonly momentMagnitude: number
  readonly peak: number
  readonly mean: number
}

export function patchRow(p: LoadPatch, units: ModelUnits, system: UnitSystem): PatchRow {
  const L = (v: number): number => convert(v, units, 'length', system)
  const F = (v: number): number => convert(v, units, 'force', system)
  const M = (v: number): number => convert(v, units, 'moment', system)
  const S = (v: number): number => convert(v, units, 'stress', system)
  return {
    id: p.id, part: p.part, faces: p.faceCount, area: convert(p.area, units, 'area', system),
    centroid: [L(p.centroid[0]), L(p.centroid[1]), L(p.centroid[2])],
    force: [F(p.force[0]), F(p.force[1]), F(p.force[2])],
    forceMagnitude: F(Math.hypot(...p.force)),
    moment: [M(p.moment[0]), M(p.moment[1]), M(p.moment[2])],
    momentMagnitude: M(Math.hypot(...p.moment)),
    peak: S(p.peak), mean: S(p.mean),
  }
}

/** CSV field: quote when needed, and defuse leading formula characters for spreadsheets. */
export function csvField(s: string | number): string {
  let t = String(s)
  if (/^[=+\-@]/.test(t) && typeof s === 'string') t = "'" + t
  return /[",\n\r]/.test(t) ? `"${t.replace(/"/g, '""')}"` : t
}

export function sectionCsv(m: ModelSummary, r: SectionResult, system: UnitSystem): string {
  const lines = [
    `# Tractus section resultant: ${m.name.replace(/[\r\n]/g, ' ')}`,
    `# plane point ${r.plane.point.join(' ')} normal ${r.plane.normal.join(' ')} (model units ${m.units.length}); moment about ${r.about.join(' ')}`,
    `# section axes: ${describeAxes(r.axes)}; e1 ${r.axes.e1.join(' ')}; e2 ${r.axes.e2.join(' ')}; e3 ${r.axes.e3.join(' ')}`,
    'quantity,value,unit',
  ]
  for (const row of sectionRows(r, m.units, system)) lines.push([csvField(row.label), csvField(row.value), csvField(row.unit)].join(','))
  // --- assemblies: the regions (and whether the figures are a selection's) ---
  if (r.limited) lines.splice(3, 0, '# limited: the figures are those of the selected polygons only')
  if (r.regions && r.regions.length) lines.push('', ...regionCsvLines(r, system, m.units))
  return lines.join('\n') + '\n'
}

export function sectionJson(m: ModelSummary, r: SectionResult, system: UnitSystem): string {
  const rows = sectionRows(r, m.units, system)
  return JSON.stringify({
    model: m.name, modelUnits: m.units, displayUnits: system,
    plane: r.plane, about: r.about, axes: r.axes, empty: r.empty, cutElements: r.cutElements,
    figures: Object.fromEntries(rows.map((x) => [x.key, { value: x.value, unit: x.unit, modelValue: x.model }])),
    ...(r.regions ? { limited: r.limited ?? false, freeBodyDefined: r.freeBodyDefined ?? true, regions: regionRecords(r) } : {}),
  }, null, 2)
}

/** How the patches were found, in words (for the CSV header, the card and the report). */
export function patchRuleText(a: { fractions: { threshold: number; lowerThreshold: number }; featureAngle: number }): string {
  const pct = (f: number): string => `${formatNumber(100 * f, 3)} %`
  return `faces above ${pct(a.fractions.threshold)} of the reference stress start a patch, faces above ${pct(a.fractions.lowerThreshold)} join one they touch; patches split where the surface folds by more than ${formatNumber(a.featureAngle, 3)}° and between parts; moments about each patch's centroid`
}

type PatchAudit = { fractions: { threshold: number; lowerThreshold: number }; featureAngle: number }

export function patchesCsv(m: ModelSummary, patches: readonly LoadPatch[], system: UnitSystem, rule?: PatchAudit): string {
  const L = unitLabel('length', system), A = unitLabel('area', system), F = unitLabel('force', system), M = unitLabel('moment', system), S = unitLabel('stress', system)
  const head = ['patch', 'part', 'faces', `area ${A}`, `cx ${L}`, `cy ${L}`, `cz ${L}`, `Fx ${F}`, `Fy ${F}`, `Fz ${F}`, `|F| ${F}`, `Mx ${M}`, `My ${M}`, `Mz ${M}`, `|M| ${M}`, `peak |t| ${S}`, `mean |t| ${S}`]
  const lines = [`# Tractus load-entry patches: ${m.name.replace(/[\r\n]/g, ' ')}`, ...(rule ? [`# ${patchRuleText(rule)}`] : []), head.map(csvField).join(',')]
  for (const p of patches) {
    const r = patchRow(p, m.units, system)
    lines.push([r.id, r.part, r.faces, r.area, ...r.centroid, ...r.force, r.forceMagnitude, ...r.moment, r.momentMagnitude, r.peak, r.mean].map(csvField).join(','))
  }
  return lines.join('\n') + '\n'
}

export function patchesJson(m: ModelSummary, patches: readonly LoadPatch[], system: UnitSystem, rule?: PatchAudit): string {
  return JSON.stringify({
    model: m.name, displayUnits: system,
    units: { length: unitLabel('length', system), area: unitLabel('area', system), force: unitLabel('force', system), moment: unitLabel('moment', system), stress: unitLabel('stress', system) },
    ...(rule ? { rule: { thresholdFraction: rule.fractions.threshold, lowerThresholdFraction: rule.fractions.lowerThreshold, featureAngle: rule.featureAngle, momentAbout: 'each patch\'s centroid' } } : {}),
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
