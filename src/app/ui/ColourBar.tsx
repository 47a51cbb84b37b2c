import { useEffect, useRef } from 'react'
import { sectionColouring } from '../../scene/index.ts'
import { colourMapTable } from '../colourMaps.ts'
import { formatNumber, QUANTITY_LABEL, quantityDisplay } from '../format.ts'
import { activeRange, useStore } from '../store.ts'
import type { ColourMapName } from '../store.ts'

function Bar({ testId, title, unit, map, lo, hi, factor, note }: { testId: string; title: string; unit: string; map: ColourMapName; lo: number; hi: number; factor: number; note: string }) {
  const ref = useRef<HTMLCanvasElement>(null)
  useEffect(() => {
    const c = ref.current
    if (!c) return
    const g = c.getContext('2d')!
    const img = g.createImageData(256, 1)
    img.data.set(colourMapTable(map, 256))
    g.putImageData(img, 0, 0)
  }, [map])
  const ticks = [0, 0.25, 0.5, 0.75, 1]
  return (
    <div className="colourbar" data-testid={testId} data-min={String(lo)} data-max={String(hi)} data-map={map}>
      <div className="cb-title">
        {title} <span className="unit">[{unit}]</span>
        <span className="cb-map">{map}, {note}</span>
      </div>
      <canvas ref={ref} width={256} height={1} className="cb-gradient" aria-hidden />
      <div className="cb-ticks num">
        {ticks.map((t) => <span key={t} style={{ left: `${t * 100}%` }}>{formatNumber((lo + t * (hi - lo)) * factor)}</span>)}
      </div>
    </div>
  )
}

/**
 * Horizontal continuous colour bars along the bottom: the surface quantity, and the section
 * traction when the section face has its own map or range.
 */
export function ColourBar() {
  const st = useStore((s) => s)
  if (!st.model) return null
  const { factor, unit } = quantityDisplay(st.quantity, st.model.units, st.units)
  const [lo, hi] = activeRange(st)
  const sec = st.section.enabled && st.sectionBuffers ? sectionColouring(st) : null
  const secDisp = quantityDisplay(st.section.traction, st.model.units, st.units)
  return (
    <div className="colourbars">
      <Bar testId="colour-bar" title={QUANTITY_LABEL[st.quantity]} unit={unit} map={st.colourMap} lo={lo} hi={hi} factor={factor}
        note={st.range === 'auto' ? 'auto range' : 'fixed range'} />
      {sec && !sec.sharedWithSurface ? (
        <Bar testId="section-colour-bar" title={`Section: ${QUANTITY_LABEL[st.section.traction]}`} unit={secDisp.unit} map={sec.map}
          lo={sec.range[0]} hi={sec.range[1]} factor={secDisp.factor} note="section range" />
      ) : null}
    </div>
  )
}
