import { Card } from '../ui/Card.tsx'
import { NumberField } from '../ui/NumberField.tsx'
import { QUANTITY_LABEL, quantityDisplay } from '../format.ts'
import { activeRange } from '../../state/selectors.ts'
import { COLOUR_MAP_NAMES, QUANTITY_NAMES, useStore } from '../../state/store.ts'
import type { ColourMapName, QuantityName } from '../../state/store.ts'
import type { ArrowMode } from '../../../workers/protocol.ts'

export function QuantitySelect({ testId }: { testId: string }) {
  const quantity = useStore((s) => s.quantity)
  const setQuantity = useStore((s) => s.setQuantity)
  return (
    <select value={quantity} data-testid={testId} aria-label="Quantity" onChange={(e) => setQuantity(e.target.value as QuantityName)}>
      {QUANTITY_NAMES.map((q, i) => <option key={q} value={q}>{i + 1} · {QUANTITY_LABEL[q]}</option>)}
    </select>
  )
}

/** Quantity, colour range and map, and the arrow field. */
export function ColourCard() {
  const model = useStore((s) => s.model)
  const quantity = useStore((s) => s.quantity)
  const system = useStore((s) => s.units)
  const range = useStore((s) => s.range)
  // Select numbers, not a fresh array: a selector returning a new array each call never settles.
  const lo = useStore((s) => activeRange(s)[0])
  const hi = useStore((s) => activeRange(s)[1])
  const colourMap = useStore((s) => s.colourMap)
  const a = useStore((s) => s.arrowSettings)
  const setRange = useStore((s) => s.setRange)
  const setColourMap = useStore((s) => s.setColourMap)
  const setArrowSettings = useStore((s) => s.setArrowSettings)
  if (!model) return null
  const { factor, unit } = quantityDisplay(quantity, model.units, system)
  const fixed = range !== 'auto'
  return (
    <Card id="colour" title="Colour and arrows">
      <div className="row"><span className="lbl">Quantity</span><QuantitySelect testId="quantity-card" /></div>
      <div className="row">
        <label className="check"><input type="checkbox" data-testid="range-fixed" checked={fixed} onChange={(e) => setRange(e.target.checked ? [lo, hi] : 'auto')} /> Fix range</label>
        <NumberField label={`min [${unit}]`} testId="range-min" value={lo * factor} onCommit={(v) => { const x = v / factor; if (x < hi) setRange([x, hi]) }} />
        <NumberField label={`max [${unit}]`} testId="range-max" value={hi * factor} onCommit={(v) => { const x = v / factor; if (x > lo) setRange([lo, x]) }} />
      </div>
      <div className="row">
        <span className="lbl">Map</span>
        <select value={colourMap} data-testid="colour-map" onChange={(e) => setColourMap(e.target.value as ColourMapName)}>
          {COLOUR_MAP_NAMES.map((m) => <option key={m} value={m}>{m}{m === 'RdBu' || m === 'PuOr' ? ' (diverging)' : ''}</option>)}
        </select>
      </div>
      <div className="row">
        <label className="check"><input type="checkbox" data-testid="arrows-surface" checked={a.surface} onChange={(e) => setArrowSettings({ surface: e.target.checked })} /> Arrows on surface <kbd>A</kbd></label>
        <label className="check"><input type="checkbox" data-testid="arrows-section" checked={a.section} onChange={(e) => setArrowSettings({ section: e.target.checked })} /> on section</label>
      </div>
      <div className="row">
        <label className="pair">
          <span className="lbl">Show</span>
          <select value={a.mode} data-testid="arrows-mode" onChange={(e) => setArrowSettings({ mode: e.target.value as ArrowMode })}>
            <option value="full">traction t</option>
            <option value="normal">normal part</option>
            <option value="shear">shear part</option>
          </select>
        </label>
      </div>
      <div className="row">
        <label className="pair">
          <span className="lbl">Colour</span>
          <select value={a.colour} data-testid="arrows-colour" onChange={(e) => setArrowSettings({ colour: e.target.value as 'normal' | 'single' })}>
            <option value="normal">by normal traction tₙ (tension / compression)</option>
            <option value="single">one colour</option>
          </select>
        </label>
      </div>
      <p className="note">Arrow lengths share one scale, drawn in the view as an arrow of a round value under the model.</p>
      <label className="slider"><span className="lbl">Length</span>
        <input type="range" min={0.1} max={5} step={0.1} value={a.scale} data-testid="arrows-scale" onChange={(e) => setArrowSettings({ scale: Number(e.target.value) })} />
        <span className="num">×{a.scale.toFixed(1)}</span>
      </label>
      <label className="slider"><span className="lbl">At most</span>
        <input type="range" min={100} max={10000} step={100} value={a.budget} data-testid="arrows-budget" onChange={(e) => setArrowSettings({ budget: Number(e.target.value) })} />
        <span className="num">{a.budget} arrows</span>
      </label>
    </Card>
  )
}
