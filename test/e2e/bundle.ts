/**
 * CSV bundles for the end-to-end tests, made here from the box mesher and the io writer.
 * Invented data: a hex8 box carrying the end-loaded cantilever field of Timoshenko & Goodier,
 * Theory of Elasticity, 3rd ed. (1970), §21 (σx = -Pxy/I, τxy = -(P/2I)(c² - y²)).
 */
import { boxMesh } from '../../src/model/boxMesh.ts'
import { writeCsvBundle } from '../../src/io/index.ts'
import type { Model } from '../../src/model/model.ts'

export function cantileverModel(name: string, nx = 12, ny = 4, nz = 3): Model {
  const L = 3, c = 0.25, b = 0.3, P = 5e4
  const mesh = boxMesh({ nx, ny, nz, lx: L, ly: 2 * c, lz: b, y0: -c }, 'hex8')
  const I = (b * (2 * c) ** 3) / 12
  const stress = new Float64Array(6 * mesh.nodeCount)
  for (let i = 0; i < mesh.nodeCount; i++) {
    const x = mesh.coords[3 * i], y = mesh.coords[3 * i + 1], z = mesh.coords[3 * i + 2]
    stress[6 * i] = (-P * x * y) / I
    stress[6 * i + 3] = (-P / (2 * I)) * (c * c - y * y)
    // A small smooth extra so no component is identically zero (keeps the comparison honest).
    stress[6 * i + 2] = 1e3 * z
  }
  return { name, description: 'e2e fixture', units: { length: 'm', stress: 'Pa' }, mesh, stress, displacement: null, bodyForce: [0, 0, 0], warnings: [] }
}

/** The bundle as files for Playwright's setInputFiles. */
export function bundleFiles(model: Model): { name: string; mimeType: string; buffer: Buffer }[] {
  return writeCsvBundle(model).map((f) => ({
    name: f.name, mimeType: f.name.endsWith('.json') ? 'application/json' : 'text/csv', buffer: Buffer.from(f.text, 'utf8'),
  }))
}

export function bundleTexts(model: Model): { name: string; text: string }[] {
  return writeCsvBundle(model)
}
