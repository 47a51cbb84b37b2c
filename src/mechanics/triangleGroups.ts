/**
 * Triangle groups: reorders an indexed triangle buffer so that the triangles of one group (a
 * part of the surface, a region of the section) lie together, so the scene draws, hides or
 * highlights a group as one range of the index buffer (no per-triangle work on the UI thread).
 *
 * Layout: `index` Uint32Array(3·T) of vertex numbers; `carried` per-triangle arrays (T entries,
 * e.g. the triangle's face or element) that move with their triangle; `group` Int32Array(T) with
 * the group 0..G-1 of each triangle, anything else (−1) meaning none (those go last). A counting
 * sort: stable, O(T), and groups keep their triangles' order.
 */

/**
 * Sorts the triangles of `index` (and every `carried` array) by `group`, in place; returns the
 * offsets Int32Array(G + 2): group g holds triangles offsets[g] .. offsets[g + 1] − 1, and the
 * triangles of no group lie from offsets[G] to offsets[G + 1] = T.
 */
export function groupTriangles(index: Uint32Array, carried: readonly (Int32Array | Uint32Array)[], group: Int32Array, G: number): Int32Array {
  const T = group.length
  const offsets = new Int32Array(G + 2)
  for (let t = 0; t < T; t++) {
    const g = group[t]
    offsets[(g >= 0 && g < G ? g : G) + 1]++
  }
  for (let g = 0; g <= G; g++) offsets[g + 1] += offsets[g]
  const at = offsets.slice(0, G + 1)
  const dest = new Int32Array(T)
  for (let t = 0; t < T; t++) {
    const g = group[t]
    dest[t] = at[g >= 0 && g < G ? g : G]++
  }
  const idx = index.slice(0, 3 * T)
  for (let t = 0; t < T; t++) {
    const d = dest[t]
    index[3 * d] = idx[3 * t]; index[3 * d + 1] = idx[3 * t + 1]; index[3 * d + 2] = idx[3 * t + 2]
  }
  for (const a of carried) {
    const copy = a.slice(0, T)
    for (let t = 0; t < T; t++) a[dest[t]] = copy[t]
  }
  return offsets
}

/**
 * The group of each triangle from a label per item (an element, a face): `itemOf[t]` is the
 * triangle's item and `label` gives each item's group (−1 for none). Writes to `out` (T).
 */
export function triangleGroupsOf(out: Int32Array, itemOf: ArrayLike<number>, label: (item: number) => number): Int32Array {
  for (let t = 0; t < out.length; t++) out[t] = label(itemOf[t])
  return out
}
