/**
 * Structured meshes of a box [x0, x0+lx] × [y0, y0+ly] × [z0, z0+lz] with nx × ny × nz cells,
 * for tests, benchmarks and demos, of any registered element type: each cell is filled as the
 * type's registry record says (`cubeCells`: one hexahedron, two wedges on the bottom diagonal,
 * six Kuhn tetrahedra on the cell diagonal, six pyramids about a node at the cell centre), so the
 * mesh is conforming. Quadratic types get straight mid-edge nodes shared between neighbours.
 *
 * Node numbering: grid node (i, j, k) is i + (nx+1)(j + (ny+1)k); cell centres (when the fill
 * uses them) follow in cell order; mid-edge nodes come last. Elements run cell by cell
 * (i fastest), in the fill's order within a cell.
 */
import { ELEMENT_TYPE_LIST, elementType } from './elementTypes.ts'
import type { ElementTypeName } from './elementTypes.ts'
import { createMesh } from './createMesh.ts'
import type { Mesh } from './model.ts'

export interface BoxSpec {
  readonly nx: number; readonly ny: number; readonly nz: number
  readonly lx: number; readonly ly: number; readonly lz: number
  readonly x0?: number; readonly y0?: number; readonly z0?: number
}

export function boxMesh(spec: BoxSpec, type: ElementTypeName): Mesh {
  const topo = elementType(type)
  const lin = elementType(topo.linear)
  const fill = lin.cubeCells
  const { nx, ny, nz } = spec
  const cells = nx * ny * nz
  const grid = gridNodeCount(spec)
  const centred = fill.some((c) => c.includes(CELL_CENTRE))
  const coords = new Float64Array(3 * (grid + (centred ? cells : 0)))
  gridCoordinates(coords, spec)
  const nn = lin.nodeCount
  const conn = new Int32Array(cells * fill.length * nn)
  const c = new Int32Array(9)
  let e = 0, cell = 0
  for (let k = 0; k < nz; k++) for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++, cell++) {
    cellCorners(c, spec, i, j, k)
    if (centred) c[CELL_CENTRE] = cellCentre(coords, grid + cell, c)
    for (const t of fill) { for (let a = 0; a < nn; a++) conn[e * nn + a] = c[t[a]]; e++ }
  }
  if (topo === lin) return createMesh(coords, [{ type, conn }])
  const q = addMidEdgeNodesToBlocks(coords, [{ type, conn }])
  return createMesh(q.coords, q.blocks)
}

/** Local number of the cell-centre node in `cubeCells` lists (after the cell's corners 0-7). */
export const CELL_CENTRE = 8

/** Grid nodes of a box: (nx+1)(ny+1)(nz+1). */
export function gridNodeCount(spec: BoxSpec): number {
  return (spec.nx + 1) * (spec.ny + 1) * (spec.nz + 1)
}

/** Writes the grid node coordinates of the box into out[0 .. 3·gridNodeCount). */
export function gridCoordinates(out: Float64Array, spec: BoxSpec): Float64Array {
  const { nx, ny, nz, lx, ly, lz } = spec
  const x0 = spec.x0 ?? 0, y0 = spec.y0 ?? 0, z0 = spec.z0 ?? 0
  const NX = nx + 1, NY = ny + 1
  for (let k = 0; k <= nz; k++) for (let j = 0; j <= ny; j++) for (let i = 0; i <= nx; i++) {
    const p = i + NX * (j + NY * k)
    out[3 * p] = x0 + (lx * i) / nx
    out[3 * p + 1] = y0 + (ly * j) / ny
    out[3 * p + 2] = z0 + (lz * k) / nz
  }
  return out
}

/** Grid nodes of cell (i, j, k) in hex8 corner order, written to out[0..7]. */
export function cellCorners(out: Int32Array, spec: BoxSpec, i: number, j: number, k: number): Int32Array {
  const NX = spec.nx + 1, NY = spec.ny + 1
  const p = i + NX * (j + NY * k)
  out[0] = p; out[1] = p + 1; out[2] = p + 1 + NX; out[3] = p + NX
  out[4] = p + NX * NY; out[5] = out[4] + 1; out[6] = out[4] + 1 + NX; out[7] = out[4] + NX
  return out
}

/** Places node `index` at the mean of the cell corners c[0..7] and returns its index. */
export function cellCentre(coords: Float64Array, index: number, c: Int32Array): number {
  for (let d = 0; d < 3; d++) {
    let s = 0
    for (let a = 0; a < 8; a++) s += coords[3 * c[a] + d]
    coords[3 * index + d] = s / 8
  }
  return index
}

/** Turns a linear mesh block into its quadratic twin `to` with shared straight mid-edge nodes. */
export function addMidEdgeNodes(coords: Float64Array, conn: Int32Array, from: ElementTypeName, to: ElementTypeName): { coords: Float64Array; conn: Int32Array } {
  if (elementType(to).linear !== from) throw new Error(`${to} is not the quadratic twin of ${from}`)
  const q = addMidEdgeNodesToBlocks(coords, [{ type: to, conn }])
  return { coords: q.coords, conn: q.blocks[0].conn }
}

/** The quadratic type whose corners are the linear type `name`; an error when it has none. */
export function quadraticTwin(name: ElementTypeName): ElementTypeName {
  const t = ELEMENT_TYPE_LIST.find((q) => q.quadratic && q.linear === name)
  if (!t) throw new Error(`no quadratic element type has the corners of ${name}`)
  return t.name
}

/**
 * Blocks of linear connectivity (corners only, the linear type's node order), each labelled with
 * the quadratic type it becomes, get one mid-edge node per distinct corner edge, shared across
 * elements and blocks (so a conforming linear mesh stays conforming), at the edge's midpoint.
 */
export function addMidEdgeNodesToBlocks(coords: Float64Array, blocks: readonly { type: ElementTypeName; conn: Int32Array }[]): { coords: Float64Array; blocks: { type: ElementTypeName; conn: Int32Array }[] } {
  const n0 = coords.length / 3
  const edgeIndex = new Map<number, number>()
  const extra: number[] = []
  const out = blocks.map(({ type, conn }) => {
    const quad = elementType(type), nLin = quad.cornerCount, nQuad = quad.nodeCount
    if (!quad.quadratic) throw new Error(`${type} has no mid-edge nodes`)
    const count = conn.length / nLin
    const q = new Int32Array(count * nQuad)
    for (let e = 0; e < count; e++) {
      for (let a = 0; a < nLin; a++) q[e * nQuad + a] = conn[e * nLin + a]
      for (const [a, b, m] of quad.edges) {
        const na = conn[e * nLin + a], nb = conn[e * nLin + b]
        const key = Math.min(na, nb) * n0 + Math.max(na, nb)
        let idx = edgeIndex.get(key)
        if (idx === undefined) {
          idx = n0 + extra.length / 3
          edgeIndex.set(key, idx)
          extra.push((coords[3 * na] + coords[3 * nb]) / 2, (coords[3 * na + 1] + coords[3 * nb + 1]) / 2, (coords[3 * na + 2] + coords[3 * nb + 2]) / 2)
        }
        q[e * nQuad + m] = idx
      }
    }
    return { type, conn: q }
  })
  const xyz = new Float64Array(coords.length + extra.length)
  xyz.set(coords)
  xyz.set(extra, coords.length)
  return { coords: xyz, blocks: out }
}
