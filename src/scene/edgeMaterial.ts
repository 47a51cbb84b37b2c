import { Color, ShaderMaterial } from 'three'
import type { Plane } from 'three'
import { rawColour } from './rawColour.ts'

/**
 * Material of the thin feature edges: one colour and opacity, moved like the surface in the
 * deformed shape (vec3 attribute `displacement` times `deformScale`), clipped by the undeformed
 * position as the surface is (scalarMaterial.ts), so the edges stay on the surface they outline.
 */
export interface EdgeMaterialUniforms {
  colour: { value: Color }
  opacity: { value: number }
  deformScale: { value: number }
}

const vertexShader = /* glsl */ `
#include <common>
#include <clipping_planes_pars_vertex>
attribute vec3 displacement;
uniform float deformScale;
void main() {
  vec4 mvPosition = modelViewMatrix * vec4(position, 1.0);
  gl_Position = projectionMatrix * modelViewMatrix * vec4(position + deformScale * displacement, 1.0);
  #include <clipping_planes_vertex>
}
`

const fragmentShader = /* glsl */ `
#include <clipping_planes_pars_fragment>
uniform vec3 colour;
uniform float opacity;
void main() {
  #include <clipping_planes_fragment>
  gl_FragColor = vec4(colour, opacity);
}
`

export function createEdgeMaterial(colour: string, opacity: number, clippingPlanes: Plane[]): ShaderMaterial & { uniforms: EdgeMaterialUniforms } {
  const uniforms: EdgeMaterialUniforms = { colour: { value: rawColour(colour) }, opacity: { value: opacity }, deformScale: { value: 0 } }
  const m = new ShaderMaterial({
    uniforms: uniforms as unknown as ShaderMaterial['uniforms'],
    vertexShader, fragmentShader, transparent: opacity < 1, clipping: true, clippingPlanes, toneMapped: false,
  })
  Object.assign(m.defaultAttributeValues, { displacement: [0, 0, 0] })
  return m as ShaderMaterial & { uniforms: EdgeMaterialUniforms }
}
