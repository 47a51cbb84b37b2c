import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../src/model/boxMesh.ts'
import type { Vec3 } from '../../src/model/model.ts'
import {
  cutNodal, nodalStress,
} from '../helpers/sectionMeshes.ts'

// Gravity-loaded column (Malvern 1969, ch. 3: static form of Cauchy's equation, div σ + ρb = 0; the
// column itself is common practice): height H, σzz = -ρg(H - z), body force ρb = (0, 0, -ρg).
// SI units: m, Pa, N. ρ = 2300 kg/m³, g = 9.81 m/s².
const rho = 2300, g = 9.81, H = 2000, lx = 50, ly = 40
const A = lx * ly
const bodyForce: Vec3 = [0, 0, -rho * g]

describe.each(['hex8', 'tet4', 'wedge6'] as const)('gravity column (%s)', (type) => {
  const mesh = boxMesh({ nx: 2, ny: 2, nz: 8, lx, ly, lz: H }, type)
  const stress = nodalStress(mesh, (_x, _y, z) => [0, 0, -rho * g * (H - z), 0, 0, 0])

  it('a section at height z carries axial = -ρg(H - z)A (compression); the piece below balances only with ρb', () => {
    const z0 = 730
    const { result: r } = cutNodal(mesh, stress, bodyForce, { point: [lx / 2, ly / 2, z0], normal: [0, 0, 1] })
    expect(Math.abs(r.axial - -rho * g * (H - z0) * A)).toBeLessThan(1e-12 * rho * g * H * A)
    expect(Math.hypot(...r.shear)).toBeLessThan(1e-9 * rho * g * H * A)
    // piece below: base support ρgH·A up, section ρg(H - z0)A down, weight ρg z0 A down
    expect(r.freeBody.relative).toBeLessThan(1e-12)
    expect(Math.hypot(...r.freeBody.moment)).toBeLessThan(1e-12 * r.freeBody.gross * H)
    const noWeight = cutNodal(mesh, stress, [0, 0, 0], { point: [lx / 2, ly / 2, z0], normal: [0, 0, 1] }).result
    expect(Math.abs(noWeight.freeBody.force[2] - rho * g * z0 * A)).toBeLessThan(1e-9 * rho * g * H * A)
    expect(noWeight.freeBody.relative).toBeGreaterThan(0.1)
  })

  it('the piece above (normal -z) balances too: the section holds its weight', () => {
    const z0 = 1234.5
    const { result: r } = cutNodal(mesh, stress, bodyForce, { point: [0, 0, z0], normal: [0, 0, -1] })
    expect(Math.abs(r.force[2] - rho * g * (H - z0) * A)).toBeLessThan(1e-12 * rho * g * H * A)
    expect(r.freeBody.relative).toBeLessThan(1e-12)
  })

  // Common practice: vertical (lithostatic) stress grows about 22.6 MPa/km for ρ ≈ 2300 kg/m³.
  it('reads the lithostatic gradient back from two cuts', () => {
    const at = (z: number) => cutNodal(mesh, stress, bodyForce, { point: [0, 0, z], normal: [0, 0, 1] }).result.axial
    const z1 = 500, z2 = 1500
    const gradientPaPerM = (at(z2) - at(z1)) / (A * (z2 - z1))
    expect(Math.abs(gradientPaPerM - rho * g)).toBeLessThan(1e-9 * rho * g)
    const mpaPerKm = (gradientPaPerM * 1000) / 1e6
    expect(Math.abs(mpaPerKm - 22.6)).toBeLessThan(0.1)
  })
})
