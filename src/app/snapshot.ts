/**
 * The design-review snapshot: the scene rendered off-screen at 1x, 2x or 4x, with the colour bar,
 * quantity, units, model name, date, the section resultant table when a section is on, and the
 * caution line, composed on a 2D canvas and saved as PNG. All text is drawn with fillText (never
 * HTML), so a model name with markup stays text.
 */
import { CAUTION } from './caution.ts'
import { colourMapTable } from '../scene/colourMaps.ts'
import { axesLines, sectionRows } from './exports.ts'
import { formatNumber, QUANTITY_LABEL, quantityDisplay, quantityLabel } from './format.ts'
import { snapshotLayout } from './snapshotLayout.ts'
import { activeRange, modelSphere, modelWithInputs } from '../state/selectors.ts'
import type { ColourMapName, ReviewFields, TractusState } from '../state/store.ts'
import { arrowColouring, sectionColouring } from '../scene/index.ts'
import { displayUnitLabel } from '../model/units.ts'
import { TOOL_VERSION } from './version.ts'
import { regionTable } from './assemblyTables.ts'
import type { DisplayTable } from './assemblyTables.ts'
import { envelopeLines, envelopeOnPlane } from './envelopeExport.ts'
import type { EnvelopeLine } from './envelopeExport.ts'
import { sectionPlaneOf } from '../state/selectors.ts'
import { factorsText } from '../state/caseSlice.ts'

type Picture = HTMLCanvasElement | OffscreenCanvas

const FONT = 'system-ui, -apple-system, "Segoe UI", Roboto, sans-serif'

export async function composeSnapshot(st: TractusState, cssWidth: number, cssHeight: number, scale: number, fallback: HTMLCanvasElement | null): Promise<Blob> {
  const w = Math.round(cssWidth * scale), h = Math.round(cssHeight * scale)
  let picture: Picture | null = null
  if (st.snapshotRenderer) picture = await st.snapshotRenderer(w, h)
  const out = document.createElement('canvas')
  out.width = w
  out.height = h
  const g = out.getContext('2d')!
  g.fillStyle = '#eceef0'
  g.fillRect(0, 0, w, h)
  if (picture) g.drawImage(picture as CanvasImageSource, 0, 0, w, h)
  else if (fallback) g.drawImage(fallback, 0, 0, w, h)
  drawOverlays(g, st, w, h, scale)
  return new Promise((resolve, reject) => out.toBlob((b) => (b ? resolve(b) : reject(new Error('The browser could not encode the PNG.'))), 'image/png'))
}

function panel(g: CanvasRenderingContext2D, x: number, y: number, w: number, h: number): void {
  g.fillStyle = 'rgba(255,255,255,0.88)'
  g.fillRect(x, y, w, h)
}

/** The regions of the cut as a small table (at most 8 rows; the rest counted). */
function drawRegions(g: CanvasRenderingContext2D, t: DisplayTable, x0: number, y0: number, colW: number, s: number): void {
  const rowH = Math.round(15 * s), shown = t.rows.slice(0, 8), more = t.rows.length - shown.length
  const cols = [0, 0.08, 0.4, 0.58, 0.79, 1] // #, part, area, N, |V| (right edges from area on)
  panel(g, x0 - Math.round(8 * s), y0 - Math.round(6 * s), colW + Math.round(16 * s), rowH * (shown.length + 2 + (more > 0 ? 1 : 0)) + Math.round(8 * s))
  g.fillStyle = '#1d2329'
  g.font = `600 ${Math.round(12 * s)}px system-ui, sans-serif`
  g.fillText(`Regions (${t.rows.length}), largest force first; each about its own centroid`, x0, y0, colW)
  g.font = `${Math.round(10 * s)}px system-ui, sans-serif`
  const line = (cells: readonly string[], y: number): void => {
    g.textAlign = 'left'
    g.fillText(cells[0], x0, y)
    g.fillText(cells[1], x0 + cols[1] * colW, y, (cols[2] - cols[1] - 0.14) * colW)
    g.textAlign = 'right'
    for (let c = 2; c <= 4; c++) g.fillText(cells[c], x0 + cols[c + 1] * colW, y)
    g.textAlign = 'left'
  }
  g.fillStyle = '#4a545e'
  line(t.head, y0 + rowH)
  g.fillStyle = '#1d2329'
  shown.forEach((r, i) => line(r, y0 + rowH * (i + 2)))
  if (more > 0) g.fillText(`… and ${more} more (the exports list them all)`, x0, y0 + rowH * (shown.length + 2))
}

