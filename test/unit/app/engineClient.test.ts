/**
 * The engine client in Node, with a fake worker whose replies the test releases by hand and a
 * frame clock the test advances: no browser. Three behaviours of the section protocol and the
 * restart (the contract is written in src/app/engineClient.ts; common practice for request
 * coalescing in interactive tools):
 * - the latest plane wins: while a cut is in flight, further requests only replace the pending
 *   one, and the newest is sent next, once (for a drag and for plain moves alike);
 * - a reply from before a restart is dropped (the worker generation);
 * - cancelling a load keeps the last good model, reloads it in a fresh worker, and ignores the
 *   cancelled load's late reply.
 */
import { describe, expect, it } from 'vitest'
import { createEngineClient } from '../../../src/app/engineClient.ts'
import type { AppSource, EngineConnection } from '../../../src/app/engineClient.ts'
import { modelWithInputs } from '../../../src/state/selectors.ts'
import { createTractusStore, SOFTWARE_ARROW_BUDGET } from '../../../src/state/store.ts'
import type { SectionResult } from '../../../src/mechanics/types.ts'
import type {
  ArrowRequest, AuditSummary, Combination, CutOptions, CutReply, CutRequest, EngineCalls, InputFileRecord, LoadedModel, ModelSource, Outcome, PatchReply, PatchRule, Plane, SurfaceBuffers,
} from '../../../workers/protocol.ts'

interface Deferred<T> { readonly promise: Promise<T>; resolve(v: T): void }

function deferred<T>(): Deferred<T> {
  let resolve!: (v: T) => void
  const promise = new Promise<T>((r) => { resolve = r })
  return { promise, resolve }
}

/** One fake engine worker: records every load and cut and answers when the test says so. */
class FakeWorker {
  readonly loads: { source: ModelSource; reply: Deferred<Outcome<LoadedModel>>; rule?: PatchRule }[] = []
  readonly cuts: { plane: Plane; arrows: ArrowRequest; options?: CutOptions; reply: Deferred<Outcome<CutReply>> }[] = []
  readonly patchRules: { rule: PatchRule; reply: Deferred<Outcome<PatchReply>> }[] = []
  readonly shownCases: { name: string; combinations: readonly Combination[] }[] = []
  /** What the engine was told after loads: 'picture' for pictureShown, 'digests' for inputDigests. */
  readonly afterLoad: string[] = []
  /** The likely first cut each pictureShown carried. */
  readonly likely: (CutRequest | undefined)[] = []
  digests: InputFileRecord[] | null = null
  terminated = false
  constructor(readonly onFailure: (message: string) => void) {}
  readonly calls: EngineCalls = {
    configure: async () => undefined,
    load: (source, _onProgress, rule) => { const reply = deferred<Outcome<LoadedModel>>(); this.loads.push({ source, reply, rule }); return reply.promise },
    pictureShown: async (likely) => { this.afterLoad.push('picture'); this.likely.push(likely) },
    inputDigests: async () => { this.afterLoad.push('digests'); return this.digests },
    surfaceArrows: async () => null,
    cut: (plane, arrows, options) => { const reply = deferred<Outcome<CutReply>>(); this.cuts.push({ plane, arrows, options, reply }); return reply.promise },
    probe: async () => null,
    sweep: async () => ({ ok: false, error: { message: 'not in this test' } }),
    components: async () => ({ ok: false, error: { message: 'not in this test' } }),
    line: async () => ({ ok: false, error: { message: 'not in this test' } }),
    lineThroughWall: async () => null,
    showCase: async (name, combinations) => { this.shownCases.push({ name, combinations }); return { ok: false, error: { message: 'not in this test' } } },
    envelope: async () => ({ ok: false, error: { message: 'not in this test' } }),
    patches: (rule) => { const reply = deferred<Outcome<PatchReply>>(); this.patchRules.push({ rule, reply }); return reply.promise },
    dispose: async () => undefined,
  }
}

/** A model summary of a 2 × 1 × 1 box (length units m), centre (1, 0.5, 0.5). */
function loaded(name: string): Outcome<LoadedModel> {
  return {
    ok: true,
    value: {
      summary: {
        name, description: '', units: { length: 'm', stress: 'Pa' }, nodeCount: 8, elementCount: 1, boundaryFaceCount: 6,
        elementTypes: { hex8: 1 }, bounds: { min: [0, 0, 0], max: [2, 1, 1] }, bodyForce: [0, 0, 0], warnings: [], source: `synthetic:${name}`,
      },
      // The client passes buffers through to the store untouched; their content is not read here.
      surface: {} as SurfaceBuffers,
      audit: {} as AuditSummary,
    },
  }
}

