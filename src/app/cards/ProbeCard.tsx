import { Card } from '../ui/Card.tsx'
import { Num, VecRow } from '../ui/Num.tsx'
import { noiseFloor } from '../format.ts'
import { modelSphere } from '../../state/selectors.ts'
import { useStore } from '../../state/store.ts'

const COMPONENTS = ['σxx', 'σyy', 'σzz', 'σxy', 'σyz', 'σxz']

/** What the last click on the surface or the section read. */
export function ProbeCard() {
  const probe = useStore((s) => s.probe)
  const model = useStore((s) => s.model)
  if (!model) return null
  // One table: stresses and tractions judged against the largest stress, the point against the model's size.
  const sFloor = probe ? noiseFloor([...probe.stress, ...probe.principal, probe.vonMises, ...probe.traction]) : 0
  const lFloor = noiseFloor([], modelSphere(model.bounds).diagonal)
  return (
    <Card id="probe" title="Probe">
      {!probe ? <p className="note">Click the surface or the section face to read the stress there.</p> : (
        <table className="figures" data-testid="probe-result">
          <caption>{probe.where === 'section' ? 'On the section' : 'On the surface'}, element {probe.elementId}</caption>
          <tbody>
            <VecRow label="Position" v={probe.position} q="length" floor={lFloor} />
            {probe.stress.map((v, i) => <tr key={i}><th>{COMPONENTS[i]}</th><td><Num v={v} q="stress" floor={sFloor} /></td></tr>)}
            <VecRow label="σ₁, σ₂, σ₃" v={probe.principal} q="stress" floor={sFloor} />
            <tr><th>von Mises</th><td><Num v={probe.vonMises} q="stress" floor={sFloor} /></td></tr>
            <VecRow label="Normal n" v={probe.normal} q={null} floor={1e-6} />
            <VecRow label="Traction t = σn" v={probe.traction} q="stress" floor={sFloor} />
            <tr><th>Normal tₙ</th><td><Num v={probe.normalTraction} q="stress" floor={sFloor} /></td></tr>
            <tr><th>Shear |τ|</th><td><Num v={probe.shearTraction} q="stress" floor={sFloor} /></td></tr>
          </tbody>
        </table>
      )}
    </Card>
  )
}