/** Height of the envelope table (px at scale s): title, head, a line per component. */
const envelopeHeight = (n: number, s: number): number => Math.round(15 * s) * (n + 2) + Math.round(8 * s)

/** The section's envelope over the load cases as a small table: component, largest and smallest with their governing case. */
function drawEnvelope(g: CanvasRenderingContext2D, title: string, lines: readonly EnvelopeLine[], x0: number, y0: number, colW: number, s: number): void {
  const rowH = Math.round(15 * s)
  // the symbol, then each extreme right-aligned with its governing case after it (fractions of the width)
  const cols = { hi: 0.36, hiCase: 0.38, lo: 0.8, loCase: 0.82 }
  panel(g, x0 - Math.round(8 * s), y0 - Math.round(6 * s), colW + Math.round(16 * s), envelopeHeight(lines.length, s))
  g.fillStyle = '#1d2329'
  g.font = `600 ${Math.round(12 * s)}px ${FONT}`
  g.fillText(title, x0, y0, colW)
  g.font = `${Math.round(10 * s)}px ${FONT}`
  const line = (l: EnvelopeLine, y: number, ink: string, caseInk: string): void => {
    g.fillStyle = ink
    g.textAlign = 'left'
    g.fillText(l.label, x0, y, 0.1 * colW)
    g.textAlign = 'right'
    g.fillText(l.largest, x0 + cols.hi * colW, y, 0.25 * colW)
    g.fillText(l.smallest, x0 + cols.lo * colW, y, 0.25 * colW)
    g.textAlign = 'left'
    g.fillStyle = caseInk
    g.fillText(l.largestCase, x0 + cols.hiCase * colW, y, (cols.lo - 0.25 - cols.hiCase - 0.01) * colW)
    g.fillText(l.smallestCase, x0 + cols.loCase * colW, y, (1 - cols.loCase) * colW)
  }
  line({ label: '', largest: 'largest', largestCase: 'case', smallest: 'smallest', smallestCase: 'case' }, y0 + rowH, '#4a545e', '#4a545e')
  // the symbol alone (N, V₁, …, M₂): the words would crowd the figures out
  lines.forEach((l, i) => line({ ...l, label: l.label.split(' ').pop() ?? l.label }, y0 + rowH * (i + 2), '#1d2329', '#4a545e'))
  g.textAlign = 'left'
}

/** "Load case: dead" or "Combination: ULS (1.35 × dead + 1.5 × imposed)" for the title block; null for a model of one case. */
function caseLine(st: TractusState): string | null {
  const m = st.model
  if (!m?.shownCase || ((m.cases?.length ?? 1) < 2 && !(m.combinations?.length) && st.userCombinations.length === 0)) return null
  const name = m.shownCase.toLowerCase()
  const combo = st.userCombinations.find((c) => c.name.toLowerCase() === name) ?? m.combinations?.find((c) => c.name.toLowerCase() === name)
  return combo ? `Combination: ${combo.name} (${factorsText(combo)})` : `Load case: ${m.shownCase}`
}

