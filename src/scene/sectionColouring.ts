import { activeRange, isSignedQuantity } from '../state/selectors.ts'
import type { ColourMapName, TractusData } from '../state/store.ts'

/**
 * Colours of the section face. When the surface shows the same quantity as the section
 * (normal or shear traction) the face shares the surface's map and range, so one colour bar
 * reads both; otherwise it gets its own range from its data: symmetric about zero on the
 * diverging map for normal traction, from zero on viridis for the shear magnitude.
 */
export function sectionColouring(s: Pick<TractusData, 'quantity' | 'range' | 'surface' | 'colourMap' | 'section' | 'sectionBuffers'>): {
  map: ColourMapName; range: readonly [number, number]; sharedWithSurface: boolean
} {
  const q = s.section.traction
  if (s.quantity === q) return { map: s.colourMap, range: activeRange(s), sharedWithSurface: true }
  const r = s.sectionBuffers?.ranges[q] ?? [0, 1]
  if (q === 'normalTraction' && isSignedQuantity(q)) {
    const a = Math.max(Math.abs(r[0]), Math.abs(r[1])) || 1
    return { map: 'RdBu', range: [-a, a], sharedWithSurface: false }
  }
  return { map: 'viridis', range: [0, r[1] > 0 ? r[1] : 1], sharedWithSurface: false }
}
