/**
 * The worker client: spawns the engine worker, runs one job at a time, coalesces section cuts
 * (only the latest plane is computed), and on cancel or crash terminates and respawns the worker,
 * then reloads the last good model so the user keeps what they had.
 */
import * as Comlink from 'comlink'
import { computeOptionsFromHash } from './computeOptions.ts'
import { checkModelSize } from '../io/sizeGuard.ts'
import { isInputError } from '../model/errors.ts'
import type { CutReply, EngineApi, EngineFile, LoadedModel, ModelSource, Outcome, SweepReply, SyntheticSpec, Vec3 } from '../../workers/engineTypes.ts'
import { DEFAULT_SECTION, sectionPlaneOf, useStore } from './store.ts'
import type { AppError } from './store.ts'

/** Where a model comes from, in a form that can be loaded again after a respawn. */
export type AppSource =
  | { readonly kind: 'demo'; readonly id: string; readonly url: string; readonly file: string }
  | { readonly kind: 'files'; readonly files: readonly File[] }
  | { readonly kind: 'synthetic'; readonly spec: SyntheticSpec }

interface Handle { worker: Worker; api: Comlink.Remote<EngineApi> }

let handle: Handle | null = null
let queue: Promise<unknown> = Promise.resolve()
let generation = 0
let lastGood: AppSource | null = null
let cutInFlight = false
let cutPending = false
let probeInFlight = false
/** Called after each successful load (the app applies a pending URL view then). */
let afterLoad: ((source: AppSource) => void) | null = null

export function onModelLoaded(cb: ((source: AppSource) => void) | null): void { afterLoad = cb }

function spawn(): Handle {
  const worker = new Worker(new URL('../../workers/engine.worker.ts', import.meta.url), { type: 'module', name: 'tractus-engine' })
  const h: Handle = { worker, api: Comlink.wrap<EngineApi>(worker) }
  void h.api.configure(computeOptionsFromHash(location.hash)).catch(() => undefined)
  worker.addEventListener('error', (ev) => {
    ev.preventDefault()
    if (handle === h) void recover({ message: `The engine stopped: ${ev.message || 'an unexpected error'}. The previous model is being reloaded.` })
  })
  return h
}

function engine(): Handle {
  if (!handle) handle = spawn()
  return handle
}

/** Runs jobs one after another; a job started before a respawn is dropped by its generation. */
function enqueue<T>(job: (api: Comlink.Remote<EngineApi>, gen: number) => Promise<T>): Promise<T> {
  const gen = generation
  const run = queue.then(() => (gen === generation ? job(engine().api, gen) : Promise.reject(new Error('cancelled'))))
  queue = run.catch(() => undefined)
  return run
}

function respawn(): void {
  generation++
  if (handle) {
    handle.api[Comlink.releaseProxy]()
    handle.worker.terminate()
  }
  handle = null
  queue = Promise.resolve()
  cutInFlight = false
  cutPending = false
  probeInFlight = false
  pacedOffset = null
  shownKey = ''
}

async function recover(error: AppError): Promise<void> {
  respawn()
  useStore.getState().set({ error, busy: false, progress: null })
  if (lastGood) await loadSource(lastGood, { quiet: true })
}

/** CSV and JSON travel as text; anything else (the binary container) as bytes. */
async function readFile(f: File): Promise<EngineFile> {
  const lower = f.name.toLowerCase()
  if (lower.endsWith('.csv') || lower.endsWith('.json') || lower.endsWith('.txt')) return { name: f.name, data: await f.text() }
  return { name: f.name, data: await f.arrayBuffer() }
}