export function drawOverlays(g: CanvasRenderingContext2D, st: TractusState, w: number, h: number, s: number): void {
  const L = snapshotLayout(w, h, s)
  const m = st.model
  const { factor, unit } = quantityDisplay(st.quantity, m?.units, st.units)
  const range = activeRange(st)
  const px = (n: number): string => `${Math.round(n * s)}px ${FONT}`

  // Title block, top left: the reviewer's title (else the model's name), the quantity, the
  // review details, the date. At most half the width, so the section table keeps its place.
  const review = st.review
  const title = review.title.trim() || (m ? m.name || 'Unnamed model' : 'No model')
  const lines: { text: string; font: string; colour: string }[] = [
    { text: title, font: `600 ${px(14)}`, colour: '#1d2329' },
    ...(review.title.trim() && m ? [{ text: `Model: ${m.name || 'Unnamed model'}`, font: px(12), colour: '#1d2329' }] : []),
    { text: `${quantityLabel(st.quantity, st.componentAxes)} [${unit}]`, font: px(12), colour: '#1d2329' },
    ...[caseLine(st)].filter((t): t is string => t !== null).map((text) => ({ text, font: px(12), colour: '#1d2329' })),
    ...reviewLines(review).map((text) => ({ text, font: px(11), colour: '#1d2329' })),
    { text: new Date().toISOString().replace('T', ' ').slice(0, 16) + ' UTC', font: px(11), colour: '#4a545e' },
  ]
  const maxW = Math.round(w * 0.5)
  // Traceability, small: the inputs with their sizes and the start of their SHA-256 (the report
  // has the whole digest), the tool, the stress layout and the units.
  if (m) {
    g.font = px(10)
    for (const text of wrapText(g, traceItems(st), maxW - 2 * L.margin)) lines.push({ text, font: px(10), colour: '#4a545e' })
  }
  const lineH = Math.round(18 * s)
  let tw = 0
  for (const l of lines) { g.font = l.font; tw = Math.max(tw, g.measureText(l.text).width) }
  panel(g, 0, 0, Math.min(maxW, tw + 2 * L.margin), Math.round(10 * s) + lineH * lines.length)
  g.textBaseline = 'top'
  lines.forEach((l, i) => {
    g.font = l.font
    g.fillStyle = l.colour
    g.fillText(l.text, L.margin, Math.round(8 * s) + lineH * i, maxW - 2 * L.margin)
  })

  // Section table, top right.
  if (st.section.enabled && st.sectionResult && !st.sectionResult.empty && m) {
    const rows = sectionRows(st.sectionResult, m.units, st.units, modelSphere(m.bounds).diagonal).filter((r) => !['I1', 'I2', 'I12', 'fbF', 'fbM'].includes(r.key))
    const axes = axesLines(st.sectionResult)
    const rowH = Math.round(16 * s)
    const colW = Math.round(290 * s)
    const x0 = w - colW - L.margin, y0 = L.margin
    const sec = st.sectionBuffers ? sectionColouring(st) : null
    const ownBar = !!sec && !sec.sharedWithSurface
    const barBlock = ownBar ? Math.round(52 * s) : 0
    const head = 4 // title, normal, e1, e2
    panel(g, x0 - Math.round(8 * s), y0 - Math.round(6 * s), colW + Math.round(16 * s), rowH * (rows.length + head) + Math.round(12 * s) + barBlock)
    g.fillStyle = '#1d2329'
    g.font = `600 ${px(12)}`
    g.fillText('Section resultant', x0, y0)
    g.font = px(10)
    g.fillStyle = '#4a545e'
    g.fillText(`n = e₃ = ${axes.e3}; ${st.sectionResult.axes.kind === 'principal' ? 'principal axes' : 'reference axes'}${st.sectionResult.axes.followsReference && st.sectionResult.axes.kind === 'principal' ? ' (I₁ ≈ I₂: e₁ follows the reference)' : ''}`, x0, y0 + rowH, colW)
    g.fillStyle = '#8c4a00'
    g.fillText(`e₁ = ${axes.e1}`, x0, y0 + 2 * rowH, colW)
    g.fillStyle = '#1e6b40'
    g.fillText(`e₂ = ${axes.e2}`, x0, y0 + 3 * rowH, colW)
    g.font = px(11)
    rows.forEach((r, i) => {
      const y = y0 + rowH * (i + head)
      g.fillStyle = '#1d2329'
      g.textAlign = 'left'
      g.fillText(r.label, x0, y)
      g.textAlign = 'right'
      g.fillText(`${formatNumber(r.shown)} ${r.unit === '–' ? '' : r.unit}`, x0 + colW, y)
    })
    g.textAlign = 'left'
    if (ownBar && sec) {
      // The section face has its own map or range: its bar goes under the table.
      const d = quantityDisplay(st.section.traction, m.units, st.units)
      const by = y0 + rowH * (rows.length + head) + Math.round(4 * s)
      g.font = px(11)
      g.fillStyle = '#1d2329'
      g.fillText(`Section fill: ${QUANTITY_LABEL[st.section.traction]} [${d.unit}]`, x0, by)
      drawGradient(g, sec.map, x0, by + Math.round(16 * s), colW, Math.round(10 * s), s)
      g.font = px(10)
      g.fillText(formatNumber(sec.range[0] * d.factor), x0, by + Math.round(29 * s))
      g.textAlign = 'right'
      g.fillText(formatNumber(sec.range[1] * d.factor), x0 + colW, by + Math.round(29 * s))
      g.textAlign = 'left'
    }
    // --- assemblies: the regions of the cut under the section table ---
    const regions = st.sectionResult.regions ?? []
    const regionsY = y0 + rowH * (rows.length + head) + barBlock + Math.round(14 * s)
    const regionRows = regions.length > 1 ? Math.min(8, regions.length) + 2 + (regions.length > 8 ? 1 : 0) : 0
    if (regions.length > 1) drawRegions(g, regionTable(st.sectionResult, st.assembly, m.units, st.units), x0, regionsY, colW, s)
    // --- load cases: the section's envelope, when the cut card shows it for this plane ---
    const env = st.envelopeOpen && st.envelope?.envelope && envelopeOnPlane(st.envelope, sectionPlaneOf(st.section), modelSphere(m.bounds).diagonal) ? st.envelope : null
    if (env) {
      const lines = envelopeLines(env, m, st.units)
      const over = env.combinationsOnly ? 'the combinations' : `${env.cases.length} cases and combinations`
      const title = `Envelope over ${over}`
      const eh = envelopeHeight(lines.length, s)
      const below = (regionRows ? regionsY + Math.round(15 * s) * regionRows + Math.round(22 * s) : regionsY) + Math.round(10 * s)
      // under the section table where it fits above the footer, else bottom left
      const fits = below + eh <= L.footer.y - L.margin
      const envW = Math.min(Math.round(340 * s), w - 2 * L.margin)
      const ex = fits ? w - envW - L.margin : L.margin
      const ey = fits ? below : L.footer.y - L.margin - eh - (arrowBarShown(st) ? Math.round(64 * s) : 0)
      drawEnvelope(g, title, lines, ex, ey, envW, s)
    }
  }

  // The arrows' own colour bar, bottom left above the footer, when they do not share the surface's.
  const ac = arrowBarShown(st) ? arrowColouring(st) : null
  if (ac && !ac.sharedWithSurface && m) {
    const d = quantityDisplay('normalTraction', m.units, st.units)
    const bw = Math.round(220 * s), bh = Math.round(10 * s)
    const x0 = L.margin, y0 = L.footer.y - Math.round(58 * s)
    panel(g, x0 - Math.round(8 * s), y0 - Math.round(6 * s), bw + Math.round(16 * s), Math.round(54 * s))
    g.fillStyle = '#1d2329'
    g.font = px(11)
    g.fillText(`Arrow colour: ${QUANTITY_LABEL.normalTraction} [${d.unit}]`, x0, y0)
    drawGradient(g, ac.map, x0, y0 + Math.round(16 * s), bw, bh, s)
    g.font = px(10)
    g.fillText(formatNumber(ac.range[0] * d.factor), x0, y0 + Math.round(29 * s))
    g.textAlign = 'right'
    g.fillText(formatNumber(ac.range[1] * d.factor), x0 + bw, y0 + Math.round(29 * s))
    g.textAlign = 'left'
  }

  // Footer: quantity title, colour bar, labels, caution.
  panel(g, L.footer.x, L.footer.y, L.footer.w, L.footer.h)
  g.fillStyle = '#1d2329'
  g.font = px(12)
  g.textAlign = 'center'
  g.fillText(`${quantityLabel(st.quantity, st.componentAxes)} [${unit}]`, w / 2, L.footer.y + Math.round(3 * s))
  drawGradient(g, st.colourMap, L.bar.x, L.bar.y, L.bar.w, L.bar.h, s)
  g.font = px(11)
  const ticks = 5
  for (let i = 0; i < ticks; i++) {
    const t = i / (ticks - 1)
    const x = L.bar.x + t * L.bar.w
    g.beginPath()
    g.moveTo(x, L.bar.y + L.bar.h)
    g.lineTo(x, L.bar.y + L.bar.h + Math.round(4 * s))
    g.stroke()
    g.textAlign = i === 0 ? 'left' : i === ticks - 1 ? 'right' : 'center'
    g.fillText(formatNumber((range[0] + t * (range[1] - range[0])) * factor), x, L.bar.y + L.bar.h + Math.round(5 * s))
  }
  g.textAlign = 'center'
  g.fillStyle = '#6b3a00'
  g.font = px(11)
  g.fillText(CAUTION, w / 2, L.caution.y + Math.round(5 * s), w - 2 * L.margin)
  g.textAlign = 'left'
}

