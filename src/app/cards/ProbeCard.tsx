import { Card } from '../ui/Card.tsx'
import { Num, VecRow } from '../ui/Num.tsx'
import { componentSymbols, displacementSymbols, noiseFloor } from '../format.ts'
import { modelSphere } from '../../state/selectors.ts'
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
  // One table: stresses and tractions judged against the largest stress, the point against the model's size.
  const sFloor = noiseFloor([...probe.stress, ...probe.principal, probe.vonMises, ...probe.traction])
  const lFloor = noiseFloor([], modelSphere(model.bounds).diagonal)
  return (
    <Card id="probe" title="Probe">
      <table className="figures" data-testid="probe-result">
        <caption>{probe.where === 'section' ? 'On the section' : 'On the surface'}, element {probe.elementId}{axes.kind === 'cylindrical' ? '; components in cylindrical axes' : ''}</caption>
        <tbody>
          <VecRow label="Position" v={probe.position} q="length" floor={lFloor} />
          {Array.from(s, (v, i) => <tr key={i} data-row={sym[i]}><th>{sym[i]}</th><td><Num v={v} q="stress" floor={sFloor} /></td></tr>)}
          <VecRow label="σ₁, σ₂, σ₃" v={probe.principal} q="stress" floor={sFloor} />
          <tr><th>von Mises</th><td><Num v={probe.vonMises} q="stress" floor={sFloor} /></td></tr>
          <VecRow label="Normal n" v={probe.normal} q={null} floor={1e-6} />
          <VecRow label="Traction t = σn" v={probe.traction} q="stress" floor={sFloor} />
          <tr><th>Normal tₙ</th><td><Num v={probe.normalTraction} q="stress" floor={sFloor} /></td></tr>
          <tr><th>Shear |τ|</th><td><Num v={probe.shearTraction} q="stress" floor={sFloor} /></td></tr>
          {u ? <VecRow label={`Displacement ${usym.join(', ')}`} v={Array.from(u)} q="length" floor={lFloor} /> : null}
        </tbody>
      </table>
    </Card>
  )
}
