/**
 * The section face a cut reply carries (SectionBuffers): the cut's own fill triangles
 * (sectionTriangles.ts) and, for a software renderer, a light face of about LIGHT_FACE_TRIANGLES
 * triangles by vertex clustering (coarseSectionFill.ts) when the face has more: drawn while the
 * plane is dragged, it keeps a drag's frames short (at 10^7 elements the full face's 10^5 small
 * triangles were most of what a frame waited for). 'also' sends both, so the grab's first frame
 * already draws the light face; 'only' (a drag step) sends the light face in the full one's place.
 * Both keep the full face's colour ranges, so the legend stays still. Regions keep the full
 * face: their marks name its triangles.
 */
import { buildSectionTriangles } from '../src/mechanics/sectionTriangles.ts'
import { coarsenSectionFill } from '../src/mechanics/coarseSectionFill.ts'
import type { SectionPolygons } from '../src/mechanics/types.ts'
import type { Vec3 } from '../src/model/model.ts'
import type { CutOptions, SectionFaceArrays } from './protocol.ts'

/** Triangles of the light face: a few milliseconds of a software rasteriser, about 10^4 cells across the face. */
export const LIGHT_FACE_TRIANGLES = 20_000

export interface SectionFace {
  /** The face drawn: the full one, or the light one for 'only'. */
  readonly face: SectionFaceArrays
  /** The light face besides the full one ('also', when the face is larger than the light one). */
  readonly light: SectionFaceArrays | null
  readonly ranges: { readonly normalTraction: readonly [number, number]; readonly shearTraction: readonly [number, number] }
  /** The element of each triangle of `face` when it is the full face, else null. */
  readonly triangleElement: Int32Array | null
}

function lightOf(polygons: SectionPolygons, normal: Vec3, displacement: Float64Array | undefined, triangles: number) {
  const c = coarsenSectionFill(polygons.fill, normal, triangles, displacement)
  const face: SectionFaceArrays = { positions: c.positions, index: c.index, normalTraction: c.normalTraction, shearTraction: c.shearTraction, ...(c.displacement ? { displacement: c.displacement } : {}) }
  return { face, ranges: c.ranges }
}

/**
 * `normal` the section normal m; `displacement` (3 per fill point, the deformed shape) or
 * undefined; `regions`: the reply marks regions on the face, so the face drawn stays whole;
 * `triangles` the light face's size.
 */
export function sectionFace(
  polygons: SectionPolygons, normal: Vec3, lightFace: CutOptions['lightFace'], displacement: Float64Array | undefined, regions: boolean,
  triangles = LIGHT_FACE_TRIANGLES,
): SectionFace {
  const large = lightFace !== undefined && polygons.fill.index.length > 3 * triangles
  if (large && lightFace === 'only' && !regions) {
    const l = lightOf(polygons, normal, displacement, triangles)
    return { face: l.face, light: null, ranges: l.ranges, triangleElement: null }
  }
  const t = buildSectionTriangles(polygons, normal)
  const face: SectionFaceArrays = {
    positions: t.positions, index: t.index, normalTraction: t.normalTraction, shearTraction: t.shearTraction,
    ...(displacement ? { displacement: Float32Array.from(displacement) } : {}),
  }
  return { face, light: large ? lightOf(polygons, normal, displacement, triangles).face : null, ranges: t.ranges, triangleElement: t.triangleElement }
}

/** The buffers a face record holds (for a reply's transfer list). */
export function faceTransfer(f: SectionFaceArrays | null | undefined): ArrayBuffer[] {
  if (!f) return []
  return [f.positions, f.index, f.normalTraction, f.shearTraction, ...(f.displacement ? [f.displacement] : [])].map((x) => x.buffer as ArrayBuffer)
}
