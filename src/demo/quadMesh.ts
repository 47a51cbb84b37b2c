/**
 * Plane quadrilateral meshes for the demo scenarios, meshed by our own code, and their extrusion
 * into hex8 slabs. A QuadMesh holds `xy` (2 per node) and `quads` (4 node indices per quad,
 * counter-clockwise seen from +z).
 */
export interface QuadMesh {
  readonly xy: Float64Array
  readonly quads: Int32Array
}

/**
 * Geometric grading of n steps over [0, 1] whose first step is `first` (a fraction of the
 * length): s_j = (q^j - 1)/(q^n - 1), with q found by bisection. Uniform when `first` ≥ 1/n.
 */
export function gradedSteps(n: number, first: number): Float64Array {
  const s = new Float64Array(n + 1)
  let q = 1
  if (first < 1 / n) {
    let lo = 1, hi = 2
    while ((hi - 1) / (hi ** n - 1) > first) hi *= 2
    for (let it = 0; it < 200; it++) {
      const mid = 0.5 * (lo + hi)
      if ((mid - 1) / (mid ** n - 1) > first) lo = mid
      else hi = mid
    }
    q = 0.5 * (lo + hi)
  }
  for (let j = 0; j <= n; j++) s[j] = q === 1 ? j / n : (q ** j - 1) / (q ** n - 1)
  s[n] = 1
  return s
}

/**
 * A ring of quads from a circular hole (centre cx, cy; radius a) out to a closed outline: the
 * hole is split into 8 sectors of 45°, each into m equal steps, and node k of the hole
 * (angle 2πk/8m from +x, counter-clockwise) is joined by a straight graded line to outline point
 * k, given by `outline(k)` for k = 0..8m-1. Nodes are numbered k + 8m·j (ring j = 0 on the hole,
 * j = nr on the outline). `firstStep` is the first radial step as a fraction of the shortest line.
 */
export function holeRing(cx: number, cy: number, a: number, m: number, nr: number, outline: (k: number) => [number, number], firstStep: number): QuadMesh {
  const nc = 8 * m
  const xy = new Float64Array(2 * nc * (nr + 1))
  const s = gradedSteps(nr, firstStep)
  for (let k = 0; k < nc; k++) {
    const th = (2 * Math.PI * k) / nc
    const x0 = cx + a * Math.cos(th), y0 = cy + a * Math.sin(th)
    const [x1, y1] = outline(k)
    for (let j = 0; j <= nr; j++) {
      const i = k + nc * j
      xy[2 * i] = x0 + (x1 - x0) * s[j]
      xy[2 * i + 1] = y0 + (y1 - y0) * s[j]
    }
  }
  const quads = new Int32Array(4 * nc * nr)
  let q = 0
  for (let j = 0; j < nr; j++) for (let k = 0; k < nc; k++) {
    const k1 = (k + 1) % nc
    // Radial then tangential (counter-clockwise) keeps the quad counter-clockwise seen from +z.
    quads[q++] = k + nc * j; quads[q++] = k + nc * (j + 1); quads[q++] = k1 + nc * (j + 1); quads[q++] = k1 + nc * j
  }
  return { xy, quads }
}

/**
 * Point k (0..8m-1) on the square of half-side h centred at (cx, cy), matching holeRing's sectors:
 * sector 0 runs from (h, 0) up to (h, h), sector 1 from (h, h) to (0, h), and so on round.
 */
export function squareOutline(cx: number, cy: number, h: number, m: number, k: number): [number, number] {
  const s = Math.floor(k / m), t = (k - s * m) / m
  switch (s) {
    case 0: return [cx + h, cy + h * t]
    case 1: return [cx + h * (1 - t), cy + h]
    case 2: return [cx - h * t, cy + h]
    case 3: return [cx - h, cy + h * (1 - t)]
    case 4: return [cx - h, cy - h * t]
    case 5: return [cx - h + h * t, cy - h]
    case 6: return [cx + h * t, cy - h]
    default: return [cx + h, cy - h + h * t]
  }
}

/** Joins plane meshes, merging nodes that coincide within `tol`. */
export function mergeQuadMeshes(parts: readonly QuadMesh[], tol: number): QuadMesh {
  const xy: number[] = []
  const quads: number[] = []
  const grid = new Map<string, number[]>()
  const cell = tol * 4
  const find = (x: number, y: number): number => {
    const gx = Math.floor(x / cell), gy = Math.floor(y / cell)
    for (let dx = -1; dx <= 1; dx++) for (let dy = -1; dy <= 1; dy++) {
      const list = grid.get(`${gx + dx},${gy + dy}`)
      if (list) for (const i of list) if (Math.abs(xy[2 * i] - x) <= tol && Math.abs(xy[2 * i + 1] - y) <= tol) return i
    }
    const i = xy.length / 2
    xy.push(x, y)
    const key = `${gx},${gy}`
    const list = grid.get(key)
    if (list) list.push(i)
    else grid.set(key, [i])
    return i
  }
  for (const p of parts) {
    const map = new Int32Array(p.xy.length / 2)
    for (let i = 0; i < map.length; i++) map[i] = find(p.xy[2 * i], p.xy[2 * i + 1])
    for (let i = 0; i < p.quads.length; i++) quads.push(map[p.quads[i]])
  }
  return { xy: Float64Array.from(xy), quads: Int32Array.from(quads) }
}

/**
 * Extrudes a plane quad mesh through z ∈ [0, thickness] in `layers` equal layers into hex8
 * elements (bottom quad counter-clockwise seen from +z, then the top one: elementTypes.ts order).
 * Node index = plane node + planeNodes·layer.
 */
export function extrudeQuads(mesh: QuadMesh, thickness: number, layers: number): { coords: Float64Array; conn: Int32Array } {
  const n2 = mesh.xy.length / 2, q2 = mesh.quads.length / 4
  const coords = new Float64Array(3 * n2 * (layers + 1))
  for (let l = 0; l <= layers; l++) for (let i = 0; i < n2; i++) {
    const o = 3 * (i + n2 * l)
    coords[o] = mesh.xy[2 * i]; coords[o + 1] = mesh.xy[2 * i + 1]; coords[o + 2] = (thickness * l) / layers
  }
  const conn = new Int32Array(8 * q2 * layers)
  let e = 0
  for (let l = 0; l < layers; l++) for (let q = 0; q < q2; q++) {
    for (let c = 0; c < 4; c++) {
      conn[8 * e + c] = mesh.quads[4 * q + c] + n2 * l
      conn[8 * e + 4 + c] = mesh.quads[4 * q + c] + n2 * (l + 1)
    }
    e++
  }
  return { coords, conn }
}

/** Smallest signed area of the quads (positive for a valid counter-clockwise mesh). */
export function minQuadArea(mesh: QuadMesh): number {
  let min = Infinity
  const { xy, quads } = mesh
  for (let q = 0; q < quads.length; q += 4) {
    let a = 0
    for (let c = 0; c < 4; c++) {
      const i = quads[q + c], j = quads[q + ((c + 1) % 4)]
      a += xy[2 * i] * xy[2 * j + 1] - xy[2 * j] * xy[2 * i + 1]
    }
    min = Math.min(min, a / 2)
  }
  return min
}
