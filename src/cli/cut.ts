/**
 * `tractus cut <model> --point x,y,z --normal nx,ny,nz [--about x,y,z]`: the force and moment
 * the material on the +normal side exerts across a plane, in global and section axes, with the
 * free-body check of the piece on the -normal side.
 */
import type { Command } from './command.ts'
import { BODY_FORCE_OPTION, HELP_OPTION, JSON_OPTION, UNITS_OPTION, bodyForceOf, printJson, unitChoice, vecOption } from './command.ts'
import { loadModel } from './loadModel.ts'
import { makePlane } from '../mechanics/plane.ts'
import type { UnitView } from './unitView.ts'
import { createUnitView, unitLabels } from './unitView.ts'
import { block, num, qty, vecJson, vecPlain, vecQty } from './format.ts'
import type { SectionResult } from '../mechanics/types.ts'
import { cutSection } from '../mechanics/sectionCut.ts'
import { nodalStressField } from '../model/stressField.ts'
import type { ParsedArgs } from './args.ts'
import { UsageError } from './args.ts'
import { InputError } from '../model/errors.ts'
import type { Mesh } from '../model/model.ts'
import type { SectionLimit } from '../mechanics/sectionRegions.ts'
import type { OptionSpec } from './args.ts'

// --- assemblies: --parts and --within, regions in the output ---
export const PARTS_OPTION: OptionSpec = { name: 'parts', kind: 'string', value: 'a,b,...', help: 'limit the cut to these part numbers (the section on a face between parts belongs to the part on the -m side)' }
export const WITHIN_OPTION: OptionSpec = { name: 'within', kind: 'string', value: 'x,y,z,r', help: 'limit the cut to the polygons whose centroid lies within r of the point x,y,z projected onto the plane (model length units)' }

/** The part numbers present in the mesh. */
export function meshParts(mesh: Mesh): Set<number> {
  const parts = new Set<number>()
  for (const b of mesh.blocks) {
    if (!b.part) { parts.add(0); continue }
    for (let e = 0; e < b.part.length; e++) parts.add(b.part[e])
  }
  return parts
}

/** --parts and --within as a limit (null when neither is given). Malformed: UsageError; unknown part: InputError. */
export function sectionLimitOf(args: ParsedArgs, mesh: Mesh): SectionLimit | null {
  const rawParts = args.options.parts, rawWithin = args.options.within
  if (rawParts === undefined && rawWithin === undefined) return null
  let parts: number[] | undefined
  if (typeof rawParts === 'string') {
    parts = rawParts.split(',').map((t) => {
      const v = t.trim() === '' ? NaN : Number(t)
      if (!Number.isInteger(v) || v < 0) throw new UsageError(`--parts needs whole part numbers separated by commas, like 1,3 (got "${rawParts}")`)
      return v
    })
    const known = meshParts(mesh)
    const unknown = parts.filter((p) => !known.has(p))
    if (unknown.length > 0) {
      throw new InputError('bad-argument', `--parts: no element has part ${unknown.join(', ')}; the model's parts are ${[...known].sort((a, b) => a - b).join(', ')}`)
    }
  }
  let within: SectionLimit['within']
  if (typeof rawWithin === 'string') {
    const v = rawWithin.split(',').map((t) => (t.trim() === '' ? NaN : Number(t)))
    if (v.length !== 4 || !v.every(Number.isFinite)) throw new UsageError(`--within needs four numbers x,y,z,r separated by commas, like 0,0,10,5 (got "${rawWithin}")`)
    if (!(v[3] > 0)) throw new UsageError(`--within: the radius must be greater than 0 (got ${v[3]})`)
    within = { center: [v[0], v[1], v[2]], radius: v[3] }
  }
  return { ...(parts ? { parts } : {}), ...(within ? { within } : {}) }
}

