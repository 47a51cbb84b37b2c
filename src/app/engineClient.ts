/**
 * The engine client: the app's one line to the engine worker, as a small object made by
 * `createEngineClient(deps)` (no module state; the worker factory, the store and the frame clock
 * are handed in, so Node tests drive it with a fake worker). It runs one job at a time, reacts to
 * the store's requests once `watch()` is on (a plane, a drag step, a probe ray, arrow settings),
 * reports every reply through the store's named actions, and on cancel or a crash ends the
 * worker, starts a fresh one and reloads the last good model, so the user keeps what they had.
 *
 * Section cuts follow one protocol, whatever moves the plane (the offset slider, the handle in the
 * scene, the keys, a typed value, a link):
 * - the latest plane wins: while a cut is in flight, a request only replaces the one pending
 *   request, and when the running cut's frame is out the newest pending one is sent, once; so a
 *   drag never queues more than one job behind the one in flight, and the worker never computes
 *   while that frame is drawn (on two cores the cut and a software rasteriser would slow each
 *   other down);
 * - during a drag (the store's beginSectionDrag … endSectionDrag) a step's plane is shown only
 *   together with its cut, so the clipped surface and the section face move as one; the first
 *   step waits for the frame the grab itself causes; the release cuts once more, with the arrows
 *   a software renderer leaves out while dragging;
 * - every job belongs to the worker generation it was sent to, and a reply from before a restart
 *   is dropped.
 */
import type { StoreApi } from 'zustand'
import { checkModelSize, tooLargeHint } from '../io/sizeGuard.ts'
import { isInputError } from '../model/errors.ts'
import type { Vec3 } from '../model/model.ts'
import type { LengthUnit, StressUnit } from '../model/units.ts'
import { deformScaleOf, resolvedHide, sectionPlaneOf } from '../state/selectors.ts'
import type { TractusState } from '../state/store.ts'
import type {
  AppError, ComputeOptions, CutReply, EngineCalls, EngineFile, LoadedModel, ModelSource, Outcome, PatchReply, Progress,
  SectionAxesChoice, SweepReply, SyntheticSpec,
} from '../../workers/protocol.ts'
import type { ComponentAxes } from '../../workers/protocol.ts'

/** Where a model comes from, in a form that can be loaded again after a restart. */
export type AppSource =
  | { readonly kind: 'demo'; readonly id: string; readonly url: string; readonly file: string }
  | { readonly kind: 'files'; readonly files: readonly File[]; readonly units?: { readonly length?: LengthUnit; readonly stress?: StressUnit } }
  | { readonly kind: 'synthetic'; readonly spec: SyntheticSpec }

/** A running engine worker as the client sees it. */
export interface EngineConnection {
  readonly calls: EngineCalls
  /** Ends the worker at once; calls in flight never answer. */
  terminate(): void
}

export interface EngineClientDeps {
  /** Starts an engine worker; `onFailure` is called when it dies outside a call (its error event). */
  readonly createWorker: (onFailure: (message: string) => void) => EngineConnection
  readonly store: StoreApi<TractusState>
  /** How the engine may use the machine, read when a worker starts (default: no settings). */
  readonly computeOptions?: () => ComputeOptions
  /** Runs `cb` once the next frame is out (default: an animation frame, then a task). */
  readonly afterFrame?: (cb: () => void) => void
  /** Reads a demo model (default: the global fetch). */
  readonly fetch?: (url: string) => Promise<Response>
  /** Each cut's request-to-reply time, for the browser tests' figures (default: a User Timing measure 'tractus:cut'). */
  readonly cutTimed?: (askedAt: number, computeMs: number | null) => void
}

