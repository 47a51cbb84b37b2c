import { useEffect, useMemo } from 'react'
import { MeshBasicMaterial } from 'three'
import { useThree } from '@react-three/fiber'
import { rawColour } from './rawColour.ts'
import { PROBE } from './sceneLook.ts'

export interface ProbeMarkerProps {
  /** Probed point, model length units. */
  readonly position: readonly [number, number, number]
  /** Marker radius, model length units. */
  readonly radius: number
}

/** A small dot where the probe read its values; drawn over everything so it is never hidden. */
export function ProbeMarker({ position, radius }: ProbeMarkerProps) {
  const invalidate = useThree((s) => s.invalidate)
  const material = useMemo(() => new MeshBasicMaterial({ color: rawColour(PROBE), depthTest: false, toneMapped: false }), [])
  useEffect(() => () => material.dispose(), [material])
  useEffect(() => { invalidate() }, [position, invalidate])
  return (
    <mesh position={[position[0], position[1], position[2]]} material={material} renderOrder={12} raycast={() => {}}>
      <sphereGeometry args={[radius, 16, 10]} />
    </mesh>
  )
}
