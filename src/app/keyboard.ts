/** Keyboard shortcuts for the frequent actions; the help overlay lists SHORTCUTS. */
import { engine } from './engine.ts'
import { takeSnapshot } from './actions.ts'
import { modelSphere } from '../state/selectors.ts'
import { QUANTITY_NAMES, useStore } from '../state/store.ts'
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
  if (k === 'escape') { if (st.helpOpen) st.setHelpOpen(false); else if (st.busy) void engine.cancelLoad(); return }
  if (k === '?') { st.setHelpOpen(!st.helpOpen); return }
  if (k === 'o') { openPicker(); e.preventDefault(); return }
  if (!st.model) return
  const sphere = modelSphere(st.model.bounds)
  if (k >= '1' && k <= '7') st.setQuantity(QUANTITY_NAMES[Number(k) - 1])
  else if (k === 'c') st.setSection({ enabled: !st.section.enabled })
  else if (k in AXIS) st.setSection({ enabled: true, normal: AXIS[k], offset: 0 })
  else if (k === '[' || k === ']') {
    // One step is a fiftieth of the model's size; the cut follows as for any other move of the plane.
    const step = sphere.diagonal / 50
    st.setSection({ enabled: true, offset: st.section.offset + (k === ']' ? step : -step) })
  } else if (k === 'a') { st.setArrowSettings({ surface: !st.arrowSettings.surface }) }
  else if (k === 'm') {
    const order = ['full', 'normal', 'shear'] as const
    st.setArrowSettings({ mode: order[(order.indexOf(st.arrowSettings.mode) + 1) % 3] })
  } else if (k === 'u') st.setUnits(st.units === 'SI' ? 'US' : 'SI')
  else if (k === 'f') st.requestView({ frame: { center: sphere.center, radius: sphere.radius } })
  else if (k === 'p') void takeSnapshot(2)
  else return
  e.preventDefault()
}
