import { useEffect, useMemo } from 'react'
import { BackSide, BufferAttribute, BufferGeometry, FrontSide, Sphere, Vector3 } from 'three'
import { useThree } from '@react-three/fiber'
import type { SurfaceBuffers } from '../../workers/protocol.ts'
import type { QuantityName } from '../state/store.ts'
import { colourMapTexture } from './colourMapTexture.ts'
import { createScalarMaterial } from './scalarMaterial.ts'
import type { ColourMapName } from '../state/store.ts'
import type { Plane } from 'three'

export interface SurfaceMeshProps {
  readonly surface: SurfaceBuffers
  readonly quantity: QuantityName
  /** Colour range [min, max] in the quantity's model units. */
  readonly range: readonly [number, number]
  readonly colourMap: ColourMapName
  /** Load-patch id to tint, -1 for none. */
  readonly highlightedPatch: number
  readonly clippingPlanes: Plane[]
  /**
   * True while a side of the body is clipped away: the inside then shows through the cut, so
   * back faces are drawn too; otherwise they are culled.
   */
  readonly clipped: boolean
  /** Model bounds, so three.js never loops over the vertices to find them. */
  readonly bounds: { readonly min: readonly number[]; readonly max: readonly number[] }
}

/** Never raycast the big surface on the main thread: picking goes to the worker. */
const noRaycast = (): void => {}

/**
 * The boundary surface, colour-mapped by one scalar per vertex. The geometry is built once per
 * buffer set; quantity, range, map and highlight only swap an attribute or set a uniform.
 */
export function SurfaceMesh({ surface, quantity, range, colourMap, highlightedPatch, clippingPlanes, clipped, bounds }: SurfaceMeshProps) {
  const invalidate = useThree((s) => s.invalidate)

  const { geometry, scalarAttributes } = useMemo(() => {
    const g = new BufferGeometry()
    g.setAttribute('position', new BufferAttribute(surface.positions, 3))
    g.setAttribute('normal', new BufferAttribute(surface.normals, 3))
    g.setAttribute('label', new BufferAttribute(surface.patch, 1))
    g.setIndex(new BufferAttribute(surface.index, 1))
    // Bounds from the model summary: computeBoundingSphere would walk every vertex.
    const c = new Vector3((bounds.min[0] + bounds.max[0]) / 2, (bounds.min[1] + bounds.max[1]) / 2, (bounds.min[2] + bounds.max[2]) / 2)
    const r = 0.5 * Math.hypot(bounds.max[0] - bounds.min[0], bounds.max[1] - bounds.min[1], bounds.max[2] - bounds.min[2])
    g.boundingSphere = new Sphere(c, r)
    // One attribute object per quantity, created lazily; three uploads each once.
    return { geometry: g, scalarAttributes: new Map<QuantityName, BufferAttribute>() }
  }, [surface, bounds])

  useEffect(() => () => {
    // three frees only the attributes attached at dispose time; attach every scalar buffer
    // uploaded for this geometry so none stays behind on the GPU.
    for (const [q, attr] of scalarAttributes) geometry.setAttribute('scalar_' + q, attr)
    geometry.dispose()
  }, [geometry, scalarAttributes])

  const material = useMemo(() => {
    const m = createScalarMaterial(colourMapTexture('viridis'), clippingPlanes)
    m.side = FrontSide
    return m
  }, [clippingPlanes])
  useEffect(() => () => material.dispose(), [material])

  useEffect(() => {
    let attr = scalarAttributes.get(quantity)
    if (!attr) {
      attr = new BufferAttribute(surface.scalars[quantity], 1)
      scalarAttributes.set(quantity, attr)
    }
    geometry.setAttribute('scalar', attr)
    invalidate()
  }, [geometry, scalarAttributes, surface, quantity, invalidate])

  // The inside seen through the cut: a second pass over the same geometry, back faces only,
  // pushed further back in depth so front faces always win along silhouette edges.
  const backMaterial = useMemo(() => {
    const m = createScalarMaterial(colourMapTexture('viridis'), clippingPlanes)
    m.side = BackSide
    m.polygonOffsetFactor = 4
    m.polygonOffsetUnits = 8
    return m
  }, [clippingPlanes])
  useEffect(() => () => backMaterial.dispose(), [backMaterial])

  useEffect(() => {
    const u = material.uniforms
    u.map.value = colourMapTexture(colourMap)
    u.range.value.set(range[0], range[1])
    u.highlight.value = highlightedPatch
    invalidate()
  }, [material, colourMap, range, highlightedPatch, invalidate])

  // The first draw of each surface leaves a User Timing mark (the browser tests time the first picture by it).
  const markFirstDraw = useMemo(() => {
    let done = false
    return () => { if (!done) { done = true; performance.mark('tractus:surface-drawn', { detail: { vertices: surface.positions.length / 3 } }) } }
  }, [surface])

  return (
    <>
      <mesh geometry={geometry} material={material} raycast={noRaycast} frustumCulled={false} onAfterRender={markFirstDraw} />
      {clipped && <mesh geometry={geometry} material={backMaterial} raycast={noRaycast} frustumCulled={false} />}
    </>
  )
}
