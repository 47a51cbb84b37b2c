/**
 * Signed corner volumes and the mirroring of inverted elements.
 * References: volumes of a cube, a right triangular prism (base area × height) and a tetrahedron
 * (|triple product| / 6) are elementary geometry; the node order conventions are those of
 * src/model/elementTypes.ts. Each case is also run rotated, as the volume must not depend on it.
 */
import { describe, expect, it } from 'vitest'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { ELEMENT_TYPES, ELEMENT_TYPE_NAMES } from '../../src/model/elementTypes.ts'
import { checkBlockOrientation, checkBlockOrientationPlain, measureElement, reorientElements, reorientedWarning } from '../../src/io/elementOrientation.ts'

const TYPES = ELEMENT_TYPE_NAMES

function rotate(coords: Float64Array, angle: number): Float64Array {
  // Rotation about the unit axis k = (1, 1, 1)/√3 by `angle`, Rodrigues' formula:
  // v' = v cos θ + (k × v) sin θ + k (k·v)(1 - cos θ).
  const k = 1 / Math.sqrt(3), c = Math.cos(angle), s = Math.sin(angle)
  const out = new Float64Array(coords.length)
  for (let i = 0; i < coords.length; i += 3) {
    const x = coords[i], y = coords[i + 1], z = coords[i + 2]
    const kv = k * (x + y + z) * k * (1 - c)
    out[i] = x * c + k * (z - y) * s + kv
    out[i + 1] = y * c + k * (x - z) * s + kv
    out[i + 2] = z * c + k * (y - x) * s + kv
  }
  return out
}

describe('measureElement', () => {
  const out = new Float64Array(2), scratch = new Float64Array(24)
  it.each([0, 0.7, 2.1])('volumes of a 2 × 1 × 0.5 box sum to 1 for every type (rotation %s rad)', (angle) => {
    for (const t of TYPES) {
      const m = boxMesh({ nx: 2, ny: 2, nz: 1, lx: 2, ly: 1, lz: 0.5 }, t)
      const coords = rotate(m.coords, angle)
      const b = m.blocks[0]
      const nn = ELEMENT_TYPES[t].nodeCount
      let sum = 0
      for (let e = 0; e < b.ids.length; e++) {
        measureElement(out, scratch, coords, b.conn, e * nn, t)
        expect(out[0], `${t} element ${e}`).toBeGreaterThan(0)
        sum += out[0]
      }
      expect(sum).toBeCloseTo(1, 12)
    }
  })
  it('the corner bounding-box diagonal', () => {
    const m = boxMesh({ nx: 1, ny: 1, nz: 1, lx: 3, ly: 4, lz: 12 }, 'hex8')
    measureElement(out, scratch, m.coords, m.blocks[0].conn, 0, 'hex8')
    expect(out[0]).toBeCloseTo(144, 10)
    expect(out[1]).toBeCloseTo(13, 12) // √(9 + 16 + 144)
  })
  it.each([0, 0.7, 2.1])('pyramids: base area × height / 3 wherever the apex stands (Cavalieri), inverted when mirrored (rotation %s rad)', (angle) => {
    // Base: the quadrilateral (0,0,0) (2,0,0) (2,3,0) (0,3,0); apex at height 1.5 over a point
    // outside the base: V = 6 · 1.5 / 3 = 3. pyramid13 adds straight mid-edge nodes (ignored).
    const pts = [[0, 0, 0], [2, 0, 0], [2, 3, 0], [0, 3, 0], [3.5, -1, 1.5]]
    for (const t of ['pyramid5', 'pyramid13'] as const) {
      const topo = ELEMENT_TYPES[t]
      const nodes = [...pts, ...topo.edges.filter(([, , m]) => m >= 0).map(([a, b]) => [0, 1, 2].map((k) => (pts[a][k] + pts[b][k]) / 2))]
      const coords = rotate(Float64Array.from(nodes.flat()), angle)
      const conn = Int32Array.from(nodes.keys())
      measureElement(out, scratch, coords, conn, 0, t)
      expect(out[0]).toBeCloseTo(3, 12)
      const mirrored = Int32Array.from(topo.mirror.map((i) => conn[i]))
      measureElement(out, scratch, coords, mirrored, 0, t)
      expect(out[0]).toBeCloseTo(-3, 12)
      expect(checkBlockOrientation(coords, t, mirrored).inverted.length).toBe(1)
      // Apex lowered into the base plane: zero volume, a degenerate element.
      const flat = Float64Array.from(nodes.flat())
      flat[14] = 0
      for (const [a, b, m] of topo.edges) if (m >= 0) flat[3 * m + 2] = (flat[3 * a + 2] + flat[3 * b + 2]) / 2
      expect(checkBlockOrientation(rotate(flat, angle), t, conn).degenerate).toBe(0)
    }
  })
  it('a pyramid on a warped base is the cone from the apex over the base split about its centre', () => {
    // Base corner 3 lifted by h = 0.6 over the unit square, apex (0.5, 0.5, 2). Split about the
    // centre m = (0.5, 0.5, h/4), the base is four triangles; the cones from the apex over them
    // sum to (1/3) (apex - m) · (area vector) = (1/3)(2 - h/4) · 1 (the area vector's z part is
    // the projected area 1, and its x, y parts meet apex - m = (0, 0, 2 - h/4) at right angles).
    const h = 0.6
    const coords = Float64Array.from([0, 0, 0, 1, 0, 0, 1, 1, 0, 0, 1, h, 0.5, 0.5, 2])
    measureElement(out, scratch, coords, Int32Array.from([0, 1, 2, 3, 4]), 0, 'pyramid5')
    expect(out[0]).toBeCloseTo((2 - h / 4) / 3, 14)
  })
  it('a warped hex (one top corner lifted) is measured by the symmetric face split', () => {
    const m = boxMesh({ nx: 1, ny: 1, nz: 1, lx: 1, ly: 1, lz: 1 }, 'hex8')
    const c = m.coords.slice()
    c[3 * 6 + 2] = 2 // node 7 (index 6) lifted from z = 1 to 2
    measureElement(out, scratch, c, m.blocks[0].conn, 0, 'hex8')
    // Derivation: the top face becomes the bilinear surface z = 1 + h·x·y over the unit square,
    // so the volume is 1 + h/4 = 1.25 for h = 1. The split about face centres gives it exactly here.
    expect(out[0]).toBeCloseTo(1.25, 12)
  })
})

