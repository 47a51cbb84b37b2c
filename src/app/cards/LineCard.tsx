import { useState } from 'react'
import type { Vec3 } from '../../model/model.ts'
import { displayFactor, displayUnitLabel } from '../../model/units.ts'
import { Card } from '../ui/Card.tsx'
import { NumberField } from '../ui/NumberField.tsx'
import { LineChart } from '../ui/LineChart.tsx'
import { engine } from '../engine.ts'
import { download, fileStem } from '../exports.ts'
import { formatNumber } from '../format.ts'
import { frameNote, lineCsv, linearisationTables, lineSeries } from '../lineExport.ts'
import { useStore } from '../../state/store.ts'
import { MAX_APP_LINE_POINTS } from '../../state/lineSlice.ts'
import { LINEARISATION_CAUTION } from '../../mechanics/linearisation.ts'
import './lineCard.css'
import './sweepCard.css'


function EndFields({ which, value, factor, unit }: { which: 'from' | 'to'; value: Vec3 | null; factor: number; unit: string }) {
  const setLine = useStore((s) => s.setLine)
  const p = value ?? [0, 0, 0]
  const set = (k: number, v: number): void => {
    const q = [...p] as Vec3
    q[k] = v / factor
    setLine({ [which]: q })
  }
  return (
    <div className="row">
      <span className="lbl">{which === 'from' ? 'Start' : 'End'}</span>
      {(['x', 'y', 'z'] as const).map((a, k) => (
        <NumberField key={a} label={a} width={5} testId={`line-${which}-${a}`} value={value ? p[k] * factor : NaN} onCommit={(v) => set(k, v)} />
      ))}
      <span className="unit">{unit}</span>
    </div>
  )
}

/**
 * A straight line through the model: its ends typed or picked by two clicks on the surface or
 * the section, the values along it as a chart (with CSV), and the through-thickness
 * linearisation when its ends lie on the two surfaces of a wall.
 */
