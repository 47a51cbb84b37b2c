/**
 * Range check of index arrays read from a file (connectivity): one tight loop over the array with
 * a single unsigned compare per entry, so a reader can check every index of every file it opens.
 */

/** Position of the first entry of `a` outside 0..limit-1, or -1 when all are inside. */
export function firstIndexOutside(a: Int32Array, limit: number): number {
  // (n >>> 0) maps negative indices above 2^31, so one compare catches both ends.
  const len = a.length
  if (limit > 0x80000000) {
    for (let i = 0; i < len; i++) if (a[i] < 0) return i
    return -1
  }
  for (let i = 0; i < len; i++) if ((a[i] >>> 0) >= limit) return i
  return -1
}
