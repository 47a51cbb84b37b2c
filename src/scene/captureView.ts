import { Color, NoColorSpace, OrthographicCamera, PerspectiveCamera, RGBAFormat, UnsignedByteType, WebGLRenderTarget } from 'three'
import type { Camera, Object3D, Scene, WebGLRenderer } from 'three'
import { rawColour } from './rawColour.ts'
import { BACKGROUND } from './sceneLook.ts'

/** Largest side of a snapshot: what Chromium allows for a 2D canvas with room to spare. */
const MAX_SIDE = 16384
/** Largest snapshot in pixels (about 400 MB of RGBA in the canvas and the read buffer together). */
const MAX_PIXELS = 50_000_000
/** Tiles stay small enough for any WebGL2 device and for a bounded read buffer. */
const MAX_TILE = 2048

export interface CaptureOptions {
  /** Multisampling of the off-screen target (0 = none); software renderers should pass 0. */
  readonly samples?: number
  /** Background, sRGB hex; defaults to the scene background. */
  readonly background?: string
}

/**
 * Renders the current view of `scene` through `camera` off-screen at `width`×`height` pixels
 * and returns it as a 2D canvas (rows flipped to top-down). Large pictures are rendered in tiles
 * (camera view offsets) no larger than the device's texture and renderbuffer limits; a picture
 * beyond MAX_SIDE or MAX_PIXELS is scaled down to fit, keeping its aspect (the returned canvas
 * says the size actually made). Objects with `userData.noSnapshot` (the section handle) are left
 * out. If the aspect differs from the camera's, the camera's aspect is set for the capture only.
 */
export function renderViewToCanvas(gl: WebGLRenderer, scene: Scene, camera: Camera, width: number, height: number, options: CaptureOptions = {}): HTMLCanvasElement {
  let W = Math.max(1, Math.round(width)), H = Math.max(1, Math.round(height))
  const shrink = Math.min(1, MAX_SIDE / W, MAX_SIDE / H, Math.sqrt(MAX_PIXELS / (W * H)))
  if (shrink < 1) { W = Math.max(1, Math.floor(W * shrink)); H = Math.max(1, Math.floor(H * shrink)) }

  const ctx = gl.getContext()
  const maxRb = ctx.getParameter(ctx.MAX_RENDERBUFFER_SIZE) as number
  const tile = Math.max(64, Math.min(MAX_TILE, gl.capabilities.maxTextureSize, maxRb || MAX_TILE))

  const out = document.createElement('canvas')
  out.width = W; out.height = H
  const c2d = out.getContext('2d')
  if (!c2d) throw new Error('This browser cannot create a 2D canvas for the snapshot.')

  const hidden: Object3D[] = []
  scene.traverse((o) => { if (o.userData.noSnapshot && o.visible) { o.visible = false; hidden.push(o) } })
  const previousTarget = gl.getRenderTarget()
  const previousClear = new Color()
  gl.getClearColor(previousClear)
  const previousAlpha = gl.getClearAlpha()
  const projective = camera instanceof PerspectiveCamera || camera instanceof OrthographicCamera ? camera : null
  const previousAspect = camera instanceof PerspectiveCamera ? camera.aspect : 0
  if (camera instanceof PerspectiveCamera) { camera.aspect = W / H; camera.updateProjectionMatrix() }

  const tw0 = Math.min(tile, W), th0 = Math.min(tile, H)
  const target = new WebGLRenderTarget(tw0, th0, { format: RGBAFormat, type: UnsignedByteType, samples: options.samples ?? 0, depthBuffer: true })
  target.texture.colorSpace = NoColorSpace
  const pixels = new Uint8Array(4 * tw0 * th0)
  try {
    gl.setClearColor(rawColour(options.background ?? BACKGROUND), 1)
    for (let y = 0; y < H; y += th0) {
      for (let x = 0; x < W; x += tw0) {
        const tw = Math.min(tw0, W - x), th = Math.min(th0, H - y)
        target.setSize(tw, th)
        projective?.setViewOffset(W, H, x, y, tw, th)
        gl.setRenderTarget(target)
        gl.clear(true, true, true)
        gl.render(scene, camera)
        gl.readRenderTargetPixels(target, 0, 0, tw, th, pixels)
        // WebGL rows run bottom-up; the canvas wants them top-down.
        const image = c2d.createImageData(tw, th)
        const row = 4 * tw
        for (let r = 0; r < th; r++) image.data.set(pixels.subarray((th - 1 - r) * row, (th - r) * row), r * row)
        c2d.putImageData(image, x, y)
      }
    }
  } finally {
    projective?.clearViewOffset()
    if (camera instanceof PerspectiveCamera) { camera.aspect = previousAspect; camera.updateProjectionMatrix() }
    gl.setRenderTarget(previousTarget)
    gl.setClearColor(previousClear, previousAlpha)
    target.dispose()
    for (const o of hidden) o.visible = true
  }
  return out
}

/** The current view at `scale` × the canvas's CSS size (see renderViewToCanvas for limits). */
export function captureView(gl: WebGLRenderer, scene: Scene, camera: Camera, scale: 1 | 2 | 4, options: CaptureOptions = {}): HTMLCanvasElement {
  const el = gl.domElement
  const w = el.clientWidth || el.width, h = el.clientHeight || el.height
  return renderViewToCanvas(gl, scene, camera, w * scale, h * scale, options)
}