export function LineCard() {
  const model = useStore((s) => s.model)
  const system = useStore((s) => s.units)
  const line = useStore((s) => s.line)
  const picking = useStore((s) => s.linePicking)
  const reply = useStore((s) => s.lineResult)
  const running = useStore((s) => s.lineRunning)
  const error = useStore((s) => s.lineError)
  const shown = useStore((s) => s.lineSeries)
  const axes = useStore((s) => s.componentAxes)
  const [busyWall, setBusyWall] = useState(false)
  if (!model) return null
  const st = useStore.getState
  const Lf = displayFactor(model.units, 'length', system)
  const Lu = displayUnitLabel('length', system)
  const throughWall = async (): Promise<void> => {
    const { from, to } = st().line
    if (!from || !to) return
    setBusyWall(true)
    const w = await engine.runJob((calls) => calls.lineThroughWall(from, to))
    setBusyWall(false)
    if (w) st().setLine({ from: w.from, to: w.to })
    else st().lineEnded(null, 'No point of the line lies in the body, so there is no wall to reach.')
  }
  const exportCsv = (): void => {
    const r = st().lineResult, m = st().model
    if (r && m) download(`${fileStem(m.name)}-line.csv`, lineCsv(m, r, st().units), 'text/csv')
  }
  const l = reply?.linearisation ?? null
  const t = l ? linearisationTables(l, model.units, system) : null
  const defs = lineSeries(reply?.axes ?? axes).filter((d) => d.key !== 'displacement' || reply?.displacement)
  return (
    <Card id="line" title="Line through the model">
      <div className="row">
        {picking === 'off'
          ? <button type="button" data-testid="line-pick" onClick={() => st().startLinePick()}>Pick two points</button>
          : <button type="button" data-testid="line-pick-cancel" onClick={() => st().cancelLinePick()}>Stop picking</button>}
        <button type="button" data-testid="line-through-wall" disabled={!line.from || !line.to || busyWall} onClick={() => void throughWall()}
          title="Move the ends to where the line enters and leaves the material">Ends to the surfaces</button>
        <button type="button" data-testid="line-clear" disabled={!line.from && !line.to} onClick={() => st().clearLine()}>Clear</button>
      </div>
      {picking !== 'off' ? (
        <p className="note pick" data-testid="line-pick-hint">
          {picking === 'from' ? 'Click the start of the line on the surface or on the section face.' : 'Now click its end.'}
        </p>
      ) : null}
      <EndFields which="from" value={line.from} factor={Lf} unit={Lu} />
      <EndFields which="to" value={line.to} factor={Lf} unit={Lu} />
      <div className="row">
        <NumberField label="Points" width={4} testId="line-points" value={line.points}
          onCommit={(v) => st().setLine({ points: Math.min(MAX_APP_LINE_POINTS, Math.max(2, Math.round(v))) })} />
        <span className="lbl">Equivalent</span>
        <select value={line.criterion} data-testid="line-criterion" onChange={(e) => st().setLine({ criterion: e.target.value as 'vonMises' | 'tresca' })}>
          <option value="vonMises">von Mises</option>
          <option value="tresca">Tresca</option>
        </select>
        {running ? <span className="note">computing…</span> : null}
      </div>
      {error ? <p className="note bad" data-testid="line-error">{error}</p> : null}
      {reply && !reply.outside ? (
        <>
          <div className="row sweep-pick" role="group" aria-label="Values to plot">
            {defs.map((d) => (
              <label key={d.key} className="check" title={d.label}>
                <input type="checkbox" data-testid={`line-show-${d.key}`} checked={shown[d.key]} onChange={(e) => st().showLineSeries(d.key, e.target.checked)} />
                <span className="swatch" style={{ background: d.colour }} aria-hidden />{d.symbol}
              </label>
            ))}
          </div>
          <LineChart reply={reply} units={model.units} system={system} shown={shown} />
          <p className="note">
            {reply.held.length} points over {formatNumber(reply.length * Lf)} {Lu}
            {reply.held.some((h) => h === 0) ? '; gaps where the line is outside the body' : ''}
            {reply.axes.kind === 'cylindrical' ? '; components in cylindrical axes' : '; components in global axes'}.
          </p>
          <div className="row"><button type="button" data-testid="line-csv" onClick={exportCsv}>Export CSV</button></div>
        </>
      ) : null}
      {reply?.outside ? <p className="note bad" data-testid="line-outside">The line lies wholly outside the body: none of its points is in an element.</p> : null}
      {reply && !reply.outside ? (
        <section className="linearisation" data-testid="linearisation">
          <h4>Through-thickness linearisation</h4>
          {l && t ? (
            <>
              <p className="note">
                ASME BPVC Section VIII Div. 2, Part 5, Annex 5-A (EN 13445-3 Annex C is alike). Wall thickness along the line {t.thickness},
                integrated over {l.segments} element segments. Frame: {frameNote(l)}.
              </p>
              <table className="figures lin" data-testid="linearisation-equivalents">
                <caption>{t.criterion} equivalent stress [{t.unit}]</caption>
                <thead><tr><th /><th>at the start</th><th>at the end</th></tr></thead>
                <tbody>{t.equivalents.map(([n, a, b]) => <tr key={n} data-row={n}><th>{n}</th><td className="num">{a}</td><td className="num">{b}</td></tr>)}</tbody>
              </table>
              <table className="figures lin" data-testid="linearisation-components">
                <caption>Components in the line&apos;s frame [{t.unit}]; bending only for σ₂₂ and σ₃₃ (Annex 5-A), its negative at the end</caption>
                <thead><tr><th /><th>membrane</th><th>bending at start</th></tr></thead>
                <tbody>{t.components.map(([n, m, b]) => <tr key={n}><th>{n}</th><td className="num">{m}</td><td className="num">{b}</td></tr>)}</tbody>
              </table>
              <p className="note caution-note">{LINEARISATION_CAUTION}</p>
            </>
          ) : <p className="note" data-testid="linearisation-refused">Not linearised: {reply.refused}.</p>}
          {reply.warnings.length ? <ul className="note warnings" data-testid="line-warnings">{reply.warnings.map((w, i) => <li key={i}>{w}</li>)}</ul> : null}
        </section>
      ) : null}
      {!reply && !line.from ? <p className="note">Pick two points on the model (or type them) to read the stress along a straight line between them; with the ends on the two surfaces of a wall it is also split into membrane, bending and peak parts.</p> : null}
    </Card>
  )
}
