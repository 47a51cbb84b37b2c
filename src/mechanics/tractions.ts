/**
 * Surface tractions on boundary faces by Cauchy's formula t = σn (n outward unit normal).
 *
 * At each face node the normal comes from the face's own shape functions at that node
 * (t_u × t_v), so the nodes of a curved quadratic face each get their own normal, and σ is that
 * node's stress row, read through the field's element-node index (the face's element and local
 * node numbers give the row), so nodal and element-nodal stress take one path. Face integrals use
 * the face quadrature (faceQuadraturePoint.ts) with σ interpolated by the face shape functions and
 * the area element |t_u × t_v| du dv. Where the area element is constant
 * (flat triangles, parallelograms) force and moment are exact: σ·x is at most degree 4 on a tri6
 * (degree-4 rule) and degree 4 per direction on a quad8 (3×3 Gauss, exact to 5). Curved faces are
 * integrated to the rule's accuracy. The means of |τ| and |t| are not polynomial and are
 * quadrature approximations.
 *
 * `computeSurfaceTractions(out, mesh, stress, faces)` fills a record from
 * `allocateSurfaceTractions(faces)` (layout in types.ts: SurfaceTractions) and returns it.
 */
import type { Mesh } from '../model/model.ts'
import { ELEMENT_TYPES, FACE_KIND_BY_CODE } from '../model/elementTypes.ts'
import { checkStressField } from '../model/stressField.ts'
import type { StressField } from '../model/stressField.ts'
import { faceQuadratureTables } from './boundaryFaces.ts'
import { FQP_AREA, FQP_SIZE, FQP_STRESS, FQP_X, createFacePoints, faceQuadraturePoints } from './faceQuadraturePoint.ts'
import { tabulateFace } from './shapeFunctions.ts'
import type { FaceTable } from './shapeFunctions.ts'
import { FACE_SLOTS } from './types.ts'
import type { BoundaryFaces, SurfaceTractions } from './types.ts'

/** t = σn for one stress 6-vector (xx, yy, zz, xy, yz, xz) and a vector n; writes out3. */
export function tractionAt(out3: Float64Array | number[], s6: ArrayLike<number>, n3: ArrayLike<number>): Float64Array | number[] {
  const nx = n3[0], ny = n3[1], nz = n3[2]
  out3[0] = s6[0] * nx + s6[3] * ny + s6[5] * nz
  out3[1] = s6[3] * nx + s6[1] * ny + s6[4] * nz
  out3[2] = s6[5] * nx + s6[4] * ny + s6[2] * nz
  return out3
}

let nodeTables: FaceTable[] | null = null
/** Face shape derivatives at each face's own nodes, indexed by face kind code. */
export function faceNodeTables(): FaceTable[] {
  if (!nodeTables) nodeTables = FACE_KIND_BY_CODE.map((k) => tabulateFace(k, null))
  return nodeTables
}

/** Fresh output arrays for the faces (see SurfaceTractions). */
export function allocateSurfaceTractions(faces: BoundaryFaces): SurfaceTractions {
  const F = faces.count, S = faces.slots
  return {
    nodeNormal: new Float64Array(3 * S * F), nodeTraction: new Float64Array(3 * S * F),
    nodeNormalTraction: new Float64Array(S * F), nodeShear: new Float64Array(S * F), nodeMagnitude: new Float64Array(S * F),
    force: new Float64Array(3 * F), moment: new Float64Array(3 * F),
    meanNormal: new Float64Array(F), meanShear: new Float64Array(F), meanMagnitude: new Float64Array(F),
  }
}

/** Local node numbers of every face of a type, FACE_SLOTS per face (face order, then unused). */
function localFaceNodes(faces: readonly (readonly number[])[]): Int32Array {
  const t = new Int32Array(FACE_SLOTS * faces.length)
  faces.forEach((f, i) => t.set(f, FACE_SLOTS * i))
  return t
}

