/**
 * Which of the surface's clusters (src/mechanics/surfaceClusters.ts, sent with the surface's
 * buffers: SurfaceBuffers.clusters) a pass must draw, as runs of consecutive
 * triangles. A cluster is left out only when none of its triangles could leave a pixel:
 * - `facing` +1 (a pass that culls back faces) and every triangle faces away from the camera, or
 *   −1 (a pass that culls front faces) and every triangle faces it. A triangle with unit normal n
 *   through a point p faces a camera at e when n·(e − p) > 0 (the sign is the same for every
 *   point of its plane, so this is the rasteriser's own test for a perspective view); for a
 *   parallel view along d it is n·d < 0. With the cluster's normals within angle α of the cone's
 *   axis a and its points within the sphere (c, r), and v = e − c at angle β from a:
 *   max n·(e − p) ≤ |v| cos(max(0, β − α)) + r and min n·(e − p) ≥ |v| cos(min(π, β + α)) − r,
 *   so all face away when the first is < 0 and all face the camera when the second is > 0;
 * - `plane` (nx, ny, nz, c) given and the whole sphere lies where n·x + c < 0, the side a
 *   clipping plane removes (the convention of three.js's clipping planes).
 * Both tests keep a margin (an angle of 1e-4 and a part in 10^6 of the distances), so rounding
 * can only keep a cluster, never drop a visible one. `shown` (one flag per cluster, or null for
 * all) leaves out hidden parts.
 *
 * Writes the runs to out (first triangle, triangle count; 2 per run, room for K runs needed) and
 * returns their number. O(clusters).
 */
/** Floats per cluster in `bounds` (the layout of src/mechanics/surfaceClusters.ts). */
const CLUSTER_STRIDE = 8

export interface ClusterView {
  /** The camera's position (perspective), or null for a parallel view along `direction`. */
  readonly eye: readonly number[] | null
  /** The viewing direction of a parallel view (unit). */
  readonly direction: readonly number[]
  /** +1: back faces are culled; −1: front faces are culled; 0: both sides are drawn. */
  readonly facing: number
  /** The kept side n·x + c ≥ 0 of a clipping plane, or null. */
  readonly plane: readonly number[] | null
}

const MARGIN_ANGLE = 1e-4, MARGIN = 1e-6

export function visibleClusterRuns(start: Int32Array, bounds: Float32Array, view: ClusterView, shown: Uint8Array | null, out: Int32Array): number {
  const K = start.length - 1
  const eye = view.eye, d = view.direction, facing = view.facing, plane = view.plane
  let runs = 0, open = -1
  for (let k = 0; k < K; k++) {
    const o = CLUSTER_STRIDE * k
    const keep = (shown === null || shown[k] !== 0) && onKeptSide(bounds, o, plane) && faces(bounds, o, eye, d, facing)
    if (keep) {
      if (open < 0) open = start[k]
      continue
    }
    if (open >= 0) { out[2 * runs] = open; out[2 * runs + 1] = start[k] - open; runs++; open = -1 }
  }
  if (open >= 0) { out[2 * runs] = open; out[2 * runs + 1] = start[K] - open; runs++ }
  return runs
}

function onKeptSide(b: Float32Array, o: number, plane: readonly number[] | null): boolean {
  if (!plane) return true
  const cx = b[o], cy = b[o + 1], cz = b[o + 2], r = b[o + 3]
  const s = plane[0] * cx + plane[1] * cy + plane[2] * cz + plane[3]
  const scale = Math.abs(plane[0] * cx) + Math.abs(plane[1] * cy) + Math.abs(plane[2] * cz) + Math.abs(plane[3]) + r
  return !(s + r + MARGIN * scale < 0)
}

/** False only when every triangle of the cluster is culled by the pass (header). */
function faces(b: Float32Array, o: number, eye: readonly number[] | null, d: readonly number[], facing: number): boolean {
  const cosA = b[o + 7]
  if (facing === 0 || !(cosA > 0)) return true
  const ax = b[o + 4], ay = b[o + 5], az = b[o + 6]
  let vx: number, vy: number, vz: number, L: number, r: number
  if (eye) {
    vx = eye[0] - b[o]; vy = eye[1] - b[o + 1]; vz = eye[2] - b[o + 2]
    L = Math.hypot(vx, vy, vz)
    r = b[o + 3]
    if (!(L > r)) return true // the camera inside the sphere
  } else {
    vx = -d[0]; vy = -d[1]; vz = -d[2]
    L = Math.hypot(vx, vy, vz)
    r = 0
    if (!(L > 0)) return true
  }
  const cosB = Math.max(-1, Math.min(1, (ax * vx + ay * vy + az * vz) / L))
  const beta = Math.acos(cosB), alpha = Math.acos(Math.min(1, cosA)) + MARGIN_ANGLE
  const pad = r + MARGIN * (L + r)
  if (facing > 0) return L * Math.cos(Math.max(0, beta - alpha)) + pad >= 0
  return L * Math.cos(Math.min(Math.PI, beta + alpha)) - pad <= 0
}
