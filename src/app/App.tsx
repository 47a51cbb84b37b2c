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
import { FileIntake } from './ui/FileIntake.tsx'
import { CutCard } from './cards/CutCard.tsx'
import { EquilibriumCard } from './cards/EquilibriumCard.tsx'
import { LoadEntryCard } from './cards/LoadEntryCard.tsx'
import { ProbeCard } from './cards/ProbeCard.tsx'
import { ColourCard } from './cards/ColourCard.tsx'
import { SnapshotCard } from './cards/SnapshotCard.tsx'
import { SweepCard } from './cards/SweepCard.tsx'
import { ModelCard } from './cards/ModelCard.tsx'
import { LineCard } from './cards/LineCard.tsx'
import { DeformationCard } from './cards/DeformationCard.tsx'
import { SceneView } from './SceneView.tsx'

export function App() {
  const input = useRef<HTMLInputElement>(null)
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
      <aside className="cards" aria-label="Cards">
        <ErrorCard />
        <ModelCard />
        <CutCard />
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
      <HelpOverlay />
    </div>
  )
}
