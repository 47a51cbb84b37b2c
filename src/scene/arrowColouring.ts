import { activeRange } from '../state/selectors.ts'
import { sectionColouring } from './sectionColouring.ts'
import type { ArrowBuffers } from '../../workers/protocol.ts'
import type { ColourMapName, TractusData } from '../state/store.ts'

type ArrowState = Pick<TractusData, 'arrowSettings' | 'arrows' | 'sectionBuffers' | 'section' | 'quantity' | 'range' | 'surface' | 'colourMap'>

/** The arrow fields on screen: the surface's when switched on, the section's when the cut shows them. */
function visibleArrows(s: ArrowState): ArrowBuffers[] {
  const out: ArrowBuffers[] = []
  if (s.arrowSettings.surface && s.arrows) out.push(s.arrows)
  if (s.arrowSettings.section && s.section.enabled && s.sectionBuffers) out.push(s.sectionBuffers.arrows)
  return out
}

const largest = new WeakMap<Float32Array, number>()

/** Largest |tₙ| of one arrow field (bounded by the arrow budget; remembered per buffer). */
function maxAbsNormal(a: ArrowBuffers): number {
  const tn = a.normalTraction
  let m = largest.get(tn)
  if (m === undefined) {
    m = 0
    for (let i = 0; i < tn.length; i++) { const v = Math.abs(tn[i]); if (v > m) m = v }
    largest.set(tn, m)
  }
  return m
}

/**
 * How the arrows are coloured (null: one colour): by their signed normal traction tₙ on a
 * diverging map, centred on zero. When the surface shows tₙ the arrows take its map and range,
 * so its colour bar reads them too; when only the section's arrows show and the section face
 * shows tₙ, they take the face's; otherwise they get a range of their own, ±(largest |tₙ| of
 * the arrows on screen), on a diverging map the surface is not using, with a bar of their own.
 * `sharedWithSurface` is true when no bar of their own is needed.
 */
export function arrowColouring(s: ArrowState): { map: ColourMapName; range: readonly [number, number]; sharedWithSurface: boolean } | null {
  if (s.arrowSettings.colour === 'single') return null
  if (s.quantity === 'normalTraction') return { map: s.colourMap, range: activeRange(s), sharedWithSurface: true }
  const surfaceArrows = s.arrowSettings.surface && s.arrows
  if (!surfaceArrows && s.section.enabled && s.sectionBuffers && s.section.traction === 'normalTraction') {
    const c = sectionColouring(s)
    return { map: c.map, range: c.range, sharedWithSurface: true }
  }
  let a = 0
  for (const f of visibleArrows(s)) a = Math.max(a, maxAbsNormal(f))
  if (!(a > 0)) a = 1
  return { map: s.colourMap === 'RdBu' ? 'PuOr' : 'RdBu', range: [-a, a], sharedWithSurface: false }
}

/**
 * The magnitude (stress units) drawn at the full arrow length, shared by every arrow field on
 * screen so one scale arrow reads them all: the largest magnitude among them (0: no arrows).
 */
export function arrowReference(s: ArrowState): number {
  let m = 0
  for (const f of visibleArrows(s)) if (f.maxMagnitude > m) m = f.maxMagnitude
  return m
}

/** The largest 1-2-5 value (1, 2, 5, 10, 20 ...) not above `v` (v > 0), for the scale arrow. */
export function roundDown125(v: number): number {
  if (!(v > 0) || !Number.isFinite(v)) return 0
  const p = 10 ** Math.floor(Math.log10(v))
  const m = v / p
  // m in [1, 10): round-off may put a power of ten a hair under it
  const step = m >= 5 - 1e-9 ? 5 : m >= 2 - 1e-9 ? 2 : 1
  return step * p
}
