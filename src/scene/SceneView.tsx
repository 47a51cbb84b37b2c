import { useEffect, useMemo, useRef } from 'react'
import { displayFactor, displayUnitLabel } from '../model/units.ts'
import { activeRange, deformScaleOf, modelSphere, quantityExtremes, quantityScalars, sectionPlaneOf, sectionShown } from '../state/selectors.ts'
import { useStore } from '../state/store.ts'
import type { QuantityName } from '../state/store.ts'
import type { Vec3 } from '../../workers/protocol.ts'
import { ExtremeMarkers } from './ExtremeMarkers.tsx'
import type { ExtremeMark } from './ExtremeMarkers.tsx'
import { LineOverlay } from './LineOverlay.tsx'
import { EDGE } from './sceneLook.ts'
import { ArrowField } from './ArrowField.tsx'
import { CameraRig } from './CameraRig.tsx'
import { FirstDrawWarmUp } from './FirstDrawWarmUp.tsx'
import { FeatureEdges } from './FeatureEdges.tsx'
import { ProbeMarker } from './ProbeMarker.tsx'
import { ProbePicker } from './ProbePicker.tsx'
import { SceneCanvas } from './SceneCanvas.tsx'
import { SectionFill } from './SectionFill.tsx'
import { SectionHandle } from './SectionHandle.tsx'
import { SnapshotRegistrar } from './SnapshotRegistrar.tsx'
import { SurfaceMesh } from './SurfaceMesh.tsx'
import { ClosingFaces, InterfacePatches, RegionMarks } from './AssemblyMarks.tsx'
import { sectionColouring } from './sectionColouring.ts'
import { useClippingPlanes } from './useClippingPlanes.ts'
import { arrowColouring, arrowReference, roundDown125 } from './arrowColouring.ts'
import { ARROW_LENGTH_FRACTION } from './sceneLook.ts'
import { ScaleArrow } from './ScaleArrow.tsx'
import { SectionTriad } from './SectionTriad.tsx'
import { ElementMarker } from './ElementMarker.tsx'

/** Model sphere from the summary bounds: centre and radius, length units. */
function useModelSphere(): { center: [number, number, number]; radius: number; diagonal: number } | null {
  const model = useStore((s) => s.model)
  return useMemo(() => (model ? modelSphere(model.bounds) : null), [model])
}

/** Text of an extremes label: the app writes it (value and unit in the chosen system). */
export type ExtremeLabel = (kind: 'max' | 'min', value: number, quantity: QuantityName) => string

