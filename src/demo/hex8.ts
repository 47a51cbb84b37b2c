/**
 * The trilinear hexahedron (hex8) of the demo solver: shape functions, 2×2×2 Gauss rule, element
 * stiffness for an isotropic material, Gauss-point stress and extrapolation to the corners.
 *
 * Local node order and reference coordinates follow src/model/elementTypes.ts (hex8 corners at
 * ξ, η, ζ = ±1, bottom face 0-1-2-3 counter-clockwise seen from the top, 4-7 above 0-3).
 * Degrees of freedom are numbered 3·a + i (node a, component i = x, y, z); element matrices are
 * row-major 24 × 24.
 *
 * Fully integrated trilinear hexahedra are stiff in bending when a beam has few elements through
 * its depth (shear locking, common practice); the demos mesh finely where bending matters and the
 * cantilever test shows the error left at its mesh.
 */

import { shapeDerivatives, shapeValues } from '../mechanics/shapeFunctions.ts'

/** Reference corner signs of the hex8 nodes. */
export const HEX8_CORNER = Float64Array.of(
  -1, -1, -1, 1, -1, -1, 1, 1, -1, -1, 1, -1,
  -1, -1, 1, 1, -1, 1, 1, 1, 1, -1, 1, 1,
)

/** 2×2×2 Gauss points (Abramowitz & Stegun 1964, Table 25.4: ±1/√3, weights 1), point g sits next to corner g. */
export const HEX8_GAUSS = (() => {
  const g = 1 / Math.sqrt(3)
  const out = new Float64Array(24)
  for (let i = 0; i < 24; i++) out[i] = HEX8_CORNER[i] * g
  return out
})()

/** dN_a/dξ_k at (ξ, η, ζ): out[3a + k] (the element library's hex8). */
export function hex8ShapeDerivatives(out: Float64Array, xi: number, eta: number, zeta: number): Float64Array {
  return shapeDerivatives('hex8', xi, eta, zeta, out)
}

/** N_a at (ξ, η, ζ) (the element library's hex8). */
export function hex8ShapeValues(out: Float64Array, xi: number, eta: number, zeta: number): Float64Array {
  return shapeValues('hex8', xi, eta, zeta, out)
}

/** Reference derivatives at the 8 Gauss points, 24 per point; computed once. */
const DN_GAUSS = (() => {
  const out = new Float64Array(8 * 24)
  const tmp = new Float64Array(24)
  for (let g = 0; g < 8; g++) {
    hex8ShapeDerivatives(tmp, HEX8_GAUSS[3 * g], HEX8_GAUSS[3 * g + 1], HEX8_GAUSS[3 * g + 2])
    out.set(tmp, 24 * g)
  }
  return out
})()

/**
 * Extrapolation from the Gauss points to the corners: corner a = Σ_g X[8a + g]·σ_g. The Gauss
 * points form a small hexahedron with corners at ±1/√3; corner a lies at √3·(its signs) in that
 * hexahedron's own coordinates, where its trilinear shape functions are evaluated (common practice).
 */
export const HEX8_EXTRAPOLATION = (() => {
  const out = new Float64Array(64)
  const r = Math.sqrt(3)
  for (let a = 0; a < 8; a++) for (let g = 0; g < 8; g++) {
    let v = 0.125
    for (let k = 0; k < 3; k++) v *= 1 + HEX8_CORNER[3 * g + k] * HEX8_CORNER[3 * a + k] * r
    out[8 * a + g] = v
  }
  return out
})()

/**
 * Extrapolation in ξ and η only, with the mean over the two ζ layers of Gauss points: for slabs
 * extruded along ζ. The trilinear element cannot bend its ζ-lines into the parabola that a plate
 * in in-plane bending takes through its thickness, so its transverse shear has an error that is
 * odd in ζ within each element; full extrapolation carries that error, amplified √3 times, onto
 * the slab's free faces, while the ζ-mean drops it.
 */
