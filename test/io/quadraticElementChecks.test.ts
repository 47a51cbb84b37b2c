/**
 * Quadratic elements are checked when read: a mid-edge node far from its edge's midpoint, or a
 * Jacobian that is not positive at a quadrature point, is an error naming the element, the node
 * and the node order this tool reads; model.json "nodeOrder" maps another order. References: the
 * sagitta of a circular arc, s = R − √(R² − h²/4) ≈ h²/(8R) (plane geometry, common practice);
 * the quarter-point elements of Barsoum, IJNME 10 (1976) (mid-edge node at a quarter of the edge,
 * a valid element with a singular Jacobian only at its corner).
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { ELEMENT_TYPES, ELEMENT_TYPE_NAMES } from '../../src/model/elementTypes.ts'
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import { InputError } from '../../src/model/errors.ts'
import { boxMesh } from '../../src/model/boxMesh.ts'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import { readNative, writeNative } from '../../src/io/nativeContainer.ts'
import { MID_EDGE_TOLERANCE, checkQuadraticBlock, nodeOrderText } from '../../src/io/quadraticElementChecks.ts'
import { NODE_ORDERS, bundleOf, toUserOrder } from './bundleVariants.ts'
import { modelOf } from './testModels.ts'
import { expectSameModel } from './sameModel.ts'
import { mulberry32, rotationFromUniforms } from '../helpers/rotation.ts'
import type { Bundle } from './tinyBundle.ts'
import { toFiles } from './tinyBundle.ts'

const SEED = 20261212
console.log(`quadratic element checks: fast-check seed ${SEED}`)

/** A bundle of one element: nodes 1..n at `xyz`, the element's nodes listed as `order` (1-based ids). */
function oneElement(type: ElementTypeName, xyz: readonly (readonly number[])[], order: readonly number[], json: object = { units: { length: 'mm', stress: 'MPa' } }): Bundle {
  return {
    'nodes.csv': ['id,x,y,z', ...xyz.map((p, i) => `${i + 1},${p.join(',')}`)].join('\n') + '\n',
    'elements.csv': `id,type,${order.map((_, k) => `n${k + 1}`).join(',')}\n7,${type},${order.join(',')}\n`,
    'stress.csv': ['id,sxx,syy,szz,sxy,syz,sxz', ...xyz.map((_, i) => `${i + 1},1,0,0,0,0,0`)].join('\n') + '\n',
    'model.json': JSON.stringify(json),
  }
}

function errorOf(b: Bundle): InputError {
  try { readCsvBundle(toFiles(b)) } catch (e) { expect(e).toBeInstanceOf(InputError); return e as InputError }
  throw new Error('expected an InputError')
}

/** Corners of a tet10 and its straight mid-edge nodes, in our order. */
function straightTet10(corners: readonly (readonly number[])[]): number[][] {
  const pts = corners.map((p) => [...p])
  for (const [a, b] of ELEMENT_TYPES.tet10.edges) pts.push([0, 1, 2].map((k) => (corners[a][k] + corners[b][k]) / 2))
  return pts
}

const ID = (n: number) => Array.from({ length: n }, (_, k) => k + 1)

