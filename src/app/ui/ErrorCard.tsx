import { useStore } from '../../state/store.ts'

/** The error as text (never HTML): message, file and line, what to fix. The model stays. */
export function ErrorCard() {
  const error = useStore((s) => s.error)
  const model = useStore((s) => s.model)
  const dismissError = useStore((s) => s.dismissError)
  if (!error) return null
  return (
    <div className="error-card" role="alert" data-testid="error-card">
      <h2>That did not load</h2>
      <p className="msg" data-testid="error-message">{error.message}</p>
      {error.file ? <p className="where">File <code>{error.file}</code>{error.line !== undefined ? <>, line <span className="num">{error.line}</span></> : null}</p> : null}
      {error.hint ? <p className="hint">{error.hint}</p> : null}
      {model ? <p className="kept">Still showing the previous model.</p> : null}
      <button type="button" data-testid="error-dismiss" onClick={() => dismissError()}>Dismiss</button>
    </div>
  )
}
