import { BufferGeometry, ConeGeometry, CylinderGeometry } from 'three'
import { mergeGeometries } from 'three/examples/jsm/utils/BufferGeometryUtils.js'

/** Fraction of the arrow length taken by the head. */
const HEAD = 0.28
/** Head radius in shaft radii. */
const HEAD_RADIUS = 2.4

let shared: BufferGeometry | null = null

/**
 * One arrow of unit length along +y from the origin, shaft radius 1: instances scale it by
 * (radius, length, radius). Eight sides are plenty at arrow size and keep software rendering
 * cheap (about 50 triangles per arrow). Shared by every arrow field for the page's life.
 */
export function unitArrowGeometry(): BufferGeometry {
  if (shared) return shared
  const shaft = new CylinderGeometry(1, 1, 1 - HEAD, 8, 1, false)
  shaft.translate(0, (1 - HEAD) / 2, 0)
  const head = new ConeGeometry(HEAD_RADIUS, HEAD, 8, 1, false)
  head.translate(0, 1 - HEAD / 2, 0)
  shared = mergeGeometries([shaft, head], false)
  shaft.dispose()
  head.dispose()
  return shared
}
