import { engine } from '../engine.ts'
import { useStore } from '../../state/store.ts'

export function ProgressBar() {
  const busy = useStore((s) => s.busy)
  const p = useStore((s) => s.progress)
  if (!busy) return null
  const f = Math.max(0, Math.min(1, p?.fraction ?? 0))
  return (
    <div className="progress" data-testid="progress" role="status">
      <div className="bar"><div className="fill" style={{ width: `${f * 100}%` }} /></div>
      <span className="stage">{p?.stage ?? 'Working'}… <span className="num">{Math.round(f * 100)} %</span></span>
      <button type="button" data-testid="cancel" onClick={() => void engine.cancelLoad()}>Cancel <kbd>Esc</kbd></button>
    </div>
  )
}
