/**
 * Element topology tables. Local node numbers are 0-based here; DESIGN.md states them 1-based.
 *
 * Corner numbering (positive volume):
 * - tet4: (x1-x0)×(x2-x0)·(x3-x0) > 0.
 * - hex8: bottom face 0-1-2-3 counter-clockwise seen from the top face, 4-7 above 0-3.
 * - wedge6: triangle 0-1-2 counter-clockwise seen from above, 3-5 above it.
 * Quadratic types list their mid-edge nodes after the corners, on the edges named in `midEdges`.
 *
 * Faces list their corners counter-clockwise seen from outside the element (so the right-hand
 * normal points outward), then, for quadratic faces, the mid-edge nodes of edges
 * (c0,c1) (c1,c2) (c2,c0) or (c0,c1) (c1,c2) (c2,c3) (c3,c0).
 */

export type ElementTypeName = 'tet4' | 'tet10' | 'hex8' | 'hex20' | 'wedge6'
export type FaceKind = 'tri3' | 'tri6' | 'quad4' | 'quad8'

export interface ElementTopology {
  readonly name: ElementTypeName
  /** Small integer code used in binary files and typed arrays. Never renumber. */
  readonly code: number
  readonly nodeCount: number
  readonly cornerCount: number
  readonly quadratic: boolean
  /** Faces as local node lists (corners first, then mid-edge nodes for quadratic faces). */
  readonly faces: readonly (readonly number[])[]
  readonly faceKinds: readonly FaceKind[]
  /** Corner edges [a, b, mid] with mid = local mid-edge node or -1 for linear types. */
  readonly edges: readonly (readonly [number, number, number])[]
  /** Reference coordinates of every local node, [ξ, η, ζ] per node. */
  readonly refCoords: readonly (readonly [number, number, number])[]
}

export const FACE_NODE_COUNT: Readonly<Record<FaceKind, number>> = { tri3: 3, tri6: 6, quad4: 4, quad8: 8 }
export const FACE_CORNER_COUNT: Readonly<Record<FaceKind, number>> = { tri3: 3, tri6: 3, quad4: 4, quad8: 4 }
/** Numeric codes for face kinds, used in typed arrays. */
export const FACE_KIND_CODE: Readonly<Record<FaceKind, number>> = { tri3: 0, tri6: 1, quad4: 2, quad8: 3 }
export const FACE_KIND_BY_CODE: readonly FaceKind[] = ['tri3', 'tri6', 'quad4', 'quad8']

const TET_CORNERS: [number, number, number][] = [[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1]]
const HEX_CORNERS: [number, number, number][] = [
  [-1, -1, -1], [1, -1, -1], [1, 1, -1], [-1, 1, -1],
  [-1, -1, 1], [1, -1, 1], [1, 1, 1], [-1, 1, 1],
]
const WEDGE_CORNERS: [number, number, number][] = [
  [0, 0, -1], [1, 0, -1], [0, 1, -1], [0, 0, 1], [1, 0, 1], [0, 1, 1],
]

const mid = (c: [number, number, number][], a: number, b: number): [number, number, number] =>
  [(c[a][0] + c[b][0]) / 2, (c[a][1] + c[b][1]) / 2, (c[a][2] + c[b][2]) / 2]

const TET10_MID: [number, number][] = [[0, 1], [1, 2], [2, 0], [0, 3], [1, 3], [2, 3]]
const HEX20_MID: [number, number][] = [
  [0, 1], [1, 2], [2, 3], [3, 0], [4, 5], [5, 6], [6, 7], [7, 4], [0, 4], [1, 5], [2, 6], [3, 7],
]

const TET4: ElementTopology = {
  name: 'tet4', code: 1, nodeCount: 4, cornerCount: 4, quadratic: false,
  faces: [[0, 2, 1], [0, 1, 3], [1, 2, 3], [0, 3, 2]],
  faceKinds: ['tri3', 'tri3', 'tri3', 'tri3'],
  edges: [[0, 1, -1], [1, 2, -1], [2, 0, -1], [0, 3, -1], [1, 3, -1], [2, 3, -1]],
  refCoords: TET_CORNERS,
}

