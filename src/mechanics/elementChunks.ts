/**
 * Which elements a plane can cut, without visiting every element: the elements of each block in
 * chunks of CHUNK consecutive elements, each chunk with the box (min and max x, y, z) of its
 * elements' corners. A plane with unit normal m at offset s = p·m meets a chunk's box only if
 * |c·m − s| ≤ r, with c the box's centre and r = Σ half-width_i |m_i|; the chunks it misses hold
 * no cut element. Built once per mesh (any normal, any offset: dragging or turning a section, a
 * sweep), one pass over the corners, 48 bytes per chunk (at CHUNK = 64, 0.75 byte per element).
 *
 * It prunes as well as the element numbering is local: solvers and mesh generators number
 * elements so that neighbours have near numbers (common practice, for the bandwidth of the
 * stiffness matrix), and the boxes of such chunks are small; with a numbering that scatters
 * neighbours the boxes are large and the cut scans about as much as without them. Either way the
 * chunks met are a superset of the cut elements, scanned in ascending order, so a cut finds
 * exactly the elements, in the same order, that a scan of all of them finds: its sums are the same
 * to the last bit. The test is widened by a tolerance far above the section's snap band
 * (sectionCut.ts SNAP_EPS) and the rounding of c·m against (x − p)·m.
 *
 * Each chunk also keeps the boxes of its runs of SUB consecutive elements, in 32-bit floats (24
 * bytes a run, 1.5 bytes per element): a chunk the plane meets is scanned only in the runs whose
 * box it meets too. A chunk of 64 elements numbered along one axis of a structured block spans
 * about eleven cells along it, so a plane across that axis met chunks holding about ten times the
 * elements it cuts (at 10^7 tet4, about 45 ms a cut in the browser); its runs span about three.
 * The runs' boxes are rounded to 32 bits, so their test is widened by a further 1e-6 of the
 * mesh's scale, far above that rounding (a relative 6e-8 on centre and half-width).
 */
import { ELEMENT_TYPES } from '../model/elementTypes.ts'
import type { Mesh } from '../model/model.ts'

/** Elements per chunk: small enough to prune well, large enough that the boxes are few. */
export const CHUNK = 64
/** Elements per run inside a chunk (see the header). */
export const SUB = 16

export interface ElementChunks {
  /** Per chunk: its block, its first local element, its element count. */
  readonly block: Int32Array
  readonly first: Int32Array
  readonly count: Int32Array
  /** Per chunk: box centre (3) and half-widths (3). */
  readonly centre: Float64Array
  readonly half: Float64Array
  /** Elements per run, and runs per chunk (the chunk's size over `sub`, rounded up). */
  readonly sub: number
  readonly runsPerChunk: number
  /** Per chunk, runsPerChunk runs of `sub` elements (fewer at a chunk's end): box centre (3) and half-widths (3) each, 32-bit. */
  readonly runs: Float32Array
  /** Largest |coordinate| over the mesh (length units), for the tolerance. */
  readonly scale: number
}

/** The chunks of `mesh` with their boxes (O(elements · corners), one pass). */
export function buildElementChunks(mesh: Mesh, chunk = CHUNK, sub = Math.min(SUB, chunk)): ElementChunks {
  const perChunk = Math.ceil(chunk / sub)
  let total = 0
  for (const b of mesh.blocks) total += Math.ceil(b.conn.length / ELEMENT_TYPES[b.type].nodeCount / chunk)
  const block = new Int32Array(total), first = new Int32Array(total), count = new Int32Array(total)
  const centre = new Float64Array(3 * total), half = new Float64Array(3 * total), runs = new Float32Array(6 * perChunk * total)
  const x = mesh.coords, box = BOX
  let k = 0, scale = 0
  mesh.blocks.forEach((b, bi) => {
    const topo = ELEMENT_TYPES[b.type], nn = topo.nodeCount, cc = topo.cornerCount, conn = b.conn
    const n = conn.length / nn
    for (let e0 = 0; e0 < n; e0 += chunk, k++) {
      const e1 = Math.min(n, e0 + chunk)
      let x0 = Infinity, y0 = Infinity, z0 = Infinity, x1 = -Infinity, y1 = -Infinity, z1 = -Infinity
      for (let r = 0, s0 = e0; s0 < e1; r++, s0 += sub) {
        cornerBox(box, x, conn, nn, cc, s0, Math.min(e1, s0 + sub))
        const o = 6 * (perChunk * k + r)
        for (let i = 0; i < 3; i++) { runs[o + i] = 0.5 * (box[i] + box[3 + i]); runs[o + 3 + i] = 0.5 * (box[3 + i] - box[i]) }
        x0 = Math.min(x0, box[0]); y0 = Math.min(y0, box[1]); z0 = Math.min(z0, box[2])
        x1 = Math.max(x1, box[3]); y1 = Math.max(y1, box[4]); z1 = Math.max(z1, box[5])
      }
      block[k] = bi; first[k] = e0; count[k] = e1 - e0
      centre[3 * k] = 0.5 * (x0 + x1); centre[3 * k + 1] = 0.5 * (y0 + y1); centre[3 * k + 2] = 0.5 * (z0 + z1)
      half[3 * k] = 0.5 * (x1 - x0); half[3 * k + 1] = 0.5 * (y1 - y0); half[3 * k + 2] = 0.5 * (z1 - z0)
      scale = Math.max(scale, Math.abs(x0), Math.abs(x1), Math.abs(y0), Math.abs(y1), Math.abs(z0), Math.abs(z1))
    }
  })
  return { block, first, count, centre, half, sub, runsPerChunk: perChunk, runs, scale }
}

