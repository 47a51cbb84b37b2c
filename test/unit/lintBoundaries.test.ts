/**
 * The import boundaries of eslint.config.js bite: a one-line file placed (virtually) in each guarded
 * folder that imports across a forbidden arrow is reported by `no-restricted-imports`, and the
 * same file with an allowed import is not. The rules are the house's own directions (DEVELOPERS.md,
 * "Layout and the direction of dependencies"): app -> scene -> state -> model, app -> state,
 * app -> engine client -> workers, state -> workers/protocol (types).
 */
import { describe, expect, it } from 'vitest'
import { ESLint } from 'eslint'
import { resolve } from 'node:path'

const root = resolve(import.meta.dirname, '../..')
const eslint = new ESLint({ cwd: root })

/** Messages of `no-restricted-imports` for `code` placed at `file` (a path under the repository). */
async function restricted(file: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: resolve(root, file) })
  return result.messages.filter((m) => m.ruleId === 'no-restricted-imports').map((m) => m.message)
}

// Each case: a file in a guarded folder, an import it may not make, and one it may.
const CASES: readonly { readonly file: string; readonly forbidden: readonly string[]; readonly allowed: string }[] = [
  {
    file: 'workers/lintProbe.ts',
    forbidden: ['../src/app/engine.ts', '../src/app/cards/CutCard.tsx', '../src/scene/SceneView.tsx', '../src/demo/liftingLug.ts', '../src/state/store.ts'],
    allowed: './protocol.ts',
  },
  {
    file: 'src/scene/lintProbe.ts',
    forbidden: ['../app/store.ts', '../app/ui/Num.tsx', '../mechanics/sectionCut.ts'],
    allowed: '../state/store.ts',
  },
  {
    file: 'src/state/lintProbe.ts',
    forbidden: ['../app/engine.ts', '../scene/SceneView.tsx', '../scene/colourMaps.ts', '../../workers/engine.worker.ts', 'three'],
    allowed: '../../workers/protocol.ts',
  },
  {
    file: 'src/mechanics/lintProbe.ts',
    forbidden: ['../state/store.ts', '../app/format.ts', '../../workers/protocol.ts', 'react'],
    allowed: '../model/model.ts',
  },
]

describe('eslint import boundaries', () => {
  for (const c of CASES) {
    for (const target of c.forbidden) {
      it(`${c.file} may not import ${target}`, async () => {
        const messages = await restricted(c.file, `import { x } from '${target}'\nexport const y = x\n`)
        expect(messages.length, `no-restricted-imports on ${target}`).toBe(1)
      })
    }
    it(`${c.file} may import ${c.allowed}`, async () => {
      expect(await restricted(c.file, `import { x } from '${c.allowed}'\nexport const y = x\n`)).toEqual([])
    })
  }
})
