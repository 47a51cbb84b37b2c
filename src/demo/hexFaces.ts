import { ELEMENT_TYPES } from '../model/elementTypes.ts'

/**
 * Boundary faces of a hex8 mesh: faces held by exactly one element, as 4 corner nodes each,
 * counter-clockwise seen from outside (so the right-hand normal points out of the body),
 * with the element that owns each face.
 */
export interface HexFaces {
  readonly count: number
  /** Int32Array(4·count) node indices. */
  readonly nodes: Int32Array
  /** Int32Array(count) element index. */
  readonly elem: Int32Array
}

const HEX_FACES = ELEMENT_TYPES.hex8.faces

/**
 * Finds the boundary faces. A quad face of a conforming hex mesh is known by its smallest node
 * and the node diagonally opposite it (two faces never share a diagonal), which makes a numeric
 * key below 2^53 for any mesh under 90 million nodes.
 */
export function hexBoundaryFaces(conn: Int32Array, nodeCount: number): HexFaces {
  const elements = conn.length / 8
  const seen = new Map<number, number>()
  for (let e = 0; e < elements; e++) for (let f = 0; f < 6; f++) {
    const key = faceKey(conn, e, f, nodeCount)
    const k = e * 6 + f
    if (seen.has(key)) seen.delete(key)
    else seen.set(key, k)
  }
  const count = seen.size
  const nodes = new Int32Array(4 * count), elem = new Int32Array(count)
  let i = 0
  for (const k of seen.values()) {
    const e = Math.floor(k / 6), face = HEX_FACES[k % 6]
    for (let c = 0; c < 4; c++) nodes[4 * i + c] = conn[8 * e + face[c]]
    elem[i++] = e
  }
  return { count, nodes, elem }
}

function faceKey(conn: Int32Array, e: number, f: number, nodeCount: number): number {
  const face = HEX_FACES[f]
  let best = 0, min = conn[8 * e + face[0]]
  for (let c = 1; c < 4; c++) {
    const n = conn[8 * e + face[c]]
    if (n < min) { min = n; best = c }
  }
  return min * nodeCount + conn[8 * e + face[(best + 2) % 4]]
}

/** Faces (subset of `faces`) whose 4 nodes all satisfy `test(x, y, z)`. */
export function selectFaces(faces: HexFaces, coords: Float64Array, test: (x: number, y: number, z: number) => boolean): HexFaces {
  const keep: number[] = []
  for (let i = 0; i < faces.count; i++) {
    let ok = true
    for (let c = 0; c < 4 && ok; c++) {
      const n = faces.nodes[4 * i + c]
      ok = test(coords[3 * n], coords[3 * n + 1], coords[3 * n + 2])
    }
    if (ok) keep.push(i)
  }
  const nodes = new Int32Array(4 * keep.length), elem = new Int32Array(keep.length)
  keep.forEach((f, i) => { nodes.set(faces.nodes.subarray(4 * f, 4 * f + 4), 4 * i); elem[i] = faces.elem[f] })
  return { count: keep.length, nodes, elem }
}
