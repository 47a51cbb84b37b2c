import { useEffect, useRef, useState } from 'react'
import type { Vec3 } from '../../model/model.ts'
import { displayFactor, displayUnitLabel } from '../../model/units.ts'
import { Card } from '../ui/Card.tsx'
import { NumberField } from '../ui/NumberField.tsx'
import { SweepChart } from '../ui/SweepChart.tsx'
import { engine } from '../engine.ts'
import { formatNumber } from '../format.ts'
import { sectionPlaneOf } from '../../state/selectors.ts'
import { useStore } from '../../state/store.ts'
import { offsetForPosition, positionAlong, SERIES, worstResidual } from '../sweepSeries.ts'
import './sweepCard.css'

type Direction = 'section' | 'x' | 'y' | 'z'

const AXIS: Record<Exclude<Direction, 'section'>, Vec3> = { x: [1, 0, 0], y: [0, 1, 0], z: [0, 0, 1] }

/** Largest section count offered in the app (the worker accepts more; the chart gains nothing). */
const MAX_COUNT = 2000

/**
 * "Along the part": parallel sections from one end of the part to the other, the six section
 * quantities as diagrams, the live section marked on them, a click moves the section there.
 */
export function SweepCard() {
  const model = useStore((s) => s.model)
  const system = useStore((s) => s.units)
  const section = useStore((s) => s.section)
  const sweep = useStore((s) => s.sweep)
  const shown = useStore((s) => s.sweepShown)
  const running = useStore((s) => s.sweepRunning)
  const showSweepSeries = useStore((s) => s.showSweepSeries)
  const [direction, setDirection] = useState<Direction>('section')
  const [count, setCount] = useState(100)
  const [wide, setWide] = useState(false)
  const [error, setError] = useState('')
  const root = useRef<HTMLDivElement>(null)

  // The wider layout widens the whole card column while this card asks for it.
  useEffect(() => {
    const col = root.current?.closest('.cards')
    col?.classList.toggle('wide', wide)
    return () => { col?.classList.remove('wide') }
  }, [wide, model])

  if (!model) return null
  const run = async (): Promise<void> => {
    const n: Vec3 = direction === 'section' ? sectionPlaneOf(section).normal : AXIS[direction]
    useStore.getState().sweepStarted()
    setError('')
    const out = await engine.sweep(n, count)
    useStore.getState().sweepEnded(out?.ok ? out.value : null)
    if (out && !out.ok) setError(out.error.message)
  }
  const plane = sectionPlaneOf(section)
  const marker = sweep && section.enabled ? positionAlong(plane.point, plane.normal, sweep.normal) : null
  const pick = (position: number): void => {
    if (!sweep) return
    const st = useStore.getState()
    st.setSection({ enabled: true, normal: [...sweep.normal] as Vec3, offset: offsetForPosition(position, st.section.point, sweep.normal) })
  }
  const Lu = displayUnitLabel('length', system)
  const Lf = displayFactor(model.units, 'length', system)
  return (
    <Card id="sweep" title="Along the part">
      <div ref={root} className="sweep-card">
        <div className="row">
          <span className="lbl">Along</span>
          <select value={direction} data-testid="sweep-direction" onChange={(e) => setDirection(e.target.value as Direction)}>
            <option value="section">the section normal</option>
            <option value="x">x</option>
            <option value="y">y</option>
            <option value="z">z</option>
          </select>
          <NumberField label="Sections" value={count} width={4} testId="sweep-count"
            onCommit={(v) => setCount(Math.min(MAX_COUNT, Math.max(2, Math.round(v))))} />
          <button type="button" data-testid="sweep-run" disabled={running} onClick={() => void run()}>{running ? 'Running…' : 'Run'}</button>
        </div>
        <div className="row sweep-pick" role="group" aria-label="Quantities to plot">
          {SERIES.map((s) => (
            <label key={s.key} className="check" title={s.label}>
              <input type="checkbox" data-testid={`sweep-show-${s.key}`} checked={shown[s.key]} onChange={(e) => showSweepSeries(s.key, e.target.checked)} />
              <span className="swatch" style={{ background: s.colour }} aria-hidden />{s.symbol}
            </label>
          ))}
        </div>
        {error ? <p className="note bad" data-testid="sweep-error">{error}</p> : null}
        {sweep ? (
          <>
            <p className="note">
              {sweep.offsets.length} sections along m = ({sweep.normal.map((v) => formatNumber(v, 3)).join(', ')}), end to end over x·m = {formatNumber(sweep.extent[0] * Lf)} … {formatNumber(sweep.extent[1] * Lf)} {Lu}. Section axes per section, moments about each centroid.
            </p>
            <SweepChart sweep={sweep} units={model.units} system={system} shown={shown} marker={marker} onPick={pick} />
            <p className="note" data-testid="sweep-trust">
              Free-body residual (force / gross, moment / (gross · L)), largest along the part: <span className="num" data-model={String(worstResidual(sweep))}>{formatNumber(worstResidual(sweep), 2)}</span>
              {section.enabled && marker === null ? ' · the section is not parallel to these planes; click the chart to align it.' : ''}
            </p>
          </>
        ) : <p className="note">Run to cut the part at evenly spaced planes from end to end.</p>}
        <div className="row">
          <label className="check"><input type="checkbox" data-testid="sweep-wide" checked={wide} onChange={(e) => setWide(e.target.checked)} /> Wider cards</label>
        </div>
      </div>
    </Card>
  )
}

