import { describe, expect, it } from 'vitest'
import { computeOptionsFromHash } from '../../../src/app/computeOptions.ts'
import { computeLine } from '../../../src/app/cards/ModelCard.tsx'

describe('compute options from the page address', () => {
  it('reads threads 1..16 and sharing=copy, ignores anything else', () => {
    expect(computeOptionsFromHash('#model=block&threads=1')).toEqual({ threads: 1 })
    expect(computeOptionsFromHash('#threads=3&sharing=copy')).toEqual({ threads: 3, sharing: 'copy' })
    for (const bad of ['#threads=0', '#threads=17', '#threads=2.5', '#threads=abc', '#threads=', '#sharing=shared', '#%E0%A4%A']) {
      expect(computeOptionsFromHash(bad)).toEqual({})
    }
  })
})

describe('the compute line of the model card', () => {
  it('says how long the load took and where the element balance ran', () => {
    const stagesMs = [['generate', 250], ['boundary', 500.5], ['elementBalance', 0]] as const
    expect(computeLine({ stagesMs, workers: 1, sharing: 'shared' })).toBe('Computed in 0.75 s; element balance on 1 pool worker beside the engine (shared memory).')
    expect(computeLine({ stagesMs, workers: 3, sharing: 'copy' })).toBe('Computed in 0.75 s; element balance on 3 pool workers beside the engine (copied).')
    expect(computeLine({ stagesMs, workers: 0, sharing: 'none', fallback: 'a pool worker failed (boom)' }))
      .toBe('Computed in 0.75 s; element balance in the engine. The worker pool stood down: a pool worker failed (boom).')
  })
})
