/**
 * Hole of radius a in a large plate under remote tension S along x: Kirsch (1898), e.g. Timoshenko
 * & Goodier §35, Roark's stress-concentration tables:
 *   σr  = S/2 (1 - a²/r²) + S/2 (1 - 4a²/r² + 3a⁴/r⁴) cos 2θ
 *   σθ  = S/2 (1 + a²/r²) - S/2 (1 + 3a⁴/r⁴) cos 2θ
 *   τrθ = -S/2 (1 + 2a²/r² - 3a⁴/r⁴) sin 2θ
 * With this field at the nodes of a quarter plate (polar mesh, graded towards the hole), the
 * hole surface is traction-free (σr = τrθ = 0 at r = a), so the traction read there must be ≈ 0
 * and shrink with refinement; the hoop stress at the hole reads 3S at θ = 90° and -S at θ = 0°.
 * Measured peak nodal |t|/S on the hole (ntheta 8 → 16 → 32 over the quarter): hex8 0.29 → 0.15
 * → 0.074 (first order: a flat face's normal is off by half the angle step and σθ reaches 3S);
 * curved hex20 7.1e-4 → 8.9e-5 → 1.1e-5.
 */
import { describe, expect, it } from 'vitest'
import { ELEMENT_TYPE_NAMES, ELEMENT_TYPES, FACE_KINDS } from '../../src/model/elementTypes.ts'
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import { polarToCartesian, quarterCylinder, stressField } from '../helpers/mappedMeshes.ts'
import { runCore } from '../helpers/pipeline.ts'

const a = 1, R = 8, S = 10, thickness = 0.2

function kirsch(x: number, y: number): number[] {
  const r2 = x * x + y * y, q = (a * a) / r2, th = Math.atan2(y, x)
  const c2 = Math.cos(2 * th), s2 = Math.sin(2 * th)
  const sr = (S / 2) * (1 - q) + (S / 2) * (1 - 4 * q + 3 * q * q) * c2
  const st = (S / 2) * (1 + q) - (S / 2) * (1 + 3 * q * q) * c2
  const trt = (-S / 2) * (1 + 2 * q - 3 * q * q) * s2
  return polarToCartesian(sr, st, trt, th)
}

function holeTraction(type: ElementTypeName, ntheta: number) {
  const mesh = quarterCylinder({ a, b: R, length: thickness, nr: 6, ntheta, nz: 1, grading: 6 }, type)
  const stress = stressField(mesh, kirsch)
  const run = runCore(mesh, stress)
  const { faces, tractions } = run
  let peak = 0, holeFaces = 0
  const hole: number[] = []
  for (let f = 0; f < faces.count; f++) {
    const nn = FACE_KINDS[faces.kind[f]].nodeCount
    let onHole = true
    for (let k = 0; k < nn; k++) {
      const p = faces.nodes[faces.slots * f + k]
      if (Math.abs(Math.hypot(mesh.coords[3 * p], mesh.coords[3 * p + 1]) - a) > 1e-9) onHole = false
    }
    if (!onHole) continue
    holeFaces++
    hole.push(f)
    for (let k = 0; k < nn; k++) peak = Math.max(peak, tractions.nodeMagnitude[faces.slots * f + k] / S)
  }
  return { mesh, stress, run, peak, holeFaces, hole }
}

describe('Kirsch hole in a plate under tension (Kirsch 1898)', () => {
  for (const type of ELEMENT_TYPE_NAMES) {
    const quadratic = ELEMENT_TYPES[type].quadratic
    it(`${type}: the hole surface reads ≈ zero traction, shrinking with refinement`, () => {
      const c = holeTraction(type, 8), f = holeTraction(type, 16), ff = holeTraction(type, 32)
      expect(c.holeFaces).toBeGreaterThan(0)
      // Flat faces: |t| ≈ σθ·sin(Δθ/2), first order in the angle step; curved faces: much faster.
      expect(f.peak).toBeLessThan(c.peak / (quadratic ? 3 : 1.8))
      expect(ff.peak).toBeLessThan(f.peak / (quadratic ? 3 : 1.8))
      expect(ff.peak).toBeLessThan(quadratic ? 1e-3 : 0.2)
    })
  }

  it('hoop stress at the hole: 3S at 90°, -S at 0° (principal stresses of the nodal field)', () => {
    const { mesh, run } = holeTraction('hex20', 16)
    const inv = run.invariants
    let top = -1, side = -1
    for (let i = 0; i < mesh.nodeCount; i++) {
      const x = mesh.coords[3 * i], y = mesh.coords[3 * i + 1], z = mesh.coords[3 * i + 2]
      if (z !== 0) continue
      if (Math.abs(x) < 1e-12 && Math.abs(y - a) < 1e-12) top = i
      if (Math.abs(y) < 1e-12 && Math.abs(x - a) < 1e-12) side = i
    }
    expect(top).toBeGreaterThanOrEqual(0)
    expect(side).toBeGreaterThanOrEqual(0)
    expect(inv.principal[3 * top] / S).toBeCloseTo(3, 10)
    expect(inv.principal[3 * side + 2] / S).toBeCloseTo(-1, 10)
    // The hoop direction at 90° is x.
    expect(Math.abs(inv.directions[9 * top])).toBeCloseTo(1, 10)
  })

  it('load patches: the curved hole belongs to the nominally free surface', () => {
    const { run, hole } = holeTraction('hex20', 16)
    const lp = run.loadPatches
    for (const f of hole) expect(lp.faceLabel[f]).toBe(-1)
    expect(lp.patches.length).toBeGreaterThan(0)
  })
})
