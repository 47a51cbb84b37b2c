/**
 * Line chart of the values along a line through the model (uPlot, as the sweep chart): stresses
 * on the left axis, the displacement on the right; points outside the body leave gaps. Hovering
 * reads the values at the nearest sample point.
 */
import { useEffect, useMemo, useRef, useState } from 'react'
import uPlot from 'uplot'
import 'uplot/dist/uPlot.min.css'
import type { ModelUnits, UnitSystem } from '../../model/units.ts'
import { displayFactor, displayUnitLabel } from '../../model/units.ts'
import type { LineReply } from '../../../workers/protocol.ts'
import type { LineSeries } from '../../state/lineSlice.ts'
import { formatNumber } from '../format.ts'
import { useBoxWidth } from './useBoxWidth.ts'
import { lineSeries, lineSeriesValues } from '../lineExport.ts'

export interface LineChartProps {
  readonly reply: LineReply
  readonly units: ModelUnits
  readonly system: UnitSystem
  readonly shown: Readonly<Record<LineSeries, boolean>>
}

const AXIS = { stroke: '#4a545e', grid: { stroke: '#e3e5e1', width: 1 }, ticks: { stroke: '#c9ccc8', width: 1 }, font: '11px system-ui, sans-serif' }

export function LineChart({ reply, units, system, shown }: LineChartProps) {
  const box = useRef<HTMLDivElement>(null)
  const [idx, setIdx] = useState<number | null>(null)
  const width = useBoxWidth(box)
  const defs = lineSeries(reply.axes).filter((d) => shown[d.key] && (d.key !== 'displacement' || reply.displacement))
  const shownKey = defs.map((d) => d.key).join(',')
  // Model-unit values of each shown series (NaN at gaps), once per reply: the chart and the read-out use them.
  const values = useMemo(() => defs.map((d) => lineSeriesValues(reply, d.key)), [reply, shownKey])
  const Lf = displayFactor(units, 'length', system)

  useEffect(() => {
    if (!box.current) return
    const x = Array.from(reply.distance, (d) => d * Lf)
    const ys = defs.map((d, i) => {
      const f = displayFactor(units, d.quantity, system)
      return Array.from(values[i], (v) => (Number.isFinite(v) ? v * f : null))
    })
    const hasS = defs.some((d) => d.quantity === 'stress'), hasU = defs.some((d) => d.quantity === 'length')
    const fmt = (_u: uPlot, vals: number[]): string[] => vals.map((v) => formatNumber(v, 3))
    const axes: uPlot.Axis[] = [{ ...AXIS, values: fmt, size: 44, label: `Distance from the start [${displayUnitLabel('length', system)}]`, labelSize: 14, labelFont: AXIS.font }]
    if (hasS || !hasU) axes.push({ ...AXIS, scale: 'S', label: `Stress [${displayUnitLabel('stress', system)}]`, labelSize: 16, size: 50, values: fmt, labelFont: AXIS.font })
    if (hasU) axes.push({ ...AXIS, scale: 'U', side: hasS ? 1 : 3, label: `Displacement [${displayUnitLabel('length', system)}]`, labelSize: 16, size: 56, values: fmt, labelFont: AXIS.font, grid: { show: !hasS } })
    const plot = new uPlot({
      width, height: 200, legend: { show: false },
      cursor: { y: false, drag: { x: false, y: false, setScale: false }, points: { size: 6 } },
      scales: { x: { time: false }, S: { auto: true }, U: { auto: true } },
      axes,
      series: [{ label: 'Distance' }, ...defs.map((d) => ({ label: d.symbol, scale: d.quantity === 'length' ? 'U' : 'S', stroke: d.colour, width: 1.6, points: { show: false } }))],
      hooks: { setCursor: [(u) => setIdx(u.cursor.idx ?? null)] },
    }, [x, ...ys] as uPlot.AlignedData, box.current)
    return () => plot.destroy()
    // `defs` follows from shownKey and the reply's axes.
  }, [reply, units, system, shownKey, width, Lf, values])

  const k = idx !== null && idx >= 0 && idx < reply.held.length ? idx : null
  const L = displayUnitLabel('length', system)
  return (
    <div className="line-chart">
      <div ref={box} data-testid="line-chart" />
      <div className="sweep-readout" data-testid="line-readout" aria-live="polite">
        {k === null ? <span className="note">Hover to read the values at a point.</span> : (
          <>
            <span data-readout="distance">s = {formatNumber(reply.distance[k] * Lf)} <span className="unit">{L}</span></span>
            {!reply.held[k] ? <span className="note">outside the body</span> : defs.map((d, i) => (
              <span key={d.key} data-readout={d.key} style={{ color: d.colour }}>
                {d.symbol} = {formatNumber(values[i][k] * displayFactor(units, d.quantity, system))} <span className="unit">{displayUnitLabel(d.quantity, system)}</span>
              </span>
            ))}
          </>
        )}
      </div>
    </div>
  )
}
