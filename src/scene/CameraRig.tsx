import { useCallback, useEffect, useMemo, useRef } from 'react'
import { Vector3 } from 'three'
import type { PerspectiveCamera } from 'three'
import { useThree } from '@react-three/fiber'
import { OrbitControls } from '@react-three/drei'
import type { OrbitControls as OrbitControlsImpl } from 'three-stdlib'
import { useStore } from '../state/store.ts'
import type { ViewRequest } from '../state/store.ts'
import { modelSphere as boundsSphere } from '../state/selectors.ts'
import type { ModelSummary } from '../../workers/protocol.ts'
import { defaultViewDirection, frameSphere, setClipPlanes, upForBodyForce } from './frameSphere.ts'
import type { OpenView } from './frameSphere.ts'

function modelSphere(m: ModelSummary): { center: Vector3; radius: number } {
  const { center, radius } = boundsSphere(m.bounds)
  return { center: new Vector3(center[0], center[1], center[2]), radius }
}

/**
 * Orbit controls plus the camera's answers to the store: fit the model when one loads, apply a
 * view request (an exact camera, or a sphere to frame such as a load patch), and report the
 * camera when a move ends. A camera request that arrives before its model is kept until the
 * model is there, so a restored view is not replaced by the automatic fit.
 */
export function CameraRig() {
  const camera = useThree((s) => s.camera) as PerspectiveCamera
  const controls = useThree((s) => s.controls) as unknown as OrbitControlsImpl | null
  const invalidate = useThree((s) => s.invalidate)
  const size = useThree((s) => s.size)
  const sizeNow = useRef(size)
  sizeNow.current = size
  // The part of the view the cards and bars leave open: framing centres there (read when framing,
  // so a resize alone never moves the camera).
  const open = useCallback((): OpenView => ({ width: sizeNow.current.width, height: sizeNow.current.height, insets: useStore.getState().viewInsets }), [])
  const model = useStore((s) => s.model)
  const viewRequest = useStore((s) => s.viewRequest)
  const lastSeq = useRef(-1)
  // camera.up must be set before the (re)made controls read it, so it is set while rendering.
  const upKey = useMemo(() => {
    const up = upForBodyForce(model ? model.bodyForce : [0, 0, 0])
    camera.up.copy(up)
    return `${up.x.toFixed(6)},${up.y.toFixed(6)},${up.z.toFixed(6)}`
  }, [model, camera])
  const pending = useRef<ViewRequest | null>(null)

  const report = useCallback(() => {
    if (!controls) return
    const p = camera.position, t = controls.target, u = camera.up
    useStore.getState().cameraMoved({ position: [p.x, p.y, p.z], target: [t.x, t.y, t.z], up: [u.x, u.y, u.z], fov: camera.fov })
  }, [camera, controls])

  const apply = useCallback((req: ViewRequest, m: ModelSummary | null) => {
    if (!controls) return
    const radius = m ? modelSphere(m).radius : 1
    if (req.camera) {
      const c = req.camera
      camera.up.set(c.up[0], c.up[1], c.up[2])
      camera.position.set(c.position[0], c.position[1], c.position[2])
      if (c.fov > 0 && c.fov < 180) camera.fov = c.fov
      controls.target.set(c.target[0], c.target[1], c.target[2])
      setClipPlanes(camera, radius)
    } else if (req.frame) {
      const center = new Vector3(req.frame.center[0], req.frame.center[1], req.frame.center[2])
      const n = req.frame.normal ? new Vector3(req.frame.normal[0], req.frame.normal[1], req.frame.normal[2]) : null
      const along = req.frame.along ? new Vector3(req.frame.along[0], req.frame.along[1], req.frame.along[2]) : null
      if (along && along.lengthSq() > 0) {
        // Exactly along the direction asked for (a view button, "look at the section"). Looking
        // straight along the orbit's up axis is tilted by a milliradian, so the orbit stays
        // defined; the screen's up then lies on the side the tilt leaves it.
        const dir = along.normalize().negate()
        const up = camera.up.clone().normalize()
        if (Math.abs(dir.dot(up)) > 0.9999) {
          const hint = req.frame.up ? new Vector3(req.frame.up[0], req.frame.up[1], req.frame.up[2]) : new Vector3(0, 1, 0)
          hint.addScaledVector(up, -hint.dot(up))
          if (hint.lengthSq() < 1e-12) hint.set(1, 0, 0).addScaledVector(up, -up.x)
          dir.addScaledVector(hint.normalize(), -1e-3).normalize()
        }
        controls.target.copy(center)
        camera.position.copy(center).add(dir)
      } else if (n && n.lengthSq() > 0.04) {
        // Look at the patch along its own outward normal, raised towards the screen's up so a
        // patch inside a hole is seen over the hole's rim (and a flat one in a three-quarter view).
        const current = camera.position.clone().sub(controls.target).normalize()
        const dir = n.normalize().add(camera.up.clone().multiplyScalar(0.7)).addScaledVector(current, 0.3).normalize()
        controls.target.copy(center)
        camera.position.copy(center).add(dir)
      } else if (m) {
        // Look at a patch from outside the part: lean the view towards the direction from the
        // model centre to the patch, so a patch on the far side is not framed from behind.
        const outward = center.clone().sub(modelSphere(m).center)
        if (outward.lengthSq() > 1e-12 * radius * radius) {
          const current = camera.position.clone().sub(controls.target).normalize()
          const dir = outward.normalize().multiplyScalar(2).add(current).normalize()
          controls.target.copy(center)
          camera.position.copy(center).add(dir)
        }
      }
      controls.target.copy(frameSphere(camera, controls.target, center, req.frame.radius, true, undefined, open()))
      // Keep the far plane set for the whole model, so framing a small patch does not cut it off.
      setClipPlanes(camera, Math.max(radius, req.frame.radius))
    }
    controls.update()
    invalidate()
    report()
  }, [camera, controls, invalidate, report, open])

  useEffect(() => {
    if (!viewRequest || !controls || viewRequest.seq === lastSeq.current) return
    lastSeq.current = viewRequest.seq
    if (!model && viewRequest.camera) { pending.current = viewRequest; return }
    apply(viewRequest, model)
  }, [viewRequest, controls, model, apply])

  useEffect(() => {
    if (!model || !controls) return
    if (pending.current) {
      apply(pending.current, model)
      pending.current = null
      return
    }
    const { center, radius } = modelSphere(model)
    controls.target.copy(frameSphere(camera, controls.target, center, radius, false, defaultViewDirection(camera.up), open()))
    controls.update()
    invalidate()
    report()
  }, [model, controls, camera, apply, invalidate, report, open])

  // The controls fix their orbit axis from camera.up when they are made, so a model whose up
  // differs (see upForBodyForce) gets fresh controls.
  return <OrbitControls key={upKey} makeDefault enableDamping={false} onEnd={report} />
}
