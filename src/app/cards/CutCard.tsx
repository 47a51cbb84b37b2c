import type { Vec3 } from '../../model/model.ts'
import { displayFactor } from '../../model/units.ts'
import type { SectionResult } from '../../mechanics/types.ts'
import { Card } from '../ui/Card.tsx'
import { EnvelopeSection } from './EnvelopeTable.tsx'
import { Num, Vec } from '../ui/Num.tsx'
import { NumberField } from '../ui/NumberField.tsx'
import { axesLines, download, fileStem, sectionCsv, sectionJson, sectionRows } from '../exports.ts'
import type { FigureRow } from '../exports.ts'
import { formatNumber, unitLabel } from '../format.ts'
import { lookAtSection } from '../views.ts'
import { modelSphere, sectionPlaneOf } from '../../state/selectors.ts'
import { useStore } from '../../state/store.ts'
import type { SectionState } from '../../state/store.ts'
import { RegionTable, SectionLimitControl } from './SectionRegions.tsx'

/**
 * The offset slider. While the pointer holds it, moves go through the store's section drag (the
 * protocol the scene's handle uses too: one cut at a time, the newest step wins, the plane shown
 * with its cut) and the thumb follows the pointer from the drag's target. Keys on the focused
 * slider move the plane directly. The value beside it follows every drag, the handle's too.
 */
function OffsetSlider({ half }: { half: number }) {
  const offset = useStore((s) => s.section.offset)
  const target = useStore((s) => s.sectionDrag?.offset ?? null)
  const setSection = useStore((s) => s.setSection)
  const beginSectionDrag = useStore((s) => s.beginSectionDrag)
  const dragSection = useStore((s) => s.dragSection)
  const endSectionDrag = useStore((s) => s.endSectionDrag)
  const shown = target ?? offset
  return (
    <label className="slider">
      <span className="lbl">Offset</span>
      <input
        type="range" data-testid="cut-offset" min={-half} max={half} step={half / 500} value={shown}
        onChange={(e) => {
          const v = Number(e.target.value)
          if (useStore.getState().section.dragging) dragSection(v)
          else setSection({ offset: v })
        }}
        onPointerDown={() => beginSectionDrag()}
        onPointerUp={() => endSectionDrag()}
        onPointerCancel={() => endSectionDrag()}
      />
      <span data-testid="cut-offset-value"><Num v={shown} q="length" floor={1e-9 * half} /></span>
    </label>
  )
}

const AXES: [string, Vec3][] = [['x', [1, 0, 0]], ['y', [0, 1, 0]], ['z', [0, 0, 1]]]

/** The choice of section axes: principal or reference, and the reference direction. */
function AxesChoice({ explain }: { explain: boolean }) {
  const choice = useStore((s) => s.sectionAxes)
  const setSectionAxes = useStore((s) => s.setSectionAxes)
  const note = useStore((s) => s.cutInfo?.axesNote ?? null)
  const ref = choice.reference ?? null
  const refKey = !ref ? 'auto' : AXES.find(([, v]) => v[0] === ref[0] && v[1] === ref[1] && v[2] === ref[2])?.[0] ?? 'typed'
  return (
    <>
      <div className="row">
        <label className="pair">
          <span className="lbl">Axes</span>
          <select value={choice.kind} data-testid="cut-axes" onChange={(e) => setSectionAxes({ ...choice, kind: e.target.value as 'principal' | 'reference' })}>
            <option value="principal">principal axes of the section</option>
            <option value="reference">reference axes</option>
          </select>
        </label>
      </div>
      <div className="row">
        <label className="pair">
          <span className="lbl">Reference</span>
          <select value={refKey} data-testid="cut-reference" onChange={(e) => {
            const k = e.target.value
            const axis = AXES.find(([name]) => name === k)
            setSectionAxes({ ...choice, reference: k === 'auto' ? null : axis ? axis[1] : ref ?? [1, 0, 0] })
          }}>
            <option value="auto">x, y or z: the longest in the plane</option>
            <option value="x">x</option>
            <option value="y">y</option>
            <option value="z">z</option>
            <option value="typed">typed…</option>
          </select>
        </label>
      </div>
      {refKey === 'typed' && ref ? (
        <div className="row">
          <span className="lbl">Direction</span>
          {[0, 1, 2].map((k) => (
            <NumberField key={k} label={'xyz'[k]} value={ref[k]} width={4} testId={`cut-ref-${'xyz'[k]}`} onCommit={(v) => {
              const r = [...ref] as Vec3
              r[k] = v
              if (Math.hypot(...r) > 0) setSectionAxes({ ...choice, reference: r })
            }} />
          ))}
        </div>
      ) : null}
      {explain ? <p className="note">
        {choice.kind === 'principal'
          ? 'e₁, e₂: the principal axes of the section area (I₁ ≥ I₂), signed towards the reference; where I₁ and I₂ lie within 1 %, e₁ follows the reference.'
          : 'e₁: the reference direction projected onto the plane; e₂ = n × e₁.'}
      </p> : null}
      {note ? <p className="note bad" data-testid="cut-axes-note">{note}</p> : null}
    </>
  )
}

