/**
 * The record the element registry keeps per element type, and the two builders the family files
 * (tetrahedra.ts, hexahedra.ts, wedges.ts, pyramids.ts) use: a linear type is written out in
 * full; its quadratic twin is derived from it and the order of its mid-edge nodes, so faces,
 * edges, reference coordinates and the mirror permutation of quadratic types cannot disagree
 * with their corners.
 *
 * Local node numbers are 0-based here (the README states them 1-based). Faces list
 * their corners counter-clockwise seen from outside the element (the right-hand normal points
 * outward), then, for quadratic faces, the mid-edge nodes of edges (c0,c1) (c1,c2) (c2,c0) or
 * (c0,c1) (c1,c2) (c2,c3) (c3,c0).
 */
import type { FaceKind } from './faceKinds.ts'
import type { QuadratureRule } from './quadratureRules.ts'

export type RefPoint = readonly [number, number, number]

/**
 * A family's reference domain, in reference coordinates (ξ, η, ζ): its volume, its centroid
 * (where the inversion of an element's map starts), a projection into the closed domain (round-off
 * and points just outside an element land on its boundary), and the collapsed-cube map from
 * [0, 1]³ onto the domain (for sampling it evenly in tests; the collapsed quadrature rules are
 * built on the same map).
 */
export interface ReferenceDomain {
  /** The family's domain: tetrahedron, cube, wedge, pyramid. */
  readonly name: string
  readonly volume: number
  /** Reference centroid: the start point for inverting x(ξ) by Newton's method. */
  readonly centroid: readonly [number, number, number]
  /** Moves the reference point p (3 numbers, changed in place) into the closed domain. */
  clamp(p: Float64Array | number[]): void
  /** Writes the image of (u, v, w) ∈ [0, 1]³ to out (onto the domain; collapsed where it narrows). */
  fromUnitCube(out: Float64Array | number[], u: number, v: number, w: number): void
}

export interface ElementType<N extends string = string> {
  readonly name: N
  /** Small integer code for binary files and typed arrays. Never renumber. */
  readonly code: number
  readonly nodeCount: number
  readonly cornerCount: number
  readonly quadratic: boolean
  /** The linear type with the same corners (the type itself when it is linear). */
  readonly linear: string
  readonly domain: ReferenceDomain
  /** Faces as local node lists (corners first, then mid-edge nodes for quadratic faces). */
  readonly faces: readonly (readonly number[])[]
  readonly faceKinds: readonly FaceKind[]
  /** Corner edges [a, b, mid] with mid = local mid-edge node, or -1 for linear types. */
  readonly edges: readonly (readonly [number, number, number])[]
  /** Reference coordinates of every local node, [ξ, η, ζ] per node. */
  readonly refCoords: readonly RefPoint[]
  /**
   * Corner faces, 4 local corner numbers per face (-1 in the fourth for triangles): what the
   * signed-volume test (src/io/elementOrientation.ts) and the face matching read.
   */
  readonly cornerFaces: Int32Array
  /**
   * Local node permutation that mirrors the element, reversing its orientation: new local node
   * i = old local node mirror[i]. Mid-edge nodes follow their edges.
   */
  readonly mirror: readonly number[]
  /** Volume rule on the reference domain (read-only, shared). */
  readonly volumeRule: QuadratureRule
  /**
   * How elements of this type fill one cell of a structured grid, as lists of corners over the
   * cell's corners 0-7 (hex8 numbering: 0-3 bottom counter-clockwise seen from above, 4-7 above
   * them) and 8 = a node at the cell centre; every element positively oriented. A face of the
   * cell is either one quadrilateral or two triangles on the diagonal that joins its lowest and
   * its highest corner (smallest and largest i + j + k), so neighbouring cells always conform.
   * Quadratic types fill the cell like their linear type, with straight mid-edge nodes.
   */
  readonly cubeCells: readonly (readonly number[])[]
  /** Values of the shape functions at (ξ, η, ζ): out[a]. */
  shapeValues(xi: number, eta: number, zeta: number, out: Float64Array): Float64Array
  /** Derivatives dN_a/dξ_k at (ξ, η, ζ): out[3a + k]. */
  shapeDerivatives(xi: number, eta: number, zeta: number, out: Float64Array): Float64Array
}

type Shape = (xi: number, eta: number, zeta: number, out: Float64Array) => Float64Array

