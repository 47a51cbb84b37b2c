/**
 * Geometry of a line diagram for the review report: plot frame, "nice" ticks and polyline point
 * lists in pixel coordinates. Pure, so the report's SVG is built by DOM calls from numbers only.
 * Non-finite values break a line (a plane that misses the body leaves a gap).
 */
import { formatNumber } from './format.ts'

export interface DiagramLineInput {
  readonly label: string
  readonly colour: string
  readonly values: ArrayLike<number>
}

export interface DiagramGeometry {
  readonly width: number
  readonly height: number
  /** Plot area in pixels. */
  readonly plot: { readonly x: number; readonly y: number; readonly w: number; readonly h: number }
  /** Per line: runs of "x,y x,y ..." point lists. */
  readonly lines: readonly { readonly label: string; readonly colour: string; readonly runs: readonly string[] }[]
  readonly xTicks: readonly { readonly at: number; readonly label: string }[]
  readonly yTicks: readonly { readonly at: number; readonly label: string }[]
  /** Pixel y of value 0 when 0 lies inside the value range, else null. */
  readonly zeroY: number | null
}

/** Tick values on a 1-2-5 ladder covering [lo, hi] with about `target` steps. */
export function niceTicks(lo: number, hi: number, target = 5): number[] {
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return []
  if (hi < lo) [lo, hi] = [hi, lo]
  if (hi === lo) return [lo]
  // a range at round-off of its values has no steps that move a double: one tick
  if (hi - lo <= 1e-12 * Math.max(Math.abs(lo), Math.abs(hi))) return [lo]
  const raw = (hi - lo) / target
  const mag = 10 ** Math.floor(Math.log10(raw))
  // the 1-2-5 step whose count comes closest to the target
  let step = mag
  for (const f of [1, 2, 5, 10]) if (Math.abs((hi - lo) / (f * mag) - target) < Math.abs((hi - lo) / step - target)) step = f * mag
  const out: number[] = []
  for (let v = Math.ceil(lo / step - 1e-9) * step; v <= hi + step * 1e-9; v += step) out.push(Math.abs(v) < step * 1e-9 ? 0 : v)
  return out
}

export function diagramGeometry(
  x: ArrayLike<number>, lines: readonly DiagramLineInput[], width: number, height: number,
  margin = { left: 64, right: 12, top: 10, bottom: 28 },
  /** Horizontal range to show, when wider than the data's (e.g. the part's whole extent). */
  xDomain?: readonly [number, number],
  /** Vertical range to show, when wider than the data's (diagrams that share one scale). */
  yDomain?: readonly [number, number],
): DiagramGeometry {
  const plot = { x: margin.left, y: margin.top, w: width - margin.left - margin.right, h: height - margin.top - margin.bottom }
  let x0 = Infinity, x1 = -Infinity, y0 = Infinity, y1 = -Infinity
  for (let i = 0; i < x.length; i++) { if (x[i] < x0) x0 = x[i]; if (x[i] > x1) x1 = x[i] }
  for (const l of lines) {
    for (let i = 0; i < l.values.length; i++) {
      const v = l.values[i]
      if (Number.isFinite(v)) { if (v < y0) y0 = v; if (v > y1) y1 = v }
    }
  }
  if (xDomain && Number.isFinite(xDomain[0]) && Number.isFinite(xDomain[1])) { x0 = Math.min(x0, xDomain[0]); x1 = Math.max(x1, xDomain[1]) }
  if (yDomain && Number.isFinite(yDomain[0]) && Number.isFinite(yDomain[1])) { y0 = Math.min(y0, yDomain[0]); y1 = Math.max(y1, yDomain[1]) }
  if (!(x0 <= x1)) { x0 = 0; x1 = 1 }
  if (x0 === x1) { x0 -= 0.5; x1 += 0.5 }
  if (!(y0 <= y1)) { y0 = 0; y1 = 1 }
  // a flat line up to round-off (a constant axial force along a bar) is drawn flat, with room
  if (y1 - y0 <= 1e-9 * Math.max(Math.abs(y0), Math.abs(y1))) { const a = Math.max(Math.abs(y0), Math.abs(y1)) || 1; y0 -= 0.1 * a; y1 += 0.1 * a }
  const pad = 0.05 * (y1 - y0)
  y0 -= pad; y1 += pad
  const px = (v: number): number => plot.x + ((v - x0) / (x1 - x0)) * plot.w
  const py = (v: number): number => plot.y + (1 - (v - y0) / (y1 - y0)) * plot.h
  const r = (v: number): string => (Math.round(v * 10) / 10).toString()
  const out = lines.map((l) => {
    const runs: string[] = []
    let cur: string[] = []
    for (let i = 0; i < x.length; i++) {
      const v = l.values[i]
      if (!Number.isFinite(v) || !Number.isFinite(x[i])) { if (cur.length) runs.push(cur.join(' ')); cur = []; continue }
      cur.push(`${r(px(x[i]))},${r(py(v))}`)
    }
    if (cur.length) runs.push(cur.join(' '))
    return { label: l.label, colour: l.colour, runs }
  })
  return {
    width, height, plot, lines: out,
    xTicks: niceTicks(x0, x1).map((v) => ({ at: px(v), label: formatNumber(v, 3) })),
    yTicks: niceTicks(y0, y1).map((v) => ({ at: py(v), label: formatNumber(v, 3) })),
    zeroY: y0 < 0 && y1 > 0 ? py(0) : null,
  }
}
