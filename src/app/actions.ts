/**
 * What buttons, shortcuts, drops and links do. Thin: each action sets store fields or calls the
 * worker client; nothing O(elements) happens here.
 */
import { download, fileStem } from './exports.ts'
import { engine } from './engine.ts'
import type { AppSource } from './engine.ts'
import { composeSnapshot } from './snapshot.ts'
import { useStore } from '../state/store.ts'
import { modelWithInputs } from '../state/selectors.ts'
import { buildViewLink, parseViewLink } from './urlHash.ts'
import type { ViewLink } from './urlHash.ts'
import type { InputFileRecord } from '../../workers/protocol.ts'
import { PREVIEW_BYTES, mappingModelJson, mappingProblems, previewBundle, suggestMapping } from '../io/bundlePreview.ts'
import type { SampleFile } from '../io/bundlePreview.ts'
import { limitFor } from '../io/sizeGuard.ts'

/** An entry of public/demo/index.json. */
export interface DemoEntry {
  readonly id: string
  readonly name: string
  readonly description: string
  readonly file: string
  readonly units?: unknown
  readonly elements?: number
}

/** The generated model used when no demo list is shipped (or it cannot be read). */
export const FALLBACK_SOURCE: AppSource = { kind: 'synthetic', spec: { kind: 'block', elements: 12000 } }

let demoList: Promise<DemoEntry[]> | null = null

/** Reads public/demo/index.json once; an unreadable list is an empty list. */
export function demos(): Promise<DemoEntry[]> {
  if (!demoList) {
    demoList = fetch(new URL('demo/index.json', document.baseURI).href)
      .then((r) => (r.ok ? r.json() : []))
      .then((doc: unknown) => {
        // Either a bare list or {scenarios: [...]}.
        const list = Array.isArray(doc) ? doc : Array.isArray((doc as { scenarios?: unknown })?.scenarios) ? (doc as { scenarios: unknown[] }).scenarios : []
        return list.filter(isDemoEntry)
      })
      .catch(() => [])
  }
  return demoList
}

function isDemoEntry(x: unknown): x is DemoEntry {
  const e = x as DemoEntry
  // The file is a path under demo/: plain segments only, so the list cannot point elsewhere.
  return !!e && typeof e.id === 'string' && /^[A-Za-z0-9_-]{1,64}$/.test(e.id) && typeof e.file === 'string' &&
    /^[A-Za-z0-9_-][A-Za-z0-9_.-]*(\/[A-Za-z0-9_-][A-Za-z0-9_.-]*)*$/.test(e.file) && e.file.length <= 200 &&
    !e.file.split('/').includes('..') && typeof e.name === 'string'
}

export function demoSource(d: DemoEntry): AppSource {
  return { kind: 'demo', id: d.id, file: d.file, url: new URL('demo/' + d.file, document.baseURI).href }
}

/**
 * Files chosen or dropped: a container loads at once; a CSV bundle is previewed from its first
 * bytes (bounded, PREVIEW_BYTES a file) and loads at once when it reads as it is and declares its
 * units, else the intake step asks for the mapping and the units first (the model on screen stays).
 */
export async function openFiles(files: readonly File[]): Promise<void> {
  if (files.length === 0) return
  // A file over its limit is refused at once (the engine client's card), before any preview.
  if (files.some((f) => f.size > limitFor(f.name))) { await engine.load({ kind: 'files', files: [...files] }); return }
  const samples = await Promise.all(files.map(sampleOf))
  if (samples.some((s) => s.text.startsWith('TRACTUS\0'))) { await engine.load({ kind: 'files', files: [...files] }); return }
  const preview = previewBundle(samples)
  const declared = preview.unitsDeclared.length && preview.unitsDeclared.stress
  if (preview.jsonError || (!preview.problem && declared)) { await engine.load({ kind: 'files', files: [...files] }); return }
  // Units are never guessed: each one the files do not state is chosen by the user.
  useStore.getState().intakeAsked({ files: [...files], preview, mapping: suggestMapping(preview, { length: null, stress: null }), unitsOnly: !preview.problem })
}

/** The first bytes of a file as text, cut at its last line end (model.json whole, when small). */
async function sampleOf(f: File): Promise<SampleFile> {
  const whole = f.size <= PREVIEW_BYTES || (f.name.toLowerCase().endsWith('.json') && f.size <= 4 * PREVIEW_BYTES)
  const text = await f.slice(0, whole ? f.size : PREVIEW_BYTES).text()
  if (whole) return { name: f.name, text }
  const end = Math.max(text.lastIndexOf('\n'), text.lastIndexOf('\r'))
  return { name: f.name, text: end > 0 ? text.slice(0, end + 1) : text }
}

/** Loads the files of the intake step with its mapping (as a model.json beside them) and its units. */
export async function loadIntake(): Promise<void> {
  const st = useStore.getState()
  const step = st.intakeStep
  if (!step || mappingProblems(step.preview, step.mapping).length) return
  let files = step.files
  if (!step.unitsOnly) {
    const json = mappingModelJson(step.preview, step.mapping, false)
    files = [...files.filter((f) => f.name.toLowerCase() !== 'model.json'), new File([JSON.stringify(json, null, 2)], 'model.json', { type: 'application/json' })]
  }
  st.intakeClosed()
  const { length, stress } = step.mapping.units
  await engine.load({ kind: 'files', files: [...files], units: { ...(length ? { length } : {}), ...(stress ? { stress } : {}) } })
}

