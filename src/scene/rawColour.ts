import { Color, LinearSRGBColorSpace } from 'three'

/**
 * A three.js Color holding the sRGB components of `hex` as they are, not converted to linear:
 * scene materials write colours to the screen unchanged, so the stored values must be the
 * display values (see sceneLook.ts).
 */
export function rawColour(hex: string): Color {
  return new Color().setStyle(hex, LinearSRGBColorSpace)
}
