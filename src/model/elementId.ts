/**
 * The user's element id of a global element index. The rule everywhere (messages, exports, the
 * probe, the command line): a reported element id is the id the user gave, read from the element's
 * block (`ElementBlock.ids`), never one made up. An index outside the mesh is a programming error,
 * not something to report with a stand-in id, so it throws.
 */
import type { Mesh } from './model.ts'

/** Global element index `g` (0..elementCount-1) → the user's element id. */
export function elementIdOf(mesh: Mesh, g: number): number {
  for (const b of mesh.blocks) {
    if (g >= b.offset && g < b.offset + b.ids.length) return b.ids[g - b.offset]
  }
  throw new RangeError(`element index ${g} is outside the mesh (${mesh.elementCount} elements)`)
}
