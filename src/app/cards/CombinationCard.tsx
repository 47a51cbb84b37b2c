import { useState } from 'react'
import { Card } from '../ui/Card.tsx'
import { Vec } from '../ui/Num.tsx'
import { useStore } from '../../state/store.ts'
import { factorsText } from '../../state/caseSlice.ts'
import { checkCombination } from '../../model/loadCases.ts'
import { isInputError } from '../../model/errors.ts'
import './loadCases.css'

/**
 * Load cases: which case is which (description, ρb), the model's combinations, and the app's own
 * combinations, defined or edited here (a factor per case; they travel in the view link).
 */
export function CombinationCard() {
  const model = useStore((s) => s.model)
  const user = useStore((s) => s.userCombinations)
  const caseName = useStore((s) => s.caseName)
  const chooseCase = useStore((s) => s.chooseCase)
  const saveCombination = useStore((s) => s.saveCombination)
  const removeCombination = useStore((s) => s.removeCombination)
  const [name, setName] = useState('')
  const [factors, setFactors] = useState<Record<string, string>>({})
  const [error, setError] = useState<string | null>(null)
  const cases = model?.cases ?? []
  if (!model || cases.length < 2) return null
  const own = model.combinations ?? []
  // ρb is listed only where some case has one
  const anyBodyForce = cases.some((c) => c.bodyForce.some((v) => v !== 0))
  const save = (): void => {
    const f: Record<string, number> = {}
    for (const c of cases) {
      const t = (factors[c.name] ?? '').trim()
      if (t === '') continue
      f[c.name] = Number(t.replace(',', '.'))
    }
    try {
      // the app's combinations may not take the name of a model's combination or case
      if (own.some((c) => c.name.toLowerCase() === name.trim().toLowerCase())) throw new Error(`"${name.trim()}" is the name of one of the model's combinations; give yours a name of its own`)
      const combo = checkCombination(cases, { name: name.trim(), factors: f }, { field: 'combination' })
      saveCombination(combo)
      chooseCase(combo.name)
      setError(null)
    } catch (e) {
      setError(isInputError(e) ? e.message.replace(/^field "[^"]*": /, '') : e instanceof Error ? e.message : String(e))
    }
  }
  const edit = (n: string): void => {
    const c = user.find((x) => x.name === n)
    if (!c) return
    setName(c.name)
    setFactors(Object.fromEntries(cases.map((k) => [k.name, c.factors[k.name] === undefined ? '' : String(c.factors[k.name])])))
  }
  return (
    <Card id="cases" title="Load cases">
      <table className="figures case-list" data-testid="case-list">
        <caption>Cases of the model</caption>
        <tbody>
          {cases.map((c) => (
            <tr key={c.name} data-case={c.name} className={c.name === caseName ? 'shown' : ''}>
              <th>{c.name}</th><td className="text">{c.description || '—'}{anyBodyForce ? <> · ρb <Vec v={c.bodyForce} q="forcePerVolume" /></> : null}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {own.length || user.length ? (
        <table className="figures case-list" data-testid="combination-list">
          <caption>Combinations</caption>
          <tbody>
            {own.map((c) => <tr key={c.name} data-combination={c.name}><th>{c.name}</th><td className="text">{factorsText(c)}</td><td className="text">(model)</td></tr>)}
            {user.map((c) => (
              <tr key={c.name} data-combination={c.name}>
                <th>{c.name}</th><td className="text">{factorsText(c)}</td>
                <td className="act"><button type="button" data-testid={`combination-edit-${c.name}`} onClick={() => edit(c.name)}>Edit</button> <button type="button" data-testid={`combination-remove-${c.name}`} onClick={() => removeCombination(c.name)}>Remove</button></td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : null}
      <fieldset className="combination-editor" data-testid="combination-editor">
        <legend>Define a combination (a factor per case; leave a case blank to leave it out)</legend>
        <label className="pair"><span className="lbl">Name</span><input type="text" data-testid="combination-name" value={name} size={12} onChange={(e) => setName(e.target.value)} placeholder="e.g. ULS-3" /></label>
        {cases.map((c) => (
          <label key={c.name} className="pair"><span className="lbl">× {c.name}</span>
            <input type="text" inputMode="decimal" size={6} data-testid={`combination-factor-${c.name}`} value={factors[c.name] ?? ''} onChange={(e) => setFactors({ ...factors, [c.name]: e.target.value })} />
          </label>
        ))}
        <button type="button" data-testid="combination-save" onClick={save}>Save and show</button>
        {error ? <p className="note bad" data-testid="combination-error">{error}</p> : null}
      </fieldset>
    </Card>
  )
}
