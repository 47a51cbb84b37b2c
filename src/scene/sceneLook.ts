/**
 * The scene's few colours and proportions in one place, so the canvas, the snapshot and the
 * handle agree. Colours are sRGB hex; every scene material writes them to the screen unchanged
 * (the renderer does no colour-space conversion, see SceneCanvas), so what is written here is
 * what is seen and what a snapshot reads back.
 */
export const BACKGROUND = '#e6e6e3'
/** Surface where a value is missing (NaN), and the back of the surface seen through a cut. */
export const NEUTRAL_SURFACE = '#b9b9b4'
/** Section handle (SectionHandle.tsx): the tab, the tab under the pointer, its rim, the rail and leader. */
export const HANDLE = '#2f4f6f'
export const HANDLE_HOVER = '#52789e'
export const HANDLE_RIM = '#f4f4f1'
export const HANDLE_RAIL = '#8a96a1'
/** Section axes triad at the centroid (SectionTriad.tsx): e1, e2 and the normal, with a pale halo. */
export const TRIAD_E1 = '#8c4a00'
export const TRIAD_E2 = '#1e6b40'
export const TRIAD_N = '#3d3f42'
export const HALO = '#f4f4f1'
/** The scale arrow of the arrow fields and the least balanced element's marker. */
export const SCALE_ARROW = '#26282b'
export const MARKER = '#8e1a5a'
/** The probe's dot. */
export const PROBE = '#d06a12'
/** Arrows when coloured with one colour. */
export const ARROW_SINGLE = '#26282b'
/** Thin feature edges. */
export const EDGE = '#3d3f42'
/** Drawn arrow length at scale 1 for the largest magnitude, as a fraction of the model diagonal. */
export const ARROW_LENGTH_FRACTION = 0.08
/** A line through the model and its end points. */
export const LINE = '#b0226a'
/** Extremes markers: the largest and the smallest value of the shown quantity. */
export const EXTREME_MAX = '#c2410c'
export const EXTREME_MIN = '#1d4ed8'
/** Assemblies: the highlighted region of a cut (and its number), and the interfaces between parts. */
export const REGION = '#e0590b'
export const INTERFACE = '#7b2cbf'
