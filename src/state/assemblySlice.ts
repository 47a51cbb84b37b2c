/**
 * The assembly slice of the one store: the loaded model's parts and interfaces (from the engine),
 * which parts are shown and whether the surface is coloured by part, the highlighted region of
 * the cut and interface, whether the interfaces are drawn, and the bounded-section limit with the
 * error of the last refused input (the previous limit and cut then stay).
 *
 * Units: model units (centre and radius length units).
 */
import type { StateCreator } from 'zustand'
import type { AssemblySummary, CutLimit, LoadedModel } from '../../workers/protocol.ts'
import type { TractusState } from './store.ts'

/** What the bounded-section fields hold as typed (text), so a refused input stays on screen. */
export interface LimitInput {
  readonly parts: string
  readonly disc: boolean
  readonly centre: string
  readonly radius: string
  /** Display length per model length: the centre and radius are typed in the shown unit. */
  readonly lengthFactor: number
}

/** The field a refused limit names, and why. */
export interface LimitError {
  readonly field: 'parts' | 'centre' | 'radius'
  readonly message: string
}

export interface AssemblySlice {
  readonly assembly: AssemblySummary | null
  /** Part numbers hidden in the scene. */
  readonly hiddenParts: readonly number[]
  readonly partColours: boolean
  /** Index into sectionResult.regions, -1 for none. */
  readonly highlightedRegion: number
  /** The current cut's triangles grouped by region (CutReply.regionTriangles), or null. */
  readonly regionTriangles: Int32Array | null
  readonly interfacesShown: boolean
  /** Index into assembly.interfaces, -1 for none. */
  readonly highlightedInterface: number
  readonly sectionLimit: CutLimit | null
  readonly limitError: LimitError | null
  regionsShown: (regionTriangles: Int32Array | null) => void
  setHighlightedRegion: (k: number) => void
  setPartHidden: (part: number, hidden: boolean) => void
  /** Shows this part alone; null shows every part. */
  isolatePart: (part: number | null) => void
  setPartColours: (on: boolean) => void
  setInterfacesShown: (on: boolean) => void
  setHighlightedInterface: (k: number) => void
  /** Parses the typed limit; a bad field is refused (limitError names it) and the previous limit stays. */
  setSectionLimit: (input: LimitInput) => void
  clearSectionLimit: () => void
}

/** The slice's fields a loaded model sets (its parts; the user's choices about the old parts go). */
export function assemblyOfLoad(loaded: LoadedModel): Pick<AssemblySlice, 'assembly' | 'hiddenParts' | 'highlightedRegion' | 'regionTriangles' | 'highlightedInterface' | 'sectionLimit' | 'limitError'> {
  return { assembly: loaded.assembly ?? null, hiddenParts: [], highlightedRegion: -1, regionTriangles: null, highlightedInterface: -1, sectionLimit: null, limitError: null }
}

/** Numbers separated by commas (spaces allowed); null when any is not a finite number. */
function numbers(text: string): number[] | null {
  const parts = text.split(',').map((t) => t.trim())
  if (parts.some((t) => t === '')) return null
  const v = parts.map(Number)
  return v.every(Number.isFinite) ? v : null
}

/** The limit a typed input means, or the field it fails on. `known`: the model's part numbers. */
export function parseLimit(input: LimitInput, known: readonly number[]): CutLimit | LimitError | null {
  let parts: number[] | undefined
  if (input.parts.trim() !== '') {
    const v = numbers(input.parts)
    if (!v || !v.every((p) => Number.isInteger(p) && p >= 0)) return { field: 'parts', message: `Parts: whole part numbers separated by commas, like 1,3 (got "${input.parts}").` }
    const unknown = v.filter((p) => !known.includes(p))
    if (unknown.length) return { field: 'parts', message: `Parts: no element has part ${unknown.join(', ')}; the model's parts are ${known.join(', ')}.` }
    parts = v
  }
  let within: CutLimit['within']
  if (input.disc) {
    const c = numbers(input.centre)
    if (!c || c.length !== 3) return { field: 'centre', message: `Disc centre: three numbers x, y, z (got "${input.centre}").` }
    const r = Number(input.radius.trim())
    if (input.radius.trim() === '' || !Number.isFinite(r) || !(r > 0)) return { field: 'radius', message: `Disc radius: a number greater than 0 (got "${input.radius}").` }
    const f = input.lengthFactor
    within = { center: [c[0] / f, c[1] / f, c[2] / f], radius: r / f }
  }
  if (!parts && !within) return null
  return { ...(parts ? { parts } : {}), ...(within ? { within } : {}) }
}

export const createAssemblySlice: StateCreator<TractusState, [], [], AssemblySlice> = (set, get) => ({
  assembly: null,
  hiddenParts: [],
  partColours: false,
  highlightedRegion: -1,
  regionTriangles: null,
  interfacesShown: false,
  highlightedInterface: -1,
  sectionLimit: null,
  limitError: null,
  regionsShown: (regionTriangles) => {
    const n = get().sectionResult?.regions?.length ?? 0
    set({ regionTriangles, ...(get().highlightedRegion >= n ? { highlightedRegion: -1 } : {}) })
  },
  setHighlightedRegion: (highlightedRegion) => set({ highlightedRegion }),
  setPartHidden: (part, hidden) => {
    const now = get().hiddenParts.filter((p) => p !== part)
    set({ hiddenParts: hidden ? [...now, part].sort((a, b) => a - b) : now })
  },
  isolatePart: (part) => {
    const all = get().assembly?.parts.map((p) => p.part) ?? []
    set({ hiddenParts: part === null ? [] : all.filter((p) => p !== part) })
  },
  setPartColours: (partColours) => set({ partColours }),
  setInterfacesShown: (interfacesShown) => set({ interfacesShown }),
  setHighlightedInterface: (highlightedInterface) => set({ highlightedInterface, ...(highlightedInterface >= 0 ? { interfacesShown: true } : {}) }),
  setSectionLimit: (input) => {
    const known = get().assembly?.parts.map((p) => p.part) ?? [0]
    const r = parseLimit(input, known)
    if (r && 'field' in r) { set({ limitError: r }); return }
    set({ sectionLimit: r, limitError: null, highlightedRegion: -1 })
  },
  clearSectionLimit: () => set({ sectionLimit: null, limitError: null, highlightedRegion: -1 }),
})
