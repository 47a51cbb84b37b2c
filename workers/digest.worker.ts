/** The digest worker: SHA-256 of one Blob at a time (workers/blobDigest.ts), nothing kept between calls. */
import * as Comlink from 'comlink'
import { DIGEST_SLICE_BYTES, digestBlob } from './blobDigest.ts'

const api = {
  digest: (blob: Blob, share = 1): Promise<string> => digestBlob(blob, DIGEST_SLICE_BYTES, share),
}

export type DigestWorkerApi = typeof api

Comlink.expose(api)
