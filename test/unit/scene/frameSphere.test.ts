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

describe('frameSphere into the open part of the view', () => {
  it('the sphere lands in the middle of the part the cards leave open, and inside it (projective geometry)', () => {
    const cam = new PerspectiveCamera(35, 1280 / 720, 0.1, 100)
    cam.up.set(0, 0, 1)
    cam.position.set(0, -10, 0)
    const center = new Vector3(1, 2, 3)
    const open = { width: 1280, height: 720, insets: { top: 40, right: 360, bottom: 80, left: 0 } }
    const aim = frameSphere(cam, new Vector3(), center, 2, true, undefined, open)
    cam.updateMatrixWorld()
    const c = center.clone().project(cam)
    // Middle of the open part in normalised device coordinates: x from 0 to 920 px, y from 40 to 640 px.
    expect((c.x + 1) / 2 * 1280).toBeCloseTo(460, 4)
    expect((1 - c.y) / 2 * 720).toBeCloseTo(340, 4)
    // The aim moved with the camera, so the view direction is the one asked for.
    expect(cam.position.clone().sub(aim).normalize().y).toBeCloseTo(-1, 12)
    // Every point of the sphere along the screen axes stays within the open part.
    const right = new Vector3().setFromMatrixColumn(cam.matrixWorld, 0), up = new Vector3().setFromMatrixColumn(cam.matrixWorld, 1)
    for (const off of [right, right.clone().negate(), up, up.clone().negate()]) {
      const p = center.clone().addScaledVector(off, 2).project(cam)
      const px = (p.x + 1) / 2 * 1280, py = (1 - p.y) / 2 * 720
      expect(px).toBeGreaterThan(0)
      expect(px).toBeLessThan(920)
      expect(py).toBeGreaterThan(40)
      expect(py).toBeLessThan(640)
    }
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
