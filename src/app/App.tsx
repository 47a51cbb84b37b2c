import { useEffect, useRef } from 'react'
import { startFromHash, startHashSync } from './actions.ts'
import { engine } from './engine.ts'
import { handleKey } from './keyboard.ts'
import { CAUTION } from './caution.ts'
import { TopBar } from './ui/TopBar.tsx'
import { ColourBar } from './ui/ColourBar.tsx'
import { ProgressBar } from './ui/ProgressBar.tsx'
import { ErrorCard } from './ui/ErrorCard.tsx'
import { HelpOverlay } from './ui/HelpOverlay.tsx'
import { NoticeCard } from './ui/NoticeCard.tsx'
import { ViewButtons } from './ui/ViewButtons.tsx'
import { useStore } from '../state/store.ts'
import { FileIntake } from './ui/FileIntake.tsx'
import { IntakeStep } from './ui/IntakeStep.tsx'
import { CutCard } from './cards/CutCard.tsx'
import { CombinationCard } from './cards/CombinationCard.tsx'
import { EquilibriumCard } from './cards/EquilibriumCard.tsx'
import { LoadEntryCard } from './cards/LoadEntryCard.tsx'
import { ProbeCard } from './cards/ProbeCard.tsx'
import { ColourCard } from './cards/ColourCard.tsx'
import { SnapshotCard } from './cards/SnapshotCard.tsx'
import { SweepCard } from './cards/SweepCard.tsx'
import { ModelCard } from './cards/ModelCard.tsx'
import { LineCard } from './cards/LineCard.tsx'
import { DeformationCard } from './cards/DeformationCard.tsx'
import { PartsCard } from './cards/PartsCard.tsx'
import { InterfacesCard } from './cards/InterfacesCard.tsx'
import { SceneView } from './SceneView.tsx'

/**
 * Reports to the store how much of the scene the top bar, the cards and the bottom bar cover
 * (CSS pixels), whenever any of them changes size, so framing centres in the open part.
 */
function useViewInsets(cards: React.RefObject<HTMLElement | null>): void {
  useEffect(() => {
    const measure = (): void => {
      const W = window.innerWidth
      const top = document.querySelector('.topbar')?.getBoundingClientRect().bottom ?? 0
      const bottomEl = document.querySelector('.bottom')?.getBoundingClientRect()
      const bottom = bottomEl ? Math.max(0, window.innerHeight - bottomEl.top) : 0
      const c = cards.current?.getBoundingClientRect()
      // The cards column covers the scene from its left edge to the window's right edge.
      const right = c && c.width > 0 ? Math.max(0, W - c.left) : 0
      useStore.getState().setViewInsets({ top: Math.round(top), right: Math.round(right), bottom: Math.round(bottom), left: 0 })
    }
    measure()
    const ro = new ResizeObserver(measure)
    for (const el of [cards.current, document.querySelector('.topbar'), document.querySelector('.bottom')]) if (el) ro.observe(el)
    window.addEventListener('resize', measure)
    return () => { ro.disconnect(); window.removeEventListener('resize', measure) }
  }, [cards])
}

export function App() {
  const input = useRef<HTMLInputElement>(null)
  const cards = useRef<HTMLElement>(null)
  const wide = useStore((s) => s.wideCards)
  useViewInsets(cards)
  // The engine client turns the store's requests (a plane, a drag step, a probe ray, arrow
  // settings) into worker jobs while the app is mounted.
  useEffect(() => engine.watch(), [])
  useEffect(() => {
    const stop = startHashSync()
    void startFromHash()
    return stop
  }, [])
  useEffect(() => {
    const onKey = (e: KeyboardEvent): void => handleKey(e, () => input.current?.click())
    window.addEventListener('keydown', onKey)
    return () => window.removeEventListener('keydown', onKey)
  }, [])
  return (
    <div className="app">
      <SceneView />
      <TopBar onOpen={() => input.current?.click()} />
      <ProgressBar />
      <ViewButtons />
      <aside ref={cards} className={'cards' + (wide ? ' wide' : '')} aria-label="Cards">
        <ErrorCard />
        <NoticeCard />
        <ModelCard />
        <CombinationCard />
        <CutCard />
        <PartsCard />
        <InterfacesCard />
        <SweepCard />
        <EquilibriumCard />
        <LoadEntryCard />
        <ProbeCard />
        <LineCard />
        <ColourCard />
        <DeformationCard />
        <SnapshotCard />
      </aside>
      <footer className="bottom">
        <ColourBar />
        <p className="caution" data-testid="caution">{CAUTION}</p>
      </footer>
      <FileIntake ref={input} />
      <IntakeStep />
      <HelpOverlay />
    </div>
  )
}
