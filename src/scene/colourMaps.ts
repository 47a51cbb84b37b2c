/**
 * Published colour maps under their published names, sampled into small tables the shader and the
 * colour bar share, so both show exactly the same colours.
 * - viridis: van der Walt & Smith, matplotlib 2.0 default (2015), sequential, for magnitudes;
 * - cividis: Nuñez, Anderton & Renslow, PLOS ONE 13(7) 2018, sequential, colour-vision friendly;
 * - RdBu, PuOr: ColorBrewer diverging schemes (Brewer, colorbrewer2.org), centred on zero, for
 *   signed values. d3-scale-chromatic runs RdBu/PuOr from red/orange (low) to blue/purple (high);
 *   we reverse them so tension (positive) is warm and compression (negative) is cool.
 * Values come from d3-scale-chromatic (the published tables), not typed in by hand.
 */
import { interpolateCividis, interpolatePuOr, interpolateRdBu, interpolateViridis } from 'd3-scale-chromatic'
import type { ColourMapName } from '../state/store.ts'

const INTERPOLATORS: Readonly<Record<ColourMapName, (t: number) => string>> = {
  viridis: interpolateViridis,
  cividis: interpolateCividis,
  RdBu: (t) => interpolateRdBu(1 - t),
  PuOr: (t) => interpolatePuOr(1 - t),
}

/** Parses "rgb(r, g, b)" or "#rrggbb" into 0..255 components. */
function parseColour(s: string, out: Uint8Array, at: number): void {
  if (s[0] === '#') {
    out[at] = parseInt(s.slice(1, 3), 16); out[at + 1] = parseInt(s.slice(3, 5), 16); out[at + 2] = parseInt(s.slice(5, 7), 16)
  } else {
    const m = /(\d+)\D+(\d+)\D+(\d+)/.exec(s)
    out[at] = m ? +m[1] : 0; out[at + 1] = m ? +m[2] : 0; out[at + 2] = m ? +m[3] : 0
  }
  out[at + 3] = 255
}

const cache = new Map<string, Uint8Array>()

/**
 * RGBA8 table of `n` samples (t = i/(n-1) from the low end to the high end of the range), for a
 * 1D texture (three.js DataTexture width n, height 1, RGBAFormat) or the colour bar.
 */
export function colourMapTable(name: ColourMapName, n = 256): Uint8Array {
  const key = name + ':' + n
  let t = cache.get(key)
  if (!t) {
    t = new Uint8Array(4 * n)
    const f = INTERPOLATORS[name] ?? interpolateViridis
    for (let i = 0; i < n; i++) parseColour(f(n === 1 ? 0 : i / (n - 1)), t, 4 * i)
    cache.set(key, t)
  }
  return t
}