async function toModelSource(s: AppSource): Promise<ModelSource> {
  if (s.kind === 'synthetic') return { kind: 'synthetic', spec: s.spec }
  if (s.kind === 'files') {
    checkModelSize(s.files.map((f) => ({ name: f.name, size: f.size })))
    return { kind: 'files', files: await Promise.all(s.files.map(readFile)), label: 'files:' + s.files.map((f) => f.name).join(',') }
  }
  const res = await fetch(s.url)
  if (!res.ok) throw new Error(`Could not read the demo model ${s.file} (HTTP ${res.status}).`)
  const data = s.file.toLowerCase().endsWith('.json') ? await res.text() : await res.arrayBuffer()
  const name = s.file.split('/').pop() ?? s.file
  return { kind: 'files', files: [{ name, data }], label: `demo:${s.id}` }
}

function transferList(src: ModelSource): Transferable[] {
  if (src.kind !== 'files') return []
  return src.files.flatMap((f) => (typeof f.data === 'string' ? [] : [f.data]))
}

export function sourceKey(s: AppSource): string {
  if (s.kind === 'demo') return `demo:${s.id}`
  if (s.kind === 'synthetic') return `block:${s.spec.elements}`
  return 'files'
}

/**
 * Loads a model. On an input error the error card shows and the previous model stays. `quiet`
 * (used after a respawn) keeps the current error card.
 */
export async function loadSource(source: AppSource, opts: { quiet?: boolean } = {}): Promise<boolean> {
  const st = useStore.getState()
  st.set({ busy: true, progress: { stage: 'Preparing', fraction: 0 }, ...(opts.quiet ? {} : { error: null }) })
  let src: ModelSource
  try {
    src = await toModelSource(source)
  } catch (e) {
    const err = isInputError(e) ? { message: e.message, file: e.where.file, hint: 'Choose a smaller model.' } : { message: e instanceof Error ? e.message : String(e) }
    useStore.getState().set({ busy: false, progress: null, error: err })
    return false
  }
  const gen = generation
  try {
    const onProgress = Comlink.proxy((p: { stage: string; fraction: number }) => {
      if (gen === generation) useStore.getState().set({ progress: p })
    })
    const out = await enqueue<Outcome<LoadedModel>>((api) => api.load(Comlink.transfer(src, transferList(src)), onProgress))
    if (gen !== generation) return false
    if (!out.ok) {
      useStore.getState().set({ busy: false, progress: null, error: out.error })
      return false
    }
    lastGood = source
    shownKey = ''
    const { summary, surface, audit } = out.value
    const c = summary.bounds
    const centre: [number, number, number] = [(c.min[0] + c.max[0]) / 2, (c.min[1] + c.max[1]) / 2, (c.min[2] + c.max[2]) / 2]
    const prev = useStore.getState()
    useStore.getState().set({
      model: summary, surface, audit, arrows: null, sectionBuffers: null, sectionResult: null, probe: null, probeRay: null,
      highlightedPatch: -1, busy: false, progress: null,
      section: { ...DEFAULT_SECTION, enabled: prev.section.enabled, normal: prev.section.normal, hide: prev.section.hide, traction: prev.section.traction, point: centre },
    })
    // Frame the model first; a link applied by afterLoad may then ask for its own camera.
    useStore.getState().requestView({ frame: { center: centre, radius: Math.max(1e-9, Math.hypot(c.max[0] - c.min[0], c.max[1] - c.min[1], c.max[2] - c.min[2]) / 2) } })
    afterLoad?.(source)
    void refreshSurfaceArrows()
    requestCut()
    return true
  } catch (e) {
    if (gen !== generation) return false
    // A real failure inside the worker: show it, start a fresh worker with the last good model.
    await recover({ message: failureMessage(e, 'while loading') })
    return false
  }
}

/** Stops a running load: the worker is terminated and respawned, the last good model reloaded. */
export async function cancelLoad(): Promise<void> {
  respawn()
  useStore.getState().set({ busy: false, progress: null })
  if (lastGood) await loadSource(lastGood, { quiet: true })
}

