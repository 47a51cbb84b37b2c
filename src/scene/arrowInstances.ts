import { Matrix4, Quaternion, Vector3 } from 'three'
import type { InstancedMesh } from 'three'
import type { ArrowBuffers } from '../../workers/protocol.ts'
import type { ColourMapName } from '../state/store.ts'
import { colourMapTable } from './colourMaps.ts'

const _m = new Matrix4()
const _q = new Quaternion()
const _p = new Vector3()
const _s = new Vector3()
const _d = new Vector3()
const Y = new Vector3(0, 1, 0)

/**
 * Writes instance matrices (and colours) of `mesh` from the arrow buffers. `unitLength` is the
 * drawn length (model length units) of an arrow of magnitude `reference` (stress units; default
 * the largest of these arrows), so arrow fields drawn with one reference share one length scale.
 * An arrow pushing on the surface (v·n < 0, n the outward normal when the buffers carry
 * `normals`) is drawn ending at its point, so it stays outside the body; a pulling one starts
 * there. Colour: the signed normal traction tₙ through `colourMap` over `colourRange` (tension
 * and compression on the two halves of a diverging map), or none when `colourRange` is null (the
 * material's single colour). With the deformed shape (`deformScale` > 0 and the buffers'
 * `displacement`) every origin moves by deformScale times its displacement. Bounded by the arrow
 * budget, so running this on the main thread is fine.
 */
export function writeArrowInstances(
  mesh: InstancedMesh, arrows: ArrowBuffers, unitLength: number, radius: number,
  colourMap: ColourMapName, colourRange: readonly [number, number] | null, reference = arrows.maxMagnitude, deformScale = 0,
): void {
  const n = Math.min(mesh.count, arrows.magnitudes.length)
  const { origins, vectors, magnitudes } = arrows
  const normals = (arrows as { normals?: Float32Array }).normals
  const du = arrows.displacement
  const tn = (arrows as { normalTraction?: Float32Array }).normalTraction
  const max = reference > 0 ? reference : 1
  const table = colourMapTable(colourMap, 256)
  const lo = colourRange ? colourRange[0] : 0
  const span = colourRange && colourRange[1] > colourRange[0] ? colourRange[1] - colourRange[0] : 1
  const colours = mesh.instanceColor ? mesh.instanceColor.array as Float32Array : null
  for (let i = 0; i < n; i++) {
    const m = magnitudes[i]
    const L = m > 0 ? (unitLength * m) / max : 0
    _d.set(vectors[3 * i], vectors[3 * i + 1], vectors[3 * i + 2])
    if (m > 0) _d.multiplyScalar(1 / m)
    else _d.set(0, 1, 0) // zero arrow: any direction, drawn with zero length
    _q.setFromUnitVectors(Y, _d)
    _p.set(origins[3 * i], origins[3 * i + 1], origins[3 * i + 2])
    if (du && deformScale !== 0) { _p.x += deformScale * du[3 * i]; _p.y += deformScale * du[3 * i + 1]; _p.z += deformScale * du[3 * i + 2] }
    if (normals && _d.x * normals[3 * i] + _d.y * normals[3 * i + 1] + _d.z * normals[3 * i + 2] < 0) {
      _p.addScaledVector(_d, -L)
    }
    const r = Math.min(radius, 0.1 * L)
    _s.set(r, L, r)
    mesh.setMatrixAt(i, _m.compose(_p, _q, _s))
    if (colours) {
      const t = colourRange && tn ? (tn[i] - lo) / span : 0
      const k = 4 * Math.max(0, Math.min(255, Math.round((Number.isFinite(t) ? t : 0) * 255)))
      const c = colourRange ? 1 / 255 : 0
      colours[3 * i] = table[k] * c; colours[3 * i + 1] = table[k + 1] * c; colours[3 * i + 2] = table[k + 2] * c
    }
  }
  mesh.instanceMatrix.needsUpdate = true
  if (mesh.instanceColor) mesh.instanceColor.needsUpdate = true
}
