/**
 * A user-facing input error: names the file, the line (1-based) and the column or field, or the
 * element id, so the user knows what to fix. Thrown by readers; the CLI and the app show
 * `message` as is, never a stack trace.
 */
export type InputErrorKind =
  | 'empty-file' | 'missing-file' | 'header' | 'column-count' | 'not-a-number' | 'not-finite'
  | 'bad-id' | 'duplicate-id' | 'missing-node' | 'unknown-type' | 'node-count' | 'missing-stress'
  | 'zero-volume' | 'bad-json' | 'bad-unit' | 'container' | 'version' | 'too-large' | 'no-elements'
  | 'bad-argument' | 'missing-displacement' | 'encoding'
  | 'shared-face'
  // Reading what solvers and spreadsheets write: an undecidable CSV dialect, and quadratic
  // elements whose mid-edge nodes are off their edges or whose Jacobian is not positive.
  | 'csv-dialect' | 'mid-edge-node' | 'negative-jacobian'
  // --- element-nodal: a stress row for an element that does not exist, or at a node that is not the element's ---
  | 'missing-element' | 'element-node'

export interface InputErrorWhere {
  readonly file?: string
  readonly line?: number
  readonly column?: string
  readonly elementId?: number
  readonly field?: string
}

export class InputError extends Error {
  readonly kind: InputErrorKind
  readonly where: InputErrorWhere
  constructor(kind: InputErrorKind, message: string, where: InputErrorWhere = {}) {
    super(formatWhere(where) + message)
    this.name = 'InputError'
    this.kind = kind
    this.where = where
  }
}

function formatWhere(w: InputErrorWhere): string {
  const parts: string[] = []
  if (w.file) parts.push(w.file)
  if (w.line !== undefined) parts.push(`line ${w.line}`)
  if (w.column) parts.push(`column "${w.column}"`)
  if (w.field) parts.push(`field "${w.field}"`)
  if (w.elementId !== undefined) parts.push(`element ${w.elementId}`)
  return parts.length ? parts.join(', ') + ': ' : ''
}

export function isInputError(e: unknown): e is InputError {
  return e instanceof Error && e.name === 'InputError' && 'kind' in e
}
