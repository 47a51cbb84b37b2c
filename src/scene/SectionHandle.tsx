import { useEffect, useMemo, useRef, useState } from 'react'
import { CylinderGeometry, DoubleSide, Matrix4, Mesh, MeshBasicMaterial, Quaternion, Shape, ShapeGeometry, Vector3 } from 'three'
import type { Group, PerspectiveCamera } from 'three'
import { useFrame, useThree } from '@react-three/fiber'
import type { ThreeEvent } from '@react-three/fiber'
import { sectionPlaneOf } from '../state/selectors.ts'
import { useStore } from '../state/store.ts'
import type { SectionState } from '../state/store.ts'
import { closestOnLine } from './closestOnLine.ts'
import { rawColour } from './rawColour.ts'
import { rayFromPointer } from './rayFromPointer.ts'
import { HANDLE, HANDLE_HOVER, HANDLE_RAIL, HANDLE_RIM } from './sceneLook.ts'

export interface SectionHandleProps {
  readonly section: SectionState
  /** Model sphere: centre and radius, length units. */
  readonly center: readonly [number, number, number]
  readonly radius: number
  /** Model bounds (length units): the rail spans the model's extent along the normal. */
  readonly bounds: { readonly min: readonly number[]; readonly max: readonly number[] }
  /**
   * The cut's own centre and half-size (length units) when known, so the handle stands beside the
   * section instead of beside the whole model.
   */
  readonly cut?: { readonly centroid: readonly [number, number, number]; readonly halfSize: number } | null
}

/** Sizes on screen (CSS pixels): the tab, its rim, the rail, and the invisible grips. */
const TAB_W = 34, TAB_H = 15, RIM = 2.5, RAIL = 1.6, GRIP = 11

/** Perpendicular unit vectors (e1, e2) to the unit n, e1 × e2 = n. */
function basis(n: Vector3): [Vector3, Vector3] {
  const a = Math.abs(n.x) < 0.9 ? new Vector3(1, 0, 0) : new Vector3(0, 1, 0)
  const e1 = new Vector3().crossVectors(n, a).normalize()
  const e2 = new Vector3().crossVectors(n, e1)
  return [e1, e2]
}

/** A rounded rectangle w × h (units), centred, in the xy-plane, its long side along x. */
function pill(w: number, h: number): ShapeGeometry {
  const r = h / 2, x = w / 2 - r
  const s = new Shape()
  s.moveTo(-x, -r)
  s.lineTo(x, -r)
  s.absarc(x, 0, r, -Math.PI / 2, Math.PI / 2, false)
  s.lineTo(-x, r)
  s.absarc(-x, 0, r, Math.PI / 2, (3 * Math.PI) / 2, false)
  return new ShapeGeometry(s, 8)
}

/** The handle's flat colour, drawn over everything (sectionWarmUp.ts makes one to warm its draw). */
export const flatMaterial = (hex: string, visible = true): MeshBasicMaterial =>
  new MeshBasicMaterial({ color: rawColour(hex), depthTest: false, depthWrite: false, toneMapped: false, visible, side: DoubleSide })

/**
 * The section handle, our own: a rail along the section normal that stands beside the cut (to
 * the right of it on screen, never over it), spanning the model's extent along the normal, with a
 * small pill-shaped tab where the plane meets the rail (its long side in the cut plane, turned
 * about the rail to face the viewer), and a short leader from the section's edge to the tab. The
 * tab shows where the cut sits within the part, like a slider drawn in the model; it keeps its
 * size on screen however large or small the model is (a pale rim keeps it readable over dense
 * meshes), and it leaves the section face uncovered.
 *
 * Dragging the tab moves the plane along its normal; pressing the rail elsewhere moves the plane
 * there and drags on. The pointer ray's closest point on the rail gives the new offset, handed to
 * the store's section drag (beginSectionDrag / dragSection / endSectionDrag, the protocol the
 * offset slider uses too) at most once per animation frame; the plane on screen follows with each
 * cut. While dragging, the rail turns the tab's colour and the tab's rim widens. Orbiting is off
 * while dragging. Kept out of snapshots (userData.noSnapshot).
 */
