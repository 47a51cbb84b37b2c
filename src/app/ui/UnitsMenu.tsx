import { FORCE_UNITS, LENGTH_UNITS, STRESS_UNITS, displayUnitsOf, modelDisplayUnits } from '../../model/units.ts'
import type { DisplayUnits, ForceUnit, LengthUnit, StressUnit } from '../../model/units.ts'
import { useStore } from '../../state/store.ts'
import type { UnitPreset } from '../../state/store.ts'

const setText = (d: DisplayUnits): string => `${d.length}, ${d.force}, ${d.stress}`

/**
 * The display units: SI, US customary, the model's own, or the user's own length, force and stress
 * units (the others follow: area, moment, second moment). Typed coordinates use the length unit
 * shown. Key U cycles SI → US → the model's own.
 */
export function UnitsMenu() {
  const model = useStore((s) => s.model)
  const preset = useStore((s) => s.unitPreset)
  const units = useStore((s) => s.units)
  const setUnitPreset = useStore((s) => s.setUnitPreset)
  const shown = displayUnitsOf(units)
  const own = model ? modelDisplayUnits(model.units) : null
  const choices: [UnitPreset, string][] = [
    ['SI', `SI (${setText(displayUnitsOf('SI'))})`],
    ['US', `US customary (${setText(displayUnitsOf('US'))})`],
    ['model', own ? `the model's own (${setText(own)})` : "the model's own"],
    ['custom', 'your own choice'],
  ]
  const set = (patch: Partial<DisplayUnits>): void => setUnitPreset('custom', { ...shown, ...patch })
  return (
    <details className="units-menu" data-testid="units-menu">
      <summary data-testid="units-summary" title="Display units (U cycles SI, US, the model's own)">
        Units: {preset === 'SI' ? 'SI' : preset === 'US' ? 'US' : preset === 'model' ? 'model' : 'own'} <span className="unit">({setText(shown)})</span>
      </summary>
      <div className="menu">
        {choices.map(([p, text]) => (
          <label key={p} className="check">
            <input type="radio" name="unit-preset" data-testid={`units-${p}`} checked={preset === p} onChange={() => (p === 'custom' ? set({}) : setUnitPreset(p))} /> {text}
          </label>
        ))}
        <div className="row">
          <label className="pair"><span className="lbl">length</span>
            <select value={shown.length} data-testid="units-length" onChange={(e) => set({ length: e.target.value as LengthUnit })}>
              {LENGTH_UNITS.map((u) => <option key={u} value={u}>{u}</option>)}
            </select>
          </label>
          <label className="pair"><span className="lbl">force</span>
            <select value={shown.force} data-testid="units-force" onChange={(e) => set({ force: e.target.value as ForceUnit })}>
              {FORCE_UNITS.map((u) => <option key={u} value={u}>{u}</option>)}
            </select>
          </label>
          <label className="pair"><span className="lbl">stress</span>
            <select value={shown.stress} data-testid="units-stress" onChange={(e) => set({ stress: e.target.value as StressUnit })}>
              {STRESS_UNITS.map((u) => <option key={u} value={u}>{u}</option>)}
            </select>
          </label>
        </div>
        <p className="note">Moments are force × length, areas length²; the numbers stay in the model's units underneath and in every export's model values.</p>
      </div>
    </details>
  )
}