/** Where the body is, when the plane misses it: its extent along n, in the shown length unit, and a way back into it. */
function MissNote({ section, extent }: { section: SectionState; extent: readonly [number, number] | null }) {
  const model = useStore((s) => s.model)!
  const system = useStore((s) => s.units)
  const setSection = useStore((s) => s.setSection)
  const Lf = displayFactor(model.units, 'length', system)
  const Lu = unitLabel('length', system)
  const plane = sectionPlaneOf(section)
  const at = plane.point[0] * plane.normal[0] + plane.point[1] * plane.normal[1] + plane.point[2] * plane.normal[2]
  const nText = `(${plane.normal.map((v) => formatNumber(v, 3)).join(', ')})`
  return (
    <div className="note bad" data-testid="cut-empty">
      <p className="note bad">
        The plane misses the body. {extent
          ? <>Along n = {nText} the body spans x·n = {formatNumber(extent[0] * Lf)} … {formatNumber(extent[1] * Lf)} {Lu}; this plane lies at x·n = {formatNumber(at * Lf)} {Lu}. Typed coordinates are in {Lu}.</>
          : null}
      </p>
      {extent ? (
        <button type="button" data-testid="cut-into-body" onClick={() => {
          // The plane through the middle of the body's extent along n.
          const mid = (extent[0] + extent[1]) / 2
          setSection({ offset: section.offset + (mid - at) })
        }}>Move the plane into the body</button>
      ) : null}
    </div>
  )
}

/** The section axes e₁, e₂, e₃ as unit vectors, and which kind they are. */
function AxesShown({ r }: { r: SectionResult }) {
  const a = axesLines(r)
  return (
    <div className="axes" data-testid="cut-axes-shown" data-kind={r.axes.kind}>
      <p className="note">{a.kind.charAt(0).toUpperCase() + a.kind.slice(1)}.</p>
      <table className="figures">
        <tbody>
          <tr><th><span className="axis e1">e₁</span></th><td className="vec" data-row="e1">{a.e1}</td></tr>
          <tr><th><span className="axis e2">e₂</span></th><td className="vec" data-row="e2">{a.e2}</td></tr>
          <tr><th><span className="axis n">e₃ = n</span></th><td className="vec" data-row="e3">{a.e3}</td></tr>
        </tbody>
      </table>
    </div>
  )
}

