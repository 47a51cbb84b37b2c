/**
 * What the scene draws for an assembly: the highlighted region of the cut (its triangles as one
 * index range of the section geometry, drawn over the fill) and every region's number at its
 * centroid; and the interfaces between parts as patches (drawn through the surface, since a
 * shared-node interface lies inside the body), the highlighted one stronger. The worker groups
 * the triangles, so nothing here loops over them.
 */
import { useEffect, useMemo } from 'react'
import { BufferAttribute, BufferGeometry, DoubleSide, MeshBasicMaterial, MeshLambertMaterial } from 'three'
import type { PerspectiveCamera, Plane, Sprite } from 'three'
import { useThree } from '@react-three/fiber'
import type { SectionBuffers, Vec3 } from '../../workers/protocol.ts'
import { rawColour } from './rawColour.ts'
import { disposeSprite, setLabelSize, textSprite } from './textSprite.ts'
import { INTERFACE, NEUTRAL_SURFACE, REGION } from './sceneLook.ts'

const noRaycast = (): void => {}

/** Draws only triangle group k of `geometry` (offsets per group); false when k is none or out of range. */
function useGroupRange(geometry: BufferGeometry, offsets: Int32Array, k: number): boolean {
  const invalidate = useThree((s) => s.invalidate)
  const ok = k >= 0 && k + 1 < offsets.length
  useEffect(() => {
    if (ok) geometry.setDrawRange(3 * offsets[k], 3 * (offsets[k + 1] - offsets[k]))
    invalidate()
  }, [geometry, offsets, k, ok, invalidate])
  return ok
}

/** One region's number at its centroid. */
function RegionNumber({ n, at, strong }: { n: number; at: Vec3; strong: boolean }) {
  const invalidate = useThree((s) => s.invalidate)
  const camera = useThree((s) => s.camera) as PerspectiveCamera
  const height = useThree((s) => s.size.height)
  const label = useMemo<Sprite>(() => textSprite(String(n), strong ? REGION : '#3d3f42'), [n, strong])
  useEffect(() => () => disposeSprite(label), [label])
  useEffect(() => { setLabelSize(label, height, camera.fov); invalidate() }, [label, height, camera.fov, invalidate])
  return <primitive object={label} position={[at[0], at[1], at[2]]} />
}

export interface RegionMarksProps {
  readonly buffers: SectionBuffers
  /** Triangle offsets per region (CutReply.regionTriangles). */
  readonly offsets: Int32Array
  readonly centroids: readonly Vec3[]
  /** Index of the highlighted region, -1 for none. */
  readonly highlighted: number
}

/** The regions' numbers and the highlighted region over the section fill. */
export function RegionMarks({ buffers, offsets, centroids, highlighted }: RegionMarksProps) {
  const geometry = useMemo(() => {
    const g = new BufferGeometry()
    g.setAttribute('position', new BufferAttribute(buffers.positions, 3))
    g.setIndex(new BufferAttribute(buffers.index, 1))
    return g
  }, [buffers])
  useEffect(() => () => geometry.dispose(), [geometry])
  const material = useMemo(() => new MeshBasicMaterial({
    color: rawColour(REGION), transparent: true, opacity: 0.55, side: DoubleSide, depthWrite: false, toneMapped: false,
    polygonOffset: true, polygonOffsetFactor: -2, polygonOffsetUnits: -4,
  }), [])
  useEffect(() => () => material.dispose(), [material])
  const ok = useGroupRange(geometry, offsets, highlighted)
  return (
    <>
      {ok ? <mesh geometry={geometry} material={material} renderOrder={5} raycast={noRaycast} frustumCulled={false} /> : null}
      {centroids.map((c, k) => <RegionNumber key={k} n={k + 1} at={c} strong={k === highlighted} />)}
    </>
  )
}

export interface InterfacePatchesProps {
  /** Float32Array(9·T) triangles of the interfaces (AssemblySummary.interfacePositions). */
  readonly positions: Float32Array
  readonly offsets: Int32Array
  readonly highlighted: number
}

/** The interfaces between parts as patches, seen through the surface; the highlighted one stronger. */
export function InterfacePatches({ positions, offsets, highlighted }: InterfacePatchesProps) {
  const geometry = useMemo(() => {
    const g = new BufferGeometry()
    g.setAttribute('position', new BufferAttribute(positions, 3))
    return g
  }, [positions])
  const strong = useMemo(() => {
    const g = new BufferGeometry()
    g.setAttribute('position', new BufferAttribute(positions, 3))
    return g
  }, [positions])
  useEffect(() => () => { geometry.dispose(); strong.dispose() }, [geometry, strong])
  const [soft, hard] = useMemo(() => [
    new MeshBasicMaterial({ color: rawColour(INTERFACE), transparent: true, opacity: 0.35, side: DoubleSide, depthTest: false, depthWrite: false, toneMapped: false }),
    new MeshBasicMaterial({ color: rawColour(INTERFACE), transparent: true, opacity: 0.85, side: DoubleSide, depthTest: false, depthWrite: false, toneMapped: false }),
  ], [])
  useEffect(() => () => { soft.dispose(); hard.dispose() }, [soft, hard])
  const ok = useGroupRange(strong, offsets, highlighted)
  return (
    <>
      <mesh geometry={geometry} material={soft} renderOrder={6} raycast={noRaycast} frustumCulled={false} />
      {ok ? <mesh geometry={strong} material={hard} renderOrder={7} raycast={noRaycast} frustumCulled={false} /> : null}
    </>
  )
}

export interface ClosingFacesProps {
  readonly positions: Float32Array
  readonly offsets: Int32Array
  /** Interfaces to draw (indices): those between a shown and a hidden part. */
  readonly shown: readonly number[]
  readonly clippingPlanes: Plane[]
}

/**
 * The faces a shown part has against hidden parts: they are not on the body's surface (shared-node
 * interfaces lie inside it), so a part shown alone would be open there. Drawn plain, in depth.
 */
export function ClosingFaces({ positions, offsets, shown, clippingPlanes }: ClosingFacesProps) {
  const invalidate = useThree((s) => s.invalidate)
  const geometry = useMemo(() => {
    const g = new BufferGeometry()
    g.setAttribute('position', new BufferAttribute(positions, 3))
    g.computeVertexNormals()
    return g
  }, [positions])
  useEffect(() => () => geometry.dispose(), [geometry])
  const material = useMemo(() => new MeshLambertMaterial({ color: rawColour(NEUTRAL_SURFACE), side: DoubleSide, clippingPlanes, toneMapped: false }), [clippingPlanes])
  useEffect(() => () => material.dispose(), [material])
  useEffect(() => {
    geometry.clearGroups()
    for (const i of shown) geometry.addGroup(3 * offsets[i], 3 * (offsets[i + 1] - offsets[i]), 0)
    invalidate()
  }, [geometry, offsets, shown, invalidate])
  const materials = useMemo(() => [material], [material])
  return (
    <>
      <hemisphereLight args={['#ffffff', '#c4c4bf', 1.7]} />
      <mesh geometry={geometry} material={materials} raycast={noRaycast} frustumCulled={false} />
    </>
  )
}