export const HEX8_EXTRAPOLATION_PLANAR = (() => {
  const out = new Float64Array(64)
  const r = Math.sqrt(3)
  for (let a = 0; a < 8; a++) for (let g = 0; g < 8; g++) {
    let v = 0.125
    for (let k = 0; k < 2; k++) v *= 1 + HEX8_CORNER[3 * g + k] * HEX8_CORNER[3 * a + k] * r
    out[8 * a + g] = v
  }
  return out
})()

/** Centroid value for every corner (the mean of the 8 Gauss points). */
export const HEX8_CENTROID_SPREAD = new Float64Array(64).fill(0.125)

/**
 * Physical gradients dN_a/dx_k at Gauss point g of the element with corner coordinates `xyz`
 * (24 numbers): out[3a + k]. Returns det J (the volume scale), negative for an inverted element.
 */
export function hex8GradientsAtGauss(out: Float64Array, xyz: Float64Array, g: number): number {
  return physicalGradients(out, xyz, DN_GAUSS, 24 * g)
}

/** Reference derivatives at the centroid (ξ = η = ζ = 0). */
const DN_CENTRE = hex8ShapeDerivatives(new Float64Array(24), 0, 0, 0)

/** Physical gradients at the element centroid, as hex8GradientsAtGauss; returns det J there. */
export function hex8GradientsAtCentre(out: Float64Array, xyz: Float64Array): number {
  return physicalGradients(out, xyz, DN_CENTRE, 0)
}

function physicalGradients(out: Float64Array, xyz: Float64Array, dn: Float64Array, o: number): number {
  let j00 = 0, j01 = 0, j02 = 0, j10 = 0, j11 = 0, j12 = 0, j20 = 0, j21 = 0, j22 = 0
  for (let a = 0; a < 8; a++) {
    const d0 = dn[o + 3 * a], d1 = dn[o + 3 * a + 1], d2 = dn[o + 3 * a + 2]
    const x = xyz[3 * a], y = xyz[3 * a + 1], z = xyz[3 * a + 2]
    // J[k][i] = dx_i/dξ_k
    j00 += d0 * x; j01 += d0 * y; j02 += d0 * z
    j10 += d1 * x; j11 += d1 * y; j12 += d1 * z
    j20 += d2 * x; j21 += d2 * y; j22 += d2 * z
  }
  const c00 = j11 * j22 - j12 * j21, c01 = j02 * j21 - j01 * j22, c02 = j01 * j12 - j02 * j11
  const c10 = j12 * j20 - j10 * j22, c11 = j00 * j22 - j02 * j20, c12 = j02 * j10 - j00 * j12
  const c20 = j10 * j21 - j11 * j20, c21 = j01 * j20 - j00 * j21, c22 = j00 * j11 - j01 * j10
  const det = j00 * c00 + j01 * c10 + j02 * c20
  const inv = 1 / det
  for (let a = 0; a < 8; a++) {
    const d0 = dn[o + 3 * a], d1 = dn[o + 3 * a + 1], d2 = dn[o + 3 * a + 2]
    // dN/dx_i = Σ_k (J⁻¹)[i][k] dN/dξ_k
    out[3 * a] = (c00 * d0 + c01 * d1 + c02 * d2) * inv
    out[3 * a + 1] = (c10 * d0 + c11 * d1 + c12 * d2) * inv
    out[3 * a + 2] = (c20 * d0 + c21 * d1 + c22 * d2) * inv
  }
  return det
}

/**
 * Element stiffness of an isotropic hex8 (Lamé constants λ, μ), 2×2×2 Gauss rule:
 * K_ab,ij = Σ_g w·detJ (λ ∂_i N_a ∂_j N_b + μ ∂_j N_a ∂_i N_b + μ δ_ij ∇N_a·∇N_b),
 * which is Bᵀ D B written out for the isotropic D. `grad` is 24 numbers of scratch.
 * Returns the element volume (negative when the element is inverted).
 */