/** True when the arrows are drawn with a colour bar of their own (not the surface's). */
function arrowBarShown(st: TractusState): boolean {
  const arrowsShown = (st.arrowSettings.surface && st.arrows) || (st.arrowSettings.section && st.section.enabled && st.sectionBuffers)
  if (!arrowsShown || !st.model) return false
  const c = arrowColouring(st)
  return !!c && !c.sharedWithSurface
}

/** What a snapshot was made from, as short items: the input files, the tool, the stress, the units. */
function traceItems(st: TractusState): string[] {
  const m = modelWithInputs(st)!
  const files = m.inputs?.length
    ? m.inputs.map((f) => `${f.name} (${f.bytes.toLocaleString('en-US').replace(/,/g, ' ')} bytes${f.sha256 ? `, SHA-256 ${f.sha256.slice(0, 16)}…` : ''})`)
    : [m.source.startsWith('synthetic:') ? 'generated model' : m.source]
  const shown = (['length', 'force', 'stress'] as const).map((q) => displayUnitLabel(q, st.units)).join(', ')
  return [...files, `Tractus ${TOOL_VERSION}`, m.stressLayout === 'element-nodal' ? 'element-nodal stress' : 'nodal stress', `model units ${m.units.length}, ${m.units.stress}; shown in ${shown}`]
}

