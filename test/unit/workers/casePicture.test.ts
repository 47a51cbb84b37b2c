/**
 * The case switch's fast path (workers/casePicture.ts) against the plain computation a load runs
 * (the analysis pipeline with the invariants of every node, then the whole surface buffers): the
 * same scalars, ranges, patch labels, extras, audit figures and parts' balance, bit for bit, for
 * each case and a combination of a model with two parts, nodal and element-nodal stress, with
 * displacement. The surface's geometry is the load's, so the scalars must fall on its vertices; the
 * body's volume and centroid are the load's too.
 */
import { describe, expect, it } from 'vitest'
import type { Model } from '../../../src/model/model.ts'
import type { LoadCase } from '../../../src/model/loadCases.ts'
import { modelForCase } from '../../../src/model/loadCases.ts'
import { extractBoundaryFaces } from '../../../src/mechanics/boundaryFaces.ts'
import { bodyVolumeOf } from '../../../src/mechanics/balanceAudit.ts'
import { analysisInputOf, displayStressOf, runAnalysis } from '../../../src/mechanics/analysisPipeline.ts'
import { buildSurfaceTriangles } from '../../../src/mechanics/surfaceTriangles.ts'
import { buildFeatureEdges } from '../../../src/mechanics/featureEdges.ts'
import { analyseCaseOnSurface, caseSurface, jumpOf, loadExtras, surfaceNodesOf, withVerdict } from '../../../workers/casePicture.ts'
import { indicatorSpread } from '../../../src/mechanics/balanceVerdict.ts'
import { loadAssembly } from '../../../workers/assembly.ts'
import { assembly } from '../../helpers/assemblies.ts'
import { elementNodalCopy } from '../../helpers/elementNodal.ts'
import { stressField } from '../../helpers/mappedMeshes.ts'

/** Two parts (a hex8 block and a tet4 block on top, nodes merged), three fields unlike each other, a displacement each. */
function twoPartModel(elementNodal: boolean): Model {
  const mesh = assembly([
    { box: { nx: 4, ny: 2, nz: 2, lx: 2, ly: 1, lz: 1 }, type: 'hex8', part: 1 },
    { box: { nx: 4, ny: 2, nz: 2, lx: 2, ly: 1, lz: 1, z0: 1 }, type: 'tet4', part: 2 },
  ], true)
  const fields = [
    (x: number, y: number, z: number) => [10 + 3 * z, -2 * y, 0.5 * x, 1 + x * y, 0.2 * z, -0.7],
    (x: number, y: number, z: number) => [-4 * x * z, 6, 1 + y * y, 0, 2 * x, z - y],
    (x: number, y: number, z: number) => [x + y + z, x - y, 3, -2 * z, 0.1 * x * y, 4],
  ]
  const cases: LoadCase[] = fields.map((f, j) => {
    const stress = stressField(mesh, f)
    // element-nodal: each element-node's own row, off its node's by a little, so the stress jumps between elements
    const field = elementNodal ? elementNodalCopy(mesh, stress, 7 + j) : null
    if (field) for (let i = 0; i < field.values.length; i++) field.values[i] += 0.05 * Math.sin(3 * i + j)
    const displacement = Float64Array.from({ length: 3 * mesh.nodeCount }, (_, i) => 1e-3 * Math.sin(i * (j + 1)))
    return {
      name: `c${j}`, description: '', bodyForce: j === 1 ? [0, 0, -5] : null, stress, displacement,
      ...(field ? { stressField: field } : {}),
    }
  })
  return {
    name: 'two parts', description: '', units: { length: 'm', stress: 'Pa' }, mesh, stress: cases[0].stress, displacement: cases[0].displacement,
    ...(elementNodal ? { stressField: cases[0].stressField } : {}),
    bodyForce: [0, 0, 0], warnings: [], cases, combinations: [{ name: 'K', factors: { c0: 1.35, c1: 1.5, c2: -0.5 } }],
  }
}

