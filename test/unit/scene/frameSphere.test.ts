import { describe, expect, it } from 'vitest'
import { PerspectiveCamera, Vector3 } from 'three'
import { fitDistance, frameSphere } from '../../../src/scene/frameSphere.ts'

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
