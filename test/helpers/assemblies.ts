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
