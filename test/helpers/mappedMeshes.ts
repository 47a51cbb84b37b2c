/**
 * Test meshes made by mapping a structured box (src/model/boxMesh.ts) through a coordinate map,
 * so quadratic types get curved edges for free: the box's mid-edge nodes sit at parameter
 * midpoints and land on the true arcs.
 * - quarterCylinder: (r, θ, z) ∈ [a, b] × [0, π/2] × [0, L] → (r cos θ, r sin θ, z), for the
 *   Lamé thick cylinder and the Kirsch plate with a hole (a quarter model; the symmetry planes
 *   are ordinary boundary faces here).
 */
import { boxMesh } from '../../src/model/boxMesh.ts'
import { createMesh } from '../../src/model/createMesh.ts'
import type { BlockInput } from '../../src/model/createMesh.ts'
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import type { Mesh } from '../../src/model/model.ts'

export interface PolarSpec {
  readonly a: number; readonly b: number; readonly length: number
  readonly nr: number; readonly ntheta: number; readonly nz: number
  /** Angle spanned (default π/2). */
  readonly angle?: number
  /** Radial grading: node radii follow a geometric progression with this ratio of last to first cell (default 1). */
  readonly grading?: number
}

export function quarterCylinder(spec: PolarSpec, type: ElementTypeName): Mesh {
  const angle = spec.angle ?? Math.PI / 2
  const box = boxMesh({ nx: spec.nr, ny: spec.ntheta, nz: spec.nz, lx: 1, ly: 1, lz: spec.length }, type)
  const c = box.coords
  const out = new Float64Array(c.length)
  const g = spec.grading ?? 1
  for (let i = 0; i < box.nodeCount; i++) {
    const s = c[3 * i], t = c[3 * i + 1], z = c[3 * i + 2]
    // Geometric grading maps s ∈ [0, 1] to [0, 1] with cell ratio g (s itself when g = 1).
    const sg = g === 1 ? s : (Math.pow(g, s) - 1) / (g - 1)
    const r = spec.a + (spec.b - spec.a) * sg
    const th = angle * t
    out[3 * i] = r * Math.cos(th); out[3 * i + 1] = r * Math.sin(th); out[3 * i + 2] = z
  }
  return { ...box, coords: out }
}

/** Nodal stress from a function of position. */
export function stressField(mesh: Mesh, f: (x: number, y: number, z: number) => number[]): Float64Array {
  const s = new Float64Array(6 * mesh.nodeCount)
  for (let i = 0; i < mesh.nodeCount; i++) s.set(f(mesh.coords[3 * i], mesh.coords[3 * i + 1], mesh.coords[3 * i + 2]), 6 * i)
  return s
}

/** Cartesian stress from polar components (σr, σθ, τrθ) at angle θ, σzz given. */
export function polarToCartesian(sr: number, st: number, trt: number, theta: number, szz = 0): number[] {
  const c = Math.cos(theta), s = Math.sin(theta)
  return [
    sr * c * c + st * s * s - 2 * trt * s * c,
    sr * s * s + st * c * c + 2 * trt * s * c,
    szz,
    (sr - st) * s * c + trt * (c * c - s * s),
    0, 0,
  ]
}

/**
 * A box whose cells are split into element types by `cellType(i, j, k)`: 'hex8' (one hexahedron),
 * 'wedge6' (two wedges on the bottom diagonal 0-2, as boxMesh splits them) or 'tet4' (six Kuhn
 * tetrahedra on the diagonal 0-6). The caller keeps neighbours conforming: hex8 and wedge6 meet
 * on quadrilaterals (lateral neighbours), wedge6 and tet4 on triangles (vertical neighbours).
 */
export function mixedBox(nx: number, ny: number, nz: number, size: [number, number, number], cellType: (i: number, j: number, k: number) => 'hex8' | 'wedge6' | 'tet4'): Mesh {
  const hex = boxMesh({ nx, ny, nz, lx: size[0], ly: size[1], lz: size[2] }, 'hex8')
  const tets = boxMesh({ nx, ny, nz, lx: size[0], ly: size[1], lz: size[2] }, 'tet4')
  const conn = hex.blocks[0].conn, tconn = tets.blocks[0].conn
  const lists: Record<'hex8' | 'wedge6' | 'tet4', number[]> = { hex8: [], wedge6: [], tet4: [] }
  let cell = 0
  for (let k = 0; k < nz; k++) for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++, cell++) {
    const c = Array.from(conn.subarray(8 * cell, 8 * cell + 8))
    const t = cellType(i, j, k)
    if (t === 'hex8') lists.hex8.push(...c)
    else if (t === 'wedge6') lists.wedge6.push(c[0], c[1], c[2], c[4], c[5], c[6], c[0], c[2], c[3], c[4], c[6], c[7])
    else lists.tet4.push(...tconn.subarray(24 * cell, 24 * cell + 24))
  }
  const blocks: BlockInput[] = []
  for (const type of ['hex8', 'wedge6', 'tet4'] as const) if (lists[type].length) blocks.push({ type, conn: Int32Array.from(lists[type]) })
  return createMesh(hex.coords, blocks)
}
