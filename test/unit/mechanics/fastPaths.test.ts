/**
 * Every per-type fast path equals the plain path it replaces, to round-off, on jittered meshes
 * of every type it applies to: the tet10 and hex8 closed forms of the element balance and the
 * element volumes, and the inverse map's cheaper affine test. The plain paths are the general
 * face and volume quadratures (exact for these integrands: polynomial degrees stated beside each
 * fast path in the source), so equality to round-off is the expected outcome.
 */
import { describe, expect, it } from 'vitest'
import { addMidEdgeNodes, boxMesh } from '../../../src/model/boxMesh.ts'
import { createMesh } from '../../../src/model/createMesh.ts'
import type { Mesh } from '../../../src/model/model.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import { allocateElementBalance, computeElementBalance, computeElementBalanceGeneral } from '../../../src/mechanics/balanceAudit.ts'
import { elementVolumesAndCentroids } from '../../../src/mechanics/elementVolume.ts'
import { isStraightTet10 } from '../../../src/mechanics/straightTet10.ts'
import { affineFit, createElementMap, loadElementMap, referenceDomain } from '../../../src/mechanics/inverseMap.ts'
import { mulberry32 } from '../../../src/mechanics/seededRandom.ts'
import { stressField } from '../../helpers/mappedMeshes.ts'

/**
 * A 3×3×3 box (origin `at`) of hex8, or tet4 split into tet10, with interior corner nodes moved by
 * up to ±15 % of a cell (seeded); for tet10, `curved` of the mid-edge nodes are also moved off
 * their edges by up to 5 % of a cell, so the block mixes straight and curved elements.
 */
function jittered(type: 'hex8' | 'tet10', seed: number, at: number, curved: number): Mesh {
  const n = 3, h = 1 / n
  const corners = boxMesh({ nx: n, ny: n, nz: n, lx: 1, ly: 1, lz: 1, x0: at, y0: at, z0: at }, type === 'hex8' ? 'hex8' : 'tet4')
  const x = corners.coords.slice()
  const rnd = mulberry32(seed)
  for (let i = 0; i < corners.nodeCount; i++) {
    for (let k = 0; k < 3; k++) {
      const v = x[3 * i + k] - at
      if (v > 1e-9 && v < 1 - 1e-9) x[3 * i + k] += 0.15 * h * (2 * rnd() - 1)
    }
  }
  if (type === 'hex8') return createMesh(x, [{ type: 'hex8', conn: corners.blocks[0].conn }])
  const q = addMidEdgeNodes(x, corners.blocks[0].conn, 'tet4', 'tet10')
  const n0 = corners.nodeCount, N = q.coords.length / 3
  for (let i = n0; i < N; i++) {
    if (rnd() >= curved) continue
    for (let k = 0; k < 3; k++) {
      const v = q.coords[3 * i + k] - at
      if (v > 1e-9 && v < 1 - 1e-9) q.coords[3 * i + k] += 0.05 * h * (2 * rnd() - 1)
    }
  }
  return createMesh(q.coords, [{ type: 'tet10', conn: q.conn }])
}

function expectClose(a: ArrayLike<number>, b: ArrayLike<number>, scale: number, rel = 1e-12): void {
  expect(a.length).toBe(b.length)
  let worst = 0
  for (let i = 0; i < a.length; i++) worst = Math.max(worst, Math.abs(a[i] - b[i]))
  expect(worst).toBeLessThanOrEqual(rel * scale)
}

const maxAbs = (a: ArrayLike<number>): number => { let m = 0; for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i])); return m }

describe('fast paths equal the plain paths', () => {
  for (const [type, seed, at, curved] of [['hex8', 11, 0, 0], ['hex8', 12, 500, 0], ['tet10', 13, 0, 0], ['tet10', 14, 0, 0.3], ['tet10', 15, 500, 0.3]] as const) {
    const label = `${type} (seed ${seed}, origin ${at}${type === 'tet10' ? `, ${curved * 100} % of mid-edge nodes moved` : ''})`

    it(`${label}: element volumes and centroids = the volume rule`, () => {
      const mesh = jittered(type, seed, at, curved)
      const E = mesh.elementCount
      const v = new Float64Array(E), c = new Float64Array(3 * E), vg = new Float64Array(E), cg = new Float64Array(3 * E)
      elementVolumesAndCentroids(mesh, v, c, false)
      elementVolumesAndCentroids(mesh, vg, cg, true)
      expectClose(v, vg, maxAbs(vg))
      // centroids to round-off of the coordinates (far from the origin: of their size)
      expectClose(c, cg, Math.max(1, at))
    })

    it(`${label}: element balance closed forms = the general face quadrature`, () => {
      const mesh = jittered(type, seed, at, curved)
      // a quadratic field with cross terms and a body force: every element has a sizeable residual
      const stress = stressField(mesh, (x, y, z) => [1 + x * x + 2 * x * y, 2 + y * y - x * z, -1 + z * z + x * y, 0.5 + x * z + y * y, y * z - x * x, 3 * x * y + z])
      const b: [number, number, number] = [0.5, 2, -3]
      const E = mesh.elementCount
      const fast = computeElementBalance(allocateElementBalance(E), mesh, nodalStressField(mesh, stress), b)
      const ref = computeElementBalanceGeneral(allocateElementBalance(E), mesh, nodalStressField(mesh, stress), b)
      expectClose(fast.residual, ref.residual, maxAbs(ref.gross), 1e-11)
      expectClose(fast.gross, ref.gross, maxAbs(ref.gross), 1e-11)
      for (let e = 0; e < E; e++) expect(Math.abs(fast.indicator[e] - ref.indicator[e])).toBeLessThanOrEqual(1e-9 * Math.max(1, ref.indicator[e]))
    })
  }

  it('isStraightTet10 tells straight from curved tet10 (mid-edge nodes at or off the midpoints)', () => {
    const straight = jittered('tet10', 21, 0, 0), bent = jittered('tet10', 22, 0, 1)
    const count = (m: Mesh) => { let k = 0; for (let e = 0; e < m.elementCount; e++) if (isStraightTet10(m.coords, m.blocks[0].conn, 10 * e)) k++; return k }
    expect(count(straight)).toBe(straight.elementCount)
    // every interior mid-edge node moved: only elements with all six edges on the box surface stay straight
    expect(count(bent)).toBeLessThan(bent.elementCount / 2)
  })

  it('loadElementMap: the tet10 midpoint test = the general affine fit, element by element, straight and curved', () => {
    const dom = referenceDomain('tet10')
    for (const [seed, at, curved] of [[31, 0, 0], [32, 0, 0.3], [33, 500, 0.3]] as const) {
      const mesh = jittered('tet10', seed, at, curved)
      const conn = mesh.blocks[0].conn, em = createElementMap()
      let straight = 0
      for (let e = 0; e < mesh.elementCount; e++) {
        const fast = loadElementMap(em, dom, mesh.coords, conn, 10 * e).affine
        expect(fast).toBe(affineFit(em, dom))
        expect(fast).toBe(isStraightTet10(mesh.coords, conn, 10 * e))
        if (fast) straight++
      }
      if (curved > 0) expect(straight).toBeLessThan(mesh.elementCount)
      else expect(straight).toBe(mesh.elementCount)
    }
  })
})