const TET10: ElementTopology = {
  name: 'tet10', code: 2, nodeCount: 10, cornerCount: 4, quadratic: true,
  faces: [[0, 2, 1, 6, 5, 4], [0, 1, 3, 4, 8, 7], [1, 2, 3, 5, 9, 8], [0, 3, 2, 7, 9, 6]],
  faceKinds: ['tri6', 'tri6', 'tri6', 'tri6'],
  edges: [[0, 1, 4], [1, 2, 5], [2, 0, 6], [0, 3, 7], [1, 3, 8], [2, 3, 9]],
  refCoords: [...TET_CORNERS, ...TET10_MID.map(([a, b]) => mid(TET_CORNERS, a, b))],
}

const HEX8: ElementTopology = {
  name: 'hex8', code: 3, nodeCount: 8, cornerCount: 8, quadratic: false,
  faces: [[0, 3, 2, 1], [4, 5, 6, 7], [0, 1, 5, 4], [1, 2, 6, 5], [2, 3, 7, 6], [3, 0, 4, 7]],
  faceKinds: ['quad4', 'quad4', 'quad4', 'quad4', 'quad4', 'quad4'],
  edges: HEX20_MID.map(([a, b]) => [a, b, -1] as const),
  refCoords: HEX_CORNERS,
}

const HEX20: ElementTopology = {
  name: 'hex20', code: 4, nodeCount: 20, cornerCount: 8, quadratic: true,
  faces: [
    [0, 3, 2, 1, 11, 10, 9, 8], [4, 5, 6, 7, 12, 13, 14, 15], [0, 1, 5, 4, 8, 17, 12, 16],
    [1, 2, 6, 5, 9, 18, 13, 17], [2, 3, 7, 6, 10, 19, 14, 18], [3, 0, 4, 7, 11, 16, 15, 19],
  ],
  faceKinds: ['quad8', 'quad8', 'quad8', 'quad8', 'quad8', 'quad8'],
  edges: HEX20_MID.map(([a, b], i) => [a, b, 8 + i] as const),
  refCoords: [...HEX_CORNERS, ...HEX20_MID.map(([a, b]) => mid(HEX_CORNERS, a, b))],
}

const WEDGE6: ElementTopology = {
  name: 'wedge6', code: 5, nodeCount: 6, cornerCount: 6, quadratic: false,
  faces: [[0, 2, 1], [3, 4, 5], [0, 1, 4, 3], [1, 2, 5, 4], [2, 0, 3, 5]],
  faceKinds: ['tri3', 'tri3', 'quad4', 'quad4', 'quad4'],
  edges: [[0, 1, -1], [1, 2, -1], [2, 0, -1], [3, 4, -1], [4, 5, -1], [5, 3, -1], [0, 3, -1], [1, 4, -1], [2, 5, -1]],
  refCoords: WEDGE_CORNERS,
}

export const ELEMENT_TYPES: Readonly<Record<ElementTypeName, ElementTopology>> = {
  tet4: TET4, tet10: TET10, hex8: HEX8, hex20: HEX20, wedge6: WEDGE6,
}

export const ELEMENT_TYPE_NAMES: readonly ElementTypeName[] = ['tet4', 'tet10', 'hex8', 'hex20', 'wedge6']

export const ELEMENT_TYPE_BY_CODE: readonly (ElementTopology | undefined)[] = (() => {
  const out: (ElementTopology | undefined)[] = []
  for (const t of Object.values(ELEMENT_TYPES)) out[t.code] = t
  return out
})()

export function isElementTypeName(s: string): s is ElementTypeName {
  return Object.prototype.hasOwnProperty.call(ELEMENT_TYPES, s)
}
