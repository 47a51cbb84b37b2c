/**
 * Reading a Blob's bytes in order, a slice at a time, into buffers the caller chooses: by the
 * Blob's byte stream with a "bring your own buffer" reader where the platform has one (the bytes
 * go straight into the caller's buffer: no temporary per slice, whose fresh pages cost about as
 * much as the copy on the machines measured here), else by Blob.slice().arrayBuffer() and a copy.
 * Measured in headless Chromium on a 334 MB file (load average 6–7): 1.6–2.1 s by the stream,
 * 4.1–5.5 s by 16 MiB slices.
 */

/**
 * Fills `into` (length n, n ≤ what is left of the Blob from `reader`'s position) and returns the
 * buffer that now holds it: a stream reader moves the buffer it is given, so `into` is detached
 * and its bytes live in the returned view.
 */
export type SliceReader = (into: Uint8Array<ArrayBuffer>) => Promise<Uint8Array<ArrayBuffer>>

/** A reader of `blob` from its start, one slice after another in order. */
export function sliceReader(blob: Blob): SliceReader {
  const byob = byobReader(blob)
  if (byob) {
    return async (into) => {
      // the sizes now: `into` is detached by the first read
      const n = into.byteLength, start = into.byteOffset
      let buffer = into.buffer, at = 0
      while (at < n) {
        const { done, value } = await byob.read(new Uint8Array(buffer, start + at, n - at))
        if (done || !value) throw new Error('the file ended before its stated size: was it changed while it was read?')
        buffer = value.buffer
        at += value.byteLength
      }
      return new Uint8Array(buffer, start, n)
    }
  }
  let pos = 0
  return async (into) => {
    into.set(new Uint8Array(await blob.slice(pos, pos + into.byteLength).arrayBuffer()))
    pos += into.byteLength
    return into
  }
}

function byobReader(blob: Blob): ReadableStreamBYOBReader | null {
  if (typeof blob.stream !== 'function') return null
  try {
    return blob.stream().getReader({ mode: 'byob' })
  } catch {
    // not a byte stream on this platform
    return null
  }
}
