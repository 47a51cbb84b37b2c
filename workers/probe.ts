/**
 * The probe: a pick ray from the scene is intersected here, in the worker, with the boundary faces
 * (flat triangles through the face corners, which is close enough to choose the face) and with the
 * section polygons; the stress at the hit is interpolated with the element's own shape functions
 * after inverting the isoparametric map (src/mechanics/mapInversion.ts).
 *
 * With the deformed shape on screen (ProbeRequest.deformScale s > 0) the ray meets the triangles
 * as drawn, every corner moved by s·u, and the hit's barycentric coordinates in the drawn
 * triangle give the material point in the undeformed one: the probe reads the material point
 * under the pointer, and every figure stays on the undeformed geometry.
 */
import { ELEMENT_TYPE_LIST, elementType, FACE_KINDS } from '../src/model/elementTypes.ts'
import { invertElementMap } from '../src/mechanics/mapInversion.ts'
import { vectorInElement } from '../src/mechanics/fieldAtPoint.ts'
import type { ElementTypeName } from '../src/model/elementTypes.ts'
import type { Mesh, Vec3 } from '../src/model/model.ts'
import { principalStresses, vonMises } from '../src/mechanics/invariants.ts'
import { elementIdOf } from '../src/model/elementId.ts'
import { makePlane, planeDistance } from '../src/mechanics/plane.ts'
import { sectionStressAt } from '../src/mechanics/sectionDrawing.ts'
import { nodalStressField } from '../src/model/stressField.ts'
import type { StressField } from '../src/model/stressField.ts'
import type { BoundaryFaces, SectionPlane, SectionPolygons } from '../src/mechanics/types.ts'
import type { ProbeRequest, ProbeResult } from './protocol.ts'

/** Corners per face kind code, from the element registry. */
const CORNERS_OF_KIND = FACE_KINDS.map((k) => k.cornerCount)

interface Hit { t: number; elem: number; normal: Vec3; where: 'surface' | 'section'; point: Vec3; polygon: number }

/** Barycentric (u, v) of the last hit of rayTriangle: the hit is a + u (b − a) + v (c − a). */
const BARY = new Float64Array(2)

/** Ray–triangle (Möller–Trumbore) on the corners a, b, c (3 numbers each at offsets ao, bo, co); t or Infinity; both sides count. */
function rayTriangle(o: Vec3, d: Vec3, x: ArrayLike<number>, ao: number, bo: number, co: number): number {
  const ax = x[ao], ay = x[ao + 1], az = x[ao + 2]
  const e1x = x[bo] - ax, e1y = x[bo + 1] - ay, e1z = x[bo + 2] - az
  const e2x = x[co] - ax, e2y = x[co + 1] - ay, e2z = x[co + 2] - az
  const px = d[1] * e2z - d[2] * e2y, py = d[2] * e2x - d[0] * e2z, pz = d[0] * e2y - d[1] * e2x
  const det = e1x * px + e1y * py + e1z * pz
  if (Math.abs(det) < 1e-300) return Infinity // ray parallel to the triangle
  const inv = 1 / det
  const sx = o[0] - ax, sy = o[1] - ay, sz = o[2] - az
  const u = (sx * px + sy * py + sz * pz) * inv
  if (u < 0 || u > 1) return Infinity
  const qx = sy * e1z - sz * e1y, qy = sz * e1x - sx * e1z, qz = sx * e1y - sy * e1x
  const v = (d[0] * qx + d[1] * qy + d[2] * qz) * inv
  if (v < 0 || u + v > 1) return Infinity
  const t = (e2x * qx + e2y * qy + e2z * qz) * inv
  if (!(t > 0)) return Infinity
  BARY[0] = u; BARY[1] = v
  return t
}

/** Nine numbers: the corners a, b, c of a triangle as drawn (undeformed, or moved by s·u). */
const TRI = new Float64Array(9)

function drawnCorners(x: Float64Array, u: Float64Array | null, s: number, a: number, b: number, c: number, uo: [number, number, number] | null = null): Float64Array {
  const idx = [a, b, c]
  for (let k = 0; k < 3; k++) {
    const n = idx[k], m = uo ? uo[k] : n
    for (let i = 0; i < 3; i++) TRI[3 * k + i] = x[3 * n + i] + (u && s !== 0 ? s * u[3 * m + i] : 0)
  }
  return TRI
}

/** The point a + u (b − a) + v (c − a) of the undeformed triangle a, b, c (node indices into x). */
function materialPoint(x: Float64Array, a: number, b: number, c: number, u: number, v: number): Vec3 {
  return [0, 1, 2].map((i) => x[3 * a + i] + u * (x[3 * b + i] - x[3 * a + i]) + v * (x[3 * c + i] - x[3 * a + i])) as Vec3
}

