import { ClampToEdgeWrapping, DataTexture, LinearFilter, NoColorSpace, RGBAFormat, UnsignedByteType } from 'three'
import type { ColourMapName } from '../state/store.ts'
import { colourMapTable } from './colourMaps.ts'

const cache = new Map<ColourMapName, DataTexture>()

/**
 * The 256×1 colour-map texture the shaders sample, from the same table as the colour bar.
 * Linear filtering between the 256 entries keeps the map continuous; NoColorSpace because the
 * bytes are display values written to the screen unchanged. Cached for the page's life (four
 * maps of 1 KB each).
 */
export function colourMapTexture(name: ColourMapName): DataTexture {
  let tex = cache.get(name)
  if (!tex) {
    tex = new DataTexture(colourMapTable(name, 256), 256, 1, RGBAFormat, UnsignedByteType)
    tex.colorSpace = NoColorSpace
    tex.magFilter = LinearFilter
    tex.minFilter = LinearFilter
    tex.wrapS = ClampToEdgeWrapping
    tex.wrapT = ClampToEdgeWrapping
    tex.generateMipmaps = false
    tex.needsUpdate = true
    cache.set(name, tex)
  }
  return tex
}
