/**
 * Turns report content into ONE self-contained HTML file: styles inline, the snapshot as a data:
 * URL, diagrams as inline SVG, a Content-Security-Policy that forbids scripts and every fetch.
 * Built with DOM calls only: every model-provided string goes in as a text node or an attribute
 * value set through the DOM, never parsed as markup.
 */
import type { ReportContent, ReportDiagram, ReportTable } from './reportContent.ts'

/** No scripts, no network: only inline styles and data: images. */
export const REPORT_CSP = "default-src 'none'; img-src data:; style-src 'unsafe-inline'"

const STYLE = `
body { font: 14px/1.45 system-ui, -apple-system, "Segoe UI", Roboto, sans-serif; color: #1d2329; margin: 24px auto; max-width: 980px; padding: 0 16px; }
h1 { font-size: 20px; margin: 0 0 8px; color: #2f4f6f; }
h2 { font-size: 15px; margin: 22px 0 6px; border-bottom: 1px solid #c9ccc8; padding-bottom: 2px; }
dl.facts { display: grid; grid-template-columns: max-content 1fr; gap: 2px 14px; margin: 0; }
dl.facts dt { color: #4a545e; }
dl.facts dd { margin: 0; overflow-wrap: anywhere; }
.caution { border-left: 4px solid #6b3a00; background: #fbf5ec; color: #6b3a00; padding: 6px 10px; margin: 12px 0; }
.note { color: #4a545e; font-size: 12px; margin: 0 0 4px; }
table { border-collapse: collapse; font-variant-numeric: tabular-nums; font-size: 12px; }
th, td { border: 1px solid #dcdedb; padding: 2px 6px; text-align: right; white-space: nowrap; }
th { background: #f1f2ef; font-weight: 600; }
td:first-child, th:first-child { text-align: left; }
img.view { max-width: 100%; border: 1px solid #c9ccc8; }
svg { display: block; max-width: 100%; height: auto; }
svg text { font: 11px system-ui, sans-serif; fill: #4a545e; }
.legend { display: flex; gap: 14px; flex-wrap: wrap; font-size: 12px; }
.legend span::before { content: ""; display: inline-block; width: 18px; height: 3px; margin-right: 5px; vertical-align: middle; background: var(--c); }
footer { margin-top: 28px; color: #4a545e; font-size: 12px; }
@media print {
  @page { size: A4; margin: 14mm 12mm 16mm; }
  body { margin: 0; max-width: none; padding: 0; font-size: 11px; color: #000; }
  h1 { font-size: 17px; }
  h2 { font-size: 13px; break-after: avoid; page-break-after: avoid; }
  figure, img.view, dl.facts, .caution, tr { break-inside: avoid; page-break-inside: avoid; }
  table { font-size: 10px; }
  th, td { padding: 1px 4px; }
  th { background: #eee !important; -webkit-print-color-adjust: exact; print-color-adjust: exact; }
  img.view { max-height: 120mm; }
  svg polyline { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
  .caution { background: none; }
}
`

const SVG_NS = 'http://www.w3.org/2000/svg'

function el<K extends keyof HTMLElementTagNameMap>(doc: Document, tag: K, text?: string, cls?: string): HTMLElementTagNameMap[K] {
  const e = doc.createElement(tag)
  if (text !== undefined) e.textContent = text
  if (cls) e.className = cls
  return e
}

function svgEl(doc: Document, tag: string, attrs: Record<string, string | number>, text?: string): SVGElement {
  const e = doc.createElementNS(SVG_NS, tag) as SVGElement
  for (const [k, v] of Object.entries(attrs)) e.setAttribute(k, String(v))
  if (text !== undefined) e.textContent = text
  return e
}

function tableOf(doc: Document, t: ReportTable): HTMLElement {
  const wrap = el(doc, 'div')
  const table = el(doc, 'table')
  table.dataset.table = t.id
  const thead = el(doc, 'thead'), hr = el(doc, 'tr')
  for (const h of t.head) hr.appendChild(el(doc, 'th', h))
  thead.appendChild(hr)
  const tbody = el(doc, 'tbody')
  for (const r of t.rows) {
    const tr = el(doc, 'tr')
    r.forEach((c, i) => tr.appendChild(el(doc, i === 0 ? 'th' : 'td', c)))
    tbody.appendChild(tr)
  }
  table.append(thead, tbody)
  wrap.appendChild(table)
  return wrap
}

