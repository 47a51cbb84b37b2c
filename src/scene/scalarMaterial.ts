import { DoubleSide, ShaderMaterial, Vector2, Vector4 } from 'three'
import type { Color, Plane, Texture } from 'three'
import { NEUTRAL_SURFACE } from './sceneLook.ts'
import { rawColour } from './rawColour.ts'

/**
 * Colour-mapped surface material. A float vertex attribute `scalar` goes through a 256×1 colour
 * map texture between the uniforms `range` = (min, max); switching quantity swaps an attribute
 * and switching range or map changes a uniform, so neither costs a loop on the main thread.
 * Optional float attribute `label` (load-patch id): while `highlight` ≥ 0, faces of other patches
 * fade towards neutral, so the highlighted patch keeps its data colours and stands out.
 *
 * Deformed shape: an optional vec3 attribute `displacement` moves every vertex by `deformScale`
 * times it (0: undeformed). The clipping planes test the undeformed position, so a cut hides the
 * same material points whatever the scale, and the section face (moved the same way) closes it.
 *
 * Light: a head light from the viewer, slightly from above, plus ambient, so the shape reads
 * without a lighting setup to tune. Back faces (seen through a section cut) are drawn neutral
 * and darker. Colours are written unchanged (no tone mapping, no colour-space conversion), so
 * the picture shows exactly the colour bar's colours.
 */
export interface ScalarMaterialUniforms {
  map: { value: Texture }
  range: { value: Vector2 }
  highlight: { value: number }
  neutral: { value: Color }
  useLabel: { value: number }
  /** 1 when the surface has scalars, 0 to paint it neutral (no quantity yet). */
  useScalar: { value: number }
  /** xyz: one world normal for every vertex (a flat section face), used when w = 1. */
  flatNormal: { value: Vector4 }
  /** 1: back faces neutral and dim (a closed surface seen through a cut); 0: lit like the front. */
  backNeutral: { value: number }
  /** Scale of the deformed shape (dimensionless); 0 draws the undeformed geometry. */
  deformScale: { value: number }
}

const vertexShader = /* glsl */ `
#include <common>
#include <clipping_planes_pars_vertex>
attribute float scalar;
attribute float label;
attribute vec3 displacement;
uniform float deformScale;
varying float vScalar;
varying float vLabel;
uniform vec4 flatNormal;
varying vec3 vNormalView;
void main() {
  vScalar = scalar;
  vLabel = label;
  vNormalView = flatNormal.w > 0.5 ? (viewMatrix * vec4(flatNormal.xyz, 0.0)).xyz : normalMatrix * normal;
  // The undeformed position decides clipping (material points); the drawn one is moved.
  vec4 mvPosition = modelViewMatrix * vec4(position, 1.0);
  gl_Position = projectionMatrix * modelViewMatrix * vec4(position + deformScale * displacement, 1.0);
  #include <clipping_planes_vertex>
}
`

const fragmentShader = /* glsl */ `
#include <clipping_planes_pars_fragment>
uniform sampler2D map;
uniform vec2 range;
uniform float highlight;
uniform vec3 neutral;
uniform float useLabel;
uniform float useScalar;
uniform float backNeutral;
varying float vScalar;
varying float vLabel;
varying vec3 vNormalView;
void main() {
  #include <clipping_planes_fragment>
  vec3 n = normalize(vNormalView);
  if (!gl_FrontFacing) {
    if (backNeutral > 0.5) {
      // Inside of the body, seen through the cut: neutral and dim.
      gl_FragColor = vec4(neutral * 0.55, 1.0);
      return;
    }
    n = -n;
  }
  // NaN compares false with everything; this form survives compilers that fold x != x.
  bool finite = (vScalar < 0.0 || vScalar > 0.0 || vScalar == 0.0) && abs(vScalar) < 3.0e38;
  vec3 base = neutral;
  if (useScalar > 0.5 && finite) {
    float span = range.y - range.x;
    float t = span > 0.0 ? clamp((vScalar - range.x) / span, 0.0, 1.0) : 0.5;
    // Sample the centres of the first and last texels at t = 0 and 1.
    base = texture2D(map, vec2((t * 255.0 + 0.5) / 256.0, 0.5)).rgb;
  }
  if (useLabel > 0.5 && highlight >= 0.0) {
    // Keep the patch's own colours readable and fade the rest towards neutral grey.
    if (abs(vLabel - highlight) >= 0.5) base = mix(base, neutral, 0.7);
  }
  vec3 l = normalize(vec3(0.25, 0.45, 1.0));
  float shade = 0.62 + 0.38 * max(dot(n, l), 0.0);
  gl_FragColor = vec4(base * shade, 1.0);
}
`

export function createScalarMaterial(map: Texture, clippingPlanes: Plane[]): ShaderMaterial & { uniforms: ScalarMaterialUniforms } {
  const uniforms: ScalarMaterialUniforms = {
    map: { value: map },
    range: { value: new Vector2(0, 1) },
    highlight: { value: -1 },
    neutral: { value: rawColour(NEUTRAL_SURFACE) },
    useLabel: { value: 1 },
    useScalar: { value: 1 },
    flatNormal: { value: new Vector4(0, 0, 1, 0) },
    backNeutral: { value: 1 },
    deformScale: { value: 0 },
  }
  const m = new ShaderMaterial({
    uniforms: uniforms as unknown as ShaderMaterial['uniforms'],
    vertexShader, fragmentShader,
    side: DoubleSide,
    clipping: true,
    clippingPlanes,
    toneMapped: false,
  })
  // A geometry without displacement reads zero (not another program's constant at that location).
  Object.assign(m.defaultAttributeValues, { displacement: [0, 0, 0] })
  // Pull the surface slightly back so the section fill and edges drawn on it win the depth test.
  m.polygonOffset = true
  m.polygonOffsetFactor = 1
  m.polygonOffsetUnits = 1
  return m as ShaderMaterial & { uniforms: ScalarMaterialUniforms }
}
