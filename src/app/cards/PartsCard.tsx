/**
 * The Parts card (models with several parts): number, name, element count, volume and each
 * part's own balance (the residual of ∮ t dA + ∫ ρb dV over the part, its faces against other
 * parts included, relative to its gross load); show, hide, isolate, and colour by part (the
 * swatches are the legend: viridis at the part's rank).
 */
import { colourMapTable } from '../../scene/colourMaps.ts'
import { Card } from '../ui/Card.tsx'
import { Num } from '../ui/Num.tsx'
import { formatNumber, unitLabel } from '../format.ts'
import { useStore } from '../../state/store.ts'
import { download, fileStem } from '../exports.ts'
import { assemblyCsv, assemblyRecords } from '../assemblyTables.ts'

/** The colour of the part of rank k among n when the surface is coloured by part (CSS rgb). */
export function partColour(k: number, n: number): string {
  const table = colourMapTable('viridis', 256)
  const i = Math.min(255, Math.max(0, Math.floor(256 * (k + 0.5) / n)))
  return `rgb(${table[4 * i]}, ${table[4 * i + 1]}, ${table[4 * i + 2]})`
}

export function PartsCard() {
  const assembly = useStore((s) => s.assembly)
  const hidden = useStore((s) => s.hiddenParts)
  const colours = useStore((s) => s.partColours)
  const setHidden = useStore((s) => s.setPartHidden)
  const isolate = useStore((s) => s.isolatePart)
  const setColours = useStore((s) => s.setPartColours)
  const system = useStore((s) => s.units)
  const model = useStore((s) => s.model)
  if (!assembly || !model) return null
  const n = assembly.parts.length
  return (
    <Card id="parts" title={`Parts (${n})`}>
      <div className="row">
        <label className="check"><input type="checkbox" data-testid="parts-colour" checked={colours} onChange={(e) => setColours(e.target.checked)} /> Colour by part</label>
        <button type="button" data-testid="parts-show-all" disabled={hidden.length === 0} onClick={() => isolate(null)}>Show every part</button>
      </div>
      <table className="figures list" data-testid="parts-table">
        <thead><tr><th>Show</th><th>#</th><th>Name</th><th>Elements</th><th>Volume [{unitLabel('volume', system)}]</th><th /></tr></thead>
        <tbody>
          {assembly.parts.map((p, k) => {
            const shown = !hidden.includes(p.part)
            return (
              <tr key={p.part} data-part={p.part} className={shown ? '' : 'hidden'}>
                <td><input type="checkbox" aria-label={`show part ${p.part}`} data-testid={`part-shown-${p.part}`} checked={shown} onChange={(e) => setHidden(p.part, !e.target.checked)} /></td>
                <td>{colours ? <span className="swatch" style={{ background: partColour(k, n) }} aria-hidden /> : null}{p.part}</td>
                <td className="name" title={`own balance: residual ${formatNumber(p.balance.relative, 2)} of the part's gross load`}>{p.name || '—'}</td>
                <td><span className="num">{p.elements}</span></td>
                <td><Num v={p.volume} q="volume" bare /></td>
                <td><button type="button" data-testid={`part-isolate-${p.part}`} title={`Show part ${p.part} alone`} onClick={() => isolate(p.part)}>alone</button></td>
              </tr>
            )
          })}
        </tbody>
      </table>
      <div className="row">
        <button type="button" data-testid="export-parts-csv" onClick={() => download(`${fileStem(model.name)}-parts.csv`, assemblyCsv(model.name, assembly, model.units, system), 'text/csv')}>Parts CSV</button>
        <button type="button" data-testid="export-parts-json" onClick={() => download(`${fileStem(model.name)}-parts.json`, JSON.stringify({ model: model.name, modelUnits: model.units, ...assemblyRecords(assembly) }, null, 2), 'application/json')}>Parts JSON</button>
      </div>
      <p className="note">Each part&apos;s own balance (a free body whose boundary includes its faces against other parts) and the load path are in the exports and the review report.</p>
    </Card>
  )
}