/**
 * Fills `out` with the tractions on `faces` (boundary faces of `mesh`) from `stress`; every slot
 * is written, unused slots NaN, so `out` may be reused. Returns `out`.
 */
export function computeSurfaceTractions(out: SurfaceTractions, mesh: Mesh, stress: StressField, faces: BoundaryFaces): SurfaceTractions {
  const F = faces.count
  const coords = mesh.coords, values = stress.values
  const kind = faces.kind, nodes = faces.nodes, elem = faces.elem, localFace = faces.localFace
  const S = faces.slots
  if (out.force.length < 3 * F || out.meanMagnitude.length < F || out.nodeNormal.length < 3 * S * F || out.nodeMagnitude.length < S * F) {
    throw new RangeError(`traction output holds ${out.meanMagnitude.length} faces, there are ${F} (${S} slots each)`)
  }
  checkStressField(mesh, stress)
  const { nodeNormal, nodeTraction, nodeNormalTraction, nodeShear, nodeMagnitude, force, moment, meanNormal, meanShear, meanMagnitude } = out

  const nodeTabs = faceNodeTables(), quadTabs = faceQuadratureTables()
  // Imported names once into locals: where tsx compiles the modules to CommonJS (a script run
  // from outside the project, DEVELOPERS.md) every use of an imported binding is a getter call.
  const points = faceQuadraturePoints, X = FQP_X, AREA = FQP_AREA, STRESS = FQP_STRESS, SIZE = FQP_SIZE, SLOTS = FACE_SLOTS
  const xs = new Float64Array(3 * S), ss = new Float64Array(6 * S)
  const qp = createFacePoints(quadTabs), np = createFacePoints(nodeTabs)
  const blocks = mesh.blocks
  const faceLocal = blocks.map((b) => localFaceNodes(ELEMENT_TYPES[b.type].faces))
  const nodesPer = blocks.map((b) => ELEMENT_TYPES[b.type].nodeCount)
  let bi = 0

  for (let f = 0; f < F; f++) {
    const kc = kind[f]
    const o = S * f
    const nt = nodeTabs[kc], qt = quadTabs[kc]
    const nn = nt.nodeCount
    // The face's block: faces come in element order (extractBoundaryFaces), so the cursor only
    // moves on; any other order starts it over.
    const g = elem[f]
    if (g < blocks[bi].offset) bi = 0
    while (g >= blocks[bi].offset + blocks[bi].ids.length) {
      if (++bi === blocks.length) throw new RangeError(`face ${f} names element index ${g}, outside the mesh`)
    }
    const rows = stress.rows[bi], fl = faceLocal[bi], lo = SLOTS * localFace[f]
    const rb = (g - blocks[bi].offset) * nodesPer[bi]
    for (let a = 0; a < nn; a++) {
      const p = nodes[o + a], r = 6 * rows[rb + fl[lo + a]]
      xs[3 * a] = coords[3 * p]; xs[3 * a + 1] = coords[3 * p + 1]; xs[3 * a + 2] = coords[3 * p + 2]
      for (let c = 0; c < 6; c++) ss[6 * a + c] = values[r + c]
    }

    // Node slots: normal from the face tangents at the node, traction from the node's stress.
    points(np, nt, xs, null, false)
    for (let b = 0; b < nn; b++) {
      const r = SIZE * b
      let nx = np[r + AREA], ny = np[r + AREA + 1], nz = np[r + AREA + 2]
      const len = Math.sqrt(nx * nx + ny * ny + nz * nz)
      // A degenerate corner (collapsed edge) has no tangent plane: fall back to the face's mean normal.
      if (len > 0) { nx /= len; ny /= len; nz /= len } else { nx = faces.normal[3 * f]; ny = faces.normal[3 * f + 1]; nz = faces.normal[3 * f + 2] }
      const sb = 6 * b
      const sxx = ss[sb], syy = ss[sb + 1], szz = ss[sb + 2], sxy = ss[sb + 3], syz = ss[sb + 4], sxz = ss[sb + 5]
      const tx = sxx * nx + sxy * ny + sxz * nz
      const ty = sxy * nx + syy * ny + syz * nz
      const tz = sxz * nx + syz * ny + szz * nz
      const tn = tx * nx + ty * ny + tz * nz
      const t2 = tx * tx + ty * ty + tz * tz
      const slot = o + b
      nodeNormal[3 * slot] = nx; nodeNormal[3 * slot + 1] = ny; nodeNormal[3 * slot + 2] = nz
      nodeTraction[3 * slot] = tx; nodeTraction[3 * slot + 1] = ty; nodeTraction[3 * slot + 2] = tz
      nodeNormalTraction[slot] = tn
      // |t - t_n n| directly: √(|t|² - t_n²) loses half the digits when the shear is small.
      const qx = tx - tn * nx, qy = ty - tn * ny, qz = tz - tn * nz
      nodeShear[slot] = Math.sqrt(qx * qx + qy * qy + qz * qz)
      nodeMagnitude[slot] = Math.sqrt(t2)
    }
    // Unused slots of a smaller face than the stride: NaN, so nothing reads them as values.
    for (let b = nn; b < S; b++) {
      const slot = o + b
      nodeNormal[3 * slot] = nodeNormal[3 * slot + 1] = nodeNormal[3 * slot + 2] = NaN
      nodeTraction[3 * slot] = nodeTraction[3 * slot + 1] = nodeTraction[3 * slot + 2] = NaN
      nodeNormalTraction[slot] = nodeShear[slot] = nodeMagnitude[slot] = NaN
    }

    // Face integrals.
    const W = qt.weights, nq = qt.pointCount
    let fx = 0, fy = 0, fz = 0, mx = 0, my = 0, mz = 0, A = 0, In = 0, Is = 0, Im = 0
    points(qp, qt, xs, ss, true)
    for (let q = 0; q < nq; q++) {
      const r = SIZE * q, w = W[q]
      // c = t_u × t_v carries both the normal direction and the area element.
      const cx = qp[r + AREA], cy = qp[r + AREA + 1], cz = qp[r + AREA + 2]
      const J = Math.sqrt(cx * cx + cy * cy + cz * cz)
      if (J === 0) continue // degenerate point: contributes no area
      const dA = J * w
      const nx = cx / J, ny = cy / J, nz = cz / J
      const sxx = qp[r + STRESS], syy = qp[r + STRESS + 1], szz = qp[r + STRESS + 2]
      const sxy = qp[r + STRESS + 3], syz = qp[r + STRESS + 4], sxz = qp[r + STRESS + 5]
      const tx = sxx * nx + sxy * ny + sxz * nz
      const ty = sxy * nx + syy * ny + syz * nz
      const tz = sxz * nx + syz * ny + szz * nz
      const tn = tx * nx + ty * ny + tz * nz
      const t2 = tx * tx + ty * ty + tz * tz
      const px = qp[r + X], py = qp[r + X + 1], pz = qp[r + X + 2]
      fx += tx * dA; fy += ty * dA; fz += tz * dA
      // x × t in scalar locals (see vec3.ts): this is the innermost loop of the traction pass.
      mx += (py * tz - pz * ty) * dA; my += (pz * tx - px * tz) * dA; mz += (px * ty - py * tx) * dA
      A += dA
      In += tn * dA
      const qx = tx - tn * nx, qy = ty - tn * ny, qz = tz - tn * nz
      Is += Math.sqrt(qx * qx + qy * qy + qz * qz) * dA
      Im += Math.sqrt(t2) * dA
    }
    force[3 * f] = fx; force[3 * f + 1] = fy; force[3 * f + 2] = fz
    moment[3 * f] = mx; moment[3 * f + 1] = my; moment[3 * f + 2] = mz
    // Zero-area faces report zero means rather than NaN.
    const invA = A > 0 ? 1 / A : 0
    meanNormal[f] = In * invA; meanShear[f] = Is * invA; meanMagnitude[f] = Im * invA
  }
  return out
}
