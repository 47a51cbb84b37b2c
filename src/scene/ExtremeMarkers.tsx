import { useEffect, useMemo, useRef } from 'react'
import { MeshBasicMaterial, Vector3 } from 'three'
import { useFrame, useThree } from '@react-three/fiber'
import type { Vec3 } from '../../workers/protocol.ts'
import { useStore } from '../state/store.ts'
import { rawColour } from './rawColour.ts'
import { EXTREME_MAX, EXTREME_MIN } from './sceneLook.ts'

export interface ExtremeMark {
  readonly kind: 'max' | 'min'
  /** Where it is drawn (model length units, moved with the deformed shape). */
  readonly position: Vec3
  /** The label's text: the value with its unit, written by the app. */
  readonly label: string
}

export interface ExtremeMarkersProps {
  readonly marks: readonly ExtremeMark[]
  /** Marker radius and the radius framed by a click on a label, length units. */
  readonly radius: number
  readonly frameRadius: number
}

const noRaycast = (): void => {}
const _v = new Vector3()

/**
 * Markers at the largest and the smallest value of the shown quantity on the surface, each with
 * a small label beside it (a DOM element over the canvas, moved with the view on every frame the
 * scene draws). A click on a label frames that point.
 */
export function ExtremeMarkers({ marks, radius, frameRadius }: ExtremeMarkersProps) {
  const gl = useThree((s) => s.gl)
  const invalidate = useThree((s) => s.invalidate)
  const labels = useRef<HTMLButtonElement[]>([])
  const materials = useMemo(() => ({
    max: new MeshBasicMaterial({ color: rawColour(EXTREME_MAX), depthTest: false, toneMapped: false }),
    min: new MeshBasicMaterial({ color: rawColour(EXTREME_MIN), depthTest: false, toneMapped: false }),
  }), [])
  useEffect(() => () => { materials.max.dispose(); materials.min.dispose() }, [materials])

  useEffect(() => {
    const host = gl.domElement.parentElement
    if (!host) return
    const made = marks.map((m) => {
      const b = document.createElement('button')
      b.type = 'button'
      b.className = `extreme-label ${m.kind}`
      b.dataset.testid = `extreme-${m.kind}`
      b.textContent = m.label
      b.title = 'Frame this point'
      const p = m.position
      b.addEventListener('click', () => useStore.getState().requestView({ frame: { center: [p[0], p[1], p[2]], radius: frameRadius } }))
      host.appendChild(b)
      return b
    })
    labels.current = made
    invalidate()
    return () => { for (const b of made) b.remove(); labels.current = [] }
  }, [gl, marks, frameRadius, invalidate])

  useFrame(({ camera, size }) => {
    labels.current.forEach((b, i) => {
      const p = marks[i]?.position
      if (!p) return
      _v.set(p[0], p[1], p[2]).project(camera)
      const visible = _v.z > -1 && _v.z < 1
      b.style.display = visible ? '' : 'none'
      b.style.transform = `translate(${Math.round(((_v.x + 1) / 2) * size.width + 8)}px, ${Math.round(((1 - _v.y) / 2) * size.height - 10)}px)`
    })
  })

  return (
    <>
      {marks.map((m) => (
        <mesh key={m.kind} position={m.position} material={materials[m.kind]} renderOrder={14} raycast={noRaycast}>
          {m.kind === 'max' ? <coneGeometry args={[radius, 2 * radius, 12]} /> : <octahedronGeometry args={[radius]} />}
        </mesh>
      ))}
    </>
  )
}
