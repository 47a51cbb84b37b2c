/**
 * The element registry: the one place that knows the element types. Per type its name, code,
 * nodes, corners, faces and face kinds, edges with their mid-edge nodes, reference domain and
 * reference coordinates, shape functions, volume rule, mirror permutation, signed-volume inputs
 * and how it fills a grid cell (src/model/elements/elementRecord.ts says what each field means);
 * per face kind its nodes, shape functions and face rule (src/model/elements/faceKinds.ts).
 * Everything else looks types up here, and an unknown type is an error, never a default.
 *
 * Adding a type: write its record in the family file under src/model/elements/ (a new family
 * gets a file of its own) and list it in ELEMENT_TYPE_LIST below; nothing else keeps a table.
 */
import type { ElementType } from './elements/elementRecord.ts'
import { FACE_KINDS } from './elements/faceKinds.ts'
import type { FaceKind } from './elements/faceKinds.ts'
import { HEX20, HEX8 } from './elements/hexahedra.ts'
import { PYRAMID13, PYRAMID5 } from './elements/pyramids.ts'
import { TET10, TET4 } from './elements/tetrahedra.ts'
import { WEDGE15, WEDGE6 } from './elements/wedges.ts'
import { InputError } from './errors.ts'

export type { ElementType, RefPoint, ReferenceDomain } from './elements/elementRecord.ts'
export type { FaceKind, FaceKindType } from './elements/faceKinds.ts'
export { FACE_KINDS, faceKind, faceKindOf } from './elements/faceKinds.ts'
export type { QuadratureRule } from './elements/quadratureRules.ts'

/** Every element type, in code order (codes are never renumbered; a new type takes the next). */
export const ELEMENT_TYPE_LIST = [TET4, TET10, HEX8, HEX20, WEDGE6, PYRAMID5, PYRAMID13, WEDGE15] as const

export type ElementTypeName = (typeof ELEMENT_TYPE_LIST)[number]['name']
/** An element type's registry record. */
export type ElementTopology = ElementType<ElementTypeName>

export const ELEMENT_TYPE_NAMES: readonly ElementTypeName[] = ELEMENT_TYPE_LIST.map((t) => t.name)

export const ELEMENT_TYPES: Readonly<Record<ElementTypeName, ElementTopology>> = Object.freeze(
  Object.fromEntries(ELEMENT_TYPE_LIST.map((t) => [t.name, t])) as Record<ElementTypeName, ElementTopology>,
)

export function isElementTypeName(s: string): s is ElementTypeName {
  return Object.prototype.hasOwnProperty.call(ELEMENT_TYPES, s)
}

/** The registry record of `name`; an unknown name is an InputError that lists the known ones. */
export function elementType(name: string): ElementTopology {
  if (!isElementTypeName(name)) {
    throw new InputError('unknown-type', `unknown element type ${JSON.stringify(name)}; known types: ${ELEMENT_TYPE_NAMES.join(', ')}`)
  }
  return ELEMENT_TYPES[name]
}

/** Node count of each face kind, by name. */
export const FACE_NODE_COUNT: Readonly<Record<FaceKind, number>> = byFaceKind((k) => k.nodeCount)
/** Corner count of each face kind, by name. */
export const FACE_CORNER_COUNT: Readonly<Record<FaceKind, number>> = byFaceKind((k) => k.cornerCount)
/** Numeric code of each face kind (BoundaryFaces.kind), by name. */
export const FACE_KIND_CODE: Readonly<Record<FaceKind, number>> = byFaceKind((k) => k.code)
/** Face kind names by code. */
export const FACE_KIND_BY_CODE: readonly FaceKind[] = FACE_KINDS.map((k) => k.name)

function byFaceKind(f: (k: (typeof FACE_KINDS)[number]) => number): Readonly<Record<FaceKind, number>> {
  return Object.freeze(Object.fromEntries(FACE_KINDS.map((k) => [k.name, f(k)])) as Record<FaceKind, number>)
}
