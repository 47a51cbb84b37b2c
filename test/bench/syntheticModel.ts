/**
 * Seeded synthetic models for the benchmarks: a structured unit block as hex8, or the same block
 * split into tet4 (six per cell; tet10: the same tets with straight mid-edge nodes added after the
 * jitter), with interior nodes jittered by a seeded generator and a smooth
 * analytic stress field that is in equilibrium with a gravity-like body force.
 *
 * The field (x, y, z in m, stress in Pa, invented for benchmarking):
 *   σxx = A + B sin(πy) cos(πz)   σyy = C + D x z        σzz = γ (z - 1)
 *   σxy = E z                     σyz = F x              σxz = G y
 * satisfies div σ + ρb = 0 with ρb = (0, 0, -γ): each row of the divergence differentiates only
 * terms that do not depend on that row's variable, except ∂σzz/∂z = γ, which the body force
 * balances (Cauchy's static equation, any continuum-mechanics text).
 */
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import type { Model, Vec3 } from '../../src/model/model.ts'
import { DEFAULT_UNITS } from '../../src/model/units.ts'
import { addMidEdgeNodes, boxMesh } from '../../src/model/boxMesh.ts'
import { createMesh } from '../../src/model/createMesh.ts'

export const FIELD = { A: 1e6, B: 5e5, C: -2e5, D: 3e5, gamma: 2.35e4, E: 1e5, F: -1.5e5, G: 2e5 } as const

/** Small, fast, seedable generator (mulberry32); returns numbers in [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/** Cells per side so that the block has about `elements` elements of `type`. */
export function cellsPerSide(type: 'hex8' | 'tet4' | 'tet10', elements: number): number {
  return Math.max(1, Math.round(Math.cbrt(type === 'hex8' ? elements : elements / 6)))
}

export function analyticStress(out: Float64Array, o: number, x: number, y: number, z: number): void {
  const f = FIELD
  out[o] = f.A + f.B * Math.sin(Math.PI * y) * Math.cos(Math.PI * z)
  out[o + 1] = f.C + f.D * x * z
  out[o + 2] = f.gamma * (z - 1)
  out[o + 3] = f.E * z
  out[o + 4] = f.F * x
  out[o + 5] = f.G * y
}

export const BODY_FORCE: Vec3 = [0, 0, -FIELD.gamma]

/**
 * A unit block with about `elements` elements. Interior nodes move by up to `jitter` cell sizes
 * per coordinate (0.1 cannot invert a Kuhn tetrahedron, whose smallest height is 0.707 cells),
 * boundary nodes stay on the block's faces so its surface stays flat. With `parts` ≥ 1 every
 * element gets a part number: `parts` slabs along z of equal thickness (numbered 1.. from z = 0,
 * by the element's first corner, so a slab's border follows the cells), sharing the nodes where
 * they meet; `parts` = 1 is a single-part model with a part column.
 */
export function syntheticModel(type: 'hex8' | 'tet4' | 'tet10', elements: number, seed = 1, jitter = 0.1, parts = 0): Model {
  const n = cellsPerSide(type, elements)
  const corners = boxMesh({ nx: n, ny: n, nz: n, lx: 1, ly: 1, lz: 1 }, (type === 'tet10' ? 'tet4' : type) as ElementTypeName)
  const x = corners.coords
  const rnd = mulberry32(seed)
  const h = 1 / n
  const N = corners.nodeCount
  for (let i = 0; i < N; i++) {
    for (let k = 0; k < 3; k++) {
      const v = x[3 * i + k]
      // Boundary coordinates are exactly 0 or 1 as boxMesh writes them.
      if (v > 0 && v < 1) x[3 * i + k] = v + (2 * rnd() - 1) * jitter * h
      else rnd()
    }
  }
  // tet10: mid-edge nodes at the midpoints of the jittered edges (straight-sided elements)
  let mesh = type === 'tet10'
    ? (() => { const q = addMidEdgeNodes(x, corners.blocks[0].conn, 'tet4', 'tet10'); return createMesh(q.coords, [{ type: 'tet10', conn: q.conn }]) })()
    : corners
  if (parts >= 1) {
    // the cell's layer: that of its lowest corner (boxMesh numbers grid nodes x fastest, then y, then z)
    const b = mesh.blocks[0], nn = b.conn.length / b.ids.length, part = new Int32Array(b.ids.length), layer = (n + 1) * (n + 1)
    for (let e = 0; e < part.length; e++) {
      let low = n
      for (let c = 0; c < (type === 'hex8' ? 8 : 4); c++) low = Math.min(low, Math.floor(b.conn[nn * e + c] / layer))
      part[e] = 1 + Math.min(parts - 1, Math.floor((low * parts) / n))
    }
    mesh = createMesh(mesh.coords, [{ type: b.type, conn: b.conn, part }])
  }
  const xs = mesh.coords, NS = mesh.nodeCount
  const stress = new Float64Array(6 * NS)
  for (let i = 0; i < NS; i++) analyticStress(stress, 6 * i, xs[3 * i], xs[3 * i + 1], xs[3 * i + 2])
  return {
    name: `bench-${type}-${n}`,
    description: `Synthetic ${type} block, ${n} cells per side, seed ${seed}${parts >= 1 ? `, ${parts} part slabs` : ""} (invented data for benchmarking)`,
    units: DEFAULT_UNITS,
    mesh,
    stress,
    displacement: null,
    bodyForce: [...BODY_FORCE],
    warnings: [],
  }
}