describe('the case switch computes only what the case changes, the same values as a load', () => {
  for (const elementNodal of [false, true]) {
    it(`${elementNodal ? 'element-nodal' : 'nodal'} stress: every case and a combination, scalars, extras, audit and parts bit for bit`, () => {
      const base = twoPartModel(elementNodal)
      const faces = extractBoundaryFaces(base.mesh)
      const surfaceNodes = surfaceNodesOf(faces, base.mesh.nodeCount)
      const edges = buildFeatureEdges(base.mesh.coords, faces)
      for (const name of ['c0', 'c1', 'c2', 'K']) {
        const model = modelForCase(base, name)
        const input = analysisInputOf(model)
        // plain: the pipeline (invariants of every node), the whole surface buffers
        const r = runAnalysis(input, { balancePrecision: 'single', faces })
        const tri = buildSurfaceTriangles(model.mesh.coords, faces, r.tractions, r.invariants, r.elementBalance.indicator, r.loadPatches.faceLabel, jumpOf(model.mesh, input.stress, r.loadPatches))
        const extras = loadExtras(model, faces, displayStressOf(input), tri.scalars, edges.nodes)
        const asm = loadAssembly(model, input.stress, faces, r.tractions, r.loadPatches.faceLabel, tri.index.slice(), tri.triangleFace.slice(), tri.faceVertexStart)!
        // the switch's path
        const stages: string[] = []
        const a = analyseCaseOnSurface(input, faces, { surfaceNodes, body: bodyVolumeOf(model.mesh, faces) }, undefined, (s) => stages.push(s))
        const c = caseSurface(model, faces, { faceVertexStart: tri.faceVertexStart, edgeNodes: edges.nodes, surfaceNodes, body: bodyVolumeOf(model.mesh, faces) }, a, input)
        expect(stages).toEqual(['tractions', 'invariants', 'bodyBalance', 'loadPatches', 'elementBalance', 'verdict'])
        expect(c.surface.scalars).toEqual(tri.scalars)
        expect(c.surface.ranges).toEqual(tri.ranges)
        expect(c.surface.patch).toEqual(tri.patch)
        expect(c.extras).toEqual(extras)
        expect(a.invariants.vonMises).toEqual(r.invariants.vonMises)
        for (const p of surfaceNodes) expect(Array.from(a.invariants.principal.subarray(3 * p, 3 * p + 3))).toEqual(Array.from(r.invariants.principal.subarray(3 * p, 3 * p + 3)))
        expect(a.tractions).toEqual(r.tractions)
        expect(a.elementBalance).toEqual(r.elementBalance)
        expect(a.bodyBalance).toEqual(r.bodyBalance)
        expect(a.loadPatches).toEqual(r.loadPatches)
        expect(a.verdict).toEqual(r.verdict)
        // the verdict with the indicator's spread computed elsewhere (the engine's pool) is the same
        const early = { tractions: a.tractions, invariants: a.invariants, bodyBalance: a.bodyBalance, loadPatches: a.loadPatches }
        expect(withVerdict(input, faces, early, a.elementBalance, () => {}, indicatorSpread(a.elementBalance.indicator)).verdict).toEqual(r.verdict)
        expect(c.assembly).toEqual({ parts: asm.parts, interfaces: asm.interfaces })
        if (elementNodal) expect(c.surface.scalars.stressJump.some((v) => v > 0)).toBe(true)
      }
    })
  }

  it('lists each node of the boundary faces once, ascending', () => {
    const base = twoPartModel(false)
    const faces = extractBoundaryFaces(base.mesh)
    const nodes = surfaceNodesOf(faces, base.mesh.nodeCount)
    const expected = [...new Set(Array.from(faces.nodes).filter((p) => p >= 0))].sort((x, y) => x - y)
    expect(Array.from(nodes)).toEqual(expected)
  })
})