describe('mirroring', () => {
  it.each(TYPES)('%s: mirroring flips the volume sign and keeps mid-edge nodes on their edges', (t) => {
    const m = boxMesh({ nx: 1, ny: 1, nz: 1, lx: 1, ly: 2, lz: 3 }, t)
    const b = m.blocks[0]
    const nn = ELEMENT_TYPES[t].nodeCount
    const conn = b.conn.slice()
    const count = conn.length / nn
    const all = Int32Array.from({ length: count }, (_, i) => i)
    reorientElements(conn, t, all)
    const o = checkBlockOrientation(m.coords, t, conn)
    expect(o.inverted.length).toBe(count)
    const topo = ELEMENT_TYPES[t]
    for (let e = 0; e < count; e++) {
      for (const [a, bb, mid] of topo.edges) {
        if (mid < 0) continue
        for (let d = 0; d < 3; d++) {
          const pa = m.coords[3 * conn[e * nn + a] + d], pb = m.coords[3 * conn[e * nn + bb] + d], pm = m.coords[3 * conn[e * nn + mid] + d]
          expect(pm).toBeCloseTo((pa + pb) / 2, 12)
        }
      }
    }
    reorientElements(conn, t, o.inverted)
    expect(Array.from(conn)).toEqual(Array.from(b.conn))
    expect(ELEMENT_TYPES[t].mirror.length).toBe(nn)
  })
  it('degenerate: flat and collapsed elements are found, the threshold is relative to size', () => {
    const m = boxMesh({ nx: 1, ny: 1, nz: 1, lx: 1, ly: 1, lz: 1 }, 'hex8')
    const flat = m.coords.slice()
    for (let i = 4; i < 8; i++) flat[3 * i + 2] = 0
    expect(checkBlockOrientation(flat, 'hex8', m.blocks[0].conn).degenerate).toBe(0)
    // A tiny but well-shaped element is not degenerate: 1e-6 m cube, volume 1e-18 = d³/5.2.
    const tiny = m.coords.map((x) => x * 1e-6)
    expect(checkBlockOrientation(tiny, 'hex8', m.blocks[0].conn).degenerate).toBe(-1)
    // A sliver far below 1e-12 of its size is.
    const sliver = m.coords.slice()
    for (let i = 4; i < 8; i++) sliver[3 * i + 2] = 1e-13
    expect(checkBlockOrientation(sliver, 'hex8', m.blocks[0].conn).degenerate).toBe(0)
  })
  it('tet4: the fast loop decides like measureElement, also near the degeneracy threshold', () => {
    // Random tetrahedra, some squashed towards a plane by factors around the 1e-12 threshold, some
    // mirrored, at several scales (including ones whose V² underflows or overflows).
    let seed = 7
    const rnd = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32)
    const seen = { degenerate: 0, inverted: 0, positive: 0 }
    for (const scale of [1, 1e-6, 1e-110, 1e60, 1e100]) {
      const count = 400
      const coords = new Float64Array(12 * count)
      const conn = new Int32Array(4 * count)
      for (let e = 0; e < count; e++) {
        const squash = e % 4 === 3 ? 10 ** (-6 - 4 * rnd()) : 1
        for (let a = 0; a < 4; a++) {
          const p = 3 * (4 * e + a)
          coords[p] = (rnd() - 0.5) * scale; coords[p + 1] = (rnd() - 0.5) * scale
          coords[p + 2] = (a === 3 ? (rnd() - 0.5) * squash : (rnd() - 0.5) * 1e-3 * squash) * scale
          conn[4 * e + a] = 4 * e + a
        }
      }
      // Reference: measureElement with the documented threshold, element by element.
      const out = new Float64Array(2), scratch = new Float64Array(24)
      for (let e = 0; e < count; e++) {
        measureElement(out, scratch, coords, conn, 4 * e, 'tet4')
        const degenerate = !(Math.abs(out[0]) > 1e-12 * out[1] ** 3)
        const o = checkBlockOrientation(coords, 'tet4', conn.subarray(4 * e, 4 * e + 4))
        expect(o.degenerate).toBe(degenerate ? 0 : -1)
        expect(o.inverted.length).toBe(!degenerate && out[0] < 0 ? 1 : 0)
        if (degenerate) seen.degenerate++
        else if (out[0] < 0) seen.inverted++
        else seen.positive++
      }
    }
    expect(Math.min(seen.degenerate, seen.inverted, seen.positive)).toBeGreaterThan(50)
  })
  it('hexahedra, wedges, pyramids: the fast loops decide like the plain path (measureElement on every element)', () => {
    // Each type's elements of a 2×2×2 box, corners moved at random by up to 40 % of a cell (and
    // so some inverted), every fourth one squashed towards z = its first corner's by 1e-5..1e-15
    // (around the 1e-12 threshold), every third one mirrored, at several scales; whole blocks
    // and single elements. The
    // hexahedron's fast loop takes the trilinear volume in closed form (Grandy 1997, from
    // memory), the others measureElement's face sum relative to corner 0.
    let seed = 11
    const rnd = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32)
    const seen = { degenerate: 0, inverted: 0, positive: 0 }
    for (const t of TYPES.filter((x) => ELEMENT_TYPES[x].cornerCount > 4)) {
      const m = boxMesh({ nx: 2, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1 }, t)
      const conn = m.blocks[0].conn, nn = ELEMENT_TYPES[t].nodeCount, nc = ELEMENT_TYPES[t].cornerCount
      const count = conn.length / nn
      for (const scale of [1, 1e-6, 1e-100, 1e80]) {
        for (let round = 0; round < 6; round++) {
          // Elements get their own nodes so each can be distorted alone.
          const coords = new Float64Array(3 * conn.length)
          const own = new Int32Array(conn.length)
          for (let e = 0; e < count; e++) {
            const squash = e % 4 === 3 ? 10 ** (-5 - 10 * rnd()) : 1
            const base = 3 * conn[e * nn]
            for (let a = 0; a < nn; a++) {
              const p = 3 * conn[e * nn + a], q = 3 * (e * nn + a)
              own[e * nn + a] = e * nn + a
              for (let k = 0; k < 3; k++) coords[q + k] = m.coords[p + k] + (a < nc ? 0.2 * (rnd() - 0.5) : 0)
              coords[q + 2] = m.coords[base + 2] + (coords[q + 2] - m.coords[base + 2]) * squash
              for (let k = 0; k < 3; k++) coords[q + k] *= scale
            }
          }
          // Every third element mirrored: inverted.
          reorientElements(own, t, Int32Array.from({ length: Math.ceil(count / 3) }, (_, i) => 3 * i).filter((e) => e < count))
          const plain = checkBlockOrientationPlain(coords, t, own)
          const fast = checkBlockOrientation(coords, t, own)
          expect(fast.degenerate).toBe(plain.degenerate)
          expect(Array.from(fast.inverted)).toEqual(Array.from(plain.inverted))
          for (let e = 0; e < count; e++) {
            const one = own.subarray(e * nn, (e + 1) * nn)
            const p1 = checkBlockOrientationPlain(coords, t, one), f1 = checkBlockOrientation(coords, t, one)
            expect([f1.degenerate, f1.inverted.length]).toEqual([p1.degenerate, p1.inverted.length])
            if (p1.degenerate === 0) seen.degenerate++
            else if (p1.inverted.length) seen.inverted++
            else seen.positive++
          }
        }
      }
    }
    expect(Math.min(seen.degenerate, seen.inverted, seen.positive)).toBeGreaterThan(50)
  })
  it('the warning lists at most 10 ids and counts the rest', () => {
    expect(reorientedWarning([1, 2, 3, 4, 5, 6, 7, 8, 9, 10], 25)).toBe('reoriented 25 inverted elements (negative volume, local nodes mirrored): 1, 2, 3, 4, 5, 6, 7, 8, 9, 10 and 15 more')
  })
})
