/**
 * Conforming mixed meshes of a box: each cell of an nx × ny × nz grid is filled with elements of
 * one linear type (as its registry record fills a cell, see boxMesh.ts) or is a transition cell,
 * split about a node at its centre into a pyramid on every face that meets a quadrilateral and
 * two tetrahedra on every face that meets triangles (taking the neighbour's diagonal). So a hex8
 * meets a pyramid5 on its quadrilateral face, the pyramid's triangular sides meet tet4s, and a
 * wedge6 meets a hex8 on its sides and a tet4 on its triangles. The quadratic variant turns every
 * element into its quadratic twin (hex20, pyramid13, tet10, wedge15) with straight mid-edge nodes
 * shared across types. Units: the box's, as in BoxSpec.
 *
 * Conformity is checked, not assumed: every corner face of every element must be shared by
 * exactly two elements, or lie on the box surface; a layout that breaks this is an error that
 * names the face.
 */
import { elementType, ELEMENT_TYPE_NAMES, ELEMENT_TYPES } from '../model/elementTypes.ts'
import type { ElementTypeName } from '../model/elementTypes.ts'
import { createMesh } from '../model/createMesh.ts'
import type { BlockInput } from '../model/createMesh.ts'
import type { Mesh } from '../model/model.ts'
import { addMidEdgeNodesToBlocks, CELL_CENTRE, cellCentre, cellCorners, gridCoordinates, gridNodeCount, quadraticTwin } from '../model/boxMesh.ts'
import type { BoxSpec } from '../model/boxMesh.ts'

/** What fills a cell: a linear element type, or a transition cell of pyramids and tetrahedra. */
export type CellFill = ElementTypeName | 'transition'

/** The six faces of a grid cell in cell-corner numbers, counter-clockwise seen from outside (hex8 faces). */
const CELL_FACES = ELEMENT_TYPES.hex8.faces
/** Cell-corner offsets (i, j, k) of corners 0-7, and the neighbour across each cell face. */
const CORNER_OFFSET = [[0, 0, 0], [1, 0, 0], [1, 1, 0], [0, 1, 0], [0, 0, 1], [1, 0, 1], [1, 1, 1], [0, 1, 1]]
const FACE_STEP = CELL_FACES.map((f) => [0, 1, 2].map((d) => {
  const s = f.reduce((acc, c) => acc + CORNER_OFFSET[c][d], 0)
  return s === 0 ? -1 : s === 4 ? 1 : 0
}))

/**
 * The mesh of `spec` with cell (i, j, k) filled by `fill(i, j, k)`. `quadratic` gives every
 * element its quadratic twin. Blocks come one per type present, in code order.
 */
export function mixedBoxMesh(spec: BoxSpec, fill: (i: number, j: number, k: number) => CellFill, quadratic = false): Mesh {
  const { nx, ny, nz } = spec
  const fills: CellFill[] = []
  for (let k = 0; k < nz; k++) for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) {
    const f = fill(i, j, k)
    if (f !== 'transition' && elementType(f).linear !== f) throw new Error(`cell (${i}, ${j}, ${k}): fill with a linear type or 'transition', not ${f}`)
    fills.push(f)
  }
  const fillAt = (i: number, j: number, k: number): CellFill | null =>
    i < 0 || j < 0 || k < 0 || i >= nx || j >= ny || k >= nz ? null : fills[i + nx * (j + ny * k)]
  const grid = gridNodeCount(spec)
  const centred = fills.map((f) => f === 'transition' || elementType(f).cubeCells.some((c) => c.includes(CELL_CENTRE)))
  let centres = 0
  const centreIndex = centred.map((c) => (c ? grid + centres++ : -1))
  const coords = new Float64Array(3 * (grid + centres))
  gridCoordinates(coords, spec)
  const lists = new Map<ElementTypeName, number[]>()
  const push = (type: ElementTypeName, nodes: readonly number[]): void => {
    let l = lists.get(type)
    if (!l) { l = []; lists.set(type, l) }
    l.push(...nodes)
  }
  const c = new Int32Array(9)
  let cell = 0
  for (let k = 0; k < nz; k++) for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++, cell++) {
    cellCorners(c, spec, i, j, k)
    if (centred[cell]) c[CELL_CENTRE] = cellCentre(coords, centreIndex[cell], c)
    const f = fills[cell]
    if (f !== 'transition') {
      for (const t of elementType(f).cubeCells) push(f, t.map((a) => c[a]))
      continue
    }
    CELL_FACES.forEach((face, fi) => {
      const [di, dj, dk] = FACE_STEP[fi]
      const other = fillAt(i + di, j + dj, k + dk)
      const p = face.map((a) => c[a])
      if (other === null || !presentsTriangles(other, oppositeFace(fi))) {
        // Pyramid: base = the face seen from the centre (its outward order reversed).
        push('pyramid5', [p[0], p[3], p[2], p[1], c[CELL_CENTRE]])
        return
      }
      // Two tetrahedra on the diagonal through the face's lowest and highest corner (the rule
      // every registry fill follows), each an outward triangle (a, b, c) + centre as [a, c, b, centre].
      const sums = face.map((a) => CORNER_OFFSET[a][0] + CORNER_OFFSET[a][1] + CORNER_OFFSET[a][2])
      const lo = sums.indexOf(Math.min(...sums))
      const tris = lo % 2 === 0 ? [[0, 1, 2], [0, 2, 3]] : [[1, 2, 3], [1, 3, 0]]
      for (const [a, b, cc] of tris) push('tet4', [p[a], p[cc], p[b], c[CELL_CENTRE]])
    })
  }
  const blocks = ELEMENT_TYPE_NAMES.filter((t) => lists.has(t)).map((t) => ({ type: t, conn: Int32Array.from(lists.get(t)!) }))
  checkConforming(coords, blocks, spec)
  if (!quadratic) return createMesh(coords, blocks as BlockInput[])
  const q = addMidEdgeNodesToBlocks(coords, blocks.map((b) => ({ type: quadraticTwin(b.type), conn: b.conn })))
  return createMesh(q.coords, q.blocks.sort((x, y) => ELEMENT_TYPES[x.type].code - ELEMENT_TYPES[y.type].code))
}

