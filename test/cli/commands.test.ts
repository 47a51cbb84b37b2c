/**
 * The command line in-process: every documented JSON field equals what the kernels compute on
 * the same model, and uniform-stress cases match Cauchy's formula (Malvern, Introduction to the
 * Mechanics of a Continuous Medium, 1969, ch. 3): a section carries F = σm·A and no moment about
 * its centroid, and the whole body is in balance.
 */
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { rmSync } from 'node:fs'
import { cli, cliJson, tempDir, writeBundle } from './cliHarness.ts'
import { syntheticModel } from '../bench/syntheticModel.ts'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { readCsvBundle, writeCsvBundle } from '../../src/io/index.ts'
import type { Model, Vec3 } from '../../src/model/model.ts'
import { LBF_TO_N } from '../../src/model/units.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { allocateElementBalance, computeBodyBalance, computeElementBalance, percentiles } from '../../src/mechanics/balanceAudit.ts'
import { allocateNodalInvariants, computeNodalInvariants } from '../../src/mechanics/invariants.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { findLoadPatches } from '../../src/mechanics/loadPatches.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { sweepSections } from '../../src/mechanics/sectionSweep.ts'

let root = ''
let bundle = ''
let uniform = ''
/** The synthetic model as the CLI sees it (read back from the written CSV). */
let model: Model

// Uniform stress state in Pa (invented numbers), order xx, yy, zz, xy, yz, xz.
const S = [3e6, -1e6, 2e6, 5e5, -2e5, 1e5]

function uniformModel(): Model {
  const mesh = boxMesh({ nx: 4, ny: 2, nz: 2, lx: 2, ly: 1, lz: 1 }, 'hex8')
  const stress = new Float64Array(6 * mesh.nodeCount)
  for (let i = 0; i < mesh.nodeCount; i++) stress.set(S, 6 * i)
  return { name: 'uniform', description: '', units: { length: 'm', stress: 'Pa' }, mesh, stress, displacement: null, bodyForce: [0, 0, 0], warnings: [] }
}

beforeAll(() => {
  root = tempDir()
  const synthetic = syntheticModel('tet4', 3000, 11)
  bundle = writeBundle(join(root, 'block'), synthetic)
  uniform = writeBundle(join(root, 'uniform'), uniformModel())
  model = readCsvBundle(writeCsvBundle(synthetic))
})
afterAll(() => { rmSync(root, { recursive: true, force: true }) })

const close = (a: number, b: number, tol = 1e-12) => expect(Math.abs(a - b)).toBeLessThanOrEqual(tol * Math.max(1, Math.abs(b)))
const closeVec = (a: number[], b: ArrayLike<number>, tol = 1e-12) => { for (let k = 0; k < 3; k++) close(a[k], b[k], tol) }

describe('tractus info', () => {
  it('reports counts, types, bounds, units and warnings', async () => {
    const j = await cliJson('info', bundle)
    expect(j.nodes).toBe(model.mesh.nodeCount)
    expect(j.elements).toBe(model.mesh.elementCount)
    expect(j.types).toEqual({ tet4: model.mesh.elementCount })
    expect(j.bounds.min).toEqual([0, 0, 0])
    expect(j.bounds.max).toEqual([1, 1, 1])
    expect(j.modelUnits).toEqual({ length: 'm', stress: 'Pa' })
    expect(j.bodyForce).toEqual([0, 0, -23500])
    expect(j.warnings).toEqual([])
  })

  it('prints a table with a unit on every number', async () => {
    const out = await cli('info', bundle)
    expect(out.code).toBe(0)
    expect(out.stdout).toMatch(/bounds max\s+\(1, 1, 1\) m/)
    expect(out.stdout).toMatch(/σzz\s+-23500 Pa\s+0 Pa/)
  })
})

