/**
 * Is WebGL drawn in software? Then the scene turns antialiasing off and renders at pixel ratio 1
 * (see /work notes on software rendering cost: SwiftShader on 2 cores manages ~10 frames/s).
 * Chromium without a GPU reports e.g. "Google SwiftShader", Mesa "llvmpipe", Windows
 * "Microsoft Basic Render Driver"; several browsers report "Software" in the name.
 */
export type RendererKind = 'hardware' | 'software' | 'unknown'

const SOFTWARE = /swiftshader|llvmpipe|softpipe|software|basic render driver/i

export function classifyRenderer(name: string): RendererKind {
  if (!name) return 'unknown'
  return SOFTWARE.test(name) ? 'software' : 'hardware'
}

/** The unmasked renderer string where the browser gives it, else the plain RENDERER string. */
export function rendererName(gl: WebGLRenderingContext | WebGL2RenderingContext): string {
  const ext = gl.getExtension('WEBGL_debug_renderer_info')
  const name = ext ? gl.getParameter(ext.UNMASKED_RENDERER_WEBGL) : gl.getParameter(gl.RENDERER)
  return typeof name === 'string' ? name : ''
}

let probed: { kind: RendererKind; name: string } | null = null

/**
 * Asks a throw-away WebGL2 context before the real one exists, because antialiasing is fixed when
 * a context is created. Done once per page; the probe context is released at once.
 */
export function probeRenderer(): { kind: RendererKind; name: string } {
  if (probed) return probed
  try {
    const canvas = document.createElement('canvas')
    const gl = canvas.getContext('webgl2') ?? canvas.getContext('webgl')
    if (!gl) return (probed = { kind: 'unknown', name: '' })
    const name = rendererName(gl)
    gl.getExtension('WEBGL_lose_context')?.loseContext()
    probed = { kind: classifyRenderer(name), name }
  } catch {
    probed = { kind: 'unknown', name: '' }
  }
  return probed
}
