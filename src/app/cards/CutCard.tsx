import type { Vec3 } from '../../model/model.ts'
import { displayFactor } from '../../model/units.ts'
import { Card } from '../ui/Card.tsx'
import { Num, Vec } from '../ui/Num.tsx'
import { NumberField } from '../ui/NumberField.tsx'
import { download, fileStem, sectionCsv, sectionJson, sectionRows } from '../exports.ts'
import { unitLabel } from '../format.ts'
import { modelSphere, sectionPlaneOf } from '../../state/selectors.ts'
import { useStore } from '../../state/store.ts'

/**
 * The offset slider. While the pointer holds it, moves go through the store's section drag (the
 * protocol the scene's handle uses too: one cut at a time, the newest step wins, the plane shown
 * with its cut) and the thumb follows the pointer from the drag's target. Keys on the focused
 * slider move the plane directly.
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
      <Num v={shown} q="length" />
    </label>
  )
}

const AXES: [string, Vec3][] = [['x', [1, 0, 0]], ['y', [0, 1, 0]], ['z', [0, 0, 1]]]

/** The cutting plane: typed point and normal, axis snaps, offset slider, and the resultant. */
export function CutCard() {
  const model = useStore((s) => s.model)
  const section = useStore((s) => s.section)
  const result = useStore((s) => s.sectionResult)
  const inputError = useStore((s) => s.sectionInputError)
  const system = useStore((s) => s.units)
  const setSection = useStore((s) => s.setSection)
  if (!model) return null
  const Lf = displayFactor(model.units, 'length', system)
  const Lu = unitLabel('length', system)
  const half = Math.max(1e-12, modelSphere(model.bounds).radius)
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
  const rows = result && !result.empty ? sectionRows(result, model.units, system) : []
  const byKey = new Map(rows.map((r) => [r.key, r]))
  const Row = ({ k }: { k: string }) => {
    const r = byKey.get(k)
    if (!r) return null
    const q = r.key.startsWith('fbRel') ? null : ['axial', 'shear1', 'shear2', 'Fx', 'Fy', 'Fz', 'fbF'].includes(r.key) ? 'force' as const
      : ['torque', 'bending1', 'bending2', 'Mx', 'My', 'Mz', 'fbM'].includes(r.key) ? 'moment' as const
      : r.key === 'area' ? 'area' as const : ['I1', 'I2'].includes(r.key) ? 'secondMoment' as const : 'length' as const
    return <tr data-row={r.key}><th>{r.label}</th><td><Num v={r.model} q={q} /></td></tr>
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
            <span className="lbl">Snap</span>
            {AXES.map(([name, n]) => (
              <button key={name} type="button" data-testid={`cut-snap-${name}`} onClick={() => setSection({ normal: n, offset: 0 })}>{name} <kbd>{name.toUpperCase()}</kbd></button>
            ))}
            <button type="button" data-testid="cut-flip" onClick={() => setSection({ normal: [-section.normal[0], -section.normal[1], -section.normal[2]], offset: -section.offset })}>Flip</button>
          </div>
          <OffsetSlider half={half} />
          <div className="row">
            <span className="lbl">Hide</span>
            <select value={section.hide} data-testid="cut-hide" onChange={(e) => setSection({ hide: e.target.value as typeof section.hide })}>
              <option value="positive">the +n side</option>
              <option value="negative">the −n side</option>
              <option value="none">nothing</option>
            </select>
            <span className="lbl">Fill</span>
            <select value={section.traction} data-testid="cut-fill" onChange={(e) => setSection({ traction: e.target.value as typeof section.traction })}>
              <option value="normalTraction">normal traction</option>
              <option value="shearTraction">shear traction</option>
            </select>
          </div>
          <div className="plane" data-testid="cut-plane">
            Plane through <Vec v={plane.point} q="length" />, n = <span className="vec">(<Num v={plane.normal[0]} q={null} />, <Num v={plane.normal[1]} q={null} />, <Num v={plane.normal[2]} q={null} />)</span>
          </div>
          {result?.empty ? <p className="note" data-testid="cut-empty">The plane misses the body.</p> : null}
          {rows.length ? (
            <div data-testid="cut-result">
              <p className="note">What the +n side exerts on the −n side; moments about the section centroid.</p>
              <table className="figures">
                <caption>Section axes (e₃ = n)</caption>
                <tbody>{['axial', 'shear1', 'shear2', 'torque', 'bending1', 'bending2'].map((k) => <Row key={k} k={k} />)}</tbody>
              </table>
              <table className="figures">
                <caption>Global axes</caption>
                <tbody>{['Fx', 'Fy', 'Fz', 'Mx', 'My', 'Mz'].map((k) => <Row key={k} k={k} />)}</tbody>
              </table>
              <table className="figures">
                <caption>Section</caption>
                <tbody>
                  {['area', 'cx', 'cy', 'cz', 'I1', 'I2'].map((k) => <Row key={k} k={k} />)}
                  <tr><th>Elements cut</th><td><span className="num" data-model={String(result!.cutElements)}>{result!.cutElements}</span></td></tr>
                </tbody>
              </table>
              <table className="figures">
                <caption>Free body on the −n side</caption>
                <tbody>{['fbF', 'fbM', 'fbRel', 'fbRelM'].map((k) => <Row key={k} k={k} />)}</tbody>
              </table>
              <div className="row">
                <button type="button" data-testid="export-section-csv" onClick={() => download(`${fileStem(model.name)}-section.csv`, sectionCsv(model, result!, system), 'text/csv')}>Section CSV</button>
                <button type="button" data-testid="export-section-json" onClick={() => download(`${fileStem(model.name)}-section.json`, sectionJson(model, result!, system), 'application/json')}>Section JSON</button>
              </div>
            </div>
          ) : null}
        </>
      ) : null}
    </Card>
  )
}
