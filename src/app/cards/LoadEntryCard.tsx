import { useState } from 'react'
import { Card } from '../ui/Card.tsx'
import { Num, Vec } from '../ui/Num.tsx'
import { NumberField } from '../ui/NumberField.tsx'
import { download, fileStem, patchesCsv, patchesJson } from '../exports.ts'
import { formatNumber, noiseFloor, unitLabel } from '../format.ts'
import { DEFAULT_PATCH_RULE, useStore } from '../../state/store.ts'
import type { PatchRule } from '../../../workers/protocol.ts'

const pct = (f: number): string => formatNumber(100 * f, 3)

/**
 * The patch rule, as the user may set it: the two thresholds (per cent of the reference stress)
 * and the feature angle. A lower threshold above the threshold, or an angle outside 0–180°, is
 * refused with the reason; the rule in use stays.
 */
function PatchRuleFields() {
  const rule = useStore((s) => s.patchRule)
  const setPatchRule = useStore((s) => s.setPatchRule)
  const [error, setError] = useState('')
  const take = (next: PatchRule): void => {
    if (!(next.threshold >= 0) || !(next.lowerThreshold >= 0)) { setError('Thresholds are per cent of the reference stress, 0 or more.'); return }
    if (next.lowerThreshold > next.threshold) { setError(`The lower threshold (${pct(next.lowerThreshold)} %) may not exceed the threshold (${pct(next.threshold)} %): faces above the threshold start patches, faces above the lower one only join them.`); return }
    if (!(next.featureAngle >= 0 && next.featureAngle <= 180)) { setError('The feature angle is between 0° and 180°.'); return }
    setError('')
    setPatchRule(next)
  }
  const isDefault = rule.threshold === DEFAULT_PATCH_RULE.threshold && rule.lowerThreshold === DEFAULT_PATCH_RULE.lowerThreshold && rule.featureAngle === DEFAULT_PATCH_RULE.featureAngle
  return (
    <details className="rule" data-testid="patch-rule">
      <summary>Patch rule: start {pct(rule.threshold)} %, join {pct(rule.lowerThreshold)} %, fold {formatNumber(rule.featureAngle, 3)}°{isDefault ? ' (defaults)' : ''}</summary>
      <div className="row">
        <NumberField label="start above [%]" value={100 * rule.threshold} width={4} testId="patch-threshold" invalid={!!error}
          onCommit={(v) => take({ ...rule, threshold: v / 100 })} />
        <NumberField label="join above [%]" value={100 * rule.lowerThreshold} width={4} testId="patch-lower" invalid={!!error}
          onCommit={(v) => take({ ...rule, lowerThreshold: v / 100 })} />
      </div>
      <div className="row">
        <NumberField label="split at folds over [°]" value={rule.featureAngle} width={4} testId="patch-angle" invalid={!!error}
          onCommit={(v) => take({ ...rule, featureAngle: v })} />
        <button type="button" data-testid="patch-defaults" disabled={isDefault} onClick={() => { setError(''); setPatchRule(DEFAULT_PATCH_RULE) }}>Defaults</button>
      </div>
      {error ? <p className="note bad" data-testid="patch-rule-error">{error}</p> : null}
      <p className="note">
        A boundary face whose mean |t| exceeds the start level (per cent of the reference stress, the 95th percentile of nodal von Mises stress)
        starts a patch; neighbours above the join level join it. Patches end where the surface folds by more than the angle, and between parts.
      </p>
    </details>
  )
}

/** Load-entry patches from the audit: the rule, the list with force and moment, highlight, frame, export. */
export function LoadEntryCard() {
  const audit = useStore((s) => s.audit)
  const model = useStore((s) => s.model)
  const highlighted = useStore((s) => s.highlightedPatch)
  const system = useStore((s) => s.units)
  const highlightPatch = useStore((s) => s.highlightPatch)
  const requestView = useStore((s) => s.requestView)
  if (!audit || !model) return null
  const patches = audit.patches
  const parts = new Set(patches.map((p) => p.part))
  // One table: forces judged against forces, moments against moments (rounding-noise rule).
  const fFloor = noiseFloor(patches.flatMap((p) => p.force))
  const mFloor = noiseFloor(patches.flatMap((p) => p.moment))
  const sel = patches.find((p) => p.id === highlighted) ?? null
  return (
    <Card id="load-entry" title="Load entry">
      <p className="note">
        Surface areas where load enters or leaves: they start above <Num v={audit.threshold} q="stress" /> and take in neighbours above <Num v={audit.lowerThreshold} q="stress" />; the rest counts as free surface.
      </p>
      <PatchRuleFields />
      {patches.length === 0 ? <p className="note">No loaded patches found.</p> : (
        <table className="figures list" data-testid="patch-list">
          <thead><tr><th>#</th>{parts.size > 1 ? <th>Part</th> : null}<th>Area [{unitLabel('area', system)}]</th><th>|F| [{unitLabel('force', system)}]</th><th title="about the patch's centroid">|M| [{unitLabel('moment', system)}]</th><th /></tr></thead>
          <tbody>
            {patches.map((p) => (
              <tr key={p.id} className={p.id === highlighted ? 'sel' : ''} data-patch={p.id}
                onClick={() => highlightPatch(p.id === highlighted ? -1 : p.id)}>
                <td>{p.id}</td>
                {parts.size > 1 ? <td>{p.part}</td> : null}
                <td><Num v={p.area} q="area" bare /></td>
                <td data-col="force"><Num v={Math.hypot(...p.force)} q="force" floor={fFloor} bare /></td>
                <td data-col="moment"><Num v={Math.hypot(...p.moment)} q="moment" floor={mFloor} bare /></td>
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
      {sel ? (
        <table className="figures" data-testid="patch-detail">
          <caption>Patch {sel.id}{parts.size > 1 ? `, part ${sel.part}` : ''}: {sel.faceCount} faces</caption>
          <tbody>
            <tr className="vlabel"><th colSpan={2}>Force ∫ t dA</th></tr>
            <tr className="vvalue" data-row="force"><td colSpan={2}><Vec v={sel.force} q="force" floor={fFloor} /></td></tr>
            <tr className="vlabel"><th colSpan={2}>Moment about its centroid</th></tr>
            <tr className="vvalue" data-row="moment"><td colSpan={2}><Vec v={sel.moment} q="moment" floor={mFloor} /></td></tr>
            <tr className="vlabel"><th colSpan={2}>Centroid</th></tr>
            <tr className="vvalue"><td colSpan={2}><Vec v={sel.centroid} q="length" floor={1e-6 * Math.hypot(model.bounds.max[0] - model.bounds.min[0], model.bounds.max[1] - model.bounds.min[1], model.bounds.max[2] - model.bounds.min[2])} /></td></tr>
            <tr><th>Peak |t|</th><td><Num v={sel.peak} q="stress" /></td></tr>
            <tr><th>Mean |t|</th><td><Num v={sel.mean} q="stress" /></td></tr>
          </tbody>
        </table>
      ) : patches.length ? <p className="note">Click a patch for its force and moment vectors.</p> : null}
      <div className="row">
        <button type="button" data-testid="export-patches-csv" onClick={() => download(`${fileStem(model.name)}-patches.csv`, patchesCsv(model, patches, system, audit), 'text/csv')}>Patches CSV</button>
        <button type="button" data-testid="export-patches-json" onClick={() => download(`${fileStem(model.name)}-patches.json`, patchesJson(model, patches, system, audit), 'application/json')}>Patches JSON</button>
      </div>
    </Card>
  )
}
