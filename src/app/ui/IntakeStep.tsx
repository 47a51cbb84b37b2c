import { LENGTH_UNITS, STRESS_UNITS } from '../../model/units.ts'
import { INTAKE_ROLES, MAPPING_FIELDS, fieldLabel, mappingProblems, suggestColumns } from '../../io/bundlePreview.ts'
import type { FilePreview, IntakeMapping, IntakeRole } from '../../io/bundlePreview.ts'
import { useStore } from '../../state/store.ts'
import { loadIntake, saveIntakeJson } from '../actions.ts'

const ROLE_WORDS: Readonly<Record<IntakeRole, string>> = {
  nodes: 'nodes (id, x, y, z)', elements: 'elements (id, type, nodes)', stress: 'stress (per node, or per element and node)', displacement: 'displacement (optional)',
}
const SEPARATOR_WORDS: Readonly<Record<string, string>> = { ',': 'commas', ';': 'semicolons', '\t': 'tabs', ' ': 'spaces' }

/**
 * The step between choosing files and loading them (state in the store's intake slice): each
 * file's first rows, what it holds, which column holds each field, and the units the files do
 * not state. Nothing loads until the mapping is complete; the model on screen stays meanwhile.
 */
export function IntakeStep() {
  const step = useStore((s) => s.intakeStep)
  const setMapping = useStore((s) => s.setIntakeMapping)
  const close = useStore((s) => s.intakeClosed)
  const hasModel = useStore((s) => s.model !== null)
  if (!step) return null
  const { preview, mapping } = step
  const problems = mappingProblems(preview, mapping)
  const setRole = (file: FilePreview, role: IntakeRole | '') => {
    const columns = { ...mapping.columns }
    if (role) columns[role] = suggestColumns(file, role)
    setMapping({ ...mapping, roles: { ...mapping.roles, [file.name]: role }, columns })
  }
  const setColumn = (role: IntakeRole, field: string, col: number) =>
    setMapping({ ...mapping, columns: { ...mapping.columns, [role]: { ...mapping.columns[role], [field]: col } } })
  const setUnits = (units: IntakeMapping['units']) => setMapping({ ...mapping, units })
  const askUnits = !preview.unitsDeclared.length || !preview.unitsDeclared.stress
  return (
    <div className="intake-backdrop">
      <section className="intake-step" role="dialog" aria-modal="true" aria-labelledby="intake-title" data-testid="intake-step">
        <h2 id="intake-title">{step.unitsOnly ? 'Units of these files' : 'Match the columns of these files'}</h2>
        {step.unitsOnly ? null : (
          <>
            <p>Say what each file holds and which of its columns holds each field. Load reads the files so; Save as model.json writes the same choices for next time.</p>
            <p className="why" data-testid="intake-why">Why this step: {preview.problem}</p>
          </>
        )}
        {step.unitsOnly ? null : preview.files.map((f, i) => <FileMap key={f.name} file={f} index={i} mapping={mapping} setRole={setRole} setColumn={setColumn} />)}
        {askUnits ? (
          <fieldset className="intake-units">
            <legend>Units the files do not state</legend>
            {!preview.unitsDeclared.length ? (
              <UnitChoice label="Lengths are in" testId="intake-length" value={mapping.units.length} units={LENGTH_UNITS} onChange={(length) => setUnits({ ...mapping.units, length })} />
            ) : null}
            {!preview.unitsDeclared.stress ? (
              <UnitChoice label="Stresses are in" testId="intake-stress" value={mapping.units.stress} units={STRESS_UNITS} onChange={(stress) => setUnits({ ...mapping.units, stress })} />
            ) : null}
            <p className="note">Numbers are read as written and only labelled with these units. The model stays marked “units not declared” until model.json or the headers state them; “Save as model.json” does that for next time.</p>
          </fieldset>
        ) : null}
        {problems.length ? <ul className="intake-problems" data-testid="intake-problems">{problems.map((p) => <li key={p}>{p}</li>)}</ul> : null}
        <div className="row intake-buttons">
          <button type="button" data-testid="intake-load" disabled={problems.length > 0} onClick={() => void loadIntake()}>Load</button>
          <button type="button" data-testid="intake-save" disabled={problems.length > 0} onClick={saveIntakeJson} title="The file names, columns and units as a model.json to put beside the files">Save as model.json</button>
          <button type="button" data-testid="intake-cancel" onClick={close}>Cancel</button>
          <span className="note">{hasModel ? 'The model on screen stays until these files load.' : ''}</span>
        </div>
      </section>
    </div>
  )
}

/** One unit the files do not state: nothing chosen until the user chooses. */
function UnitChoice<U extends string>({ label, testId, value, units, onChange }: {
  label: string; testId: string; value: U | null; units: readonly U[]; onChange: (u: U | null) => void
}) {
  return (
    <label>{label}{' '}
      <select data-testid={testId} value={value ?? ''} onChange={(e) => onChange((e.target.value || null) as U | null)}>
        <option value="">choose…</option>
        {units.map((u) => <option key={u} value={u}>{u}</option>)}
      </select>
    </label>
  )
}

function FileMap({ file, index, mapping, setRole, setColumn }: {
  file: FilePreview; index: number; mapping: IntakeMapping
  setRole: (f: FilePreview, r: IntakeRole | '') => void; setColumn: (r: IntakeRole, field: string, col: number) => void
}) {
  const role = mapping.roles[file.name] ?? ''
  const cols = role ? mapping.columns[role] ?? {} : {}
  return (
    <div className="intake-file" data-testid={`intake-file-${index}`}>
      <div className="row">
        <strong className="file-name">{file.name}</strong>
        <label>holds{' '}
          <select data-testid={`intake-role-${index}`} value={role} onChange={(e) => setRole(file, e.target.value as IntakeRole | '')}>
            <option value="">not part of the model</option>
            {INTAKE_ROLES.map((r) => <option key={r} value={r}>{ROLE_WORDS[r]}</option>)}
          </select>
        </label>
        {file.separator ? <span className="note">{SEPARATOR_WORDS[file.separator]}, {file.hasHeader ? 'header row' : 'no header row'}</span> : null}
      </div>
      {file.problem ? <p className="why">{file.problem}</p> : null}
      {role ? (
        <div className="row intake-fields">
          {MAPPING_FIELDS[role].map(({ field, optional }) => (
            <label key={field}>{fieldLabel(role, field, cols)}{' '}
              <select data-testid={`intake-col-${role}-${field}`} value={cols[field] ?? -1} onChange={(e) => setColumn(role, field, Number(e.target.value))}>
                <option value={-1}>{optional ? (field === 'element' ? 'none: one row per node' : 'none') : 'choose…'}</option>
                {file.columns.map((c, k) => <option key={k} value={k}>{c}</option>)}
              </select>
            </label>
          ))}
        </div>
      ) : null}
      {file.rows.length ? (
        <div className="intake-rows">
          <table>
            <thead><tr>{file.columns.map((c, k) => <th key={k} className={Object.values(cols).includes(k) ? 'used' : ''}>{c}</th>)}</tr></thead>
            <tbody>{file.rows.map((r, i) => <tr key={i}>{file.columns.map((_, k) => <td key={k}>{r[k] ?? ''}</td>)}</tr>)}</tbody>
          </table>
        </div>
      ) : null}
    </div>
  )
}
