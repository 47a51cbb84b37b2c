/**
 * The bounded-section input (assemblySlice.ts parseLimit): good inputs become a limit in model
 * units; a bad field is named with a message a user can act on (the store then keeps the previous
 * limit and cut).
 */
import { describe, expect, it } from 'vitest'
import { parseLimit } from '../../../src/state/assemblySlice.ts'

const known = [1, 2, 3]
const base = { parts: '', disc: false, centre: '', radius: '', lengthFactor: 1 }

describe('bounded-section input', () => {
  it('reads parts and a disc, converting from the shown length unit', () => {
    expect(parseLimit({ ...base, parts: '1, 3' }, known)).toEqual({ parts: [1, 3] })
    expect(parseLimit({ ...base, disc: true, centre: '1000, 0, -500', radius: '20', lengthFactor: 1000 }, known)).toEqual({ within: { center: [1, 0, -0.5], radius: 0.02 } })
    expect(parseLimit(base, known)).toBeNull()
  })
  it('names the bad field', () => {
    expect(parseLimit({ ...base, parts: '1,x' }, known)).toMatchObject({ field: 'parts', message: expect.stringMatching(/whole part numbers/) })
    expect(parseLimit({ ...base, parts: '1.5' }, known)).toMatchObject({ field: 'parts' })
    expect(parseLimit({ ...base, parts: '7' }, known)).toMatchObject({ field: 'parts', message: expect.stringMatching(/no element has part 7; the model's parts are 1, 2, 3/) })
    expect(parseLimit({ ...base, disc: true, centre: '1,2', radius: '1' }, known)).toMatchObject({ field: 'centre' })
    expect(parseLimit({ ...base, disc: true, centre: '1,2,3', radius: '0' }, known)).toMatchObject({ field: 'radius' })
    expect(parseLimit({ ...base, disc: true, centre: '1,2,3', radius: '-2' }, known)).toMatchObject({ field: 'radius' })
    expect(parseLimit({ ...base, disc: true, centre: '1,2,3', radius: '' }, known)).toMatchObject({ field: 'radius' })
  })
})
