import { useEffect, useRef } from 'react'
import { startFromHash, startHashSync } from './actions.ts'
import { requestCut, runProbe } from './engine.ts'
import { handleKey, watchArrowSettings } from './keyboard.ts'
import { useStore } from './store.ts'
import type { ArrowBuffers } from './store.ts'
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
import { SceneView } from './SceneView.tsx'

/** Arrow count (count) used when WebGL reports a software renderer. */
const SOFTWARE_ARROW_BUDGET = 150

const NO_ARROWS: ArrowBuffers = {
  mode: 'full', origins: new Float32Array(0), vectors: new Float32Array(0), normals: new Float32Array(0),
  magnitudes: new Float32Array(0), maxMagnitude: 0,
}

/** Wires store changes to the worker client: section → cut, probe ray → probe. */
function useEngineWiring(): void {
  useEffect(() => {
    const unsub = useStore.subscribe((s, p) => {
      if (s.section !== p.section) {
        const a = s.section, b = p.section
        // Only the plane and the switch change the cut; hide/fill/dragging are drawing matters.
        // At the start of a drag on software WebGL, drop the section arrows at once (see requestCut).
        if (a.dragging && !b.dragging && s.renderer === 'software' && s.sectionBuffers && s.sectionBuffers.arrows.magnitudes.length > 0) {
          useStore.getState().set({ sectionBuffers: { ...s.sectionBuffers, arrows: NO_ARROWS } })
        }
        // The end of a drag cuts once more, with the arrows the drag left out.
        if (a.enabled !== b.enabled || a.point !== b.point || a.normal !== b.normal || a.offset !== b.offset ||
            (b.dragging && !a.dragging)) requestCut()
      }
      if (s.arrowSettings !== p.arrowSettings && (s.arrowSettings.mode !== p.arrowSettings.mode || s.arrowSettings.budget !== p.arrowSettings.budget)) requestCut()
      if (s.probeRay !== p.probeRay && s.probeRay) runProbe()
    })
    const unsubArrows = watchArrowSettings()
    // Software WebGL (no GPU) draws instanced arrows slowly: keep the default count small there.
    const unsubRenderer = useStore.subscribe((st, prev) => {
      if (st.renderer === 'software' && prev.renderer !== 'software' && st.arrowSettings.budget > SOFTWARE_ARROW_BUDGET) {
        st.setArrowSettings({ budget: SOFTWARE_ARROW_BUDGET })
      }
    })
    return () => { unsub(); unsubArrows(); unsubRenderer() }
  }, [])
}

export function App() {
  const input = useRef<HTMLInputElement>(null)
  useEngineWiring()
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
        <ColourCard />
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
