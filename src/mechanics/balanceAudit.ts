/**
 * Balance audit: does the stress field satisfy the static Cauchy equation div σ + ρb = 0 in the
 * integral sense, element by element and for the whole body?
 *
 * Element: residual = ∮ σn dA over all faces of the element (its own face shape functions, σ
 * interpolated from its nodes, face quadrature) + ρb·V. The gross load is half the sum of
 * |∫ σn dA| over its faces plus half |ρb|·V: a bar in equilibrium under a force P has two end
 * faces carrying P each, so gross = P and the indicator |residual| / gross reads "fraction of
 * the load that is out of balance".
 *
 * Whole body: F = Σ ∫ t dA over the boundary faces + ρb·V; moment about the volume centroid c,
 * Σ ∫ (x - c) × t dA (the body force has no moment about c, since ∫ (x - c) dV = 0);
 * gross = half of (Σ |face force| + |ρb|·V).
 *
 * Stress is read through the field's element-node index (`StressField.rows`, beside the
 * connectivity): the stress of element-node (e, a) is row rows[e·n + a], so nodal and
 * element-nodal stress take the same path, closed forms included.
 */
import { ELEMENT_TYPES, FACE_KIND_CODE } from '../model/elementTypes.ts'
import type { Mesh, Vec3 } from '../model/model.ts'
import { checkStressField } from '../model/stressField.ts'
import type { StressField } from '../model/stressField.ts'
import { faceQuadratureTables } from './boundaryFaces.ts'
import { elementByRule, elementVolumesAndCentroids, volumeChunks } from './elementVolume.ts'
import { sixTetVolume } from '../model/elements/tetVolume.ts'
import { tabulateElement } from './shapeFunctions.ts'
import { isStraightTet10 } from './straightTet10.ts'
import { FQP_AREA, FQP_SIZE, FQP_STRESS, createFacePoints, faceQuadraturePoints } from './faceQuadraturePoint.ts'
import { momentAbout } from './vec3.ts'
import { hex8Balance } from './hex8Balance.ts'
import { boundaryVolume } from './boundaryVolume.ts'
import type { BodyBalance, BoundaryFaces, ElementBalance, SurfaceTractions } from './types.ts'

/** Fresh output arrays for E elements in the chosen storage precision (see ElementBalance). */
export function allocateElementBalance(E: number, precision: 'double' | 'single' = 'double'): ElementBalance {
  const A = precision === 'single' ? Float32Array : Float64Array
  return { residual: new A(3 * E), gross: new A(E), indicator: new A(E) }
}

/**
 * Fills `out` (allocateElementBalance: double or single precision storage) for every element of
 * `mesh` and returns it; sums always run in double precision. To split the work, run it on
 * meshSlice(mesh, from, to) and stressFieldSlice(...) with `out` holding subarray views
 * [from, to) of the whole output.
 */
export function computeElementBalance(out: ElementBalance, mesh: Mesh, stress: StressField, bodyForce: Vec3): ElementBalance {
  return elementBalance(out, mesh, stress, bodyForce, true)
}

/**
 * The same audit with hex8 and straight-sided tet10 blocks sent through the general face
 * quadrature (and the general volume quadrature) instead of their closed forms: the reference
 * the closed forms are tested against. Not for production use (slower).
 */
export function computeElementBalanceGeneral(out: ElementBalance, mesh: Mesh, stress: StressField, bodyForce: Vec3): ElementBalance {
  return elementBalance(out, mesh, stress, bodyForce, false)
}

/** tet10 faces, 6 local nodes each: corners (outward), then the mid-edge nodes (ELEMENT_TYPES.tet10.faces). */
const TET10_FACES = Int32Array.from(ELEMENT_TYPES.tet10.faces.flat())

