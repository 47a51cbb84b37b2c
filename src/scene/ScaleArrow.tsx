import { useEffect, useMemo, useRef } from 'react'
import { MeshBasicMaterial, Quaternion, Vector3 } from 'three'
import type { Group, PerspectiveCamera, Sprite } from 'three'
import { useFrame, useThree } from '@react-three/fiber'
import { unitArrowGeometry } from './arrowGeometry.ts'
import { rawColour } from './rawColour.ts'
import { disposeSprite, setLabelSize, textSprite } from './textSprite.ts'
import { HALO, SCALE_ARROW } from './sceneLook.ts'

export interface ScaleArrowProps {
  /** Model bounds, length units: the arrow stands below their lower left corner on screen. */
  readonly bounds: { readonly min: readonly number[]; readonly max: readonly number[] }
  /** Drawn length of the arrow (length units): that of a traction arrow of the labelled value. */
  readonly length: number
  /** Shaft radius, length units (as the traction arrows). */
  readonly radius: number
  /** The label, e.g. "50 MPa". */
  readonly label: string
  /** Hidden (kept mounted) while no arrows show, so its label and shaders outlive a drag. */
  readonly visible?: boolean
}

const Y = new Vector3(0, 1, 0)

/**
 * The length scale of the traction arrows: an arrow of a round value, drawn at the length a
 * traction of that value gets, lying across the screen just below the model's lower left corner,
 * labelled with the value. It turns with the view (it always runs along the screen, so its
 * length on screen is true at its depth). Part of snapshots.
 */
export function ScaleArrow({ bounds, length, radius, label, visible = true }: ScaleArrowProps) {
  const invalidate = useThree((s) => s.invalidate)
  const camera = useThree((s) => s.camera) as PerspectiveCamera
  const height = useThree((s) => s.size.height)
  const group = useRef<Group>(null)
  const materials = useMemo(() => ({
    halo: new MeshBasicMaterial({ color: rawColour(HALO), depthTest: false, depthWrite: false, toneMapped: false }),
    arrow: new MeshBasicMaterial({ color: rawColour(SCALE_ARROW), depthTest: false, depthWrite: false, toneMapped: false }),
  }), [])
  useEffect(() => () => { materials.halo.dispose(); materials.arrow.dispose() }, [materials])
  const sprite = useMemo<Sprite>(() => {
    const s = textSprite(label, SCALE_ARROW)
    s.center.set(0, 0.5)
    return s
  }, [label])
  useEffect(() => () => disposeSprite(sprite), [sprite])
  useEffect(() => { setLabelSize(sprite, height, camera.fov); invalidate() }, [sprite, height, camera.fov, invalidate])
  useEffect(() => { sprite.visible = visible; invalidate() }, [sprite, visible, invalidate])
  useEffect(() => { invalidate() }, [bounds, length, radius, label, invalidate])

  const corners = useMemo(() => {
    const out: Vector3[] = []
    for (let i = 0; i < 8; i++) out.push(new Vector3(i & 1 ? bounds.max[0] : bounds.min[0], i & 2 ? bounds.max[1] : bounds.min[1], i & 4 ? bounds.max[2] : bounds.min[2]))
    return out
  }, [bounds])
  const size = useMemo(() => Math.hypot(bounds.max[0] - bounds.min[0], bounds.max[1] - bounds.min[1], bounds.max[2] - bounds.min[2]) || 1, [bounds])

  // Placed every frame from the camera: below the corner that is lowest-left on screen.
  const right = useRef(new Vector3()), up = useRef(new Vector3()), q = useRef(new Quaternion())
  useFrame(() => {
    const g = group.current
    if (!g) return
    camera.updateMatrixWorld()
    right.current.setFromMatrixColumn(camera.matrixWorld, 0).normalize()
    up.current.setFromMatrixColumn(camera.matrixWorld, 1).normalize()
    let best = corners[0], score = Infinity
    for (const c of corners) {
      const v = c.dot(right.current) + c.dot(up.current)
      if (v < score) { score = v; best = c }
    }
    g.position.copy(best).addScaledVector(up.current, -0.06 * size)
    g.quaternion.copy(q.current.setFromUnitVectors(Y, right.current))
    sprite.position.copy(g.position).addScaledVector(right.current, length + 0.015 * size)
  })
  return (
    <>
      <group ref={group} visible={visible}>
        <mesh geometry={unitArrowGeometry()} material={materials.halo} scale={[2.4 * radius, length * 1.04, 2.4 * radius]} position={[0, -0.02 * length, 0]} renderOrder={14} raycast={() => {}} />
        <mesh geometry={unitArrowGeometry()} material={materials.arrow} scale={[radius, length, radius]} renderOrder={15} raycast={() => {}} />
      </group>
      <primitive object={sprite} />
    </>
  )
}
