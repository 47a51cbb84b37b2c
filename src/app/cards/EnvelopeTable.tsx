import { Num } from '../ui/Num.tsx'
import { useStore } from '../../state/store.ts'
import type { CaseResultant, EnvelopeEntry, ResultantEnvelope } from '../../../workers/protocol.ts'
import { noiseFloor } from '../../model/roundingNoise.ts'
import { unitLabel } from '../format.ts'
import './loadCases.css'
import { download, fileStem } from '../exports.ts'
import { envelopeCsv, envelopeJson } from '../envelopeExport.ts'

/** The six components of a resultant in section axes: label, unit kind, how to read it from an envelope and from a case. */
export const ENVELOPE_COMPONENTS: readonly { key: string; label: string; q: 'force' | 'moment'; env: (e: ResultantEnvelope) => EnvelopeEntry; of: (c: CaseResultant) => number }[] = [
  { key: 'axial', label: 'N', q: 'force', env: (e) => e.axial, of: (c) => c.axial },
  { key: 'shear1', label: 'V₁', q: 'force', env: (e) => e.shear[0], of: (c) => c.shear[0] },
  { key: 'shear2', label: 'V₂', q: 'force', env: (e) => e.shear[1], of: (c) => c.shear[1] },
  { key: 'torque', label: 'T', q: 'moment', env: (e) => e.torque, of: (c) => c.torque },
  { key: 'bending1', label: 'M₁', q: 'moment', env: (e) => e.bending[0], of: (c) => c.bending[0] },
  { key: 'bending2', label: 'M₂', q: 'moment', env: (e) => e.bending[1], of: (c) => c.bending[1] },
]

/**
 * One envelope as two tables: per component its largest and smallest value and the case that
 * governs each; then each governing case once with its whole resultant (the concurrent values).
 * A component that is rounding noise in every case names no governing case.
 */
export function EnvelopeGrid({ env, cases, testId }: { env: ResultantEnvelope; cases: readonly CaseResultant[]; testId: string }) {
  const system = useStore((s) => s.units)
  const fF = noiseFloor(cases.flatMap((c) => [c.axial, ...c.shear]))
  const fM = noiseFloor(cases.flatMap((c) => [c.torque, ...c.bending]))
  const floor = (q: 'force' | 'moment') => (q === 'force' ? fF : fM)
  const rows = ENVELOPE_COMPONENTS.flatMap((k) => {
    const e = k.env(env)
    const noise = Math.abs(e.max) <= floor(k.q) && Math.abs(e.min) <= floor(k.q)
    return (['max', 'min'] as const).map((side) => ({ k, side, value: side === 'max' ? e.max : e.min, name: noise ? null : side === 'max' ? e.maxCase : e.minCase }))
  })
  const governing = cases.filter((c) => rows.some((r) => r.name === c.name))
  return (
    <div className="scroll">
      <table className="figures envelope" data-testid={testId}>
        <thead><tr><th>component</th><th>value</th><th>governing case</th></tr></thead>
        <tbody>
          {rows.map(({ k, side, value, name }) => (
            <tr key={k.key + side} data-row={`${k.key}-${side}`}>
              <th>{k.label} {side === 'max' ? 'largest' : 'smallest'}</th>
              <td><Num v={value} q={k.q} floor={floor(k.q)} /></td>
              <td className="text" data-case={name ?? ''}>{name ?? '—'}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <table className="figures envelope" data-testid={`${testId}-concurrent`}>
        <caption>Concurrent values: each governing case&apos;s whole resultant</caption>
        <thead>
          <tr><th>case</th>{ENVELOPE_COMPONENTS.map((j) => <th key={j.key}>{j.label} [{unitLabel(j.q, system)}]</th>)}</tr>
        </thead>
        <tbody>
          {governing.map((c) => (
            <tr key={c.name} data-case-row={c.name}>
              <th>{c.name}</th>
              {ENVELOPE_COMPONENTS.map((j) => <td key={j.key}><Num v={j.of(c)} q={j.q} floor={floor(j.q)} bare /></td>)}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  )
}

/** The envelope of the section in the cut card: over every case and combination (or the combinations only), and per region. */
export function EnvelopeSection() {
  const model = useStore((s) => s.model)
  const open = useStore((s) => s.envelopeOpen)
  const only = useStore((s) => s.envelopeCombinationsOnly)
  const reply = useStore((s) => s.envelope)
  const error = useStore((s) => s.envelopeError)
  const user = useStore((s) => s.userCombinations)
  const setOpen = useStore((s) => s.setEnvelopeOpen)
  const setOnly = useStore((s) => s.setEnvelopeCombinationsOnly)
  const system = useStore((s) => s.units)
  const count = (model?.cases?.length ?? 1) + (model?.combinations?.length ?? 0) + user.length
  if (!model || count < 2) return null
  const combos = (model.combinations?.length ?? 0) + user.length
  return (
    <div className="envelope-block" data-testid="envelope">
      <label className="check">
        <input type="checkbox" data-testid="envelope-open" checked={open} onChange={(e) => setOpen(e.target.checked)} />
        Envelope over {count} cases and combinations
      </label>
      {open ? (
        <>
          <label className="check">
            <input type="checkbox" data-testid="envelope-combinations-only" checked={only} disabled={combos === 0} onChange={(e) => setOnly(e.target.checked)} />
            Combinations only
          </label>
          {error ? <p className="note bad">{error}</p> : null}
          {reply && reply.envelope ? (
            <>
              <p className="note">Over {reply.combinationsOnly ? 'the combinations only' : 'every case and combination'}; section axes as above, moments about the section centroid. Each extreme value names the case that governs it; the second table gives each governing case&apos;s whole resultant (the concurrent values).</p>
              <EnvelopeGrid env={reply.envelope} cases={reply.combinationsOnly ? reply.cases.filter((c) => c.kind === 'combination') : reply.cases} testId="envelope-table" />
              {reply.regions.length > 1 ? reply.regions.map((g, i) => g.envelope ? (
                <div key={i}>
                  <p className="note">Region {i + 1} (part {g.parts.join(', ')}); moments about its own centroid.</p>
                  <EnvelopeGrid env={g.envelope} cases={reply.combinationsOnly ? g.cases.filter((c) => c.kind === 'combination') : g.cases} testId={`envelope-table-region-${i + 1}`} />
                </div>
              ) : null) : null}
            </>
          ) : null}
          {reply && reply.envelope && model ? (
            <div className="row">
              <button type="button" data-testid="export-envelope-csv" onClick={() => download(`${fileStem(model.name)}-envelope.csv`, envelopeCsv(reply, model, system), 'text/csv')}>Envelope CSV</button>
              <button type="button" data-testid="export-envelope-json" onClick={() => download(`${fileStem(model.name)}-envelope.json`, envelopeJson(reply, model, system), 'application/json')}>Envelope JSON</button>
            </div>
          ) : reply && !reply.envelope ? <p className="note">Nothing to envelope here (the plane misses the body, or there are no combinations).</p> : !error ? <p className="note">computing…</p> : null}
        </>
      ) : null}
    </div>
  )
}
