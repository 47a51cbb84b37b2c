import { useEffect, useMemo } from 'react'
import { BufferAttribute, BufferGeometry, LineBasicMaterial, Sphere, Vector3 } from 'three'
import type { Plane } from 'three'
import { rawColour } from './rawColour.ts'
import { EDGE } from './sceneLook.ts'

export interface FeatureEdgesProps {
  /** Segment end points, Float32Array(6·S), model length units (built in the worker). */
  readonly segments: Float32Array
  readonly clippingPlanes: Plane[]
  readonly bounds: { readonly min: readonly number[]; readonly max: readonly number[] }
}

const noRaycast = (): void => {}

/**
 * Thin lines along the creases of the surface (one draw call). They sit on the surface, which
 * is pushed back by a polygon offset, so they win the depth test without z-fighting.
 */
export function FeatureEdges({ segments, clippingPlanes, bounds }: FeatureEdgesProps) {
  const geometry = useMemo(() => {
    const g = new BufferGeometry()
    g.setAttribute('position', new BufferAttribute(segments, 3))
    const c = new Vector3((bounds.min[0] + bounds.max[0]) / 2, (bounds.min[1] + bounds.max[1]) / 2, (bounds.min[2] + bounds.max[2]) / 2)
    g.boundingSphere = new Sphere(c, 0.5 * Math.hypot(bounds.max[0] - bounds.min[0], bounds.max[1] - bounds.min[1], bounds.max[2] - bounds.min[2]))
    return g
  }, [segments, bounds])
  useEffect(() => () => geometry.dispose(), [geometry])
  const material = useMemo(
    () => new LineBasicMaterial({ color: rawColour(EDGE), transparent: true, opacity: 0.55, clippingPlanes, toneMapped: false }),
    [clippingPlanes],
  )
  useEffect(() => () => material.dispose(), [material])
  if (segments.length === 0) return null
  return <lineSegments geometry={geometry} material={material} raycast={noRaycast} frustumCulled={false} />
}