/** A cut reply whose result carries the plane's x, so the test can tell which cut is shown. */
function cutReply(x: number): Outcome<CutReply> {
  return { ok: true, value: { result: { planeX: x } as unknown as SectionResult, buffers: null, computeMs: 1 } }
}

const shownX = (r: SectionResult | null): number | null => (r ? (r as unknown as { planeX: number }).planeX : null)

/** Lets queued promise callbacks run. */
const settle = (): Promise<void> => new Promise((r) => setTimeout(r, 0))

function setUp() {
  const store = createTractusStore()
  const workers: FakeWorker[] = []
  const frames: (() => void)[] = []
  const client = createEngineClient({
    store,
    createWorker: (onFailure): EngineConnection => {
      const w = new FakeWorker(onFailure)
      workers.push(w)
      return { calls: w.calls, terminate: () => { w.terminated = true } }
    },
    afterFrame: (cb) => { frames.push(cb) },
    cutTimed: () => undefined,
  })
  /** Puts out the frames asked for so far (and those they ask for in turn). */
  const frame = async (): Promise<void> => {
    await settle()
    while (frames.length) frames.splice(0).forEach((cb) => cb())
    await settle()
  }
  return { store, workers, client, frame }
}

const BLOCK = (name: string): AppSource => ({ kind: 'synthetic', spec: { kind: 'block', elements: name.length } })

async function loadModel(t: ReturnType<typeof setUp>, name: string): Promise<void> {
  const done = t.client.load(BLOCK(name))
  await settle()
  const w = t.workers[t.workers.length - 1]
  w.loads[w.loads.length - 1].reply.resolve(loaded(name))
  expect(await done).toBe(true)
}

describe('engine client: after the first picture', () => {
  it('tells the engine two frames after a load, then takes the files\' digests into the model\'s summary', async () => {
    const t = setUp()
    const done = t.client.load(BLOCK('A'))
    await settle()
    const w = t.workers[0]
    w.digests = [{ name: 'a.tractus', bytes: 10, sha256: 'cd'.repeat(32) }]
    const reply = loaded('A')
    if (!reply.ok) throw new Error('fixture')
    w.loads[0].reply.resolve({ ok: true, value: { ...reply.value, summary: { ...reply.value.summary, inputs: [{ name: 'a.tractus', bytes: 10 }], digestsPending: true } } })
    expect(await done).toBe(true)
    expect(w.afterLoad).toEqual([])
    const summary = t.store.getState().model
    expect(summary?.digestsPending).toBe(true)
    await t.frame()
    expect(w.afterLoad).toEqual(['picture', 'digests'])
    await settle()
    // the summary object stays the load's (effects keyed on it belong to a new model); the digests sit beside it
    expect(t.store.getState().model).toBe(summary)
    const m = modelWithInputs(t.store.getState())!
    expect(m.digestsPending).toBeUndefined()
    expect(m.inputs).toEqual([{ name: 'a.tractus', bytes: 10, sha256: 'cd'.repeat(32) }])
  })

  it('tells the engine the cut the section\'s switch will ask for, exactly as it then asks for it (the engine keeps that cut ready)', async () => {
    const t = setUp()
    t.client.watch()
    await loadModel(t, 'A')
    await t.frame()
    const w = t.workers[0]
    const likely = w.likely[0]
    expect(likely).toBeDefined()
    t.store.getState().setSection({ enabled: true })
    await settle()
    expect(w.cuts).toHaveLength(1)
    // the engine compares the two by their JSON (cutRequestKey): the same fields, the same numbers
    const asked = { plane: w.cuts[0].plane, arrows: w.cuts[0].arrows, options: w.cuts[0].options }
    expect(JSON.parse(JSON.stringify(asked))).toEqual(JSON.parse(JSON.stringify(likely)))
    expect(likely!.options.regions).toBe(true)
  })

  it('with the section already on, no likely cut goes with the first picture (the load asks for its cut)', async () => {
    const t = setUp()
    t.client.watch()
    await loadModel(t, 'A')
    await t.frame()
    t.store.getState().setSection({ enabled: true })
    await settle()
    t.workers[0].cuts[0].reply.resolve(cutReply(1))
    await t.frame()
    await loadModel(t, 'B')
    await t.frame()
    expect(t.store.getState().section.enabled).toBe(true)
    expect(t.workers[0].likely).toHaveLength(2)
    expect(t.workers[0].likely[1]).toBeUndefined()
  })

  it('a model without pending digests is not asked for them', async () => {
    const t = setUp()
    await loadModel(t, 'B')
    await t.frame()
    expect(t.workers[0].afterLoad).toEqual(['picture'])
  })
})

