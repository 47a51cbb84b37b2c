/**
 * Line chart of a sweep (uPlot: canvas drawing, no inline script, styles set through the CSSOM).
 * Forces on the left axis, moments on the right; a thin second plot under it shows the free-body
 * residual / gross on a log axis, its cursor tied to the first. A vertical line marks the live
 * section; a click reports the position under the pointer (model length units).
 */
import { useEffect, useRef, useState } from 'react'
import uPlot from 'uplot'
import 'uplot/dist/uPlot.min.css'
import type { ModelUnits, UnitSystem } from '../../model/units.ts'
import { displayFactor, displayUnitLabel } from '../../model/units.ts'
import type { SeriesKey, SweepReply } from '../../../workers/protocol.ts'
import { denoise, formatNumber, noiseFloor } from '../format.ts'
import { useBoxWidth } from './useBoxWidth.ts'
import { caseLegendColour, caseLineStyle, caseSeriesInDisplay, offsetsInDisplay, SERIES, seriesInDisplay, zeroAlignedRanges } from '../sweepSeries.ts'
import type { SeriesInfo } from '../sweepSeries.ts'

export interface SweepChartProps {
  readonly sweep: SweepReply
  readonly units: ModelUnits
  readonly system: UnitSystem
  readonly shown: Readonly<Record<SeriesKey, boolean>>
  /** Load cases drawn, one line each per component (names of `sweep.cases`); empty: the case shown. */
  readonly cases?: readonly string[]
  /** The case shown (named in the legend of the free-body residual when several are drawn). */
  readonly shownCase?: string | null
  /** Live section position along the sweep direction (model length units), or null. */
  readonly marker: number | null
  readonly onPick: (position: number) => void
}

const MARKER = '#1d2329'
const AXIS = { stroke: '#4a545e', grid: { stroke: '#e3e5e1', width: 1 }, ticks: { stroke: '#c9ccc8', width: 1 }, font: '11px system-ui, sans-serif' }

/** Draws the section marker as a dashed vertical line inside the plot area. */
function markerPlugin(get: () => number | null): uPlot.Plugin {
  return {
    hooks: {
      draw: (u) => {
        const x = get()
        if (x === null) return
        const px = u.valToPos(x, 'x', true)
        const { left, top, width, height } = u.bbox
        if (!(px >= left - 0.5 && px <= left + width + 0.5)) return
        const g = u.ctx
        g.save()
        g.strokeStyle = MARKER
        g.lineWidth = Math.max(1, devicePixelRatio)
        g.setLineDash([4 * devicePixelRatio, 3 * devicePixelRatio])
        g.beginPath()
        g.moveTo(px, top)
        g.lineTo(px, top + height)
        g.stroke()
        g.restore()
      },
    },
  }
}

/** Smallest residual drawn; a free body that balances to round-off sits on this floor. */
const RESIDUAL_FLOOR = 1e-16

/** Whole exponents inside [min, max] (the residual plot draws log10 of the ratio), at most four. */
function decades(_u: uPlot, _axis: number, min: number, max: number): number[] {
  const out: number[] = []
  for (let e = Math.ceil(min - 1e-9); e <= Math.floor(max + 1e-9); e++) out.push(e)
  if (out.length === 0) return [Math.round((min + max) / 2)]
  const step = Math.ceil(out.length / 4)
  return out.filter((_, i) => (out.length - 1 - i) % step === 0)
}

/** One line of the main plot: a component of the case shown, or of one of the drawn cases. */
interface Line {
  readonly s: SeriesInfo
  /** The case, or null for the case shown (the sweep's own figures). */
  readonly name: string | null
  readonly colour: string
  readonly dash: readonly number[]
}

/** SVG dash attribute of a uPlot dash pattern (empty: solid). */
const dashAttr = (d: readonly number[]): string | undefined => (d.length ? d.join(' ') : undefined)