function elementBalance(out: ElementBalance, mesh: Mesh, field: StressField, bodyForce: Vec3, closedForms: boolean): ElementBalance {
  const E = mesh.elementCount
  if (out.gross.length < E || out.indicator.length < E || out.residual.length < 3 * E) {
    throw new RangeError(`element balance output holds ${out.gross.length} elements, the mesh has ${E}`)
  }
  checkStressField(mesh, field)
  const stress = field.values
  // tet4 and hex8 blocks compute their volume inline; the others use the volume quadrature (an
  // array only when there are such blocks).
  const inline = (t: string): boolean => t === 'tet4' || (closedForms && (t === 'hex8' || t === 'tet10'))
  const hasOther = mesh.blocks.some((b) => !inline(b.type))
  const volume = new Float64Array(hasOther ? E : 0)
  if (hasOther) elementVolumesAndCentroids(mesh, volume, null, !closedForms)
  const bx = bodyForce[0], by = bodyForce[1], bz = bodyForce[2]
  const bMag = Math.sqrt(bx * bx + by * by + bz * bz)
  const x = mesh.coords
  const tables = faceQuadratureTables()
  const xs = new Float64Array(3 * 8), ss = new Float64Array(6 * 8), qp = createFacePoints(tables)
  // Imported names once into locals: where tsx compiles the modules to CommonJS (a script run
  // from outside the project, DEVELOPERS.md) every use of an imported binding is a getter call.
  const points = faceQuadraturePoints, SIZE = FQP_SIZE, AREA = FQP_AREA, STRESS = FQP_STRESS, straightTet10 = isStraightTet10
  const six = sixTetVolume, byRule = elementByRule
  // curved tet10 in the closed-form path: their volume by the type's rule, one at a time
  const tet10Rule = tabulateElement('tet10', ELEMENT_TYPES.tet10.volumeRule), xs10 = new Float64Array(30), vol1 = new Float64Array(1)

  for (let bi = 0; bi < mesh.blocks.length; bi++) {
    const b = mesh.blocks[bi]
    const topo = ELEMENT_TYPES[b.type]
    const conn = b.conn, rows = field.rows[bi], off = b.offset, nn = topo.nodeCount
    const count = conn.length / nn
    if (b.type === 'tet4') {
      // Flat faces and linear σ: ∫ σn dA = σ̄ · (A n) exactly, σ̄ the mean of the face's three
      // corners. The face opposite corner k has corner sum Σσ - σ_k; its area vector a_k is
      // ½ of a cross product; Σ a_k = 0 saves one. Volume V = (x1-x0)·((x2-x0)×(x3-x0))/6.
      for (let e = 0; e < count; e++) {
        const n0 = conn[4 * e], n1 = conn[4 * e + 1], n2 = conn[4 * e + 2], n3 = conn[4 * e + 3]
        const x0 = x[3 * n0], y0 = x[3 * n0 + 1], z0 = x[3 * n0 + 2]
        const ux = x[3 * n1] - x0, uy = x[3 * n1 + 1] - y0, uz = x[3 * n1 + 2] - z0
        const vx = x[3 * n2] - x0, vy = x[3 * n2 + 1] - y0, vz = x[3 * n2 + 2] - z0
        const wx = x[3 * n3] - x0, wy = x[3 * n3 + 1] - y0, wz = x[3 * n3 + 2] - z0
        // Outward doubled area vectors: opposite 3 = v × u, opposite 2 = u × w, opposite 1 = w × v
        // (scalar locals, not vec3.cross: this loop runs once per element, see vec3.ts).
        const a3x = vy * uz - vz * uy, a3y = vz * ux - vx * uz, a3z = vx * uy - vy * ux
        const a2x = uy * wz - uz * wy, a2y = uz * wx - ux * wz, a2z = ux * wy - uy * wx
        const a1x = wy * vz - wz * vy, a1y = wz * vx - wx * vz, a1z = wx * vy - wy * vx
        const a0x = -(a1x + a2x + a3x), a0y = -(a1y + a2y + a3y), a0z = -(a1z + a2z + a3z)
        const vol = -(ux * a1x + uy * a1y + uz * a1z) / 6
        const s0 = 6 * rows[4 * e], s1 = 6 * rows[4 * e + 1], s2 = 6 * rows[4 * e + 2], s3 = 6 * rows[4 * e + 3]
        const txx = stress[s0] + stress[s1] + stress[s2] + stress[s3]
        const tyy = stress[s0 + 1] + stress[s1 + 1] + stress[s2 + 1] + stress[s3 + 1]
        const tzz = stress[s0 + 2] + stress[s1 + 2] + stress[s2 + 2] + stress[s3 + 2]
        const txy = stress[s0 + 3] + stress[s1 + 3] + stress[s2 + 3] + stress[s3 + 3]
        const tyz = stress[s0 + 4] + stress[s1 + 4] + stress[s2 + 4] + stress[s3 + 4]
        const txz = stress[s0 + 5] + stress[s1 + 5] + stress[s2 + 5] + stress[s3 + 5]
        let rx = 0, ry = 0, rz = 0, g = 0
        for (let k = 0; k < 4; k++) {
          const sk = k === 0 ? s0 : k === 1 ? s1 : k === 2 ? s2 : s3
          const ax = k === 0 ? a0x : k === 1 ? a1x : k === 2 ? a2x : a3x
          const ay = k === 0 ? a0y : k === 1 ? a1y : k === 2 ? a2y : a3y
          const az = k === 0 ? a0z : k === 1 ? a1z : k === 2 ? a2z : a3z
          const sxx = txx - stress[sk], syy = tyy - stress[sk + 1], szz = tzz - stress[sk + 2]
          const sxy = txy - stress[sk + 3], syz = tyz - stress[sk + 4], sxz = txz - stress[sk + 5]
          // (corner sum / 3) · (½ doubled area vector) = corner sum · a / 6.
          const fx = (sxx * ax + sxy * ay + sxz * az) / 6
          const fy = (sxy * ax + syy * ay + syz * az) / 6
          const fz = (sxz * ax + syz * ay + szz * az) / 6
          rx += fx; ry += fy; rz += fz
          g += Math.sqrt(fx * fx + fy * fy + fz * fz)
        }
        store(off + e, vol, rx, ry, rz, g)
      }
      continue
    }
    if (b.type === 'hex8' && closedForms) {
      // its own function in its own file (hex8Balance.ts), so its loop is optimised for
      // hexahedra alone whatever other types ran before
      hex8Balance(out, off, x, conn, rows, stress, bodyForce)
      continue
    }
    const nf = topo.faces.length
    const faceCode = topo.faceKinds.map((k) => FACE_KIND_CODE[k])
    const faceNodes = Int32Array.from(topo.faces.flat()), faceFirst = new Int32Array(nf + 1)
    for (let f = 0; f < nf; f++) faceFirst[f + 1] = faceFirst[f] + topo.faces[f].length
    if (b.type === 'tet10' && closedForms) {
      // Straight-sided tet10 (mid-edge nodes at their edges' midpoints, within 1e-12 of the
      // element's size: an affine map): each face is a flat triangle of doubled area vector a and
      // σ is the quadratic interpolant of its six nodes, whose corner functions integrate to 0
      // and mid-edge functions to A/3 over the triangle (common practice), so exactly
      // ∫ σn dA = (σ_m1 + σ_m2 + σ_m3) · a / 6: the face quadrature's value (degree 4, exact for
      // this degree-2 integrand) with four face rules' worth of arithmetic saved. Curved
      // elements take the general path.
      for (let e = 0; e < count; e++) {
        const base = 10 * e
        if (!straightTet10(x, conn, base)) {
          // curved: the volume by the type's rule, the faces by their quadrature
          byRule(vol1, null, 0, x, conn, base, 10, tet10Rule, xs10)
          generalElement(off + e, conn, rows, base, nf, faceNodes, faceFirst, faceCode, vol1[0])
          continue
        }
        const p0 = 3 * conn[base], p1 = 3 * conn[base + 1], p2 = 3 * conn[base + 2], p3 = 3 * conn[base + 3]
        const vol = six(x, p0, p1, p2, p3) / 6
        let rx = 0, ry = 0, rz = 0, g = 0
        for (let f = 0; f < 24; f += 6) {
          const c0 = 3 * conn[base + TET10_FACES[f]], c1 = 3 * conn[base + TET10_FACES[f + 1]], c2 = 3 * conn[base + TET10_FACES[f + 2]]
          const x0 = x[c0], y0 = x[c0 + 1], z0 = x[c0 + 2]
          const ux = x[c1] - x0, uy = x[c1 + 1] - y0, uz = x[c1 + 2] - z0
          const vx = x[c2] - x0, vy = x[c2 + 1] - y0, vz = x[c2 + 2] - z0
          const ax = (uy * vz - uz * vy) / 6, ay = (uz * vx - ux * vz) / 6, az = (ux * vy - uy * vx) / 6
          const s0 = 6 * rows[base + TET10_FACES[f + 3]], s1 = 6 * rows[base + TET10_FACES[f + 4]], s2 = 6 * rows[base + TET10_FACES[f + 5]]
          const sxx = stress[s0] + stress[s1] + stress[s2], syy = stress[s0 + 1] + stress[s1 + 1] + stress[s2 + 1]
          const szz = stress[s0 + 2] + stress[s1 + 2] + stress[s2 + 2], sxy = stress[s0 + 3] + stress[s1 + 3] + stress[s2 + 3]
          const syz = stress[s0 + 4] + stress[s1 + 4] + stress[s2 + 4], sxz = stress[s0 + 5] + stress[s1 + 5] + stress[s2 + 5]
          const fx = sxx * ax + sxy * ay + sxz * az
          const fy = sxy * ax + syy * ay + syz * az
          const fz = sxz * ax + syz * ay + szz * az
          rx += fx; ry += fy; rz += fz
          g += Math.sqrt(fx * fx + fy * fy + fz * fz)
        }
        store(off + e, vol, rx, ry, rz, g)
      }
      continue
    }
    for (let e = 0; e < count; e++) generalElement(off + e, conn, rows, e * nn, nf, faceNodes, faceFirst, faceCode, volume[off + e])
  }
  return out

  /** The general path for one element: every face by its face quadrature (faceQuadraturePoint.ts). */
  function generalElement(ge: number, conn: Int32Array, rows: Int32Array, base: number, nf: number, faceNodes: Int32Array, faceFirst: Int32Array, faceCode: readonly number[], vol: number): void {
    let rx = 0, ry = 0, rz = 0, g = 0
    for (let f = 0; f < nf; f++) {
      const t = tables[faceCode[f]], fo = faceFirst[f]
      const fn = t.nodeCount, nq = t.pointCount, W = t.weights
      for (let a = 0; a < fn; a++) {
        const la = base + faceNodes[fo + a]
        const p = conn[la], r = 6 * rows[la]
        xs[3 * a] = x[3 * p]; xs[3 * a + 1] = x[3 * p + 1]; xs[3 * a + 2] = x[3 * p + 2]
        for (let c = 0; c < 6; c++) ss[6 * a + c] = stress[r + c]
      }
      let fx = 0, fy = 0, fz = 0
      points(qp, t, xs, ss, false)
      for (let q = 0; q < nq; q++) {
        // (t_u × t_v) w is the area vector n dA of this quadrature point.
        const r = SIZE * q, w = W[q]
        const nx = qp[r + AREA] * w, ny = qp[r + AREA + 1] * w, nz = qp[r + AREA + 2] * w
        const sxx = qp[r + STRESS], syy = qp[r + STRESS + 1], szz = qp[r + STRESS + 2]
        const sxy = qp[r + STRESS + 3], syz = qp[r + STRESS + 4], sxz = qp[r + STRESS + 5]
        fx += sxx * nx + sxy * ny + sxz * nz
        fy += sxy * nx + syy * ny + syz * nz
        fz += sxz * nx + syz * ny + szz * nz
      }
      rx += fx; ry += fy; rz += fz
      g += Math.sqrt(fx * fx + fy * fy + fz * fz)
    }
    store(ge, vol, rx, ry, rz, g)
  }

  function store(ge: number, v: number, rx: number, ry: number, rz: number, faceSum: number): void {
    storeBalance(out, ge, v, rx, ry, rz, faceSum, bx, by, bz, bMag)
  }
}

