import type { BlockCsr } from './blockCsr.ts'
import { addElementMatrix, createBlockCsr } from './blockCsr.ts'
import { hex8Stiffness } from './hex8.ts'

/**
 * Assembles the stiffness of an isotropic hex8 mesh (Lamé constants λ, μ) into block CSR.
 * Throws RangeError for an inverted element (the demo meshers build positive ones, so this is a
 * programming error, not user input).
 */
export function assembleStiffness(coords: Float64Array, conn: Int32Array, lambda: number, mu: number): BlockCsr {
  const nodes = coords.length / 3, elements = conn.length / 8
  const k = createBlockCsr(conn, 8, nodes)
  const ke = new Float64Array(576), xyz = new Float64Array(24), grad = new Float64Array(24)
  const en = new Int32Array(8)
  for (let e = 0; e < elements; e++) {
    for (let a = 0; a < 8; a++) {
      const n = conn[8 * e + a]
      en[a] = n
      xyz[3 * a] = coords[3 * n]; xyz[3 * a + 1] = coords[3 * n + 1]; xyz[3 * a + 2] = coords[3 * n + 2]
    }
    const vol = hex8Stiffness(ke, xyz, lambda, mu, grad)
    if (!(vol > 0)) throw new RangeError(`demo mesh element ${e + 1} is inverted or flat (volume ${vol})`)
    addElementMatrix(k, en, ke)
  }
  return k
}