describe('mid-edge nodes in another order', () => {
  const tet = straightTet10([[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1]])

  it('tet10: the error names the element, the node, what was expected and our node order', () => {
    // The last two mid-edge nodes swapped: node 9 (edge 2-4) is listed where node 10 (edge 3-4) belongs.
    const e = errorOf(oneElement('tet10', tet, toUserOrder(ID(10), NODE_ORDERS.tet10!)))
    expect(e.kind).toBe('mid-edge-node')
    for (const f of ['elements.csv', 'line 2', 'element 7', 'mid-edge node 10 (node 9 of the tet10)', 'edge (2,4) between nodes 2 and 4', `more than ${MID_EDGE_TOLERANCE} × the edge length`,
      'tet10 nodes 5-10 are the mid-edge nodes of edges (1,2) (2,3) (3,1) (1,4) (2,4) (3,4)', '"nodeOrder": {"tet10": [...]}']) expect(e.message).toContain(f)
  })

  it('hex20: the mid-edge nodes of the vertical edges listed before those of the top face', () => {
    const m = modelOf(boxMesh({ nx: 1, ny: 1, nz: 1, lx: 2, ly: 1, lz: 1 }, 'hex20'))
    const b = bundleOf(m)
    const rows = b['elements.csv'].trim().split('\n')
    const r = rows[1].split(',')
    rows[1] = [r[0], r[1], ...toUserOrder(r.slice(2), NODE_ORDERS.hex20!)].join(',')
    b['elements.csv'] = rows.join('\n') + '\n'
    const e = errorOf(b)
    expect(e.kind).toBe('mid-edge-node')
    for (const f of ['element 1', 'of the hex20', 'hex20 nodes 9-20 are the mid-edge nodes of edges (1,2) (2,3) (3,4) (4,1) (5,6) (6,7) (7,8) (8,5) (1,5) (2,6) (3,7) (4,8)']) expect(e.message).toContain(f)
    // The same file with model.json "nodeOrder" loads to the model as written in our order.
    b['model.json'] = JSON.stringify({ ...JSON.parse(b['model.json']), nodeOrder: { hex20: NODE_ORDERS.hex20 } })
    expectSameModel(m, readCsvBundle(toFiles(b)))
  })

  it('nodeOrder maps the reordered tet10 back to ours', () => {
    const b = oneElement('tet10', tet, toUserOrder(ID(10), NODE_ORDERS.tet10!), { units: { length: 'mm', stress: 'MPa' }, nodeOrder: { tet10: NODE_ORDERS.tet10 } })
    const r = readCsvBundle(toFiles(b))
    expect(Array.from(r.mesh.blocks[0].conn).map((i) => r.mesh.nodeIds[i])).toEqual(ID(10))
  })

  it('every quadratic type: any two mid-edge nodes swapped in a box cell are found', () => {
    for (const type of ELEMENT_TYPE_NAMES.filter((t) => ELEMENT_TYPES[t].quadratic)) {
      const mesh = boxMesh({ nx: 1, ny: 1, nz: 1, lx: 1, ly: 1.3, lz: 0.8 }, type)
      const mids = ELEMENT_TYPES[type].edges.map((e) => e[2]).filter((m) => m >= 0)
      const nn = ELEMENT_TYPES[type].nodeCount
      for (const block of mesh.blocks) {
        expect(checkQuadraticBlock(mesh.coords, type, block.conn), type).toBeNull()
        for (let i = 0; i < mids.length; i++) for (let j = i + 1; j < mids.length; j++) {
          const conn = block.conn.slice(0, nn)
          const t = conn[mids[i]]; conn[mids[i]] = conn[mids[j]]; conn[mids[j]] = t
          expect(checkQuadraticBlock(mesh.coords, type, conn), `${type}: mid-edge nodes ${mids[i] + 1} and ${mids[j] + 1} swapped`).not.toBeNull()
        }
      }
    }
  })

  it('a container whose connectivity has them in another order is refused the same way', () => {
    const m = modelOf(boxMesh({ nx: 1, ny: 1, nz: 1, lx: 1, ly: 1, lz: 1 }, 'tet10'))
    const conn = m.mesh.blocks[0].conn
    const t = conn[8]; conn[8] = conn[9]; conn[9] = t
    let err: unknown = null
    try { readNative(writeNative(m), 'bad.tractus') } catch (e) { err = e }
    expect((err as InputError).kind).toBe('mid-edge-node')
    expect((err as InputError).message).toMatch(/^bad\.tractus, field "block0\.conn", element 1: mid-edge node/)
  })
})

