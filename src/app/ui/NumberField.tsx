import { useEffect, useState } from 'react'

/**
 * A number typed by the user. Shows `value`, commits on Enter or blur; text that is not a finite
 * number is refused (the field turns red and the old value stays).
 */
export function NumberField({ label, value, onCommit, testId, width = 6 }: { label: string; value: number; onCommit: (v: number) => void; testId?: string; width?: number }) {
  const [text, setText] = useState(String(round(value)))
  const [bad, setBad] = useState(false)
  useEffect(() => { setText(String(round(value))); setBad(false) }, [value])
  const commit = (): void => {
    const v = Number(text.trim().replace('−', '-'))
    if (text.trim() === '' || !Number.isFinite(v)) { setBad(true); return }
    setBad(false)
    if (v !== value) onCommit(v)
  }
  return (
    <label className={'field' + (bad ? ' bad' : '')}>
      <span>{label}</span>
      <input
        type="text" inputMode="decimal" size={width} value={text} data-testid={testId} aria-label={label}
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