describe('engine client: section axes and the patch rule', () => {
  it('cuts with the store\'s section axes, cuts again when they change, and keeps what the engine adds', async () => {
    const t = setUp()
    t.client.watch()
    await loadModel(t, 'A')
    const w = t.workers[0]
    t.store.getState().setSection({ enabled: true })
    await settle()
    expect(w.cuts[0].options?.axes).toEqual({ kind: 'principal' })
    w.cuts[0].reply.resolve({ ok: true, value: { result: { planeX: 1 } as unknown as SectionResult, buffers: null, computeMs: 1, info: { axesNote: 'refused' } } })
    await t.frame()
    expect(t.store.getState().cutInfo).toEqual({ axesNote: 'refused' })
    t.store.getState().setSectionAxes({ kind: 'reference', reference: [0, 0, 1] })
    await t.frame()
    expect(w.cuts).toHaveLength(2)
    expect(w.cuts[1].options?.axes).toEqual({ kind: 'reference', reference: [0, 0, 1] })
  })

  it('loads with the store\'s patch rule and finds the patches again when it changes (the newest rule wins)', async () => {
    const t = setUp()
    t.client.watch()
    t.store.getState().setPatchRule({ threshold: 0.1, lowerThreshold: 0.02, featureAngle: 30 })
    const done = t.client.load(BLOCK('A'))
    await settle()
    const w = t.workers[0]
    expect(w.loads[0].rule).toEqual({ threshold: 0.1, lowerThreshold: 0.02, featureAngle: 30 })
    w.loads[0].reply.resolve(loaded('A'))
    await done
    t.store.getState().setPatchRule({ threshold: 0.05, lowerThreshold: 0.005, featureAngle: 40 })
    t.store.getState().setPatchRule({ threshold: 0.05, lowerThreshold: 0.005, featureAngle: 90 })
    await settle()
    // Both asked (one job at a time); the older reply is dropped.
    expect(w.patchRules.map((p) => p.rule.featureAngle)).toEqual([40])
    const audit = { patches: [] } as unknown as AuditSummary
    w.patchRules[0].reply.resolve({ ok: true, value: { audit, patchLabel: new Float32Array(0) } })
    await settle()
    await settle()
    expect(t.store.getState().audit).not.toBe(audit)
    expect(w.patchRules.map((p) => p.rule.featureAngle)).toEqual([40, 90])
    w.patchRules[1].reply.resolve({ ok: true, value: { audit, patchLabel: new Float32Array(0) } })
    await settle()
    await settle()
    expect(t.store.getState().audit).toBe(audit)
  })
})

describe('engine client: the latest plane wins', () => {
  it('a drag sends only the newest step after the cut in flight, and the plane moves with its cut', async () => {
    const t = setUp()
    t.client.watch()
    // Software WebGL: drag steps are cut without section arrows, the release with them.
    t.store.getState().setRenderer('software')
    await loadModel(t, 'A')
    const w = t.workers[0]
    t.store.getState().setSection({ enabled: true })
    await settle()
    expect(w.cuts.length).toBe(1)
    expect(w.cuts[0].plane.point[0]).toBe(1)

    const st = t.store.getState()
    st.beginSectionDrag()
    for (const offset of [0.1, 0.2, 0.3]) st.dragSection(offset)
    await t.frame()
    // The first cut has not answered: nothing new is sent, whatever the pointer does.
    expect(w.cuts.length).toBe(1)
    w.cuts[0].reply.resolve(cutReply(1))
    await t.frame()
    // One cut, of the newest step only; 0.1 and 0.2 were dropped.
    expect(w.cuts.length).toBe(2)
    expect(w.cuts[1].plane.point[0]).toBeCloseTo(1.3, 12)
    expect(w.cuts[1].arrows.budget).toBe(0)
    // ... and with the light section face only (workers/sectionFace.ts); the first cut asked for both.
    expect(w.cuts[1].options?.lightFace).toBe('only')
    expect(w.cuts[0].options?.lightFace).toBe('also')
    // The plane on screen stays where it was until its cut is there.
    expect(t.store.getState().section.offset).toBe(0)
    w.cuts[1].reply.resolve(cutReply(1.3))
    await t.frame()
    expect(shownX(t.store.getState().sectionResult)).toBe(1.3)
    expect(t.store.getState().section.offset).toBe(0.3)

    // The release takes the last step and cuts once more, with the arrows.
    t.store.getState().endSectionDrag()
    await t.frame()
    expect(t.store.getState().section).toMatchObject({ offset: 0.3, dragging: false })
    expect(w.cuts.length).toBe(3)
    expect(w.cuts[2].plane.point[0]).toBeCloseTo(1.3, 12)
    expect(w.cuts[2].arrows.budget).toBe(SOFTWARE_ARROW_BUDGET)
    expect(w.cuts[2].options?.lightFace).toBe('also')
  })

  it('moves by key or typed value while a cut is in flight: the newest plane is cut next, once', async () => {
    const t = setUp()
    t.client.watch()
    await loadModel(t, 'A')
    const w = t.workers[0]
    t.store.getState().setSection({ enabled: true })
    await settle()
    for (const offset of [0.1, 0.2, 0.3, 0.4]) t.store.getState().setSection({ offset })
    await t.frame()
    expect(w.cuts.length).toBe(1)
    w.cuts[0].reply.resolve(cutReply(1))
    await t.frame()
    expect(w.cuts.map((c) => c.plane.point[0])).toEqual([1, 1.4])
    w.cuts[1].reply.resolve(cutReply(1.4))
    await t.frame()
    expect(shownX(t.store.getState().sectionResult)).toBe(1.4)
    expect(w.cuts.length).toBe(2)
  })
})