export interface EngineClient {
  /** Reacts to the store's requests from now on; returns the function that stops it. */
  watch(): () => void
  /**
   * Loads a model. On an input error the error card shows and the previous model stays. `quiet`
   * (used after a restart) keeps the current error card. True when the model is shown.
   */
  load(source: AppSource, opts?: { quiet?: boolean }): Promise<boolean>
  /** Stops a running load: the worker is ended and restarted, the last good model reloaded. */
  cancelLoad(): Promise<void>
  /**
   * Sections along `normal` (model extent when from/to are left out). Resolves to null when a
   * restart dropped the job; input problems come back as {ok: false}.
   */
  sweep(normal: Vec3, count: number, from?: number, to?: number, axes?: SectionAxesChoice): Promise<Outcome<SweepReply> | null>
  /** Runs `job` in turn; an unexpected failure shows in the error card and the engine restarts. Null then. */
  runJob<T>(job: (calls: EngineCalls) => Promise<T>): Promise<T | null>
  /** Called after each successful load (the app applies a pending link view then). */
  onModelLoaded(cb: ((source: AppSource) => void) | null): void
  /** Ends the worker; the client starts a new one if asked again. */
  dispose(): void
}

/** A cut to send: the section as in the store, moved to `offset`; `paced`: a drag step. */
interface CutAsk {
  readonly offset: number
  readonly paced: boolean
}

/** Runs `cb` after the next animation frame has been produced (rAF, then a task after it). */
function afterNextFrame(cb: () => void): void {
  if (typeof requestAnimationFrame !== 'function' || (typeof document !== 'undefined' && document.hidden)) { setTimeout(cb, 0); return }
  requestAnimationFrame(() => setTimeout(cb, 0))
}

