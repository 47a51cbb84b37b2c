import { describe, expect, it } from 'vitest'
import { Ray, Vector3 } from 'three'
import { closestOnLine } from '../../../src/scene/closestOnLine.ts'

describe('closestOnLine (closest points of two lines, elementary geometry)', () => {
  it('reads the parameter along the line under a crossing ray', () => {
    // Line: the x axis. Ray from (3, 5, 0) straight down -y crosses it at x = 3.
    expect(closestOnLine(new Vector3(0, 0, 0), new Vector3(1, 0, 0), new Ray(new Vector3(3, 5, 0), new Vector3(0, -1, 0)))).toBeCloseTo(3, 12)
    // Skew ray passing above the line at x = -2 (offset in z): still x = -2.
    expect(closestOnLine(new Vector3(1, 0, 0), new Vector3(1, 0, 0), new Ray(new Vector3(-2, 4, 1), new Vector3(0, -1, 0)))).toBeCloseTo(-3, 12)
  })

  it('gives NaN for a ray parallel to the line', () => {
    expect(closestOnLine(new Vector3(), new Vector3(0, 0, 1), new Ray(new Vector3(1, 1, 1), new Vector3(0, 0, -1)))).toBeNaN()
  })
})
