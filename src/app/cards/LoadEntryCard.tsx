import { Card } from '../ui/Card.tsx'
import { Num } from '../ui/Num.tsx'
import { download, fileStem, patchesCsv, patchesJson } from '../exports.ts'
import { useStore } from '../../state/store.ts'

/** Load-entry patches from the audit: list, highlight, frame, export. */
export function LoadEntryCard() {
  const audit = useStore((s) => s.audit)
  const model = useStore((s) => s.model)
  const highlighted = useStore((s) => s.highlightedPatch)
  const system = useStore((s) => s.units)
  const highlightPatch = useStore((s) => s.highlightPatch)
  const requestView = useStore((s) => s.requestView)
  if (!audit || !model) return null
  const patches = audit.patches
  return (
    <Card id="load-entry" title="Load entry">
      <p className="note">Surface areas whose traction exceeds <Num v={audit.threshold} q="stress" />; the rest counts as free surface.</p>
      {patches.length === 0 ? <p className="note">No loaded patches found.</p> : (
        <table className="figures list" data-testid="patch-list">
          <thead><tr><th>#</th><th>Area</th><th>|F|</th><th>Peak |t|</th><th /></tr></thead>
          <tbody>
            {patches.map((p) => (
              <tr key={p.id} className={p.id === highlighted ? 'sel' : ''} data-patch={p.id}
                onClick={() => highlightPatch(p.id === highlighted ? -1 : p.id)}>
                <td>{p.id}</td>
                <td><Num v={p.area} q="area" /></td>
                <td><Num v={Math.hypot(...p.force)} q="force" /></td>
                <td><Num v={p.peak} q="stress" /></td>
                <td>
                  <button type="button" title="Frame this patch" onClick={(e) => {
                    e.stopPropagation()
                    highlightPatch(p.id)
                    requestView({ frame: { center: p.centroid, radius: Math.max(Math.sqrt(p.area), 1e-9), normal: p.normal } })
                  }}>Frame</button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <div className="row">
        <button type="button" data-testid="export-patches-csv" onClick={() => download(`${fileStem(model.name)}-patches.csv`, patchesCsv(model, patches, system), 'text/csv')}>Patches CSV</button>
        <button type="button" data-testid="export-patches-json" onClick={() => download(`${fileStem(model.name)}-patches.json`, patchesJson(model, patches, system), 'application/json')}>Patches JSON</button>
      </div>
    </Card>
  )
}
