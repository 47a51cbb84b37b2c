/**
 * Where the snapshot puts its overlays, in output pixels, for an image of w × h at scale s
 * (1, 2 or 4). Pure, so the end-to-end test can find the colour bar in the PNG it downloads.
 */
export interface Rect { readonly x: number; readonly y: number; readonly w: number; readonly h: number }

export interface SnapshotLayout {
  /** The colour bar itself (the gradient only). */
  readonly bar: Rect
  /** Band under the bar with the caution line. */
  readonly caution: Rect
  /** Panel behind the bar, its labels and the caution line. */
  readonly footer: Rect
  readonly margin: number
}

export function snapshotLayout(w: number, h: number, s: number): SnapshotLayout {
  const margin = Math.round(16 * s)
  const cautionH = Math.round(22 * s)
  const barH = Math.round(14 * s)
  const labelsH = Math.round(20 * s)
  const titleH = Math.round(20 * s)
  const footerH = titleH + barH + labelsH + cautionH
  const footer = { x: 0, y: h - footerH, w, h: footerH }
  const barW = Math.min(w - 2 * margin, Math.round(720 * s))
  const bar = { x: Math.round((w - barW) / 2), y: footer.y + titleH, w: barW, h: barH }
  const caution = { x: 0, y: h - cautionH, w, h: cautionH }
  return { bar, caution, footer, margin }
}
