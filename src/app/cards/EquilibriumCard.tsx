import { Card } from '../ui/Card.tsx'
import { Num, Vec, VecRow } from '../ui/Num.tsx'
import { noiseFloor } from '../format.ts'
import { modelSphere } from '../../state/selectors.ts'
import { useStore } from '../../state/store.ts'
import type { BalanceVerdictKind } from '../../../workers/protocol.ts'

/** The verdict's tag: what the residual most likely is. */
const VERDICT_LABEL: Record<BalanceVerdictKind, string> = { mesh: 'mesh error', model: 'model error', inconclusive: 'inconclusive' }

/**
 * Whole-body balance (with the point its residual moment is taken about), the spread of the
 * element indicator with the least balanced elements (click one to see it), and the traction left
 * on the free surface.
 */
export function EquilibriumCard() {
  const audit = useStore((s) => s.audit)
  const model = useStore((s) => s.model)
  const marked = useStore((s) => s.markedElement)
  const markElement = useStore((s) => s.markElement)
  const requestView = useStore((s) => s.requestView)
  if (!audit || !model) return null
  const b = audit.body
  const v = audit.verdict
  // One table: forces with forces, moments with moments, points against the model's size.
  const fFloor = noiseFloor([...b.force, ...b.bodyForceTotal, ...audit.freeSurfaceForce], b.gross)
  const mFloor = noiseFloor(b.moment)
  const size = modelSphere(model.bounds).diagonal
  return (
    <Card id="equilibrium" title="Equilibrium">
      <table className="figures" data-testid="body-balance">
        <caption>Whole body: ∮ t dA + ∫ ρb dV</caption>
        <tbody>
          <VecRow label="Residual force" v={b.force} q="force" floor={fFloor} />
          <VecRow label="Residual moment" v={b.moment} q="moment" floor={mFloor} testId="moment" />
          <tr className="vlabel"><th colSpan={2}>about the volume centroid</th></tr>
          <tr className="vvalue" data-row="about"><td colSpan={2}><Vec v={b.about} q="length" floor={1e-6 * size} /></td></tr>
          <tr><th>Residual / gross load</th><td><Num v={b.relative} q={null} /></td></tr>
          <tr data-row="gross"><th>Gross load</th><td><Num v={b.gross} q="force" /></td></tr>
          <VecRow label="Body force total" v={b.bodyForceTotal} q="force" floor={fFloor} />
          <tr><th>Volume</th><td><Num v={b.volume} q="volume" /></td></tr>
          <VecRow label="Of the residual, free surface" v={audit.freeSurfaceForce} q="force" floor={fFloor} />
        </tbody>
      </table>
      <p className={'verdict ' + v.kind} data-testid="balance-verdict" data-kind={v.kind}>
        <span className="tag">{VERDICT_LABEL[v.kind]}</span> {v.reason}
      </p>
      <table className="figures" data-testid="element-balance">
        <caption>Element indicator |residual| / gross</caption>
        <tbody>
          <tr><th>Median</th><td><Num v={audit.indicator.p50} q={null} /></td></tr>
          <tr><th>95th percentile</th><td><Num v={audit.indicator.p95} q={null} /></td></tr>
          <tr><th>Largest</th><td><Num v={audit.indicator.max} q={null} /></td></tr>
        </tbody>
      </table>
      {audit.leastBalanced.length ? (
        <table className="figures list" data-testid="least-balanced">
          <caption>Least balanced elements (click to show one)</caption>
          <thead><tr><th>Element</th><th>Indicator</th><th /></tr></thead>
          <tbody>
            {audit.leastBalanced.map((e) => {
              const on = marked?.id === e.id
              const show = (): void => {
                markElement(on ? null : { id: e.id, centre: e.centre, radius: e.radius })
                if (!on) requestView({ frame: { center: e.centre, radius: Math.max(10 * e.radius, 0.12 * size) } })
              }
              return (
                <tr key={e.id} className={on ? 'sel' : ''} data-element={e.id} onClick={show}>
                  <td className="num">{e.id}</td>
                  <td><Num v={e.indicator} q={null} /></td>
                  <td><button type="button" title={`Frame element ${e.id}`} onClick={(ev) => { ev.stopPropagation(); show() }}>{on ? 'Hide' : 'Frame'}</button></td>
                </tr>
              )
            })}
          </tbody>
        </table>
      ) : null}
      <table className="figures" data-testid="free-surface">
        <caption>Nominally free surface</caption>
        <tbody>
          <tr><th>Area</th><td><Num v={audit.freeSurface.area} q="area" /></td></tr>
          <tr><th>Mean |t|</th><td><Num v={audit.freeSurface.mean} q="stress" /></td></tr>
          <tr><th>Peak |t|</th><td><Num v={audit.freeSurface.peak} q="stress" /></td></tr>
          <tr><th>Mean / reference stress</th><td><Num v={audit.freeSurface.relative} q={null} /></td></tr>
        </tbody>
      </table>
    </Card>
  )
}
