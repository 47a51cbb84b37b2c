import { assembleStiffness } from './assembleStiffness.ts'
import { lameConstants } from './hex8.ts'
import { createMultigrid } from './multigrid.ts'
import type { MultigridHierarchy } from './multigrid.ts'
import { solvePcg } from './pcg.ts'
import { recoverPatchStress } from './patchRecovery.ts'
import { recoverNodalStress } from './stressRecovery.ts'
import type { RecoveryMode } from './stressRecovery.ts'

/**
 * A small linear-elastic problem on a hex8 mesh, in any consistent units (length L, stress S,
 * force S·L²).
 * - `coords` Float64Array(3N), `conn` Int32Array(8E) hex8 connectivity (elementTypes.ts order);
 * - `E` Young's modulus (S), `nu` Poisson's ratio; isotropic, small strain;
 * - `fixed` Uint8Array(3N): 1 holds that displacement component at zero (supports, symmetry rollers);
 * - `load` Float64Array(3N): external nodal forces, consistent loads of tractions and body force.
 */
export interface ElasticProblem {
  readonly coords: Float64Array
  readonly conn: Int32Array
  readonly E: number
  readonly nu: number
  readonly fixed: Uint8Array
  readonly load: Float64Array
  /** Relative residual ‖f - Au‖/‖f‖ to stop at; 1e-8 by default. */
  readonly tolerance?: number
  readonly maxIterations?: number
  /** Initial guess of the displacement (3N), e.g. a coarser mesh's solution interpolated; zero by default. */
  readonly initialGuess?: Float64Array
  /** Coarser meshes of the same body for a multigrid preconditioner (multigrid.ts); block Jacobi when absent. */
  readonly multigrid?: MultigridHierarchy
  /**
   * Nodal stress recovery: 'patch' (default) superconvergent patch recovery (patchRecovery.ts),
   * or element values spread to the corners and averaged at nodes: 'extrapolate' (Gauss points
   * extrapolated), 'centroid' (centroid values).
   */
  readonly recovery?: 'patch' | RecoveryMode
}

/** Figures of one solve, for the generator's printout and the report. */
export interface SolveStats {
  readonly nodes: number
  readonly elements: number
  readonly dofs: number
  readonly freeDofs: number
  readonly matrixBlocks: number
  readonly iterations: number
  readonly relativeResidual: number
  readonly converged: boolean
  readonly assemblySeconds: number
  readonly solveSeconds: number
  readonly recoverySeconds: number
}

/**
 * The solution: displacement (3N, L), recovered nodal stress (6N, S, order xx yy zz xy yz xz),
 * reaction (3N, force: A u - f at fixed components, zero elsewhere) and solve figures.
 */
export interface ElasticSolution {
  readonly displacement: Float64Array
  readonly stress: Float64Array
  readonly reaction: Float64Array
  readonly stats: SolveStats
}

/**
 * Assembles the stiffness in block CSR, solves by block-Jacobi preconditioned conjugate gradients
 * and recovers nodal stress (patch recovery by default). Throws RangeError for an inverted element (the demo meshers build
 * positive ones, so this is a programming error, not user input).
 */
export function solveElastic(problem: ElasticProblem): ElasticSolution {
  const { coords, conn, E, nu, fixed, load } = problem
  const nodes = coords.length / 3, elements = conn.length / 8
  const { lambda, mu } = lameConstants(E, nu)
  const t0 = performance.now()
  const k = assembleStiffness(coords, conn, lambda, mu)
  const t1 = performance.now()
  const u = problem.initialGuess ? Float64Array.from(problem.initialGuess) : new Float64Array(3 * nodes)
  const pre = problem.multigrid ? createMultigrid(k, fixed, problem.multigrid, lambda, mu) : undefined
  const res = solvePcg(u, k, load, fixed, problem.tolerance ?? 1e-8, problem.maxIterations ?? 20000, pre)
  const t2 = performance.now()
  const mode = problem.recovery ?? 'patch'
  const averaged = recoverNodalStress(new Float64Array(6 * nodes), coords, conn, u, lambda, mu, mode === 'patch' ? 'extrapolate' : mode)
  const stress = mode === 'patch' ? recoverPatchStress(new Float64Array(6 * nodes), coords, conn, u, lambda, mu, averaged) : averaged
  const reaction = new Float64Array(3 * nodes)
  // A u at the fixed components: blockCsrMultiply would do all rows; only the fixed ones are needed.
  const rs = k.rowStart, col = k.col, v = k.values
  for (let i = 0; i < nodes; i++) {
    if (!fixed[3 * i] && !fixed[3 * i + 1] && !fixed[3 * i + 2]) continue
    for (let r = 0; r < 3; r++) {
      if (!fixed[3 * i + r]) continue
      let s = 0
      for (let p = rs[i]; p < rs[i + 1]; p++) {
        const j = 3 * col[p], o = 9 * p + 3 * r
        s += v[o] * u[j] + v[o + 1] * u[j + 1] + v[o + 2] * u[j + 2]
      }
      reaction[3 * i + r] = s - load[3 * i + r]
    }
  }
  const t3 = performance.now()
  let free = 0
  for (let d = 0; d < fixed.length; d++) if (!fixed[d]) free++
  return {
    displacement: u, stress, reaction,
    stats: {
      nodes, elements, dofs: 3 * nodes, freeDofs: free, matrixBlocks: k.col.length,
      iterations: res.iterations, relativeResidual: res.relativeResidual, converged: res.converged,
      assemblySeconds: (t1 - t0) / 1000, solveSeconds: (t2 - t1) / 1000, recoverySeconds: (t3 - t2) / 1000,
    },
  }
}

