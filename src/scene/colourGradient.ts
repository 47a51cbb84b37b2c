import type { ColourMapName } from '../state/store.ts'
import { colourMapTable } from './colourMaps.ts'

/**
 * A CSS `linear-gradient(...)` of a colour map, low end on the left, from the same 256-entry
 * table the shader samples, with `stops` evenly spaced colour stops (the browser interpolates
 * between them; 32 stops keep every map within a level or two of the table).
 */
export function cssGradient(name: ColourMapName, stops = 32, direction = 'to right'): string {
  const table = colourMapTable(name, 256)
  const n = Math.max(2, Math.min(256, Math.floor(stops)))
  const parts: string[] = []
  for (let i = 0; i < n; i++) {
    const k = 4 * Math.round((i * 255) / (n - 1))
    const pct = ((100 * i) / (n - 1)).toFixed(2).replace(/\.?0+$/, '')
    parts.push(`rgb(${table[k]} ${table[k + 1]} ${table[k + 2]}) ${pct}%`)
  }
  return `linear-gradient(${direction}, ${parts.join(', ')})`
}
