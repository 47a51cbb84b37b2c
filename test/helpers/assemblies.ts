/**
 * Assemblies for the parts tests: box meshes joined with a part number per input, either with
 * coincident nodes merged (shared nodes) or kept apart (parts meshed separately whose nodes
 * only coincide).
 */
import { boxMesh } from '../../src/model/boxMesh.ts'
import type { BoxSpec } from '../../src/model/boxMesh.ts'
import { createMesh } from '../../src/model/createMesh.ts'
import type { BlockInput } from '../../src/model/createMesh.ts'
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import type { Mesh } from '../../src/model/model.ts'

export interface PieceSpec { readonly box: BoxSpec; readonly type: ElementTypeName; readonly part: number }

export function assembly(pieces: readonly PieceSpec[], merge: boolean): Mesh {
  const meshes = pieces.map((p) => boxMesh(p.box, p.type))
  let size = 0
  for (const m of meshes) for (const v of m.coords) size = Math.max(size, Math.abs(v))
  const tol = 1e-9 * (size || 1)
  const index = new Map<string, number>()
  const coords: number[] = []
  const blocks: BlockInput[] = []
  meshes.forEach((m, pi) => {
    const map = new Int32Array(m.nodeCount)
    for (let i = 0; i < m.nodeCount; i++) {
      const x = m.coords[3 * i], y = m.coords[3 * i + 1], z = m.coords[3 * i + 2]
      const k = merge ? `${Math.round(x / tol)},${Math.round(y / tol)},${Math.round(z / tol)}` : ''
      let j = merge ? index.get(k) : undefined
      if (j === undefined) {
        j = coords.length / 3
        if (merge) index.set(k, j)
        coords.push(x, y, z)
      }
      map[i] = j
    }
    for (const b of m.blocks) blocks.push({ type: b.type, conn: b.conn.map((n) => map[n]), part: new Int32Array(b.ids.length).fill(pieces[pi].part) })
  })
  return createMesh(Float64Array.from(coords), blocks)
}

/** The element types of the random assemblies. */
export const ASSEMBLY_TYPES: readonly ElementTypeName[] = ['tet4', 'tet10', 'hex8', 'hex20', 'wedge6', 'pyramid5']

/**
 * A random assembly: 2-5 boxes of 2×2×2 cells on a unit lattice (they touch face to face), random
 * types and parts 1-3, nodes merged (shared) or kept apart (meshed apart) at random.
 */
export function randomAssembly(rnd: () => number): { mesh: Mesh; merged: boolean } {
  const pieces: PieceSpec[] = []
  const count = 2 + Math.floor(4 * rnd())
  // one grid spacing for all, so faces of touching boxes match (a type's own split may differ)
  for (let p = 0; p < count; p++) {
    const at = [Math.floor(3 * rnd()), Math.floor(2 * rnd()), Math.floor(2 * rnd())]
    pieces.push({
      box: { nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1, x0: at[0], y0: at[1], z0: at[2] },
      type: ASSEMBLY_TYPES[Math.floor(rnd() * ASSEMBLY_TYPES.length)], part: 1 + Math.floor(3 * rnd()),
    })
  }
  // boxes on the same lattice cell would overlap: keep the first of each
  const seen = new Set<string>()
  const kept = pieces.filter((p) => { const k = `${p.box.x0},${p.box.y0},${p.box.z0}`; if (seen.has(k)) return false; seen.add(k); return true })
  const merged = rnd() < 0.5
  return { mesh: assembly(kept, merged), merged }
}
