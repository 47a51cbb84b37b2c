import type { Quantity } from '../../model/units.ts'
import { convert, denoise, formatNumber, unitLabel } from '../format.ts'
import { useStore } from '../../state/store.ts'

/**
 * One number with its unit, converted to the chosen system. `data-model` keeps the full-precision
 * model-unit value (tests and copy-paste read it); `q` null means dimensionless; `bare` omits the
 * unit (for vectors that print it once); `floor` (model units) is the rounding-noise floor of the
 * value's family (format.ts `noiseFloor`): below it the value reads 0.
 */
export function Num({ v, q, digits, bare, floor = 0 }: { v: number; q: Quantity | null; digits?: number; bare?: boolean; floor?: number }) {
  const units = useStore((s) => s.model?.units)
  const system = useStore((s) => s.units)
  const clean = denoise(v, floor)
  const shown = q && units ? convert(clean, units, q, system) : clean
  return (
    <span className="num" data-model={String(v)} data-q={q ?? 'ratio'}>
      {formatNumber(shown, digits)}
      {q && !bare ? <span className="unit"> {unitLabel(q, system)}</span> : null}
    </span>
  )
}

/** A three-vector as (x, y, z) with its unit once; `floor` as for Num. */
export function Vec({ v, q, floor }: { v: readonly number[]; q: Quantity; floor?: number }) {
  const system = useStore((s) => s.units)
  return (
    <span className="vec">
      (<Num v={v[0]} q={q} bare floor={floor} />, <Num v={v[1]} q={q} bare floor={floor} />, <Num v={v[2]} q={q} bare floor={floor} />)
      <span className="unit"> {unitLabel(q, system)}</span>
    </span>
  )
}

/** A table row pair for a vector: the label on one line, the value right-aligned under it. */
export function VecRow({ label, v, q, floor, testId }: { label: string; v: readonly number[]; q: Quantity | null; floor?: number; testId?: string }) {
  return (
    <>
      <tr className="vlabel"><th colSpan={2}>{label}</th></tr>
      <tr className="vvalue" data-row={testId}>
        <td colSpan={2}>
          {q ? <Vec v={v} q={q} floor={floor} /> : <span className="vec">(<Num v={v[0]} q={null} floor={floor} />, <Num v={v[1]} q={null} floor={floor} />, <Num v={v[2]} q={null} floor={floor} />)</span>}
        </td>
      </tr>
    </>
  )
}
