/**
 * The engine's assembly jobs: the parts, their balance and interfaces of a loaded model (once per
 * load, only when it has several parts), the surface's triangles grouped by part, and a cut's
 * section triangles grouped by region. Everything here is O(elements) or O(triangles) and runs in
 * the worker; the scene then shows, hides and highlights whole index ranges.
 *
 * Units: model units (see protocol.ts).
 */
import type { Model, Vec3 } from '../src/model/model.ts'
import type { StressField } from '../src/model/stressField.ts'
import { assemblyBalance, hasSeveralParts, partNumbers } from '../src/mechanics/partBalance.ts'
import type { AssemblyBalance } from '../src/mechanics/partBalance.ts'
import { groupTriangles } from '../src/mechanics/triangleGroups.ts'
import { partPiece } from '../src/mechanics/sectionCut.ts'
import type { PartPiece, RegionLabels } from '../src/mechanics/sectionCut.ts'
import type { BoundaryFaces, SurfaceTractions } from '../src/mechanics/types.ts'
import type { AssemblySummary, CutLimit } from './protocol.ts'
import { InputError } from '../src/model/errors.ts'

/**
 * The parts and interfaces of `model` as a load computes them: the whole body's boundary faces,
 * their tractions (from `field`) and the faces against parts meshed apart (the load patches'
 * label -2) are the load's own, reused (partBalance.ts). The benchmark of the per-part work at
 * load (test/bench/partsCost.ts) runs this same function.
 */
export function assemblyAtLoad(model: Model, field: StressField, faces: BoundaryFaces, tractions: SurfaceTractions, faceLabel: Int32Array): AssemblyBalance {
  const info = new Map((model.parts ?? []).map((p) => [p.part, p]))
  const bodyForce = (p: number): Vec3 => info.get(p)?.bodyForce ?? model.bodyForce
  const names = new Map([...info.values()].map((p) => [p.part, p.name]))
  return assemblyBalance(model.mesh, field, bodyForce, names, { faces, tractions, against: labelled(faceLabel, -2) })
}

/**
 * The assembly of `model` (null with one part), its surface triangles regrouped by part in place
 * (`index` and `triangleFace` move together, so picking still finds each triangle's face).
 * `tractions` and `faceLabel` are the load's on `faces` (see assemblyAtLoad).
 */
export function loadAssembly(
  model: Model, field: StressField, faces: BoundaryFaces, tractions: SurfaceTractions, faceLabel: Int32Array,
  index: Uint32Array, triangleFace: Uint32Array, faceVertexStart: Int32Array,
): AssemblySummary | null {
  if (!hasSeveralParts(model.mesh)) return null
  const asm = assemblyAtLoad(model, field, faces, tractions, faceLabel)
  // each face's part rank (its part's place in the part list), found along the faces: no array per element
  // (the loops are functions of their own: compiled code of a function that also holds this
  // load's objects is dropped with them and compiled again at the next load)
  const rank = asm.facePart
  const partTriangles = groupTriangles(index, [triangleFace], triangleGroups(rank, triangleFace), asm.parts.length)
  // the part's rank at every surface vertex (colour by part)
  const vertexPart = vertexGroups(rank, faceVertexStart, faces.count)
  return {
    parts: asm.parts, interfaces: asm.interfaces, partTriangles, vertexPart,
    interfacePositions: asm.interfaceMesh.positions, interfaceTriangles: asm.interfaceMesh.offsets,
  }
}

/** 1 where `label` is `value`, else 0. */
function labelled(label: Int32Array, value: number): Uint8Array {
  const out = new Uint8Array(label.length)
  for (let f = 0; f < label.length; f++) out[f] = label[f] === value ? 1 : 0
  return out
}

/** Each triangle's group: its face's (`rank` per face). */
function triangleGroups(rank: Int32Array, triangleFace: Uint32Array): Int32Array {
  const T = triangleFace.length, group = new Int32Array(T)
  for (let t = 0; t < T; t++) group[t] = rank[triangleFace[t]]
  return group
}

