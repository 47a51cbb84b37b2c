import { useEffect, useMemo } from 'react'
import { BufferAttribute, BufferGeometry, LineBasicMaterial, MeshBasicMaterial } from 'three'
import { useThree } from '@react-three/fiber'
import type { LineReply, Vec3 } from '../../workers/protocol.ts'
import { rawColour } from './rawColour.ts'
import { LINE } from './sceneLook.ts'

export interface LineOverlayProps {
  /** The sampled line, or null while only its ends are known. */
  readonly reply: LineReply | null
  /** Its ends as set (model length units); the start alone while the end is being picked. */
  readonly from: Vec3 | null
  readonly to: Vec3 | null
  /** Deformed-shape scale (0: undeformed): the line moves with the material under it. */
  readonly deformScale: number
  /** Marker radius, length units. */
  readonly radius: number
}

const noRaycast = (): void => {}

/**
 * The line through the model: the sampled points joined where they lie in the body (gaps stay
 * open), and a dot at each end. Drawn over everything, so a line through a wall shows through
 * the surface that hides it. Bounded by the sample count, so building it here is fine.
 */
export function LineOverlay({ reply, from, to, deformScale, radius }: LineOverlayProps) {
  const invalidate = useThree((s) => s.invalidate)
  const geometry = useMemo(() => {
    const g = new BufferGeometry()
    const seg: number[] = []
    if (reply) {
      const n = reply.held.length, p = reply.points, u = reply.displacement
      const at = (i: number, k: number): number => p[3 * i + k] + (u && deformScale ? deformScale * u[3 * i + k] : 0)
      for (let i = 0; i + 1 < n; i++) {
        if (!reply.held[i] || !reply.held[i + 1]) continue
        seg.push(at(i, 0), at(i, 1), at(i, 2), at(i + 1, 0), at(i + 1, 1), at(i + 1, 2))
      }
    }
    g.setAttribute('position', new BufferAttribute(Float32Array.from(seg), 3))
    return g
  }, [reply, deformScale])
  useEffect(() => () => geometry.dispose(), [geometry])
  const lineMaterial = useMemo(() => new LineBasicMaterial({ color: rawColour(LINE), depthTest: false, toneMapped: false }), [])
  const dotMaterial = useMemo(() => new MeshBasicMaterial({ color: rawColour(LINE), depthTest: false, toneMapped: false }), [])
  useEffect(() => () => { lineMaterial.dispose(); dotMaterial.dispose() }, [lineMaterial, dotMaterial])
  useEffect(() => { invalidate() }, [geometry, from, to, invalidate])
  // The end dots sit where the first and last points are drawn (moved with the material).
  const ends: Vec3[] = []
  if (reply && reply.held.length > 1) {
    const n = reply.held.length, p = reply.points, u = reply.displacement
    for (const i of [0, n - 1]) ends.push([0, 1, 2].map((k) => p[3 * i + k] + (u && deformScale && reply.held[i] ? deformScale * u[3 * i + k] : 0)) as Vec3)
  } else {
    if (from) ends.push(from)
    if (to) ends.push(to)
  }
  return (
    <>
      <lineSegments geometry={geometry} material={lineMaterial} renderOrder={13} raycast={noRaycast} frustumCulled={false} />
      {ends.map((e, i) => (
        <mesh key={i} position={e} material={dotMaterial} renderOrder={13} raycast={noRaycast}>
          <sphereGeometry args={[radius, 14, 9]} />
        </mesh>
      ))}
    </>
  )
}
