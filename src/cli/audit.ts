/**
 * `tractus audit <model>`: is the result in equilibrium, and where does the load enter?
 * Whole-body balance, percentiles of the element balance indicator (with the worst elements by
 * id), load-entry patches and what is left on the nominally free surface.
 */
import type { Command } from './command.ts'
import { BODY_FORCE_OPTION, HELP_OPTION, JSON_OPTION, UNITS_OPTION, bodyForceOf, printJson, unitChoice } from './command.ts'
import { UsageError } from './args.ts'
import { CASE_OPTION, caseModel } from './caseOption.ts'
import { loadModelAsync } from './loadModel.ts'
import { createUnitView, unitLabels } from './unitView.ts'
import { block, num, qty, table, vecJson, vecQty } from './format.ts'
import { elementIdOf } from '../model/elementId.ts'
import { analysisInputOf, runAnalysis } from '../mechanics/analysisPipeline.ts'
import { LOAD_PATCH_DEFAULTS } from '../mechanics/loadPatches.ts'
import { noiseFloor } from '../model/roundingNoise.ts'
import { meshSize } from './cut.ts'

export const auditCommand: Command = {
  name: 'audit',
  summary: 'whole-body and element balance, load-entry patches and the free-surface residue',
  usage: 'tractus audit <model> [--case NAME] [--json] [--units si|us] [--body-force bx,by,bz] [--threshold f] [--lower-threshold f] [--feature-angle deg] [--worst n]',
  positionals: ['<model>'],
  options: [
    CASE_OPTION, JSON_OPTION, UNITS_OPTION, BODY_FORCE_OPTION,
    { name: 'threshold', kind: 'number', value: 'f', help: `a boundary face starts a load-entry patch when its mean |t| exceeds f times the reference stress (the 95th percentile of nodal von Mises stress); default ${LOAD_PATCH_DEFAULTS.threshold}` },
    { name: 'lower-threshold', kind: 'number', value: 'f', help: `a face may join a patch it touches when its mean |t| exceeds f times the reference stress (at most --threshold); default ${LOAD_PATCH_DEFAULTS.lowerThreshold}` },
    { name: 'feature-angle', kind: 'number', value: 'deg', help: `patches split where the normals of neighbouring faces differ by more than this angle, in degrees (0 to 180); default ${LOAD_PATCH_DEFAULTS.featureAngle}` },
    { name: 'worst', kind: 'integer', value: 'n', help: 'how many of the least balanced elements to list (default 5)' },
    HELP_OPTION,
  ],
  details: [
    'Balance: the surface integral of t = σn plus ∫ρb dV over the whole body; "relative" divides the residual force by the gross load (half the sum of |face force|).',
    'Verdict: "mesh" where the residual is what a discretisation leaves, "model" where the stress does not belong to the loads or the mesh, "inconclusive" between; the rule and its thresholds are in the README (Equilibrium).',
    'Element indicator: |∮σn dA + ∫ρb dV| of each element over its gross face load; p50, p95 and max over all elements.',
    'Patches: boundary faces whose mean traction magnitude exceeds the threshold, grown into edge-connected neighbours down to the lower threshold, split where the surface folds by more than the feature angle and where one part meets another; the rest is the nominally free surface, whose mean traction should be small next to the reference stress.',
  ].join('\n'),
  async run(args, io) {
    const loaded = await loadModelAsync(args.positionals[0])
    const { model } = caseModel(loaded.model, args, 'audit')
    const { mesh } = model
    const u = createUnitView(model.units, unitChoice(args))
    const bodyForce = bodyForceOf(args, model)
    const worstCount = args.options.worst === undefined ? 5 : Math.max(0, args.options.worst as number)
    const threshold = (args.options.threshold as number | undefined) ?? LOAD_PATCH_DEFAULTS.threshold
    if (!(threshold >= 0)) throw new UsageError('--threshold must be a fraction ≥ 0, like 0.05')
    const lowerThreshold = (args.options['lower-threshold'] as number | undefined) ?? Math.min(LOAD_PATCH_DEFAULTS.lowerThreshold, threshold)
    if (!(lowerThreshold >= 0)) throw new UsageError('--lower-threshold must be a fraction ≥ 0, like 0.01')
    if (lowerThreshold > threshold) throw new UsageError(`--lower-threshold (${lowerThreshold}) must not exceed --threshold (${threshold}): faces above the threshold start patches, faces above the lower threshold only join them`)
    const featureAngle = (args.options['feature-angle'] as number | undefined) ?? LOAD_PATCH_DEFAULTS.featureAngle
    if (!(featureAngle >= 0 && featureAngle <= 180)) throw new UsageError('--feature-angle must be an angle from 0 to 180 degrees, like 40')

    // Single-precision storage of the element balance: the indicator is read and ranked, and
    // memory stays near the model's size.
    const { faces, bodyBalance: body, elementBalance: elements, loadPatches: lp, verdict } = runAnalysis(
      analysisInputOf(model, bodyForce), { balancePrecision: 'single', loadPatches: { threshold, lowerThreshold, featureAngle }, leastBalanced: worstCount })
    const { p50, p95, max: pmax } = verdict.indicator
    const worst = verdict.leastBalanced.map((g) => ({ id: elementIdOf(mesh, g), indicator: elements.indicator[g] }))

    const fs = u.factor('stress')
    const fa = u.factor('area')
    const patches = lp.patches.map((p) => ({
      id: p.id,
      faces: p.faceCount,
      part: p.part,
      area: p.area * fa,
      centroid: vecJson(p.centroid, 'length', u),
      force: vecJson(p.force, 'force', u),
      moment: vecJson(p.moment, 'moment', u),
      peak: p.peak * fs,
      mean: p.mean * fs,
    }))
    if (args.options.json) {
      printJson(io, {
        file: loaded.path,
        name: model.name,
        units: unitLabels(u),
        bodyForce: vecJson(bodyForce, 'forcePerVolume', u),
        boundaryFaces: faces.count,
        balance: {
          force: vecJson(body.force, 'force', u),
          moment: vecJson(body.moment, 'moment', u),
          relative: body.relative,
          gross: body.gross * u.factor('force'),
          about: vecJson(body.about, 'length', u),
          surfaceForce: vecJson(body.surfaceForce, 'force', u),
          bodyForceTotal: vecJson(body.bodyForceTotal, 'force', u),
          volume: body.volume * u.factor('volume'),
          freeSurfaceForce: vecJson(verdict.freeSurfaceForce, 'force', u),
          verdict: verdict.verdict,
        },
        elements: { count: mesh.elementCount, p50, p95, max: pmax, worst },
        threshold: lp.threshold * fs,
        thresholdFraction: threshold,
        lowerThreshold: lp.lowerThreshold * fs,
        lowerThresholdFraction: lowerThreshold,
        featureAngle,
        referenceStress: lp.referenceStress * fs,
        patches,
        freeSurface: {
          area: lp.freeSurface.area * fa,
          mean: lp.freeSurface.mean * fs,
          relative: lp.freeSurface.relative,
          peak: lp.freeSurface.peak * fs,
        },
      })
      return 0
    }
    // The tables read rounding noise as 0 (src/model/roundingNoise.ts); the JSON carries every digit.
    const size = meshSize(mesh.coords)
    const fF = noiseFloor([...body.force, ...body.surfaceForce, ...body.bodyForceTotal, ...verdict.freeSurfaceForce], body.gross)
    const fM = noiseFloor(body.moment)
    const fL = noiseFloor([], size)
    let out = block(`Balance of "${model.name}" (${mesh.elementCount} elements, ${faces.count} boundary faces)`, [
      ['residual force', vecQty(body.force, 'force', u, fF)],
      ['residual moment', `${vecQty(body.moment, 'moment', u, fM)} about ${vecQty(body.about, 'length', u, fL)} (the volume centroid)`],
      ['relative', `${num(body.relative)} of the gross load ${qty(body.gross, 'force', u)}`],
      ['surface force', vecQty(body.surfaceForce, 'force', u, fF)],
      ['body force ∫ρb dV', `${vecQty(body.bodyForceTotal, 'force', u, fF)} over ${qty(body.volume, 'volume', u)}`],
      ['of it, free surface', vecQty(verdict.freeSurfaceForce, 'force', u, fF)],
      ['verdict', `${verdict.verdict.kind}: ${verdict.verdict.reason}`],
    ])
    out += '\n' + block('Element balance indicator |residual| / gross (dimensionless)', [
      ['p50', num(p50)], ['p95', num(p95)], ['max', num(pmax)],
      ...worst.map((w, i): [string, string] => [i === 0 ? 'least balanced' : '', `element ${w.id}: ${num(w.indicator)}`]),
    ])
    out += `\nLoad-entry patches (start above mean |t| ${qty(lp.threshold, 'stress', u)} = ${num(threshold)} × reference stress ${qty(lp.referenceStress, 'stress', u)}, ` +
      `grow down to ${qty(lp.lowerThreshold, 'stress', u)} = ${num(lowerThreshold)} ×, split at folds over ${num(featureAngle)}° and between parts)\n`
    if (lp.patches.length === 0) out += '  none\n'
    else {
      const pF = noiseFloor(lp.patches.flatMap((p) => p.force)), pM = noiseFloor(lp.patches.flatMap((p) => p.moment))
      out += table([
        ['  patch', 'part', 'faces', 'area', 'centroid', 'force', 'moment about centroid', 'peak |t|'],
        ...lp.patches.map((p) => [`  ${p.id}`, String(p.part), String(p.faceCount), qty(p.area, 'area', u), vecQty(p.centroid, 'length', u, fL), vecQty(p.force, 'force', u, pF), vecQty(p.moment, 'moment', u, pM), qty(p.peak, 'stress', u)]),
      ], [false, true, true, true, false, false, false, true])
    }
    out += '\n' + block('Nominally free surface', [
      ['area', qty(lp.freeSurface.area, 'area', u)],
      ['mean |t|', `${qty(lp.freeSurface.mean, 'stress', u)} (${num(lp.freeSurface.relative)} of the reference stress)`],
      ['peak |t|', qty(lp.freeSurface.peak, 'stress', u)],
    ])
    io.stdout(out)
    return 0
  },
}
