import { useEffect, useState } from 'react'
import { demos, demoSource } from '../actions.ts'
import type { DemoEntry } from '../actions.ts'
import { engine } from '../engine.ts'
import { QuantitySelect } from '../cards/ColourCard.tsx'
import { UnitsMenu } from './UnitsMenu.tsx'
import { CaseSelect } from './CaseSelect.tsx'
import { useStore } from '../../state/store.ts'

/** Slim bar: model name, quantity, units, card width, open, demos, help. The name is React text only. */
export function TopBar({ onOpen }: { onOpen: () => void }) {
  const model = useStore((s) => s.model)
  const wide = useStore((s) => s.wideCards)
  const setWideCards = useStore((s) => s.setWideCards)
  const setHelpOpen = useStore((s) => s.setHelpOpen)
  const busy = useStore((s) => s.busy)
  const [list, setList] = useState<DemoEntry[]>([])
  useEffect(() => { void demos().then(setList) }, [])
  const current = model?.source.startsWith('demo:') ? model.source.slice(5) : ''
  return (
    <header className="topbar">
      <span className="brand">Tractus</span>
      <span className="model-name" data-testid="model-name" title={model?.description ?? ''}>{model ? model.name || 'Unnamed model' : 'No model loaded'}</span>
      {model ? <span className="counts num">{model.elementCount.toLocaleString('en-US')} elements · {model.nodeCount.toLocaleString('en-US')} nodes · model units {model.units.length}, {model.units.stress}</span> : null}
      {model && model.unitsDeclared === false ? (
        <span className="units-undeclared" data-testid="units-undeclared" title={model.warnings.find((w) => /declared/.test(w)) ?? 'The files do not state their units.'}>units not declared</span>
      ) : null}
      <span className="spacer" />
      <CaseSelect />
      <QuantitySelect testId="quantity" />
      <UnitsMenu />
      <button type="button" data-testid="wide-cards" aria-pressed={wide} className={wide ? 'on' : ''} title="Widen or narrow the column of cards (diagrams read better wide); W"
        onClick={() => setWideCards(!wide)}>{wide ? 'Narrow' : 'Wide'} <kbd>W</kbd></button>
      {list.length ? (
        <select value={current} data-testid="demo-select" aria-label="Demo model" disabled={busy}
          onChange={(e) => { const d = list.find((x) => x.id === e.target.value); if (d) void engine.load(demoSource(d)) }}>
          <option value="" disabled>Demo models…</option>
          {list.map((d) => <option key={d.id} value={d.id}>{d.name}</option>)}
        </select>
      ) : null}
      <button type="button" data-testid="open" onClick={onOpen} disabled={busy}>Open… <kbd>O</kbd></button>
      <button type="button" data-testid="help" onClick={() => setHelpOpen(true)} aria-label="Keys and what they do" title="Keys and what they do (?)">Keys ?</button>
    </header>
  )
}
