import { useEffect, useMemo } from 'react'
import { MeshBasicMaterial } from 'three'
import type { PerspectiveCamera, Sprite } from 'three'
import { useThree } from '@react-three/fiber'
import { rawColour } from './rawColour.ts'
import { disposeSprite, setLabelSize, textSprite } from './textSprite.ts'
import { MARKER } from './sceneLook.ts'

export interface ElementMarkerProps {
  readonly id: number
  /** Element centre and size (length units). */
  readonly centre: readonly [number, number, number]
  readonly radius: number
}

/**
 * Points at one element (the Equilibrium card's least balanced elements): a wire ball round it
 * and its id, drawn over everything so an element inside the body is seen through the surface.
 */
export function ElementMarker({ id, centre, radius }: ElementMarkerProps) {
  const invalidate = useThree((s) => s.invalidate)
  const camera = useThree((s) => s.camera) as PerspectiveCamera
  const height = useThree((s) => s.size.height)
  const material = useMemo(() => new MeshBasicMaterial({ color: rawColour(MARKER), wireframe: true, depthTest: false, toneMapped: false }), [])
  useEffect(() => () => material.dispose(), [material])
  const label = useMemo<Sprite>(() => {
    const s = textSprite(`element ${id}`, MARKER)
    s.center.set(-0.15, -0.4)
    return s
  }, [id])
  useEffect(() => () => disposeSprite(label), [label])
  useEffect(() => { setLabelSize(label, height, camera.fov); invalidate() }, [label, height, camera.fov, invalidate])
  useEffect(() => { invalidate() }, [centre, radius, invalidate])
  const r = 1.3 * radius
  return (
    <group position={[centre[0], centre[1], centre[2]]}>
      <mesh material={material} renderOrder={16} raycast={() => {}}>
        <sphereGeometry args={[r, 12, 8]} />
      </mesh>
      <primitive object={label} position={[r, r, 0]} />
    </group>
  )
}
