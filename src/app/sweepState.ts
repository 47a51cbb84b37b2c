/**
 * The last sweep the user ran, kept beside the main store (it is read by the sweep card and the
 * review report only). Cleared when another model loads, so old diagrams never sit on a new part.
 */
import { create } from 'zustand'
import type { SweepReply } from '../../workers/engineTypes.ts'
import { useStore } from './store.ts'
import type { SeriesKey } from './sweepSeries.ts'

export interface SweepState {
  readonly sweep: SweepReply | null
  /** Which quantities the chart and the report diagrams show. */
  readonly shown: Readonly<Record<SeriesKey, boolean>>
  readonly running: boolean
  set: (patch: Partial<Omit<SweepState, 'set'>>) => void
}

export const useSweepStore = create<SweepState>()((set) => ({
  sweep: null,
  shown: { axial: true, shear1: true, shear2: true, torque: false, bending1: false, bending2: false },
  running: false,
  set: (patch) => set(patch),
}))

useStore.subscribe((s, p) => {
  if (s.model !== p.model && useSweepStore.getState().sweep) useSweepStore.getState().set({ sweep: null })
})