/** The cutting plane: typed point and normal, axis snaps, offset slider, section axes, and the resultant. */
export function CutCard() {
  const model = useStore((s) => s.model)
  const section = useStore((s) => s.section)
  const result = useStore((s) => s.sectionResult)
  const inputError = useStore((s) => s.sectionInputError)
  const extent = useStore((s) => s.cutInfo?.extent ?? null)
  const system = useStore((s) => s.units)
  const setSection = useStore((s) => s.setSection)
  if (!model) return null
  const Lf = displayFactor(model.units, 'length', system)
  const Lu = unitLabel('length', system)
  const sphere = modelSphere(model.bounds)
  const half = Math.max(1e-12, sphere.radius)
  const plane = sectionPlaneOf(section)
  const setPoint = (k: number, v: number): void => {
    const p = [...section.point] as Vec3
    p[k] = v / Lf
    setSection({ point: p })
  }
  const setNormal = (k: number, v: number): void => {
    const n = [...section.normal] as Vec3
    n[k] = v
    // A normal with no direction is refused by the store, which keeps the previous plane and cut.
    setSection({ normal: n })
  }
  const rows = result && !result.empty ? sectionRows(result, model.units, system, sphere.diagonal) : []
  const byKey = new Map<string, FigureRow>(rows.map((r) => [r.key, r]))
  const Row = ({ k }: { k: string }) => {
    const r = byKey.get(k)
    if (!r) return null
    return <tr data-row={r.key}><th>{r.label}</th><td><Num v={r.model} q={r.q} floor={r.floor} /></td></tr>
  }
  return (
    <Card id="cut" title="Cut">
      <label className="check">
        <input type="checkbox" data-testid="cut-enabled" checked={section.enabled} onChange={(e) => setSection({ enabled: e.target.checked })} />
        Cut the body with a plane <kbd>C</kbd>
      </label>
      {section.enabled ? (
        <>
          <div className="row">
            <span className="lbl">Point [{Lu}]</span>
            {[0, 1, 2].map((k) => <NumberField key={k} label={'xyz'[k]} value={section.point[k] * Lf} onCommit={(v) => setPoint(k, v)} testId={`cut-p${'xyz'[k]}`} invalid={inputError?.field === 'point'} />)}
          </div>
          <div className="row">
            <span className="lbl">Normal</span>
            {[0, 1, 2].map((k) => <NumberField key={k} label={'xyz'[k]} value={section.normal[k]} onCommit={(v) => setNormal(k, v)} testId={`cut-n${'xyz'[k]}`} width={4} invalid={inputError?.field === 'normal'} />)}
          </div>
          {inputError ? <p className="note bad" data-testid="cut-input-error">{inputError.message}. The previous plane is kept.</p> : null}
          <div className="row">
            <span className="lbl">Normal to</span>
            {AXES.map(([name, n]) => (
              <button key={name} type="button" data-testid={`cut-snap-${name}`} title={`Turn the cut normal to ${name} (key ${name.toUpperCase()}); the view stays`} onClick={() => setSection({ normal: n, offset: 0 })}>{name} <kbd>{name.toUpperCase()}</kbd></button>
            ))}
            <button type="button" data-testid="cut-flip" onClick={() => setSection({ normal: [-section.normal[0], -section.normal[1], -section.normal[2]], offset: -section.offset })}>Flip</button>
          </div>
          <OffsetSlider half={half} />
          <div className="row">
            <label className="pair">
              <span className="lbl">Hide</span>
              <select value={section.hide} data-testid="cut-hide" onChange={(e) => setSection({ hide: e.target.value as typeof section.hide })}>
                <option value="auto">the side nearer the camera</option>
                <option value="positive">the +n side</option>
                <option value="negative">the −n side</option>
                <option value="none">nothing</option>
              </select>
            </label>
          </div>
          <div className="row">
            <label className="pair">
              <span className="lbl">Fill</span>
              <select value={section.traction} data-testid="cut-fill" onChange={(e) => setSection({ traction: e.target.value as typeof section.traction })}>
                <option value="normalTraction">normal traction</option>
                <option value="shearTraction">shear traction</option>
              </select>
            </label>
            <button type="button" data-testid="cut-look" title="Turn the view to look straight at the cut face" disabled={!result || result.empty} onClick={() => lookAtSection()}>Look at the section <kbd>L</kbd></button>
          </div>
          <div className="plane" data-testid="cut-plane">
            Plane through <Vec v={plane.point} q="length" floor={1e-9 * sphere.diagonal} />, n = <span className="vec">(<Num v={plane.normal[0]} q={null} floor={1e-9} />, <Num v={plane.normal[1]} q={null} floor={1e-9} />, <Num v={plane.normal[2]} q={null} floor={1e-9} />)</span>
          </div>
          <AxesChoice explain={!result || result.empty} />
          {/* --- assemblies: the bounded section --- */}
          <SectionLimitControl />
          {result?.empty && result.limited ? <p className="note bad" data-testid="cut-limit-empty">The limit selects no part of this section: nothing to report.</p> : null}
          {result?.empty && !result.limited ? <MissNote section={section} extent={extent} /> : null}
          {rows.length && result ? (
            <div data-testid="cut-result">
              <AxesShown r={result} />
              <p className="note">What the +n side exerts on the −n side{result.limited ? ', over the selected polygons only' : ''}; moments about the {result.limited ? 'selection\'s' : 'section'} centroid.</p>
              <table className="figures">
                <caption>Section axes e₁, e₂, e₃ = n</caption>
                <tbody>{['axial', 'shear1', 'shear2', 'torque', 'bending1', 'bending2'].map((k) => <Row key={k} k={k} />)}</tbody>
              </table>
              <table className="figures">
                <caption>Global axes</caption>
                <tbody>{['Fx', 'Fy', 'Fz', 'Mx', 'My', 'Mz'].map((k) => <Row key={k} k={k} />)}</tbody>
              </table>
              <table className="figures">
                <caption>Section</caption>
                <tbody>
                  {['area', 'cx', 'cy', 'cz', 'I1', 'I2', 'I12'].map((k) => <Row key={k} k={k} />)}
                  <tr><th>Elements cut</th><td><span className="num" data-model={String(result.cutElements)}>{result.cutElements}</span></td></tr>
                </tbody>
              </table>
              {result.freeBodyDefined === false
                ? <p className="note" data-testid="cut-free-body-undefined">Free body: not defined for a disc (a disc of the plane does not bound a piece of the body); limit to whole parts alone for it.</p>
                : <table className="figures">
                  <caption>Free body on the −n side{result.limited ? ' of the selected parts (their faces against other parts included)' : ''}</caption>
                  <tbody>{['fbF', 'fbM', 'fbRel', 'fbRelM'].map((k) => <Row key={k} k={k} />)}</tbody>
                </table>}
              <RegionTable result={result} />
              <EnvelopeSection />
              <div className="row">
                <button type="button" data-testid="export-section-csv" onClick={() => download(`${fileStem(model.name)}-section.csv`, sectionCsv(model, result, system), 'text/csv')}>Section CSV</button>
                <button type="button" data-testid="export-section-json" onClick={() => download(`${fileStem(model.name)}-section.json`, sectionJson(model, result, system), 'application/json')}>Section JSON</button>
              </div>
            </div>
          ) : null}
        </>
      ) : null}
    </Card>
  )
}
