/**
 * Point location: the elements that hold a point, found through the element grid
 * (elementGrid.ts) and confirmed by inverting each candidate's map (mapInversion.ts). A point on a
 * face, an edge or a node shared by several elements is held by all of them; every one is
 * reported, with its reference coordinates, so a caller can average element-nodal values there.
 *
 * Tolerance: a point is held by an element when |x(ξ) − p| ≤ tol after the inversion, tol in
 * model length units; `locationTolerance` gives the default, 10⁻⁹ of the model's diagonal (far
 * below any element, far above round-off of the coordinates).
 *
 * Record `PointHits` (filled in place, at most MAX_HITS elements; a point shared by more elements
 * than that keeps the first MAX_HITS, which only a degenerate mesh produces):
 * - `count`; `elem[i]` global element index; `block[i]`, `local[i]` its block and index in it;
 * - `xi[3i..3i+2]` its reference coordinates.
 */
import { elementType } from '../model/elementTypes.ts'
import type { Mesh } from '../model/model.ts'
import type { ElementGrid } from './elementGrid.ts'
import { gridCellOf, inElementBox } from './elementGrid.ts'
import { invertElementMap } from './mapInversion.ts'

/** Most elements reported at one point (a node of a tetrahedral mesh is shared by some 20–30). */
export const MAX_HITS = 64

export interface PointHits {
  count: number
  readonly elem: Int32Array
  readonly block: Int32Array
  readonly local: Int32Array
  readonly xi: Float64Array
}

export function allocatePointHits(): PointHits {
  return { count: 0, elem: new Int32Array(MAX_HITS), block: new Int32Array(MAX_HITS), local: new Int32Array(MAX_HITS), xi: new Float64Array(3 * MAX_HITS) }
}

/** Default tolerance of point location: 10⁻⁹ of the model diagonal (length units). */
export function locationTolerance(grid: ElementGrid): number {
  return 1e-9 * grid.size
}

/** Block index of global element e (a short scan: meshes have a few blocks). */
export function blockOfElement(grid: ElementGrid, e: number): number {
  const s = grid.blockStart
  for (let b = 0; b + 1 < s.length; b++) if (e < s[b + 1]) return b
  throw new RangeError(`element index ${e} is not in the mesh (${s[s.length - 1]} elements)`)
}

const XI = new Float64Array(3)

/**
 * True when element e holds p within `tol`; its reference coordinates go to outXi[o..o+2].
 * `b` is e's block index (blockOfElement).
 */
export function elementHolds(outXi: Float64Array, o: number, mesh: Mesh, b: number, e: number, px: number, py: number, pz: number, tol: number): boolean {
  const blk = mesh.blocks[b]
  const topo = elementType(blk.type)
  const d = invertElementMap(XI, topo, mesh.coords, blk.conn, (e - blk.offset) * topo.nodeCount, px, py, pz)
  outXi[o] = XI[0]; outXi[o + 1] = XI[1]; outXi[o + 2] = XI[2]
  return d <= tol
}

/** Every element that holds p (see the file comment), into `out`; returns out. */
export function locatePoint(out: PointHits, mesh: Mesh, grid: ElementGrid, px: number, py: number, pz: number, tol: number): PointHits {
  out.count = 0
  const c = gridCellOf(grid, px, py, pz)
  if (c < 0) return out
  const items = grid.items
  for (let k = grid.cellStart[c], end = grid.cellStart[c + 1]; k < end && out.count < MAX_HITS; k++) {
    const e = items[k]
    if (!inElementBox(grid, e, px, py, pz, tol)) continue
    const b = blockOfElement(grid, e)
    const i = out.count
    if (!elementHolds(out.xi, 3 * i, mesh, b, e, px, py, pz, tol)) continue
    out.elem[i] = e
    out.block[i] = b
    out.local[i] = e - mesh.blocks[b].offset
    out.count++
  }
  return out
}
