import type { Quantity } from '../../model/units.ts'
import { convert, formatNumber, unitLabel } from '../format.ts'
import { useStore } from '../../state/store.ts'

/**
 * One number with its unit, converted to the chosen system. `data-model` keeps the full-precision
 * model-unit value (tests and copy-paste read it); `q` null means dimensionless; `bare` omits the
 * unit (for vectors that print it once).
 */
export function Num({ v, q, digits, bare }: { v: number; q: Quantity | null; digits?: number; bare?: boolean }) {
  const units = useStore((s) => s.model?.units)
  const system = useStore((s) => s.units)
  const shown = q && units ? convert(v, units, q, system) : v
  return (
    <span className="num" data-model={String(v)} data-q={q ?? 'ratio'}>
      {formatNumber(shown, digits)}
      {q && !bare ? <span className="unit"> {unitLabel(q, system)}</span> : null}
    </span>
  )
}

/** A three-vector as (x, y, z) with its unit once. */
export function Vec({ v, q }: { v: readonly number[]; q: Quantity }) {
  const system = useStore((s) => s.units)
  return (
    <span className="vec">
      (<Num v={v[0]} q={q} bare />, <Num v={v[1]} q={q} bare />, <Num v={v[2]} q={q} bare />)
      <span className="unit"> {unitLabel(q, system)}</span>
    </span>
  )
}

/** A table row pair for a vector: the label on one line, the value right-aligned under it. */
export function VecRow({ label, v, q }: { label: string; v: readonly number[]; q: Quantity | null }) {
  return (
    <>
      <tr className="vlabel"><th colSpan={2}>{label}</th></tr>
      <tr className="vvalue">
        <td colSpan={2}>
          {q ? <Vec v={v} q={q} /> : <span className="vec">(<Num v={v[0]} q={null} />, <Num v={v[1]} q={null} />, <Num v={v[2]} q={null} />)</span>}
        </td>
      </tr>
    </>
  )
}
