/**
 * The release bundle carries no test hook: `vite build` (mode production) leaves out the browser
 * tests' window hook (src/app/testHooks.ts) and the worker's deliberate failure, while the
 * end-to-end build (`vite build --mode e2e`, what `npm run e2e` serves) has both, which shows the
 * scan below would see them. Builds into temporary folders; the repository's dist/ is untouched.
 */
import { describe, expect, it } from 'vitest'
import { build } from 'vite'
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'

const root = resolve(import.meta.dirname, '../../..')
const HOOKS = ['__tractusTest', 'deliberate failure inside the engine'] as const

/** Builds the app in `mode` and returns which of HOOKS appear in any emitted file. */
async function hooksIn(mode: string): Promise<string[]> {
  const outDir = mkdtempSync(join(tmpdir(), `tractus-${mode}-`))
  try {
    await build({ root, configFile: resolve(root, 'vite.config.ts'), mode, logLevel: 'silent', build: { outDir, emptyOutDir: true } })
    const files = readdirSync(outDir, { recursive: true, withFileTypes: true }).filter((d) => d.isFile() && /\.(js|html)$/.test(d.name))
    const text = files.map((d) => readFileSync(join(d.parentPath, d.name), 'utf8')).join('\n')
    expect(text.length).toBeGreaterThan(0)
    return HOOKS.filter((h) => text.includes(h))
  } finally {
    rmSync(outDir, { recursive: true, force: true })
  }
}

describe('release bundle', () => {
  it('has no test hook; the end-to-end build has them', async () => {
    expect(await hooksIn('production')).toEqual([])
    expect(await hooksIn('e2e')).toEqual([...HOOKS])
  }, 120_000)
})