/** Downloads the intake step's mapping and units as model.json, for next time. */
export function saveIntakeJson(): void {
  const step = useStore.getState().intakeStep
  if (!step) return
  download('model.json', JSON.stringify(mappingModelJson(step.preview, step.mapping, true), null, 2) + '\n', 'application/json')
}

export async function takeSnapshot(scale: number): Promise<void> {
  const st = useStore.getState()
  const canvas = document.querySelector<HTMLCanvasElement>('[data-testid="scene"] canvas')
  const w = canvas?.clientWidth || window.innerWidth, h = canvas?.clientHeight || window.innerHeight
  try {
    const blob = await composeSnapshot(st, w, h, scale, canvas)
    const stamp = new Date().toISOString().slice(0, 16).replace(/[:T]/g, '-')
    download(`${fileStem(st.model?.name ?? 'tractus')}-${stamp}-${scale}x.png`, blob)
  } catch (e) {
    st.showError({ message: `The snapshot could not be made: ${e instanceof Error ? e.message : String(e)}` })
  }
}

/** The first 12 hex digits of each input's SHA-256, when every input has one. */
function shortHashes(inputs: readonly InputFileRecord[] | undefined): string[] | undefined {
  if (!inputs || inputs.length === 0 || !inputs.every((i) => i.sha256)) return undefined
  return inputs.map((i) => i.sha256!.slice(0, 12))
}

/** The link of the current view (the model by name: a demo, a generated block, or the user's files). */
export function currentViewLink(): ViewLink {
  const st = useStore.getState()
  const src = st.model?.source ?? ''
  let model: ViewLink['model']
  if (src.startsWith('demo:')) model = { kind: 'demo', id: src.slice(5) }
  else if (src.startsWith('synthetic:block:')) model = { kind: 'block', elements: Number(src.slice(16)) }
  else if (src.startsWith('files:')) {
    const names = modelWithInputs(st)?.inputs?.map((i) => i.name) ?? src.slice(6).split(',')
    const sha = shortHashes(modelWithInputs(st)?.inputs)
    model = { kind: 'files', names, ...(sha ? { sha } : {}) }
  }
  return {
    model, quantity: st.quantity, range: st.range, colourMap: st.colourMap, units: st.unitPreset === 'model' ? 'model' : st.units,
    section: st.section.enabled ? { ...st.section } : undefined,
    camera: st.camera ?? undefined,
    // --- load cases ---
    ...(st.caseName && st.model?.cases && st.caseName !== st.model.cases[0]?.name ? { loadCase: st.caseName } : {}),
    ...(st.userCombinations.length ? { combinations: [...st.userCombinations] } : {}),
  }
}

/** The view of a link that waits for its model: loaded from the link, or (files) opened by the user. */
let pendingView: ViewLink | null = null

/** Applies the parts of a link that do not need a model, and keeps the rest for after the load. */
function applyImmediate(v: ViewLink): void {
  const st = useStore.getState()
  const { units, ...rest } = v
  st.applyViewSettings({ quantity: rest.quantity, range: rest.range, colourMap: rest.colourMap })
  if (units === 'model') st.setUnitPreset('model')
  else if (units) st.setUnits(units)
}

function applyView(v: ViewLink): void {
  const st = useStore.getState()
  if (v.range) st.setRange(v.range)
  if (v.section) st.setSection(v.section)
  // --- load cases: the app's own combinations first, then the case they may name ---
  if (v.combinations) st.setUserCombinations(v.combinations)
  if (v.loadCase) st.chooseCase(v.loadCase)
  // The scene fits every new model in the render that shows it; asking for the linked camera a
  // moment later lands after that fit instead of being replaced by it.
  const cam = v.camera
  if (cam) setTimeout(() => useStore.getState().requestView({ camera: cam }), 50)
}

const sameName = (a: string, b: string): boolean => a.toLowerCase() === b.toLowerCase()

/**
 * After every load: a pending link view is applied when its model is the one just loaded. A view
 * made on the user's own files waits for files of the same names; it says so while it waits, and
 * says when the files opened have those names but other contents.
 */
