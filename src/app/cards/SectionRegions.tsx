/**
 * The Cut card's assembly parts: the regions of the cut (connected pieces of one part, largest
 * force first, each with its own resultant about its own centroid; a click highlights one in the
 * scene, where each carries its number) and the bounded-section control (parts and/or a disc).
 * Units: model units converted for display by Num.
 */
import { useState } from 'react'
import type { SectionRegion, SectionResult } from '../../mechanics/types.ts'
import { formatNumber, noiseFloor, unitLabel } from '../format.ts'
import { displayFactor } from '../../model/units.ts'
import { Num, Vec } from '../ui/Num.tsx'
import { useStore } from '../../state/store.ts'

/** A part's label: its number, and its name where it has one. */
export function partLabel(part: number, names: ReadonlyMap<number, string>): string {
  const n = names.get(part)
  return n ? `${part} ${n}` : String(part)
}

/** The model's part names (number → name), from the assembly. */
export function usePartNames(): ReadonlyMap<number, string> {
  const assembly = useStore((s) => s.assembly)
  return new Map((assembly?.parts ?? []).map((p) => [p.part, p.name]))
}

/** The regions of the cut, largest force first; the highlighted one's figures below the list. */
export function RegionTable({ result }: { result: SectionResult }) {
  const regions = result.regions ?? []
  const highlighted = useStore((s) => s.highlightedRegion)
  const setHighlighted = useStore((s) => s.setHighlightedRegion)
  const system = useStore((s) => s.units)
  const names = usePartNames()
  if (regions.length === 0) return null
  const fFloor = noiseFloor(regions.flatMap((g) => g.force))
  const mFloor = noiseFloor(regions.flatMap((g) => [g.torque, ...g.bending]))
  const sel: SectionRegion | undefined = regions[highlighted]
  return (
    <div data-testid="cut-regions">
      <table className="figures list">
        <caption>Regions of the {result.limited ? 'selection' : 'cut'} ({regions.length}), largest force first; click one to mark it</caption>
        <thead><tr><th>#</th><th>Part</th><th>Area [{unitLabel('area', system)}]</th><th title="F·e₃">N [{unitLabel('force', system)}]</th><th title="|F − N e₃|">|V| [{unitLabel('force', system)}]</th><th title="|M·e₁, M·e₂|, about the region's own centroid">|Mb| [{unitLabel('moment', system)}]</th></tr></thead>
        <tbody>
          {regions.map((g, k) => (
            <tr key={k} className={k === highlighted ? 'sel' : ''} data-region={k + 1} onClick={() => setHighlighted(k === highlighted ? -1 : k)}>
              <td>{k + 1}</td>
              <td title={g.parts.map((p) => partLabel(p, names)).join(', ')}>{g.parts.join(', ')}</td>
              <td><Num v={g.area} q="area" bare /></td>
              <td><Num v={g.axial} q="force" bare floor={fFloor} /></td>
              <td><Num v={Math.hypot(...g.shear)} q="force" bare floor={fFloor} /></td>
              <td><Num v={Math.hypot(...g.bending)} q="moment" bare floor={mFloor} /></td>
            </tr>
          ))}
        </tbody>
      </table>
      {sel ? (
        <table className="figures" data-testid="cut-region-selected">
          <caption>Region {highlighted + 1} (part {sel.parts.map((p) => partLabel(p, names)).join(', ')}): about its own centroid, in its own section axes</caption>
          <tbody>
            <tr className="vlabel"><th colSpan={2}>Centroid</th></tr>
            <tr className="vvalue"><td colSpan={2}><Vec v={sel.centroid} q="length" /></td></tr>
            <tr className="vlabel"><th colSpan={2}>Force</th></tr>
            <tr className="vvalue" data-row="region-force"><td colSpan={2}><Vec v={sel.force} q="force" floor={fFloor} /></td></tr>
            <tr className="vlabel"><th colSpan={2}>Moment</th></tr>
            <tr className="vvalue" data-row="region-moment"><td colSpan={2}><Vec v={sel.moment} q="moment" floor={mFloor} /></td></tr>
            <tr><th>Axial N</th><td><Num v={sel.axial} q="force" floor={fFloor} /></td></tr>
            <tr><th>Shear V₁, V₂</th><td><Num v={sel.shear[0]} q="force" floor={fFloor} />, <Num v={sel.shear[1]} q="force" floor={fFloor} /></td></tr>
            <tr><th>Torque T</th><td><Num v={sel.torque} q="moment" floor={mFloor} /></td></tr>
            <tr><th>Bending M₁, M₂</th><td><Num v={sel.bending[0]} q="moment" floor={mFloor} />, <Num v={sel.bending[1]} q="moment" floor={mFloor} /></td></tr>
          </tbody>
        </table>
      ) : null}
    </div>
  )
}

