import { useEffect, useRef } from 'react'
import { colourMapTable } from '../colourMaps.ts'
import { formatNumber, QUANTITY_LABEL, quantityDisplay } from '../format.ts'
import { activeRange, useStore } from '../store.ts'

/** Horizontal continuous colour bar along the bottom: quantity, units, range, ticks, map name. */
export function ColourBar() {
  const st = useStore((s) => s)
  const ref = useRef<HTMLCanvasElement>(null)
  const map = st.colourMap
  useEffect(() => {
    const c = ref.current
    if (!c) return
    const g = c.getContext('2d')!
    const t = colourMapTable(map, 256)
    const img = g.createImageData(256, 1)
    img.data.set(t)
    g.putImageData(img, 0, 0)
  }, [map])
  if (!st.model) return null
  const { factor, unit } = quantityDisplay(st.quantity, st.model.units, st.units)
  const [lo, hi] = activeRange(st)
  const ticks = [0, 0.25, 0.5, 0.75, 1]
  return (
    <div className="colourbar" data-testid="colour-bar" data-min={String(lo)} data-max={String(hi)} data-map={map}>
      <div className="cb-title">
        {QUANTITY_LABEL[st.quantity]} <span className="unit">[{unit}]</span>
        <span className="cb-map">{map}{st.range === 'auto' ? ', auto range' : ', fixed range'}</span>
      </div>
      <canvas ref={ref} width={256} height={1} className="cb-gradient" aria-hidden />
      <div className="cb-ticks num">
        {ticks.map((t) => <span key={t} style={{ left: `${t * 100}%` }}>{formatNumber((lo + t * (hi - lo)) * factor)}</span>)}
      </div>
    </div>
  )
}