function diagramOf(doc: Document, d: ReportDiagram): HTMLElement {
  const g = d.geometry
  const fig = el(doc, 'figure')
  fig.dataset.diagram = d.id
  fig.style.margin = '0'
  const svg = svgEl(doc, 'svg', { viewBox: `0 0 ${g.width} ${g.height}`, width: g.width, height: g.height, role: 'img' })
  svg.appendChild(svgEl(doc, 'title', {}, d.heading))
  const p = g.plot
  svg.appendChild(svgEl(doc, 'rect', { x: p.x, y: p.y, width: p.w, height: p.h, fill: '#fff', stroke: '#c9ccc8' }))
  for (const t of g.yTicks) {
    svg.appendChild(svgEl(doc, 'line', { x1: p.x, x2: p.x + p.w, y1: t.at, y2: t.at, stroke: '#eceeea' }))
    svg.appendChild(svgEl(doc, 'text', { x: p.x - 4, y: t.at + 4, 'text-anchor': 'end' }, t.label))
  }
  for (const t of g.xTicks) {
    svg.appendChild(svgEl(doc, 'line', { x1: t.at, x2: t.at, y1: p.y, y2: p.y + p.h, stroke: '#eceeea' }))
    svg.appendChild(svgEl(doc, 'text', { x: t.at, y: p.y + p.h + 14, 'text-anchor': 'middle' }, t.label))
  }
  if (g.zeroY !== null) svg.appendChild(svgEl(doc, 'line', { x1: p.x, x2: p.x + p.w, y1: g.zeroY, y2: g.zeroY, stroke: '#8a9096' }))
  for (const l of g.lines) {
    for (const run of l.runs) svg.appendChild(svgEl(doc, 'polyline', { points: run, fill: 'none', stroke: l.colour, 'stroke-width': 1.6 }))
  }
  svg.appendChild(svgEl(doc, 'text', { x: p.x + p.w / 2, y: g.height - 2, 'text-anchor': 'middle' }, d.xLabel))
  svg.appendChild(svgEl(doc, 'text', { x: 12, y: p.y + p.h / 2, 'text-anchor': 'middle', transform: `rotate(-90 12 ${p.y + p.h / 2})` }, d.yLabel))
  fig.appendChild(svg)
  const legend = el(doc, 'figcaption', undefined, 'legend')
  for (const l of g.lines) {
    const s = el(doc, 'span', l.label)
    s.style.setProperty('--c', l.colour)
    legend.appendChild(s)
  }
  fig.appendChild(legend)
  return fig
}

/** The report as the text of one HTML file. `doc` defaults to a fresh document of this page's DOM. */
export function renderReport(c: ReportContent, makeDoc: () => Document = () => document.implementation.createHTMLDocument('')): string {
  const doc = makeDoc()
  doc.documentElement.lang = 'en'
  const head = doc.head
  head.replaceChildren()
  const charset = doc.createElement('meta')
  charset.setAttribute('charset', 'utf-8')
  const csp = doc.createElement('meta')
  csp.httpEquiv = 'Content-Security-Policy'
  csp.content = REPORT_CSP
  const viewport = doc.createElement('meta')
  viewport.name = 'viewport'
  viewport.content = 'width=device-width, initial-scale=1'
  head.append(charset, csp, viewport, el(doc, 'title', c.title), el(doc, 'style', STYLE))
  const body = doc.body
  body.replaceChildren()
  body.appendChild(el(doc, 'h1', c.title))
  const dl = el(doc, 'dl', undefined, 'facts')
  for (const [k, v] of c.facts) dl.append(el(doc, 'dt', k), el(doc, 'dd', v))
  body.appendChild(dl)
  const caution = el(doc, 'p', c.caution, 'caution')
  caution.dataset.testid = 'report-caution'
  body.appendChild(caution)
  for (const b of c.blocks) {
    const sec = el(doc, 'section')
    sec.dataset.block = b.id
    sec.appendChild(el(doc, 'h2', b.heading))
    if (b.kind === 'table') {
      if (b.note) sec.appendChild(el(doc, 'p', b.note, 'note'))
      if (b.rows.length) sec.appendChild(tableOf(doc, b))
    } else if (b.kind === 'image') {
      const img = el(doc, 'img', undefined, 'view')
      img.src = b.src
      img.alt = b.alt
      sec.appendChild(img)
    } else {
      sec.appendChild(diagramOf(doc, b))
    }
    body.appendChild(sec)
  }
  body.appendChild(el(doc, 'footer', `Made with Tractus. ${c.caution}`))
  return '<!doctype html>\n' + doc.documentElement.outerHTML + '\n'
}
