import { useEffect, useMemo } from 'react'
import { BufferAttribute, BufferGeometry } from 'three'
import { useThree } from '@react-three/fiber'
import type { SectionBuffers } from '../../workers/protocol.ts'
import type { ColourMapName } from '../state/store.ts'
import { colourMapTexture } from './colourMapTexture.ts'
import { createScalarMaterial } from './scalarMaterial.ts'

export interface SectionFillProps {
  readonly buffers: SectionBuffers
  readonly traction: 'normalTraction' | 'shearTraction'
  readonly range: readonly [number, number]
  readonly colourMap: ColourMapName
  /** Unit section normal m (world = model coordinates). */
  readonly normal: readonly [number, number, number]
  /** Scale of the deformed shape (0: undeformed); the face moves by it times buffers.displacement. */
  readonly deformScale?: number
  /** The plane is being dragged: the light face is drawn when the buffers hold one (a software renderer). */
  readonly dragging?: boolean
}

const noRaycast = (): void => {}

/** The section face's material: never clipped (it is what the cut shows), no patch labels. */
export function createSectionFillMaterial(): ReturnType<typeof createScalarMaterial> {
  const m = createScalarMaterial(colourMapTexture('viridis'), [])
  m.uniforms.useLabel.value = 0
  m.uniforms.backNeutral.value = 0
  m.polygonOffset = false
  return m
}

/**
 * The cut face, colour-mapped by the section's normal traction m·σm or shear magnitude; with the
 * deformed shape it moves with the material (the displacement at its vertices comes from the worker).
 */
export function SectionFill({ buffers, traction, range, colourMap, normal, deformScale = 0, dragging = false }: SectionFillProps) {
  const invalidate = useThree((s) => s.invalidate)
  // While dragging on a software renderer, the light face (workers/sectionFace.ts): the full
  // face's many small triangles were most of a drag frame there, the grab's first frame included.
  const face = dragging && buffers.light ? buffers.light : buffers
  // Keyed on the arrays, not on the buffers' record: a drag's start drops the section arrows from
  // the record (beginSectionDrag) and keeps these arrays, whose upload is not to be redone.
  const { positions, index, normalTraction, shearTraction, displacement } = face
  const { geometry, normalAttr, shearAttr } = useMemo(() => {
    const g = new BufferGeometry()
    g.setAttribute('position', new BufferAttribute(positions, 3))
    g.setIndex(new BufferAttribute(index, 1))
    if (displacement && displacement.length === positions.length) g.setAttribute('displacement', new BufferAttribute(displacement, 3))
    return { geometry: g, normalAttr: new BufferAttribute(normalTraction, 1), shearAttr: new BufferAttribute(shearTraction, 1) }
  }, [positions, index, normalTraction, shearTraction, displacement])
  useEffect(() => () => {
    // Attach both scalar buffers so dispose frees whichever was uploaded.
    geometry.setAttribute('scalarNormal', normalAttr)
    geometry.setAttribute('scalarShear', shearAttr)
    geometry.dispose()
  }, [geometry, normalAttr, shearAttr])

  const material = useMemo(createSectionFillMaterial, [])
  useEffect(() => () => material.dispose(), [material])

  useEffect(() => {
    geometry.setAttribute('scalar', traction === 'shearTraction' ? shearAttr : normalAttr)
    invalidate()
  }, [geometry, normalAttr, shearAttr, traction, invalidate])

  useEffect(() => {
    const u = material.uniforms
    u.map.value = colourMapTexture(colourMap)
    u.range.value.set(range[0], range[1])
    // A deformed section face is not flat: it takes its vertex normals (the plane's, as given) then.
    const deformed = displacement !== undefined && deformScale !== 0
    u.flatNormal.value.set(normal[0], normal[1], normal[2], 1)
    u.deformScale.value = deformed ? deformScale : 0
    invalidate()
  }, [material, colourMap, range, normal, displacement, deformScale, invalidate])

  return <mesh geometry={geometry} material={material} raycast={noRaycast} frustumCulled={false} />
}