/** The documented JSON fields of the regions (moments about each region's centroid). */
export function regionsJson(r: SectionResult, u: UnitView): Record<string, unknown>[] {
  const ff = u.factor('force'), fm = u.factor('moment')
  return (r.regions ?? []).map((g) => ({
    area: g.area * u.factor('area'),
    centroid: vecJson(g.centroid, 'length', u),
    force: vecJson(g.force, 'force', u),
    moment: vecJson(g.moment, 'moment', u),
    axial: g.axial * ff,
    shear: [g.shear[0] * ff, g.shear[1] * ff],
    torque: g.torque * fm,
    bending: [g.bending[0] * fm, g.bending[1] * fm],
    parts: [...g.parts],
    cutElements: g.cutElements,
  }))
}

/** The documented JSON fields of one section (shared with `sweep`), in the view's units. */
export function sectionJson(r: SectionResult, u: UnitView): Record<string, unknown> {
  const ff = u.factor('force'), fm = u.factor('moment'), fi = u.factor('secondMoment')
  return {
    empty: r.empty,
    plane: { point: vecJson(r.plane.point, 'length', u), normal: vecJson(r.plane.normal, null, u) },
    area: r.area * u.factor('area'),
    centroid: vecJson(r.centroid, 'length', u),
    about: vecJson(r.about, 'length', u),
    force: vecJson(r.force, 'force', u),
    moment: vecJson(r.moment, 'moment', u),
    axes: { e1: vecJson(r.axes.e1, null, u), e2: vecJson(r.axes.e2, null, u), e3: vecJson(r.axes.e3, null, u) },
    secondMoments: { I1: r.secondMoments.I1 * fi, I2: r.secondMoments.I2 * fi, J: r.secondMoments.J * fi },
    axial: r.axial * ff,
    shear: [r.shear[0] * ff, r.shear[1] * ff],
    torque: r.torque * fm,
    bending: [r.bending[0] * fm, r.bending[1] * fm],
    freeBody: {
      force: vecJson(r.freeBody.force, 'force', u),
      moment: vecJson(r.freeBody.moment, 'moment', u),
      relative: r.freeBody.relative,
      gross: r.freeBody.gross * ff,
      momentRelative: r.freeBody.momentRelative,
    },
    cutElements: r.cutElements,
    unmappedPoints: r.unmappedPoints,
  }
}

export const cutCommand: Command = {
  name: 'cut',
  summary: 'force and moment across a section plane, in global and section axes',
  usage: 'tractus cut <model> --point x,y,z --normal nx,ny,nz [--about x,y,z] [--parts a,b] [--within x,y,z,r] [--json] [--units si|us] [--body-force bx,by,bz]',
  positionals: ['<model>'],
  options: [
    { name: 'point', kind: 'vec3', value: 'x,y,z', required: true, help: 'a point on the plane (model length units)' },
    { name: 'normal', kind: 'vec3', value: 'nx,ny,nz', required: true, help: 'plane normal m (any length, not zero)' },
    { name: 'about', kind: 'vec3', value: 'x,y,z', help: 'moment reference point (model length units); the section centroid by default' },
    PARTS_OPTION, WITHIN_OPTION,
    JSON_OPTION, UNITS_OPTION, BODY_FORCE_OPTION, HELP_OPTION,
  ],
  details: [
    'The resultant is what the material on the +m side exerts on the material on the -m side: F = ∫σm dA, M = ∫(x - about) × σm dA.',
    'Section axes: e3 = m, e1 and e2 the principal axes of the section area (I1 ≥ I2). axial = F·e3, shear = [F·e1, F·e2], torque = M·e3, bending = [M·e1, M·e2].',
    'Regions: the section split into connected regions (neighbouring cut elements of one part), each with its area, centroid, force and moment about its own centroid, largest force first. With --parts and/or --within the top-level figures are those of the selected polygons only, and the free-body check is not defined.',
    'Free body: the residual of the piece on the -m side (its boundary tractions, its body force and the section resultant); "relative" is its force over that piece\'s gross load, "momentRelative" its moment about the section centroid over the gross load times the diagonal of the piece\'s bounding box.',
  ].join('\n'),
  run(args, io) {
    const plane = makePlane(vecOption(args, 'point')!, vecOption(args, 'normal')!)
    const about = vecOption(args, 'about')
    const loaded = loadModel(args.positionals[0])
    const { model } = loaded
    const u = createUnitView(model.units, unitChoice(args))
    const bodyForce = bodyForceOf(args, model)
    const limit = sectionLimitOf(args, model.mesh)
    const { result: r } = cutSection(model.mesh, nodalStressField(model.mesh, model.stress), bodyForce, plane, { about, polygons: false, regions: true, limit })
    if (args.options.json) {
      printJson(io, {
        file: loaded.path, name: model.name, units: unitLabels(u), bodyForce: vecJson(bodyForce, 'forcePerVolume', u), ...sectionJson(r, u),
        limited: r.limited ?? false, freeBodyDefined: r.freeBodyDefined ?? true, regions: regionsJson(r, u),
      })
      return 0
    }
    io.stdout(sectionText(r, u, `Section of "${model.name}" through ${vecQty(plane.point, 'length', u)}, normal ${vecPlain(plane.normal)}`))
    return 0
  },
}

