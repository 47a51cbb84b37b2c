/**
 * The key map: every key and what it does, grouped as the help overlay lists them (SHORTCUTS).
 * Letters X, Y, Z turn the cut; with Shift they turn the view (many 3D viewers use the plain
 * letters for views, so the help says which is which).
 */
import { engine } from './engine.ts'
import { takeSnapshot } from './actions.ts'
import { frameModel, lookAtSection, showView } from './views.ts'
import { QUANTITY_NAMES, useStore } from '../state/store.ts'
import type { UnitPreset } from '../state/store.ts'
import type { Vec3 } from '../model/model.ts'

export type ShortcutGroup = 'View' | 'Cut' | 'Colour and arrows' | 'Model, units and output'

export const SHORTCUTS: readonly (readonly [string, string, ShortcutGroup])[] = [
  ['Shift+X  Shift+Y  Shift+Z', 'Look along +x, +y or +z (view only; the cut stays)', 'View'],
  ['I', 'Isometric view', 'View'],
  ['F', 'Frame the whole model', 'View'],
  ['L', 'Look straight at the section face', 'View'],
  ['C', 'Cut on / off', 'Cut'],
  ['X  Y  Z', 'Turn the cut normal to x, y or z (the view stays)', 'Cut'],
  ['[  ]', 'Move the cut back / forward', 'Cut'],
  ['1 – 7', 'Colour by quantity 1 to 7', 'Colour and arrows'],
  ['A', 'Arrows on the surface on / off', 'Colour and arrows'],
  ['M', 'Arrows: traction, normal part, shear part', 'Colour and arrows'],
  ['O', 'Open model files', 'Model, units and output'],
  ['U', 'Units: SI, US customary, the model\'s own in turn', 'Model, units and output'],
  ['W', 'Wide / narrow cards', 'Model, units and output'],
  ['P', 'Save a PNG snapshot (2×)', 'Model, units and output'],
  ['?', 'This list of keys', 'Model, units and output'],
  ['Esc', 'Close this list, cancel a load', 'Model, units and output'],
]

const AXIS: Record<string, Vec3> = { x: [1, 0, 0], y: [0, 1, 0], z: [0, 0, 1] }
const UNIT_CYCLE: readonly UnitPreset[] = ['SI', 'US', 'model']

export function handleKey(e: KeyboardEvent, openPicker: () => void): void {
  const t = e.target as HTMLElement | null
  if (e.ctrlKey || e.metaKey || e.altKey) return
  if (t && (t.tagName === 'INPUT' || t.tagName === 'SELECT' || t.tagName === 'TEXTAREA' || t.isContentEditable)) return
  const st = useStore.getState()
  const k = e.key.toLowerCase()
  if (k === 'escape') { if (st.helpOpen) st.setHelpOpen(false); else if (st.busy) void engine.cancelLoad(); return }
  if (k === '?') { st.setHelpOpen(!st.helpOpen); return }
  if (k === 'o') { openPicker(); e.preventDefault(); return }
  if (k === 'w') { st.setWideCards(!st.wideCards); e.preventDefault(); return }
  if (!st.model) return
  if (e.shiftKey && k in AXIS) { showView(`+${k}` as '+x' | '+y' | '+z'); e.preventDefault(); return }
  if (k >= '1' && k <= '7') st.setQuantity(QUANTITY_NAMES[Number(k) - 1])
  else if (k === 'c') st.setSection({ enabled: !st.section.enabled })
  else if (k in AXIS) st.setSection({ enabled: true, normal: AXIS[k], offset: 0 })
  else if (k === '[' || k === ']') {
    // One step is a fiftieth of the model's size; the cut follows as for any other move of the plane.
    const b = st.model.bounds
    const step = (Math.hypot(b.max[0] - b.min[0], b.max[1] - b.min[1], b.max[2] - b.min[2]) || 1) / 50
    st.setSection({ enabled: true, offset: st.section.offset + (k === ']' ? step : -step) })
  } else if (k === 'a') { st.setArrowSettings({ surface: !st.arrowSettings.surface }) }
  else if (k === 'm') {
    const order = ['full', 'normal', 'shear'] as const
    st.setArrowSettings({ mode: order[(order.indexOf(st.arrowSettings.mode) + 1) % 3] })
  } else if (k === 'u') {
    const i = UNIT_CYCLE.indexOf(st.unitPreset)
    st.setUnitPreset(UNIT_CYCLE[(i + 1) % UNIT_CYCLE.length])
  } else if (k === 'f') frameModel()
  else if (k === 'i') showView('iso')
  else if (k === 'l') lookAtSection()
  else if (k === 'p') void takeSnapshot(2)
  else return
  e.preventDefault()
}
