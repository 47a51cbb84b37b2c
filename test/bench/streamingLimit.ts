/**
 * The streaming limit: minimal passes that only read what a kernel must read and sum it, so a
 * kernel's time can be stated as a multiple of the memory traffic it cannot avoid.
 * - element passes walk the connectivity and gather the per-node values a kernel needs
 *   (coordinates; coordinates and stress for the balance audit);
 * - reader passes touch every byte of the input once (native: four at a time; CSV: one at a
 *   time, as a parser looks at each).
 * The sums are returned so the work cannot be optimised away.
 */
import type { Mesh } from '../../src/model/model.ts'

/** Connectivity + gathered coordinates of every element node (boundary extraction, section cut). */
export function streamConnCoords(mesh: Mesh): number {
  const x = mesh.coords
  let s = 0
  for (const b of mesh.blocks) {
    const conn = b.conn
    for (let i = 0, n = conn.length; i < n; i++) {
      const p = 3 * conn[i]
      s += x[p] + x[p + 1] + x[p + 2]
    }
  }
  return s
}

/** Connectivity + gathered coordinates and stress of every element node (element balance). */
export function streamConnCoordsStress(mesh: Mesh, stress: Float64Array): number {
  const x = mesh.coords
  let s = 0
  for (const b of mesh.blocks) {
    const conn = b.conn
    for (let i = 0, n = conn.length; i < n; i++) {
      const node = conn[i]
      const p = 3 * node, q = 6 * node
      s += x[p] + x[p + 1] + x[p + 2] + stress[q] + stress[q + 1] + stress[q + 2] + stress[q + 3] + stress[q + 4] + stress[q + 5]
    }
  }
  return s
}

/** Every byte of a buffer, read four at a time where aligned. */
export function streamBytes(bytes: Uint8Array): number {
  const head = (4 - (bytes.byteOffset & 3)) & 3
  let s = 0
  for (let i = 0; i < head && i < bytes.length; i++) s += bytes[i]
  const words = Math.max(0, (bytes.length - head) >> 2)
  const w = new Int32Array(bytes.buffer, bytes.byteOffset + head, words)
  for (let i = 0; i < words; i++) s += w[i]
  for (let i = head + 4 * words; i < bytes.length; i++) s += bytes[i]
  return s
}

/** Every byte of the CSV files, one at a time (a parser looks at each). */
export function streamEachByte(files: readonly Uint8Array[]): number {
  let s = 0
  for (const b of files) for (let i = 0, n = b.length; i < n; i++) s += b[i]
  return s
}
