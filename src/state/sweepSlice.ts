/**
 * The sweep slice of the one store: the last sweep the user ran (read by the sweep card and the
 * review report), which of its quantities are plotted, and whether one is running. A new model
 * clears the sweep (`modelLoaded` in store.ts), so old diagrams never sit on a new part. With load
 * cases the sweep holds every case and combination at the same sections (`SweepReply.cases`),
 * and the chart draws the ones picked here.
 */
import type { StateCreator } from 'zustand'
import type { SeriesKey, SweepReply } from '../../workers/protocol.ts'
import type { TractusState } from './store.ts'

export interface SweepSlice {
  readonly sweep: SweepReply | null
  /** Which quantities the chart and the report diagrams show. */
  readonly sweepShown: Readonly<Record<SeriesKey, boolean>>
  readonly sweepRunning: boolean
  /**
   * The load cases and combinations the chart draws, one line each (names as the sweep's reply
   * spells them); empty: the case shown alone, as a sweep of one case.
   */
  readonly sweepCases: readonly string[]
  sweepStarted: () => void
  /** The sweep's reply; null when it failed or was dropped (the previous sweep stays). */
  sweepEnded: (reply: SweepReply | null) => void
  showSweepSeries: (key: SeriesKey, shown: boolean) => void
  /** Adds or removes one case from the chart (kept in the sweep's order of cases). */
  showSweepCase: (name: string, shown: boolean) => void
}

/** The cases of `sweep` the chart draws: the picked ones that the sweep holds, in its order. */
export function drawnSweepCases(sweep: SweepReply | null, picked: readonly string[]): string[] {
  if (!sweep?.cases) return []
  return sweep.cases.cases.map((c) => c.name).filter((n) => picked.some((p) => p.toLowerCase() === n.toLowerCase()))
}

export const createSweepSlice: StateCreator<TractusState, [], [], SweepSlice> = (set, get) => ({
  sweep: null,
  // All six internal forces by default, in the chart and in the report.
  sweepShown: { axial: true, shear1: true, shear2: true, torque: true, bending1: true, bending2: true },
  sweepRunning: false,
  sweepCases: [],
  sweepStarted: () => set({ sweepRunning: true }),
  sweepEnded: (reply) => set({ sweepRunning: false, ...(reply ? { sweep: reply } : {}) }),
  showSweepSeries: (key, shown) => set({ sweepShown: { ...get().sweepShown, [key]: shown } }),
  showSweepCase: (name, shown) => {
    const rest = get().sweepCases.filter((n) => n.toLowerCase() !== name.toLowerCase())
    set({ sweepCases: shown ? [...rest, name] : rest })
  },
})