function hidden(p: Vec3, req: ProbeRequest, plane: SectionPlane | null): boolean {
  const s = req.section
  if (!s || !plane || s.hide === 'none') return false
  const side = planeDistance(plane, p[0], p[1], p[2])
  return s.hide === 'positive' ? side > 0 : side < 0
}

/** Point-in-polygon for a planar polygon, by projecting onto the plane's dominant axes. */
function insidePolygon(p: Vec3, pos: Float64Array, from: number, to: number, m: Vec3): boolean {
  const ax = Math.abs(m[0]), ay = Math.abs(m[1]), az = Math.abs(m[2])
  const i = ax >= ay && ax >= az ? 1 : 0
  const j = ax >= ay && ax >= az ? 2 : ay >= az ? 2 : 1
  let inside = false
  for (let a = from, b = to - 1; a < to; b = a++) {
    const ya = pos[3 * a + j], yb = pos[3 * b + j]
    if ((ya > p[j]) !== (yb > p[j])) {
      const xc = pos[3 * a + i] + ((p[j] - ya) / (yb - ya)) * (pos[3 * b + i] - pos[3 * a + i])
      if (p[i] < xc) inside = !inside
    }
  }
  return inside
}

function blockOf(mesh: Mesh, g: number): { type: ElementTypeName; conn: Int32Array; local: number; index: number } | null {
  for (let i = 0; i < mesh.blocks.length; i++) {
    const b = mesh.blocks[i], count = b.ids.length
    if (g >= b.offset && g < b.offset + count) return { type: b.type, conn: b.conn, local: g - b.offset, index: i }
  }
  return null
}

const N = new Float64Array(Math.max(...ELEMENT_TYPE_LIST.map((t) => t.nodeCount))), R = new Float64Array(3)

/**
 * Stress (6) at point p inside element g: the element's map inverted by the one inversion of the
 * house (src/mechanics/mapInversion.ts: Newton from the reference centroid, every iterate kept in
 * the closed domain), then Σ Nₐ σₐ. If p lies just outside the element (a pick on a flat triangle
 * through a curved face), the inversion ends on the element's boundary nearest to it, which
 * gives a value from that element. An unknown type is an error.
 */
export function stressInElement(mesh: Mesh, stress: Float64Array | StressField, g: number, p: Vec3, out: Float64Array, outDisplacement: Float64Array | null = null, displacement: Float64Array | null = null): void {
  const blk = blockOf(mesh, g)
  if (!blk) throw new RangeError(`element index ${g} is not in the mesh (${mesh.elementCount} elements)`)
  out.fill(0)
  const topo = elementType(blk.type)
  const nn = topo.nodeCount
  const base = blk.local * nn
  invertElementMap(R, topo, mesh.coords, blk.conn, base, p[0], p[1], p[2])
  topo.shapeValues(R[0], R[1], R[2], N)
  // --- element-nodal: the element's own values through the field's rows (nodal: the connectivity) ---
  const values = stress instanceof Float64Array ? stress : stress.values
  const rows = stress instanceof Float64Array ? blk.conn : stress.rows[blk.index]
  for (let a = 0; a < nn; a++) {
    const n = rows[base + a]
    for (let k = 0; k < 6; k++) out[k] += N[a] * values[6 * n + k]
  }
  if (outDisplacement && displacement) vectorInElement(outDisplacement, 0, mesh, displacement, blk.index, blk.local, R)
}

/**
 * Finds what the ray hits first (visible surface or section face) and reads the stress there.
 * `displacement` (3N) and `polygonDisplacement` (3 per section polygon vertex) serve the
 * deformed shape and the displacement read-out; null without displacement.
 */
