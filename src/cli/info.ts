/**
 * `tractus info <model>`: what is in a model (counts, element types, bounds, units and where they
 * came from, stress range, body force, how each file was read, reader warnings), without any
 * mechanics.
 */
import type { Command } from './command.ts'
import { BODY_FORCE_OPTION, HELP_OPTION, JSON_OPTION, UNITS_OPTION, bodyForceOf, printJson, unitChoice } from './command.ts'
import { CASE_OPTION, caseModel } from './caseOption.ts'
import { casesOf, combinationsOf, describeFactors } from '../model/loadCases.ts'
import { loadModelAsync } from './loadModel.ts'
import { createUnitView, unitLabels } from './unitView.ts'
import { block, qty, table, vecJson, vecQty } from './format.ts'
import { STRESS_COMPONENTS } from '../model/model.ts'
import type { Model } from '../model/model.ts'
import type { IntakeReport, UnitSource } from '../io/index.ts'

export interface ModelSummary {
  readonly types: Record<string, number>
  readonly parts: number[]
  readonly min: [number, number, number]
  readonly max: [number, number, number]
  /** Per stress component (xx, yy, zz, xy, yz, xz): smallest and largest nodal value. */
  readonly stressMin: number[]
  readonly stressMax: number[]
}

export function summarize(model: Model): ModelSummary {
  const { mesh, stress } = model
  const types: Record<string, number> = {}
  const parts = new Set<number>()
  for (const b of mesh.blocks) {
    types[b.type] = (types[b.type] ?? 0) + b.ids.length
    if (b.part) for (let i = 0; i < b.part.length; i++) parts.add(b.part[i])
  }
  const x = mesh.coords
  const min: [number, number, number] = [Infinity, Infinity, Infinity]
  const max: [number, number, number] = [-Infinity, -Infinity, -Infinity]
  for (let i = 0; i < mesh.nodeCount; i++) {
    for (let k = 0; k < 3; k++) {
      const v = x[3 * i + k]
      if (v < min[k]) min[k] = v
      if (v > max[k]) max[k] = v
    }
  }
  const stressMin = [Infinity, Infinity, Infinity, Infinity, Infinity, Infinity]
  const stressMax = [-Infinity, -Infinity, -Infinity, -Infinity, -Infinity, -Infinity]
  for (let i = 0; i < mesh.nodeCount; i++) {
    for (let k = 0; k < 6; k++) {
      const v = stress[6 * i + k]
      if (v < stressMin[k]) stressMin[k] = v
      if (v > stressMax[k]) stressMax[k] = v
    }
  }
  return { types, parts: [...parts].sort((a, b) => a - b), min, max, stressMin, stressMax }
}

const SOURCE_WORDS: Readonly<Record<UnitSource, string>> = {
  'model.json': 'model.json', header: 'the headers', container: 'the container', default: 'NOT DECLARED, assumed', chosen: 'NOT DECLARED, chosen when opened',
}

/** "length mm (model.json), stress MPa (the headers)". */
export function unitsText(model: Model, intake: IntakeReport): string {
  const s = intake.unitSources
  return `length ${model.units.length} (${SOURCE_WORDS[s.length]}), stress ${model.units.stress} (${SOURCE_WORDS[s.stress]})`
}

