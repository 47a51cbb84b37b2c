import { useState } from 'react'
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
import { download, fileStem } from '../exports.ts'
import { sweepCsv, sweepJson } from '../sweepExport.ts'
import { drawnSweepCases } from '../../state/sweepSlice.ts'
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
  const [countError, setCountError] = useState('')
  const [error, setError] = useState('')
  const axes = useStore((s) => s.sectionAxes)
  const picked = useStore((s) => s.sweepCases)
  const showSweepCase = useStore((s) => s.showSweepCase)

  if (!model) return null
  const run = async (): Promise<void> => {
    const n: Vec3 = direction === 'section' ? sectionPlaneOf(section).normal : AXIS[direction]
    useStore.getState().sweepStarted()
    setError('')
    // One choice of section axes (and one reference) for every section of the sweep.
    const out = await engine.sweep(n, count, undefined, undefined, axes)
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
  const drawn = drawnSweepCases(sweep, picked)
  const shownCase = model.shownCase ?? null
  const Lu = displayUnitLabel('length', system)
  const Lf = displayFactor(model.units, 'length', system)
  return (
    <Card id="sweep" title="Along the part">
      <div className="sweep-card">
        <div className="row">
          <span className="lbl">Along</span>
          <select value={direction} data-testid="sweep-direction" onChange={(e) => setDirection(e.target.value as Direction)}>
            <option value="section">the section normal</option>
            <option value="x">x</option>
            <option value="y">y</option>
            <option value="z">z</option>
          </select>
          <NumberField label="Sections" value={count} width={4} testId="sweep-count" invalid={!!countError}
            onCommit={(v) => {
              // Refused, not clamped: the field is marked and says what it takes.
              if (!Number.isInteger(v) || v < 2 || v > MAX_COUNT) { setCountError(`${formatNumber(v)} sections: give a whole number from 2 to ${MAX_COUNT} (the command line takes up to 100 000); ${count} kept.`); return }
              setCountError('')
              setCount(v)
            }} />
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
        {sweep?.cases ? (
          <div className="row sweep-cases" role="group" aria-label="Load cases to draw" data-testid="sweep-cases">
            <span className="lbl" title="Draw these load cases and combinations, one line each; none ticked: the case shown">Cases</span>
            {sweep.cases.cases.map((c) => (
              <label key={c.name} className="check" title={c.kind === 'combination' ? 'combination' : 'load case'}>
                <input type="checkbox" data-testid={`sweep-case-${c.name}`} checked={drawn.includes(c.name)} onChange={(e) => showSweepCase(c.name, e.target.checked)} />
                {c.kind === 'combination' ? <i>{c.name}</i> : c.name}
              </label>
            ))}
          </div>
        ) : null}
        {countError ? <p className="note bad" data-testid="sweep-count-error">{countError}</p> : null}
        {error ? <p className="note bad" data-testid="sweep-error">{error}</p> : null}
        {sweep ? (
          <>
            <p className="note">
              {sweep.offsets.length} sections along m = ({sweep.normal.map((v) => formatNumber(v, 3)).join(', ')}), end to end over x·m = {formatNumber(sweep.extent[0] * Lf)} … {formatNumber(sweep.extent[1] * Lf)} {Lu}.
              {' '}{sweep.axes.kind === 'principal' ? 'Principal axes per section' : 'Reference axes'}, one reference for all: ({sweep.axes.reference.map((v) => formatNumber(Math.abs(v) < 1e-12 ? 0 : v, 3)).join(', ')}); moments about each centroid.
            </p>
            <SweepChart sweep={sweep} units={model.units} system={system} shown={shown} cases={drawn} shownCase={shownCase} marker={marker} onPick={pick} />
            <p className="note" data-testid="sweep-trust">
              Free-body residual (force / gross, moment / (gross · L)), largest along the part: <span className="num" data-model={String(worstResidual(sweep))}>{formatNumber(worstResidual(sweep), 2)}</span>
              {section.enabled && marker === null ? ' · the section is not parallel to these planes; click the chart to align it.' : ''}
            </p>
            <div className="row">
              <button type="button" data-testid="export-sweep-csv" onClick={() => download(`${fileStem(model.name)}-sweep.csv`, sweepCsv(model, sweep, system, drawn, shownCase), 'text/csv')}>Sweep CSV</button>
              <button type="button" data-testid="export-sweep-json" onClick={() => download(`${fileStem(model.name)}-sweep.json`, sweepJson(model, sweep, system, drawn, shownCase), 'application/json')}>Sweep JSON</button>
              {sweep.cases ? <span className="note">{drawn.length ? `${drawn.length} case${drawn.length > 1 ? 's' : ''}` : 'the case shown'} and the envelope over {sweep.cases.combinationsOnly ? 'the combinations' : 'every case and combination'}</span> : null}
            </div>
          </>
        ) : <p className="note">Run to cut the part at evenly spaced planes from end to end.</p>}
      </div>
    </Card>
  )
}

