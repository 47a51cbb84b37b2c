/**
 * How the engine may use the machine, read from the page address (a diagnostic setting, not part
 * of the view link): `threads=<1..16>` caps the worker pool (1 = everything on the engine worker
 * alone), `sharing=copy` hands the model to the pool by copies even where shared memory is
 * available. Anything else is ignored.
 */
import type { ComputeOptions } from '../../workers/protocol.ts'

export function computeOptionsFromHash(hash: string): ComputeOptions {
  let params: URLSearchParams
  try { params = new URLSearchParams(hash.replace(/^#/, '').slice(0, 4000)) } catch { return {} }
  const t = Number(params.get('threads'))
  return {
    ...(Number.isInteger(t) && t >= 1 && t <= 16 ? { threads: t } : {}),
    ...(params.get('sharing') === 'copy' ? { sharing: 'copy' as const } : {}),
  }
}
