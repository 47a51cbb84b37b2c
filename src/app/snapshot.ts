/**
 * The design-review snapshot: the scene rendered off-screen at 1x, 2x or 4x, with the colour bar,
 * quantity, units, model name, date, the section resultant table when a section is on, and the
 * caution line, composed on a 2D canvas and saved as PNG. All text is drawn with fillText (never
 * HTML), so a model name with markup stays text.
 */
import { CAUTION } from './caution.ts'
import { colourMapTable } from '../scene/colourMaps.ts'
import { sectionRows } from './exports.ts'
import { formatNumber, QUANTITY_LABEL, quantityDisplay, quantityLabel } from './format.ts'
import { snapshotLayout } from './snapshotLayout.ts'
import { activeRange, sectionPlaneOf } from '../state/selectors.ts'
import type { ColourMapName, TractusState } from '../state/store.ts'
import { sectionColouring } from '../scene/index.ts'

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

export function drawOverlays(g: CanvasRenderingContext2D, st: TractusState, w: number, h: number, s: number): void {
  const L = snapshotLayout(w, h, s)
  const m = st.model
  const { factor, unit } = quantityDisplay(st.quantity, m?.units, st.units)
  const range = activeRange(st)
  const px = (n: number): string => `${Math.round(n * s)}px ${FONT}`

  // Title block, top left.
  const lines = [
    m ? m.name || 'Unnamed model' : 'No model',
    `${quantityLabel(st.quantity, st.componentAxes)} [${unit}] · units ${st.units === 'SI' ? 'SI' : 'US customary'}`,
    new Date().toISOString().replace('T', ' ').slice(0, 16) + ' UTC',
  ]
  g.font = px(13)
  const tw = Math.max(...lines.map((t) => g.measureText(t).width)) + 2 * L.margin
  panel(g, 0, 0, Math.min(w, tw), Math.round(66 * s))
  g.fillStyle = '#1d2329'
  g.textBaseline = 'top'
  g.font = `600 ${px(14)}`
  g.fillText(lines[0], L.margin, Math.round(8 * s), w - 2 * L.margin)
  g.font = px(12)
  g.fillText(lines[1], L.margin, Math.round(28 * s), w - 2 * L.margin)
  g.fillStyle = '#4a545e'
  g.fillText(lines[2], L.margin, Math.round(46 * s), w - 2 * L.margin)

  // Section table, top right.
  if (st.section.enabled && st.sectionResult && m) {
    const rows = sectionRows(st.sectionResult, m.units, st.units).filter((r) => !['I1', 'I2', 'fbF', 'fbM'].includes(r.key))
    const rowH = Math.round(16 * s)
    const colW = Math.round(250 * s)
    const x0 = w - colW - L.margin, y0 = L.margin
    const plane = sectionPlaneOf(st.section)
    const sec = st.sectionBuffers ? sectionColouring(st) : null
    const ownBar = !!sec && !sec.sharedWithSurface
    const barBlock = ownBar ? Math.round(52 * s) : 0
    panel(g, x0 - Math.round(8 * s), y0 - Math.round(6 * s), colW + Math.round(16 * s), rowH * (rows.length + 2) + Math.round(12 * s) + barBlock)
    g.fillStyle = '#1d2329'
    g.font = `600 ${px(12)}`
    g.fillText('Section resultant', x0, y0)
    g.font = px(10)
    g.fillStyle = '#4a545e'
    g.fillText(`n = (${plane.normal.map((v) => formatNumber(v, 3)).join(', ')})`, x0, y0 + rowH)
    g.font = px(11)
    rows.forEach((r, i) => {
      const y = y0 + rowH * (i + 2)
      g.fillStyle = '#1d2329'
      g.textAlign = 'left'
      g.fillText(r.label, x0, y)
      g.textAlign = 'right'
      g.fillText(`${formatNumber(r.value)} ${r.unit === '–' ? '' : r.unit}`, x0 + colW, y)
    })
    g.textAlign = 'left'
    if (ownBar && sec) {
      // The section face has its own map or range: its bar goes under the table.
      const d = quantityDisplay(st.section.traction, m.units, st.units)
      const by = y0 + rowH * (rows.length + 2) + Math.round(4 * s)
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
