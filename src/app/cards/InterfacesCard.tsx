/**
 * The Interfaces card (models whose parts touch): per pair of parts a → b, the interface area
 * and centroid, the force a exerts on b (from b's faces and stress) and its moment about the
 * centroid, and the mismatch |F_ab + F_ba| / ∫|t| dA (Newton's third law as a quality figure:
 * zero for nodal stress with shared nodes). A click marks the interface in the scene.
 */
import { Card } from '../ui/Card.tsx'
import { Num, Vec } from '../ui/Num.tsx'
import { formatNumber, noiseFloor, unitLabel } from '../format.ts'
import { useStore } from '../../state/store.ts'
import { partLabel, usePartNames } from './SectionRegions.tsx'

export function InterfacesCard() {
  const assembly = useStore((s) => s.assembly)
  const shown = useStore((s) => s.interfacesShown)
  const highlighted = useStore((s) => s.highlightedInterface)
  const setShown = useStore((s) => s.setInterfacesShown)
  const setHighlighted = useStore((s) => s.setHighlightedInterface)
  const system = useStore((s) => s.units)
  const names = usePartNames()
  if (!assembly) return null
  const list = assembly.interfaces
  const fFloor = noiseFloor(list.flatMap((i) => i.force))
  const mFloor = noiseFloor(list.flatMap((i) => i.moment))
  const sel = list[highlighted]
  return (
    <Card id="interfaces" title={`Interfaces (${list.length})`}>
      {list.length === 0 ? <p className="note" data-testid="interfaces-none">No two parts share or touch a face.</p> : (
        <>
          <label className="check"><input type="checkbox" data-testid="interfaces-shown" checked={shown} onChange={(e) => setShown(e.target.checked)} /> Draw the interfaces</label>
          <table className="figures list" data-testid="interfaces-table">
            <caption>Force that the first part exerts on the second</caption>
            <thead><tr><th>Parts</th><th>Area [{unitLabel('area', system)}]</th><th>|F| [{unitLabel('force', system)}]</th><th title="|F_ab + F_ba| / ∫|t| dA">Mismatch</th></tr></thead>
            <tbody>
              {list.map((i, k) => (
                <tr key={k} className={k === highlighted ? 'sel' : ''} data-interface={`${i.parts[0]}-${i.parts[1]}`} onClick={() => setHighlighted(k === highlighted ? -1 : k)}>
                  <td>{i.parts[0]} → {i.parts[1]}</td>
                  <td><Num v={i.area} q="area" bare /></td>
                  <td><Num v={Math.hypot(...i.force)} q="force" bare floor={fFloor} /></td>
                  {/* round-off (below 10⁻¹²) reads 0; data-model keeps the value */}
                  <td><span className="num" data-model={String(i.mismatch)}>{formatNumber(i.mismatch < 1e-12 ? 0 : i.mismatch, 2)}</span></td>
                </tr>
              ))}
            </tbody>
          </table>
          {sel ? (
            <table className="figures" data-testid="interface-selected">
              <caption>{partLabel(sel.parts[0], names)} on {partLabel(sel.parts[1], names)} ({sel.faces} faces)</caption>
              <tbody>
                <tr className="vlabel"><th colSpan={2}>Centroid</th></tr>
                <tr className="vvalue"><td colSpan={2}><Vec v={sel.centroid} q="length" /></td></tr>
                <tr className="vlabel"><th colSpan={2}>Force a → b</th></tr>
                <tr className="vvalue" data-row="interface-force"><td colSpan={2}><Vec v={sel.force} q="force" floor={fFloor} /></td></tr>
                <tr className="vlabel"><th colSpan={2}>Moment about the centroid</th></tr>
                <tr className="vvalue" data-row="interface-moment"><td colSpan={2}><Vec v={sel.moment} q="moment" floor={mFloor} /></td></tr>
                <tr className="vlabel"><th colSpan={2}>Force b → a (from a&apos;s side)</th></tr>
                <tr className="vvalue"><td colSpan={2}><Vec v={sel.reverseForce} q="force" floor={fFloor} /></td></tr>
              </tbody>
            </table>
          ) : null}
          <p className="note">Mismatch: |F_ab + F_ba| over the interface&apos;s gross load ∫|t| dA; zero for nodal stress with shared nodes, a quality figure for element-nodal stress.</p>
        </>
      )}
    </Card>
  )
}
