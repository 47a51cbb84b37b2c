/**
 * The faces between parts that share nodes, as the boundary extraction finds them: an interior
 * face is a run of two in the extraction's matching (boundaryFaces.ts), and where its two elements
 * have different part numbers it lies between those parts. The extraction records those pairs for
 * the mesh it matched (two reads per interior face, only on a mesh with two parts or more), and
 * the parts' boundaries (partFaces.ts) read them instead of matching the faces between parts again,
 * which takes two passes over every element's corners.
 *
 * A record belongs to the mesh object it was made for (a WeakMap: it goes with the mesh); a mesh
 * without a record (another object for the same elements, or one never extracted) gets the
 * plain matching in partFaces.ts, with the same result.
 *
 * A pair is two face references, globalElement·8 + localFace (boundaryFaces.ts), the lower first.
 */
import type { Mesh } from '../model/model.ts'

const recorded = new WeakMap<Mesh, Int32Array>()

/**
 * Each element's part number (global element order) when the mesh has two part numbers or more,
 * else null: a block's own array when it is the only block, a new array otherwise.
 */
export function elementParts(mesh: Mesh): Int32Array | null {
  const blocks = mesh.blocks
  if (!hasSeveralParts(mesh)) return null
  if (blocks.length === 1) return blocks[0].part
  const out = new Int32Array(mesh.elementCount)
  for (const b of blocks) if (b.part) out.set(b.part, b.offset)
  return out
}

/** Whether the mesh has two part numbers or more (partNumbers(mesh).length ≥ 2), read only up to the first second part. */
export function hasSeveralParts(mesh: Mesh): boolean {
  // the blocks' first and last elements tell at once for most assemblies (parts come in runs)
  const ends: number[] = []
  for (const b of mesh.blocks) {
    if (!b.part) ends.push(0)
    else if (b.part.length > 0) ends.push(b.part[0], b.part[b.part.length - 1])
  }
  if (ends.some((p) => p !== ends[0])) return true
  let first = 0, seen = false
  for (const b of mesh.blocks) {
    if (!b.part) {
      if (seen && first !== 0) return true
      first = 0; seen = true
      continue
    }
    const part = b.part
    for (let e = 0; e < part.length; e++) {
      const p = part[e]
      if (!seen) { first = p; seen = true } else if (p !== first) return true
    }
  }
  return false
}

/** Records the pairs (2 references each) found by the extraction of `mesh`. */
export function recordPartPairs(mesh: Mesh, pairs: Int32Array): void {
  recorded.set(mesh, pairs)
}

/** The pairs the extraction recorded for this mesh object, or null. */
export function recordedPartPairs(mesh: Mesh): Int32Array | null {
  return recorded.get(mesh) ?? null
}
