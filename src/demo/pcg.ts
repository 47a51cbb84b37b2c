import type { BlockCsr } from './blockCsr.ts'
import { blockCsrMultiply, blockIndex } from './blockCsr.ts'

/** Outcome of a conjugate-gradient solve. */
export interface PcgResult {
  readonly iterations: number
  /** ‖f - A u‖ / ‖f‖ over the free degrees of freedom at exit. */
  readonly relativeResidual: number
  readonly converged: boolean
}

/**
 * Solves A u = f for the free degrees of freedom by the conjugate gradient method preconditioned
 * with the inverse of each node's 3×3 diagonal block (block Jacobi). `fixed[d] = 1` holds dof d at
 * zero: the solve works on P A P with P the projection onto the free dofs, so the matrix stays
 * untouched and the reactions can be read afterwards as A u - f. Starts from the u given (an
 * initial guess, for example a coarser mesh's solution; fixed entries are zeroed) and writes the
 * solution into it.
 * Hestenes & Stiefel (1952) for the method; block Jacobi is common practice. `precondition`
 * replaces block Jacobi (for example by a multigrid cycle, multigrid.ts).
 */
export function solvePcg(u: Float64Array, a: BlockCsr, f: Float64Array, fixed: Uint8Array, tolerance: number, maxIterations: number, precondition?: Preconditioner): PcgResult {
  const n = f.length
  const inv = precondition ? null : blockJacobiInverse(a, fixed)
  const apply: Preconditioner = precondition ?? ((z, r) => applyBlockDiagonal(z, inv!, r))
  const r = new Float64Array(n), z = new Float64Array(n), p = new Float64Array(n), q = new Float64Array(n)
  let fnorm = 0
  for (let d = 0; d < n; d++) {
    if (fixed[d]) u[d] = 0
    else fnorm += f[d] * f[d]
  }
  fnorm = Math.sqrt(fnorm)
  if (fnorm === 0) { u.fill(0); return { iterations: 0, relativeResidual: 0, converged: true } }
  blockCsrMultiply(q, a, u)
  let r0 = 0
  for (let d = 0; d < n; d++) { r[d] = fixed[d] ? 0 : f[d] - q[d]; r0 += r[d] * r[d] }
  // An initial guess that already solves the system needs no step (and would divide 0 by 0).
  if (Math.sqrt(r0) / fnorm < tolerance) return { iterations: 0, relativeResidual: Math.sqrt(r0) / fnorm, converged: true }
  apply(z, r)
  p.set(z)
  let rz = dot(r, z)
  let it = 0, rel = 1
  while (it < maxIterations) {
    blockCsrMultiply(q, a, p)
    for (let d = 0; d < n; d++) if (fixed[d]) q[d] = 0
    const alpha = rz / dot(p, q)
    let rr = 0
    for (let d = 0; d < n; d++) {
      u[d] += alpha * p[d]
      const rd = r[d] - alpha * q[d]
      r[d] = rd
      rr += rd * rd
    }
    it++
    rel = Math.sqrt(rr) / fnorm
    if (rel < tolerance) break
    apply(z, r)
    const rzNew = dot(r, z)
    const beta = rzNew / rz
    rz = rzNew
    for (let d = 0; d < n; d++) p[d] = z[d] + beta * p[d]
  }
  // The recurrence drifts from the true residual; report the true one.
  blockCsrMultiply(q, a, u)
  let rr = 0
  for (let d = 0; d < n; d++) if (!fixed[d]) { const e = f[d] - q[d]; rr += e * e }
  rel = Math.sqrt(rr) / fnorm
  return { iterations: it, relativeResidual: rel, converged: rel < tolerance * 10 }
}

/** z = M⁻¹ r for a symmetric positive definite M; r is zero at fixed dofs and z must be too. */
export type Preconditioner = (z: Float64Array, r: Float64Array) => void

/**
 * Inverses of the nodes' 3×3 diagonal blocks (9 per node), with each fixed component's row and
 * column replaced by the identity's so fixed dofs stay decoupled.
 */
export function blockJacobiInverse(a: BlockCsr, fixed: Uint8Array): Float64Array {
  const nodes = a.nodeCount
  const inv = new Float64Array(9 * nodes)
  const blk = new Float64Array(9)
  for (let i = 0; i < nodes; i++) {
    const p = 9 * blockIndex(a, i, i)
    for (let k = 0; k < 9; k++) blk[k] = a.values[p + k]
    for (let r = 0; r < 3; r++) if (fixed[3 * i + r]) {
      for (let c = 0; c < 3; c++) { blk[3 * r + c] = 0; blk[3 * c + r] = 0 }
      blk[4 * r] = 1
    }
    invert3(inv, 9 * i, blk)
  }
  return inv
}

function dot(x: Float64Array, y: Float64Array): number {
  let s = 0
  for (let i = 0; i < x.length; i++) s += x[i] * y[i]
  return s
}

/** z = D⁻¹ r with D⁻¹ from blockJacobiInverse. */
export function applyBlockDiagonal(z: Float64Array, inv: Float64Array, r: Float64Array): void {
  for (let i = 0, o = 0; i < r.length; i += 3, o += 9) {
    const r0 = r[i], r1 = r[i + 1], r2 = r[i + 2]
    z[i] = inv[o] * r0 + inv[o + 1] * r1 + inv[o + 2] * r2
    z[i + 1] = inv[o + 3] * r0 + inv[o + 4] * r1 + inv[o + 5] * r2
    z[i + 2] = inv[o + 6] * r0 + inv[o + 7] * r1 + inv[o + 8] * r2
  }
}

/** Inverse of a 3×3 row-major matrix by cofactors, written at out[o..o+8]. */
function invert3(out: Float64Array, o: number, m: Float64Array): void {
  const a = m[0], b = m[1], c = m[2], d = m[3], e = m[4], f = m[5], g = m[6], h = m[7], k = m[8]
  const A = e * k - f * h, B = f * g - d * k, C = d * h - e * g
  const det = a * A + b * B + c * C
  // A singular diagonal block means a node no element stiffens: leave it unpreconditioned.
  if (det === 0 || !Number.isFinite(det)) { out.fill(0, o, o + 9); out[o] = out[o + 4] = out[o + 8] = 1; return }
  const s = 1 / det
  out[o] = A * s; out[o + 1] = (c * h - b * k) * s; out[o + 2] = (b * f - c * e) * s
  out[o + 3] = B * s; out[o + 4] = (a * k - c * g) * s; out[o + 5] = (c * d - a * f) * s
  out[o + 6] = C * s; out[o + 7] = (b * g - a * h) * s; out[o + 8] = (a * e - b * d) * s
}
