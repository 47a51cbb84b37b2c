/**
 * The load-case slice of the one store: which case or combination everything shows, the
 * combinations the user defined in the app (they travel in the view link), and the envelope of
 * the section over every case and combination (shown in the cut card when asked for).
 *
 * Choosing a case asks the engine for the analysis of that case (the engine client watches
 * `caseName` and the user's combinations); its reply replaces the surface's scalars and patch
 * labels, the audit and the extras through `caseShown`, keeping the surface's geometry (the scene
 * keeps it on the GPU), the section, the camera and the view settings.
 */
import type { StateCreator } from 'zustand'
import type { CaseShown, Combination, EnvelopeReply, ModelSummary } from '../../workers/protocol.ts'
import { shapeOfLoad } from './shapeSlice.ts'
import { describeFactors } from '../model/loadCases.ts'
import type { TractusState } from './store.ts'

export interface CaseSlice {
  /** The case or combination asked for (null: the model's first case). */
  readonly caseName: string | null
  /** Combinations defined in the app, after the model's own. */
  readonly userCombinations: readonly Combination[]
  /** True while the engine computes another case. */
  readonly caseRunning: boolean
  /** The envelope table in the cut card: shown, over combinations only, and the last reply. */
  readonly envelopeOpen: boolean
  readonly envelopeCombinationsOnly: boolean
  readonly envelope: EnvelopeReply | null
  readonly envelopeError: string | null
  chooseCase: (name: string) => void
  /** Adds a combination, or replaces the user's one of the same name (names match without regard to letter case). */
  saveCombination: (combo: Combination) => void
  removeCombination: (name: string) => void
  setUserCombinations: (combos: readonly Combination[]) => void
  setEnvelopeOpen: (open: boolean) => void
  setEnvelopeCombinationsOnly: (only: boolean) => void
  envelopeShown: (reply: EnvelopeReply | null, error?: string) => void
  caseStarted: () => void
  /** The analysis of the chosen case: the surface's scalars, the audit and the extras replace the old ones; the geometry, the section and view stay. */
  caseShown: (loaded: CaseShown | null) => void
}

/** What a new model sets in this slice (modelLoaded in store.ts): its first case, no combinations of the user's. */
export function caseStateOfLoad(summary: ModelSummary): Pick<CaseSlice, 'caseName' | 'userCombinations' | 'envelope' | 'envelopeError' | 'caseRunning'> {
  return { caseName: summary.shownCase ?? null, userCombinations: [], envelope: null, envelopeError: null, caseRunning: false }
}

/** Every name the picker offers: the cases, the model's combinations, then the user's. */
export function pickableCases(summary: ModelSummary | null, user: readonly Combination[]): { name: string; kind: 'case' | 'combination' | 'user'; description: string }[] {
  if (!summary) return []
  const cases = (summary.cases ?? [{ name: 'default', description: '', bodyForce: summary.bodyForce, displacement: false }]).map((c) => ({ name: c.name, kind: 'case' as const, description: c.description }))
  const own = (summary.combinations ?? []).filter((c) => !user.some((u) => u.name.toLowerCase() === c.name.toLowerCase()))
  return [
    ...cases,
    ...own.map((c) => ({ name: c.name, kind: 'combination' as const, description: factorsText(c) })),
    ...user.map((c) => ({ name: c.name, kind: 'user' as const, description: factorsText(c) })),
  ]
}

/** "1.35 × dead + 1.5 × imposed" (the model's own wording, src/model/loadCases.ts). */
export const factorsText = describeFactors

export const createCaseSlice: StateCreator<TractusState, [], [], CaseSlice> = (set, get) => ({
  caseName: null,
  userCombinations: [],
  caseRunning: false,
  envelopeOpen: false,
  envelopeCombinationsOnly: false,
  envelope: null,
  envelopeError: null,
  chooseCase: (caseName) => { if (caseName !== get().caseName) set({ caseName }) },
  saveCombination: (combo) => {
    const rest = get().userCombinations.filter((c) => c.name.toLowerCase() !== combo.name.toLowerCase())
    set({ userCombinations: [...rest, combo] })
  },
  removeCombination: (name) => {
    const st = get()
    const left = st.userCombinations.filter((c) => c.name.toLowerCase() !== name.toLowerCase())
    // the one shown goes: back to the first case
    const shown = st.caseName?.toLowerCase() === name.toLowerCase()
    set({ userCombinations: left, ...(shown ? { caseName: st.model?.cases?.[0]?.name ?? null } : {}) })
  },
  setUserCombinations: (userCombinations) => set({ userCombinations }),
  setEnvelopeOpen: (envelopeOpen) => set({ envelopeOpen }),
  setEnvelopeCombinationsOnly: (envelopeCombinationsOnly) => set({ envelopeCombinationsOnly }),
  envelopeShown: (envelope, error) => set({ envelope, envelopeError: error ?? null }),
  caseStarted: () => set({ caseRunning: true }),
  caseShown: (loaded) => {
    const st = get()
    if (!loaded || !st.model) { set({ caseRunning: false }); return }
    const prev = st.model
    // the model is the same: its source and inputs stay; the figures are the case's
    const model: ModelSummary = { ...loaded.summary, source: prev.source, ...(prev.inputs ? { inputs: prev.inputs } : {}), ...(prev.digestsPending ? { digestsPending: true } : {}) }
    // the geometry is the load's: only the scalars, their ranges and the patch labels are the case's
    const surface = st.surface ? { ...st.surface, ...loaded.surface } : null
    set({
      model, surface, audit: loaded.audit, probe: null, highlightedPatch: -1, caseRunning: false,
      ...shapeOfLoad(loaded),
      // the parts' balances and interfaces are the case's; their triangles, hidden parts and the limit stay
      assembly: st.assembly && loaded.assembly ? { ...st.assembly, ...loaded.assembly } : null, highlightedInterface: -1,
    })
  },
})