/**
 * Writes one element's balance: the residual (face sum plus ρb·V), the gross load (half the face
 * sum of |force| plus half |ρb|·|V|) and the indicator |residual| / gross.
 */
function storeBalance(out: ElementBalance, ge: number, v: number, rx: number, ry: number, rz: number, faceSum: number, bx: number, by: number, bz: number, bMag: number): void {
  rx += bx * v; ry += by * v; rz += bz * v
  const residual = out.residual
  residual[3 * ge] = rx; residual[3 * ge + 1] = ry; residual[3 * ge + 2] = rz
  const gr = 0.5 * (faceSum + bMag * Math.abs(v))
  out.gross[ge] = gr
  // An unloaded element (zero stress, no body force) is trivially balanced.
  out.indicator[ge] = gr > 0 ? Math.sqrt(rx * rx + ry * ry + rz * rz) / gr : 0
}

/**
 * Volume V (L³) and volume centroid (L) of the mesh, about which the body balance takes its
 * moment: they do not depend on the stress, so a caller that balances several load cases of one
 * mesh computes them once and hands them to computeBodyBalance.
 */
export function bodyVolume(mesh: Mesh): { readonly volume: number; readonly centroid: Vec3 } {
  // Volumes and centroids a chunk of elements at a time, summed in element order: the same sums
  // as over whole-mesh arrays.
  let V = 0, cx = 0, cy = 0, cz = 0
  volumeChunks(mesh, (_b, _first, n, vol, cen) => {
    for (let e = 0; e < n; e++) {
      const v = vol[e]
      V += v; cx += v * cen[3 * e]; cy += v * cen[3 * e + 1]; cz += v * cen[3 * e + 2]
    }
  })
  // An empty or zero-volume body has no centroid: use the origin.
  return { volume: V, centroid: V !== 0 ? [cx / V, cy / V, cz / V] : [0, 0, 0] }
}

