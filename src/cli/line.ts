/**
 * `tractus line <model> --from x,y,z --to x,y,z [--points N] [--case NAME] [--json]`: the stress
 * (and displacement) sampled along a straight line by the elements' own shape functions, with the
 * through-thickness linearisation over it (ASME BPVC Section VIII Division 2, Part 5, Annex 5-A;
 * src/mechanics/linearisation.ts). Points outside the body are gaps: null in every per-point
 * array of the JSON, "outside" in the table.
 */
import type { Command } from './command.ts'
import { HELP_OPTION, JSON_OPTION, UNITS_OPTION, printJson, unitChoice, vecOption } from './command.ts'
import { UsageError } from './args.ts'
import { loadModelAsync } from './loadModel.ts'
import { CASE_OPTION, caseModel } from './caseOption.ts'
import type { UnitView } from './unitView.ts'
import { createUnitView, unitLabels } from './unitView.ts'
import { num, table, vecPlain, vecQty } from './format.ts'
import { modelStressField } from '../model/stressField.ts'
import { buildElementGrid } from '../mechanics/elementGrid.ts'
import type { ComponentAxes } from '../mechanics/componentAxes.ts'
import { checkAxes } from '../mechanics/componentAxes.ts'
import type { LineAnalysis } from '../mechanics/lineAnalysis.ts'
import { analyseLine, lineThroughWall, MAX_LINE_POINTS } from '../mechanics/lineAnalysis.ts'
import type { Linearisation } from '../mechanics/linearisation.ts'
import { LINEARISATION_CAUTION, LINEARISATION_METHOD } from '../mechanics/linearisation.ts'

/** The sample count when --points is not given. */
export const DEFAULT_LINE_POINTS = 51


const perPoint = <T>(n: number, held: Uint8Array, f: (i: number) => T): (T | null)[] => Array.from({ length: n }, (_, i) => (held[i] > 0 ? f(i) : null))

function tensor(v: ArrayLike<number>, o: number, f: number): number[] {
  return [v[o] * f, v[o + 1] * f, v[o + 2] * f, v[o + 3] * f, v[o + 4] * f, v[o + 5] * f]
}

/** The documented "linearised" object, in the view's units. */
export function linearisedJson(l: Linearisation, u: UnitView): Record<string, unknown> {
  const fs = u.factor('stress'), fl = u.factor('length')
  return {
    method: LINEARISATION_METHOD,
    frame: { e1: l.frame.e1, e2: l.frame.e2, e3: l.frame.e3, rule: l.frame.rule },
    thickness: l.thickness * fl,
    start: l.start.map((v) => v * fl), end: l.end.map((v) => v * fl),
    membrane: tensor(l.membrane, 0, fs),
    bending: tensor(l.bending, 0, fs),
    local: { membrane: tensor(l.membraneLocal, 0, fs), bending: tensor(l.bendingLocal, 0, fs) },
    membraneEquivalent: l.membraneEquivalent * fs,
    membranePlusBendingEquivalent: { from: l.membranePlusBendingEquivalent.from * fs, to: l.membranePlusBendingEquivalent.to * fs },
    peakEquivalent: { from: l.peakEquivalent.from * fs, to: l.peakEquivalent.to * fs },
    totalEquivalent: { from: l.totalEquivalent.from * fs, to: l.totalEquivalent.to * fs },
    criterion: l.criterion,
    segments: l.segments,
  }
}

function axesOf(args: Parameters<Command['run']>[0]): ComponentAxes {
  const axis = vecOption(args, 'axis')
  const through = vecOption(args, 'axis-point')
  if (!axis) {
    if (through) throw new UsageError('--axis-point needs --axis (the direction of the cylinder axis)')
    return { kind: 'global' }
  }
  return checkAxes({ kind: 'cylindrical', origin: through ?? [0, 0, 0], axis })
}

