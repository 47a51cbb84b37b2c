/**
 * The region labelling of a cut (labelRegions, sectionRegions.ts) against a plain reference on
 * random assemblies: boxes of several element types, some sharing nodes, some meshed apart with
 * coincident nodes (of one part or of two), random planes (some exactly through grid nodes) and
 * random selections (a limit). The reference is the definition written out directly: two cut
 * elements of one part belong together when they have a crossed face with the same corner
 * nodes, an element edge on the plane (both corners at d == 0) with the same two nodes, or
 * crossed faces whose corners coincide within COINCIDENT_TOL times the face size; every pair of
 * faces or edges is compared (no tables, no hashing). Seeded; the seed is printed.
 */
import { describe, expect, it } from 'vitest'
import { nodeDistances } from '../../src/mechanics/sectionCut.ts'
import { COINCIDENT_TOL, createCutRecord, labelRegions, recordElement } from '../../src/mechanics/sectionRegions.ts'
import type { CutRecord } from '../../src/mechanics/sectionRegions.ts'
import { ELEMENT_TYPES } from '../../src/model/elementTypes.ts'
import type { Mesh, Vec3 } from '../../src/model/model.ts'
import { randomAssembly } from '../helpers/assemblies.ts'
import { mulberry32, rotateMesh, rotationFromUniforms } from '../helpers/rotation.ts'

const SEED = 20261202

/** Region labels by the definition: every pair of crossed faces compared. */
function referenceLabels(sel: Int32Array, n: number, r: CutRecord, mesh: Mesh, d: Float64Array): Int32Array {
  const parent = Array.from({ length: n }, (_, i) => i)
  const find = (i: number): number => (parent[i] === i ? i : (parent[i] = find(parent[i])))
  const join = (a: number, b: number) => { const ra = find(a), rb = find(b); if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb) }
  const part: number[] = []
  const faces: { owner: number; nodes: number[] }[] = []
  for (let s = 0; s < n; s++) {
    const i = sel[s], block = mesh.blocks[r.block[i]], topo = ELEMENT_TYPES[block.type], base = topo.nodeCount * r.local[i]
    part.push(block.part ? block.part[r.local[i]] : 0)
    for (let f = 0; f < topo.cornerFaces.length / 4; f++) {
      const nodes: number[] = []
      for (let k = 0; k < 4; k++) if (topo.cornerFaces[4 * f + k] >= 0) nodes.push(block.conn[base + topo.cornerFaces[4 * f + k]])
      const below = nodes.filter((v) => d[v] < 0).length
      if (below > 0 && below < nodes.length) faces.push({ owner: s, nodes: nodes.sort((a, b) => a - b) })
    }
  }
  // the same corner nodes (a face of a conforming mesh is told by its three smallest corners)
  const key = (f: { nodes: number[] }) => f.nodes.slice(0, 3).join(',')
  const open: typeof faces = []
  for (const f of faces) {
    const twins = faces.filter((g) => key(g) === key(f))
    expect(twins.length).toBeLessThanOrEqual(2) // valid meshes: a face has at most two elements
    if (twins.length === 1) open.push(f)
    else if (twins[0] === f && part[twins[0].owner] === part[twins[1].owner]) join(twins[0].owner, twins[1].owner)
  }
  // an element edge with both corners on the plane (d == 0), the same two nodes in both: the
  // polygons share that edge (a plane through a layer of nodes)
  const edges: { owner: number; key: string }[] = []
  for (let s = 0; s < n; s++) {
    const i = sel[s], block = mesh.blocks[r.block[i]], topo = ELEMENT_TYPES[block.type], base = topo.nodeCount * r.local[i]
    for (const [a, b] of topo.edges) {
      const u = block.conn[base + a], v = block.conn[base + b]
      if (d[u] === 0 && d[v] === 0) edges.push({ owner: s, key: `${Math.min(u, v)},${Math.max(u, v)}` })
    }
  }
  for (const e of edges) for (const g of edges) if (e.key === g.key && part[e.owner] === part[g.owner]) join(e.owner, g.owner)
  // corners that coincide within the tolerance (the two faces' centroids, then every corner)
  const x = mesh.coords
  const centroid = (f: { nodes: number[] }) => [0, 1, 2].map((j) => f.nodes.reduce((s, v) => s + x[3 * v + j] / f.nodes.length, 0))
  const size = (f: { nodes: number[] }) => { const c = centroid(f); return Math.max(...f.nodes.map((v) => Math.hypot(x[3 * v] - c[0], x[3 * v + 1] - c[1], x[3 * v + 2] - c[2]))) }
  const dist = (a: number[], b: number[]) => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2])
  const at = (v: number) => [x[3 * v], x[3 * v + 1], x[3 * v + 2]]
  for (let a = 0; a < open.length; a++) {
    for (let b = a + 1; b < open.length; b++) {
      const f = open[a], g = open[b]
      if (f.owner === g.owner || f.nodes.length !== g.nodes.length || part[f.owner] !== part[g.owner]) continue
      const tol = COINCIDENT_TOL * Math.min(size(f), size(g))
      if (dist(centroid(f), centroid(g)) > tol) continue
      if (f.nodes.every((u) => g.nodes.some((v) => dist(at(u), at(v)) <= tol))) join(f.owner, g.owner)
    }
  }
  const id = new Map<number, number>()
  return Int32Array.from({ length: n }, (_, s) => {
    const root = find(s)
    if (!id.has(root)) id.set(root, id.size)
    return id.get(root)!
  })
}

