/** The digest worker: SHA-256 of one Blob at a time (workers/blobDigest.ts), nothing kept between calls. */
import * as Comlink from 'comlink'
import { DIGEST_SLICE_BYTES, digestBlob } from './blobDigest.ts'
import type { DigestHold } from './blobDigest.ts'

const api = {
  digest: (blob: Blob, share = 1, hold: DigestHold | null = null): Promise<string> => digestBlob(blob, DIGEST_SLICE_BYTES, share, hold),
}

export type DigestWorkerApi = typeof api

Comlink.expose(api)
