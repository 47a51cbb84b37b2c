/**
 * The "Review report" action: snapshot of the view, the audit, the current section and the last
 * sweep, written as one HTML file that opens offline in any browser.
 */
import { CAUTION } from './caution.ts'
import { download, fileStem } from './exports.ts'
import { buildReportContent } from './reportContent.ts'
import { renderReport } from './reportDocument.ts'
import { composeSnapshot } from './snapshot.ts'
import { useStore } from '../state/store.ts'
import { modelWithInputs } from '../state/selectors.ts'
import { TOOL_VERSION } from './version.ts'

function blobToDataUrl(b: Blob): Promise<string> {
  return new Promise((resolve, reject) => {
    const r = new FileReader()
    r.onload = () => resolve(String(r.result))
    r.onerror = () => reject(r.error ?? new Error('the snapshot could not be read'))
    r.readAsDataURL(b)
  })
}

/** Builds the report text for the current state (exported for tests through the download). */
export async function buildReportHtml(): Promise<string> {
  const st = useStore.getState()
  if (!st.model) throw new Error('No model is loaded.')
  let snapshot: string | null = null
  const canvas = document.querySelector<HTMLCanvasElement>('[data-testid="scene"] canvas')
  try {
    const w = canvas?.clientWidth || 960, h = canvas?.clientHeight || 600
    snapshot = await blobToDataUrl(await composeSnapshot(st, w, h, 1, canvas))
  } catch { snapshot = null /* the report still carries every table */ }
  const content = buildReportContent({
    model: modelWithInputs(st)!, system: st.units, date: new Date(), caution: CAUTION, audit: st.audit,
    section: st.section.enabled ? st.sectionResult : null, sweep: st.sweep, shown: st.sweepShown, snapshot,
    envelope: st.section.enabled && st.envelopeOpen ? st.envelope : null,
    line: st.lineResult, lineShown: st.lineSeries,
    review: st.review, version: TOOL_VERSION, assembly: st.assembly,
  })
  return renderReport(content)
}

export async function exportReport(): Promise<void> {
  const st = useStore.getState()
  try {
    const html = await buildReportHtml()
    const stamp = new Date().toISOString().slice(0, 16).replace(/[:T]/g, '-')
    download(`${fileStem(st.model?.name ?? 'tractus')}-review-${stamp}.html`, html, 'text/html')
  } catch (e) {
    st.showError({ message: `The review report could not be made: ${e instanceof Error ? e.message : String(e)}` })
  }
}
