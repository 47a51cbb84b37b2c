/**
 * `--case all` of `cut` and `sweep`: every load case and combination of a section at once, and
 * the envelope (largest and smallest value of each resultant component in section axes, the
 * case that governs each), for the section and each of its regions. The envelope comes from one
 * stencil per plane (src/mechanics/sectionEnvelope.ts); each case of `cut` is also cut in full,
 * with its free body, by the single-case cut.
 */
import type { ParsedArgs } from './args.ts'
import type { CliIO } from './command.ts'
import { bodyForceOf, printJson, unitChoice } from './command.ts'
import type { LoadedModel } from './loadModel.ts'
import type { UnitView } from './unitView.ts'
import { createUnitView, unitLabels } from './unitView.ts'
import { num, table, vecJson, vecPlain, vecQty } from './format.ts'
import { combinationsOnly } from './caseOption.ts'
import { regionsJson, sectionJson, sectionLimitOf, sectionText, meshSize } from './cut.ts'
import type { Model, Vec3 } from '../model/model.ts'
import { caseNames, combinationsOf, modelForCase } from '../model/loadCases.ts'
import { modelStressField } from '../model/stressField.ts'
import { cutSection } from '../mechanics/sectionCut.ts'
import type { SectionAxesChoice } from '../mechanics/sectionAxes.ts'
import type { EnvelopeEntry, ResultantEnvelope, SectionEnvelope } from '../mechanics/sectionEnvelope.ts'
import { modelEnvelope, sweepEnvelopes } from '../mechanics/sweepEnvelope.ts'
import type { SectionPlane } from '../mechanics/types.ts'
import { denoise, noiseFloor } from '../model/roundingNoise.ts'

/** An envelope as JSON: {axial: {max, maxCase, min, minCase}, torque, shear: [.., ..], bending: [.., ..]} in the view's units. */
export function envelopeJson(e: ResultantEnvelope | null, u: UnitView): Record<string, unknown> | null {
  if (!e) return null
  const f = (x: EnvelopeEntry, k: number) => ({ max: x.max * k, maxCase: x.maxCase, min: x.min * k, minCase: x.minCase })
  const ff = u.factor('force'), fm = u.factor('moment')
  return { axial: f(e.axial, ff), torque: f(e.torque, fm), shear: [f(e.shear[0], ff), f(e.shear[1], ff)], bending: [f(e.bending[0], fm), f(e.bending[1], fm)] }
}

/** The envelope's regions as JSON (largest area first). */
export function envelopeRegionsJson(env: SectionEnvelope, u: UnitView): Record<string, unknown>[] {
  return env.regions.map((g) => ({ area: g.area * u.factor('area'), centroid: vecJson(g.centroid, 'length', u), parts: [...g.parts], ...envelopeJson(g.envelope, u) }))
}

/** The envelope as a table: component, largest with its case, smallest with its case. */
export function envelopeText(e: ResultantEnvelope, u: UnitView, indent = '  '): string {
  const fF = noiseFloor([e.axial.max, e.axial.min, ...e.shear.flatMap((x) => [x.max, x.min])])
  const fM = noiseFloor([e.torque.max, e.torque.min, ...e.bending.flatMap((x) => [x.max, x.min])])
  const row = (label: string, x: EnvelopeEntry, q: 'force' | 'moment') => {
    const floor = q === 'force' ? fF : fM
    const hi = denoise(x.max, floor), lo = denoise(x.min, floor)
    // a component that is rounding noise in every case has no governing case
    const noise = hi === 0 && lo === 0
    return [`${indent}${label} [${u.label(q)}]`, num(hi * u.factor(q)), noise ? '—' : x.maxCase, num(lo * u.factor(q)), noise ? '—' : x.minCase]
  }
  return table([
    [`${indent}component`, 'largest', 'case', 'smallest', 'case'],
    row('axial N', e.axial, 'force'), row('shear V1', e.shear[0], 'force'), row('shear V2', e.shear[1], 'force'),
    row('torque T', e.torque, 'moment'), row('bending M1', e.bending[0], 'moment'), row('bending M2', e.bending[1], 'moment'),
  ], [false, true, false, true, false])
}