/** Each surface vertex's group, as a float (a vertex attribute): its face's (`rank`), faces' vertices from faceVertexStart. */
function vertexGroups(rank: Int32Array, faceVertexStart: Int32Array, F: number): Float32Array {
  const out = new Float32Array(faceVertexStart[F])
  for (let f = 0; f < F; f++) out.fill(rank[f], faceVertexStart[f], faceVertexStart[f + 1])
  return out
}

/** The parts' balance and interfaces of the model's stress (assemblyBalance with the parts' own body forces and names). */
function balanceOfParts(model: Model, field: StressField): ReturnType<typeof assemblyBalance> {
  const info = new Map((model.parts ?? []).map((p) => [p.part, p]))
  const bodyForce = (p: number): Vec3 => info.get(p)?.bodyForce ?? model.bodyForce
  const names = new Map([...info.values()].map((p) => [p.part, p.name]))
  return assemblyBalance(model.mesh, field, bodyForce, names)
}

/**
 * What another load case changes of the assembly (null with one part): the parts' balance and the
 * interfaces' forces. The triangle groups, part colours and interface mesh of the load stay.
 */
export function caseAssembly(model: Model, field: StressField): Pick<AssemblySummary, 'parts' | 'interfaces'> | null {
  if (!hasSeveralParts(model.mesh)) return null
  const asm = balanceOfParts(model, field)
  return { parts: asm.parts, interfaces: asm.interfaces }
}

/**
 * A cut's section triangles regrouped by region in place; returns the region offsets (see
 * CutReply). The triangles come polygon by polygon in the order the cut met the elements, which
 * is the order of the labels: each triangle's element is found by walking the labels alongside
 * (a few steps ahead at most), and only a triangle found nowhere near asks a map of every label
 * (made then, once). A map for every cut cost 30–45 ms at 85 000 cut elements.
 */
export function regionTriangles(labels: RegionLabels, count: number, index: Uint32Array, triangleElement: Int32Array): Int32Array {
  const E = labels.element, R = labels.region, n = E.length
  const T = triangleElement.length
  const group = new Int32Array(T)
  let regionOf: Map<number, number> | null = null
  let j = 0
  for (let t = 0; t < T; t++) {
    const e = triangleElement[t]
    let k = j
    while (k < n && k < j + WALK_AHEAD && E[k] !== e) k++
    if (k < n && E[k] === e) { j = k; group[t] = R[k]; continue }
    if (!regionOf) { regionOf = new Map(); for (let s = 0; s < n; s++) regionOf.set(E[s], R[s]) }
    group[t] = regionOf.get(e) ?? -1
  }
  return groupTriangles(index, [triangleElement], group, count)
}
/** Labels looked at ahead of the last one found before the map is asked. */
const WALK_AHEAD = 4

/** Checks a limit from the app: known parts, a finite centre and a radius > 0 (InputError naming the field). */
export function checkLimit(limit: CutLimit | null | undefined, model: Model): CutLimit | null {
  if (!limit || (!limit.parts && !limit.within)) return null
  if (limit.parts) {
    const known = new Set(partNumbers(model.mesh))
    const unknown = limit.parts.filter((p) => !known.has(p))
    if (unknown.length) throw new InputError('bad-argument', `parts: no element has part ${unknown.join(', ')}; the model's parts are ${[...known].join(', ')}`)
  }
  const w = limit.within
  if (w && !(w.center.every(Number.isFinite) && Number.isFinite(w.radius) && w.radius > 0)) {
    throw new InputError('bad-argument', 'disc: the centre needs three finite numbers and the radius a number greater than 0')
  }
  return limit
}

/** The piece of the last parts limit per model (a parts-limited cut's free body; O(elements) to build). */
const pieces = new WeakMap<Model, PartPiece>()

/** The piece of `limit`'s parts when the limit is whole parts only (else undefined), kept while the parts stay. */
export function pieceFor(model: Model, field: StressField, limit: CutLimit | null): PartPiece | undefined {
  if (!limit?.parts || limit.parts.length === 0 || limit.within) return undefined
  const key = [...limit.parts].sort((a, b) => a - b).join(',')
  const old = pieces.get(model)
  if (old && [...old.parts].sort((a, b) => a - b).join(',') === key) return old
  const piece = partPiece(model.mesh, field, limit.parts)
  pieces.set(model, piece)
  return piece
}
