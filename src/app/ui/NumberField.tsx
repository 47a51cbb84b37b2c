import { useEffect, useState } from 'react'

/**
 * A number typed by the user. Shows `value`, commits on Enter or blur; text that is not a finite
 * number is refused (the field turns red and the old value stays). `invalid`: the value was a
 * number but the store refused it (a zero normal, say); the field is marked the same way.
 */
export function NumberField({ label, value, onCommit, testId, width = 6, invalid = false }: { label: string; value: number; onCommit: (v: number) => void; testId?: string; width?: number; invalid?: boolean }) {
  const [text, setText] = useState(String(round(value)))
  const [bad, setBad] = useState(false)
  // A refused value shows the stored one again, marked, until a good one is taken.
  useEffect(() => { setText(String(round(value))); setBad(false) }, [value, invalid])
  const commit = (): void => {
    const v = Number(text.trim().replace('−', '-'))
    if (text.trim() === '' || !Number.isFinite(v)) { setBad(true); return }
    setBad(false)
    if (v !== value) onCommit(v)
  }
  return (
    <label className={'field' + (bad || invalid ? ' bad' : '')}>
      <span>{label}</span>
      <input
        type="text" inputMode="decimal" size={width} value={text} data-testid={testId} aria-label={label} aria-invalid={bad || invalid}
        onChange={(e) => setText(e.target.value)} onBlur={commit}
        onKeyDown={(e) => { if (e.key === 'Enter') { commit(); (e.target as HTMLInputElement).blur() } }}
      />
    </label>
  )
}

/** Enough digits to round-trip typical inputs without showing float noise. */
function round(v: number): number {
  return Number.isFinite(v) ? Number(v.toPrecision(10)) : 0
}