describe('engine client: restarts', () => {
  it('drops a reply that arrives from the worker before a restart', async () => {
    const t = setUp()
    t.client.watch()
    await loadModel(t, 'A')
    const old = t.workers[0]
    t.store.getState().setSection({ enabled: true })
    await settle()
    expect(old.cuts.length).toBe(1)
    // The worker dies outside a call (its error event): the client restarts it and reloads A.
    old.onFailure('boom')
    await settle()
    expect(old.terminated).toBe(true)
    expect(t.store.getState().error?.message).toContain('boom')
    const fresh = t.workers[1]
    expect(fresh.loads.length).toBe(1)
    // The old worker's cut answers late: it must not reach the store.
    old.cuts[0].reply.resolve(cutReply(-1))
    await t.frame()
    expect(t.store.getState().sectionResult).toBeNull()
    fresh.loads[0].reply.resolve(loaded('A'))
    await t.frame()
    expect(fresh.cuts.length).toBe(1)
    fresh.cuts[0].reply.resolve(cutReply(1))
    await t.frame()
    expect(shownX(t.store.getState().sectionResult)).toBe(1)
  })

  it('a restarted worker gets the combinations defined in the app and the case shown', async () => {
    const t = setUp()
    t.client.watch()
    const done = t.client.load(BLOCK('A'))
    await settle()
    const withCases = (): Outcome<LoadedModel> => {
      const r = loaded('A')
      if (!r.ok) throw new Error('unreachable')
      const cases = ['dead', 'live'].map((name) => ({ name, description: '', bodyForce: [0, 0, 0] as [number, number, number], displacement: false }))
      return { ok: true, value: { ...r.value, summary: { ...r.value.summary, cases, shownCase: 'dead' } } }
    }
    t.workers[0].loads[0].reply.resolve(withCases())
    expect(await done).toBe(true)
    const combo: Combination = { name: 'ULS', factors: { dead: 1.35, live: 1.5 } }
    t.store.getState().saveCombination(combo)
    t.store.getState().chooseCase('ULS')
    await settle()
    expect(t.workers[0].shownCases).toEqual([{ name: 'ULS', combinations: [combo] }])
    // The worker dies: the fresh one reloads the model and is sent the app's combination again.
    t.workers[0].onFailure('boom')
    await settle()
    const fresh = t.workers[1]
    fresh.loads[0].reply.resolve(withCases())
    await t.frame()
    expect(t.store.getState().userCombinations).toEqual([combo])
    expect(t.store.getState().caseName).toBe('ULS')
    expect(fresh.shownCases).toEqual([{ name: 'ULS', combinations: [combo] }])
  })

  it('cancel keeps the last good model, reloads it in a fresh worker and ignores the cancelled load', async () => {
    const t = setUp()
    t.client.watch()
    await loadModel(t, 'A')
    const old = t.workers[0]
    const big = t.client.load(BLOCK('B-large'))
    await settle()
    expect(old.loads.length).toBe(2)
    expect(t.store.getState().busy).toBe(true)

    const cancelled = t.client.cancelLoad()
    await settle()
    expect(old.terminated).toBe(true)
    expect(t.store.getState().model?.name).toBe('A')
    const fresh = t.workers[1]
    expect(fresh.loads.length).toBe(1)
    expect(fresh.loads[0].source).toEqual({ kind: 'synthetic', spec: { kind: 'block', elements: 1 } })

    // The cancelled load answers late: B never shows.
    old.loads[1].reply.resolve(loaded('B-large'))
    expect(await big).toBe(false)
    expect(t.store.getState().model?.name).toBe('A')

    fresh.loads[0].reply.resolve(loaded('A'))
    await cancelled
    expect(t.store.getState()).toMatchObject({ busy: false, error: null })
    expect(t.store.getState().model?.name).toBe('A')
  })
})
