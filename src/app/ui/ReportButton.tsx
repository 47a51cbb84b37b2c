import { useState } from 'react'
import { exportReport } from '../report.ts'

/** "Review report": one self-contained HTML file of the view, the audit, the section and the sweep. */
export function ReportButton() {
  const [busy, setBusy] = useState(false)
  return (
    <button type="button" data-testid="review-report" disabled={busy}
      title="One HTML file with the view, the equilibrium audit, the load-entry patches, the current section and the diagrams along the part; it opens offline"
      onClick={async () => { setBusy(true); try { await exportReport() } finally { setBusy(false) } }}>
      {busy ? 'Writing…' : 'Review report'}
    </button>
  )
}
