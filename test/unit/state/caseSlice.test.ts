/**
 * The load-case slice of the store (src/state/caseSlice.ts): a new model starts at its first
 * case without combinations of the user's; a saved combination replaces one of the same name
 * (names match without regard to letter case); removing the one shown goes back to the first case;
 * the picker lists cases, the model's combinations, then the user's.
 */
import { describe, expect, it } from 'vitest'
import { createTractusStore } from '../../../src/state/store.ts'
import { factorsText, pickableCases } from '../../../src/state/caseSlice.ts'
import type { LoadedModel } from '../../../workers/protocol.ts'

function loaded(): LoadedModel {
  return {
    summary: {
      name: 'm', description: '', units: { length: 'm', stress: 'Pa' }, nodeCount: 8, elementCount: 1, boundaryFaceCount: 6,
      elementTypes: { hex8: 1 }, bounds: { min: [0, 0, 0], max: [1, 1, 1] }, bodyForce: [0, 0, 0], warnings: [], source: 'synthetic:x',
      cases: [{ name: 'dead', description: 'own weight', bodyForce: [0, 0, -1], displacement: false }, { name: 'wind', description: '', bodyForce: [0, 0, 0], displacement: false }],
      combinations: [{ name: 'ULS', factors: { dead: 1.35, wind: 1.5 } }], shownCase: 'dead',
    },
    surface: {} as never, audit: {} as never,
  }
}

describe('load-case slice', () => {
  it('follows a new model, keeps the user\'s combinations by name and falls back to the first case', () => {
    const store = createTractusStore()
    const st = () => store.getState()
    st().modelLoaded(loaded())
    expect(st().caseName).toBe('dead')
    st().saveCombination({ name: 'k1', factors: { dead: 1 } })
    st().saveCombination({ name: 'K1', factors: { wind: 2 } })
    expect(st().userCombinations).toEqual([{ name: 'K1', factors: { wind: 2 } }])
    st().chooseCase('K1')
    expect(pickableCases(st().model, st().userCombinations).map((c) => `${c.kind}:${c.name}`)).toEqual(['case:dead', 'case:wind', 'combination:ULS', 'user:K1'])
    st().removeCombination('k1')
    expect(st().caseName).toBe('dead')
    expect(st().userCombinations).toEqual([])
    st().saveCombination({ name: 'k2', factors: { dead: 1 } })
    st().modelLoaded(loaded())
    expect(st().userCombinations).toEqual([])
    expect(factorsText({ name: 'x', factors: { dead: -1, wind: 0.5 } })).toBe('−1 × dead + 0.5 × wind')
  })
})
