import { CanvasTexture, LinearFilter, Sprite, SpriteMaterial } from 'three'

/** Label text height on screen (CSS pixels at 1×; snapshots scale with their size). */
export const LABEL_PX = 13

/**
 * A text label for the scene: the text drawn on a small canvas (on a pale rounded plate, so it
 * reads over any colour), shown as a sprite of constant screen size (sizeAttenuation off), over
 * everything (no depth test). `setLabelSize` gives it its size for a view of `viewHeight` pixels.
 * Colours are written unchanged, like every scene material (sceneLook.ts).
 */
export function textSprite(text: string, colour: string): Sprite {
  const scale = 3 // canvas pixels per label pixel: sharp in 2× and 3× snapshots
  const font = `600 ${LABEL_PX * scale}px system-ui, -apple-system, "Segoe UI", Roboto, sans-serif`
  const probe = document.createElement('canvas').getContext('2d')!
  probe.font = font
  const pad = 4 * scale
  const w = Math.ceil(probe.measureText(text).width) + 2 * pad, h = Math.ceil(LABEL_PX * scale * 1.35) + pad
  const canvas = document.createElement('canvas')
  canvas.width = w
  canvas.height = h
  const g = canvas.getContext('2d')!
  g.fillStyle = 'rgba(250, 250, 248, 0.88)'
  g.beginPath()
  g.roundRect(0, 0, w, h, 3 * scale)
  g.fill()
  g.font = font
  g.fillStyle = colour
  g.textBaseline = 'middle'
  g.fillText(text, pad, h / 2 + scale)
  const map = new CanvasTexture(canvas)
  map.minFilter = LinearFilter
  map.generateMipmaps = false
  const sprite = new Sprite(new SpriteMaterial({ map, depthTest: false, depthWrite: false, sizeAttenuation: false, toneMapped: false, transparent: true }))
  sprite.renderOrder = 20
  sprite.raycast = () => {}
  sprite.userData.aspect = w / h
  sprite.userData.textHeight = h / scale
  return sprite
}

/**
 * Sizes a label for a view `viewHeight` pixels high seen through a vertical field of view of
 * `fovDeg`: a sprite without size attenuation spans scale·(1/tan(fov/2)) of the clip-space height 2.
 */
export function setLabelSize(sprite: Sprite, viewHeight: number, fovDeg: number): void {
  const f = 1 / Math.tan(((fovDeg * Math.PI) / 180) / 2)
  const hPx = (sprite.userData.textHeight as number) ?? LABEL_PX
  const sy = (2 * hPx) / (viewHeight * f)
  sprite.scale.set(sy * (sprite.userData.aspect as number), sy, 1)
}

export function disposeSprite(sprite: Sprite): void {
  sprite.material.map?.dispose()
  sprite.material.dispose()
}