describe('tractus cut', () => {
  it('gives F = σm·A and no moment about the centroid for a uniform stress (Cauchy)', async () => {
    const j = await cliJson('cut', uniform, '--point', '0.73,0.5,0.5', '--normal', '1,0,0')
    close(j.area, 1)
    closeVec(j.force, [S[0], S[3], S[5]])
    closeVec(j.centroid, [0.73, 0.5, 0.5])
    for (const v of j.moment) expect(Math.abs(v)).toBeLessThan(1e-6)
    close(j.axial, S[0])
    expect(j.freeBody.relative).toBeLessThan(1e-12)
  })

  it('prints every documented field equal to the section kernel', async () => {
    const point: Vec3 = [0.41, 0.52, 0.47], normal: Vec3 = [0.2, -0.3, 1], about: Vec3 = [0.1, 0.2, 0.3]
    const j = await cliJson('cut', bundle, '--point', point.join(','), '--normal', normal.join(','), '--about', about.join(','))
    const r = cutSection(model.mesh, nodalStressField(model.mesh, model.stress), model.bodyForce, { point, normal }, { about }).result
    close(j.area, r.area)
    closeVec(j.centroid, r.centroid)
    expect(j.about).toEqual(about)
    closeVec(j.force, r.force)
    closeVec(j.moment, r.moment)
    closeVec(j.axes.e1, r.axes.e1)
    closeVec(j.axes.e2, r.axes.e2)
    closeVec(j.axes.e3, r.axes.e3)
    close(j.axial, r.axial)
    closeVec([...j.shear, 0], [...r.shear, 0])
    close(j.torque, r.torque)
    closeVec([...j.bending, 0], [...r.bending, 0])
    closeVec(j.freeBody.force, r.freeBody.force)
    closeVec(j.freeBody.moment, r.freeBody.moment)
    close(j.freeBody.relative, r.freeBody.relative)
    close(j.freeBody.momentRelative, r.freeBody.momentRelative)
    close(j.freeBody.gross, r.freeBody.gross)
    expect(j.unmappedPoints).toBe(0)
  })

  it('says which section axes it used: principal by default, reference axes with --reference', async () => {
    const point: Vec3 = [0.41, 0.52, 0.47], normal: Vec3 = [0.2, -0.3, 1]
    const p = await cliJson('cut', bundle, '--point', point.join(','), '--normal', normal.join(','))
    expect(p.axes.kind).toBe('principal')
    expect(p.axes.reference).toEqual([1, 0, 0]) // the first of x, y, z with the longest projection
    const reference: Vec3 = [0, 1, 0]
    const j = await cliJson('cut', bundle, '--point', point.join(','), '--normal', normal.join(','), '--reference', reference.join(','))
    const r = cutSection(model.mesh, nodalStressField(model.mesh, model.stress), model.bodyForce, { point, normal }, { axes: { kind: 'reference', reference } }).result
    expect(j.axes.kind).toBe('reference')
    expect(j.axes.reference).toEqual([0, 1, 0])
    closeVec(j.axes.e1, r.axes.e1)
    closeVec(j.axes.e2, r.axes.e2)
    // e1 is the projection of y onto the plane, so it lies in the plane.
    const m = Math.hypot(...normal)
    expect(Math.abs(j.axes.e1[0] * normal[0] + j.axes.e1[1] * normal[1] + j.axes.e1[2] * normal[2]) / m).toBeLessThan(1e-12)
    closeVec([...j.bending, 0], [...r.bending, 0])
    close(j.secondMoments.I12, r.secondMoments.I12)
    const table = await cli('cut', bundle, '--point', point.join(','), '--normal', normal.join(','), '--reference', '0,1,0')
    expect(table.stdout).toMatch(/section axes\s+reference axes: e1 is the projection of \(0, 1, 0\)/)
    const sweep = await cliJson('sweep', bundle, '--normal', '1,0,0', '--from', '0.2', '--to', '0.8', '--count', '3', '--reference', '0,1,1')
    expect(sweep.axes.kind).toBe('reference')
    closeVec(sweep.axes.reference, [0, Math.SQRT1_2, Math.SQRT1_2])
    for (const sec of sweep.sections) expect(sec.axes.kind).toBe('reference')
  })

  it('reads rounding noise as 0 in its table while the JSON keeps every digit', async () => {
    // The lug's neck (an invented demo): Fz is about 1e-6 of |F|, the centroid's x about 1e-16 of the part.
    const lug = join('public', 'demo', 'lifting-lug', 'lifting-lug.tractus')
    const args = ['cut', lug, '--point', '0,140,10', '--normal', '0,1,0']
    const j = await cliJson(...args)
    expect(j.force[2]).not.toBe(0)
    expect(Math.abs(j.force[2]) / Math.hypot(...j.force)).toBeLessThan(1e-6)
    const table = await cli(...args)
    expect(table.stdout).toMatch(/force F\s+\(25011, 43373, 0\) N/)
    // The region's own figures follow the same rule (one region here: the whole neck).
    expect(table.stdout).toMatch(/region 1 \(part 0\)\s+area 3200 mm², centroid \(0, 140, 10\) mm, force \(25011, 43373, 0\) N/)
    expect(table.stdout).toMatch(/centroid\s+\(0, 140, 10\) mm/)
  })

  it('refuses a reference parallel to the normal (exit 2, the message names both)', async () => {
    const out = await cli('cut', bundle, '--point', '0.5,0.5,0.5', '--normal', '0,0,2', '--reference', '0,0,-1')
    expect(out.code).toBe(2)
    expect(out.stderr).toMatch(/reference direction \(0, 0, -1\) is parallel to the section normal \(0, 0, 1\)/)
  })

  it('converts to US customary units with the NIST SP 811 factors', async () => {
    const args = ['cut', uniform, '--point', '0.73,0.5,0.5', '--normal', '1,0,0']
    const si = await cliJson(...args)
    const us = await cliJson(...args, '--units', 'us')
    // NIST SP 811 (2008) Appendix B: 1 lbf = 4.448 222 N, 1 in = 0.0254 m exactly.
    closeVec(us.force, si.force.map((v: number) => v / (LBF_TO_N * 1000)))
    close(us.area, si.area / 0.0254 ** 2)
    closeVec(us.centroid, si.centroid.map((v: number) => v / 0.0254))
    expect(us.units.force).toBe('kip')
    const table = await cli(...args, '--units', 'si')
    expect(table.stdout).toMatch(/axial N\s+3000 kN/)
  })

  it('takes the body force from the command line over model.json', async () => {
    const a = await cliJson('cut', bundle, '--point', '0.5,0.5,0.5', '--normal', '0,0,1')
    const b = await cliJson('cut', bundle, '--point', '0.5,0.5,0.5', '--normal', '0,0,1', '--body-force', '0,0,0')
    expect(a.bodyForce).toEqual([0, 0, -23500])
    expect(b.bodyForce).toEqual([0, 0, 0])
    // The field balances ρb = (0, 0, -23500): without it the lower half lacks its weight, 0.5 m³ · 23500 N/m³.
    expect(Math.abs(b.freeBody.force[2])).toBeGreaterThan(0.99 * 11750)
    expect(Math.abs(a.freeBody.force[2])).toBeLessThan(0.01 * 11750)
  })
})

