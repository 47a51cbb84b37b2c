import { useState } from 'react'
import { Card } from '../ui/Card.tsx'
import { takeSnapshot } from '../actions.ts'
import { ReportButton } from '../ui/ReportButton.tsx'
import { useStore } from '../../state/store.ts'
import type { ReviewFields } from '../../state/store.ts'

/** The reviewer's fields, in the order they are printed. */
const FIELDS: readonly [keyof ReviewFields, string][] = [
  ['title', 'Title'], ['project', 'Project'], ['author', 'Author'], ['checker', 'Checker'], ['revision', 'Revision'], ['loadCase', 'Load case'],
]

/** What a reviewer writes once and finds on every snapshot and report: title, project, people, revision, load case, notes. */
function ReviewFieldsForm() {
  const review = useStore((s) => s.review)
  const setReview = useStore((s) => s.setReview)
  const filled = FIELDS.filter(([k]) => review[k].trim() !== '').length + (review.notes.trim() ? 1 : 0)
  return (
    <details className="review" data-testid="review-fields">
      <summary>Review details{filled ? ` (${filled} filled)` : ''}: printed on snapshots and reports</summary>
      <div className="review-grid">
        {FIELDS.map(([k, label]) => (
          <label key={k} className="pair">
            <span className="lbl">{label}</span>
            <input type="text" value={review[k]} maxLength={120} data-testid={`review-${k}`} onChange={(e) => setReview({ [k]: e.target.value })} />
          </label>
        ))}
        <label className="pair notes">
          <span className="lbl">Notes</span>
          <textarea value={review.notes} maxLength={1000} rows={3} data-testid="review-notes" onChange={(e) => setReview({ notes: e.target.value })} />
        </label>
      </div>
    </details>
  )
}

/** PNG for design reviews, the link that restores this view, and the one-file review report. */
export function SnapshotCard() {
  const model = useStore((s) => s.model)
  const [scale, setScale] = useState(2)
  const [busy, setBusy] = useState(false)
  const [link, setLink] = useState('')
  if (!model) return null
  const own = model.source.startsWith('files:')
  return (
    <Card id="snapshot" title="Snapshot and report">
      <ReviewFieldsForm />
      <div className="row">
        <span className="lbl">Size</span>
        {[1, 2, 4].map((s) => (
          <label key={s} className="check"><input type="radio" name="snap-scale" data-testid={`snap-${s}x`} checked={scale === s} onChange={() => setScale(s)} /> {s}×</label>
        ))}
        <button type="button" data-testid="snapshot" disabled={busy} onClick={async () => { setBusy(true); try { await takeSnapshot(scale) } finally { setBusy(false) } }}>
          {busy ? 'Rendering…' : 'Save PNG'} <kbd>P</kbd>
        </button>
      </div>
      <div className="row">
        <button type="button" data-testid="make-link" onClick={() => {
          const href = window.location.href
          setLink(href)
          void navigator.clipboard?.writeText(href).catch(() => undefined)
        }}>Link to this view</button>
        <ReportButton />
      </div>
      {link ? <input className="link" readOnly value={link} data-testid="view-link" onFocus={(e) => e.target.select()} /> : null}
      {link && own ? <p className="note" data-testid="view-link-note">This view is on your own files: the link names them, and whoever opens it is asked to open the same files before the view applies.</p> : null}
    </Card>
  )
}