export async function refreshSurfaceArrows(): Promise<void> {
  const st = useStore.getState()
  if (!st.model || !st.arrowSettings.surface) { if (st.arrows) st.set({ arrows: null }); return }
  const gen = generation
  const { mode, budget } = st.arrowSettings
  try {
    const a = await enqueue((api) => api.surfaceArrows({ mode, budget }))
    if (gen === generation) useStore.getState().set({ arrows: a })
  } catch { /* dropped by a respawn */ }
}

/** Plane, arrow mode and budget of the cut on screen, so an unchanged request does nothing. */
let shownKey = ''
/** An offset held during a paced drag while a cut computes (model length units). */
let pacedOffset: number | null = null

function cutKey(plane: { point: number[]; normal: number[] }, mode: string, budget: number): string {
  return `${plane.point.join(',')}|${plane.normal.join(',')}|${mode}|${budget}`
}

/**
 * Asks for a cut of the current plane. While one is computing, further requests only mark the
 * plane dirty; when the running cut returns, the latest plane is cut once. So a drag never queues
 * more than one job behind the one in flight.
 */
export function requestCut(): void {
  const st = useStore.getState()
  if (!st.model) return
  if (!st.section.enabled) {
    shownKey = ''
    if (st.sectionResult || st.sectionBuffers) st.set({ sectionResult: null, sectionBuffers: null })
    return
  }
  if (cutInFlight) { cutPending = true; return }
  startCut(st.section.offset, false)
}

/**
 * Cuts the current section moved to `offset`. `paced`: a drag step whose plane is shown only with
 * its result (the store's offset changes together with the section face, in one update).
 */
function startCut(offset: number, paced: boolean): void {
  const st = useStore.getState()
  const section = { ...st.section, offset }
  const plane = sectionPlaneOf(section)
  const { mode } = st.arrowSettings
  // Software WebGL pays for every arrow on every frame (the compositor waits for the picture):
  // while the plane is being dragged there, the section arrows are left out; they return on release.
  const budget = section.dragging && st.renderer === 'software' ? 0 : st.arrowSettings.budget
  const key = cutKey(plane, mode, budget)
  if (!paced && key === shownKey && st.sectionResult) return
  cutInFlight = true
  cutPending = false
  const gen = generation
  const asked = performance.now()
  enqueue<Outcome<CutReply>>((api) => api.cut(plane, { mode, budget }))
    .then((out) => {
      if (gen !== generation) return
      // Request to reply, for the browser tests' figures (a User Timing entry, nothing more).
      performance.measure('tractus:cut', { start: asked, detail: out.ok ? { computeMs: out.value.computeMs } : null })
      const now = useStore.getState()
      // A paced result that arrives after the drag ended is stale: the release asked for a newer cut.
      if (paced && !now.section.dragging) return
      if (!out.ok) { now.set({ error: out.error }); return }
      shownKey = key
      now.set({
        sectionResult: out.value.result, sectionBuffers: out.value.buffers,
        ...(paced ? { section: { ...now.section, offset } } : {}),
      })
    })
    .catch((e) => {
      if (gen === generation) useStore.getState().set({ error: { message: `The section could not be computed: ${e instanceof Error ? e.message : String(e)}` } })
    })
    .finally(() => {
      if (gen !== generation) return
      // The next cut starts once the frame showing this one is out: on two cores the worker's
      // cut and the software rasteriser would otherwise fight for the same CPU and both slow down.
      afterNextFrame(() => {
        if (gen !== generation) return
        cutInFlight = false
        if (pacedOffset !== null && useStore.getState().section.dragging) {
          const o = pacedOffset
          pacedOffset = null
          startCut(o, true)
        } else if (cutPending) requestCut()
      })
    })
}

/**
 * A drag step of the offset (model length units). The plane in the store, and so the clipped
 * surface, moves only when its cut is ready, together with the section face: the picture stays
 * consistent, one frame per step, and the worker never computes while that frame is drawn.
 * While a cut computes, only the newest step is kept.
 */
export function setSectionPaced(offset: number): void {
  const st = useStore.getState()
  if (!st.model || !st.section.enabled) { st.setSection({ offset }); return }
  if (cutInFlight || dragStartGate) { pacedOffset = offset; return }
  startCut(offset, true)
}