/** `cut --case all`. */
export function cutAllCases(loaded: LoadedModel, args: ParsedArgs, io: CliIO, plane: SectionPlane, about: Vec3 | undefined, axes: SectionAxesChoice): number {
  const model = loaded.model
  const u = createUnitView(model.units, unitChoice(args))
  const only = combinationsOnly(model, args)
  const limit = sectionLimitOf(args, model.mesh)
  const given = args.options['body-force'] !== undefined ? bodyForceOf(args, model) : null
  const results = caseNames(model).map((name) => {
    const m = modelForCase(model, name)
    const bf = given ?? m.bodyForce
    return { name, bf, r: cutSection(m.mesh, modelStressField(m), bf, plane, { about, polygons: false, regions: true, limit, axes }).result }
  })
  const env = modelEnvelope(model, plane, { about, axes, limit, combinationsOnly: only })
  if (args.options.json) {
    printJson(io, {
      file: loaded.path, name: model.name, units: unitLabels(u), combinationsOnly: only,
      cases: results.map(({ name, bf, r }) => ({
        case: name, bodyForce: vecJson(bf, 'forcePerVolume', u), ...sectionJson(r, u),
        limited: r.limited ?? false, freeBodyDefined: r.freeBodyDefined ?? true, regions: regionsJson(r, u),
      })),
      envelope: { ...envelopeJson(env.envelope, u), regions: envelopeRegionsJson(env, u) },
    })
    return 0
  }
  const size = meshSize(model.mesh.coords)
  let out = ''
  for (const { name, r } of results) out += sectionText(r, u, `Case ${name}: section of "${model.name}" through ${vecQty(plane.point, 'length', u)}, normal ${vecPlain(plane.normal)}`, size) + '\n'
  out += envelopeBlock(env, u, model)
  io.stdout(out)
  return 0
}

/** The envelope of a section and of its regions, as text. */
export function envelopeBlock(env: SectionEnvelope, u: UnitView, model: Model): string {
  const over = env.combinationsOnly ? `the ${combinationsOf(model).length} combinations` : `${caseNames(model).length} cases and combinations`
  if (!env.envelope || env.cases[0].section.empty) return `Envelope over ${over}: the plane does not cut the body\n`
  let out = `Envelope over ${over} (section axes)\n` + envelopeText(env.envelope, u)
  env.regions.forEach((g, i) => {
    if (env.regions.length < 2 || !g.envelope) return
    out += `\nRegion ${i + 1} (part ${g.parts.join(', ')}, area ${num(g.area * u.factor('area'))} ${u.label('area')}, centroid ${vecQty(g.centroid, 'length', u)})\n` + envelopeText(g.envelope, u)
  })
  return out
}

/** `sweep --case all`: the envelope per section. */
export function sweepAllCases(loaded: LoadedModel, args: ParsedArgs, io: CliIO, normal: Vec3, offsets: readonly number[], axes: SectionAxesChoice): number {
  const model = loaded.model
  const u = createUnitView(model.units, unitChoice(args))
  const only = combinationsOnly(model, args)
  const envs = sweepEnvelopes(model, normal, offsets, { axes, combinationsOnly: only })
  const fl = u.factor('length')
  if (args.options.json) {
    printJson(io, {
      file: loaded.path, name: model.name, units: unitLabels(u), normal, cases: caseNames(model), combinationsOnly: only,
      sections: envs.map((e, k) => ({ offset: offsets[k] * fl, area: e.cases[0].section.area * u.factor('area'), envelope: e.cases[0].section.empty ? null : { ...envelopeJson(e.envelope, u), regions: envelopeRegionsJson(e, u) } })),
    })
    return 0
  }
  const comps: [string, (e: ResultantEnvelope) => EnvelopeEntry, 'force' | 'moment'][] = [
    ['axial', (e) => e.axial, 'force'], ['shear1', (e) => e.shear[0], 'force'], ['shear2', (e) => e.shear[1], 'force'],
    ['torque', (e) => e.torque, 'moment'], ['bending1', (e) => e.bending[0], 'moment'], ['bending2', (e) => e.bending[1], 'moment'],
  ]
  const header = [`offset [${u.label('length')}]`, ...comps.flatMap(([n, , q]) => [`${n}_max [${u.label(q)}]`, `${n}_max_case`, `${n}_min [${u.label(q)}]`, `${n}_min_case`])]
  let out = header.join(',') + '\n'
  envs.forEach((e, k) => {
    const env = e.cases[0].section.empty ? null : e.envelope
    const cells = comps.flatMap(([, get, q]) => {
      if (!env) return ['', '', '', '']
      const x = get(env)
      return [String(x.max * u.factor(q)), x.maxCase, String(x.min * u.factor(q)), x.minCase]
    })
    out += [String(offsets[k] * fl), ...cells].join(',') + '\n'
  })
  io.stdout(out)
  return 0
}
