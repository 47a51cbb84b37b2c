import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { addFaceLoads } from '../../src/demo/consistentLoads.ts'
import { hexBoundaryFaces, selectFaces } from '../../src/demo/hexFaces.ts'
import { solveElastic } from '../../src/demo/solveElastic.ts'

describe('demo solver: cantilever', () => {
  // Tip deflection of an end-loaded cantilever: Euler–Bernoulli P L³/(3 E I) plus the shear term
  // P L/(κ G A) with κ = 5/6 for a rectangle (Timoshenko beam; any strength-of-materials text,
  // e.g. Timoshenko & Gere, Mechanics of Materials). ν = 0 so the clamped end adds no Poisson
  // constraint the beam theory does not have.
  it('tip deflection agrees with beam theory within 3 %', () => {
    const L = 10, h = 1, b = 0.5, E = 1000, nu = 0, P = 1
    const mesh = boxMesh({ nx: 60, ny: 6, nz: 2, lx: L, ly: h, lz: b }, 'hex8')
    const N = mesh.nodeCount, coords = mesh.coords, conn = mesh.blocks[0].conn
    const fixed = new Uint8Array(3 * N)
    for (let n = 0; n < N; n++) if (coords[3 * n] < 1e-9) fixed[3 * n] = fixed[3 * n + 1] = fixed[3 * n + 2] = 1
    const load = new Float64Array(3 * N)
    const tip = selectFaces(hexBoundaryFaces(conn, N), coords, (x) => x > L - 1e-9)
    const applied = addFaceLoads(load, coords, tip, (t) => { t[0] = 0; t[1] = -P / (h * b); t[2] = 0 })
    expect(applied[1]).toBeCloseTo(-P, 12)
    const sol = solveElastic({ coords, conn, E, nu, fixed, load })
    let sum = 0, cnt = 0
    for (let n = 0; n < N; n++) if (coords[3 * n] > L - 1e-9) { sum += sol.displacement[3 * n + 1]; cnt++ }
    const tipDeflection = -sum / cnt
    const I = (b * h ** 3) / 12, G = E / (2 * (1 + nu)), A = b * h
    const expected = (P * L ** 3) / (3 * E * I) + (P * L) / ((5 / 6) * G * A)
    console.log(`cantilever tip ${tipDeflection.toFixed(4)} vs beam theory ${expected.toFixed(4)} (${(100 * (tipDeflection / expected - 1)).toFixed(2)} %), ${sol.stats.iterations} iterations`)
    expect(Math.abs(tipDeflection / expected - 1)).toBeLessThan(0.03)
    // The clamp carries the load: reactions sum to +P (statics).
    let ry = 0
    for (let n = 0; n < N; n++) ry += sol.reaction[3 * n + 1]
    expect(ry).toBeCloseTo(P, 6)
  })
})
