/**
 * The line slice of the one store: a straight line through the model (its ends, typed or picked
 * by two clicks on the surface or the section), how many points to sample, the equivalent stress
 * of its linearisation, the engine's last answer and which series the chart shows. The engine
 * client watches `line` (and the component axes) and asks the worker for the values.
 *
 * Units: ends in model length units.
 */
import type { StateCreator } from 'zustand'
import type { Vec3 } from '../model/model.ts'
import type { EquivalentCriterion, LineReply } from '../../workers/protocol.ts'
import type { TractusState } from './store.ts'

/** The ends (null until set), the sample count (2 … MAX_APP_LINE_POINTS) and the criterion. */
export interface LineState {
  readonly from: Vec3 | null
  readonly to: Vec3 | null
  readonly points: number
  readonly criterion: EquivalentCriterion
}

/** What the chart can draw: the six components (in the chosen axes), von Mises, σ1, σ3, |u|. */
export type LineSeries = 's0' | 's1' | 's2' | 's3' | 's4' | 's5' | 'vonMises' | 'principal1' | 'principal3' | 'displacement'

/** 'from': the next click on the model sets the start; 'to': the end; 'off': clicks probe. */
export type LinePicking = 'off' | 'from' | 'to'

export interface LineSlice {
  readonly line: LineState
  readonly linePicking: LinePicking
  readonly lineResult: LineReply | null
  readonly lineRunning: boolean
  /** Why the last line could not be computed, in words; null otherwise. */
  readonly lineError: string | null
  readonly lineSeries: Readonly<Record<LineSeries, boolean>>
  /** Changes the line; ends must be finite (a refused patch records lineError). */
  setLine: (patch: Partial<LineState>) => void
  /** The next two clicks on the model set the start and then the end. */
  startLinePick: () => void
  cancelLinePick: () => void
  /** Engine client: a click while picking landed on the model at `p` (a material point). */
  linePointPicked: (p: Vec3) => void
  clearLine: () => void
  lineStarted: () => void
  /** The engine's answer, or an error in words (the previous answer stays then). */
  lineEnded: (reply: LineReply | null, error?: string) => void
  showLineSeries: (key: LineSeries, shown: boolean) => void
}

/** Sample points offered in the app (the command line takes more). */
export const MAX_APP_LINE_POINTS = 2000
export const DEFAULT_LINE: LineState = { from: null, to: null, points: 51, criterion: 'vonMises' }

function finite(p: Vec3 | null | undefined): boolean {
  return !p || (Number.isFinite(p[0]) && Number.isFinite(p[1]) && Number.isFinite(p[2]))
}

export const createLineSlice: StateCreator<TractusState, [], [], LineSlice> = (set, get) => ({
  line: DEFAULT_LINE,
  linePicking: 'off',
  lineResult: null,
  lineRunning: false,
  lineError: null,
  lineSeries: { s0: false, s1: true, s2: false, s3: false, s4: false, s5: false, vonMises: true, principal1: false, principal3: false, displacement: false },
  setLine: (patch) => {
    if (!finite(patch.from) || !finite(patch.to)) { set({ lineError: 'The line\'s ends must be three finite numbers each.' }); return }
    const points = patch.points === undefined ? get().line.points : Math.min(MAX_APP_LINE_POINTS, Math.max(2, Math.round(patch.points)))
    if (!Number.isFinite(points)) return
    set({ line: { ...get().line, ...patch, points }, lineError: null })
  },
  startLinePick: () => set({ linePicking: 'from' }),
  cancelLinePick: () => set({ linePicking: 'off' }),
  linePointPicked: (p) => {
    const st = get()
    if (st.linePicking === 'from') set({ line: { ...st.line, from: p, to: null }, linePicking: 'to', lineResult: null, lineError: null })
    else if (st.linePicking === 'to') set({ line: { ...st.line, to: p }, linePicking: 'off', lineError: null })
  },
  clearLine: () => set({ line: { ...get().line, from: null, to: null }, linePicking: 'off', lineResult: null, lineError: null }),
  lineStarted: () => set({ lineRunning: true }),
  lineEnded: (reply, error) => set({ lineRunning: false, ...(reply ? { lineResult: reply, lineError: null } : {}), ...(error ? { lineError: error } : {}) }),
  showLineSeries: (key, shown) => set({ lineSeries: { ...get().lineSeries, [key]: shown } }),
})