describe('curved and special elements that are valid', () => {
  /**
   * A tet10 with three corners on a sphere of radius R (polar angle θ, azimuths 0°, 240°, 120°:
   * clockwise seen from outside, so the volume is positive), the fourth inside, and the mid-edge nodes of the three surface edges on the sphere: each
   * bows out from its chord by the sagitta ≈ h²/(8R).
   */
  function sphereTet10(R: number, theta: number): number[][] {
    const on = (phi: number) => [R * Math.sin(theta) * Math.cos(phi), R * Math.sin(theta) * Math.sin(phi), R * Math.cos(theta)]
    const corners = [on(0), on((4 * Math.PI) / 3), on((2 * Math.PI) / 3), [0, 0, R * Math.cos(theta) - R * Math.sin(theta)]]
    const pts = straightTet10(corners)
    for (const k of [4, 5, 6]) {
      const r = Math.hypot(pts[k][0], pts[k][1], pts[k][2])
      pts[k] = pts[k].map((v) => (v * R) / r)
    }
    return pts
  }

  it.each([[4, 0.2], [1, 0.55]])('a tet10 on a sphere of radius %s (θ = %s) loads', (R, theta) => {
    const pts = sphereTet10(R, theta)
    const h = Math.hypot(pts[1][0] - pts[0][0], pts[1][1] - pts[0][1], pts[1][2] - pts[0][2])
    const mid = [0, 1, 2].map((k) => (pts[0][k] + pts[1][k]) / 2)
    const offset = Math.hypot(pts[4][0] - mid[0], pts[4][1] - mid[1], pts[4][2] - mid[2])
    // Sagitta of the arc (common practice): R − √(R² − h²/4), about h²/(8R).
    expect(offset).toBeCloseTo(R - Math.sqrt(R * R - (h * h) / 4), 12)
    expect(offset / h).toBeLessThan(MID_EDGE_TOLERANCE)
    const r = readCsvBundle(toFiles(oneElement('tet10', pts, ID(10))))
    expect(r.mesh.elementCount).toBe(1)
    expect(r.warnings).toEqual([])
  })

  it('rotated anywhere, the curved tet10 still loads and the reordered one is still refused', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 2 ** 31 - 1 }), (seed) => {
      const u = mulberry32(seed)
      const Q = rotationFromUniforms(u(), u(), u())
      const rot = (p: number[]) => [0, 1, 2].map((i) => Q[3 * i] * p[0] + Q[3 * i + 1] * p[1] + Q[3 * i + 2] * p[2])
      const pts = sphereTet10(2, 0.3).map(rot)
      expect(checkQuadraticBlock(Float64Array.from(pts.flat()), 'tet10', Int32Array.from(ID(10).map((i) => i - 1)))).toBeNull()
      const swapped = Int32Array.from(toUserOrder(ID(10), NODE_ORDERS.tet10!).map((i) => i - 1))
      expect(checkQuadraticBlock(Float64Array.from(pts.flat()), 'tet10', swapped)?.kind).toBe('mid-edge')
    }), { seed: SEED, numRuns: 50 })
  })

  it('a quarter-point tet10 (Barsoum) loads: the bound is inclusive', () => {
    const pts = straightTet10([[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1]])
    // The mid-edge nodes of the edges from corner 1 at a quarter of their length from it.
    pts[4] = [0.25, 0, 0]; pts[6] = [0, 0.25, 0]; pts[7] = [0, 0, 0.25]
    expect(readCsvBundle(toFiles(oneElement('tet10', pts, ID(10)))).mesh.elementCount).toBe(1)
  })
})

describe('a folded element', () => {
  it('a sliver tet10 whose mid-edge node sits within the bound but above its top corner folds: negative Jacobian', () => {
    // Height 0.1; the mid-edge node of edge (1,2) lifted 0.15 (0.15 × the edge, inside the
    // bound). det J is linear along the lift; the map folds where it changes sign.
    const pts = straightTet10([[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 0.1]])
    pts[4][2] += 0.15
    const e = errorOf(oneElement('tet10', pts, ID(10)))
    expect(e.kind).toBe('negative-jacobian')
    for (const f of ['element 7', 'the tet10 folds over', 'Jacobian determinant', 'node 5 (node 5 of the tet10) lies farthest', nodeOrderText('tet10')]) expect(e.message).toContain(f)
  })
})

describe('the tet10 fast loop', () => {
  it('finds what the plain loop finds: straight, curved, reordered and folded elements in a block', () => {
    // A jittered 3×3×3 tet10 box (straight, 162 elements); in each trial a few elements get one
    // mid-edge node moved by 1e-12..0.4 × a cell (straight within round-off, curved, off the
    // bound), so the first finding and its kind move around the block. Every third trial the
    // block is flattened to 5 % of its height first, so a node lifted within the bound folds
    // its element (as the sliver above).
    const rnd = mulberry32(SEED + 1)
    const m = boxMesh({ nx: 3, ny: 3, nz: 3, lx: 1, ly: 1, lz: 1 }, 'tet10')
    const conn = m.blocks[0].conn
    const count = conn.length / 10
    const kinds = new Set<string>()
    for (let trial = 0; trial < 300; trial++) {
      const coords = m.coords.slice()
      const flat = trial % 3 === 2
      if (flat) for (let i = 2; i < coords.length; i += 3) coords[i] *= 0.05
      const moves = 1 + Math.floor(3 * rnd())
      for (let k = 0; k < moves; k++) {
        const e = Math.floor(rnd() * count), local = 4 + Math.floor(6 * rnd())
        const p = 3 * conn[10 * e + local]
        const size = flat ? 0.2 * rnd() / 3 : 10 ** (-12 + 11.6 * rnd()) / 3
        for (let c = flat ? 2 : 0; c < 3; c++) coords[p + c] += size * (2 * rnd() - 1)
      }
      const fast = checkQuadraticBlock(coords, 'tet10', conn)
      const plain = checkQuadraticBlock(coords, 'tet10', conn, true)
      expect(fast).toEqual(plain)
      kinds.add(plain ? plain.kind : 'none')
    }
    expect([...kinds].sort()).toEqual(['jacobian', 'mid-edge', 'none'])
  })
})
