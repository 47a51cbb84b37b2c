import { SHORTCUTS } from '../keyboard.ts'
import type { ShortcutGroup } from '../keyboard.ts'
import { useStore } from '../../state/store.ts'

const GROUPS: readonly ShortcutGroup[] = ['View', 'Cut', 'Colour and arrows', 'Model, units and output']

/** The key map: every key with what it does, by group. */
export function HelpOverlay() {
  const open = useStore((s) => s.helpOpen)
  const setHelpOpen = useStore((s) => s.setHelpOpen)
  if (!open) return null
  return (
    <div className="overlay" data-testid="help-overlay" onClick={() => setHelpOpen(false)}>
      <div className="help" role="dialog" aria-label="Keys and what they do" onClick={(e) => e.stopPropagation()}>
        <h2>Keys and what they do</h2>
        <div className="keymap">
          {GROUPS.map((g) => (
            <table key={g} data-group={g}>
              <caption>{g}</caption>
              <tbody>{SHORTCUTS.filter(([, , grp]) => grp === g).map(([k, what]) => <tr key={k}><th><kbd>{k}</kbd></th><td>{what}</td></tr>)}</tbody>
            </table>
          ))}
        </div>
        <p className="note">Mouse: drag to turn the view, right-drag to pan, wheel to zoom; click the surface or the section to probe; drag the tab beside the section (or press its rail) to move the cut. The view buttons at the top left look along each axis.</p>
        <button type="button" onClick={() => setHelpOpen(false)}>Close</button>
      </div>
    </div>
  )
}