describe('tractus audit', () => {
  it('prints balance, element percentiles, patches and free surface equal to the kernels', async () => {
    const j = await cliJson('audit', bundle)
    const { mesh, stress, bodyForce } = model
    const field = nodalStressField(mesh, stress)
    const faces = extractBoundaryFaces(mesh)
    const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, field, faces)
    const body = computeBodyBalance(mesh, faces, tractions, bodyForce)
    const elements = computeElementBalance(allocateElementBalance(mesh.elementCount, 'single'), mesh, field, bodyForce)
    const [p50, p95, pmax] = percentiles(elements.indicator, [50, 95, 100])
    const vonMises = computeNodalInvariants(allocateNodalInvariants(mesh.nodeCount), stress).vonMises
    const lp = findLoadPatches(mesh, faces, tractions, vonMises)
    closeVec(j.balance.force, body.force)
    closeVec(j.balance.moment, body.moment)
    close(j.balance.relative, body.relative)
    close(j.elements.p50, p50)
    close(j.elements.p95, p95)
    close(j.elements.max, pmax)
    expect(j.elements.worst[0].indicator).toBe(pmax)
    expect(j.patches.length).toBe(lp.patches.length)
    j.patches.forEach((p: { area: number; centroid: number[]; force: number[]; moment: number[]; peak: number }, i: number) => {
      close(p.area, lp.patches[i].area)
      closeVec(p.centroid, lp.patches[i].centroid)
      closeVec(p.force, lp.patches[i].force)
      closeVec(p.moment, lp.patches[i].moment)
      close(p.peak, lp.patches[i].peak)
    })
    close(j.freeSurface.area, lp.freeSurface.area)
    close(j.freeSurface.mean, lp.freeSurface.mean)
  })

  it('takes the patch rule\'s lower threshold and feature angle, and says what it used', async () => {
    const j = await cliJson('audit', bundle, '--threshold', '0.1', '--lower-threshold', '0.02', '--feature-angle', '60')
    expect(j.thresholdFraction).toBe(0.1)
    expect(j.lowerThresholdFraction).toBe(0.02)
    expect(j.featureAngle).toBe(60)
    close(j.lowerThreshold, 0.2 * j.threshold)
    const f = extractBoundaryFaces(model.mesh)
    const t = computeSurfaceTractions(allocateSurfaceTractions(f), model.mesh, nodalStressField(model.mesh, model.stress), f)
    const inv = computeNodalInvariants(allocateNodalInvariants(model.mesh.nodeCount), model.stress)
    const lp = findLoadPatches(model.mesh, f, t, inv.vonMises, { threshold: 0.1, lowerThreshold: 0.02, featureAngle: 60 })
    expect(j.patches.length).toBe(lp.patches.length)
    j.patches.forEach((p: { force: number[]; moment: number[]; part: number }, i: number) => {
      closeVec(p.force, lp.patches[i].force)
      closeVec(p.moment, lp.patches[i].moment)
      expect(p.part).toBe(lp.patches[i].part)
    })
    const bad = await cli('audit', bundle, '--threshold', '0.02', '--lower-threshold', '0.05')
    expect(bad.code).toBe(1)
    expect(bad.stderr).toMatch(/--lower-threshold \(0\.05\) must not exceed --threshold \(0\.02\)/)
    expect((await cli('audit', bundle, '--feature-angle', '200')).code).toBe(1)
  })

  it('finds a uniform stress state in balance (Cauchy: ∮σn dA = 0 for constant σ)', async () => {
    const j = await cliJson('audit', uniform)
    for (const v of j.balance.force) expect(Math.abs(v)).toBeLessThan(1e-6)
    expect(j.balance.relative).toBeLessThan(1e-12)
    expect(j.elements.max).toBeLessThan(1e-12)
    const out = await cli('audit', uniform)
    expect(out.stdout).toMatch(/relative\s+\S+ of the gross load \S+ N/)
  })
})

