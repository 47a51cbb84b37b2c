import { showView, frameModel } from '../views.ts'
import type { ViewName } from '../views.ts'
import { useStore } from '../../state/store.ts'

const VIEWS: readonly [ViewName, string, string][] = [
  ['+x', '+x', 'Look along +x (from the −x side) · Shift+X'],
  ['-x', '−x', 'Look along −x (from the +x side)'],
  ['+y', '+y', 'Look along +y (from the −y side) · Shift+Y'],
  ['-y', '−y', 'Look along −y (from the +y side)'],
  ['+z', '+z', 'Look along +z (from the −z side) · Shift+Z'],
  ['-z', '−z', 'Look along −z (from the +z side)'],
  ['iso', 'iso', 'Isometric view · I'],
]

/** Buttons over the scene that turn the view: along each axis either way, isometric, and the whole model. */
export function ViewButtons() {
  const model = useStore((s) => s.model)
  if (!model) return null
  return (
    <div className="view-buttons" role="group" aria-label="View" data-testid="view-buttons">
      <span className="lbl">View</span>
      {VIEWS.map(([name, text, title]) => (
        <button key={name} type="button" data-testid={`view-${name}`} title={title} onClick={() => showView(name)}>{text}</button>
      ))}
      <button type="button" data-testid="view-fit" title="Frame the whole model · F" onClick={() => frameModel()}>fit</button>
    </div>
  )
}
