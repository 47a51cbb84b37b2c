/**
 * Test models: box meshes (src/model/boxMesh.ts) carrying an analytic stress field, the end-loaded
 * cantilever of Timoshenko & Goodier, Theory of Elasticity, 3rd ed. (1970), §21:
 * σx = -P x y / I, τxy = -(P / 2I)(c² - y²), σy = σz = τyz = τxz = 0, beam along x, depth 2c in y,
 * unit thickness in z (I = 2c³/3). The I/O tests only need exact numbers to round-trip; the
 * field keeps them realistic (mixed signs, zeros, non-integers).
 */
import { boxMesh } from '../../src/model/boxMesh.ts'
import type { BoxSpec } from '../../src/model/boxMesh.ts'
import { createMesh } from '../../src/model/createMesh.ts'
import type { BlockInput } from '../../src/model/createMesh.ts'
import type { ElementTypeName } from '../../src/model/elementTypes.ts'
import type { Mesh, Model } from '../../src/model/model.ts'

export const SMALL_BOX: BoxSpec = { nx: 2, ny: 2, nz: 1, lx: 2, ly: 1, lz: 0.5, y0: -0.5 }

export function cantileverStress(mesh: Mesh, P = 1000): Float64Array {
  const c = 0.5
  const I = (2 * c ** 3) / 3
  const s = new Float64Array(6 * mesh.nodeCount)
  for (let i = 0; i < mesh.nodeCount; i++) {
    const x = mesh.coords[3 * i], y = mesh.coords[3 * i + 1]
    s[6 * i] = (-P * x * y) / I
    s[6 * i + 3] = (-P / (2 * I)) * (c * c - y * y)
  }
  return s
}

function linearDisplacement(mesh: Mesh): Float64Array {
  const u = new Float64Array(3 * mesh.nodeCount)
  for (let i = 0; i < mesh.nodeCount; i++) {
    u[3 * i] = 1e-3 * mesh.coords[3 * i]
    u[3 * i + 1] = -3e-4 * mesh.coords[3 * i + 1]
    u[3 * i + 2] = -3e-4 * mesh.coords[3 * i + 2]
  }
  return u
}

export function modelOf(mesh: Mesh, withDisplacement = false): Model {
  return {
    name: 'cantilever',
    description: 'end-loaded cantilever, Timoshenko & Goodier §21',
    units: { length: 'mm', stress: 'MPa' },
    mesh,
    stress: cantileverStress(mesh),
    displacement: withDisplacement ? linearDisplacement(mesh) : null,
    bodyForce: [0, 0, -7.7e-5],
    warnings: [],
  }
}

export function boxModel(type: ElementTypeName, spec: BoxSpec = SMALL_BOX, withDisplacement = false): Model {
  return modelOf(boxMesh(spec, type), withDisplacement)
}

/**
 * Several boxes side by side along x, one element type each, in one model (not conforming:
 * the I/O layer does not care). Node ids start at 1 and element ids at 1 in each box, shifted by
 * `idGap` per box so ids stay unique and non-contiguous; parts number the boxes from 1.
 */
export function mixedModel(types: readonly ElementTypeName[], idGap = 1000, withDisplacement = true, spec: BoxSpec = SMALL_BOX): Model {
  const coords: number[] = []
  const nodeIds: number[] = []
  const blocks: BlockInput[] = []
  let nodeBase = 0
  types.forEach((t, k) => {
    const m = boxMesh({ ...spec, x0: 3 * k }, t)
    for (let i = 0; i < m.nodeCount; i++) {
      coords.push(m.coords[3 * i], m.coords[3 * i + 1], m.coords[3 * i + 2])
      nodeIds.push(k * idGap * 10 + i + 1)
    }
    const b = m.blocks[0]
    const conn = b.conn.map((n) => n + nodeBase)
    const ids = b.ids.map((id) => k * idGap + id)
    blocks.push({ type: t, conn, ids, part: new Int32Array(ids.length).fill(k + 1) })
    nodeBase += m.nodeCount
  })
  return modelOf(createMesh(new Float64Array(coords), blocks, new Int32Array(nodeIds)), withDisplacement)
}

/** The model with one stress row per element and node (values made up, distinct) instead of one per node. */
export function elementNodalTwin(nodal: Model): Model {
  let offset = 0
  const rows = nodal.mesh.blocks.map((b) => {
    const r = Int32Array.from({ length: b.conn.length }, (_, i) => offset + i)
    offset += b.conn.length
    return r
  })
  const values = Float64Array.from({ length: 6 * offset }, (_, i) => Math.sin(i * 0.37) * 1e3 + i / 7)
  return { ...nodal, stressField: { values, rows, layout: 'element-nodal' } }
}
