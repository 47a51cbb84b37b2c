/**
 * The sweep slice of the one store: the last sweep the user ran (read by the sweep card and the
 * review report), which of its quantities are plotted, and whether one is running. A new model
 * clears the sweep (`modelLoaded` in store.ts), so old diagrams never sit on a new part.
 */
import type { StateCreator } from 'zustand'
import type { SeriesKey, SweepReply } from '../../workers/protocol.ts'
import type { TractusState } from './store.ts'

export interface SweepSlice {
  readonly sweep: SweepReply | null
  /** Which quantities the chart and the report diagrams show. */
  readonly sweepShown: Readonly<Record<SeriesKey, boolean>>
  readonly sweepRunning: boolean
  sweepStarted: () => void
  /** The sweep's reply; null when it failed or was dropped (the previous sweep stays). */
  sweepEnded: (reply: SweepReply | null) => void
  showSweepSeries: (key: SeriesKey, shown: boolean) => void
}

export const createSweepSlice: StateCreator<TractusState, [], [], SweepSlice> = (set, get) => ({
  sweep: null,
  // All six internal forces by default, in the chart and in the report.
  sweepShown: { axial: true, shear1: true, shear2: true, torque: true, bending1: true, bending2: true },
  sweepRunning: false,
  sweepStarted: () => set({ sweepRunning: true }),
  sweepEnded: (reply) => set({ sweepRunning: false, ...(reply ? { sweep: reply } : {}) }),
  showSweepSeries: (key, shown) => set({ sweepShown: { ...get().sweepShown, [key]: shown } }),
})
