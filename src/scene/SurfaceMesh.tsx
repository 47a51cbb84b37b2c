import { useEffect, useLayoutEffect, useMemo } from 'react'
import { BackSide, BufferAttribute, BufferGeometry, FrontSide, Sphere, Vector3 } from 'three'
import { useThree } from '@react-three/fiber'
import type { SurfaceBuffers } from '../../workers/protocol.ts'
import { colourMapTexture } from './colourMapTexture.ts'
import { createScalarMaterial } from './scalarMaterial.ts'
import { useSurfaceCulling } from './useSurfaceCulling.ts'
import type { CulledPass } from './useSurfaceCulling.ts'
import type { ColourMapName } from '../state/store.ts'
import type { Plane } from 'three'

export interface SurfaceMeshProps {
  readonly surface: SurfaceBuffers
  /** The current quantity's value per vertex (surface buffers or component scalars); null paints neutral. */
  readonly scalars: Float32Array | null
  /** Nodal displacement per vertex (3 per vertex), or null; drawn moved by deformScale times it. */
  readonly displacement: Float32Array | null
  readonly deformScale: number
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
  /** Triangle ranges [first, count] to draw (the shown parts; the worker groups triangles by part); absent: all. */
  readonly ranges?: readonly (readonly [number, number])[] | null
}

/** Never raycast the big surface on the main thread: picking goes to the worker. */
const noRaycast = (): void => {}

/**
 * The boundary surface, colour-mapped by one scalar per vertex. The geometry is built once per
 * set of geometry buffers (positions, normals, triangles): another load case brings new scalars
 * and patch labels on the same geometry, and the quantity, range, map and highlight change only
 * an attribute's values or a uniform. The shown scalar and the patch labels live in one attribute
 * each, written in place (no new GPU buffer, no new shader).
 */
export function SurfaceMesh({ surface, scalars, displacement, deformScale, range, colourMap, highlightedPatch, clippingPlanes, clipped, bounds, ranges = null }: SurfaceMeshProps) {
  const invalidate = useThree((s) => s.invalidate)
  const { positions, normals, index } = surface
  const V = positions.length / 3

  const { geometry, scalarAttribute, labelAttribute } = useMemo(() => {
    const g = new BufferGeometry()
    g.setAttribute('position', new BufferAttribute(positions, 3))
    g.setAttribute('normal', new BufferAttribute(normals, 3))
    g.setIndex(new BufferAttribute(index, 1))
    // The scalar shown and the patch labels: arrays of this geometry's own, rewritten in place.
    const scalar = new BufferAttribute(new Float32Array(positions.length / 3), 1)
    const label = new BufferAttribute(new Float32Array(positions.length / 3), 1)
    g.setAttribute('scalar', scalar)
    g.setAttribute('label', label)
    // Bounds from the model summary: computeBoundingSphere would walk every vertex.
    const c = new Vector3((bounds.min[0] + bounds.max[0]) / 2, (bounds.min[1] + bounds.max[1]) / 2, (bounds.min[2] + bounds.max[2]) / 2)
    const r = 0.5 * Math.hypot(bounds.max[0] - bounds.min[0], bounds.max[1] - bounds.min[1], bounds.max[2] - bounds.min[2])
    g.boundingSphere = new Sphere(c, r)
    return { geometry: g, scalarAttribute: scalar, labelAttribute: label }
  }, [positions, normals, index, bounds])

  useEffect(() => () => geometry.dispose(), [geometry])
  // The back pass's own geometry over the same attributes and index: its groups differ (useSurfaceCulling).
  const backGeometry = useMemo(() => {
    const g = new BufferGeometry()
    for (const [name, a] of Object.entries(geometry.attributes)) g.setAttribute(name, a)
    g.setIndex(geometry.index)
    g.boundingSphere = geometry.boundingSphere
    return g
  }, [geometry])

  const material = useMemo(() => {
    const m = createScalarMaterial(colourMapTexture('viridis'), clippingPlanes)
    m.side = FrontSide
    return m
  }, [clippingPlanes])
  useEffect(() => () => material.dispose(), [material])

  // Before the frame that shows them (a layout effect: the frame after a new case never draws the old values).
  useLayoutEffect(() => {
    // No values (a component quantity before its buffers arrive): NaN paints neutral.
    const a = scalarAttribute.array as Float32Array
    if (scalars && scalars.length === V) a.set(scalars)
    else a.fill(NaN)
    scalarAttribute.needsUpdate = true
    invalidate()
  }, [scalarAttribute, scalars, V, invalidate])

  useLayoutEffect(() => {
    const a = labelAttribute.array as Float32Array
    if (surface.patch.length === V) a.set(surface.patch)
    else a.fill(-1)
    labelAttribute.needsUpdate = true
    invalidate()
  }, [labelAttribute, surface.patch, V, invalidate])

  // The deformed shape: the displacement attribute (three frees it with the geometry).
  useEffect(() => {
    if (displacement && displacement.length === 3 * V) {
      const a = new BufferAttribute(displacement, 3)
      geometry.setAttribute('displacement', a)
      backGeometry.setAttribute('displacement', a)
    } else {
      geometry.deleteAttribute('displacement')
      backGeometry.deleteAttribute('displacement')
    }
    invalidate()
  }, [geometry, backGeometry, V, displacement, invalidate])

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
    const s = displacement ? deformScale : 0
    u.deformScale.value = s
    backMaterial.uniforms.deformScale.value = s
    invalidate()
  }, [material, backMaterial, colourMap, range, highlightedPatch, displacement, deformScale, invalidate])

  // What is drawn: the shown parts' clusters that face each pass's way and lie on the kept side
  // of the section (groups of one material; none drawn when empty).
  const clusters = surface.clusters
  const passes = useMemo((): CulledPass[] => (clipped ? [{ geometry, facing: 1 }, { geometry: backGeometry, facing: -1 }] : [{ geometry, facing: 1 }]), [clipped, geometry, backGeometry])
  useSurfaceCulling(passes, clusters, ranges, clippingPlanes, !(displacement && deformScale !== 0))
  const grouped = clusters !== undefined || ranges !== null
  const front = useMemo(() => (grouped ? [material] : material), [grouped, material])
  const back = useMemo(() => (grouped ? [backMaterial] : backMaterial), [grouped, backMaterial])

  // The first draw of each surface (a load or another case) leaves a User Timing mark (the browser
  // tests time the first picture and the case switch by it).
  const markFirstDraw = useMemo(() => {
    let done = false
    return () => {
      if (done) return
      done = true
      performance.mark('tractus:surface-drawn', { detail: { vertices: V } })
    }
  }, [surface])

  return (
    <>
      <mesh geometry={geometry} material={front} raycast={noRaycast} frustumCulled={false} onAfterRender={markFirstDraw} />
      {clipped && <mesh geometry={backGeometry} material={back} raycast={noRaycast} frustumCulled={false} />}
    </>
  )
}