function onLoaded(source: AppSource): void {
  const v = pendingView
  if (!v) return
  const st = useStore.getState()
  if (v.model?.kind !== 'files') {
    pendingView = null
    applyView(v)
    return
  }
  if (source.kind !== 'files') return // a demo shown while the link waits for the user's files
  const names = v.model.names
  const opened = source.files.map((f) => f.name)
  const matches = names.length === opened.length && names.every((n) => opened.some((o) => sameName(n, o)))
  if (!matches) {
    st.setLinkNotice({
      kind: 'needs-files', files: names,
      message: `This view was made on the files ${names.join(', ')}; the files just opened (${opened.join(', ')}) are other ones, so the view waits. Open ${names.length === 1 ? 'that file' : 'those files'} to apply it.`,
    })
    return
  }
  pendingView = null
  applyView(v)
  const have = shortHashes(modelWithInputs(st)?.inputs)
  const want = v.model.sha
  if (want && have) {
    const byName = new Map((modelWithInputs(st)?.inputs ?? []).map((i, k) => [i.name.toLowerCase(), have[k]]))
    const differ = names.filter((n, k) => byName.get(n.toLowerCase()) !== want[k])
    if (differ.length) {
      st.setLinkNotice({ kind: 'needs-files', files: names, message: `The view is applied, but ${differ.join(', ')} ${differ.length === 1 ? 'differs' : 'differ'} from the file the link was made on (another SHA-256): check that this is the same model.` })
      return
    }
  }
  st.setLinkNotice(null)
}

/**
 * The model a link loads: its demo or generated block; the first demo for a link on the user's
 * own files (their view waits, see onLoaded) and, with a notice, for a demo this build lacks.
 */
async function sourceForLink(v: ViewLink): Promise<AppSource> {
  if (v.model?.kind === 'block') return { kind: 'synthetic', spec: { kind: 'block', elements: v.model.elements } }
  const list = await demos()
  const m = v.model
  const wanted = m?.kind === 'demo' ? list.find((d) => d.id === m.id) : undefined
  const first = wanted ?? list[0]
  const st = useStore.getState()
  if (m?.kind === 'demo' && !wanted) {
    // The section and camera belong to the missing model: they are not applied to another.
    pendingView = null
    st.setLinkNotice({
      kind: 'unknown-demo',
      message: `The link names the demo "${m.id}", which this copy of Tractus does not have${first ? `; showing "${first.name}" instead, without the link's section and camera` : ''}.`,
    })
  } else if (m?.kind === 'files') {
    st.setLinkNotice({
      kind: 'needs-files', files: m.names,
      message: `This view was made on your own ${m.names.length === 1 ? 'file' : 'files'} ${m.names.join(', ')}, which a link cannot carry. Open ${m.names.length === 1 ? 'it' : 'them'} (Open… or drop ${m.names.length === 1 ? 'it' : 'them'} on the window) and the view — section, camera, colour range — is applied.`,
    })
  } else st.setLinkNotice(null)
  return first ? demoSource(first) : FALLBACK_SOURCE
}

/** Start-up: the model and view named by the URL hash, else the first demo, else a generated one. */
let started = false

export async function startFromHash(): Promise<void> {
  // React's development double-run of effects must not load twice.
  if (started) return
  started = true
  const v = parseViewLink(window.location.hash)
  applyImmediate(v)
  pendingView = v
  engine.onModelLoaded(onLoaded)
  const ok = await engine.load(await sourceForLink(v))
  if (!ok && !useStore.getState().model) await engine.load(FALLBACK_SOURCE)
}

/** A link pasted into this tab: load its model if it names another one, then apply the view. */
export async function followHash(): Promise<void> {
  const v = parseViewLink(window.location.hash)
  const cur = useStore.getState().model?.source ?? ''
  applyImmediate(v)
  pendingView = v
  const wantKey = v.model?.kind === 'demo' ? `demo:${v.model.id}` : v.model?.kind === 'block' ? `synthetic:block:${v.model.elements}` : null
  if (v.model?.kind === 'files') {
    // Already showing those files? Then the view applies now; else it waits for them.
    const names = modelWithInputs(useStore.getState())?.inputs?.map((i) => i.name) ?? []
    const shown = cur.startsWith('files:') && v.model.names.length === names.length && v.model.names.every((n) => names.some((o) => sameName(n, o)))
    if (shown) { pendingView = null; applyView(v) } else await sourceForLink(v)
    return
  }
  if (wantKey && wantKey !== cur) await engine.load(await sourceForLink(v))
  else { pendingView = null; applyView(v) }
}

let lastWritten = ''
let timer: ReturnType<typeof setTimeout> | null = null

/** Keeps the URL hash in step with the view (debounced, replaceState so history stays clean). */
export function startHashSync(): () => void {
  const write = (): void => {
    timer = null
    const st = useStore.getState()
    // A link waiting for the user's files keeps its address, so a reload still asks for them.
    if (!st.model || st.section.dragging || pendingView?.model?.kind === 'files') return
    const h = buildViewLink(currentViewLink())
    if (h !== lastWritten && h !== window.location.hash) {
      lastWritten = h
      history.replaceState(null, '', h)
    }
  }
  const unsub = useStore.subscribe((s, p) => {
    if (s.quantity !== p.quantity || s.range !== p.range || s.colourMap !== p.colourMap || s.units !== p.units ||
        s.section !== p.section || s.camera !== p.camera || s.model !== p.model || s.caseName !== p.caseName || s.userCombinations !== p.userCombinations) {
      if (timer) clearTimeout(timer)
      timer = setTimeout(write, 250)
    }
  })
  const onHash = (): void => {
    if (window.location.hash !== lastWritten) void followHash()
  }
  window.addEventListener('hashchange', onHash)
  return () => { unsub(); window.removeEventListener('hashchange', onHash) }
}
