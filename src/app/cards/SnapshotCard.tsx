import { useState } from 'react'
import { Card } from '../ui/Card.tsx'
import { takeSnapshot } from '../actions.ts'
import { ReportButton } from '../ui/ReportButton.tsx'
import { useStore } from '../../state/store.ts'

/** PNG for design reviews, the link that restores this view, and the one-file review report. */
export function SnapshotCard() {
  const model = useStore((s) => s.model)
  const [scale, setScale] = useState(2)
  const [busy, setBusy] = useState(false)
  const [link, setLink] = useState('')
  if (!model) return null
  return (
    <Card id="snapshot" title="Snapshot">
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
    </Card>
  )
}
