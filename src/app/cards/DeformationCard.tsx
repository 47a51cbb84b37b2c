import { displayFactor, displayUnitLabel } from '../../model/units.ts'
import { Card } from '../ui/Card.tsx'
import { NumberField } from '../ui/NumberField.tsx'
import { formatNumber } from '../format.ts'
import { deformScaleOf } from '../../state/selectors.ts'
import { useStore } from '../../state/store.ts'

/**
 * The deformed shape: on or off, the scale (automatic: the largest displacement drawn as 5 % of
 * the model's diagonal; or typed), the undeformed outline. Only the picture moves: every figure
 * stays on the undeformed geometry.
 */
export function DeformationCard() {
  const model = useStore((s) => s.model)
  const system = useStore((s) => s.units)
  const d = useStore((s) => s.deformation)
  const buffers = useStore((s) => s.deformationBuffers)
  const scale = useStore(deformScaleOf)
  const setDeformation = useStore((s) => s.setDeformation)
  if (!model) return null
  if (!buffers) {
    return (
      <Card id="deformation" title="Deformed shape" open={false}>
        <p className="note" data-testid="deformation-none">This model carries no displacement, so there is no deformed shape to draw.</p>
      </Card>
    )
  }
  const Lf = displayFactor(model.units, 'length', system), Lu = displayUnitLabel('length', system)
  const auto = d.scale === 'auto'
  return (
    <Card id="deformation" title="Deformed shape">
      <div className="row">
        <label className="check"><input type="checkbox" data-testid="deformation-shown" checked={d.shown} onChange={(e) => setDeformation({ shown: e.target.checked })} /> Show the deformed shape</label>
        <label className="check"><input type="checkbox" data-testid="deformation-outline" checked={d.outline} disabled={!d.shown} onChange={(e) => setDeformation({ outline: e.target.checked })} /> Undeformed outline</label>
      </div>
      <div className="row">
        <label className="check"><input type="checkbox" data-testid="deformation-auto" checked={auto} onChange={(e) => setDeformation({ scale: e.target.checked ? 'auto' : Number((scale || 1).toPrecision(3)) })} /> Automatic scale</label>
        {auto
          ? <span className="num" data-testid="deformation-factor" data-model={String(scale)}>×{formatNumber(scale, 3)}</span>
          : <NumberField label="×" width={6} testId="deformation-scale" value={typeof d.scale === 'number' ? d.scale : scale} onCommit={(v) => { if (v >= 0) setDeformation({ scale: v }) }} />}
      </div>
      <p className="note">
        Largest displacement <span className="num" data-testid="deformation-max" data-model={String(buffers.max)}>{formatNumber(buffers.max * Lf)} {Lu}</span>
        {d.shown ? `, drawn ${formatNumber(scale, 3)} times larger` : ''}. The automatic scale draws it as 5 % of the model&apos;s diagonal.
      </p>
      <p className="note">Only the picture moves: every figure is computed on the undeformed geometry (small-deformation theory).</p>
    </Card>
  )
}