/** True from the start of a drag until its first frame is out (that frame must not share the CPU). */
let dragStartGate = false

/** Starts a paced drag: the first cut waits for the frame that the drag's start itself causes. */
export function beginPacedDrag(): void {
  dragStartGate = true
  pacedOffset = null
  useStore.getState().setSection({ dragging: true })
  const gen = generation
  afterNextFrame(() => {
    dragStartGate = false
    if (gen !== generation || cutInFlight) return
    if (pacedOffset !== null && useStore.getState().section.dragging) {
      const o = pacedOffset
      pacedOffset = null
      startCut(o, true)
    }
  })
}

/** Ends a paced drag at `offset`: the store takes the final plane and the cut with its arrows follows. */
export function endPacedDrag(offset: number): void {
  pacedOffset = null
  useStore.getState().setSection({ offset, dragging: false })
}

/** Runs `cb` after the next animation frame has been produced (rAF, then a task after it). */
function afterNextFrame(cb: () => void): void {
  if (typeof requestAnimationFrame !== 'function' || document.hidden) { setTimeout(cb, 0); return }
  requestAnimationFrame(() => setTimeout(cb, 0))
}

/** Intersects the stored probe ray in the worker (latest ray wins). */
export function runProbe(): void {
  const st = useStore.getState()
  const ray = st.probeRay
  if (!ray || !st.model || probeInFlight) return
  probeInFlight = true
  const gen = generation
  const section = st.section.enabled ? { plane: sectionPlaneOf(st.section), hide: st.section.hide } : null
  enqueue((api) => api.probe({ ray, section }))
    .then((r) => {
      if (gen !== generation) return
      useStore.getState().set({ probe: r })
    })
    .catch(() => undefined)
    .finally(() => {
      if (gen !== generation) return
      probeInFlight = false
      if (useStore.getState().probeRay !== ray) runProbe()
    })
}

/**
 * Sections along `normal` (model extent when from/to are left out). Resolves to null when a
 * respawn dropped the job; input problems come back as {ok: false}.
 */
export async function requestSweep(normal: Vec3, count: number, from?: number, to?: number): Promise<Outcome<SweepReply> | null> {
  const gen = generation
  try {
    const out = await enqueue<Outcome<SweepReply>>((api) => api.sweep(normal, count, from, to))
    return gen === generation ? out : null
  } catch (e) {
    if (gen !== generation) return null
    return { ok: false, error: { message: `The sweep could not be computed: ${e instanceof Error ? e.message : String(e)}` } }
  }
}

/** True for the errors a browser raises when it cannot give the memory asked for. */
function isOutOfMemory(e: unknown): boolean {
  return e instanceof Error && (e.name === 'RangeError' || /out of memory|allocation failed/i.test(e.message))
}

/** Words for an unexpected engine failure; running out of memory gets its own advice. */
function failureMessage(e: unknown, during: string): string {
  const message = e instanceof Error ? e.message : String(e)
  return isOutOfMemory(e)
    ? `The browser ran out of memory ${during} (${message}). The previous model is kept; try a smaller or coarser model, or close other tabs.`
    : `The engine failed ${during}: ${message}. The previous model is kept.`
}

/** Test hook: make the worker throw an unexpected error or fail an allocation; the app must recover. */
export async function crashEngine(kind: 'throw' | 'memory' = 'throw'): Promise<void> {
  const gen = generation
  try {
    await enqueue((api) => api.crash(kind))
  } catch (e) {
    if (gen === generation) await recover({ message: failureMessage(e, 'in the engine') })
  }
}

declare global {
  interface Window {
    /** Hooks for the end-to-end tests only; nothing in the app calls them. */
    __tractusTest?: { crashEngine: (kind?: 'throw' | 'memory') => Promise<void> }
  }
}
if (typeof window !== 'undefined') window.__tractusTest = { crashEngine }
