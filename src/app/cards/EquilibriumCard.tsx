import { Card } from '../ui/Card.tsx'
import { Num, VecRow } from '../ui/Num.tsx'
import { useStore } from '../../state/store.ts'
import type { BalanceVerdictKind } from '../../../workers/protocol.ts'

/** The verdict's tag: what the residual most likely is. */
const VERDICT_LABEL: Record<BalanceVerdictKind, string> = { mesh: 'mesh error', model: 'model error', inconclusive: 'inconclusive' }

/** Whole-body balance, the spread of the element indicator and the traction left on free surface. */
export function EquilibriumCard() {
  const audit = useStore((s) => s.audit)
  const model = useStore((s) => s.model)
  if (!audit || !model) return null
  const b = audit.body
  const v = audit.verdict
  return (
    <Card id="equilibrium" title="Equilibrium">
      <table className="figures" data-testid="body-balance">
        <caption>Whole body: ∮ t dA + ∫ ρb dV</caption>
        <tbody>
          <VecRow label="Residual force" v={b.force} q="force" />
          <VecRow label="Residual moment" v={b.moment} q="moment" />
          <tr><th>Residual / gross load</th><td><Num v={b.relative} q={null} /></td></tr>
          <tr data-row="gross"><th>Gross load</th><td><Num v={b.gross} q="force" /></td></tr>
          <VecRow label="Body force total" v={b.bodyForceTotal} q="force" />
          <tr><th>Volume</th><td><Num v={b.volume} q="volume" /></td></tr>
          <VecRow label="Of it, free surface" v={audit.freeSurfaceForce} q="force" />
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
