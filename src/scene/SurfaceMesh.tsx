import { useEffect, useLayoutEffect, useMemo, useState } from 'react'
import { BackSide, BufferAttribute, BufferGeometry, FrontSide, Sphere, Vector3 } from 'three'
import { useThree } from '@react-three/fiber'
import type { SurfaceBuffers } from '../../workers/protocol.ts'
import { colourMapTexture } from './colourMapTexture.ts'
import { createScalarMaterial } from './scalarMaterial.ts'
import { createSectionFillMaterial } from './SectionFill.tsx'
import { sectionWarmObjects } from './sectionWarmUp.ts'
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

let fillWarm: ReturnType<typeof createSectionFillMaterial> | null = null
/** The section face's material for its warm draw, made once (see the warm-up below). */
const sectionFillWarmMaterial = (): ReturnType<typeof createSectionFillMaterial> => (fillWarm ??= createSectionFillMaterial())

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
    if (displacement && displacement.length === 3 * V) geometry.setAttribute('displacement', new BufferAttribute(displacement, 3))
    else geometry.deleteAttribute('displacement')
    invalidate()
  }, [geometry, V, displacement, invalidate])

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

  // Hidden parts: only the shown parts' ranges are drawn (groups of one material; none drawn when empty).
  useEffect(() => {
    geometry.clearGroups()
    if (ranges) for (const [first, count] of ranges) geometry.addGroup(3 * first, 3 * count, 0)
    invalidate()
  }, [geometry, ranges, invalidate])
  const front = useMemo(() => (ranges ? [material] : material), [ranges, material])
  const back = useMemo(() => (ranges ? [backMaterial] : backMaterial), [ranges, backMaterial])

  // Warm-up. The first draw with a new shader and render state costs a compile (on software
  // WebGL a JIT in the GPU process, which the main thread waits for when it reads the frame back:
  // over a second at 10^6 elements, measured). Switching the section on brings two: the surface's
  // back pass and the section face (and the handle, triad and section arrows: sectionWarmUp.ts). Each is drawn once, a single triangle, in its own frame
  // shortly after the first picture, so the switch finds them ready. The warm geometries share
  // the surface's attribute objects (no second upload) and are never disposed, which would free
  // the shared buffers; the warm materials are kept for the page's life (three.js deletes a
  // program with the last material that uses it, and the real one would compile it again).
  const [warmStep, setWarmStep] = useState(0)
  useEffect(() => setWarmStep(0), [geometry])
  const warm = useMemo(() => {
    if (warmStep !== 1 && warmStep !== 2) return null
    const g = new BufferGeometry()
    if (warmStep === 1) for (const [name, a] of Object.entries(geometry.attributes)) g.setAttribute(name, a)
    else {
      // The section face's layout: positions and one scalar.
      g.setAttribute('position', geometry.getAttribute('position'))
      g.setAttribute('scalar', geometry.getAttribute('scalar'))
    }
    g.setIndex(geometry.index)
    g.setDrawRange(0, 3)
    g.boundingSphere = geometry.boundingSphere
    // the section's other first draws go with them (sectionWarmUp.ts)
    return { geometry: g, material: warmStep === 1 ? backMaterial : sectionFillWarmMaterial(), step: warmStep, section: sectionWarmObjects(warmStep) }
  }, [warmStep, geometry, backMaterial])
  useEffect(() => {
    if (warmStep === 0) return
    // Steps 1 and 2 draw their triangle; step 3 draws the picture without them.
    invalidate()
  }, [warmStep, invalidate])
  /** After a warm draw, the next one in a later task (its own frame). */
  const warmed = useMemo(() => () => { setTimeout(() => setWarmStep((k) => (k === 1 || k === 2 ? k + 1 : k)), 50) }, [])

  // The first draw of each surface (a load or another case) leaves a User Timing mark (the browser
  // tests time the first picture and the case switch by it).
  const markFirstDraw = useMemo(() => {
    let done = false
    return () => {
      if (done) return
      done = true
      performance.mark('tractus:surface-drawn', { detail: { vertices: V } })
      setTimeout(() => setWarmStep((k) => (k === 0 ? 1 : k)), 300)
    }
  }, [surface])

  return (
    <>
      <mesh geometry={geometry} material={front} raycast={noRaycast} frustumCulled={false} onAfterRender={markFirstDraw} />
      {clipped && <mesh geometry={geometry} material={back} raycast={noRaycast} frustumCulled={false} />}
      {warm && <mesh key={warm.step} geometry={warm.geometry} material={warm.material} raycast={noRaycast} frustumCulled={false} onAfterRender={warmed} />}
      {warm && warm.section.map((o) => <primitive key={`${warm.step}-${o.uuid}`} object={o} />)}
    </>
  )
}