/** Everything inside the canvas; reads the store, holds no state of its own. */
function SceneContents({ extremeLabel }: { extremeLabel?: ExtremeLabel }) {
  const model = useStore((s) => s.model)
  const surface = useStore((s) => s.surface)
  const quantity = useStore((s) => s.quantity)
  const scalars = useStore(quantityScalars)
  // Lines, the deformed shape and the extremes markers.
  const deformScale = useStore(deformScaleOf)
  const deformation = useStore((s) => s.deformation)
  const deformationBuffers = useStore((s) => s.deformationBuffers)
  const line = useStore((s) => s.line)
  const lineResult = useStore((s) => s.lineResult)
  const extremesShown = useStore((s) => s.extremesShown)
  const extremes = useStore(quantityExtremes)
  // The labels carry units: a change of unit system writes them again.
  const unitSystem = useStore((s) => s.units)
  const marks = useMemo(
    () => (surface && extremesShown && extremes && extremeLabel ? extremeMarks(surface.positions, deformationBuffers?.surface ?? null, deformScale, extremes, quantity, extremeLabel) : null),
    // unitSystem: the label's text depends on it through extremeLabel.
    [surface, extremesShown, extremes, extremeLabel, deformationBuffers, deformScale, quantity, unitSystem],
  )
  // Select numbers, not fresh arrays: a selector returning a new array each call never settles.
  const rangeLo = useStore((s) => activeRange(s)[0])
  const rangeHi = useStore((s) => activeRange(s)[1])
  const range = useMemo(() => [rangeLo, rangeHi] as const, [rangeLo, rangeHi])
  const colourMap = useStore((s) => s.colourMap)
  const highlightedPatch = useStore((s) => s.highlightedPatch)
  const arrows = useStore((s) => s.arrows)
  const arrowSettings = useStore((s) => s.arrowSettings)
  const section = useStore((s) => s.section)
  // the section in the scene once its first cut has arrived (selectors.ts)
  const shown = useStore(sectionShown)
  const sectionBuffers = useStore((s) => s.sectionBuffers)
  const sectionMap = useStore((s) => sectionColouring(s).map)
  const sectionLo = useStore((s) => sectionColouring(s).range[0])
  const sectionHi = useStore((s) => sectionColouring(s).range[1])
  const sectionRange = useMemo(() => [sectionLo, sectionHi] as const, [sectionLo, sectionHi])
  const probe = useStore((s) => s.probe)
  const sectionResult = useStore((s) => s.sectionResult)
  const cut = useMemo(() => {
    if (!sectionResult || sectionResult.empty || !(sectionResult.area > 0)) return null
    // Twice the polar radius of gyration √(J/A) covers a compact section with a margin
    // (a rectangle's half-diagonal is √3 times it).
    return { centroid: sectionResult.centroid, halfSize: 2 * Math.sqrt(sectionResult.secondMoments.J / sectionResult.area) }
  }, [sectionResult])
  const sphere = useModelSphere()
  const renderer = useStore((s) => s.renderer)
  // The surface's back faces show the inside of the body through the cut. While the plane is
  // dragged on software WebGL, a section face cut at the plane on screen covers that opening, so
  // the second pass over the surface is hidden and only costs the rasteriser: at 10^6 elements it
  // was a third of each drag frame, which the main thread waits for when the canvas is read back.
  const faceCoversCut = section.dragging && renderer === 'software' && sectionBuffers !== null &&
    sectionResult !== null && sphere !== null && samePlane(sectionResult.plane, sectionPlaneOf(section), sphere.diagonal)
  // Optional: present when the worker sends feature edges with the surface.
  const edges = surface?.edges ?? null
  const clippingPlanes = useClippingPlanes()
  const normal = useMemo(() => sectionPlaneOf(section).normal, [section])
  // Arrows: coloured by their signed normal traction, one length scale for every field on screen.
  const arrowMap = useStore((s) => arrowColouring(s)?.map ?? s.colourMap)
  const arrowLo = useStore((s) => arrowColouring(s)?.range[0] ?? NaN)
  const arrowHi = useStore((s) => arrowColouring(s)?.range[1] ?? NaN)
  const arrowRange = useMemo(() => (Number.isNaN(arrowLo) ? null : [arrowLo, arrowHi] as const), [arrowLo, arrowHi])
  const reference = useStore((s) => arrowReference(s))
  const units = useStore((s) => s.units)
  // The last scale stays (hidden) while no arrows show, e.g. while a drag leaves them out.
  const lastScale = useRef<{ length: number; label: string } | null>(null)
  const scaleArrow = useMemo(() => {
    if (!model || !sphere || !(reference > 0)) return null
    // A round value in the shown stress unit, drawn at the length a traction of that value gets.
    const f = displayFactor(model.units, 'stress', units)
    const shown = roundDown125(reference * f)
    const value = shown / f
    const length = (ARROW_LENGTH_FRACTION * arrowSettings.scale * sphere.diagonal * value) / reference
    const text = shown >= 1e-3 && shown < 1e6 ? String(Number(shown.toPrecision(1))) : shown.toExponential(0).replace('e+', 'e')
    return { length, label: `${text.replace('-', '−')} ${displayUnitLabel('stress', units)}` }
  }, [model, sphere, reference, units, arrowSettings.scale])
  if (scaleArrow) lastScale.current = scaleArrow
  useEffect(() => { lastScale.current = null }, [model])
  const shownScale = scaleArrow ?? lastScale.current
  const markedElement = useStore((s) => s.markedElement)
  // --- assemblies: shown parts, colour by part, regions and interfaces ---
  const assembly = useStore((s) => s.assembly)
  const hiddenParts = useStore((s) => s.hiddenParts)
  const partColours = useStore((s) => s.partColours && s.assembly !== null)
  const regionTriangles = useStore((s) => s.regionTriangles)
  const highlightedRegion = useStore((s) => s.highlightedRegion)
  const interfacesShown = useStore((s) => s.interfacesShown)
  const highlightedInterface = useStore((s) => s.highlightedInterface)
  const partRanges = useMemo(() => {
    if (!assembly || hiddenParts.length === 0) return null
    const o = assembly.partTriangles
    return assembly.parts.flatMap((p, k): [number, number][] => (hiddenParts.includes(p.part) ? [] : [[o[k], o[k + 1] - o[k]]]))
  }, [assembly, hiddenParts])
  const closing = useMemo(() => (!assembly || hiddenParts.length === 0 ? [] : assembly.interfaces.flatMap((i, k) => (hiddenParts.includes(i.parts[0]) !== hiddenParts.includes(i.parts[1]) ? [k] : []))), [assembly, hiddenParts])
  const partRange = useMemo((): [number, number] => [-0.5, (assembly?.parts.length ?? 1) - 0.5], [assembly])
  // numbers only where the cut has several regions (one would sit on the section triad)
  const regionCentroids = useMemo(() => ((sectionResult?.regions?.length ?? 0) > 1 ? sectionResult!.regions!.map((g) => g.centroid) : []), [sectionResult])
  const sectionAxes = sectionResult && !sectionResult.empty ? sectionResult.axes : null

  return (
    <>
      <CameraRig />
      <ProbePicker />
      <SnapshotRegistrar />
      <FirstDrawWarmUp />
      {surface && model && (
        <SurfaceMesh
          surface={surface} scalars={partColours ? assembly!.vertexPart : scalars} displacement={deformationBuffers?.surface ?? null} deformScale={deformScale}
          range={partColours ? partRange : range} colourMap={partColours ? 'viridis' : colourMap}
          highlightedPatch={highlightedPatch} clippingPlanes={clippingPlanes} bounds={model.bounds} ranges={partRanges}
          clipped={shown && section.hide !== 'none' && !faceCoversCut}
        />
      )}
      {/* the feature edges belong to the whole body: left out while parts are hidden */}
      {edges && model && hiddenParts.length === 0 && (
        <FeatureEdges segments={edges} clippingPlanes={clippingPlanes} bounds={model.bounds} displacement={deformationBuffers?.edges ?? null} deformScale={deformScale} />
      )}
      {edges && model && deformScale !== 0 && deformation.outline && (
        <FeatureEdges segments={edges} clippingPlanes={clippingPlanes} bounds={model.bounds} colour={EDGE} opacity={0.25} />
      )}
      {arrows && sphere && arrowSettings.surface && (
        <ArrowField
          arrows={arrows} scale={arrowSettings.scale} diagonal={sphere.diagonal}
          colourMap={arrowMap} colourRange={arrowRange} reference={reference} clippingPlanes={clippingPlanes} deformScale={deformScale}
        />
      )}
      {shown && sectionBuffers && (
        <SectionFill buffers={sectionBuffers} traction={section.traction} range={sectionRange} colourMap={sectionMap} normal={normal} deformScale={deformScale} dragging={section.dragging} />
      )}
      {shown && sectionBuffers && sphere && arrowSettings.section && (
        <ArrowField
          arrows={sectionBuffers.arrows} scale={arrowSettings.scale} diagonal={sphere.diagonal}
          colourMap={arrowMap} colourRange={arrowRange} reference={reference} clippingPlanes={NO_PLANES} deformScale={deformScale}
        />
      )}
      {shown && sectionBuffers && regionTriangles && !section.dragging && (
        <RegionMarks buffers={sectionBuffers} offsets={regionTriangles} centroids={regionCentroids} highlighted={highlightedRegion} />
      )}
      {assembly && closing.length > 0 && (
        <ClosingFaces positions={assembly.interfacePositions} offsets={assembly.interfaceTriangles} shown={closing} clippingPlanes={clippingPlanes} />
      )}
      {assembly && interfacesShown && assembly.interfaces.length > 0 && (
        <InterfacePatches positions={assembly.interfacePositions} offsets={assembly.interfaceTriangles} highlighted={highlightedInterface} />
      )}
      {shownScale && model && sphere && <ScaleArrow bounds={model.bounds} length={shownScale.length} radius={0.004 * sphere.diagonal} label={shownScale.label} visible={scaleArrow !== null} />}
      {shown && cut && sectionAxes && (
        <SectionTriad centroid={cut.centroid} e1={sectionAxes.e1} e2={sectionAxes.e2} e3={sectionAxes.e3} length={0.3 * cut.halfSize} visible={!section.dragging} />
      )}
      {markedElement && <ElementMarker id={markedElement.id} centre={markedElement.centre} radius={markedElement.radius} />}
      {probe && sphere && <ProbeMarker position={moved(probe.position, probe.displacement, deformScale)} radius={0.006 * sphere.diagonal} />}
      {sphere && (line.from || lineResult) && (
        <LineOverlay reply={lineResult} from={line.from} to={line.to} deformScale={deformScale} radius={0.005 * sphere.diagonal} />
      )}
      {sphere && marks && <ExtremeMarkers marks={marks} radius={0.008 * sphere.diagonal} frameRadius={0.08 * sphere.diagonal} />}
      {shown && sphere && model && <SectionHandle section={section} center={sphere.center} radius={sphere.radius} bounds={model.bounds} cut={cut} />}
    </>
  )
}

