/**
 * The intake slice of the one store: the step between choosing files and loading them, shown
 * when the files do not read as a bundle as they are (names or headers not ours: the column
 * mapping) or do not declare their units (the units). Nothing is loaded while a step is open;
 * the model on screen stays until the user loads the mapped files. Cancelling drops the step.
 */
import type { StateCreator } from 'zustand'
import type { BundlePreview, IntakeMapping } from '../io/bundlePreview.ts'
import type { TractusState } from './store.ts'

export interface IntakeStep {
  /** The files as chosen (File objects: nothing of them is read beyond the preview's first bytes). */
  readonly files: readonly File[]
  readonly preview: BundlePreview
  readonly mapping: IntakeMapping
  /** True when the files read as they are and only the units are asked. */
  readonly unitsOnly: boolean
}

export interface IntakeSlice {
  readonly intakeStep: IntakeStep | null
  intakeAsked: (step: IntakeStep) => void
  setIntakeMapping: (mapping: IntakeMapping) => void
  intakeClosed: () => void
}

export const createIntakeSlice: StateCreator<TractusState, [], [], IntakeSlice> = (set, get) => ({
  intakeStep: null,
  intakeAsked: (step) => set({ intakeStep: step }),
  setIntakeMapping: (mapping) => { const s = get().intakeStep; if (s) set({ intakeStep: { ...s, mapping } }) },
  intakeClosed: () => set({ intakeStep: null }),
})
