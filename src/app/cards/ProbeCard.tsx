import { Card } from '../ui/Card.tsx'
import { Num, Vec } from '../ui/Num.tsx'
import { useStore } from '../store.ts'

const COMPONENTS = ['σxx', 'σyy', 'σzz', 'σxy', 'σyz', 'σxz']

/** What the last click on the surface or the section read. */
export function ProbeCard() {
  const probe = useStore((s) => s.probe)
  const model = useStore((s) => s.model)
  if (!model) return null
  return (
    <Card id="probe" title="Probe">
      {!probe ? <p className="note">Click the surface or the section face to read the stress there.</p> : (
        <table className="figures" data-testid="probe-result">
          <caption>{probe.where === 'section' ? 'On the section' : 'On the surface'}, element {probe.elementId}</caption>
          <tbody>
            <tr className="vrow"><th>Position</th><td><Vec v={probe.position} q="length" /></td></tr>
            {probe.stress.map((v, i) => <tr key={i}><th>{COMPONENTS[i]}</th><td><Num v={v} q="stress" /></td></tr>)}
            <tr className="vrow"><th>σ₁, σ₂, σ₃</th><td><Vec v={probe.principal} q="stress" /></td></tr>
            <tr><th>von Mises</th><td><Num v={probe.vonMises} q="stress" /></td></tr>
            <tr className="vrow"><th>Normal n</th><td><span className="vec">(<Num v={probe.normal[0]} q={null} />, <Num v={probe.normal[1]} q={null} />, <Num v={probe.normal[2]} q={null} />)</span></td></tr>
            <tr className="vrow"><th>Traction t = σn</th><td><Vec v={probe.traction} q="stress" /></td></tr>
            <tr><th>Normal tₙ</th><td><Num v={probe.normalTraction} q="stress" /></td></tr>
            <tr><th>Shear |τ|</th><td><Num v={probe.shearTraction} q="stress" /></td></tr>
          </tbody>
        </table>
      )}
    </Card>
  )
}