export const lineCommand: Command = {
  name: 'line',
  summary: 'stress along a straight line, and its linearisation through a wall (membrane, bending, peak)',
  usage: 'tractus line <model> --from x,y,z --to x,y,z [--points N] [--case NAME] [--criterion vonmises|tresca] [--axis ax,ay,az [--axis-point x,y,z]] [--through-wall] [--json] [--units si|us]',
  positionals: ['<model>'],
  options: [
    { name: 'from', kind: 'vec3', value: 'x,y,z', required: true, help: 'start of the line (model length units); for a linearisation, on one surface of the wall' },
    { name: 'to', kind: 'vec3', value: 'x,y,z', required: true, help: 'end of the line, on the other surface' },
    { name: 'points', kind: 'integer', value: 'N', help: `sample points, both ends included (default ${DEFAULT_LINE_POINTS}, at least 2)` },
    CASE_OPTION,
    { name: 'criterion', kind: 'string', value: 'vonmises|tresca', choices: ['vonmises', 'tresca'], help: 'equivalent stress of the linearised parts (default von Mises)' },
    { name: 'axis', kind: 'vec3', value: 'ax,ay,az', help: 'cylinder axis direction: components in r, θ, z and the linearisation frame hoop/meridional' },
    { name: 'axis-point', kind: 'vec3', value: 'x,y,z', help: 'a point on the cylinder axis (default the origin)' },
    { name: 'through-wall', kind: 'flag', help: 'first stretch or shorten the line to where it enters and leaves the material' },
    JSON_OPTION, UNITS_OPTION, HELP_OPTION,
  ],
  details: [
    'Points are evenly spaced from --from to --to; each is read with the shape functions of the element that holds it (the mean where several do). Points outside the body are null in every per-point array.',
    `Linearisation (${LINEARISATION_METHOD}): membrane = (1/t)∫σ dx, bending at --from = (6/t²)∫σ(t/2 − x) dx (its negative at --to), peak = total − membrane ∓ bending, integrated element segment by element segment (independent of --points). Bending only for the two normal stresses in the plane of the wall, as the annex says. Both ends must lie on the wall's surfaces within 2 % of the line's length (warned otherwise); a line that leaves the body between its ends is not linearised.`,
    'JSON: length, points, distance, stress [xx,yy,zz,xy,yz,xz] (global axes), vonMises, principal [s1,s2,s3], displacement (when the model has it), components (with --axis: stress [rr,θθ,zz,rθ,θz,rz] and displacement [ur,uθ,uz]), linearised {method, frame {e1 along the line, e2, e3, rule}, thickness, start, end, membrane, bending (global axes), local {membrane, bending} (frame 11,22,33,12,23,13), membraneEquivalent, membranePlusBendingEquivalent {from, to}, peakEquivalent {from, to}, totalEquivalent {from, to}, criterion} or null, linearisationRefused, warnings, outside.',
    'A line wholly outside the body says so and exits 0 with empty arrays.',
    LINEARISATION_CAUTION,
  ].join('\n'),
  async run(args, io) {
    let from = vecOption(args, 'from')!
    let to = vecOption(args, 'to')!
    const points = args.options.points === undefined ? DEFAULT_LINE_POINTS : (args.options.points as number)
    if (points < 2) throw new UsageError(`--points must be at least 2 (got ${points})`)
    if (points > MAX_LINE_POINTS) throw new UsageError(`--points must be at most ${MAX_LINE_POINTS} (got ${points})`)
    if (from[0] === to[0] && from[1] === to[1] && from[2] === to[2]) throw new UsageError(`--from and --to are the same point (${from.join(',')}); a line needs two different points`)
    const axes = axesOf(args)
    const criterion = args.options.criterion === 'tresca' ? 'tresca' : 'vonMises'
    const loaded = await loadModelAsync(args.positionals[0])
    const { model } = caseModel(loaded.model, args, 'line')
    const u = createUnitView(model.units, unitChoice(args))
    const grid = buildElementGrid(model.mesh)
    const field = modelStressField(model)
    const notes: string[] = []
    if (args.options['through-wall']) {
      const w = lineThroughWall(model.mesh, grid, from, to)
      if (w) {
        notes.push(`The line was moved to the wall's surfaces: from ${vecQty(w.from, 'length', u)} to ${vecQty(w.to, 'length', u)}.`)
        from = w.from; to = w.to
      }
    }
    const r = analyseLine(model.mesh, grid, field, model.displacement, { from, to, points, criterion, axes })
    const warnings = [...notes, ...r.warnings]
    if (args.options.json) {
      printJson(io, { file: loaded.path, name: model.name, units: unitLabels(u), ...lineJson(r, u), warnings })
      return 0
    }
    io.stdout(lineText(r, u, `Line through "${model.name}" from ${vecQty(from, 'length', u)} to ${vecQty(to, 'length', u)}`, warnings))
    return 0
  },
}