export interface LinearSpec<N extends string> {
  readonly name: N
  readonly code: number
  readonly domain: ReferenceDomain
  /** Reference coordinates of the corners. */
  readonly refCoords: readonly RefPoint[]
  /** Faces as corner lists, counter-clockwise seen from outside (3 → tri3, 4 → quad4). */
  readonly faces: readonly (readonly number[])[]
  /** Corner edges, in the order quadratic twins list their mid-edge nodes. */
  readonly edges: readonly (readonly [number, number])[]
  /** Corner permutation that reverses the orientation. */
  readonly mirror: readonly number[]
  readonly cubeCells: readonly (readonly number[])[]
  readonly volumeRule: QuadratureRule
  readonly shapeValues: Shape
  readonly shapeDerivatives: Shape
}

export function linearElement<N extends string>(s: LinearSpec<N>): ElementType<N> {
  const nc = s.refCoords.length
  checkPermutation(s.name, s.mirror, nc)
  for (const f of s.faces) if (f.length !== 3 && f.length !== 4) throw new Error(`${s.name}: a face has ${f.length} corners`)
  return {
    name: s.name, code: s.code, nodeCount: nc, cornerCount: nc, quadratic: false, linear: s.name,
    domain: s.domain,
    faces: s.faces,
    faceKinds: s.faces.map((f) => (f.length === 3 ? 'tri3' : 'quad4')),
    edges: s.edges.map(([a, b]) => [a, b, -1] as const),
    refCoords: s.refCoords,
    cornerFaces: cornerFaceTable(s.faces),
    mirror: s.mirror,
    volumeRule: s.volumeRule,
    cubeCells: s.cubeCells,
    shapeValues: s.shapeValues,
    shapeDerivatives: s.shapeDerivatives,
  }
}

export interface QuadraticSpec<N extends string> {
  readonly name: N
  readonly code: number
  readonly linear: ElementType
  readonly volumeRule: QuadratureRule
  readonly shapeValues: Shape
  readonly shapeDerivatives: Shape
}

/** The quadratic twin of a linear type: one mid-edge node per corner edge, in the edge order. */
export function quadraticElement<N extends string>(s: QuadraticSpec<N>): ElementType<N> {
  const lin = s.linear, nc = lin.cornerCount
  const midOf = (a: number, b: number): number => {
    const e = lin.edges.findIndex(([x, y]) => (x === a && y === b) || (x === b && y === a))
    if (e < 0) throw new Error(`${s.name}: (${a}, ${b}) is not an edge of ${lin.name}`)
    return nc + e
  }
  const corners = lin.refCoords
  const mids = lin.edges.map(([a, b]): RefPoint => [
    (corners[a][0] + corners[b][0]) / 2, (corners[a][1] + corners[b][1]) / 2, (corners[a][2] + corners[b][2]) / 2,
  ])
  const faces = lin.faces.map((f) => [...f, ...f.map((c, k) => midOf(c, f[(k + 1) % f.length]))])
  const cm = lin.mirror
  // New mid-edge node of edge (a, b) = the old one of the mirrored edge (cm[a], cm[b]).
  const mirror = [...cm, ...lin.edges.map(([a, b]) => midOf(cm[a], cm[b]))]
  checkPermutation(s.name, mirror, nc + lin.edges.length)
  return {
    name: s.name, code: s.code, nodeCount: nc + lin.edges.length, cornerCount: nc, quadratic: true, linear: lin.name,
    domain: lin.domain,
    faces,
    faceKinds: lin.faceKinds.map((k) => (k === 'tri3' ? 'tri6' : 'quad8')),
    edges: lin.edges.map(([a, b], e) => [a, b, nc + e] as const),
    refCoords: [...corners, ...mids],
    cornerFaces: lin.cornerFaces,
    mirror,
    volumeRule: s.volumeRule,
    cubeCells: lin.cubeCells,
    shapeValues: s.shapeValues,
    shapeDerivatives: s.shapeDerivatives,
  }
}

function cornerFaceTable(faces: readonly (readonly number[])[]): Int32Array {
  const t = new Int32Array(4 * faces.length).fill(-1)
  faces.forEach((f, i) => { for (let c = 0; c < f.length; c++) t[4 * i + c] = f[c] })
  return t
}

function checkPermutation(name: string, p: readonly number[], n: number): void {
  const seen = new Set(p)
  if (p.length !== n || seen.size !== n || p.some((x) => !(x >= 0 && x < n))) throw new Error(`${name}: the mirror permutation ${JSON.stringify(p)} is not a permutation of 0..${n - 1}`)
}
