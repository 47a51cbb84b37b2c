import { Card } from '../ui/Card.tsx'
import { Num, VecRow } from '../ui/Num.tsx'
import { componentSymbols, displacementSymbols } from '../format.ts'
import { useStore } from '../../state/store.ts'
import { basisAt, rotateStressInto, rotateVectorInto } from '../../mechanics/componentAxes.ts'

/** What the last click on the surface or the section read; components in the chosen axes. */
export function ProbeCard() {
  const probe = useStore((s) => s.probe)
  const model = useStore((s) => s.model)
  const axes = useStore((s) => s.componentAxes)
  if (!model) return null
  if (!probe) {
    return (
      <Card id="probe" title="Probe">
        <p className="note">Click the surface or the section face to read the stress there.</p>
      </Card>
    )
  }
  // The components in the axes the colours use (one point: a 3 × 3 rotation on this thread).
  const R = basisAt(new Float64Array(9), axes, ...probe.position)
  const s = rotateStressInto(new Float64Array(6), 0, probe.stress, 0, R)
  const u = probe.displacement ? rotateVectorInto(new Float64Array(3), 0, probe.displacement, 0, R) : null
  const sym = componentSymbols(axes), usym = displacementSymbols(axes)
  return (
    <Card id="probe" title="Probe">
      <table className="figures" data-testid="probe-result">
        <caption>{probe.where === 'section' ? 'On the section' : 'On the surface'}, element {probe.elementId}{axes.kind === 'cylindrical' ? '; components in cylindrical axes' : ''}</caption>
        <tbody>
          <VecRow label="Position" v={probe.position} q="length" />
          {Array.from(s, (v, i) => <tr key={i} data-row={sym[i]}><th>{sym[i]}</th><td><Num v={v} q="stress" /></td></tr>)}
          <VecRow label="σ₁, σ₂, σ₃" v={probe.principal} q="stress" />
          <tr><th>von Mises</th><td><Num v={probe.vonMises} q="stress" /></td></tr>
          <VecRow label="Normal n" v={probe.normal} q={null} />
          <VecRow label="Traction t = σn" v={probe.traction} q="stress" />
          <tr><th>Normal tₙ</th><td><Num v={probe.normalTraction} q="stress" /></td></tr>
          <tr><th>Shear |τ|</th><td><Num v={probe.shearTraction} q="stress" /></td></tr>
          {u ? <VecRow label={`Displacement ${usym.join(', ')}`} v={Array.from(u)} q="length" /> : null}
        </tbody>
      </table>
    </Card>
  )
}
