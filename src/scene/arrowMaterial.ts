import { ShaderMaterial } from 'three'
import type { Color, Plane } from 'three'
import { rawColour } from './rawColour.ts'
import { ARROW_SINGLE } from './sceneLook.ts'

/**
 * Material of the instanced arrows: per-instance colour (instanceColor) or one colour, the same
 * head light as the surface, colours written unchanged (see sceneLook.ts).
 */
const vertexShader = /* glsl */ `
#include <common>
#include <clipping_planes_pars_vertex>
uniform vec3 single;
uniform float useSingle;
varying vec3 vColour;
varying vec3 vNormalView;
void main() {
  vec4 p = instanceMatrix * vec4(position, 1.0);
  vNormalView = normalMatrix * (mat3(instanceMatrix) * normal);
#ifdef USE_INSTANCING_COLOR
  vColour = useSingle > 0.5 ? single : instanceColor;
#else
  vColour = single;
#endif
  vec4 mvPosition = modelViewMatrix * p;
  gl_Position = projectionMatrix * mvPosition;
  #include <clipping_planes_vertex>
}
`

const fragmentShader = /* glsl */ `
#include <clipping_planes_pars_fragment>
varying vec3 vColour;
varying vec3 vNormalView;
void main() {
  #include <clipping_planes_fragment>
  vec3 n = normalize(vNormalView);
  vec3 l = normalize(vec3(0.25, 0.45, 1.0));
  float shade = 0.55 + 0.45 * abs(dot(n, l));
  gl_FragColor = vec4(vColour * shade, 1.0);
}
`

export interface ArrowMaterialUniforms {
  single: { value: Color }
  useSingle: { value: number }
}

export function createArrowMaterial(clippingPlanes: Plane[]): ShaderMaterial & { uniforms: ArrowMaterialUniforms } {
  const uniforms: ArrowMaterialUniforms = { single: { value: rawColour(ARROW_SINGLE) }, useSingle: { value: 0 } }
  return new ShaderMaterial({
    uniforms: uniforms as unknown as ShaderMaterial['uniforms'],
    vertexShader, fragmentShader, clipping: true, clippingPlanes, toneMapped: false,
  }) as ShaderMaterial & { uniforms: ArrowMaterialUniforms }
}
