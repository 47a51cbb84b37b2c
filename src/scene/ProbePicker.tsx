import { useEffect } from 'react'
import { useThree } from '@react-three/fiber'
import { useStore } from '../state/store.ts'
import { rayFromPointer } from './rayFromPointer.ts'

/** A press that moves farther than this (CSS pixels) is an orbit, not a click. */
const CLICK_SLOP = 4

/**
 * Probe picking: a click (primary button, no drag) sends the pointer ray in model coordinates to
 * the store; the worker intersects it with the model. Nothing is raycast here, so a large mesh
 * costs the main thread nothing. Presses that start on the section handle are ignored.
 */
export function ProbePicker() {
  const gl = useThree((s) => s.gl)
  const camera = useThree((s) => s.camera)
  useEffect(() => {
    const el = gl.domElement
    let downX = 0, downY = 0, armed = false
    const down = (e: PointerEvent) => {
      armed = e.button === 0 && e.isPrimary
      downX = e.clientX; downY = e.clientY
    }
    const up = (e: PointerEvent) => {
      // The handle's own release listener sits on window and runs after this one, so a press that
      // started on the handle still reads as dragging here.
      if (!armed || e.button !== 0 || useStore.getState().section.dragging) return
      armed = false
      if (Math.hypot(e.clientX - downX, e.clientY - downY) > CLICK_SLOP) return
      const ray = rayFromPointer(e.clientX, e.clientY, el, camera)
      const o = ray.origin, d = ray.direction
      useStore.getState().requestProbe({ origin: [o.x, o.y, o.z], direction: [d.x, d.y, d.z] })
    }
    el.addEventListener('pointerdown', down)
    el.addEventListener('pointerup', up)
    return () => {
      el.removeEventListener('pointerdown', down)
      el.removeEventListener('pointerup', up)
    }
  }, [gl, camera])
  return null
}