/**
 * The same volume and centroid from the body's boundary faces (boundaryVolume.ts: the divergence
 * theorem, a pass over the faces instead of the elements), or by bodyVolume where a quadratic
 * face is curved or there are no faces. `faces` must be the mesh's boundary as
 * extractBoundaryFaces gives it (every element face but the matched pairs), not a selection.
 */
export function bodyVolumeOf(mesh: Mesh, faces: BoundaryFaces): { readonly volume: number; readonly centroid: Vec3 } {
  return boundaryVolume(mesh.coords, faces) ?? bodyVolume(mesh)
}

/**
 * The whole body's balance over its boundary faces (`faces`: extractBoundaryFaces of `mesh`, with
 * their tractions); `body` its volume and centroid when the caller has them (bodyVolumeOf).
 */
export function computeBodyBalance(
  mesh: Mesh, faces: BoundaryFaces, tractions: SurfaceTractions, bodyForce: Vec3, body: { readonly volume: number; readonly centroid: Vec3 } = bodyVolumeOf(mesh, faces),
): BodyBalance {
  const V = body.volume, c: Vec3 = [body.centroid[0], body.centroid[1], body.centroid[2]]
  let fx = 0, fy = 0, fz = 0, mx = 0, my = 0, mz = 0, faceSum = 0
  const F = tractions.force, M = tractions.moment
  for (let f = 0; f < faces.count; f++) {
    const a = F[3 * f], b = F[3 * f + 1], d = F[3 * f + 2]
    fx += a; fy += b; fz += d
    mx += M[3 * f]; my += M[3 * f + 1]; mz += M[3 * f + 2]
    faceSum += Math.sqrt(a * a + b * b + d * d)
  }
  const surfaceForce: Vec3 = [fx, fy, fz]
  const bodyForceTotal: Vec3 = [bodyForce[0] * V, bodyForce[1] * V, bodyForce[2] * V]
  const force: Vec3 = [fx + bodyForceTotal[0], fy + bodyForceTotal[1], fz + bodyForceTotal[2]]
  // Shift the surface moment from the origin to c: M_c = M_0 - c × F_surface.
  const moment = momentAbout<Vec3>([0, 0, 0], [mx, my, mz], c, surfaceForce)
  const gross = 0.5 * (faceSum + Math.hypot(...bodyForceTotal))
  const relative = gross > 0 ? Math.hypot(...force) / gross : 0
  return { force, moment, relative, gross, about: c, volume: V, centroid: c, surfaceForce, bodyForceTotal }
}

// Percentiles of `values` by selection (no sort): percentiles.ts.
export { percentiles } from './percentiles.ts'