/** Request to reply of a cut, as a User Timing entry the browser tests read (nothing more). */
function measureCut(askedAt: number, computeMs: number | null): void {
  if (typeof performance.measure === 'function') performance.measure('tractus:cut', { start: askedAt, detail: computeMs === null ? null : { computeMs } })
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

/** Same component axes (kind, point and direction). */
function sameAxes(a: ComponentAxes | null, b: ComponentAxes): boolean {
  if (!a || a.kind !== b.kind) return false
  if (a.kind === 'global' || b.kind === 'global') return true
  return a.origin.every((v, k) => v === b.origin[k]) && a.axis.every((v, k) => v === b.axis[k])
}

/**
 * The cut request for the section as it stands in `st` at `offset` (switched on, whether it is
 * or not): its plane, arrows and options. Software WebGL pays for every arrow on every frame (the
 * compositor waits for the picture): while the plane is being dragged there, the section arrows
 * are left out; they return on release. Regions are left out while dragging too. There, too, a
 * large section face comes with a light one drawn while dragging, and a drag step brings the light
 * face only (workers/sectionFace.ts).
 */
function cutRequestOf(st: TractusState, offset: number) {
  const plane = sectionPlaneOf({ ...st.section, offset })
  const software = st.renderer === 'software'
  const budget = software && st.section.dragging ? 0 : st.arrowSettings.budget
  const lightFace = software ? (st.section.dragging ? 'only' as const : 'also' as const) : undefined
  const options = { axes: st.sectionAxes, regions: !st.section.dragging, limit: st.sectionLimit, ...(lightFace ? { lightFace } : {}) }
  return { plane, arrows: { mode: st.arrowSettings.mode, budget }, options }
}

function cutKey(plane: { point: readonly number[]; normal: readonly number[] }, mode: string, budget: number): string {
  return `${plane.point.join(',')}|${plane.normal.join(',')}|${mode}|${budget}`
}

export function createEngineClient(deps: EngineClientDeps): EngineClient {
  const { store } = deps
  const afterFrame = deps.afterFrame ?? afterNextFrame
  const fetchUrl = deps.fetch ?? ((url: string) => fetch(url))
  const cutTimed = deps.cutTimed ?? measureCut

  let handle: EngineConnection | null = null
  let queue: Promise<unknown> = Promise.resolve()
  /** Worker generation: a restart moves it on, and replies of an older one are dropped. */
  let generation = 0
  let lastGood: AppSource | null = null
  let afterLoad: ((source: AppSource) => void) | null = null
  let cutInFlight = false
  /** The newest cut asked for while one was in flight (or before a drag's first frame). */
  let cutPending: CutAsk | null = null
  /** True from the start of a drag until its first frame is out (that frame must not share the CPU). */
  let dragStartGate = false
  /** Plane, arrow mode and budget of the cut on screen, so an unchanged request does nothing. */
  let shownKey = ''
  let probeInFlight = false

  function connection(): EngineConnection {
    if (handle) return handle
    const h: EngineConnection = deps.createWorker((message) => {
      if (handle === h) void recover({ message: `The engine stopped: ${message || 'an unexpected error'}. The previous model is being reloaded.` })
    })
    handle = h
    void h.calls.configure(deps.computeOptions?.() ?? {}).catch(() => undefined)
    return h
  }

  /** Runs jobs one after another; a job queued before a restart is dropped by its generation. */
  function enqueue<T>(job: (calls: EngineCalls) => Promise<T>): Promise<T> {
    const gen = generation
    const run = queue.then(() => (gen === generation ? job(connection().calls) : Promise.reject(new Error('cancelled'))))
    queue = run.catch(() => undefined)
    return run
  }

  function restart(): void {
    generation++
    lineInFlight = false
    lineAgain = false
    componentsInFlight = false
    handle?.terminate()
    handle = null
    queue = Promise.resolve()
    cutInFlight = false
    cutPending = null
    dragStartGate = false
    probeInFlight = false
    shownKey = ''
    caseInFlight = false; caseAgain = false; envelopeInFlight = false; envelopeAgain = false
  }

  async function recover(error: AppError): Promise<void> {
    restart()
    store.getState().loadEnded(error)
    await reloadLastGood()
  }

  /**
   * After a restart the fresh worker gets the last good model again, and with it the case shown
   * and the combinations defined in the app: a new load would reset both (caseStateOfLoad), so
   * they are put back once it is in, and the case is asked for with them.
   */
  async function reloadLastGood(): Promise<void> {
    if (!lastGood) return
    const before = store.getState()
    const keep = before.model ? { caseName: before.caseName, combos: before.userCombinations } : null
    const shown = await load(lastGood, { quiet: true })
    if (!shown || !keep) return
    const st = store.getState()
    if (keep.combos.length > 0) st.setUserCombinations(keep.combos)
    if (keep.caseName && keep.caseName !== st.caseName) st.chooseCase(keep.caseName)
    // without a watch (tests, a client not yet watching) the case is asked for here
    if (!watching && st.model && store.getState().caseName !== st.model.shownCase) runCase()
  }

  async function toModelSource(s: AppSource): Promise<ModelSource> {
    if (s.kind === 'synthetic') return { kind: 'synthetic', spec: s.spec }
    if (s.kind === 'files') {
      // Refused before anything is read. The files go as they are (handles, not bytes): the worker
      // reads each in slices and digests it (workers/inputFiles.ts), so no file is held twice.
      checkModelSize(s.files.map((f) => ({ name: f.name, size: f.size })))
      const files: EngineFile[] = s.files.map((f) => ({ name: f.name, data: f }))
      return { kind: 'files', files, label: 'files:' + s.files.map((f) => f.name).join(','), ...(s.units ? { units: s.units } : {}) }
    }
    const res = await fetchUrl(s.url)
    if (!res.ok) throw new Error(`Could not read the demo model ${s.file} (HTTP ${res.status}).`)
    const name = s.file.split('/').pop() ?? s.file
    // As a file the user opens: the worker reads and digests it.
    return { kind: 'files', files: [{ name, data: await res.blob() }], label: `demo:${s.id}` }
  }

  async function load(source: AppSource, opts: { quiet?: boolean } = {}): Promise<boolean> {
    store.getState().loadStarted({ keepError: !!opts.quiet })
    let src: ModelSource
    try {
      src = await toModelSource(source)
    } catch (e) {
      const err = isInputError(e) ? { message: e.message, file: e.where.file, hint: e.kind === 'too-large' ? tooLargeHint(e.where.file) : undefined } : { message: e instanceof Error ? e.message : String(e) }
      store.getState().loadEnded(err)
      return false
    }
    const gen = generation
    try {
      const onProgress = (p: Progress): void => { if (gen === generation) store.getState().loadProgress(p) }
      const rule = store.getState().patchRule
      const out = await enqueue<Outcome<LoadedModel>>((calls) => calls.load(src, onProgress, rule))
      if (gen !== generation) return false
      if (!out.ok) { store.getState().loadEnded(out.error); return false }
      lastGood = source
      shownKey = ''
      store.getState().modelLoaded(out.value)
      afterLoad?.(source)
      // the engine's work after a load once the first picture is out: a frame for the scene to
      // take the surface, one to draw it (EngineApi.pictureShown); then the input files' digests
      afterFrame(() => afterFrame(() => {
        if (gen !== generation) return
        const calls = connection().calls
        // the cut the section's switch would ask for, so the engine's warm-up cut is that cut
        const st = store.getState()
        const likely = st.model && !st.section.enabled ? cutRequestOf(st, st.section.offset) : undefined
        void calls.pictureShown(likely).catch(() => undefined)
        if (out.value.summary.digestsPending) {
          void calls.inputDigests().then((records) => { if (gen === generation && records) store.getState().inputsDigested(records) }, () => undefined)
        }
      }))
      void refreshSurfaceArrows()
      requestCut()
      // The load brings the components in global axes; other axes chosen before are asked for.
      runComponents()
      return true
    } catch (e) {
      if (gen !== generation) return false
      // A real failure inside the worker: show it, start a fresh worker with the last good model.
      await recover({ message: failureMessage(e, 'while loading') })
      return false
    }
  }

  async function cancelLoad(): Promise<void> {
    restart()
    store.getState().loadEnded()
    await reloadLastGood()
  }

  async function refreshSurfaceArrows(): Promise<void> {
    const st = store.getState()
    if (!st.model || !st.arrowSettings.surface) { if (st.arrows) st.surfaceArrowsShown(null); return }
    const gen = generation
    const { mode, budget } = st.arrowSettings
    try {
      const a = await enqueue((calls) => calls.surfaceArrows({ mode, budget }))
      if (gen === generation) store.getState().surfaceArrowsShown(a)
    } catch { /* dropped by a restart */ }
  }

  /** Asks for a cut of the store's current plane (not a drag step). */
  function requestCut(): void {
    const st = store.getState()
    if (!st.model) return
    if (!st.section.enabled) {
      shownKey = ''
      if (st.sectionResult || st.sectionBuffers) st.cutCleared()
      return
    }
    ask({ offset: st.section.offset, paced: false })
  }

  /** The one entry of every cut: sent now, or kept as the one pending request (the newest wins). */
  function ask(a: CutAsk): void {
    if (cutInFlight || dragStartGate) { cutPending = a; return }
    startCut(a)
  }

  /** Sends the pending request, if any, once the previous cut's frame is out. */
  function sendPending(): void {
    const next = cutPending
    cutPending = null
    if (!next) return
    // A drag step left over after the release: the release asked for its own cut.
    if (next.paced) { if (store.getState().section.dragging) startCut(next) } else requestCut()
  }

  function startCut(a: CutAsk): void {
    const st = store.getState()
    if (!st.model || !st.section.enabled) return
    const { plane, arrows: { mode, budget }, options } = cutRequestOf(st, a.offset)
    const { axes, regions, limit } = options
    const key = cutKey(plane, mode, budget) + `|${axes.kind}|${axes.reference?.join(',') ?? ''}|${regions}|${JSON.stringify(limit)}|${options.lightFace ?? ''}`
    if (!a.paced && key === shownKey && st.sectionResult) return
    cutInFlight = true
    const gen = generation
    const asked = performance.now()
    enqueue<Outcome<CutReply>>((calls) => calls.cut(plane, { mode, budget }, options))
      .then((out) => {
        if (gen !== generation) return
        cutTimed(asked, out.ok ? out.value.computeMs : null)
        const now = store.getState()
        // A drag step's cut that arrives after the release is stale: the release asked for a newer cut.
        if (a.paced && !now.section.dragging) return
        if (!out.ok) { now.showError(out.error); return }
        shownKey = key
        now.cutShown(out.value.result, out.value.buffers, a.paced ? a.offset : undefined, out.value.info ?? null)
        now.regionsShown(out.value.regionTriangles ?? null)
      })
      .catch((e) => {
        if (gen === generation) store.getState().showError({ message: `The section could not be computed: ${e instanceof Error ? e.message : String(e)}` })
      })
      .finally(() => {
        if (gen !== generation) return
        afterFrame(() => {
          if (gen !== generation) return
          cutInFlight = false
          sendPending()
        })
      })
  }

  /** A drag began: its first step waits for the frame the grab itself causes. */
  function dragStarted(): void {
    dragStartGate = true
    const gen = generation
    afterFrame(() => {
      if (gen !== generation) return
      dragStartGate = false
      if (!cutInFlight) sendPending()
    })
  }

  /** Intersects the stored probe ray in the worker (the latest ray wins). */
  function runProbe(): void {
    const st = store.getState()
    const ray = st.probeRay
    if (!ray || !st.model || probeInFlight) return
    probeInFlight = true
    const gen = generation
    const section = st.section.enabled ? { plane: sectionPlaneOf(st.section), hide: resolvedHide(st.section, st.camera) } : null
    const deformScale = deformScaleOf(st)
    enqueue((calls) => calls.probe({ ray, section, deformScale }))
      .then((r) => {
        if (gen !== generation) return
        const now = store.getState()
        // While a line is being picked, a click sets its next end instead of probing.
        if (now.linePicking !== 'off') { if (r) now.linePointPicked(r.position) } else now.probeShown(r)
      })
      .catch(() => undefined)
      .finally(() => {
        if (gen !== generation) return
        probeInFlight = false
        if (store.getState().probeRay !== ray) runProbe()
      })
  }

  // ---- Lines and stress components: the latest request wins, as for the probe. ----
  let lineInFlight = false, lineAgain = false, componentsInFlight = false

  /** Asks for the values along the store's line (when both ends are set). */
  function runLine(): void {
    const st = store.getState()
    const { from, to, points, criterion } = st.line
    if (!st.model || !from || !to) return
    if (lineInFlight) { lineAgain = true; return }
    lineInFlight = true
    const gen = generation
    st.lineStarted()
    enqueue((calls) => calls.line({ from, to, points, criterion, axes: st.componentAxes }))
      .then((out) => {
        if (gen !== generation) return
        if (out.ok) store.getState().lineEnded(out.value)
        else store.getState().lineEnded(null, out.error.message)
      })
      .catch((e) => { if (gen === generation) store.getState().lineEnded(null, `The line could not be computed: ${e instanceof Error ? e.message : String(e)}`) })
      .finally(() => {
        if (gen !== generation) return
        lineInFlight = false
        if (lineAgain) { lineAgain = false; runLine() }
      })
  }

  /** Asks for the surface components in the store's axes (unless they are on screen). */
  function runComponents(): void {
    const st = store.getState()
    if (!st.model || componentsInFlight) return
    const axes = st.componentAxes
    // Global axes come with every load: nothing to ask for (an engine without them has none).
    if (st.components ? sameAxes(st.components.axes, axes) : axes.kind === 'global') return
    componentsInFlight = true
    const gen = generation
    enqueue((calls) => calls.components(axes))
      .then((out) => {
        if (gen !== generation) return
        if (out.ok) store.getState().componentsShown(out.value)
        else store.getState().showError(out.error)
      })
      .catch(() => undefined)
      .finally(() => {
        if (gen !== generation) return
        componentsInFlight = false
        // The axes may have changed again meanwhile (a failed request is not repeated).
        if (store.getState().componentAxes !== axes) runComponents()
      })
  }

  // ---- Load cases: the latest choice wins; the section, the arrows, the line and the sweep follow. ----
  let caseInFlight = false, caseAgain = false, envelopeInFlight = false, envelopeAgain = false

  /** Asks the engine for the store's case (when it is not the one shown, or its factors changed). */
  function runCase(): void {
    const st = store.getState()
    if (!st.model || !st.caseName) return
    if (caseInFlight) { caseAgain = true; return }
    caseInFlight = true
    st.caseStarted()
    const gen = generation
    const name = st.caseName, combos = st.userCombinations, asked = performance.now()
    enqueue((calls) => calls.showCase(name, combos, st.patchRule))
      .then((out) => {
        if (gen !== generation) return
        const now = store.getState()
        if (!out.ok) { now.caseShown(null); now.showError(out.error); return }
        now.caseShown(out.value)
        if (typeof performance.measure === 'function') performance.measure('tractus:case', { start: asked })
        shownKey = ''
        void refreshSurfaceArrows()
        requestCut()
        runComponents()
        if (now.line.from && now.line.to) runLine()
        resweep()
      })
      .catch((e) => { if (gen === generation) { store.getState().caseShown(null); store.getState().showError({ message: `The load case could not be shown: ${e instanceof Error ? e.message : String(e)}` }) } })
      .finally(() => {
        if (gen !== generation) return
        caseInFlight = false
        if (caseAgain) { caseAgain = false; runCase() }
      })
  }

  /** The last sweep again at the same sections (another case shown, other combinations). */
  function resweep(): void {
    const st = store.getState()
    const sw = st.sweep
    if (!sw || sw.offsets.length === 0) return
    const gen = generation
    st.sweepStarted()
    void sweep(sw.normal, sw.offsets.length, sw.offsets[0], sw.offsets[sw.offsets.length - 1], st.sectionAxes).then((r) => {
      if (gen === generation) store.getState().sweepEnded(r && r.ok ? r.value : null)
    })
  }

  /** The envelope of the section on screen over every case and combination (when the cut card shows it). */
  function runEnvelope(): void {
    const st = store.getState()
    if (!st.model || !st.envelopeOpen || !st.section.enabled || st.section.dragging) return
    if (envelopeInFlight) { envelopeAgain = true; return }
    envelopeInFlight = true
    const gen = generation
    const plane = sectionPlaneOf(st.section)
    enqueue((calls) => calls.envelope(plane, { combinations: st.userCombinations, combinationsOnly: st.envelopeCombinationsOnly, axes: st.sectionAxes }))
      .then((out) => {
        if (gen !== generation) return
        if (out.ok) store.getState().envelopeShown(out.value)
        else store.getState().envelopeShown(null, out.error.message)
      })
      .catch((e) => { if (gen === generation) store.getState().envelopeShown(null, `The envelope could not be computed: ${e instanceof Error ? e.message : String(e)}`) })
      .finally(() => {
        if (gen !== generation) return
        envelopeInFlight = false
        if (envelopeAgain) { envelopeAgain = false; runEnvelope() }
      })
  }

  let watching = false

  function watch(): () => void {
    watching = true
    const stop = store.subscribe((s, p) => {
      // --- load cases ---
      let caseAsked = false
      if (s.model && s.caseName && (s.caseName !== p.caseName || s.userCombinations !== p.userCombinations)) {
        const user = s.userCombinations.find((c) => c.name.toLowerCase() === s.caseName!.toLowerCase())
        const changed = user !== p.userCombinations.find((c) => c.name.toLowerCase() === s.caseName!.toLowerCase())
        if (s.caseName !== s.model.shownCase || (user && changed)) { runCase(); caseAsked = true }
      }
      if (s.envelopeOpen && (s.envelopeOpen !== p.envelopeOpen || s.envelopeCombinationsOnly !== p.envelopeCombinationsOnly ||
          s.userCombinations !== p.userCombinations || s.sectionAxes !== p.sectionAxes || s.model !== p.model && s.model?.source !== p.model?.source ||
          (s.section !== p.section && !s.section.dragging && (s.section.point !== p.section.point || s.section.normal !== p.section.normal || s.section.offset !== p.section.offset || s.section.enabled !== p.section.enabled || p.section.dragging)))) runEnvelope()
      // other combinations: the sweep's cases and envelope again (the case shown re-sweeps in runCase)
      if (s.sweep && !caseAsked && s.model === p.model && (s.userCombinations !== p.userCombinations || s.envelopeCombinationsOnly !== p.envelopeCombinationsOnly)) resweep()
      if (s.componentAxes !== p.componentAxes) runComponents()
      if (s.line !== p.line || (s.componentAxes !== p.componentAxes && s.line.from && s.line.to)) runLine()
      if (s.section !== p.section) {
        const a = s.section, b = p.section
        if (a.dragging && !b.dragging) dragStarted()
        // Only the plane and the switch change the cut; hide, fill and dragging are drawing matters,
        // and an offset that changes during a drag came with its own cut. The release cuts once
        // more, with the arrows the drag left out.
        if (a.enabled !== b.enabled || a.point !== b.point || a.normal !== b.normal ||
            (a.offset !== b.offset && !a.dragging) || (b.dragging && !a.dragging)) requestCut()
      }
      // A drag step (the grab itself only records where the drag starts).
      if (s.sectionDrag && p.sectionDrag && s.sectionDrag !== p.sectionDrag && s.section.dragging) ask({ offset: s.sectionDrag.offset, paced: true })
      const x = s.arrowSettings, y = p.arrowSettings
      if (x !== y) {
        if (x.mode !== y.mode || x.budget !== y.budget) requestCut()
        if (x.surface !== y.surface || x.mode !== y.mode || x.budget !== y.budget) void refreshSurfaceArrows()
      }
      if (s.probeRay !== p.probeRay && s.probeRay) runProbe()
      if (s.sectionAxes !== p.sectionAxes || s.sectionLimit !== p.sectionLimit) requestCut()
      if (s.patchRule !== p.patchRule && s.model) void refreshPatches()
    })
    return () => { watching = false; stop() }
  }

  /** Finds the patches again by the store's rule (the newest rule wins; an older reply is dropped). */
  async function refreshPatches(): Promise<void> {
    const rule = store.getState().patchRule
    const gen = generation
    try {
      const out = await enqueue<Outcome<PatchReply>>((calls) => calls.patches(rule))
      if (gen !== generation || store.getState().patchRule !== rule) return
      if (!out.ok) { store.getState().showError(out.error); return }
      store.getState().patchesShown(out.value.audit, out.value.patchLabel)
    } catch { /* dropped by a restart */ }
  }

  async function sweep(normal: Vec3, count: number, from?: number, to?: number, axes?: SectionAxesChoice): Promise<Outcome<SweepReply> | null> {
    const gen = generation
    // every case and combination at the same sections, when the model has more than one
    const st = store.getState()
    const many = (st.model?.cases?.length ?? 1) + (st.model?.combinations?.length ?? 0) + st.userCombinations.length > 1
    const cases = many ? { combinations: st.userCombinations, combinationsOnly: st.envelopeCombinationsOnly } : undefined
    try {
      const out = await enqueue<Outcome<SweepReply>>((calls) => calls.sweep(normal, count, from, to, axes, cases))
      return gen === generation ? out : null
    } catch (e) {
      if (gen !== generation) return null
      return { ok: false, error: { message: `The sweep could not be computed: ${e instanceof Error ? e.message : String(e)}` } }
    }
  }

  async function runJob<T>(job: (calls: EngineCalls) => Promise<T>): Promise<T | null> {
    const gen = generation
    try {
      return await enqueue(job)
    } catch (e) {
      if (gen === generation) await recover({ message: failureMessage(e, 'in the engine') })
      return null
    }
  }

  return {
    watch,
    load,
    cancelLoad,
    sweep,
    runJob,
    onModelLoaded(cb) { afterLoad = cb },
    dispose() {
      restart()
    },
  }
}
