import { displayFactor } from '../../model/units.ts'
import { Card } from '../ui/Card.tsx'
import { NumberField } from '../ui/NumberField.tsx'
import { Num, Vec } from '../ui/Num.tsx'
import { QUANTITY_LABEL, quantityDisplay, quantityKind, quantityLabel } from '../format.ts'
import { activeRange, modelSphere, quantityExtremes } from '../../state/selectors.ts'
import { COLOUR_MAP_NAMES, QUANTITY_NAMES, useStore } from '../../state/store.ts'
import type { ColourMapName, QuantityName } from '../../state/store.ts'
import type { ArrowMode, ComponentAxes, ModelSummary, Vec3 } from '../../../workers/protocol.ts'
import { DISPLACEMENT_COMPONENTS, STRESS_COMPONENTS } from '../../mechanics/componentScalars.ts'

export function QuantitySelect({ testId }: { testId: string }) {
  const quantity = useStore((s) => s.quantity)
  const setQuantity = useStore((s) => s.setQuantity)
  const axes = useStore((s) => s.componentAxes)
  const hasDisplacement = useStore((s) => s.deformationBuffers !== null)
  // The stress jump needs a value per element and node; with nodal stress it is zero everywhere.
  const elementNodal = useStore((s) => s.model?.stressLayout === 'element-nodal')
  const cyl = axes.kind === 'cylindrical'
  return (
    <select value={quantity} data-testid={testId} aria-label="Quantity" onChange={(e) => setQuantity(e.target.value as QuantityName)}>
      <optgroup label="Tractions and invariants">
        {QUANTITY_NAMES.map((q, i) => (q !== 'stressJump' || elementNodal ? <option key={q} value={q}>{i + 1} · {QUANTITY_LABEL[q]}</option> : null))}
      </optgroup>
      <optgroup label={cyl ? 'Stress components, cylindrical r, θ, z' : 'Stress components, global x, y, z'}>
        {STRESS_COMPONENTS.map((q) => <option key={q} value={q}>{quantityLabel(q, axes)}</option>)}
      </optgroup>
      {hasDisplacement ? (
        <optgroup label="Displacement">
          {(['displacement', ...DISPLACEMENT_COMPONENTS] as const).map((q) => <option key={q} value={q}>{quantityLabel(q, axes)}</option>)}
        </optgroup>
      ) : null}
    </select>
  )
}

/** A default cylinder axis: through the model's centre, along the box side that differs most from the other two. */
export function defaultAxis(m: ModelSummary): { origin: Vec3; axis: Vec3 } {
  const e = [0, 1, 2].map((k) => m.bounds.max[k] - m.bounds.min[k])
  let best = 2, score = -Infinity
  for (let k = 0; k < 3; k++) {
    const s = Math.abs(e[k] - (e[(k + 1) % 3] + e[(k + 2) % 3]) / 2)
    if (s > score) { score = s; best = k }
  }
  const axis: Vec3 = [0, 0, 0]
  axis[best] = 1
  return { origin: modelSphere(m.bounds).center, axis }
}

/** Global or cylindrical axes for the components, the probe and the line read-out. */
function AxesRow({ model }: { model: ModelSummary }) {
  const axes = useStore((s) => s.componentAxes)
  const error = useStore((s) => s.axesError)
  const system = useStore((s) => s.units)
  const set = useStore((s) => s.setComponentAxes)
  const Lf = displayFactor(model.units, 'length', system)
  const cyl = axes.kind === 'cylindrical' ? axes : null
  const patch = (which: 'origin' | 'axis', k: number, v: number): void => {
    if (!cyl) return
    const next: Vec3 = [...cyl[which]]
    next[k] = which === 'origin' ? v / Lf : v
    set({ ...cyl, [which]: next } as ComponentAxes)
  }
  return (
    <>
      <div className="row">
        <span className="lbl">Axes</span>
        <select value={axes.kind} data-testid="component-axes" aria-label="Axes of the components"
          onChange={(e) => set(e.target.value === 'cylindrical' ? { kind: 'cylindrical', ...defaultAxis(model) } : { kind: 'global' })}>
          <option value="global">global x, y, z</option>
          <option value="cylindrical">cylindrical r, θ, z about an axis</option>
        </select>
      </div>
      {cyl ? (
        <>
          <div className="row">
            <span className="lbl">through</span>
            {(['x', 'y', 'z'] as const).map((a, k) => <NumberField key={a} label={a} width={5} testId={`axis-point-${a}`} value={cyl.origin[k] * Lf} onCommit={(v) => patch('origin', k, v)} />)}
          </div>
          <div className="row">
            <span className="lbl">along</span>
            {(['x', 'y', 'z'] as const).map((a, k) => <NumberField key={a} label={a} width={5} testId={`axis-dir-${a}`} value={cyl.axis[k]} invalid={!!error} onCommit={(v) => patch('axis', k, v)} />)}
          </div>
        </>
      ) : null}
      {error ? <p className="note bad" data-testid="axes-error">{error}</p> : null}
    </>
  )
}

/** The extremes markers: on/off, and where the largest and smallest value of the shown quantity are. */
function ExtremesRows() {
  const shown = useStore((s) => s.extremesShown)
  const x = useStore(quantityExtremes)
  const quantity = useStore((s) => s.quantity)
  const surface = useStore((s) => s.surface)
  const model = useStore((s) => s.model)
  const q = quantityKind(quantity)
  // Round-off of the single-precision buffer below 10⁻⁹ of the model's size reads as zero.
  const tiny = model ? 1e-9 * modelSphere(model.bounds).diagonal : 0
  const clean = (x: number): number => (Math.abs(x) < tiny ? 0 : x)
  const at = (v: number): Vec3 | null => (surface && v >= 0 ? [clean(surface.positions[3 * v]), clean(surface.positions[3 * v + 1]), clean(surface.positions[3 * v + 2])] : null)
  const frame = (p: Vec3): void => {
    if (!model) return
    useStore.getState().requestView({ frame: { center: p, radius: 0.08 * modelSphere(model.bounds).diagonal } })
  }
  const row = (kind: 'max' | 'min') => {
    const p = x ? at(kind === 'max' ? x.maxIndex : x.minIndex) : null
    if (!x || !p) return null
    return (
      <tr data-row={kind}>
        <th>{kind === 'max' ? 'Largest' : 'Smallest'}</th>
        <td><Num v={kind === 'max' ? x.max : x.min} q={q} /></td>
        <td><button type="button" className="small" data-testid={`frame-${kind}`} onClick={() => frame(p)} title="Frame this point">Frame</button></td>
      </tr>
    )
  }
  return (
    <>
      <div className="row">
        <label className="check"><input type="checkbox" data-testid="extremes-shown" checked={shown} onChange={(e) => useStore.getState().setExtremesShown(e.target.checked)} /> Mark the largest and smallest value</label>
      </div>
      {shown && x ? (
        <table className="figures" data-testid="extremes">
          <tbody>{row('max')}{row('min')}</tbody>
        </table>
      ) : null}
      {shown && x && at(x.maxIndex) ? <p className="note">Largest at <Vec v={at(x.maxIndex)!} q="length" />, on the surface.</p> : null}
    </>
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
      <AxesRow model={model} />
      <ExtremesRows />
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
            <option value="normal">by tₙ (tension / compression)</option>
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
