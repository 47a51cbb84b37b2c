/**
 * `tractus cut <model> --point x,y,z --normal nx,ny,nz [--about x,y,z]`: the force and moment
 * the material on the +normal side exerts across a plane, in global and section axes, with the
 * free-body check of the piece on the -normal side.
 */
import type { Command } from './command.ts'
import { BODY_FORCE_OPTION, HELP_OPTION, JSON_OPTION, UNITS_OPTION, bodyForceOf, printJson, unitChoice, vecOption } from './command.ts'
import { loadModelAsync } from './loadModel.ts'
import { CASE_ALL_OPTION, COMBINATIONS_ONLY_OPTION, allCases, caseModel } from './caseOption.ts'
import { cutAllCases } from './caseEnvelope.ts'
import { makePlane } from '../mechanics/plane.ts'
import type { UnitView } from './unitView.ts'
import { createUnitView, unitLabels } from './unitView.ts'
import { block, num, qty, vecJson, vecPlain, vecQty } from './format.ts'
import type { SectionResult } from '../mechanics/types.ts'
import { cutSection } from '../mechanics/sectionCut.ts'
import { modelStressField } from '../model/stressField.ts'
import { UsageError } from './args.ts'
import { InputError } from '../model/errors.ts'
import type { Mesh, Vec3 } from '../model/model.ts'
import type { SectionLimit } from '../mechanics/sectionRegions.ts'
import { partNumbers } from '../mechanics/partBalance.ts'
import { describeAxes, projectReference } from '../mechanics/sectionAxes.ts'
import { denoise, noiseFloor } from '../model/roundingNoise.ts'
import type { SectionAxesChoice } from '../mechanics/sectionAxes.ts'
import type { OptionSpec, ParsedArgs } from './args.ts'

