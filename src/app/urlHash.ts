/**
 * The view link: a URL hash that restores model (demo or generated), camera, quantity, colour
 * range, colour map, units and section. Parsing never throws and never trusts the text: unknown
 * keys are ignored, every number must be finite and within ±1e15, every name from a fixed list.
 *
 * Keys: model=demo:<id> | block | files:<name>/<name>/..., elements=<count>, fsha=<12 hex>/... (the
 * start of each file's SHA-256, in the order of the names), q=<quantity>, r=auto|<min>,<max> (model
 * units), map=<colour map>, u=SI|US|model|<length>,<force>,<stress>, cut=px,py,pz,nx,ny,nz,offset
 * (model length units; present = on), hide=auto|positive|negative|none, cam=px,py,pz,tx,ty,tz,ux,uy,uz,fov.
 * A link made on the user's own files names them (`files:`): it cannot load them (nothing leaves
 * the machine, and a page cannot open a file by itself), so the app says which files the view
 * needs and applies it once files of those names are opened.
 */
import type { Vec3 } from '../model/model.ts'
import { MAX_SYNTHETIC_ELEMENTS } from '../../workers/protocol.ts'
import { COLOUR_MAP_NAMES, QUANTITY_NAMES } from '../state/store.ts'
import type { CameraState, ColourMapName, ColourRange, QuantityName, SectionState } from '../state/store.ts'
import type { UnitSystem } from '../model/units.ts'
import type { Combination } from '../model/loadCases.ts'
import { isForceUnit, isLengthUnit, isStressUnit } from '../model/units.ts'

export interface ViewLink {
  model?: { kind: 'demo'; id: string } | { kind: 'block'; elements: number } | { kind: 'files'; names: string[]; sha?: string[] }
  quantity?: QuantityName
  range?: ColourRange
  colourMap?: ColourMapName
  /** Display units: a set, 'model' (the model's own), or a record of the user's own. */
  units?: UnitSystem | 'model'
  section?: Pick<SectionState, 'point' | 'normal' | 'offset' | 'hide'> & { enabled: boolean }
  camera?: CameraState
  // --- load cases: the case shown (lc=NAME) and the app's own combinations (combo=NAME~case:f,case:f|...) ---
  loadCase?: string
  combinations?: Combination[]
}

const CASE_TEXT = /^[A-Za-z0-9_-]{1,64}$/

/** "NAME~case:f,case:f|NAME2~..." → combinations; anything malformed is left out (at most 20, 50 factors each). */
function parseCombinations(s: string | null): Combination[] | undefined {
  if (!s || s.length > 3000) return undefined
  const out: Combination[] = []
  for (const part of s.split('|').slice(0, 20)) {
    const [name, list] = part.split('~')
    if (!name || !CASE_TEXT.test(name) || !list) continue
    const factors: Record<string, number> = {}
    let ok = true
    for (const f of list.split(',').slice(0, 50)) {
      const [k, v] = f.split(':')
      const x = Number(v)
      if (!k || !CASE_TEXT.test(k) || v === undefined || v.trim() === '' || !Number.isFinite(x) || Math.abs(x) > LIMIT) { ok = false; break }
      factors[k] = x
    }
    if (ok && Object.keys(factors).length > 0) out.push({ name, factors })
  }
  return out.length ? out : undefined
}

const LIMIT = 1e15

function numbers(s: string | null, n: number): number[] | null {
  if (!s || s.length > 400) return null
  const parts = s.split(',')
  if (parts.length !== n) return null
  const out = parts.map((p) => Number(p))
  return out.every((v) => Number.isFinite(v) && Math.abs(v) <= LIMIT) ? out : null
}