export function sectionText(r: SectionResult, u: UnitView, heading: string): string {
  if (r.empty && r.limited) return `${heading}\n  the limit (--parts / --within) selects no part of the section: nothing to report\n`
  if (r.empty) return `${heading}\n  the plane does not cut the body\n`
  return block(heading, [
    ...(r.limited ? [['selection', 'the figures below are those of the selected polygons only'] as [string, string]] : []),
    ['area', qty(r.area, 'area', u)],
    ['centroid', vecQty(r.centroid, 'length', u)],
    ['moments about', vecQty(r.about, 'length', u)],
    ['cut elements', String(r.cutElements)],
    ['force F', vecQty(r.force, 'force', u)],
    ['moment M', vecQty(r.moment, 'moment', u)],
    ['axis e1', vecPlain(r.axes.e1)],
    ['axis e2', vecPlain(r.axes.e2)],
    ['axis e3 = m', vecPlain(r.axes.e3)],
    ['I1, I2, J', `${num(r.secondMoments.I1 * u.factor('secondMoment'))}, ${num(r.secondMoments.I2 * u.factor('secondMoment'))}, ${num(r.secondMoments.J * u.factor('secondMoment'))} ${u.label('secondMoment')}`],
    ['axial N', qty(r.axial, 'force', u)],
    ['shear V1, V2', `${num(r.shear[0] * u.factor('force'))}, ${num(r.shear[1] * u.factor('force'))} ${u.label('force')}`],
    ['torque T', qty(r.torque, 'moment', u)],
    ['bending M1, M2', `${num(r.bending[0] * u.factor('moment'))}, ${num(r.bending[1] * u.factor('moment'))} ${u.label('moment')}`],
    ...(r.freeBodyDefined === false ? [['free body', 'not defined for a bounded section (a part or disc selection does not bound a piece of the body)'] as [string, string]] : [
      ['free body force', vecQty(r.freeBody.force, 'force', u)],
      ['free body moment', vecQty(r.freeBody.moment, 'moment', u)],
      ['free body relative', `${num(r.freeBody.relative)} of the gross load ${qty(r.freeBody.gross, 'force', u)}`],
      ['free body moment relative', `${num(r.freeBody.momentRelative)} of the gross load × ${qty(r.freeBody.size, 'length', u)}`],
    ] as [string, string][]),
    ...(r.regions ?? []).map((g, i) => [`region ${i + 1} (part ${g.parts.join(', ')})`,
      `area ${qty(g.area, 'area', u)}, centroid ${vecQty(g.centroid, 'length', u)}, force ${vecQty(g.force, 'force', u)}, axial ${qty(g.axial, 'force', u)}, moment about its centroid ${vecQty(g.moment, 'moment', u)}`] as [string, string]),
    ...(r.unmappedPoints > 0 ? [['unmapped points', `${r.unmappedPoints} (element map not inverted; stress taken at a clamped estimate)`] as [string, string]] : []),
  ])
}
