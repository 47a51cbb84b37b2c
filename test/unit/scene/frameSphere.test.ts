import { describe, expect, it } from 'vitest'
import { PerspectiveCamera, Vector3 } from 'three'
import { DEFAULT_VIEW_DIRECTION, defaultViewDirection, fitDistance, frameSphere, upForBodyForce } from '../../../src/scene/frameSphere.ts'

describe('frameSphere', () => {
  it('puts the sphere tangent to the narrower field of view (d = r / sin(half-angle), elementary geometry)', () => {
    // Vertical fov 90°, wide aspect: vertical half-angle 45° is the narrower one.
    expect(fitDistance(1, 90, 2, 1)).toBeCloseTo(Math.SQRT2, 12)
    // Tall aspect 0.5: horizontal half-angle atan(0.5·tan 45°) is narrower.
    expect(fitDistance(1, 90, 0.5, 1)).toBeCloseTo(1 / Math.sin(Math.atan(0.5)), 12)
  })

  it('keeps the view direction, looks at the centre and sees the whole sphere', () => {
    const cam = new PerspectiveCamera(35, 16 / 9, 0.1, 100)
    cam.position.set(10, 0, 0)
    const target = new Vector3(0, 0, 0)
    const center = new Vector3(5, 5, 5)
    frameSphere(cam, target, center, 2)
    const dir = cam.position.clone().sub(center)
    expect(dir.clone().normalize().x).toBeCloseTo(1, 12)
    expect(dir.length()).toBeCloseTo(fitDistance(2, 35, 16 / 9), 9)
    // Points of the sphere along the camera's up and right axes land inside the view.
    cam.updateMatrixWorld()
    for (const off of [new Vector3(0, 0, 2), new Vector3(0, 2, 0), new Vector3(0, -2, 0), new Vector3(0, 0, -2)]) {
      const p = center.clone().add(off).project(cam)
      expect(Math.abs(p.x)).toBeLessThan(1)
      expect(Math.abs(p.y)).toBeLessThan(1)
    }
    expect(cam.near).toBeLessThan(dir.length() - 2)
    expect(cam.far).toBeGreaterThan(dir.length() + 2)
  })
})

describe('upForBodyForce', () => {
  it('points the screen up against gravity and keeps the three-quarter view above the model (common practice)', () => {
    const up = upForBodyForce([0, -25_506, 0])
    expect(up.distanceTo(new Vector3(0, 1, 0))).toBe(0)
    const dir = defaultViewDirection(up)
    // The default view looks from above: its component along up is the same as along +z for a z-up model.
    expect(dir.dot(up)).toBeCloseTo(DEFAULT_VIEW_DIRECTION.z, 12)
    expect(dir.length()).toBeCloseTo(1, 12)
  })

  it('falls back to +z without a body force, or with a non-finite one', () => {
    expect(upForBodyForce([0, 0, 0]).toArray()).toEqual([0, 0, 1])
    expect(upForBodyForce([Number.NaN, 0, 0]).toArray()).toEqual([0, 0, 1])
  })
})
