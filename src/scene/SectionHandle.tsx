import { useEffect, useMemo, useRef, useState } from 'react'
import { BufferAttribute, BufferGeometry, LineBasicMaterial, LineLoop, MeshBasicMaterial, Quaternion, Vector3 } from 'three'
import type { PerspectiveCamera } from 'three'
import { useThree } from '@react-three/fiber'
import type { ThreeEvent } from '@react-three/fiber'
import { sectionPlaneOf } from '../state/selectors.ts'
import { useStore } from '../state/store.ts'
import type { SectionState } from '../state/store.ts'
import { unitArrowGeometry } from './arrowGeometry.ts'
import { closestOnLine } from './closestOnLine.ts'
import { rawColour } from './rawColour.ts'
import { rayFromPointer } from './rayFromPointer.ts'
import { HANDLE, HANDLE_ACTIVE } from './sceneLook.ts'

export interface SectionHandleProps {
  readonly section: SectionState
  /** Model sphere: centre and radius, length units. */
  readonly center: readonly [number, number, number]
  readonly radius: number
  /**
   * The cut's own centre and half-size (length units) when known, so the outline hugs the
   * section instead of the whole model.
   */
  readonly cut?: { readonly centroid: readonly [number, number, number]; readonly halfSize: number } | null
}

/** Perpendicular unit vectors (e1, e2) to the unit n, e1 × e2 = n. */
function basis(n: Vector3): [Vector3, Vector3] {
  const a = Math.abs(n.x) < 0.9 ? new Vector3(1, 0, 0) : new Vector3(0, 1, 0)
  const e1 = new Vector3().crossVectors(n, a).normalize()
  const e2 = new Vector3().crossVectors(n, e1)
  return [e1, e2]
}

/**
 * The section plane drawn as an outline with an arrow along its normal. Dragging the arrow moves
 * the plane along the normal: the pointer ray's closest point on the normal line gives the new
 * offset, handed to the store's section drag (beginSectionDrag / dragSection / endSectionDrag,
 * the protocol the offset slider uses too) at most once per animation frame; the plane on screen
 * follows with each cut. Orbiting is off while dragging. Kept out of snapshots (userData.noSnapshot).
 */
