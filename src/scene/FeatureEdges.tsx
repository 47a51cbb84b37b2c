import { useEffect, useMemo } from 'react'
import { BufferAttribute, BufferGeometry, Sphere, Vector3 } from 'three'
import type { Plane } from 'three'
import { useThree } from '@react-three/fiber'
import { createEdgeMaterial } from './edgeMaterial.ts'
import { EDGE } from './sceneLook.ts'

export interface FeatureEdgesProps {
  /** Segment end points, Float32Array(6·S), model length units (built in the worker). */
  readonly segments: Float32Array
  readonly clippingPlanes: Plane[]
  readonly bounds: { readonly min: readonly number[]; readonly max: readonly number[] }
  /** Displacement at the segment ends (6·S) and the deformed shape's scale; null / 0 for undeformed. */
  readonly displacement?: Float32Array | null
  readonly deformScale?: number
  /** Line colour (sRGB hex) and opacity; the feature-edge look by default. */
  readonly colour?: string
  readonly opacity?: number
}

const noRaycast = (): void => {}

/**
 * Thin lines along the creases of the surface (one draw call). They sit on the surface, which
 * is pushed back by a polygon offset, so they win the depth test without z-fighting. With the
 * deformed shape they move with the surface; a second, paler set drawn undeformed is the outline
 * of the undeformed body.
 */
export function FeatureEdges({ segments, clippingPlanes, bounds, displacement = null, deformScale = 0, colour = EDGE, opacity = 0.55 }: FeatureEdgesProps) {
  const invalidate = useThree((s) => s.invalidate)
  const geometry = useMemo(() => {
    const g = new BufferGeometry()
    g.setAttribute('position', new BufferAttribute(segments, 3))
    if (displacement && displacement.length === segments.length) g.setAttribute('displacement', new BufferAttribute(displacement, 3))
    const c = new Vector3((bounds.min[0] + bounds.max[0]) / 2, (bounds.min[1] + bounds.max[1]) / 2, (bounds.min[2] + bounds.max[2]) / 2)
    g.boundingSphere = new Sphere(c, 0.5 * Math.hypot(bounds.max[0] - bounds.min[0], bounds.max[1] - bounds.min[1], bounds.max[2] - bounds.min[2]))
    return g
  }, [segments, bounds, displacement])
  useEffect(() => () => geometry.dispose(), [geometry])
  const material = useMemo(() => createEdgeMaterial(colour, opacity, clippingPlanes), [colour, opacity, clippingPlanes])
  useEffect(() => () => material.dispose(), [material])
  useEffect(() => {
    material.uniforms.deformScale.value = displacement ? deformScale : 0
    invalidate()
  }, [material, displacement, deformScale, invalidate])
  if (segments.length === 0) return null
  return <lineSegments geometry={geometry} material={material} raycast={noRaycast} frustumCulled={false} />
}