/** A text field that keeps what was typed (a refused input stays on screen, marked). */
function TextField({ label, value, onChange, bad, testId, width = 9 }: { label: string; value: string; onChange: (v: string) => void; bad: boolean; testId: string; width?: number }) {
  return (
    <label className={'field' + (bad ? ' bad' : '')}>
      <span>{label}</span>
      <input type="text" value={value} data-testid={testId} aria-invalid={bad} style={{ width: `${width}em` }} onChange={(e) => onChange(e.target.value)} />
    </label>
  )
}

/** The bounded section: parts and/or a disc (centre projected onto the plane, radius). */
export function SectionLimitControl() {
  const limit = useStore((s) => s.sectionLimit)
  const error = useStore((s) => s.limitError)
  const setLimit = useStore((s) => s.setSectionLimit)
  const clear = useStore((s) => s.clearSectionLimit)
  const model = useStore((s) => s.model)
  const system = useStore((s) => s.units)
  const Lf = model ? displayFactor(model.units, 'length', system) : 1
  const Lu = unitLabel('length', system)
  const [parts, setParts] = useState(limit?.parts?.join(',') ?? '')
  const [disc, setDisc] = useState(!!limit?.within)
  const [centre, setCentre] = useState(limit?.within?.center.map((v) => formatNumber(v * Lf)).join(', ') ?? '')
  const [radius, setRadius] = useState(limit?.within ? formatNumber(limit.within.radius * Lf) : '')
  const apply = (): void => setLimit({ parts, disc, centre, radius, lengthFactor: Lf })
  return (
    <form className="limit" data-testid="cut-limit" onSubmit={(e) => { e.preventDefault(); apply() }}>
      <div className="row">
        <span className="lbl">Limit to</span>
        <TextField label="parts" value={parts} onChange={setParts} bad={error?.field === 'parts'} testId="cut-limit-parts" width={6} />
        <label className="check"><input type="checkbox" checked={disc} data-testid="cut-limit-disc" onChange={(e) => setDisc(e.target.checked)} /> a disc</label>
      </div>
      {disc ? (
        <div className="row">
          <span className="lbl">Disc [{Lu}]</span>
          <TextField label="centre x, y, z" value={centre} onChange={setCentre} bad={error?.field === 'centre'} testId="cut-limit-centre" />
          <TextField label="radius" value={radius} onChange={setRadius} bad={error?.field === 'radius'} testId="cut-limit-radius" width={5} />
        </div>
      ) : null}
      <div className="row">
        <button type="submit" data-testid="cut-limit-apply">Apply the limit</button>
        <button type="button" data-testid="cut-limit-clear" disabled={!limit} onClick={() => { clear(); setParts(''); setDisc(false) }}>Whole plane</button>
      </div>
      {error ? <p className="note bad" data-testid="cut-limit-error">{error.message} The previous cut is kept.</p> : null}
      {limit ? <p className="note" data-testid="cut-limit-note">
        The figures below are those of the {limit.parts ? `polygons of part${limit.parts.length > 1 ? 's' : ''} ${limit.parts.join(', ')}` : 'polygons'}
        {limit.within ? ` whose centroid lies within ${formatNumber(limit.within.radius * Lf)} ${Lu} of (${limit.within.center.map((v) => formatNumber(v * Lf)).join(', ')}) ${Lu} projected onto the plane` : ''}.
      </p> : null}
    </form>
  )
}