export function SectionHandle({ section, center, radius, cut }: SectionHandleProps) {
  const camera = useThree((s) => s.camera) as PerspectiveCamera
  const gl = useThree((s) => s.gl)
  const controls = useThree((s) => s.controls) as unknown as { enabled: boolean } | null
  const invalidate = useThree((s) => s.invalidate)
  const [hover, setHover] = useState(false)
  const [dragging, setDragging] = useState(false)
  const frame = useRef(0)

  const { point, normal } = sectionPlaneOf(section)
  const n = useMemo(() => new Vector3(normal[0], normal[1], normal[2]), [normal[0], normal[1], normal[2]])
  // Handle centre: the cut's centroid, else the model centre, projected on the plane so the
  // handle stays over the part while the cut catches up with a drag.
  const c = new Vector3(center[0], center[1], center[2])
  const anchor = cut ? new Vector3(cut.centroid[0], cut.centroid[1], cut.centroid[2]) : c
  const dist = (anchor.x - point[0]) * n.x + (anchor.y - point[1]) * n.y + (anchor.z - point[2]) * n.z
  const hc = anchor.clone().addScaledVector(n, -dist)
  const r = radius > 0 ? radius : 1
  const half = cut && cut.halfSize > 0 ? Math.min(1.05 * r, Math.max(0.15 * r, cut.halfSize)) : 0.7 * r

  // One material for every outline: disposing a material per cut would release its shader
  // program and force a synchronous recompile on each drag step.
  const lineMaterial = useMemo(() => new LineBasicMaterial({ color: rawColour(HANDLE), transparent: true, opacity: 0.7, depthTest: false, toneMapped: false }), [])
  useEffect(() => () => lineMaterial.dispose(), [lineMaterial])
  const outline = useMemo(() => {
    const [e1, e2] = basis(n)
    const s = half
    const pts = new Float32Array(12)
    const corners = [[-1, -1], [1, -1], [1, 1], [-1, 1]]
    corners.forEach(([a, b], i) => {
      pts[3 * i] = s * (a * e1.x + b * e2.x); pts[3 * i + 1] = s * (a * e1.y + b * e2.y); pts[3 * i + 2] = s * (a * e1.z + b * e2.z)
    })
    const g = new BufferGeometry()
    g.setAttribute('position', new BufferAttribute(pts, 3))
    const line = new LineLoop(g, lineMaterial)
    line.renderOrder = 10
    line.raycast = () => {}
    line.userData.noSnapshot = true
    return line
  }, [n, half, lineMaterial])
  useEffect(() => () => { outline.geometry.dispose() }, [outline])

  const arrowMaterial = useMemo(() => new MeshBasicMaterial({ color: rawColour(HANDLE), depthTest: false, toneMapped: false }), [])
  useEffect(() => () => arrowMaterial.dispose(), [arrowMaterial])
  useEffect(() => {
    arrowMaterial.color.copy(rawColour(hover || dragging ? HANDLE_ACTIVE : HANDLE))
    invalidate()
  }, [arrowMaterial, hover, dragging, invalidate])

  // Not drawn (visible: false on the material), yet still hit by the pointer ray.
  const gripMaterial = useMemo(() => new MeshBasicMaterial({ visible: false }), [])
  useEffect(() => () => gripMaterial.dispose(), [gripMaterial])

  const quaternion = useMemo(() => new Quaternion().setFromUnitVectors(new Vector3(0, 1, 0), n), [n])
  const length = Math.max(0.22 * r, 0.9 * half)

  const onPointerDown = (e: ThreeEvent<PointerEvent>) => {
    if (e.button !== 0) return
    e.stopPropagation()
    const state = useStore.getState()
    const startOffset = state.section.offset
    const P = hc.clone()
    const s0 = closestOnLine(P, n, rayFromPointer(e.nativeEvent.clientX, e.nativeEvent.clientY, gl.domElement, camera))
    if (!Number.isFinite(s0)) return
    // Keep the plane within the model's extent along n (a little beyond, to clear the ends).
    const base = (c.x - state.section.point[0]) * n.x + (c.y - state.section.point[1]) * n.y + (c.z - state.section.point[2]) * n.z
    const lo = base - 1.02 * r, hi = base + 1.02 * r
    let pendingOffset = startOffset
    if (controls) controls.enabled = false
    setDragging(true)
    state.beginSectionDrag()

    const flush = () => {
      frame.current = 0
      useStore.getState().dragSection(pendingOffset)
    }
    const move = (ev: PointerEvent) => {
      const s = closestOnLine(P, n, rayFromPointer(ev.clientX, ev.clientY, gl.domElement, camera))
      if (!Number.isFinite(s)) return
      pendingOffset = Math.min(hi, Math.max(lo, startOffset + (s - s0)))
      // At most one store write per animation frame, however fast the pointer events come.
      if (!frame.current) frame.current = requestAnimationFrame(flush)
    }
    const up = () => {
      window.removeEventListener('pointermove', move)
      window.removeEventListener('pointerup', up)
      window.removeEventListener('pointercancel', up)
      if (frame.current) { cancelAnimationFrame(frame.current); frame.current = 0 }
      if (controls) controls.enabled = true
      setDragging(false)
      useStore.getState().endSectionDrag(pendingOffset)
    }
    window.addEventListener('pointermove', move)
    window.addEventListener('pointerup', up)
    window.addEventListener('pointercancel', up)
  }

  useEffect(() => () => { if (frame.current) cancelAnimationFrame(frame.current) }, [])

  return (
    <group position={hc} userData={{ noSnapshot: true }}>
      <primitive object={outline} />
      <mesh
        geometry={unitArrowGeometry()}
        material={arrowMaterial}
        quaternion={quaternion}
        scale={[0.014 * r, length, 0.014 * r]}
        renderOrder={11}
        onPointerDown={onPointerDown}
        onPointerOver={() => { setHover(true); gl.domElement.style.cursor = 'grab' }}
        onPointerOut={() => { setHover(false); gl.domElement.style.cursor = '' }}
      />
      <mesh renderOrder={11} material={arrowMaterial} onPointerDown={onPointerDown}>
        <sphereGeometry args={[0.03 * r, 12, 8]} />
      </mesh>
      {/* A fatter, invisible grip along the arrow: a thin shaft is hard to hit with a pointer. */}
      <mesh
        material={gripMaterial}
        quaternion={quaternion}
        position={n.clone().multiplyScalar(length / 2)}
        onPointerDown={onPointerDown}
        onPointerOver={() => { setHover(true); gl.domElement.style.cursor = 'grab' }}
        onPointerOut={() => { setHover(false); gl.domElement.style.cursor = '' }}
      >
        <cylinderGeometry args={[0.06 * r, 0.06 * r, length, 8, 1]} />
      </mesh>
    </group>
  )
}
