/**
 * Mixed meshes in Chromium: a conforming box of hex8, pyramid5, tet4 and wedge6, and its quadratic
 * twin of hex20, pyramid13, tet10 and wedge15 (src/demo/mixedMesh.ts), carrying a uniform stress σ.
 * Cauchy's formula on a uniform state (Malvern, Introduction to the Mechanics of a Continuous
 * Medium, 1969, ch. 3): the body is in balance to round-off and a section through it carries
 * F = σm·A; the browser must show that for every element type the registry holds.
 */
import { describe, expect, it } from 'vitest'
import { mixedBoxMesh, mixedLayout } from '../../src/demo/mixedMesh.ts'
import type { BoxSpec } from '../../src/model/boxMesh.ts'
import type { Model } from '../../src/model/model.ts'
import { bundleFiles } from './bundle.ts'
import { figure, newPage, useBrowserSession, OUT_DIR, waitForCut, waitForModel } from './browser.ts'

const s = useBrowserSession()
const SIGMA = [120, -35, 60, 25, -18, 42] // xx yy zz xy yz xz, Pa (invented test state)
const spec: BoxSpec = { nx: 2, ny: 2, nz: 3, lx: 2, ly: 1.5, lz: 3, x0: 0, y0: 0, z0: 0 }

function mixedModel(quadratic: boolean): Model {
  const mesh = mixedBoxMesh(spec, mixedLayout(spec), quadratic)
  const stress = new Float64Array(6 * mesh.nodeCount)
  for (let i = 0; i < mesh.nodeCount; i++) stress.set(SIGMA, 6 * i)
  const name = quadratic ? 'mixed quadratic box' : 'mixed linear box'
  return { name, description: 'e2e fixture: uniform stress', units: { length: 'm', stress: 'Pa' }, mesh, stress, displacement: null, bodyForce: [0, 0, 0], warnings: [] }
}

describe('mixed meshes of every registered type', () => {
  for (const quadratic of [false, true]) {
    it(`${quadratic ? 'hex20 + pyramid13 + tet10 + wedge15' : 'hex8 + pyramid5 + tet4 + wedge6'}: balanced, and a cut carries σm·A`, async () => {
      const model = mixedModel(quadratic)
      const page = await newPage(s)
      await waitForModel(page)
      await page.setInputFiles('[data-testid="file-input"]', bundleFiles(model))
      await page.waitForFunction((n) => document.querySelector('[data-testid="model-name"]')?.textContent === n, model.name)
      await waitForModel(page)
      const counts = (await page.textContent('.counts')) ?? ''
      expect(counts).toContain(`${model.mesh.elementCount} elements`)
      // whole body in balance to round-off
      const verdict = await page.getAttribute('[data-testid="balance-verdict"]', 'data-kind')
      expect(verdict).toBe('mesh')
      expect((await page.textContent('[data-testid="balance-verdict"]')) ?? '').toMatch(/in balance/)
      // a cut normal to z at mid height: F = σ·e_z · A with A = 2 × 1.5
      await page.check('[data-testid="cut-enabled"]')
      await page.click('[data-testid="cut-snap-z"]')
      for (const [id, v] of [['cut-px', '1'], ['cut-py', '0.75'], ['cut-pz', '1.3']] as const) {
        await page.fill(`[data-testid="${id}"]`, v)
        await page.press(`[data-testid="${id}"]`, 'Enter')
      }
      await waitForCut(page)
      // the fields are applied one by one: wait for the result of the last plane (normal +z)
      await page.waitForFunction(() => {
        const n = (key: string) => Number(document.querySelector(`[data-testid="cut-result"] tr[data-row="${key}"] .num`)?.getAttribute('data-model'))
        return Math.abs(n('cz') - 1.3) < 1e-9 && Math.abs(n('area') - 3) < 1e-9
      })
      const A = 2 * 1.5
      expect(Math.abs(await figure(page, 'area') - A)).toBeLessThan(1e-9)
      const want = [SIGMA[5] * A, SIGMA[4] * A, SIGMA[2] * A] // σ e_z = (σxz, σyz, σzz)
      for (const [k, w] of [['Fx', want[0]], ['Fy', want[1]], ['Fz', want[2]]] as const) {
        expect(Math.abs(await figure(page, k) - w), k).toBeLessThan(1e-9 * 200 * A)
      }
      await page.screenshot({ path: `${OUT_DIR}/mixed-${quadratic ? 'quadratic' : 'linear'}.png` })
      await page.close()
    })
  }
})