export function hex8Stiffness(out: Float64Array, xyz: Float64Array, lambda: number, mu: number, grad: Float64Array): number {
  out.fill(0)
  let volume = 0
  for (let g = 0; g < 8; g++) {
    const det = hex8GradientsAtGauss(grad, xyz, g)
    volume += det
    const l = lambda * det, m = mu * det
    for (let a = 0; a < 8; a++) {
      const ax = grad[3 * a], ay = grad[3 * a + 1], az = grad[3 * a + 2]
      for (let b = a; b < 8; b++) {
        const bx = grad[3 * b], by = grad[3 * b + 1], bz = grad[3 * b + 2]
        const dot = m * (ax * bx + ay * by + az * bz)
        const r0 = 3 * a * 24 + 3 * b, r1 = r0 + 24, r2 = r1 + 24
        out[r0] += l * ax * bx + m * ax * bx + dot
        out[r0 + 1] += l * ax * by + m * ay * bx
        out[r0 + 2] += l * ax * bz + m * az * bx
        out[r1] += l * ay * bx + m * ax * by
        out[r1 + 1] += l * ay * by + m * ay * by + dot
        out[r1 + 2] += l * ay * bz + m * az * by
        out[r2] += l * az * bx + m * ax * bz
        out[r2 + 1] += l * az * by + m * ay * bz
        out[r2 + 2] += l * az * bz + m * az * bz + dot
      }
    }
  }
  // Mirror the upper block triangle (b ≥ a) into the lower one: K_ba = K_abᵀ.
  for (let a = 0; a < 8; a++) for (let b = a + 1; b < 8; b++) {
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) out[(3 * b + j) * 24 + 3 * a + i] = out[(3 * a + i) * 24 + 3 * b + j]
  }
  return volume
}

/**
 * Stress (xx, yy, zz, xy, yz, xz) at the 8 Gauss points from the element's nodal displacements
 * `u` (24 numbers): out[6g + c]. Small strain, isotropic: σ = λ tr(ε) I + 2μ ε.
 */
export function hex8GaussStress(out: Float64Array, xyz: Float64Array, u: Float64Array, lambda: number, mu: number, grad: Float64Array): void {
  for (let g = 0; g < 8; g++) {
    hex8GradientsAtGauss(grad, xyz, g)
    stressFromGradients(out, 6 * g, grad, u, lambda, mu)
  }
}

/** Stress at the element centroid (the 1-point value), out[0..5]. */
export function hex8CentroidStress(out: Float64Array, xyz: Float64Array, u: Float64Array, lambda: number, mu: number, grad: Float64Array): void {
  hex8GradientsAtCentre(grad, xyz)
  stressFromGradients(out, 0, grad, u, lambda, mu)
}

function stressFromGradients(out: Float64Array, o: number, grad: Float64Array, u: Float64Array, lambda: number, mu: number): void {
  let exx = 0, eyy = 0, ezz = 0, gxy = 0, gyz = 0, gxz = 0
  for (let a = 0; a < 8; a++) {
    const dx = grad[3 * a], dy = grad[3 * a + 1], dz = grad[3 * a + 2]
    const ux = u[3 * a], uy = u[3 * a + 1], uz = u[3 * a + 2]
    exx += dx * ux; eyy += dy * uy; ezz += dz * uz
    gxy += dy * ux + dx * uy; gyz += dz * uy + dy * uz; gxz += dz * ux + dx * uz
  }
  const tr = lambda * (exx + eyy + ezz)
  out[o] = tr + 2 * mu * exx
  out[o + 1] = tr + 2 * mu * eyy
  out[o + 2] = tr + 2 * mu * ezz
  out[o + 3] = mu * gxy
  out[o + 4] = mu * gyz
  out[o + 5] = mu * gxz
}

/** Lamé constants from Young's modulus E and Poisson's ratio ν (any consistent stress unit). */
export function lameConstants(E: number, nu: number): { lambda: number; mu: number } {
  return { lambda: (E * nu) / ((1 + nu) * (1 - 2 * nu)), mu: E / (2 * (1 + nu)) }
}