/** Items joined with " · " into lines no wider than `width` (the canvas's current font). */
function wrapText(g: CanvasRenderingContext2D, items: readonly string[], width: number): string[] {
  const lines: string[] = []
  let cur = ''
  for (const it of items) {
    const next = cur ? `${cur} · ${it}` : it
    if (cur && g.measureText(next).width > width) { lines.push(cur); cur = it } else cur = next
  }
  if (cur) lines.push(cur)
  return lines
}

/** The reviewer's details as short lines (empty ones left out). */
function reviewLines(r: ReviewFields): string[] {
  const pairs: [string, string][] = [['Project', r.project], ['Revision', r.revision], ['Load case', r.loadCase], ['Author', r.author], ['Checker', r.checker]]
  const filled = pairs.filter(([, v]) => v.trim() !== '').map(([k, v]) => `${k}: ${v.trim()}`)
  const lines: string[] = []
  for (let i = 0; i < filled.length; i += 3) lines.push(filled.slice(i, i + 3).join(' · '))
  if (r.notes.trim()) lines.push(`Notes: ${r.notes.trim().replace(/\s+/g, ' ')}`)
  return lines
}

/** A horizontal colour-map gradient with a thin frame, low end on the left. */
function drawGradient(g: CanvasRenderingContext2D, map: ColourMapName, x: number, y: number, w: number, h: number, s: number): void {
  const table = colourMapTable(map, 256)
  const img = g.createImageData(w, 1)
  for (let i = 0; i < w; i++) {
    const k = Math.min(255, Math.floor((i / Math.max(1, w - 1)) * 255 + 0.5))
    img.data.set(table.subarray(4 * k, 4 * k + 4), 4 * i)
  }
  for (let r = 0; r < h; r++) g.putImageData(img, x, y + r)
  g.strokeStyle = '#1d2329'
  g.lineWidth = Math.max(1, s)
  g.strokeRect(x, y, w, h)
}
