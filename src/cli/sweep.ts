/**
 * `tractus sweep <model> --normal nx,ny,nz --from a --to b --count N`: a row of parallel sections
 * at offsets a..b along the unit normal (plane point = offset · m), as CSV or JSON.
 */
import type { Command } from './command.ts'
import { BODY_FORCE_OPTION, HELP_OPTION, JSON_OPTION, UNITS_OPTION, bodyForceOf, printJson, unitChoice, vecOption } from './command.ts'
import { UsageError } from './args.ts'
import { loadModelAsync } from './loadModel.ts'
import { CASE_ALL_OPTION, COMBINATIONS_ONLY_OPTION, allCases, caseModel } from './caseOption.ts'
import { sweepAllCases } from './caseEnvelope.ts'
import { unitNormal } from '../mechanics/plane.ts'
import type { UnitView } from './unitView.ts'
import { createUnitView, unitLabels } from './unitView.ts'
import { axesOption, REFERENCE_OPTION, SECTION_AXES_DETAILS, sectionJson } from './cut.ts'
import type { SectionResult } from '../mechanics/types.ts'
import { sweepSections } from '../mechanics/sectionSweep.ts'
import { modelStressField } from '../model/stressField.ts'

const CSV_COLUMNS: readonly [string, (r: SectionResult) => number, Parameters<UnitView['factor']>[0] | null][] = [
  ['area', (r) => r.area, 'area'],
  ['cx', (r) => r.centroid[0], 'length'], ['cy', (r) => r.centroid[1], 'length'], ['cz', (r) => r.centroid[2], 'length'],
  ['fx', (r) => r.force[0], 'force'], ['fy', (r) => r.force[1], 'force'], ['fz', (r) => r.force[2], 'force'],
  ['mx', (r) => r.moment[0], 'moment'], ['my', (r) => r.moment[1], 'moment'], ['mz', (r) => r.moment[2], 'moment'],
  ['axial', (r) => r.axial, 'force'], ['shear1', (r) => r.shear[0], 'force'], ['shear2', (r) => r.shear[1], 'force'],
  ['torque', (r) => r.torque, 'moment'], ['bending1', (r) => r.bending[0], 'moment'], ['bending2', (r) => r.bending[1], 'moment'],
  ['freebody_relative', (r) => r.freeBody.relative, null],
  ['freebody_moment_relative', (r) => r.freeBody.momentRelative, null],
  ['cut_elements', (r) => r.cutElements, null],
]

export const sweepCommand: Command = {
  name: 'sweep',
  summary: 'parallel sections along a normal, one row per offset (CSV or JSON)',
  usage: 'tractus sweep <model> --normal nx,ny,nz --from a --to b --count N [--reference rx,ry,rz] [--case NAME|all [--combinations-only]] [--json] [--units si|us] [--body-force bx,by,bz]',
  positionals: ['<model>'],
  options: [
    { name: 'normal', kind: 'vec3', value: 'nx,ny,nz', required: true, help: 'section normal m (any length, not zero)' },
    { name: 'from', kind: 'number', value: 'a', required: true, help: 'first offset along the unit normal from the origin (model length units)' },
    { name: 'to', kind: 'number', value: 'b', required: true, help: 'last offset (model length units)' },
    { name: 'count', kind: 'integer', value: 'N', required: true, help: 'number of sections, at least 1 (evenly spaced, both ends included)' },
    REFERENCE_OPTION, CASE_ALL_OPTION, COMBINATIONS_ONLY_OPTION,
    JSON_OPTION, UNITS_OPTION, BODY_FORCE_OPTION, HELP_OPTION,
  ],
  details: [
    'Section k lies on the plane x·m = offset_k with m the unit normal; moments are about each section\'s centroid.',
    SECTION_AXES_DETAILS + ' One reference serves every section of the sweep.',
    'CSV columns: offset, area, cx, cy, cz, fx, fy, fz, mx, my, mz, axial, shear1, shear2, torque, bending1, bending2, freebody_relative, freebody_moment_relative, cut_elements; the header line names the units.',
    '--json prints {"sections": [...]} with "offset" and the fields of `tractus cut --json` per section.',
    '--case all: the envelope over every case and combination per section (--combinations-only: over the combinations), CSV columns offset, then per component (axial, shear1, shear2, torque, bending1, bending2) NAME_max, NAME_max_case, NAME_min, NAME_min_case; --json {"sections": [{"offset", "area", "envelope": {...as cut --case all...}}]}.',
  ].join('\n'),
  async run(args, io) {
    const normal = unitNormal(vecOption(args, 'normal')!, 'sweep direction')
    const from = args.options.from as number
    const to = args.options.to as number
    const count = args.options.count as number
    if (count < 1) throw new UsageError('--count must be at least 1')
    if (count > 100000) throw new UsageError('--count must be at most 100000')
    const axes = axesOption(args, normal)
    const loaded = await loadModelAsync(args.positionals[0])
    if (allCases(args)) {
      const offsets = Array.from({ length: count }, (_, k) => (k === count - 1 && count > 1 ? to : from + (count > 1 ? k * (to - from) / (count - 1) : 0)))
      return sweepAllCases(loaded, args, io, normal, offsets, axes)
    }
    const { model } = caseModel(loaded.model, args, 'sweep')
    const u = createUnitView(model.units, unitChoice(args))
    const bodyForce = bodyForceOf(args, model)
    const { offsets, results } = sweepSections(model.mesh, modelStressField(model), bodyForce, normal, from, to, count, { axes })
    const fl = u.factor('length')
    if (args.options.json) {
      printJson(io, {
        file: loaded.path, name: model.name, units: unitLabels(u), normal,
        axes: { kind: axes.kind, reference: results[0]?.axes.reference ?? null },
        bodyForce: [bodyForce[0] * u.factor('forcePerVolume'), bodyForce[1] * u.factor('forcePerVolume'), bodyForce[2] * u.factor('forcePerVolume')],
        sections: results.map((r, k) => ({ offset: offsets[k] * fl, ...sectionJson(r, u) })),
      })
      return 0
    }
    const header = [`offset [${u.label('length')}]`, ...CSV_COLUMNS.map(([name, , q]) => (q ? `${name} [${u.label(q)}]` : name))]
    let out = header.join(',') + '\n'
    for (let k = 0; k < results.length; k++) {
      const r = results[k]
      const row = [offsets[k] * fl, ...CSV_COLUMNS.map(([, get, q]) => get(r) * (q ? u.factor(q) : 1))]
      out += row.map((v) => (Number.isFinite(v) ? String(v) : '')).join(',') + '\n'
    }
    io.stdout(out)
    return 0
  },
}
