/**
 * The deformed shape as drawn: every point x moves to x + s·u, with u the displacement (model
 * length units) and s a dimensionless scale factor, because real displacements are far too small
 * to see. Only the drawing moves: every computation stays on the undeformed geometry
 * (small-deformation theory, the theory the stress result itself rests on).
 *
 * The automatic scale draws the largest displacement as 5 % of the model's diagonal:
 * s = 0.05·D / max|u| (common practice for a readable picture; 0 when nothing moves).
 *
 * Layouts: nodal displacement Float64Array(3N); per-vertex arrays 3 numbers per vertex.
 */
import { elementType, FACE_KINDS } from '../model/elementTypes.ts'
import type { Mesh } from '../model/model.ts'
import { surfaceVertexCount } from './componentScalars.ts'
import { vectorInElement } from './fieldAtPoint.ts'
import { invertElementMap } from './mapInversion.ts'
import type { BoundaryFaces, SectionPolygons } from './types.ts'

/** Largest displacement drawn by the automatic scale, as a fraction of the model diagonal. */
export const AUTO_DEFORMATION_FRACTION = 0.05

/** Largest |u| over the nodes (length units); 0 for none, NaN entries skipped. */
export function maxDisplacement(u: ArrayLike<number>): number {
  let m = 0
  for (let i = 0; i + 2 < u.length; i += 3) {
    const l = u[i] * u[i] + u[i + 1] * u[i + 1] + u[i + 2] * u[i + 2]
    if (l > m) m = l
  }
  return Math.sqrt(m)
}

/** The automatic scale factor (dimensionless): 5 % of `diagonal` over the largest displacement. */
export function autoDeformationScale(maxU: number, diagonal: number): number {
  return maxU > 0 && Number.isFinite(maxU) && diagonal > 0 ? (AUTO_DEFORMATION_FRACTION * diagonal) / maxU : 0
}

/** out = points + scale·u, point by point (3 per point); a NaN stays NaN. out may alias points. */
export function deformPoints<T extends Float32Array | Float64Array>(out: T, points: ArrayLike<number>, u: ArrayLike<number>, scale: number): T {
  for (let i = 0; i < points.length; i++) out[i] = points[i] + scale * u[i]
  return out
}

const NODES_OF_KIND = FACE_KINDS.map((k) => k.nodeCount)

/**
 * The nodal displacement on the surface vertices of `faces` (per face node, in the layout of
 * buildSurfaceTriangles): Float32Array(3V), length units, what the surface shader adds.
 */
export function surfaceDisplacement(faces: BoundaryFaces, u: Float64Array): Float32Array {
  const out = new Float32Array(3 * surfaceVertexCount(faces))
  let v = 0
  for (let f = 0; f < faces.count; f++) {
    const nv = NODES_OF_KIND[faces.kind[f]], base = f * faces.slots
    for (let a = 0; a < nv; a++, v++) {
      const n = 3 * faces.nodes[base + a]
      out[3 * v] = u[n]; out[3 * v + 1] = u[n + 1]; out[3 * v + 2] = u[n + 2]
    }
  }
  return out
}

/** A nodal vector field gathered at a list of nodes (3 per node): Float32Array(3·nodes.length). */
export function gatherNodalVectors(nodes: Int32Array, u: Float64Array): Float32Array {
  const out = new Float32Array(3 * nodes.length)
  for (let i = 0; i < nodes.length; i++) {
    const n = 3 * nodes[i]
    out[3 * i] = u[n]; out[3 * i + 1] = u[n + 1]; out[3 * i + 2] = u[n + 2]
  }
  return out
}

const XI = new Float64Array(3)

/**
 * The displacement at the vertices of section polygons (3 per vertex, in the order of
 * `polygons.positions`, length units): each vertex lies in its polygon's element, so the
 * element's map is inverted there (mapInversion.ts) and the nodal displacement interpolated with
 * its shape functions. What the deformed section face is drawn with.
 */
export function displacementOnPolygons(mesh: Mesh, u: Float64Array, polygons: SectionPolygons): Float64Array {
  const P = polygons.count
  const V = P > 0 ? polygons.start[P] : 0
  const out = new Float64Array(3 * V)
  const x = polygons.positions
  for (let p = 0; p < P; p++) {
    const e = polygons.elem[p]
    let b = 0
    while (b + 1 < mesh.blocks.length && e >= mesh.blocks[b + 1].offset) b++
    const blk = mesh.blocks[b], topo = elementType(blk.type), local = e - blk.offset
    for (let v = polygons.start[p]; v < polygons.start[p + 1]; v++) {
      invertElementMap(XI, topo, mesh.coords, blk.conn, local * topo.nodeCount, x[3 * v], x[3 * v + 1], x[3 * v + 2])
      vectorInElement(out, 3 * v, mesh, u, b, local, XI)
    }
  }
  return out
}

/** Mean of a per-vertex vector (3 per vertex) over each listed item's vertices start[item] .. start[item + 1] − 1: Float32Array(3·items.length). */
export function meanOverItems(items: Int32Array, start: ArrayLike<number>, vertexVectors: ArrayLike<number>): Float32Array {
  const out = new Float32Array(3 * items.length)
  for (let i = 0; i < items.length; i++) {
    const a = start[items[i]], b = start[items[i] + 1]
    let sx = 0, sy = 0, sz = 0
    for (let v = a; v < b; v++) { sx += vertexVectors[3 * v]; sy += vertexVectors[3 * v + 1]; sz += vertexVectors[3 * v + 2] }
    const n = Math.max(1, b - a)
    out[3 * i] = sx / n; out[3 * i + 1] = sy / n; out[3 * i + 2] = sz / n
  }
  return out
}

/** Mean of a nodal vector field (3N) over the nodes of each listed boundary face: Float32Array(3·items.length). */
export function faceMeanVectors(faces: BoundaryFaces, u: Float64Array, items: Int32Array): Float32Array {
  const out = new Float32Array(3 * items.length)
  for (let i = 0; i < items.length; i++) {
    const f = items[i], nv = NODES_OF_KIND[faces.kind[f]], base = f * faces.slots
    let sx = 0, sy = 0, sz = 0
    for (let a = 0; a < nv; a++) {
      const n = 3 * faces.nodes[base + a]
      sx += u[n]; sy += u[n + 1]; sz += u[n + 2]
    }
    out[3 * i] = sx / nv; out[3 * i + 1] = sy / nv; out[3 * i + 2] = sz / nv
  }
  return out
}
