/**
 * Starts the engine worker in the browser and speaks comlink to it: the factory the app hands to
 * `createEngineClient` (src/app/engineClient.ts). The user's files travel as Blobs (handles: the
 * worker reads them in slices), a demo's bytes by transfer, the progress
 * callback as a comlink proxy. A worker that dies outside a call reports through `onFailure`.
 */
import * as Comlink from 'comlink'
import type { CrashKind, EngineApi, EngineCalls, ModelSource } from '../../workers/protocol.ts'
import type { EngineConnection } from './engineClient.ts'

function transferList(src: ModelSource): Transferable[] {
  if (src.kind !== 'files') return []
  // Text is copied and a Blob goes as a handle (the worker reads its bytes); bytes move.
  return src.files.flatMap((f) => (f.data instanceof ArrayBuffer ? [f.data] : []))
}

export function startEngineWorker(onFailure: (message: string) => void): EngineConnection {
  const worker = new Worker(new URL('../../workers/engine.worker.ts', import.meta.url), { type: 'module', name: 'tractus-engine' })
  const remote = Comlink.wrap<Required<EngineApi>>(worker)
  worker.addEventListener('error', (ev) => {
    ev.preventDefault()
    onFailure(ev.message)
  })
  const calls: EngineCalls = {
    configure: (options) => remote.configure(options),
    load: (source, onProgress, rule) => remote.load(Comlink.transfer(source, transferList(source)), onProgress ? Comlink.proxy(onProgress) : undefined, rule),
    pictureShown: (likelyCut) => remote.pictureShown(likelyCut),
    inputDigests: () => remote.inputDigests(),
    surfaceArrows: (req) => remote.surfaceArrows(req),
    cut: (plane, arrows, options) => remote.cut(plane, arrows, options),
    probe: (req) => remote.probe(req),
    sweep: (normal, count, from, to, axes, cases) => remote.sweep(normal, count, from, to, axes, cases),
    patches: (rule) => remote.patches(rule),
    components: (axes) => remote.components(axes),
    line: (req) => remote.line(req),
    lineThroughWall: (from, to) => remote.lineThroughWall(from, to),
    // --- load cases ---
    showCase: (name, combinations, rule) => remote.showCase(name, combinations, rule),
    envelope: (plane, request) => remote.envelope(plane, request),
    dispose: () => remote.dispose(),
    // The end-to-end build only; the release build drops it (see workers/engine.worker.ts).
    ...(import.meta.env.MODE === 'e2e' ? { crash: (kind: CrashKind) => remote.crash(kind) } : {}),
  }
  return {
    calls,
    terminate() {
      remote[Comlink.releaseProxy]()
      worker.terminate()
    },
  }
}
