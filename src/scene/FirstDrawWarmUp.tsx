import { useEffect, useMemo, useState } from 'react'
import { BackSide, BufferAttribute, BufferGeometry, FrontSide, LineSegments, Mesh, Plane, Vector3 } from 'three'
import type { Object3D, Side } from 'three'
import { useThree } from '@react-three/fiber'
import { colourMapTexture } from './colourMapTexture.ts'
import { createEdgeMaterial } from './edgeMaterial.ts'
import { createScalarMaterial } from './scalarMaterial.ts'
import { createSectionFillMaterial } from './SectionFill.tsx'
import { NOWHERE } from './sectionClipPlane.ts'
import { sectionWarmObjects } from './sectionWarmUp.ts'
import { EDGE } from './sceneLook.ts'

/**
 * Stand-ins for what the scene draws for the first time at a model's first picture (the surface's
 * front pass, SurfaceMesh.tsx, and the feature edges, FeatureEdges.tsx) and when the section is
 * switched on (the surface's back pass, the section face, SectionFill.tsx, and the handle, triad
 * and section arrows: sectionWarmUp.ts), drawn once each, one kind a frame, when the page starts
 * and the scene is still empty, so that those frames find their shaders compiled. On software
 * WebGL a new shader and render state costs a compile in the GPU process, which the main thread
 * waits for when it reads the frame back. Measured at 10^7 elements: the first picture of a
 * generated block was one task of 600-840 ms, against about 330 ms for a file opened after the
 * start page's model had drawn the same materials; done after the first picture instead, a warm
 * frame that compiled the back pass took 410-550 ms, the picture being drawn with it.
 *
 * Each stand-in has the material (made by the same function, with the clipping planes the real
 * one has: one for the surface and edges, useClippingPlanes.ts), render state and vertex layout
 * (32-bit floats, 32-bit indices) of the real object, and is scaled to nothing, so it draws no
 * pixel. The materials are kept for the page's life: three.js deletes a shader program with the
 * last material that uses it, and the real objects would compile it again.
 */
export function FirstDrawWarmUp() {
  const invalidate = useThree((s) => s.invalidate)
  const [step, setStep] = useState(warmed ? STEPS : 0)
  const objects = useMemo(() => (step < STEPS ? standIns(step) : []), [step])
  useEffect(() => {
    if (step >= STEPS) { warmed = true; return }
    // after the stand-ins' frame, the next kind in a later task (a frame of its own)
    const first = objects[0]
    first.onAfterRender = () => { first.onAfterRender = () => {}; setTimeout(() => setStep((k) => k + 1), 50) }
    invalidate()
  }, [step, objects, invalidate])
  return <>{objects.map((o) => <primitive key={o.uuid} object={o} />)}</>
}

/** Done once per page. */
let warmed = false
const made: Object3D[][] = []

/** The stand-ins, one kind a frame: surface front and back, edges, section face, then sectionWarmUp.ts's three kinds. */
const KINDS: readonly (() => Object3D[])[] = [
  () => [surfaceStandIn(FrontSide)],
  () => [edgesStandIn()],
  () => [surfaceStandIn(BackSide)],
  () => [fillStandIn()],
  () => sectionWarmObjects(1),
  () => sectionWarmObjects(2),
  () => sectionWarmObjects(3),
]
const STEPS = KINDS.length

function standIns(step: number): Object3D[] {
  return (made[step] ??= KINDS[step]().map(hidden))
}

function hidden(o: Object3D): Object3D {
  o.scale.set(0, 0, 0)
  o.frustumCulled = false
  o.raycast = () => {}
  return o
}

/** One clipping plane, out of reach, as the surface's and edges' materials always have (useClippingPlanes.ts). */
const planes = (): Plane[] => [new Plane(new Vector3(0, 0, 1), NOWHERE)]

/** The surface's layout (SurfaceMesh.tsx): position, normal, scalar, label; 32-bit indices. */
function surfaceStandIn(side: Side): Object3D {
  const g = new BufferGeometry()
  g.setAttribute('position', new BufferAttribute(new Float32Array(9), 3))
  g.setAttribute('normal', new BufferAttribute(new Float32Array(9), 3))
  g.setAttribute('scalar', new BufferAttribute(new Float32Array(3), 1))
  g.setAttribute('label', new BufferAttribute(new Float32Array(3), 1))
  g.setIndex(new BufferAttribute(new Uint32Array([0, 1, 2]), 1))
  const m = createScalarMaterial(colourMapTexture('viridis'), planes())
  m.side = side
  if (side === BackSide) { m.polygonOffsetFactor = 4; m.polygonOffsetUnits = 8 }
  return new Mesh(g, m)
}

function edgesStandIn(): Object3D {
  const g = new BufferGeometry()
  g.setAttribute('position', new BufferAttribute(new Float32Array(6), 3))
  return new LineSegments(g, createEdgeMaterial(EDGE, 0.55, planes()))
}

/** The section face's layout (SectionFill.tsx): position and one scalar; 32-bit indices. */
function fillStandIn(): Object3D {
  const g = new BufferGeometry()
  g.setAttribute('position', new BufferAttribute(new Float32Array(9), 3))
  g.setAttribute('scalar', new BufferAttribute(new Float32Array(3), 1))
  g.setIndex(new BufferAttribute(new Uint32Array([0, 1, 2]), 1))
  return new Mesh(g, createSectionFillMaterial())
}
