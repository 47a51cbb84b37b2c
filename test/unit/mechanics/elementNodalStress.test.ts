/**
 * One code path for nodal and element-nodal stress: the kernels read every element-node's stress
 * through StressField.rows (src/model/stressField.ts). An element-nodal field made by copying each
 * node's row to each of its element-nodes, stored in a shuffled order, is the same stress; the
 * kernels must give the same bits from it as from the nodal field (the arithmetic is the same,
 * only the addresses differ). Checked on a mesh holding every element type of the registry and a
 * conforming hex8/wedge6/tet4 box.
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { ELEMENT_TYPE_NAMES } from '../../../src/model/elementTypes.ts'
import { meshSlice, splitRanges } from '../../../src/model/meshRange.ts'
import { nodalStressField, stressFieldSlice } from '../../../src/model/stressField.ts'
import type { StressField } from '../../../src/model/stressField.ts'
import type { Mesh, Vec3 } from '../../../src/model/model.ts'
import { extractBoundaryFaces } from '../../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../../src/mechanics/tractions.ts'
import { allocateElementBalance, computeBodyBalance, computeElementBalance, computeElementBalanceGeneral } from '../../../src/mechanics/balanceAudit.ts'
import { allocateNodalInvariants, computeNodalInvariants } from '../../../src/mechanics/invariants.ts'
import { runAnalysis, runAnalysisAsync } from '../../../src/mechanics/analysisPipeline.ts'
import type { ElementBalance, SurfaceTractions } from '../../../src/mechanics/types.ts'
import { mixedBox } from '../../helpers/mappedMeshes.ts'
import { mergeMeshes } from '../../helpers/sectionMeshes.ts'
import { stressField } from '../../helpers/mappedMeshes.ts'
import { elementNodalCopy } from '../../helpers/elementNodal.ts'

/** Same bytes? (NaN padding included.) */
function sameBits(a: ArrayBufferView, b: ArrayBufferView): boolean {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength).equals(Buffer.from(b.buffer, b.byteOffset, b.byteLength))
}

/** The mesh moved by dx along x. */
const moved = (m: Mesh, dx: number): Mesh => ({ ...m, coords: m.coords.map((v, i) => (i % 3 === 0 ? v + dx : v)) })

// Conforming hex8 + wedge6 columns and wedge6 + tet4 layers (mappedMeshes.ts), then one box of
// every registered type, side by side.
const mesh = mergeMeshes([
  mixedBox(3, 2, 2, [3, 1.5, 2], (i) => (i === 1 ? 'wedge6' : 'hex8')),
  moved(mixedBox(2, 2, 3, [2, 2, 3], (_i, _j, k) => (k === 0 ? 'wedge6' : 'tet4')), 4),
  ...ELEMENT_TYPE_NAMES.map((type, i) => boxMesh({ nx: 2, ny: 1, nz: 2, lx: 1, ly: 1, lz: 1, x0: 7 + 2 * i }, type)),
])
// A quadratic field (not interpolated exactly by the linear types, not in equilibrium), so every
// figure is non-trivial.
const values = stressField(mesh, (x, y, z) => [1 + x * x, y * z - 2, 3 * z + x * y, 0.5 * x - z * z, y * y, x * z + 1])
const nodal = nodalStressField(mesh, values)
const elementNodal = elementNodalCopy(mesh, values)
const bodyForce: Vec3 = [0.3, -2, 1]

function tractionsOf(field: StressField): SurfaceTractions {
  const faces = extractBoundaryFaces(mesh)
  return computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, field, faces)
}

function expectSameBalance(a: ElementBalance, b: ElementBalance): void {
  expect(sameBits(a.residual, b.residual)).toBe(true)
  expect(sameBits(a.gross, b.gross)).toBe(true)
  expect(sameBits(a.indicator, b.indicator)).toBe(true)
}

describe('element-nodal stress through the element-node index', () => {
  it('the test mesh holds every registered element type, in several blocks', () => {
    expect(new Set(mesh.blocks.map((b) => b.type))).toEqual(new Set(ELEMENT_TYPE_NAMES))
    expect(elementNodal.values.length).toBe(6 * mesh.blocks.reduce((n, b) => n + b.conn.length, 0))
  })

  it('tractions: every per-node and per-face array is bit-identical to the nodal field', () => {
    const a = tractionsOf(nodal), b = tractionsOf(elementNodal)
    for (const k of Object.keys(a) as (keyof SurfaceTractions)[]) expect(sameBits(a[k], b[k]), k).toBe(true)
  })

  it('element balance (closed forms and the general face quadrature) and body balance are bit-identical', () => {
    const E = mesh.elementCount
    expectSameBalance(computeElementBalance(allocateElementBalance(E), mesh, elementNodal, bodyForce), computeElementBalance(allocateElementBalance(E), mesh, nodal, bodyForce))
    expectSameBalance(computeElementBalanceGeneral(allocateElementBalance(E), mesh, elementNodal, bodyForce), computeElementBalanceGeneral(allocateElementBalance(E), mesh, nodal, bodyForce))
    const faces = extractBoundaryFaces(mesh)
    expect(computeBodyBalance(mesh, faces, tractionsOf(elementNodal), bodyForce)).toEqual(computeBodyBalance(mesh, faces, tractionsOf(nodal), bodyForce))
  })

  it('split over element ranges (as the kernel pool runs it), the element-nodal balance is unchanged', () => {
    const whole = computeElementBalance(allocateElementBalance(mesh.elementCount), mesh, nodal, bodyForce)
    for (let parts = 1; parts <= 5; parts++) {
      const out = allocateElementBalance(mesh.elementCount)
      for (const [from, to] of splitRanges(mesh.elementCount, parts)) {
        const slice = meshSlice(mesh, from, to)
        const part = stressFieldSlice(elementNodal, mesh, slice, from)
        expect(part.layout).toBe('element-nodal')
        computeElementBalance({ residual: out.residual.subarray(3 * from, 3 * to), gross: out.gross.subarray(from, to), indicator: out.indicator.subarray(from, to) }, slice, part, bodyForce)
      }
      expectSameBalance(out, whole)
    }
  })

  it('the pipeline runs element-nodal stress on the same path once the nodal display values are given', async () => {
    // The part-wise nodal average of these copies is the nodal field itself; until that averaging
    // is written the display invariants are handed in.
    const invariants = computeNodalInvariants(allocateNodalInvariants(mesh.nodeCount), values)
    const a = runAnalysis({ mesh, stress: nodal, bodyForce })
    const b = await runAnalysisAsync({ mesh, stress: elementNodal, bodyForce }, {}, { offloaded: { invariants: Promise.resolve(invariants) } })
    expectSameBalance(b.elementBalance, a.elementBalance)
    expect(sameBits(b.tractions.force, a.tractions.force)).toBe(true)
    expect(b.bodyBalance).toEqual(a.bodyBalance)
    expect(b.loadPatches).toEqual(a.loadPatches)
    expect(() => runAnalysis({ mesh, stress: elementNodal, bodyForce })).toThrow(/element-nodal stress needs its mesh to be averaged to nodes/)
  })
})