/**
 * The layout used by the tests and demos: cells with i < nx/2 (left) and the rest (right);
 * bottom layer hex8 | wedge6, then alternately transition | tet4 and tet4 | transition. With
 * nx ≥ 2 and nz ≥ 2 it holds hex8, pyramid5, tet4 and wedge6 (or, quadratic, hex20, pyramid13,
 * tet10 and wedge15), every pair meeting on the face kind they share.
 */
export function mixedLayout(spec: BoxSpec): (i: number, j: number, k: number) => CellFill {
  const half = Math.ceil(spec.nx / 2)
  return (i, _j, k) => {
    const left = i < half
    if (k === 0) return left ? 'hex8' : 'wedge6'
    return (k % 2 === 1) === left ? 'transition' : 'tet4'
  }
}

/** Cell face opposite face `f` (hex8 faces: bottom/top, then the four sides in turn). */
function oppositeFace(f: number): number {
  return f < 2 ? 1 - f : 2 + ((f - 2 + 2) % 4)
}

/** Whether a cell filled with `fill` shows two triangles (not one quadrilateral) on its face `f`. */
function presentsTriangles(fill: CellFill, f: number): boolean {
  if (fill === 'transition') return false
  const t = elementType(fill)
  const onFace = new Set(CELL_FACES[f])
  return t.cubeCells.some((cellNodes) => t.faces.some((face) => face.length === 3 && face.every((a) => onFace.has(cellNodes[a]))))
}

function checkConforming(coords: Float64Array, blocks: readonly { type: ElementTypeName; conn: Int32Array }[], spec: BoxSpec): void {
  const uses = new Map<string, number>()
  for (const b of blocks) {
    const t = elementType(b.type), nn = t.nodeCount
    for (let e = 0; e < b.conn.length / nn; e++) {
      for (const face of t.faces) {
        const key = face.map((a) => b.conn[e * nn + a]).sort((x, y) => x - y).join(',')
        uses.set(key, (uses.get(key) ?? 0) + 1)
      }
    }
  }
  const x0 = spec.x0 ?? 0, y0 = spec.y0 ?? 0, z0 = spec.z0 ?? 0
  const lo = [x0, y0, z0], hi = [x0 + spec.lx, y0 + spec.ly, z0 + spec.lz]
  const tol = 1e-12 * Math.max(spec.lx, spec.ly, spec.lz)
  for (const [key, n] of uses) {
    const nodes = key.split(',').map(Number)
    const onSurface = [0, 1, 2].some((d) => [lo[d], hi[d]].some((v) => nodes.every((p) => Math.abs(coords[3 * p + d] - v) <= tol)))
    if (n > 2 || (n === 1 && !onSurface)) {
      const where = nodes.map((p) => `(${coords[3 * p]}, ${coords[3 * p + 1]}, ${coords[3 * p + 2]})`).join(' ')
      throw new Error(`mixed mesh is not conforming: the face through ${where} belongs to ${n} element(s)`)
    }
  }
}
