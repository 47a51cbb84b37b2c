/**
 * Fuzz: mutated CSV bundles and .tractus containers (test/fuzz/mutations.ts). Every input must
 * either throw an InputError or load a model that passes validateModel; nothing else may escape,
 * and no case may hang (2 s bound per case, a guard against runaway loops, not a speed goal).
 * Seeded with fast-check; the seed is printed so a failure can be replayed.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { InputError } from '../../src/model/errors.ts'
import { readModelFiles } from '../../src/io/detect.ts'
import { validateModel } from '../../src/io/validateModel.ts'
import { applyCase, fuzzCase } from '../fuzz/mutations.ts'

const SEED = Number(process.env.TRACTUS_FUZZ_SEED ?? 424242)
console.log(`io fuzz: fast-check seed ${SEED} (set TRACTUS_FUZZ_SEED to replay another)`)

describe('fuzzed inputs', () => {
  it('throw InputError or load a valid model, each quickly (2000 cases)', () => {
    const kinds = new Map<string, number>()
    let loaded = 0
    fc.assert(fc.property(fuzzCase, (c) => {
      const files = applyCase(c)
      const t0 = performance.now()
      let model = null
      try {
        model = readModelFiles(files)
      } catch (e) {
        if (!(e instanceof InputError)) throw e
        expect(e.message.length).toBeGreaterThan(0)
        kinds.set(e.kind, (kinds.get(e.kind) ?? 0) + 1)
      }
      if (model) { validateModel(model); loaded++ }
      expect(performance.now() - t0).toBeLessThan(2000)
    }), { seed: SEED, numRuns: 2000 })
    console.log(`io fuzz: ${loaded} loaded, errors by kind ${JSON.stringify(Object.fromEntries([...kinds].sort()))}`)
    // The mutations must reach many different checks, not just one.
    expect(kinds.size).toBeGreaterThanOrEqual(10)
  })
})