export function parseViewLink(hash: string): ViewLink {
  const out: ViewLink = {}
  let params: URLSearchParams
  try {
    params = new URLSearchParams(hash.replace(/^#/, '').slice(0, 4000))
  } catch {
    return out
  }
  const model = params.get('model')
  if (model && /^demo:[A-Za-z0-9_-]{1,64}$/.test(model)) out.model = { kind: 'demo', id: model.slice(5) }
  else if (model && model.startsWith('files:')) {
    // Plain file names, no folders and no control characters; at most 20 of them.
    const names = model.slice(6).split('/').filter((n) => n.length > 0)
    if (names.length > 0 && names.length <= 20 && names.every((n) => n.length <= 200 && !/[\u0000-\u001f\u007f\\]/.test(n) && n !== '.' && n !== '..')) {
      const sha = (params.get('fsha') ?? '').split('/')
      out.model = { kind: 'files', names, ...(sha.length === names.length && sha.every((h) => /^[0-9a-f]{12}$/.test(h)) ? { sha } : {}) }
    }
  } else if (model === 'block') {
    const e = Number(params.get('elements') ?? '20000')
    out.model = { kind: 'block', elements: Number.isInteger(e) && e >= 6 && e <= MAX_SYNTHETIC_ELEMENTS ? e : 20000 }
  }
  const q = params.get('q')
  if (q && (QUANTITY_NAMES as readonly string[]).includes(q)) out.quantity = q as QuantityName
  const r = params.get('r')
  if (r === 'auto') out.range = 'auto'
  else {
    const v = numbers(r, 2)
    if (v && v[0] < v[1]) out.range = [v[0], v[1]]
  }
  const map = params.get('map')
  if (map && (COLOUR_MAP_NAMES as readonly string[]).includes(map)) out.colourMap = map as ColourMapName
  const u = params.get('u')
  if (u === 'SI' || u === 'US' || u === 'model') out.units = u
  else if (u) {
    const [length, force, stress] = u.split(',')
    if (u.split(',').length === 3 && isLengthUnit(length) && isForceUnit(force) && isStressUnit(stress)) out.units = { length, force, stress }
  }
  const cut = numbers(params.get('cut'), 7)
  if (cut && Math.hypot(cut[3], cut[4], cut[5]) > 0) {
    const hide = params.get('hide')
    out.section = {
      enabled: true, point: [cut[0], cut[1], cut[2]], normal: [cut[3], cut[4], cut[5]], offset: cut[6],
      hide: hide === 'negative' || hide === 'none' || hide === 'positive' ? hide : 'auto',
    }
  }
  const lc = params.get('lc')
  if (lc && CASE_TEXT.test(lc)) out.loadCase = lc
  const combos = parseCombinations(params.get('combo'))
  if (combos) out.combinations = combos
  const cam = numbers(params.get('cam'), 10)
  if (cam && cam[9] > 1 && cam[9] < 170 && Math.hypot(cam[6], cam[7], cam[8]) > 0 &&
      Math.hypot(cam[0] - cam[3], cam[1] - cam[4], cam[2] - cam[5]) > 0) {
    out.camera = { position: [cam[0], cam[1], cam[2]], target: [cam[3], cam[4], cam[5]], up: [cam[6], cam[7], cam[8]], fov: cam[9] }
  }
  return out
}

/** Shortest round-trip text of a number (so a restored view matches to the last digit). */
const num = (v: number): string => (Object.is(v, -0) ? '0' : String(v))
const vec = (v: Vec3): string => v.map(num).join(',')

export function buildViewLink(v: ViewLink): string {
  const p = new URLSearchParams()
  if (v.model?.kind === 'demo') p.set('model', `demo:${v.model.id}`)
  else if (v.model?.kind === 'block') { p.set('model', 'block'); p.set('elements', String(v.model.elements)) }
  else if (v.model?.kind === 'files') {
    p.set('model', `files:${v.model.names.join('/')}`)
    if (v.model.sha) p.set('fsha', v.model.sha.join('/'))
  }
  if (v.quantity) p.set('q', v.quantity)
  if (v.range) p.set('r', v.range === 'auto' ? 'auto' : `${num(v.range[0])},${num(v.range[1])}`)
  if (v.colourMap) p.set('map', v.colourMap)
  if (v.units) p.set('u', typeof v.units === 'string' ? v.units : `${v.units.length},${v.units.force},${v.units.stress}`)
  if (v.section?.enabled) {
    p.set('cut', `${vec(v.section.point)},${vec(v.section.normal)},${num(v.section.offset)}`)
    p.set('hide', v.section.hide)
  }
  if (v.loadCase) p.set('lc', v.loadCase)
  if (v.combinations?.length) p.set('combo', v.combinations.map((c) => `${c.name}~${Object.entries(c.factors).map(([k, f]) => `${k}:${num(f)}`).join(',')}`).join('|'))
  if (v.camera) p.set('cam', `${vec(v.camera.position)},${vec(v.camera.target)},${vec(v.camera.up)},${num(v.camera.fov)}`)
  return '#' + p.toString().replace(/%2C/g, ',').replace(/%3A/g, ':').replace(/%2F/g, '/')
}
