import { describe, expect, it } from 'vitest'
import { solveElastic } from '../../src/demo/solveElastic.ts'
import { buildTunnelBlock, interpolateTunnelField, TUNNEL_DEFAULTS, tunnelHierarchy, tunnelMeshLevel } from '../../src/demo/tunnelBlock.ts'

describe('demo solver: a coarser solution as the starting guess', () => {
  const A = { ...TUNNEL_DEFAULTS, ...tunnelMeshLevel(0) }
  const B = { ...TUNNEL_DEFAULTS, ...tunnelMeshLevel(1) }

  it('interpolating a mesh onto itself returns the field unchanged', () => {
    const n = 3 * 8 * A.perSector * (A.ringDivisions + 1) * (A.layers + 1)
    const u = new Float64Array(n)
    for (let i = 0; i < n; i++) u[i] = Math.sin(i * 0.37)
    const back = interpolateTunnelField(A, u, A)
    let worst = 0
    for (let i = 0; i < n; i++) worst = Math.max(worst, Math.abs(back[i] - u[i]))
    expect(worst).toBeLessThan(1e-12)
  })

  it('reaches the same solution in fewer iterations', () => {
    // Conjugate gradients converge to the unique solution from any start (Hestenes & Stiefel 1952).
    const coarse = solveElastic(buildTunnelBlock(A).problem)
    const sc = buildTunnelBlock(B)
    const plain = solveElastic(sc.problem)
    const started = solveElastic({ ...sc.problem, initialGuess: interpolateTunnelField(A, coarse.displacement, B) })
    expect(started.stats.iterations).toBeLessThan(plain.stats.iterations)
    let worst = 0, big = 0
    for (let i = 0; i < plain.stress.length; i++) { worst = Math.max(worst, Math.abs(started.stress[i] - plain.stress[i])); big = Math.max(big, Math.abs(plain.stress[i])) }
    expect(worst / big).toBeLessThan(1e-6)
  })
})

describe('demo solver: multigrid preconditioner', () => {
  it('reaches the block-Jacobi solution in far fewer iterations', () => {
    // A multigrid cycle is a spectrally equivalent preconditioner: iteration counts stay nearly
    // flat under refinement (Briggs, Henson & McCormick, A Multigrid Tutorial, 2000).
    const spec = { ...TUNNEL_DEFAULTS, ...tunnelMeshLevel(1) }
    const sc = buildTunnelBlock(spec)
    const plain = solveElastic(sc.problem)
    const mg = solveElastic({ ...sc.problem, multigrid: tunnelHierarchy(TUNNEL_DEFAULTS, 1) })
    console.log(`tunnel level 1: block Jacobi ${plain.stats.iterations} iterations, multigrid ${mg.stats.iterations}`)
    expect(mg.stats.converged).toBe(true)
    expect(mg.stats.iterations).toBeLessThan(plain.stats.iterations / 5)
    let worst = 0, big = 0
    for (let i = 0; i < plain.stress.length; i++) { worst = Math.max(worst, Math.abs(mg.stress[i] - plain.stress[i])); big = Math.max(big, Math.abs(plain.stress[i])) }
    expect(worst / big).toBeLessThan(1e-6)
  })
})