// --- assemblies: --parts and --within, regions in the output ---
export const PARTS_OPTION: OptionSpec = { name: 'parts', kind: 'string', value: 'a,b,...', help: 'limit the cut to these part numbers (the section on a face between parts belongs to the part on the -m side)' }
export const WITHIN_OPTION: OptionSpec = { name: 'within', kind: 'string', value: 'x,y,z,r', help: 'limit the cut to the polygons whose centroid lies within r of the point x,y,z projected onto the plane (model length units)' }

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
    const numbers = partNumbers(mesh)
    const unknown = parts.filter((p) => !numbers.includes(p))
    if (unknown.length > 0) {
      throw new InputError('bad-argument', `--parts: no element has part ${unknown.join(', ')}; the model's parts are ${numbers.join(', ')}`)
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

/** `--reference rx,ry,rz`, shared by `cut` and `sweep`. */
export const REFERENCE_OPTION: OptionSpec = {
  name: 'reference', kind: 'vec3', value: 'rx,ry,rz',
  help: 'resolve the resultant in reference axes: e1 = the projection of this direction onto the plane (not parallel to the normal); principal axes by default',
}

export const SECTION_AXES_DETAILS = 'Section axes: e3 = m; by default e1, e2 are the principal axes of the section area (I1 ≥ I2), and where I1 and I2 are within 1 % e1 follows the reference direction (the first of x, y, z whose projection onto the plane is longest); with --reference, e1 is the projection of the given direction onto the plane. axial = F·e3, shear = [F·e1, F·e2], torque = M·e3, bending = [M·e1, M·e2]; I1, I2, I12 are about e1 and e2. JSON "axes" says which: {kind, reference, followsReference, e1, e2, e3}.'

/** The axes choice of `--reference` (reference axes), else principal axes; a reference parallel to `normal` is an input error. */
export function axesOption(args: ParsedArgs, normal: Vec3): SectionAxesChoice {
  const r = args.options.reference
  if (!Array.isArray(r)) return { kind: 'principal' }
  const reference: Vec3 = [r[0], r[1], r[2]]
  const l = Math.hypot(...normal)
  projectReference([normal[0] / l, normal[1] / l, normal[2] / l], reference, 'reference')
  return { kind: 'reference', reference }
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
    axes: {
      kind: r.axes.kind, reference: vecJson(r.axes.reference, null, u), followsReference: r.axes.followsReference,
      e1: vecJson(r.axes.e1, null, u), e2: vecJson(r.axes.e2, null, u), e3: vecJson(r.axes.e3, null, u),
    },
    secondMoments: { I1: r.secondMoments.I1 * fi, I2: r.secondMoments.I2 * fi, I12: r.secondMoments.I12 * fi, J: r.secondMoments.J * fi },
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
  usage: 'tractus cut <model> --point x,y,z --normal nx,ny,nz [--about x,y,z] [--reference rx,ry,rz] [--parts a,b] [--within x,y,z,r] [--case NAME|all [--combinations-only]] [--json] [--units si|us] [--body-force bx,by,bz]',
  positionals: ['<model>'],
  options: [
    { name: 'point', kind: 'vec3', value: 'x,y,z', required: true, help: 'a point on the plane (model length units)' },
    { name: 'normal', kind: 'vec3', value: 'nx,ny,nz', required: true, help: 'plane normal m (any length, not zero)' },
    { name: 'about', kind: 'vec3', value: 'x,y,z', help: 'moment reference point (model length units); the section centroid by default' },
    PARTS_OPTION, WITHIN_OPTION, REFERENCE_OPTION, CASE_ALL_OPTION, COMBINATIONS_ONLY_OPTION,
    JSON_OPTION, UNITS_OPTION, BODY_FORCE_OPTION, HELP_OPTION,
  ],
  details: [
    'The resultant is what the material on the +m side exerts on the material on the -m side: F = ∫σm dA, M = ∫(x - about) × σm dA.',
    SECTION_AXES_DETAILS,
    'Regions: the section split into connected regions (neighbouring cut elements of one part), each with its area, centroid, force and moment about its own centroid, largest force first. With --parts and/or --within the top-level figures are those of the selected polygons only. With --parts alone the free body is that of the selected parts\' piece on the -m side, its boundary including its faces against other parts; with --within it is not defined.',
    'Load cases: --case NAME cuts one case or combination (the first case by default). --case all cuts every case and combination and adds their envelope: for the section and each region (largest area first), each component in section axes with its largest and smallest value and the case that governs each; --combinations-only envelopes the combinations alone. --json then prints {"cases": [{"case": NAME, ...the fields of one cut...}], "envelope": {"axial": {"max", "maxCase", "min", "minCase"}, "torque": {...}, "shear": [{...}, {...}], "bending": [{...}, {...}], "regions": [{"area", "centroid", "parts", "axial", ...}]}}. With --body-force every case takes that ρb.',
    'Free body: the residual of the piece on the -m side (its boundary tractions, its body force and the section resultant); "relative" is its force over that piece\'s gross load, "momentRelative" its moment about the section centroid over the gross load times the diagonal of the piece\'s bounding box.',
  ].join('\n'),
  async run(args, io) {
    const plane = makePlane(vecOption(args, 'point')!, vecOption(args, 'normal')!)
    const about = vecOption(args, 'about')
    const axes = axesOption(args, plane.normal)
    const loaded = await loadModelAsync(args.positionals[0])
    if (allCases(args)) return cutAllCases(loaded, args, io, plane, about, axes)
    const { model } = caseModel(loaded.model, args, 'cut')
    const u = createUnitView(model.units, unitChoice(args))
    const bodyForce = bodyForceOf(args, model)
    const limit = sectionLimitOf(args, model.mesh)
    const { result: r } = cutSection(model.mesh, modelStressField(model), bodyForce, plane, { about, polygons: false, regions: true, limit, axes })
    if (args.options.json) {
      printJson(io, {
        file: loaded.path, name: model.name, units: unitLabels(u), bodyForce: vecJson(bodyForce, 'forcePerVolume', u), ...sectionJson(r, u),
        limited: r.limited ?? false, freeBodyDefined: r.freeBodyDefined ?? true, regions: regionsJson(r, u),
      })
      return 0
    }
    io.stdout(sectionText(r, u, `Section of "${model.name}" through ${vecQty(plane.point, 'length', u)}, normal ${vecPlain(plane.normal)}`, meshSize(model.mesh.coords)))
    return 0
  },
}

/**
 * The section as a table. Figures of one family (forces, moments, second moments; points against
 * `modelSize`, length units) are read with the rounding-noise rule of src/model/roundingNoise.ts;
 * the JSON answer carries every digit.
 */
export function sectionText(r: SectionResult, u: UnitView, heading: string, modelSize = 0): string {
  if (r.empty && r.limited) return `${heading}\n  the limit (--parts / --within) selects no part of the section: nothing to report\n`
  if (r.empty) return `${heading}\n  the plane does not cut the body\n`
  const fF = noiseFloor([...r.force, ...r.freeBody.force])
  const fM = noiseFloor([...r.moment, ...r.freeBody.moment])
  const fI = noiseFloor([r.secondMoments.I1, r.secondMoments.I2, r.secondMoments.I12])
  const fL = noiseFloor([], modelSize)
  const n = (v: number, q: 'force' | 'moment' | 'secondMoment', floor: number): string => num(denoise(v, floor) * u.factor(q))
  return block(heading, [
    ...(r.limited ? [['selection', 'the figures below are those of the selected polygons only'] as [string, string]] : []),
    ['area', qty(r.area, 'area', u)],
    ['centroid', vecQty(r.centroid, 'length', u, fL)],
    ['moments about', vecQty(r.about, 'length', u, fL)],
    ['cut elements', String(r.cutElements)],
    ['force F', vecQty(r.force, 'force', u, fF)],
    ['moment M', vecQty(r.moment, 'moment', u, fM)],
    ['section axes', describeAxes(r.axes)],
    ['axis e1', vecPlain(r.axes.e1)],
    ['axis e2', vecPlain(r.axes.e2)],
    ['axis e3 = m', vecPlain(r.axes.e3)],
    ['I1, I2, I12, J', [r.secondMoments.I1, r.secondMoments.I2, r.secondMoments.I12, r.secondMoments.J].map((v) => n(v, 'secondMoment', fI)).join(', ') + ` ${u.label('secondMoment')}`],
    ['axial N', qty(r.axial, 'force', u, fF)],
    ['shear V1, V2', `${n(r.shear[0], 'force', fF)}, ${n(r.shear[1], 'force', fF)} ${u.label('force')}`],
    ['torque T', qty(r.torque, 'moment', u, fM)],
    ['bending M1, M2', `${n(r.bending[0], 'moment', fM)}, ${n(r.bending[1], 'moment', fM)} ${u.label('moment')}`],
    ...(r.freeBodyDefined === false ? [['free body', 'not defined for a disc (a disc of the plane does not bound a piece of the body); limit to whole parts alone for it'] as [string, string]] : [
      ['free body force', vecQty(r.freeBody.force, 'force', u, fF)],
      ['free body moment', vecQty(r.freeBody.moment, 'moment', u, fM)],
      ['free body relative', `${num(r.freeBody.relative)} of the gross load ${qty(r.freeBody.gross, 'force', u)}`],
      ['free body moment relative', `${num(r.freeBody.momentRelative)} of the gross load × ${qty(r.freeBody.size, 'length', u)}`],
    ] as [string, string][]),
    ...(r.regions ?? []).map((g, i) => [`region ${i + 1} (part ${g.parts.join(', ')})`,
      `area ${qty(g.area, 'area', u)}, centroid ${vecQty(g.centroid, 'length', u, fL)}, force ${vecQty(g.force, 'force', u, fF)}, axial ${qty(g.axial, 'force', u, fF)}, moment about its centroid ${vecQty(g.moment, 'moment', u, fM)}`] as [string, string]),
    ...(r.unmappedPoints > 0 ? [['unmapped points', `${r.unmappedPoints} (element map not inverted; stress taken at a clamped estimate)`] as [string, string]] : []),
  ])
}

/** The diagonal of the nodes' bounding box (length units): what coordinates are judged against. */
export function meshSize(coords: Float64Array): number {
  const lo = [Infinity, Infinity, Infinity], hi = [-Infinity, -Infinity, -Infinity]
  for (let i = 0; i < coords.length; i += 3) {
    for (let k = 0; k < 3; k++) { const v = coords[i + k]; if (v < lo[k]) lo[k] = v; if (v > hi[k]) hi[k] = v }
  }
  return lo[0] <= hi[0] ? Math.hypot(hi[0] - lo[0], hi[1] - lo[1], hi[2] - lo[2]) : 0
}
