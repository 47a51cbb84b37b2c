import { SHORTCUTS } from '../keyboard.ts'
import { useStore } from '../../state/store.ts'

export function HelpOverlay() {
  const open = useStore((s) => s.helpOpen)
  const setHelpOpen = useStore((s) => s.setHelpOpen)
  if (!open) return null
  return (
    <div className="overlay" data-testid="help-overlay" onClick={() => setHelpOpen(false)}>
      <div className="help" role="dialog" aria-label="Keyboard shortcuts" onClick={(e) => e.stopPropagation()}>
        <h2>Keyboard</h2>
        <table>
          <tbody>{SHORTCUTS.map(([k, what]) => <tr key={k}><th><kbd>{k}</kbd></th><td>{what}</td></tr>)}</tbody>
        </table>
        <p className="note">Drag to turn the view, right-drag to pan, wheel to zoom; click the surface or the section to probe.</p>
        <button type="button" onClick={() => setHelpOpen(false)}>Close</button>
      </div>
    </div>
  )
}
