/**
 * Thick-walled cylinder under internal pressure p_i and external pressure p_o: the Lamé solution
 * (Timoshenko & Goodier, Theory of Elasticity, 3rd ed. 1970, §28):
 *   σr = A - B/r², σθ = A + B/r², A = (p_i a² - p_o b²)/(b² - a²), B = (p_i - p_o) a² b²/(b² - a²).
 * With the exact field at the nodes of a quarter-cylinder mesh, the traction read on the inner
 * face must be t_n = -p_i and on the outer face -p_o; the error comes only from the discrete face
 * normals and must shrink under refinement. The resultant on the inner quarter face is
 * p_i·a·L·(1, 1, 0) (statics: ∫ p_i r̂ a dθ dz over θ ∈ [0, π/2]).
 * Measured (ntheta 4 → 8 → 16 over the quarter): linear types max nodal t_n error 8.1e-2 →
 * 2.1e-2 → 5.1e-3 (order 2); curved hex20/tet10 7.4e-6 → 1.2e-7 → 1.9e-9; inner resultant
 * error hex20/tet10 3.7e-4 → 2.3e-5 → 1.5e-6 (order 4).
 */
import { describe, expect, it } from 'vitest'
import { ELEMENT_TYPE_NAMES, ELEMENT_TYPES, FACE_KINDS } from '../../src/model/elementTypes.ts'
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import { polarToCartesian, quarterCylinder, stressField } from '../helpers/mappedMeshes.ts'
import { runCore } from '../helpers/pipeline.ts'

const a = 1, b = 2, L = 0.5, pi = 100, po = 20
const A = (pi * a * a - po * b * b) / (b * b - a * a), B = ((pi - po) * a * a * b * b) / (b * b - a * a)

function lame(x: number, y: number): number[] {
  const r2 = x * x + y * y
  return polarToCartesian(A - B / r2, A + B / r2, 0, Math.atan2(y, x))
}

/** Max |t_n - (-p)| / p over nodes of faces lying on radius R, and the resultant over them. */
function readFaces(type: ElementTypeName, ntheta: number) {
  const mesh = quarterCylinder({ a, b, length: L, nr: 2, ntheta, nz: 1 }, type)
  const { faces, tractions } = runCore(mesh, stressField(mesh, lame))
  const out = { inner: 0, outer: 0, innerShear: 0, force: [0, 0, 0], innerFaces: 0, outerFaces: 0 }
  const radius = (p: number) => Math.hypot(mesh.coords[3 * p], mesh.coords[3 * p + 1])
  for (let f = 0; f < faces.count; f++) {
    const nn = FACE_KINDS[faces.kind[f]].nodeCount
    let onInner = true, onOuter = true
    for (let k = 0; k < nn; k++) {
      const r = radius(faces.nodes[faces.slots * f + k])
      if (Math.abs(r - a) > 1e-9) onInner = false
      if (Math.abs(r - b) > 1e-9) onOuter = false
    }
    if (!onInner && !onOuter) continue
    const p = onInner ? pi : po
    for (let k = 0; k < nn; k++) {
      const err = Math.abs(tractions.nodeNormalTraction[faces.slots * f + k] + p) / p
      if (onInner) { out.inner = Math.max(out.inner, err); out.innerShear = Math.max(out.innerShear, tractions.nodeShear[faces.slots * f + k] / pi) }
      else out.outer = Math.max(out.outer, err)
    }
    if (onInner) { out.innerFaces++; for (let c = 0; c < 3; c++) out.force[c] += tractions.force[3 * f + c] } else out.outerFaces++
  }
  return out
}

describe('Lamé thick cylinder (Timoshenko & Goodier §28)', () => {
  for (const type of ELEMENT_TYPE_NAMES) {
    const quadratic = ELEMENT_TYPES[type].quadratic
    it(`${type}: inner t_n → -p_i, outer t_n → -p_o, converging with refinement`, () => {
      const coarse = readFaces(type, 4), fine = readFaces(type, 8), finer = readFaces(type, 16)
      expect(coarse.innerFaces).toBeGreaterThan(0)
      expect(coarse.outerFaces).toBeGreaterThan(0)
      // Flat faces leave a normal error O(h²) in t_n; curved quadratic faces do better.
      expect(fine.inner).toBeLessThan(coarse.inner / 3)
      expect(finer.inner).toBeLessThan(fine.inner / 3)
      expect(finer.outer).toBeLessThan(fine.outer / 3)
      expect(finer.inner).toBeLessThan(quadratic ? 1e-3 : 2e-2)
      expect(finer.outer).toBeLessThan(quadratic ? 1e-3 : 2e-2)
      // Resultant of the inner face: p_i a L (1, 1, 0).
      const exact = pi * a * L
      const errOf = (r: typeof coarse) => Math.hypot(r.force[0] - exact, r.force[1] - exact, r.force[2]) / exact
      expect(errOf(finer)).toBeLessThan(errOf(coarse))
      expect(errOf(finer)).toBeLessThan(quadratic ? 1e-4 : 1e-2)
    })
  }
})