const BOX = new Float64Array(6)

/** The box (min x, y, z, max x, y, z into box) of the corners of elements [e0, e1). */
function cornerBox(box: Float64Array, x: Float64Array, conn: Int32Array, nn: number, cc: number, e0: number, e1: number): void {
  let x0 = Infinity, y0 = Infinity, z0 = Infinity, x1 = -Infinity, y1 = -Infinity, z1 = -Infinity
  for (let e = e0; e < e1; e++) {
    const base = nn * e
    for (let c = 0; c < cc; c++) {
      const p = 3 * conn[base + c]
      const px = x[p], py = x[p + 1], pz = x[p + 2]
      if (px < x0) x0 = px
      if (px > x1) x1 = px
      if (py < y0) y0 = py
      if (py > y1) y1 = py
      if (pz < z0) z0 = pz
      if (pz > z1) z1 = pz
    }
  }
  box[0] = x0; box[1] = y0; box[2] = z0; box[3] = x1; box[4] = y1; box[5] = z1
}

/** Grows-only list of the runs met by the last query (valid until the next). */
let metScratch = new Int32Array(0)

/**
 * The runs (chunk k's run r is runsPerChunk·k + r) whose box the plane with unit normal m through
 * `point` meets, within chunks whose box it meets, in ascending order (block, then element), in
 * scratch valid until the next query.
 */
export function chunksMet(chunks: ElementChunks, m: readonly number[], point: readonly number[]): { items: Int32Array; n: number } {
  const mx = m[0], my = m[1], mz = m[2], amx = Math.abs(mx), amy = Math.abs(my), amz = Math.abs(mz)
  const px = point[0], py = point[1], pz = point[2]
  const C = chunks.count.length, c = chunks.centre, h = chunks.half, runs = chunks.runs, count = chunks.count
  const perChunk = chunks.runsPerChunk, sub = chunks.sub
  const tol = 1e-9 * (chunks.scale + Math.abs(px) + Math.abs(py) + Math.abs(pz))
  // the runs' boxes are 32-bit (header)
  const runTol = tol + 1e-6 * chunks.scale
  if (metScratch.length < perChunk * C) metScratch = new Int32Array(perChunk * C)
  const out = metScratch
  let n = 0
  for (let k = 0; k < C; k++) {
    const o = 3 * k
    const dist = (c[o] - px) * mx + (c[o + 1] - py) * my + (c[o + 2] - pz) * mz
    const r = h[o] * amx + h[o + 1] * amy + h[o + 2] * amz + tol
    if (dist > r || dist < -r) continue
    const last = perChunk * k + Math.ceil(count[k] / sub)
    for (let j = perChunk * k; j < last; j++) {
      const q = 6 * j
      const dj = (runs[q] - px) * mx + (runs[q + 1] - py) * my + (runs[q + 2] - pz) * mz
      const rj = runs[q + 3] * amx + runs[q + 4] * amy + runs[q + 5] * amz + runTol
      out[n] = j
      n += dj <= rj && dj >= -rj ? 1 : 0
    }
  }
  return { items: out, n }
}

/**
 * The elements of block `bi` (cc corners first, nn nodes each) in the met runs `items[0 .. n)`
 * (chunksMet) with corners on both sides of the plane (d < 0 and d ≥ 0), as local indices in
 * ascending order into `out`; returns their count. The same elements, in the same order, as a
 * scan of the whole block (sectionCut.ts cutElements).
 */
export function findCutInChunks(
  out: Int32Array, d: Float64Array, conn: Int32Array, nn: number, cc: number, chunks: ElementChunks, items: Int32Array, n: number, bi: number,
): number {
  const block = chunks.block, first = chunks.first, count = chunks.count, perChunk = chunks.runsPerChunk, sub = chunks.sub
  let k = 0
  for (let i = 0; i < n; i++) {
    const run = items[i], ch = (run / perChunk) | 0
    if (block[ch] !== bi) continue
    const e0 = first[ch] + sub * (run - perChunk * ch), e1 = Math.min(first[ch] + count[ch], e0 + sub)
    for (let e = e0, base = nn * e; e < e1; e++, base += nn) {
      let neg = 0
      for (let c = 0; c < cc; c++) neg += d[conn[base + c]] < 0 ? 1 : 0
      out[k] = e
      k += neg !== 0 && neg !== cc ? 1 : 0
    }
  }
  return k
}