export function SweepChart({ sweep, units, system, shown, cases = [], shownCase = null, marker, onPick }: SweepChartProps) {
  const box = useRef<HTMLDivElement>(null)
  const resBox = useRef<HTMLDivElement>(null)
  const plots = useRef<uPlot[]>([])
  const markerRef = useRef<number | null>(null)
  const pickRef = useRef(onPick)
  const [idx, setIdx] = useState<number | null>(null)
  const width = useBoxWidth(box)
  pickRef.current = onPick
  const Lf = displayFactor(units, 'length', system)
  markerRef.current = marker === null ? null : marker * Lf

  const keys = SERIES.filter((s) => shown[s.key])
  const drawn = sweep.cases ? cases.filter((n) => sweep.cases!.cases.some((c) => c.name === n)) : []
  const one = keys.length === 1
  const lines: Line[] = drawn.length
    ? drawn.flatMap((name, ci) => keys.map((s) => ({ s, name, ...caseLineStyle(ci, one, s.colour) })))
    : keys.map((s) => ({ s, name: null, colour: s.colour, dash: [] }))
  const shownKey = keys.map((s) => s.key).join(',') + '|' + drawn.join('\u0000')

  useEffect(() => {
    if (!box.current || !resBox.current) return
    const x = Array.from(offsetsInDisplay(sweep, units, system))
    const empty = sweep.empty
    const ys = lines.map((l) => Array.from(l.name === null ? seriesInDisplay(sweep, l.s.key, units, system) : caseSeriesInDisplay(sweep, l.name, l.s.key, units, system), (v, k) => (empty[k] ? null : v)))
    const hasF = keys.some((s) => s.quantity === 'force'), hasM = keys.some((s) => s.quantity === 'moment')
    const Fu = displayUnitLabel('force', system), Mu = displayUnitLabel('moment', system), Lu = displayUnitLabel('length', system)
    const fmtTick = (_u: uPlot, vals: number[]): string[] => vals.map((v) => formatNumber(v, 3))
    const sync = uPlot.sync('tractus-sweep')
    const cursor: uPlot.Cursor = { y: false, drag: { x: false, y: false, setScale: false }, sync: { key: sync.key }, points: { size: 6 } }
    const axes: uPlot.Axis[] = [{ ...AXIS, values: fmtTick, size: 34 }]
    if (hasF || !hasM) axes.push({ ...AXIS, scale: 'F', label: `Force [${Fu}]`, labelSize: 16, size: 46, values: fmtTick, labelFont: AXIS.font })
    if (hasM) axes.push({ ...AXIS, scale: 'M', side: hasF ? 1 : 3, label: `Moment [${Mu}]`, labelSize: 16, size: 46, values: fmtTick, labelFont: AXIS.font, grid: { show: !hasF } })
    // Force and moment axes share their zero line (see zeroAlignedRanges).
    const extentOf = (q: 'force' | 'moment'): [number, number] => {
      let lo = Infinity, hi = -Infinity
      lines.forEach(({ s }, i) => {
        if (s.quantity !== q) return
        for (const v of ys[i]) if (v !== null) { if (v < lo) lo = v; if (v > hi) hi = v }
      })
      return [lo, hi]
    }
    // The part's whole extent, so the ends of the part are the ends of the axis.
    const xr: [number, number] = [Math.min(sweep.extent[0] * Lf, x[0]), Math.max(sweep.extent[1] * Lf, x[x.length - 1])]
    const xScale: uPlot.Scale = { time: false, auto: false, range: () => (xr[0] < xr[1] ? xr : [xr[0] - 1, xr[1] + 1]) }
    const aligned = hasF && hasM ? zeroAlignedRanges([extentOf('force'), extentOf('moment')]) : null
    const main = new uPlot({
      width, height: 190, legend: { show: false }, cursor,
      scales: {
        x: xScale,
        F: aligned ? { auto: false, range: () => aligned[0] } : { auto: true },
        M: aligned ? { auto: false, range: () => aligned[1] } : { auto: true },
      },
      axes,
      series: [{ label: `Position [${Lu}]` }, ...lines.map((l) => ({ label: l.name === null ? l.s.symbol : `${l.name} ${l.s.symbol}`, scale: l.s.quantity === 'force' ? 'F' : 'M', stroke: l.colour, width: 1.6, dash: [...l.dash], points: { show: false } }))],
      plugins: [markerPlugin(() => markerRef.current)],
      hooks: { setCursor: [(u) => setIdx(u.cursor.idx ?? null)] },
    }, [x, ...ys] as uPlot.AlignedData, box.current)
    // log10 on a linear scale: the ticks stay whole decades however narrow the range
    const logOf = (a: Float64Array) => Array.from(a, (v, k) => (empty[k] ? null : Math.log10(Math.max(v, RESIDUAL_FLOOR))))
    const res = logOf(sweep.freeBodyRelative), resM = logOf(sweep.freeBodyMomentRelative)
    const resid = new uPlot({
      width, height: 80, legend: { show: false }, cursor,
      scales: { x: xScale, r: { auto: true, range: (_u, lo, hi) => [Math.floor(lo), Math.max(Math.ceil(hi), Math.floor(lo) + 1)] } },
      axes: [{ ...AXIS, size: 28, values: fmtTick }, { ...AXIS, scale: 'r', size: 62, splits: decades, values: (_u, vals) => vals.map((v) => formatNumber(10 ** v, 1)) }],
      series: [{}, { label: 'force residual', scale: 'r', stroke: '#4a545e', width: 1.2, points: { show: false } },
        { label: 'moment residual', scale: 'r', stroke: '#9a6a2a', width: 1.2, dash: [4, 3], points: { show: false } }],
      plugins: [markerPlugin(() => markerRef.current)],
      hooks: { setCursor: [(u) => setIdx(u.cursor.idx ?? null)] },
    }, [x, res, resM] as uPlot.AlignedData, resBox.current)
    plots.current = [main, resid]
    const onClick = (u: uPlot) => (e: MouseEvent): void => {
      const v = u.posToVal(e.offsetX, 'x')
      if (Number.isFinite(v)) pickRef.current(v / Lf)
    }
    const clickMain = onClick(main), clickRes = onClick(resid)
    main.over.addEventListener('click', clickMain)
    resid.over.addEventListener('click', clickRes)
    return () => {
      main.over.removeEventListener('click', clickMain)
      resid.over.removeEventListener('click', clickRes)
      main.destroy()
      resid.destroy()
      plots.current = []
    }
    // `keys` and `lines` follow from shownKey, so they are not dependencies of their own
  }, [sweep, units, system, shownKey, width, Lf])

  // The marker moves without rebuilding the plots.
  useEffect(() => { for (const p of plots.current) p.redraw(false) }, [marker, Lf])

  const k = idx !== null && idx >= 0 && idx < sweep.offsets.length ? idx : null
  // The read-out is one row of a table: forces judged against forces, moments against moments.
  const floorOf = (q: 'force' | 'moment', at: number): number => noiseFloor(SERIES.filter((x) => x.quantity === q).map((x) => sweep[x.key][at]))
  return (
    <div className="sweep-chart">
      <div ref={box} data-testid="sweep-chart" />
      {drawn.length ? (
        <ul className="sweep-legend" data-testid="sweep-legend" aria-label="Load cases drawn">
          {drawn.map((name, ci) => (
            <li key={name} data-case={name}>
              <svg width="26" height="8" aria-hidden><line x1="1" y1="4" x2="25" y2="4" stroke={caseLegendColour(ci, one)} strokeWidth="2" strokeDasharray={dashAttr(caseLineStyle(ci, one, '').dash)} /></svg>
              {name}
            </li>
          ))}
          {one ? null : <li className="note">colour: the component</li>}
        </ul>
      ) : null}
      <div className="sweep-res-title">Free-body residual{drawn.length && shownCase ? ` of the case shown (${shownCase})` : ''}, log scale: force / gross load (solid), moment / (gross load · L) (dashed)</div>
      <div ref={resBox} data-testid="sweep-residual" />
      <div className="sweep-readout" data-testid="sweep-readout" aria-live="polite">
        {k === null ? <span className="note">Hover to read values; click to move the section there.</span> : (
          <>
            <span data-readout="position">x·m = {formatNumber(sweep.offsets[k] * Lf)} <span className="unit">{displayUnitLabel('length', system)}</span></span>
            {sweep.empty[k] ? <span className="note">misses the body</span> : drawn.length ? drawn.map((name) => (
              <span key={name} data-readout-case={name} className="sweep-readout-case">
                <b>{name}</b>{keys.map((s) => {
                  const c = sweep.cases!.cases.find((x) => x.name === name)!
                  // judged against the family's values of every drawn case at this section
                  const floor = noiseFloor(drawn.flatMap((n) => { const d = sweep.cases!.cases.find((x) => x.name === n)!; return SERIES.filter((x) => x.quantity === s.quantity).map((x) => d[x.key][k]) }))
                  return (
                    <span key={s.key} data-readout={s.key} style={{ color: one ? undefined : s.colour }}>
                      {' '}{s.symbol} = {formatNumber(denoise(c[s.key][k], floor) * displayFactor(units, s.quantity, system))} <span className="unit">{displayUnitLabel(s.quantity, system)}</span>
                    </span>
                  )
                })}
              </span>
            )) : keys.map((s) => (
              <span key={s.key} data-readout={s.key} style={{ color: s.colour }}>
                {s.symbol} = {formatNumber(denoise(sweep[s.key][k], floorOf(s.quantity, k)) * displayFactor(units, s.quantity, system))} <span className="unit">{displayUnitLabel(s.quantity, system)}</span>
              </span>
            ))}
            {sweep.empty[k] ? null : <span data-readout="residual">{drawn.length && shownCase ? `residual of ${shownCase}` : 'residual'} {formatNumber(sweep.freeBodyRelative[k], 2)} (force), {formatNumber(sweep.freeBodyMomentRelative[k], 2)} (moment)</span>}
          </>
        )}
      </div>
    </div>
  )
}
