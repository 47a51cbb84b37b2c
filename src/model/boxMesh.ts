import type { ElementTypeName } from './elementTypes.ts'
import { ELEMENT_TYPES } from './elementTypes.ts'
import { createMesh } from './createMesh.ts'
import type { Mesh } from './model.ts'

/**
 * Structured meshes of a box [x0, x0+lx] × [y0, y0+ly] × [z0, z0+lz] with nx × ny × nz cells,
 * for tests, benchmarks and demos. Every type is supported:
 * - hex8 / hex20: one hexahedron per cell;
 * - wedge6: two wedges per cell, split on the bottom-face diagonal 0-2;
 * - tet4 / tet10: six tetrahedra per cell sharing the cell diagonal 0-6 (Kuhn's triangulation,
 *   which matches across neighbouring cells, so the mesh is conforming).
 * Quadratic types get straight mid-edge nodes shared between neighbours.
 */
export interface BoxSpec {
  readonly nx: number; readonly ny: number; readonly nz: number
  readonly lx: number; readonly ly: number; readonly lz: number
  readonly x0?: number; readonly y0?: number; readonly z0?: number
}

const KUHN: readonly (readonly number[])[] = [
  [0, 1, 2, 6], [0, 1, 5, 6], [0, 3, 2, 6], [0, 3, 7, 6], [0, 4, 5, 6], [0, 4, 7, 6],
]

export function boxMesh(spec: BoxSpec, type: ElementTypeName): Mesh {
  const { nx, ny, nz, lx, ly, lz } = spec
  const x0 = spec.x0 ?? 0, y0 = spec.y0 ?? 0, z0 = spec.z0 ?? 0
  const NX = nx + 1, NY = ny + 1, NZ = nz + 1
  const n = NX * NY * NZ
  const coords = new Float64Array(3 * n)
  for (let k = 0; k < NZ; k++) for (let j = 0; j < NY; j++) for (let i = 0; i < NX; i++) {
    const p = i + NX * (j + NY * k)
    coords[3 * p] = x0 + (lx * i) / nx
    coords[3 * p + 1] = y0 + (ly * j) / ny
    coords[3 * p + 2] = z0 + (lz * k) / nz
  }
  const cells = nx * ny * nz
  const base = type === 'hex8' || type === 'hex20' ? 'hex8' : type === 'wedge6' ? 'wedge6' : 'tet4'
  const per = base === 'hex8' ? 1 : base === 'wedge6' ? 2 : 6
  const nn = ELEMENT_TYPES[base].nodeCount
  const conn = new Int32Array(cells * per * nn)
  const c = new Int32Array(8)
  let e = 0
  for (let k = 0; k < nz; k++) for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) {
    const p = i + NX * (j + NY * k)
    c[0] = p; c[1] = p + 1; c[2] = p + 1 + NX; c[3] = p + NX
    c[4] = p + NX * NY; c[5] = c[4] + 1; c[6] = c[4] + 1 + NX; c[7] = c[4] + NX
    if (base === 'hex8') {
      for (let a = 0; a < 8; a++) conn[e * 8 + a] = c[a]
      e++
    } else if (base === 'wedge6') {
      const w = [[0, 1, 2, 4, 5, 6], [0, 2, 3, 4, 6, 7]]
      for (const ww of w) { for (let a = 0; a < 6; a++) conn[e * 6 + a] = c[ww[a]]; e++ }
    } else {
      for (const t of KUHN) {
        for (let a = 0; a < 4; a++) conn[e * 4 + a] = c[t[a]]
        if (tetVolumeSign(coords, conn, e) < 0) { const s = conn[e * 4 + 2]; conn[e * 4 + 2] = conn[e * 4 + 3]; conn[e * 4 + 3] = s }
        e++
      }
    }
  }
  if (type === base) return createMesh(coords, [{ type, conn }])
  const q = addMidEdgeNodes(coords, conn, base, type)
  return createMesh(q.coords, [{ type, conn: q.conn }])
}

function tetVolumeSign(x: Float64Array, conn: Int32Array, e: number): number {
  const a = conn[e * 4] * 3, b = conn[e * 4 + 1] * 3, c = conn[e * 4 + 2] * 3, d = conn[e * 4 + 3] * 3
  const ux = x[b] - x[a], uy = x[b + 1] - x[a + 1], uz = x[b + 2] - x[a + 2]
  const vx = x[c] - x[a], vy = x[c + 1] - x[a + 1], vz = x[c + 2] - x[a + 2]
  const wx = x[d] - x[a], wy = x[d + 1] - x[a + 1], wz = x[d + 2] - x[a + 2]
  return (uy * vz - uz * vy) * wx + (uz * vx - ux * vz) * wy + (ux * vy - uy * vx) * wz
}

/** Turns a linear mesh (tet4 or hex8) into its quadratic twin with shared straight mid-edge nodes. */
export function addMidEdgeNodes(coords: Float64Array, conn: Int32Array, from: ElementTypeName, to: ElementTypeName): { coords: Float64Array; conn: Int32Array } {
  const lin = ELEMENT_TYPES[from], quad = ELEMENT_TYPES[to]
  const nLin = lin.nodeCount, nQuad = quad.nodeCount
  const count = conn.length / nLin
  const n0 = coords.length / 3
  const edgeIndex = new Map<number, number>()
  const extra: number[] = []
  const out = new Int32Array(count * nQuad)
  for (let e = 0; e < count; e++) {
    for (let a = 0; a < nLin; a++) out[e * nQuad + a] = conn[e * nLin + a]
    for (const [a, b, m] of quad.edges) {
      const na = conn[e * nLin + a], nb = conn[e * nLin + b]
      const key = Math.min(na, nb) * n0 + Math.max(na, nb)
      let idx = edgeIndex.get(key)
      if (idx === undefined) {
        idx = n0 + extra.length / 3
        edgeIndex.set(key, idx)
        extra.push((coords[3 * na] + coords[3 * nb]) / 2, (coords[3 * na + 1] + coords[3 * nb + 1]) / 2, (coords[3 * na + 2] + coords[3 * nb + 2]) / 2)
      }
      out[e * nQuad + m] = idx
    }
  }
  const xyz = new Float64Array(coords.length + extra.length)
  xyz.set(coords)
  xyz.set(extra, coords.length)
  return { coords: xyz, conn: out }
}