export function SectionHandle({ section, center, radius, bounds, cut }: SectionHandleProps) {
  const camera = useThree((s) => s.camera) as PerspectiveCamera
  const gl = useThree((s) => s.gl)
  const size = useThree((s) => s.size)
  const controls = useThree((s) => s.controls) as unknown as { enabled: boolean } | null
  const invalidate = useThree((s) => s.invalidate)
  const storeCamera = useStore((s) => s.camera)
  const [hover, setHover] = useState(false)
  const [dragging, setDragging] = useState(false)
  const frame = useRef(0)
  const tabGroup = useRef<Group>(null)
  const rail = useRef<Mesh>(null)
  const railGrip = useRef<Mesh>(null)

  const { point, normal } = sectionPlaneOf(section)
  const n = useMemo(() => new Vector3(normal[0], normal[1], normal[2]), [normal[0], normal[1], normal[2]])
  const c = new Vector3(center[0], center[1], center[2])
  // Handle anchor: the cut's centroid, else the model centre, projected on the plane so the
  // handle stays with the part while the cut catches up with a drag.
  const anchor = cut ? new Vector3(cut.centroid[0], cut.centroid[1], cut.centroid[2]) : c
  const dist = (anchor.x - point[0]) * n.x + (anchor.y - point[1]) * n.y + (anchor.z - point[2]) * n.z
  const hc = anchor.clone().addScaledVector(n, -dist)
  const r = radius > 0 ? radius : 1
  const half = cut && cut.halfSize > 0 ? Math.min(1.05 * r, Math.max(0.12 * r, cut.halfSize)) : 0.7 * r

  // In-plane direction towards the right of the screen (from the camera the store last saw), so
  // the rail stands beside the section; any in-plane direction when the view runs along it.
  const u = useMemo(() => {
    if (storeCamera) {
      const f = new Vector3(storeCamera.target[0] - storeCamera.position[0], storeCamera.target[1] - storeCamera.position[1], storeCamera.target[2] - storeCamera.position[2])
      const right = f.cross(new Vector3(storeCamera.up[0], storeCamera.up[1], storeCamera.up[2]))
      right.addScaledVector(n, -right.dot(n))
      if (right.lengthSq() > 0.04 * f.lengthSq()) return right.normalize()
    }
    return basis(n)[0]
  }, [n, storeCamera])
  // Rail foot on the plane, beside the section; the rail spans the model's extent along n (its
  // bounding box's, measured from the foot: [lo, hi]).
  const foot = hc.clone().addScaledVector(u, 1.3 * half)
  const f0 = foot.x * n.x + foot.y * n.y + foot.z * n.z
  let lo = Infinity, hi = -Infinity
  for (let i = 0; i < 8; i++) {
    const d = (i & 1 ? bounds.max[0] : bounds.min[0]) * n.x + (i & 2 ? bounds.max[1] : bounds.min[1]) * n.y + (i & 4 ? bounds.max[2] : bounds.min[2]) * n.z - f0
    lo = Math.min(lo, d); hi = Math.max(hi, d)
  }
  const base = (lo + hi) / 2, span = Math.max(hi - lo, 1e-9 * r)
  const railMid = foot.clone().addScaledVector(n, base)

  const qn = useMemo(() => new Quaternion().setFromUnitVectors(new Vector3(0, 1, 0), n), [n])

  const tabGeometry = useMemo(() => pill(TAB_W, TAB_H), [])
  const rimGeometry = useMemo(() => pill(TAB_W + 2 * RIM, TAB_H + 2 * RIM), [])
  const wideRimGeometry = useMemo(() => pill(TAB_W + 5 * RIM, TAB_H + 5 * RIM), [])
  const notchGeometry = useMemo(() => pill(2.2, TAB_H - 6), [])
  const railGeometry = useMemo(() => new CylinderGeometry(1, 1, 1, 8, 1, true), [])
  const gripGeometry = useMemo(() => new CylinderGeometry(1, 1, 1, 8, 1, false), [])
  useEffect(() => () => { for (const g of [tabGeometry, rimGeometry, wideRimGeometry, notchGeometry, railGeometry, gripGeometry]) g.dispose() },
    [tabGeometry, rimGeometry, wideRimGeometry, notchGeometry, railGeometry, gripGeometry])

  // One set of materials for the handle's life: a material per cut would recompile its shader
  // on every drag step.
  const mats = useMemo(() => ({
    tab: flatMaterial(HANDLE), rim: flatMaterial(HANDLE_RIM), notch: flatMaterial(HANDLE_RIM),
    rail: flatMaterial(HANDLE_RAIL), grip: flatMaterial(HANDLE, false),
  }), [])
  useEffect(() => () => { for (const m of Object.values(mats)) m.dispose() }, [mats])
  useEffect(() => {
    mats.tab.color.copy(rawColour(hover && !dragging ? HANDLE_HOVER : HANDLE))
    mats.rail.color.copy(rawColour(dragging ? HANDLE : HANDLE_RAIL))
    invalidate()
  }, [mats, hover, dragging, invalidate])

  // Each frame: constant size on screen (the world length of one pixel at the tab), and the tab
  // turned about the rail to face the camera: its long side lies in the cut plane, across the rail.
  const tabAt = useRef(new Vector3())
  tabAt.current.copy(foot)
  const tmp = useRef({ z: new Vector3(), x: new Vector3(), m: new Matrix4() })
  useFrame(() => {
    const d = camera.position.distanceTo(tabAt.current)
    const px = (2 * d * Math.tan(((camera.fov * Math.PI) / 180) / 2)) / Math.max(1, size.height)
    const g = tabGroup.current
    if (g) {
      g.scale.setScalar(px)
      const { z, x, m } = tmp.current
      z.subVectors(camera.position, tabAt.current)
      z.addScaledVector(n, -z.dot(n))
      if (z.lengthSq() > 1e-24) {
        z.normalize()
        x.crossVectors(n, z)
        g.quaternion.setFromRotationMatrix(m.makeBasis(x, n, z))
      }
    }
    rail.current?.scale.set(RAIL * px * (dragging ? 1.6 : 1), span, RAIL * px * (dragging ? 1.6 : 1))
    railGrip.current?.scale.set(GRIP * px, span, GRIP * px)
  })

  const startDrag = (e: ThreeEvent<PointerEvent>, jump: boolean) => {
    if (e.button !== 0) return
    e.stopPropagation()
    const state = useStore.getState()
    const startOffset = state.section.offset
    const P = foot.clone()
    const s0 = closestOnLine(P, n, rayFromPointer(e.nativeEvent.clientX, e.nativeEvent.clientY, gl.domElement, camera))
    if (!Number.isFinite(s0)) return
    // Keep the plane within the model's extent along n (a little beyond, to clear the ends).
    const margin = 0.01 * span
    const min = startOffset + lo - margin, max = startOffset + hi + margin
    const clamp = (v: number): number => Math.min(max, Math.max(min, v))
    // Pressing the rail away from the tab moves the plane there at once.
    let pendingOffset = jump ? clamp(startOffset + s0) : startOffset
    const from = jump ? 0 : s0
    if (controls) controls.enabled = false
    setDragging(true)
    state.beginSectionDrag()
    if (jump) useStore.getState().dragSection(pendingOffset)

    const flush = () => {
      frame.current = 0
      useStore.getState().dragSection(pendingOffset)
    }
    const move = (ev: PointerEvent) => {
      const s = closestOnLine(P, n, rayFromPointer(ev.clientX, ev.clientY, gl.domElement, camera))
      if (!Number.isFinite(s)) return
      pendingOffset = clamp(startOffset + (s - from))
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
  const over = () => { setHover(true); gl.domElement.style.cursor = 'grab' }
  const out = () => { setHover(false); gl.domElement.style.cursor = '' }

  useEffect(() => () => { if (frame.current) cancelAnimationFrame(frame.current) }, [])

  // The leader: from the section's edge along u to the rail, in the plane.
  const leaderFrom = hc.clone().addScaledVector(u, 0.98 * half)
  const leaderLength = 0.32 * half
  const leaderMid = leaderFrom.clone().addScaledVector(u, leaderLength / 2)
  const qLeader = useMemo(() => new Quaternion().setFromUnitVectors(new Vector3(0, 1, 0), u), [u])

  return (
    <group userData={{ noSnapshot: true }}>
      <mesh ref={rail} geometry={railGeometry} material={mats.rail} position={railMid} quaternion={qn} renderOrder={10} raycast={() => {}} />
      <mesh geometry={railGeometry} material={mats.rail} position={leaderMid} quaternion={qLeader} scale={[0.0025 * r, leaderLength, 0.0025 * r]} renderOrder={10} raycast={() => {}} />
      {/* A fatter, invisible grip along the rail: a thin line is hard to hit with a pointer. */}
      <mesh ref={railGrip} geometry={gripGeometry} material={mats.grip} position={railMid} quaternion={qn}
        onPointerDown={(e) => startDrag(e, true)} onPointerOver={over} onPointerOut={out} />
      <group ref={tabGroup} position={foot}>
        <mesh geometry={dragging ? wideRimGeometry : rimGeometry} material={mats.rim} renderOrder={11} raycast={() => {}} />
        <mesh geometry={tabGeometry} material={mats.tab} renderOrder={12} onPointerDown={(e) => startDrag(e, false)} onPointerOver={over} onPointerOut={out} />
        <mesh geometry={notchGeometry} material={mats.notch} position={[-4, 0, 0]} renderOrder={13} raycast={() => {}} />
        <mesh geometry={notchGeometry} material={mats.notch} position={[4, 0, 0]} renderOrder={13} raycast={() => {}} />
        {/* An invisible disc round the tab keeps it easy to grab when the plane is seen edge-on. */}
        <mesh material={mats.grip} onPointerDown={(e) => startDrag(e, false)} onPointerOver={over} onPointerOut={out}>
          <sphereGeometry args={[GRIP + 4, 10, 6]} />
        </mesh>
      </group>
    </group>
  )
}
