import { useEffect, useRef } from 'react'
import { arrowColouring, sectionColouring } from '../../scene/index.ts'
import { colourMapTable } from '../../scene/colourMaps.ts'
import { formatNumber, QUANTITY_LABEL, quantityDisplay, quantityLabel } from '../format.ts'
import { activeRange } from '../../state/selectors.ts'
import { useStore } from '../../state/store.ts'
import type { ColourMapName } from '../../state/store.ts'

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
  const model = useStore((s) => s.model)
  const system = useStore((s) => s.units)
  const quantity = useStore((s) => s.quantity)
  const axes = useStore((s) => s.componentAxes)
  const colourMap = useStore((s) => s.colourMap)
  const auto = useStore((s) => s.range === 'auto')
  // Select numbers, not fresh arrays: a selector returning a new array each call never settles.
  const lo = useStore((s) => activeRange(s)[0])
  const hi = useStore((s) => activeRange(s)[1])
  const traction = useStore((s) => s.section.traction)
  const ownSectionBar = useStore((s) => s.section.enabled && s.sectionBuffers !== null && !sectionColouring(s).sharedWithSurface)
  const sectionMap = useStore((s) => sectionColouring(s).map)
  const sectionLo = useStore((s) => sectionColouring(s).range[0])
  const sectionHi = useStore((s) => sectionColouring(s).range[1])
  // The arrows get a bar of their own when they do not share the surface's map and range.
  const arrowsShown = useStore((s) => (s.arrowSettings.surface && s.arrows !== null) || (s.arrowSettings.section && s.section.enabled && s.sectionBuffers !== null && s.sectionBuffers.arrows.magnitudes.length > 0))
  const ownArrowBar = useStore((s) => arrowsShown && arrowColouring(s) !== null && !arrowColouring(s)!.sharedWithSurface)
  const arrowMap = useStore((s) => arrowColouring(s)?.map ?? 'RdBu')
  const arrowLo = useStore((s) => arrowColouring(s)?.range[0] ?? -1)
  const arrowHi = useStore((s) => arrowColouring(s)?.range[1] ?? 1)
  // --- assemblies: the surface coloured by part has no scale; the section keeps its own bar ---
  const partColours = useStore((s) => s.partColours && s.assembly !== null)
  const sectionShown = useStore((s) => s.section.enabled && s.sectionBuffers !== null)
  if (!model) return null
  const { factor, unit } = quantityDisplay(quantity, model.units, system)
  const secDisp = quantityDisplay(traction, model.units, system)
  return (
    <div className="colourbars">
      {partColours
        ? <div className="colourbar" data-testid="colour-bar-parts"><div className="cb-title">Surface coloured by part <span className="cb-map">the Parts card&apos;s swatches are the key</span></div></div>
        : <Bar testId="colour-bar" title={quantityLabel(quantity, axes)} unit={unit} map={colourMap} lo={lo} hi={hi} factor={factor}
          note={auto ? 'auto range' : 'fixed range'} />}
      {ownSectionBar || (partColours && sectionShown) ? (
        <Bar testId="section-colour-bar" title={`Section: ${QUANTITY_LABEL[traction]}`} unit={secDisp.unit} map={sectionMap}
          lo={sectionLo} hi={sectionHi} factor={secDisp.factor} note="section range" />
      ) : null}
      {ownArrowBar ? (
        <Bar testId="arrow-colour-bar" title="Arrows: normal traction tₙ" unit={quantityDisplay('normalTraction', model.units, system).unit} map={arrowMap}
          lo={arrowLo} hi={arrowHi} factor={quantityDisplay('normalTraction', model.units, system).factor} note="tension +" />
      ) : null}
    </div>
  )
}
