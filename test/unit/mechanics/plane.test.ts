/**
 * The one plane rule (src/mechanics/plane.ts): a normal of any length is made unit; a zero,
 * non-finite or short normal and a non-finite point are InputErrors naming what was given; the
 * signed distance is (x − p)·m (analytic geometry, common practice).
 */
import { describe, expect, it } from 'vitest'
import { isInputError } from '../../../src/model/errors.ts'
import { checkPoint, makePlane, planeDistance, unitNormal } from '../../../src/mechanics/plane.ts'

function inputErrorOf(f: () => unknown): Error {
  try { f() } catch (e) { if (isInputError(e)) return e; throw e }
  throw new Error('no error')
}

describe('plane', () => {
  it('unitNormal scales any non-zero finite vector to length 1', () => {
    expect(unitNormal([0, 0, -7])).toEqual([0, 0, -1])
    const n = unitNormal([3, 4, 12])
    expect(n).toEqual([3 / 13, 4 / 13, 12 / 13])
    // Tiny and huge vectors keep their direction (Math.hypot does not underflow or overflow).
    expect(unitNormal([1e-300, 0, 0])).toEqual([1, 0, 0])
    expect(unitNormal([0, 1e300, 1e300])[1]).toBeCloseTo(Math.SQRT1_2, 15)
  })

  it.each([
    ['zero', [0, 0, 0]], ['NaN', [NaN, 1, 0]], ['infinite', [Infinity, 0, 0]], ['short', [1, 2]],
  ])('a %s normal is an InputError that says what was given and how to fix it', (_label, n) => {
    const e = inputErrorOf(() => unitNormal(n, 'sweep direction'))
    expect(e.message).toMatch(/the sweep direction \(.*\) has no direction; give three finite numbers, not all zero/)
  })

  it('checkPoint and makePlane refuse a non-finite point by name', () => {
    expect(inputErrorOf(() => checkPoint([0, NaN, 0], 'moment point')).message).toMatch(/the moment point \(0, NaN, 0\) must be three finite numbers/)
    expect(inputErrorOf(() => makePlane([0, 0, Infinity], [0, 0, 1])).message).toMatch(/section point/)
    expect(inputErrorOf(() => makePlane([0, 0, 0], [0, 0, 0])).message).toMatch(/section normal \(0, 0, 0\) has no direction/)
  })

  it('planeDistance is the signed distance along the unit normal', () => {
    const plane = makePlane([1, 2, 3], [0, 2, 0])
    expect(plane).toEqual({ point: [1, 2, 3], normal: [0, 1, 0] })
    expect(planeDistance(plane, 5, 4.5, -1)).toBe(2.5)
    expect(planeDistance(plane, 0, 0, 0)).toBe(-2)
  })
})