/** The documented JSON fields of a line, in the view's units. */
export function lineJson(r: LineAnalysis, u: UnitView): Record<string, unknown> {
  const s = r.samples, n = s.count
  const fl = u.factor('length'), fs = u.factor('stress')
  const common = {
    from: r.from.map((v) => v * fl), to: r.to.map((v) => v * fl),
    length: s.length * fl,
    outside: r.outside,
  }
  if (r.outside) {
    return {
      ...common, message: 'the line lies wholly outside the body: none of its points is in an element',
      points: [], distance: [], stress: [], vonMises: [], principal: [], ...(s.displacement ? { displacement: [] } : {}),
      linearised: null, linearisationRefused: r.refused,
    }
  }
  const held = s.held
  const out: Record<string, unknown> = {
    ...common,
    points: Array.from({ length: n }, (_, i) => [s.points[3 * i] * fl, s.points[3 * i + 1] * fl, s.points[3 * i + 2] * fl]),
    distance: Array.from(s.distance, (d) => d * fl),
    stress: perPoint(n, held, (i) => tensor(s.stress, 6 * i, fs)),
    vonMises: perPoint(n, held, (i) => s.vonMises[i] * fs),
    principal: perPoint(n, held, (i) => [s.principal[3 * i] * fs, s.principal[3 * i + 1] * fs, s.principal[3 * i + 2] * fs]),
  }
  const d = s.displacement
  if (d) out.displacement = perPoint(n, held, (i) => [d[3 * i] * fl, d[3 * i + 1] * fl, d[3 * i + 2] * fl])
  if (r.axes.kind === 'cylindrical') {
    const dc = r.displacementComponents
    out.components = {
      axes: { kind: 'cylindrical', origin: r.axes.origin.map((v) => v * fl), axis: r.axes.axis },
      stress: perPoint(n, held, (i) => tensor(r.components, 6 * i, fs)),
      ...(dc ? { displacement: perPoint(n, held, (i) => [dc[3 * i] * fl, dc[3 * i + 1] * fl, dc[3 * i + 2] * fl]) } : {}),
    }
  }
  out.linearised = r.linearisation ? linearisedJson(r.linearisation, u) : null
  out.linearisationRefused = r.refused
  return out
}

/** The plain-text answer: the points, then the linearisation. */
export function lineText(r: LineAnalysis, u: UnitView, heading: string, warnings: readonly string[]): string {
  const s = r.samples
  const L = u.label('length'), S = u.label('stress')
  const fl = u.factor('length'), fs = u.factor('stress')
  let out = `${heading}\n  length ${num(s.length * fl)} ${L}, ${s.count} points\n`
  if (r.outside) return out + '  the line lies wholly outside the body: none of its points is in an element\n'
  const rows: string[][] = [[`  distance [${L}]`, 'x', 'y', 'z', `von Mises [${S}]`, `σ1 [${S}]`, `σ2 [${S}]`, `σ3 [${S}]`]]
  for (let i = 0; i < s.count; i++) {
    const p = [s.points[3 * i], s.points[3 * i + 1], s.points[3 * i + 2]].map((v) => num(v * fl))
    rows.push(s.held[i] > 0
      ? ['  ' + num(s.distance[i] * fl), ...p, num(s.vonMises[i] * fs), num(s.principal[3 * i] * fs), num(s.principal[3 * i + 1] * fs), num(s.principal[3 * i + 2] * fs)]
      : ['  ' + num(s.distance[i] * fl), ...p, 'outside', '', '', ''])
  }
  out += table(rows, [true, true, true, true, true, true, true, true])
  const l = r.linearisation
  if (!l) out += `Linearisation: not done: ${r.refused}\n`
  else {
    const eq = l.criterion === 'vonMises' ? 'von Mises' : 'Tresca'
    const loc = (v: ArrayLike<number>): string => `${[0, 1, 2, 3, 4, 5].map((k) => num(v[k] * fs)).join(', ')} ${S}`
    out += `Linearisation (${LINEARISATION_METHOD})\n` + table([
      ['  thickness t', `${num(l.thickness * fl)} ${L} (${l.segments} element segments)`],
      ['  frame e1 (through the wall)', vecPlain(l.frame.e1)],
      ['  frame e2, e3', `${vecPlain(l.frame.e2)}, ${vecPlain(l.frame.e3)} (${frameWords(l.frame.rule)})`],
      ['  membrane [11,22,33,12,23,13]', loc(l.membraneLocal)],
      ['  bending at start [11,...,13]', loc(l.bendingLocal)],
      [`  membrane, ${eq}`, `${num(l.membraneEquivalent * fs)} ${S}`],
      [`  membrane + bending, ${eq}`, `${num(l.membranePlusBendingEquivalent.from * fs)} ${S} at the start, ${num(l.membranePlusBendingEquivalent.to * fs)} ${S} at the end`],
      [`  peak, ${eq}`, `${num(l.peakEquivalent.from * fs)} ${S} at the start, ${num(l.peakEquivalent.to * fs)} ${S} at the end`],
      [`  total, ${eq}`, `${num(l.totalEquivalent.from * fs)} ${S} at the start, ${num(l.totalEquivalent.to * fs)} ${S} at the end`],
    ])
    out += `  ${LINEARISATION_CAUTION}\n`
  }
  for (const w of warnings) out += `Note: ${w}\n`
  return out
}

/** How the frame's in-plane axes were chosen, in words. */
export function frameWords(rule: Linearisation['frame']['rule']): string {
  switch (rule) {
    case 'axis': return 'e2 hoop, e3 meridional about the given axis'
    case 'bending': return 'principal directions of the in-plane bending'
    case 'membrane': return 'principal directions of the in-plane membrane stress'
    default: return 'no in-plane stress to orient by: global axis least aligned with the line'
  }
}

