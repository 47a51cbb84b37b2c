/** Keyboard shortcuts for the frequent actions; the help overlay lists SHORTCUTS. */
import { cancelLoad, refreshSurfaceArrows } from './engine.ts'
import { takeSnapshot } from './actions.ts'
import { isSignedQuantity, QUANTITY_NAMES, useStore } from './store.ts'
import type { Vec3 } from '../model/model.ts'

export const SHORTCUTS: readonly (readonly [string, string])[] = [
  ['O', 'Open model files'],
  ['1 – 7', 'Colour by quantity 1 to 7'],
  ['C', 'Cut on / off'],
  ['X  Y  Z', 'Turn the cut normal to an axis'],
  ['[  ]', 'Move the cut back / forward'],
  ['A', 'Arrows on the surface on / off'],
  ['M', 'Arrows: traction, normal part, shear part'],
  ['U', 'Switch SI / US customary units'],
  ['F', 'Frame the whole model'],
  ['P', 'Save a PNG snapshot (2×)'],
  ['?', 'This help'],
  ['Esc', 'Close help, cancel a load'],
]

const AXIS: Record<string, Vec3> = { x: [1, 0, 0], y: [0, 1, 0], z: [0, 0, 1] }

export function handleKey(e: KeyboardEvent, openPicker: () => void): void {
  const t = e.target as HTMLElement | null
  if (e.ctrlKey || e.metaKey || e.altKey) return
  if (t && (t.tagName === 'INPUT' || t.tagName === 'SELECT' || t.tagName === 'TEXTAREA' || t.isContentEditable)) return
  const st = useStore.getState()
  const k = e.key.toLowerCase()
  if (k === 'escape') { if (st.helpOpen) st.set({ helpOpen: false }); else if (st.busy) void cancelLoad(); return }
  if (k === '?') { st.set({ helpOpen: !st.helpOpen }); return }
  if (k === 'o') { openPicker(); e.preventDefault(); return }
  if (!st.model) return
  if (k >= '1' && k <= '7') {
    const q = QUANTITY_NAMES[Number(k) - 1]
    const signed = isSignedQuantity(q)
    st.set({ quantity: q, range: 'auto', colourMap: signed === isSignedQuantity(st.quantity) ? st.colourMap : signed ? 'RdBu' : 'viridis' })
  } else if (k === 'c') st.setSection({ enabled: !st.section.enabled })
  else if (k in AXIS) st.setSection({ enabled: true, normal: AXIS[k], offset: 0 })
  else if (k === '[' || k === ']') {
    const b = st.model.bounds
    const step = Math.hypot(b.max[0] - b.min[0], b.max[1] - b.min[1], b.max[2] - b.min[2]) / 50
    st.setSection({ enabled: true, offset: st.section.offset + (k === ']' ? step : -step) })
  } else if (k === 'a') { st.setArrowSettings({ surface: !st.arrowSettings.surface }) }
  else if (k === 'm') {
    const order = ['full', 'normal', 'shear'] as const
    st.setArrowSettings({ mode: order[(order.indexOf(st.arrowSettings.mode) + 1) % 3] })
  } else if (k === 'u') st.set({ units: st.units === 'SI' ? 'US' : 'SI' })
  else if (k === 'f') {
    const b = st.model.bounds
    st.requestView({ frame: { center: [(b.min[0] + b.max[0]) / 2, (b.min[1] + b.max[1]) / 2, (b.min[2] + b.max[2]) / 2], radius: Math.hypot(b.max[0] - b.min[0], b.max[1] - b.min[1], b.max[2] - b.min[2]) / 2 } })
  } else if (k === 'p') void takeSnapshot(2)
  else return
  e.preventDefault()
}

/** Arrow settings that change the sampled arrows (not only their drawing) refetch them. */
export function watchArrowSettings(): () => void {
  return useStore.subscribe((s, p) => {
    const a = s.arrowSettings, b = p.arrowSettings
    if (a !== b && (a.surface !== b.surface || a.mode !== b.mode || a.budget !== b.budget)) void refreshSurfaceArrows()
  })
}