describe('tractus sweep', () => {
  it('gives the sections of the sweep kernel, as JSON and as CSV', async () => {
    const j = await cliJson('sweep', bundle, '--normal', '0,0,2', '--from', '0.1', '--to', '0.9', '--count', '5')
    const ref = sweepSections(model.mesh, nodalStressField(model.mesh, model.stress), model.bodyForce, [0, 0, 1], 0.1, 0.9, 5)
    expect(j.sections.length).toBe(5)
    j.sections.forEach((s: { offset: number; area: number; force: number[]; moment: number[]; axial: number }, k: number) => {
      close(s.offset, ref.offsets[k])
      close(s.area, ref.results[k].area)
      closeVec(s.force, ref.results[k].force)
      closeVec(s.moment, ref.results[k].moment)
      close(s.axial, ref.results[k].axial)
    })
    const csv = await cli('sweep', bundle, '--normal', '0,0,1', '--from', '0.1', '--to', '0.9', '--count', '5')
    const lines = csv.stdout.trim().split('\n')
    expect(lines.length).toBe(6)
    expect(lines[0]).toMatch(/^offset \[m\],area \[m²\],/)
    expect(Number(lines[3].split(',')[0])).toBeCloseTo(0.5, 12)
    // the free body's moment column sits beside its force column
    const head = lines[0].split(',')
    const col = head.indexOf('freebody_moment_relative')
    expect(col).toBe(head.indexOf('freebody_relative') + 1)
    close(Number(lines[3].split(',')[col]), ref.results[2].freeBody.momentRelative)
  })
})

describe('tractus convert', () => {
  it('writes a native file that reads back as the same model, and back to a bundle', async () => {
    const file = join(root, 'block.tractus')
    const w = await cliJson('convert', bundle, '--out', file)
    expect(w.format).toBe('native')
    const a = await cliJson('audit', bundle)
    const b = await cliJson('audit', file)
    expect(b.balance).toEqual(a.balance)
    expect(b.elements).toEqual(a.elements)
    const back = join(root, 'back')
    const out = await cli('convert', file, '--out', back)
    expect(out.code).toBe(0)
    const info = await cliJson('info', back)
    expect(info.elements).toBe(model.mesh.elementCount)
  })
})
