import { useEffect, useMemo } from 'react'
import { InstancedBufferAttribute, InstancedMesh } from 'three'
import type { Plane } from 'three'
import { useThree } from '@react-three/fiber'
import type { ArrowBuffers } from '../../workers/protocol.ts'
import type { ColourMapName } from '../state/store.ts'
import { unitArrowGeometry } from './arrowGeometry.ts'
import { createArrowMaterial } from './arrowMaterial.ts'
import { writeArrowInstances } from './arrowInstances.ts'
import { ARROW_LENGTH_FRACTION } from './sceneLook.ts'

export interface ArrowFieldProps {
  readonly arrows: ArrowBuffers
  /** Dimensionless length factor from the user. */
  readonly scale: number
  /** Model bounding-box diagonal, length units. */
  readonly diagonal: number
  readonly colourMap: ColourMapName
  /** Range of the signed normal traction over the map (stress units); null: one colour. */
  readonly colourRange: readonly [number, number] | null
  /** Magnitude drawn at the full arrow length (stress units), shared by the fields on screen. */
  readonly reference: number
  readonly clippingPlanes: Plane[]
  /** Scale of the deformed shape (0: undeformed). */
  readonly deformScale?: number
}

const noRaycast = (): void => {}

/** Traction arrows as one instanced mesh: one draw call whatever the count. */
export function ArrowField({ arrows, scale, diagonal, colourMap, colourRange, reference, clippingPlanes, deformScale = 0 }: ArrowFieldProps) {
  const invalidate = useThree((s) => s.invalidate)
  const count = arrows.magnitudes.length
  const material = useMemo(() => createArrowMaterial(clippingPlanes), [clippingPlanes])
  useEffect(() => () => material.dispose(), [material])

  const mesh = useMemo(() => {
    const m = new InstancedMesh(unitArrowGeometry(), material, Math.max(1, count))
    m.count = count
    m.instanceColor = new InstancedBufferAttribute(new Float32Array(3 * Math.max(1, count)), 3)
    m.frustumCulled = false
    m.raycast = noRaycast
    return m
  }, [material, count])
  // The geometry is shared; only the instance buffers belong to this mesh.
  useEffect(() => () => { mesh.dispose() }, [mesh])

  const lo = colourRange ? colourRange[0] : 0, hi = colourRange ? colourRange[1] : 0
  const single = colourRange === null
  useEffect(() => {
    const unit = ARROW_LENGTH_FRACTION * scale * diagonal
    writeArrowInstances(mesh, arrows, unit, 0.004 * diagonal, colourMap, single ? null : [lo, hi], reference, deformScale)
    material.uniforms.useSingle.value = single ? 1 : 0
    invalidate()
  }, [mesh, material, arrows, scale, diagonal, colourMap, single, lo, hi, reference, deformScale, invalidate])

  if (count === 0) return null
  return <primitive object={mesh} />
}
