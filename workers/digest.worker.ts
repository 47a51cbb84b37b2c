/** The digest worker: SHA-256 of one Blob at a time (workers/blobDigest.ts), nothing kept between calls. */
import * as Comlink from 'comlink'
import { digestBlob } from './blobDigest.ts'

const api = {
  digest: (blob: Blob): Promise<string> => digestBlob(blob),
}

export type DigestWorkerApi = typeof api

Comlink.expose(api)
