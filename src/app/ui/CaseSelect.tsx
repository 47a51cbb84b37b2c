import { useStore } from '../../state/store.ts'
import { pickableCases } from '../../state/caseSlice.ts'
import '../cards/loadCases.css'

/**
 * The load case or combination everything shows (top bar). Shown when the model has more than
 * one case or any combination; the app's own combinations are listed after the model's.
 */
export function CaseSelect() {
  const model = useStore((s) => s.model)
  const user = useStore((s) => s.userCombinations)
  const caseName = useStore((s) => s.caseName)
  const running = useStore((s) => s.caseRunning)
  const busy = useStore((s) => s.busy)
  const chooseCase = useStore((s) => s.chooseCase)
  const list = pickableCases(model, user)
  if (!model || (list.length < 2 && user.length === 0)) return null
  const value = list.find((c) => c.name.toLowerCase() === (caseName ?? model.shownCase ?? '').toLowerCase())?.name ?? list[0].name
  const cases = list.filter((c) => c.kind === 'case'), combos = list.filter((c) => c.kind !== 'case')
  // the name alone in the bar; what the case is in the option's tooltip and in the Load cases card
  const label = (c: (typeof list)[number]) => c.name
  return (
    <label className="case-select" title="The load case or combination that colours, arrows, section, balance, sweep and probe show">
      <span className="lbl">Load case</span>
      <select value={value} data-testid="case-select" aria-label="Load case or combination" disabled={busy} aria-busy={running}
        onChange={(e) => chooseCase(e.target.value)}>
        <optgroup label="Cases">{cases.map((c) => <option key={c.name} value={c.name} title={c.description}>{label(c)}</option>)}</optgroup>
        {combos.length ? <optgroup label="Combinations">{combos.map((c) => <option key={c.name} value={c.name} title={c.description}>{label(c)}{c.kind === 'user' ? ' (yours)' : ''}</option>)}</optgroup> : null}
      </select>
      {running ? <span className="note" data-testid="case-running">computing…</span> : null}
    </label>
  )
}