const NO_PLANES: never[] = []

/** A point moved by scale × displacement (the deformed shape); as given without displacement. */
function moved(p: Vec3, u: Vec3 | undefined, scale: number): Vec3 {
  return u && scale ? [p[0] + scale * u[0], p[1] + scale * u[1], p[2] + scale * u[2]] : p
}

/** The markers of the largest and smallest value, at their surface vertices as drawn. */
function extremeMarks(
  positions: Float32Array, displacement: Float32Array | null, scale: number,
  x: { max: number; maxIndex: number; min: number; minIndex: number }, quantity: QuantityName, label: ExtremeLabel,
): ExtremeMark[] {
  const at = (v: number): Vec3 => [0, 1, 2].map((k) => positions[3 * v + k] + (displacement && scale ? scale * displacement[3 * v + k] : 0)) as Vec3
  if (x.maxIndex < 0 || x.minIndex < 0) return []
  return [
    { kind: 'max', position: at(x.maxIndex), label: label('max', x.max, quantity) },
    { kind: 'min', position: at(x.minIndex), label: label('min', x.min, quantity) },
  ]
}

type PlaneLike = { readonly point: readonly number[]; readonly normal: readonly number[] }

/** Same plane up to round-off: unit normals `a`, `b`; `size` the model's diagonal (length units). */
function samePlane(a: PlaneLike, b: PlaneLike, size: number): boolean {
  const m = a.normal, n = b.normal
  const tol = 1e-9 * size
  const shift = m[0] * (b.point[0] - a.point[0]) + m[1] * (b.point[1] - a.point[1]) + m[2] * (b.point[2] - a.point[2])
  return Math.abs(shift) <= tol && Math.abs(m[0] - n[0]) + Math.abs(m[1] - n[1]) + Math.abs(m[2] - n[2]) <= 1e-9
}

/** The 3D view of Tractus: fills its positioned parent. `extremeLabel` writes the extremes labels. */
export function SceneView({ extremeLabel }: { extremeLabel?: ExtremeLabel }) {
  return (
    <SceneCanvas>
      <SceneContents extremeLabel={extremeLabel} />
    </SceneCanvas>
  )
}