export const infoCommand: Command = {
  name: 'info',
  summary: 'counts, element types, bounds, units and warnings of a model',
  usage: 'tractus info <model> [--case NAME] [--json] [--units si|us] [--body-force bx,by,bz]',
  positionals: ['<model>'],
  options: [CASE_OPTION, JSON_OPTION, UNITS_OPTION, BODY_FORCE_OPTION, HELP_OPTION],
  details: '<model> is a bundle folder (nodes.csv, elements.csv, stress.csv, optional displacement.csv and model.json; further load cases stress.NAME.csv and displacement.NAME.csv) or a native .tractus file. The stress range is that of the case shown (--case); the load cases and combinations are listed ("cases", "combinations" and the shown "case" in --json).',
  async run(args, io) {
    const loaded = await loadModelAsync(args.positionals[0])
    const { model, name: shownCase } = caseModel(loaded.model, args, 'info')
    const cases = casesOf(model), combinations = combinationsOf(model)
    const intake = model.intake
    const u = createUnitView(model.units, unitChoice(args))
    const s = summarize(model)
    const bodyForce = bodyForceOf(args, model)
    const size: [number, number, number] = [s.max[0] - s.min[0], s.max[1] - s.min[1], s.max[2] - s.min[2]]
    if (args.options.json) {
      const fs = u.factor('stress')
      printJson(io, {
        file: loaded.path,
        format: loaded.format,
        bytes: loaded.bytes,
        name: model.name,
        description: model.description,
        modelUnits: { length: model.units.length, stress: model.units.stress },
        unitsDeclared: intake.unitsDeclared,
        unitSources: intake.unitSources,
        units: unitLabels(u),
        nodes: model.mesh.nodeCount,
        elements: model.mesh.elementCount,
        types: s.types,
        parts: s.parts,
        bounds: { min: vecJson(s.min, 'length', u), max: vecJson(s.max, 'length', u), size: vecJson(size, 'length', u) },
        stress: Object.fromEntries(STRESS_COMPONENTS.map((c, k) => [c, [s.stressMin[k] * fs, s.stressMax[k] * fs]])),
        displacement: model.displacement !== null,
        stressLayout: model.stressField ? 'element-nodal' : 'nodal',
        bodyForce: vecJson(bodyForce, 'forcePerVolume', u),
        case: shownCase,
        cases: cases.map((c) => ({ name: c.name, description: c.description, bodyForce: vecJson(c.bodyForce ?? model.bodyForce, 'forcePerVolume', u), displacement: c.displacement !== null })),
        combinations: combinations.map((c) => ({ name: c.name, factors: { ...c.factors } })),
        files: intake.files.map((f) => ({ ...f })),
        warnings: [...model.warnings],
      })
      return 0
    }
    const typeText = Object.entries(s.types).map(([t, n]) => `${n} ${t}`).join(', ')
    let out = block(`Model "${model.name}" (${loaded.format === 'native' ? 'native file' : 'CSV bundle'} ${loaded.path})`, [
      ['model units', unitsText(model, intake)],
      ['nodes', String(model.mesh.nodeCount)],
      ['elements', `${model.mesh.elementCount} (${typeText || 'none'})`],
      ['parts', s.parts.length ? s.parts.join(', ') : 'none'],
      ['bounds min', vecQty(s.min, 'length', u)],
      ['bounds max', vecQty(s.max, 'length', u)],
      ['size', vecQty(size, 'length', u)],
      ['body force ρb', vecQty(bodyForce, 'forcePerVolume', u)],
      ['stress form', model.stressField ? `element-nodal (${model.stressField.values.length / 6} rows, one per element and node; averaged within each part for display)` : 'nodal (one row per node)'],
      ['displacement', model.displacement ? 'present' : 'none'],
    ])
    if (model.description) out += `  ${model.description}\n`
    out += `\nLoad cases (shown: ${shownCase})\n`
    out += table(cases.map((c) => [`  ${c.name}`, c.description || '—', `ρb ${vecQty(c.bodyForce ?? model.bodyForce, 'forcePerVolume', u)}`, c.displacement ? 'displacement' : 'no displacement']), [false, false, false, false])
    if (combinations.length) {
      out += '\nCombinations\n'
      out += table(combinations.map((c) => [`  ${c.name}`, describeFactors(c)]), [false, false])
    }
    if (intake.files.length) {
      out += '\nFiles read\n'
      out += table(intake.files.map((f) => [`  ${f.role}`, f.file, f.description + (f.ignoredColumns.length ? `; columns left out: ${f.ignoredColumns.join(', ')}` : '')]), [false, false, false])
    }
    out += '\nNodal stress range\n'
    out += table([
      ['  component', 'min', 'max'],
      ...STRESS_COMPONENTS.map((c, k) => [`  σ${c}`, qty(s.stressMin[k], 'stress', u), qty(s.stressMax[k], 'stress', u)]),
    ], [false, true, true])
    out += `\nWarnings: ${model.warnings.length ? '' : 'none'}\n`
    for (const w of model.warnings) out += `  - ${w}\n`
    io.stdout(out)
    return 0
  },
}

