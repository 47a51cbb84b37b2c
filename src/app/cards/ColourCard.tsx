import { Card } from '../ui/Card.tsx'
import { NumberField } from '../ui/NumberField.tsx'
import { COLOUR_MAP_NAMES } from '../colourMaps.ts'
import { QUANTITY_LABEL, quantityDisplay } from '../format.ts'
import { activeRange, isSignedQuantity, QUANTITY_NAMES, useStore } from '../store.ts'
import type { ArrowMode, ColourMapName, QuantityName } from '../store.ts'

export function QuantitySelect({ testId }: { testId: string }) {
  const quantity = useStore((s) => s.quantity)
  const setQuantity = useQuantitySetter()
  return (
    <select value={quantity} data-testid={testId} aria-label="Quantity" onChange={(e) => setQuantity(e.target.value as QuantityName)}>
      {QUANTITY_NAMES.map((q, i) => <option key={q} value={q}>{i + 1} · {QUANTITY_LABEL[q]}</option>)}
    </select>
  )
}

/** Changing the quantity resets the range to auto and picks the map family that fits it. */
export function useQuantitySetter(): (q: QuantityName) => void {
  const set = useStore((s) => s.set)
  return (q) => {
    const st = useStore.getState()
    const wasSigned = isSignedQuantity(st.quantity), signed = isSignedQuantity(q)
    const colourMap = wasSigned === signed ? st.colourMap : signed ? 'RdBu' : 'viridis'
    set({ quantity: q, range: 'auto', colourMap })
  }
}

/** Quantity, colour range and map, and the arrow field. */
export function ColourCard() {
  const model = useStore((s) => s.model)
  const st = useStore()
  if (!model) return null
  const { factor, unit } = quantityDisplay(st.quantity, model.units, st.units)
  const r = activeRange(st)
  const fixed = st.range !== 'auto'
  const a = st.arrowSettings
  return (
    <Card id="colour" title="Colour and arrows">
      <div className="row"><span className="lbl">Quantity</span><QuantitySelect testId="quantity-card" /></div>
      <div className="row">
        <label className="check"><input type="checkbox" data-testid="range-fixed" checked={fixed} onChange={(e) => st.set({ range: e.target.checked ? [r[0], r[1]] : 'auto' })} /> Fix range</label>
        <NumberField label={`min [${unit}]`} testId="range-min" value={r[0] * factor} onCommit={(v) => { const x = v / factor; if (x < r[1]) st.set({ range: [x, r[1]] }) }} />
        <NumberField label={`max [${unit}]`} testId="range-max" value={r[1] * factor} onCommit={(v) => { const x = v / factor; if (x > r[0]) st.set({ range: [r[0], x] }) }} />
      </div>
      <div className="row">
        <span className="lbl">Map</span>
        <select value={st.colourMap} data-testid="colour-map" onChange={(e) => st.set({ colourMap: e.target.value as ColourMapName })}>
          {COLOUR_MAP_NAMES.map((m) => <option key={m} value={m}>{m}{m === 'RdBu' || m === 'PuOr' ? ' (diverging)' : ''}</option>)}
        </select>
      </div>
      <div className="row">
        <label className="check"><input type="checkbox" data-testid="arrows-surface" checked={a.surface} onChange={(e) => st.setArrowSettings({ surface: e.target.checked })} /> Arrows on surface <kbd>A</kbd></label>
        <label className="check"><input type="checkbox" data-testid="arrows-section" checked={a.section} onChange={(e) => st.setArrowSettings({ section: e.target.checked })} /> on section</label>
      </div>
      <div className="row">
        <span className="lbl">Show</span>
        <select value={a.mode} data-testid="arrows-mode" onChange={(e) => st.setArrowSettings({ mode: e.target.value as ArrowMode })}>
          <option value="full">traction t</option>
          <option value="normal">normal part</option>
          <option value="shear">shear part</option>
        </select>
        <span className="lbl">Colour</span>
        <select value={a.colour} onChange={(e) => st.setArrowSettings({ colour: e.target.value as 'magnitude' | 'single' })}>
          <option value="magnitude">by magnitude</option>
          <option value="single">one colour</option>
        </select>
      </div>
      <label className="slider"><span className="lbl">Length</span>
        <input type="range" min={0.1} max={5} step={0.1} value={a.scale} data-testid="arrows-scale" onChange={(e) => st.setArrowSettings({ scale: Number(e.target.value) })} />
        <span className="num">×{a.scale.toFixed(1)}</span>
      </label>
      <label className="slider"><span className="lbl">At most</span>
        <input type="range" min={100} max={10000} step={100} value={a.budget} data-testid="arrows-budget" onChange={(e) => st.setArrowSettings({ budget: Number(e.target.value) })} />
        <span className="num">{a.budget} arrows</span>
      </label>
    </Card>
  )
}
