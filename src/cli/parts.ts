/**
 * `tractus parts <model>`: the parts of an assembly (number, name, elements, volume, each part's
 * own free-body balance including its faces against other parts) and the interfaces between
 * parts (area, centroid, the force and moment one part exerts on the other, and the mismatch of
 * the two sides). See src/mechanics/partBalance.ts.
 */
import type { Command } from './command.ts'
import { BODY_FORCE_OPTION, HELP_OPTION, JSON_OPTION, UNITS_OPTION, bodyForceOf, printJson, unitChoice } from './command.ts'
import { CASE_OPTION, caseModel } from './caseOption.ts'
import { loadModelAsync } from './loadModel.ts'
import { createUnitView, unitLabels } from './unitView.ts'
import { num, qty, table, vecJson, vecQty } from './format.ts'
import { assemblyBalance } from '../mechanics/partBalance.ts'
import { modelStressField } from '../model/stressField.ts'
import type { Vec3 } from '../model/model.ts'

export const partsCommand: Command = {
  name: 'parts',
  summary: 'parts of an assembly, their balance, and the forces between parts',
  usage: 'tractus parts <model> [--case NAME] [--json] [--units si|us] [--body-force bx,by,bz]',
  positionals: ['<model>'],
  options: [CASE_OPTION, JSON_OPTION, UNITS_OPTION, BODY_FORCE_OPTION, HELP_OPTION],
  details: [
    'Each part\'s balance is the residual of ∮ t dA + ∫ ρb dV over the part, its boundary including the faces it shares with other parts; moment about the part\'s volume centroid ("about"); "relative" is |force| over the gross load.',
    'Interfaces: faces shared by two parts (shared nodes) or whose corners coincide within a tolerance. For parts [a, b] (a < b), "force" is what a exerts on b (traction on b\'s side, b\'s outward normal, b\'s stress), "moment" about the interface centroid; "mismatch" is |F_ab + F_ba| over the interface\'s gross load ∫|t| dA (zero for nodal stress with shared nodes).',
    'A part\'s own body force comes from model.json "parts"; --body-force sets the one of every part.',
  ].join('\n'),
  async run(args, io) {
    const loaded = await loadModelAsync(args.positionals[0])
    const { model } = caseModel(loaded.model, args, 'parts')
    const u = createUnitView(model.units, unitChoice(args))
    const common = bodyForceOf(args, model)
    const info = new Map((model.parts ?? []).map((p) => [p.part, p]))
    const bodyForce = (p: number): Vec3 => (args.options['body-force'] === undefined ? info.get(p)?.bodyForce ?? common : common)
    const names = new Map([...info.values()].map((p) => [p.part, p.name]))
    const asm = assemblyBalance(model.mesh, modelStressField(model), bodyForce, names)
    const ff = u.factor('force')
    if (args.options.json) {
      printJson(io, {
        file: loaded.path, name: model.name, units: unitLabels(u),
        parts: asm.parts.map((p) => ({
          part: p.part, name: p.name, elements: p.elements, volume: p.volume * u.factor('volume'),
          balance: { force: vecJson(p.balance.force, 'force', u), moment: vecJson(p.balance.moment, 'moment', u), relative: p.balance.relative, about: vecJson(p.balance.about, 'length', u), gross: p.balance.gross * ff },
        })),
        interfaces: asm.interfaces.map((i) => ({
          parts: i.parts, area: i.area * u.factor('area'), centroid: vecJson(i.centroid, 'length', u),
          force: vecJson(i.force, 'force', u), moment: vecJson(i.moment, 'moment', u), mismatch: i.mismatch, faces: i.faces,
        })),
      })
      return 0
    }
    const lines = [`Parts of "${model.name}"`]
    lines.push(table([['part', 'name', 'elements', 'volume', 'residual force', 'relative'], ...asm.parts.map((p) => [
      String(p.part), p.name || '-', String(p.elements), qty(p.volume, 'volume', u), vecQty(p.balance.force, 'force', u), num(p.balance.relative),
    ])]))
    if (asm.interfaces.length === 0) lines.push('No interfaces: no two parts share or touch a face.')
    else {
      lines.push('Interfaces (force: what the first part exerts on the second, moment about the interface centroid)')
      lines.push(table([['parts', 'area', 'centroid', 'force', 'moment', 'mismatch'], ...asm.interfaces.map((i) => [
        `${i.parts[0]} → ${i.parts[1]}`, qty(i.area, 'area', u), vecQty(i.centroid, 'length', u), vecQty(i.force, 'force', u), vecQty(i.moment, 'moment', u), num(i.mismatch),
      ])]))
    }
    io.stdout(lines.join('\n') + '\n')
    return 0
  },
}