/** The record a cut makes: every element with corners on both sides (d < 0 and d ≥ 0), in order. */
function recordCut(mesh: Mesh, d: Float64Array): CutRecord {
  const rec = createCutRecord()
  mesh.blocks.forEach((b, bi) => {
    const topo = ELEMENT_TYPES[b.type]
    for (let e = 0; e < b.ids.length; e++) {
      let below = 0
      for (let k = 0; k < topo.cornerCount; k++) if (d[b.conn[topo.nodeCount * e + k]] < 0) below++
      if (below > 0 && below < topo.cornerCount) recordElement(rec, bi, e, false)
    }
  })
  return rec
}

describe(`region labels against a plain reference (seed ${SEED})`, () => {
  console.log(`region labels seed ${SEED}`)
  const rnd = mulberry32(SEED)
  for (let trial = 0; trial < 40; trial++) {
    const { mesh: flat, merged } = randomAssembly(rnd)
    const mesh = trial % 2 ? rotateMesh(flat, rotationFromUniforms(rnd(), rnd(), rnd())) : flat
    it(`trial ${trial}: ${mesh.elementCount} elements, ${mesh.blocks.length} blocks, ${merged ? 'shared nodes' : 'meshed apart'}`, () => {
      for (let plane = 0; plane < 4; plane++) {
        // every other plane lies on grid nodes (axis-aligned at a multiple of the spacing, before rotation)
        const onNodes = plane % 2 === 1 && trial % 2 === 0
        const axis = Math.floor(3 * rnd())
        const normal: Vec3 = onNodes ? [axis === 0 ? 1 : 0, axis === 1 ? 1 : 0, axis === 2 ? 1 : 0] : [rnd() - 0.5, rnd() - 0.5, rnd() - 0.5]
        const l = Math.hypot(...normal)
        const m: Vec3 = [normal[0] / l, normal[1] / l, normal[2] / l]
        const c = [0, 0, 0]
        for (let i = 0; i < mesh.nodeCount; i++) for (let k = 0; k < 3; k++) c[k] += mesh.coords[3 * i + k] / mesh.nodeCount
        const point: Vec3 = onNodes ? [0.5 * Math.round(4 * rnd()), 0.5 * Math.round(4 * rnd()), 0.5 * Math.round(4 * rnd())] : [c[0] + 0.5 * (rnd() - 0.5), c[1] + 0.5 * (rnd() - 0.5), c[2] + 0.5 * (rnd() - 0.5)]
        const d = new Float64Array(mesh.nodeCount)
        nodeDistances(d, mesh.coords, mesh.nodeCount, point, m)
        const rec = recordCut(mesh, d)
        // all recorded elements, or a random selection (a limit)
        const all = plane < 2
        const sel = new Int32Array(rec.n)
        let n = 0
        for (let i = 0; i < rec.n; i++) if (all || rnd() < 0.7) sel[n++] = i
        const label = new Int32Array(n)
        const count = labelRegions(label, sel, n, rec, mesh, d)
        const want = referenceLabels(sel, n, rec, mesh, d)
        expect(Array.from(label)).toEqual(Array.from(want))
        expect(count).toBe(n ? Math.max(...want) + 1 : 0)
      }
    })
  }
})
