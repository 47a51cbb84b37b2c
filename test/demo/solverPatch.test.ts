import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { addFaceLoads } from '../../src/demo/consistentLoads.ts'
import { hexBoundaryFaces, selectFaces } from '../../src/demo/hexFaces.ts'
import { solveElastic } from '../../src/demo/solveElastic.ts'
import { mulberry32 as rng } from '../../src/mechanics/seededRandom.ts'


describe('demo solver: patch test', () => {
  // Irons patch test (common practice; Irons & Razzaque 1972, in the "traction" form): a patch of
  // distorted elements loaded on its whole boundary by the tractions t = σ0·n of a uniform stress
  // state, held only against rigid motion, must reproduce σ0 exactly at every node.
  it('reproduces a uniform stress state on a distorted hex8 patch', () => {
    const seed = 20261201
    console.log(`patch test seed ${seed}`)
    const rand = rng(seed)
    const mesh = boxMesh({ nx: 3, ny: 3, nz: 3, lx: 3, ly: 3, lz: 3 }, 'hex8')
    const coords = mesh.coords.slice()
    const N = mesh.nodeCount
    for (let n = 0; n < N; n++) {
      const x = coords[3 * n], y = coords[3 * n + 1], z = coords[3 * n + 2]
      const interior = x > 0.01 && x < 2.99 && y > 0.01 && y < 2.99 && z > 0.01 && z < 2.99
      if (!interior) continue
      for (let k = 0; k < 3; k++) coords[3 * n + k] += (rand() - 0.5) * 0.5
    }
    const conn = mesh.blocks[0].conn
    const s0 = [10, -4, 3, 2.5, -1.5, 0.7] // xx yy zz xy yz xz
    const load = new Float64Array(3 * N)
    const faces = hexBoundaryFaces(conn, N)
    expect(faces.count).toBe(6 * 9)
    addFaceLoads(load, coords, faces, (t, _x, _y, _z, nx, ny, nz) => {
      t[0] = s0[0] * nx + s0[3] * ny + s0[5] * nz
      t[1] = s0[3] * nx + s0[1] * ny + s0[4] * nz
      t[2] = s0[5] * nx + s0[4] * ny + s0[2] * nz
    })
    // 3-2-1 support: removes the six rigid motions and nothing more.
    const fixed = new Uint8Array(3 * N)
    const at = (x: number, y: number, z: number) => {
      for (let n = 0; n < N; n++) if (Math.hypot(coords[3 * n] - x, coords[3 * n + 1] - y, coords[3 * n + 2] - z) < 1e-9) return n
      throw new Error('node not found')
    }
    const a = at(0, 0, 0), b = at(3, 0, 0), c = at(0, 3, 0)
    fixed[3 * a] = fixed[3 * a + 1] = fixed[3 * a + 2] = 1
    fixed[3 * b + 1] = fixed[3 * b + 2] = 1
    fixed[3 * c + 2] = 1
    for (const recovery of ['patch', 'extrapolate', 'centroid'] as const) {
      const other = solveElastic({ coords, conn, E: 1000, nu: 0.3, fixed, load, tolerance: 1e-13, recovery })
      let worst = 0
      for (let n = 0; n < N; n++) for (let k = 0; k < 6; k++) worst = Math.max(worst, Math.abs(other.stress[6 * n + k] - s0[k]))
      expect(worst, recovery).toBeLessThan(1e-7)
    }
    const sol = solveElastic({ coords, conn, E: 1000, nu: 0.3, fixed, load, tolerance: 1e-13 })
    // Self-equilibrated load: the supports carry nothing.
    let r = 0
    for (let d = 0; d < 3 * N; d++) r = Math.max(r, Math.abs(sol.reaction[d]))
    expect(r).toBeLessThan(1e-8)
  })

  it('selects faces by position', () => {
    const mesh = boxMesh({ nx: 2, ny: 3, nz: 4, lx: 1, ly: 1, lz: 1 }, 'hex8')
    const faces = hexBoundaryFaces(mesh.blocks[0].conn, mesh.nodeCount)
    expect(faces.count).toBe(2 * (2 * 3 + 3 * 4 + 2 * 4))
    expect(selectFaces(faces, mesh.coords, (x) => x > 1 - 1e-9).count).toBe(12)
  })
})
