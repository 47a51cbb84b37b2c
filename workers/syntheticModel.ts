/**
 * Generated models for the demo fallback and for large-model tests. Invented data, says so.
 * The field is the end-loaded cantilever of Timoshenko & Goodier, Theory of Elasticity, 3rd ed.
 * (1970), §21: σx = -P·x·y / I, τxy = -(P / 2I)(c² - y²), all else zero, which satisfies
 * div σ = 0 exactly, leaves y = ±c and the z faces free, and carries the load P at x = 0.
 */
import { boxMesh } from '../src/model/boxMesh.ts'
import type { Model } from '../src/model/model.ts'
import { MAX_SYNTHETIC_ELEMENTS } from './protocol.ts'
import type { SyntheticSpec } from './protocol.ts'


/** Beam length L, half height c, thickness b (m); end load P (N). */
const L = 4, C = 0.5, B = 0.5, P = 2e5

export function syntheticModel(spec: SyntheticSpec): Model {
  const target = Math.min(MAX_SYNTHETIC_ELEMENTS, Math.max(6, Math.floor(spec.elements) || 6))
  // Six tets per cell; cells shaped roughly like the beam (8 : 2 : 1).
  const cells = Math.ceil(target / 6)
  const k = Math.cbrt(cells / 16)
  let nx = Math.max(1, Math.round(8 * k))
  const ny = Math.max(1, Math.round(2 * k)), nz = Math.max(1, Math.round(k))
  while (6 * nx * ny * nz < target) nx++
  const mesh = boxMesh({ nx, ny, nz, lx: L, ly: 2 * C, lz: B, y0: -C }, 'tet4')
  const I = (B * (2 * C) ** 3) / 12
  const N = mesh.nodeCount
  const stress = new Float64Array(6 * N)
  const x = mesh.coords
  for (let i = 0; i < N; i++) {
    const xi = x[3 * i], yi = x[3 * i + 1]
    stress[6 * i] = (-P * xi * yi) / I
    stress[6 * i + 3] = (-P / (2 * I)) * (C * C - yi * yi)
  }
  return {
    name: `Generated cantilever block (${mesh.elementCount.toLocaleString('en-US')} tet4)`,
    description: 'Invented demo data: the end-loaded cantilever field of Timoshenko & Goodier §21 on a box of tetrahedra; load enters at x = 0 and leaves at x = 4 m.',
    units: { length: 'm', stress: 'Pa' },
    mesh,
    stress,
    displacement: null,
    bodyForce: [0, 0, 0],
    warnings: [],
  }
}
