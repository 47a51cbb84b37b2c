import { SceneView as Scene3D } from '../scene/index.ts'
import { useStore } from '../state/store.ts'
import type { QuantityName } from '../state/store.ts'
import { formatNumber, quantityDisplay } from './format.ts'

/** The extremes labels' text: "max 123.4 MPa", in the chosen unit system. */
function extremeLabel(kind: 'max' | 'min', value: number, q: QuantityName): string {
  const st = useStore.getState()
  const { factor, unit } = quantityDisplay(q, st.model?.units, st.units)
  return `${kind} ${formatNumber(value * factor)} ${unit === '–' ? '' : unit}`.trim()
}

/** The 3D view area; the scene components (src/scene) draw into it. */
export function SceneView() {
  return <div className="scene" data-testid="scene"><Scene3D extremeLabel={extremeLabel} /></div>
}