export function probeModel(
  mesh: Mesh, stress: Float64Array | StressField, faces: BoundaryFaces,
  polygons: SectionPolygons | null, req: ProbeRequest,
  displacement: Float64Array | null = null, polygonDisplacement: Float64Array | null = null,
): ProbeResult | null {
  const o = req.ray.origin
  const dl = Math.hypot(...req.ray.direction)
  // A pick ray is not user input: one without a direction hits nothing.
  if (!(dl > 0) || !o.every(Number.isFinite)) return null
  // The section plane by the one plane rule (a zero or non-finite normal is an InputError).
  const plane = req.section ? makePlane(req.section.plane.point, req.section.plane.normal) : null
  const d: Vec3 = [req.ray.direction[0] / dl, req.ray.direction[1] / dl, req.ray.direction[2] / dl]
  const x = mesh.coords
  const scale = displacement && Number.isFinite(req.deformScale) ? req.deformScale ?? 0 : 0
  let best: Hit | null = null
  const at = (t: number): Vec3 => [o[0] + t * d[0], o[1] + t * d[1], o[2] + t * d[2]]
  const nodes = faces.nodes
  for (let f = 0; f < faces.count; f++) {
    const s = f * faces.slots
    const nc = CORNERS_OF_KIND[faces.kind[f]]
    // Corner triangles (0, 1, 2) and, for a quadrilateral, (0, 2, 3).
    for (let k = 1; k + 1 < nc; k++) {
      const a = nodes[s], b = nodes[s + k], c = nodes[s + k + 1]
      const t = rayTriangle(o, d, drawnCorners(x, displacement, scale, a, b, c), 0, 3, 6)
      if (!(t < (best?.t ?? Infinity))) continue
      const p = materialPoint(x, a, b, c, BARY[0], BARY[1])
      // The cut hides material points (the shader clips the undeformed position).
      if (hidden(p, req, plane)) continue
      best = { t, elem: faces.elem[f], normal: [faces.normal[3 * f], faces.normal[3 * f + 1], faces.normal[3 * f + 2]], where: 'surface', point: p, polygon: -1 }
    }
  }
  if (plane && polygons && polygons.count > 0) {
    const m = plane.normal
    if (scale !== 0 && polygonDisplacement) {
      // The drawn section face is no longer flat: its fan triangles, moved.
      const pos = polygons.positions, uo: [number, number, number] = [0, 0, 0]
      for (let q = 0; q < polygons.count; q++) {
        const v0 = polygons.start[q]
        for (let v = v0 + 1; v + 1 < polygons.start[q + 1]; v++) {
          uo[0] = v0; uo[1] = v; uo[2] = v + 1
          const t = rayTriangle(o, d, drawnCorners(pos, polygonDisplacement, scale, v0, v, v + 1, uo), 0, 3, 6)
          if (!(t < (best?.t ?? Infinity))) continue
          best = { t, elem: polygons.elem[q], normal: [m[0], m[1], m[2]], where: 'section', point: materialPoint(pos, v0, v, v + 1, BARY[0], BARY[1]), polygon: q }
        }
      }
    } else {
      const denom = d[0] * m[0] + d[1] * m[1] + d[2] * m[2]
      if (Math.abs(denom) > 1e-12) {
        const t = -planeDistance(plane, o[0], o[1], o[2]) / denom
        if (t > 0 && t < (best?.t ?? Infinity)) {
          const p = at(t)
          for (let q = 0; q < polygons.count; q++) {
            if (insidePolygon(p, polygons.positions, polygons.start[q], polygons.start[q + 1], m)) {
              best = { t, elem: polygons.elem[q], normal: [m[0], m[1], m[2]], where: 'section', point: p, polygon: q }
              break
            }
          }
        }
      }
    }
  }
  if (!best) return null
  const p = best.point
  const s = new Float64Array(6)
  const u = displacement ? new Float64Array(3) : null
  stressInElement(mesh, stress, best.elem, p, s, u, displacement)
  // on the section: the same shape functions and reference coordinates the section's fill and
  // resultant use (sectionDrawing.ts), so the probe reads what the colours show
  if (best.where === 'section' && polygons) sectionStressAt(s, mesh, stress instanceof Float64Array ? nodalStressField(mesh, stress) : stress, polygons, best.polygon, p)
  const pr = new Float64Array(3)
  principalStresses(s, pr)
  const n = best.normal
  const tx = s[0] * n[0] + s[3] * n[1] + s[5] * n[2]
  const ty = s[3] * n[0] + s[1] * n[1] + s[4] * n[2]
  const tz = s[5] * n[0] + s[4] * n[1] + s[2] * n[2]
  const tn = tx * n[0] + ty * n[1] + tz * n[2]
  const shear = Math.hypot(tx - tn * n[0], ty - tn * n[1], tz - tn * n[2])
  return {
    where: best.where,
    position: p,
    elementId: elementIdOf(mesh, best.elem),
    stress: [s[0], s[1], s[2], s[3], s[4], s[5]],
    principal: [pr[0], pr[1], pr[2]],
    vonMises: vonMises(s),
    normal: n,
    traction: [tx, ty, tz],
    normalTraction: tn,
    shearTraction: shear,
    ...(u ? { displacement: [u[0], u[1], u[2]] as Vec3 } : {}),
  }
}
