/**
 * The deformed shape (src/mechanics/deformation.ts): a uniform strain ε gives the displacement
 * u = εx (any continuum-mechanics text, e.g. Malvern 1969, ch. 4: a homogeneous deformation), so
 * the drawn surface x + s·u of an L × W × H box is exactly the box (I + sε) x: with a diagonal ε
 * its sides become L(1 + s εxx), W(1 + s εyy), H(1 + s εzz). The automatic scale draws the largest
 * displacement as 5 % of the diagonal.
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../../src/model/boxMesh.ts'
import { nodalStressField } from '../../../src/model/stressField.ts'
import { extractBoundaryFaces } from '../../../src/mechanics/boundaryFaces.ts'
import { autoDeformationScale, deformPoints, displacementOnPolygons, faceMeanVectors, gatherNodalVectors, maxDisplacement, meanOverItems, surfaceDisplacement } from '../../../src/mechanics/deformation.ts'
import { cutSection } from '../../../src/mechanics/sectionCut.ts'
import { buildSurfaceTriangles } from '../../../src/mechanics/surfaceTriangles.ts'
import { buildFeatureEdges } from '../../../src/mechanics/featureEdges.ts'
import { runCore } from '../../helpers/pipeline.ts'

const L = 4, W = 2, H = 1

function strained(eps: number[][]) {
  const mesh = boxMesh({ nx: 4, ny: 2, nz: 2, lx: L, ly: W, lz: H }, 'tet10')
  const u = new Float64Array(3 * mesh.nodeCount)
  for (let i = 0; i < mesh.nodeCount; i++) for (let r = 0; r < 3; r++) {
    u[3 * i + r] = eps[r][0] * mesh.coords[3 * i] + eps[r][1] * mesh.coords[3 * i + 1] + eps[r][2] * mesh.coords[3 * i + 2]
  }
  return { mesh, u }
}

function bounds(p: ArrayLike<number>): number[] {
  const lo = [Infinity, Infinity, Infinity], hi = [-Infinity, -Infinity, -Infinity]
  for (let i = 0; i < p.length; i += 3) for (let k = 0; k < 3; k++) { lo[k] = Math.min(lo[k], p[i + k]); hi[k] = Math.max(hi[k], p[i + k]) }
  return [hi[0] - lo[0], hi[1] - lo[1], hi[2] - lo[2]]
}

describe('deformed shape', () => {
  it('a uniform strain moves the box to the right size', () => {
    const eps = [[2e-3, 0, 0], [0, -1e-3, 0], [0, 0, 5e-4]]
    const { mesh, u } = strained(eps)
    const { faces, tractions, invariants } = runCore(mesh, new Float64Array(6 * mesh.nodeCount))
    const surface = buildSurfaceTriangles(mesh.coords, faces, tractions, invariants)
    const du = surfaceDisplacement(faces, u)
    expect(du.length).toBe(surface.positions.length)
    const s = 50
    const drawn = deformPoints(new Float64Array(du.length), surface.positions, du, s)
    const size = bounds(drawn)
    expect(size[0]).toBeCloseTo(L * (1 + s * 2e-3), 5)
    expect(size[1]).toBeCloseTo(W * (1 - s * 1e-3), 5)
    expect(size[2]).toBeCloseTo(H * (1 + s * 5e-4), 5)
    // The feature edges move with it: their end nodes carry the same displacement.
    const edges = buildFeatureEdges(mesh.coords, faces)
    const edgeDrawn = deformPoints(new Float64Array(edges.segments.length), edges.segments, gatherNodalVectors(edges.nodes, u), s)
    expect(bounds(edgeDrawn)[0]).toBeCloseTo(L * (1 + s * 2e-3), 5)
  })

  it('a shear strain: every drawn vertex is (I + sε)x', () => {
    const eps = [[0, 1e-3, 0], [1e-3, 0, 0], [0, 0, 0]]
    const { mesh, u } = strained(eps)
    const faces = extractBoundaryFaces(mesh)
    const du = surfaceDisplacement(faces, u)
    const { tractions, invariants } = runCore(mesh, new Float64Array(6 * mesh.nodeCount))
    const pos = buildSurfaceTriangles(mesh.coords, faces, tractions, invariants).positions
    const s = 20
    const drawn = deformPoints(new Float64Array(pos.length), pos, du, s)
    for (let i = 0; i < pos.length; i += 3) {
      expect(drawn[i]).toBeCloseTo(pos[i] + s * 1e-3 * pos[i + 1], 5)
      expect(drawn[i + 1]).toBeCloseTo(pos[i + 1] + s * 1e-3 * pos[i], 5)
    }
  })

  it('the section face and the arrows move with the material: u = εx at every section vertex', () => {
    // Any element reproduces a linear displacement field exactly (isoparametric; common practice).
    const eps = [[2e-3, 5e-4, 0], [0, -1e-3, 3e-4], [1e-4, 0, 5e-4]]
    const { mesh, u } = strained(eps)
    const { polygons } = cutSection(mesh, nodalStressField(mesh, new Float64Array(6 * mesh.nodeCount)), [0, 0, 0], { point: [1.3, 0.7, 0.4], normal: [1, 0.3, 0.2] }, { polygons: true })
    const pu = displacementOnPolygons(mesh, u, polygons!)
    const x = polygons!.positions
    expect(polygons!.count).toBeGreaterThan(4)
    for (let v = 0; v < x.length / 3; v++) for (let r = 0; r < 3; r++) {
      expect(pu[3 * v + r]).toBeCloseTo(eps[r][0] * x[3 * v] + eps[r][1] * x[3 * v + 1] + eps[r][2] * x[3 * v + 2], 14)
    }
    // An arrow moves with the mean of its polygon's vertices, or of its face's nodes.
    const items = Int32Array.from([0, polygons!.count - 1])
    const m = meanOverItems(items, polygons!.start, pu)
    const s0 = polygons!.start[0], s1 = polygons!.start[1]
    let mx = 0
    for (let v = s0; v < s1; v++) mx += pu[3 * v] / (s1 - s0)
    expect(m[0]).toBeCloseTo(mx, 7)
    const faces = extractBoundaryFaces(mesh)
    const fm = faceMeanVectors(faces, u, Int32Array.from([0]))
    const du = surfaceDisplacement(faces, u)
    // tet10 faces are tri6: the mean over the face's six nodes.
    let fx = 0
    for (let a = 0; a < 6; a++) fx += du[3 * a] / 6
    expect(fm[0]).toBeCloseTo(fx, 7)
  })

  it('the automatic scale draws the largest displacement as 5 % of the diagonal', () => {
    const { u } = strained([[2e-3, 0, 0], [0, -1e-3, 0], [0, 0, 5e-4]])
    const diagonal = Math.hypot(L, W, H)
    const m = maxDisplacement(u)
    // The corner (L, W, H) moves farthest: |(2e-3 L, −1e-3 W, 5e-4 H)|.
    expect(m).toBeCloseTo(Math.hypot(2e-3 * L, 1e-3 * W, 5e-4 * H), 12)
    const s = autoDeformationScale(m, diagonal)
    expect(s * m).toBeCloseTo(0.05 * diagonal, 12)
    expect(autoDeformationScale(0, diagonal)).toBe(0)
  })
})
