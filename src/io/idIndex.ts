/**
 * Maps user ids (1..2^31-1) to 0-based row indices without a JS object: a dense Int32Array
 * lookup when the largest id is not far above the row count, otherwise a sorted copy of the ids
 * searched by bisection plus the row of each sorted position. Rows keep their order.
 */
export interface IdIndex {
  /** dense[id] = row or -1; null when sparse. */
  readonly dense: Int32Array | null
  /** Ascending ids when sparse, else null. */
  readonly sorted: Int32Array | null
  /** Row of each position of `sorted`. */
  readonly rowOfSorted: Int32Array | null
}

/** A repeated id: the rows of its first and second occurrence. */
export interface DuplicateId {
  readonly id: number
  readonly firstRow: number
  readonly secondRow: number
}

/** Largest id still served by a dense table, relative to the row count (4 bytes per slot). */
function denseLimit(rows: number): number {
  return 4 * rows + 65536
}

/**
 * Builds the index of `ids` (all already checked to be positive). Returns the index, or the
 * first duplicate found (smallest second row when dense; smallest id when sparse).
 */
export function buildIdIndex(ids: Int32Array): IdIndex | DuplicateId {
  const n = ids.length
  let maxId = 0
  for (let i = 0; i < n; i++) if (ids[i] > maxId) maxId = ids[i]
  if (maxId <= denseLimit(n)) {
    const dense = new Int32Array(maxId + 1).fill(-1)
    for (let i = 0; i < n; i++) {
      const id = ids[i]
      const prev = dense[id]
      if (prev >= 0) return { id, firstRow: prev, secondRow: i }
      dense[id] = i
    }
    return { dense, sorted: null, rowOfSorted: null }
  }
  const sorted = ids.slice().sort()
  for (let i = 1; i < n; i++) {
    if (sorted[i] === sorted[i - 1]) {
      const id = sorted[i]
      const first = ids.indexOf(id)
      return { id, firstRow: first, secondRow: ids.indexOf(id, first + 1) }
    }
  }
  const rowOfSorted = new Int32Array(n)
  for (let i = 0; i < n; i++) rowOfSorted[lowerBound(sorted, ids[i])] = i
  return { dense: null, sorted, rowOfSorted }
}

export function isDuplicate(r: IdIndex | DuplicateId): r is DuplicateId {
  return (r as DuplicateId).secondRow !== undefined
}

/** Row of `id`, or -1 when absent. */
export function rowOfId(ix: IdIndex, id: number): number {
  const dense = ix.dense
  if (dense !== null) return id >= 0 && id < dense.length ? dense[id] : -1
  const sorted = ix.sorted!
  const p = lowerBound(sorted, id)
  return p < sorted.length && sorted[p] === id ? ix.rowOfSorted![p] : -1
}

function lowerBound(a: Int32Array, x: number): number {
  let lo = 0, hi = a.length
  while (lo < hi) {
    const mid = (lo + hi) >>> 1
    if (a[mid] < x) lo = mid + 1
    else hi = mid
  }
  return lo
}

/**
 * True when ids[i-1] < ids[i] throughout: the ids are then unique without an index (the usual
 * 1..n numbering), which spares a reader the table of the largest id (fresh memory costs page
 * faults that dominate a check of a million ids).
 */
export function isStrictlyAscending(ids: Int32Array): boolean {
  const n = ids.length
  for (let i = 1; i < n; i++) if (ids[i] <= ids[i - 1]) return false
  return true
}

