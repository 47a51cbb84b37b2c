import { useEffect, useMemo } from 'react'
import { MeshBasicMaterial, Quaternion, Vector3 } from 'three'
import type { Sprite } from 'three'
import { useThree } from '@react-three/fiber'
import type { PerspectiveCamera } from 'three'
import { unitArrowGeometry } from './arrowGeometry.ts'
import { rawColour } from './rawColour.ts'
import { disposeSprite, setLabelSize, textSprite } from './textSprite.ts'
import { HALO, TRIAD_E1, TRIAD_E2, TRIAD_N } from './sceneLook.ts'

type V3 = readonly [number, number, number]

export interface SectionTriadProps {
  /** Section centroid, length units. */
  readonly centroid: V3
  /** Unit section axes: e1, e2 in the plane, e3 = the normal n. */
  readonly e1: V3
  readonly e2: V3
  readonly e3: V3
  /** Arrow length, length units. */
  readonly length: number
  /**
   * Hidden (not unmounted) while the plane is dragged: a remount would make new label textures
   * and, on software WebGL, compile the sprite shader again on the release frame.
   */
  readonly visible?: boolean
}

const AXES = [
  { key: 'e1', label: 'e₁', colour: TRIAD_E1 },
  { key: 'e2', label: 'e₂', colour: TRIAD_E2 },
  { key: 'e3', label: 'n', colour: TRIAD_N },
] as const

/**
 * The section axes drawn where the resultant acts: three arrows from the centroid along e₁, e₂
 * and the normal n = e₃, labelled as in the Cut card, each on a pale halo so it reads on any
 * colour of the section face. Drawn over everything; part of snapshots.
 */
export function SectionTriad({ centroid, e1, e2, e3, length, visible = true }: SectionTriadProps) {
  const invalidate = useThree((s) => s.invalidate)
  const camera = useThree((s) => s.camera) as PerspectiveCamera
  const height = useThree((s) => s.size.height)
  const materials = useMemo(() => ({
    halo: new MeshBasicMaterial({ color: rawColour(HALO), depthTest: false, depthWrite: false, toneMapped: false }),
    axes: AXES.map((a) => new MeshBasicMaterial({ color: rawColour(a.colour), depthTest: false, depthWrite: false, toneMapped: false })),
  }), [])
  useEffect(() => () => { materials.halo.dispose(); for (const m of materials.axes) m.dispose() }, [materials])
  const labels = useMemo<Sprite[]>(() => AXES.map((a) => textSprite(a.label, a.colour)), [])
  useEffect(() => () => { for (const l of labels) disposeSprite(l) }, [labels])
  useEffect(() => { for (const l of labels) setLabelSize(l, height, camera.fov); invalidate() }, [labels, height, camera.fov, invalidate])

  const dirs = [e1, e2, e3]
  const arrows = dirs.map((d) => {
    const v = new Vector3(d[0], d[1], d[2])
    return { q: new Quaternion().setFromUnitVectors(new Vector3(0, 1, 0), v), tip: new Vector3(centroid[0], centroid[1], centroid[2]).addScaledVector(v, 1.22 * length) }
  })
  useEffect(() => { invalidate() }, [centroid, e1, e2, e3, length, visible, invalidate])
  const r = 0.035 * length
  return (
    <group visible={visible}>
      {arrows.map((a, i) => (
        <group key={AXES[i].key} position={[centroid[0], centroid[1], centroid[2]]} quaternion={a.q}>
          <mesh geometry={unitArrowGeometry()} material={materials.halo} scale={[2.4 * r, 1.06 * length, 2.4 * r]} position={[0, -0.03 * length, 0]} renderOrder={14} raycast={() => {}} />
          <mesh geometry={unitArrowGeometry()} material={materials.axes[i]} scale={[r, length, r]} renderOrder={15} raycast={() => {}} />
        </group>
      ))}
      {arrows.map((a, i) => <primitive key={`l${i}`} object={labels[i]} position={a.tip} />)}
    </group>
  )
}
