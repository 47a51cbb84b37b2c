/**
 * The engine worker's intake of the user's files (workers/inputFiles.ts): files handed over as
 * Blobs and read in slices give the same model, bit for bit, as the same files read whole; each
 * file's digest is its SHA-256 (checked against Node's own, FIPS 180-4); a file over its limit is
 * refused before a byte is read, naming the file, its size and the limit. Both ways of reading a
 * Blob (its byte stream into the caller's buffer, or slices) and the incremental digest give the
 * same bytes and Node's SHA-256.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { createHash } from 'node:crypto'
import { readInputFiles, readInSlices } from '../../../workers/inputFiles.ts'
import { createDigestHold, digestBlob, HOLD_MIN_SLICES, holdDigests } from '../../../workers/blobDigest.ts'
import { digestsOf } from '../../../workers/inputDigest.ts'
import { readStall } from '../../../workers/blobBytes.ts'
import { readModelFiles, writeCsvBundle, writeNative } from '../../../src/io/index.ts'
import { MAX_CONTAINER_BYTES, MAX_CSV_BYTES, MAX_TEXT_BYTES } from '../../../src/io/sizeGuard.ts'
import { InputError } from '../../../src/model/errors.ts'
import { boxModel } from '../../io/testModels.ts'
import { expectSameModel } from '../../io/sameModel.ts'

const sha256 = (b: Uint8Array | string): string => createHash('sha256').update(b).digest('hex')

/** A Blob that says it is `size` bytes long and fails if anything reads it. */
class HugeBlob extends Blob {
  constructor(private readonly claimed: number) { super(['x']) }
  override get size(): number { return this.claimed }
  override slice(): Blob { throw new Error('read although over the limit') }
}

describe('reading the user\'s files in slices', () => {
  const model = boxModel('tet4', { nx: 4, ny: 3, nz: 2, lx: 2, ly: 1, lz: 0.5, y0: -0.5 }, true)

  it('a CSV bundle read in slices (some splitting lines and numbers) is the model read whole', async () => {
    const csv = writeCsvBundle(model)
    const whole = readModelFiles(csv.map((f) => ({ name: f.name, data: f.text })))
    for (const slice of [7, 1000, 1 << 20]) {
      const fractions: number[] = []
      const read = await readInputFiles(csv.map((f) => ({ name: f.name, data: new Blob([f.text]) })), (x) => fractions.push(x), slice)
      expectSameModel(whole, readModelFiles(read.files))
      // the readers parse the bytes as read (src/io/csvBytes.ts): no text of the file is made
      expect(read.files.every((f, k) => f.data instanceof Uint8Array && Buffer.from(f.data).toString('utf8') === csv[k].text), 'text files arrive as their bytes').toBe(true)
      expect((await read.inputs).map((i) => [i.name, i.bytes, i.sha256])).toEqual(csv.map((f) => [f.name, Buffer.byteLength(f.text), sha256(f.text)]))
      expect(fractions.at(-1)).toBe(1)
      for (let i = 1; i < fractions.length; i++) expect(fractions[i]).toBeGreaterThanOrEqual(fractions[i - 1])
    }
  })

  it('the digests wait for the gate they are given: names and sizes at once, SHA-256 (FIPS 180-4, Node\'s) once it opens', async () => {
    const bytes = writeNative(model)
    let open = (): void => {}
    const gate = new Promise<void>((r) => { open = r })
    const read = await readInputFiles([{ name: 'm.tractus', data: new Blob([bytes as Uint8Array<ArrayBuffer>]) }], undefined, 4096, false, gate)
    expect(read.records).toEqual([{ name: 'm.tractus', bytes: bytes.byteLength }])
    let settled = false
    void read.inputs.then(() => { settled = true })
    await new Promise((r) => setTimeout(r, 50))
    expect(settled, 'no digest before the gate opens').toBe(false)
    open()
    expect(await read.inputs).toEqual([{ name: 'm.tractus', bytes: bytes.byteLength, sha256: sha256(bytes) }])
  })

  it('a container read in slices is the model read whole, its arrays views into the one buffer read', async () => {
    const bytes = writeNative(model)
    const whole = readModelFiles([{ name: 'm.tractus', data: bytes }])
    const read = await readInputFiles([{ name: 'm.tractus', data: new Blob([bytes as Uint8Array<ArrayBuffer>]) }], undefined, 4096 + 3)
    const got = readModelFiles(read.files)
    expectSameModel(whole, got)
    expect(await read.inputs).toEqual([{ name: 'm.tractus', bytes: bytes.byteLength, sha256: sha256(bytes) }])
    // Held once: the model's coordinates live in the buffer the slices were read into.
    expect(got.mesh.coords.buffer).toBe((read.files[0].data as Uint8Array).buffer)
  })

  it('readInSlices puts every slice at its place, the last one short', async () => {
    const data = Uint8Array.from({ length: 1000 }, (_, i) => (i * 37) % 251)
    const seen: number[] = []
    const got = await readInSlices(new Blob([data]), (n) => seen.push(n), 300)
    expect(Array.from(got)).toEqual(Array.from(data))
    expect(seen).toEqual([300, 300, 300, 100])
  })

  it('bytes and text given already pass through unread and undigested (a demo the client fetched)', async () => {
    const read = await readInputFiles([{ name: 'a.json', data: '{}' }])
    expect(read.files).toEqual([{ name: 'a.json', data: '{}' }])
    expect(await read.inputs).toEqual([])
  })

  it('a file over its limit is refused before any is read: the file, its size and the limit', async () => {
    const refusal = async (name: string, size: number): Promise<InputError> => {
      try { await readInputFiles([{ name: 'nodes.csv', data: new Blob(['id,x,y,z\n']) }, { name, data: new HugeBlob(size) }]) } catch (e) { return e as InputError }
      throw new Error('not refused')
    }
    const csv = await refusal('elements.csv', MAX_CSV_BYTES + 1)
    expect(csv.kind).toBe('too-large')
    expect(csv.message).toBe(`elements.csv: the file is 2.00 GiB (${MAX_CSV_BYTES + 1} bytes), more than the limit of 2.00 GiB (${MAX_CSV_BYTES} bytes)`)
    const json = await refusal('model.json', MAX_TEXT_BYTES + 1)
    expect(json.message).toBe(`model.json: the file is 512.0 MiB (${MAX_TEXT_BYTES + 1} bytes), more than the limit of 512.0 MiB (${MAX_TEXT_BYTES} bytes)`)
    const big = await refusal('big.tractus', 3 * 1024 ** 3)
    expect(big.message).toBe(`big.tractus: the file is 3.00 GiB (${3 * 1024 ** 3} bytes), more than the limit of 2.00 GiB (${MAX_CONTAINER_BYTES} bytes)`)
  })
})

/** The same bytes with no byte stream: the readers fall back to Blob.slice(). */
class SliceOnlyBlob extends Blob {
  override stream(): ReadableStream<Uint8Array<ArrayBuffer>> { return new ReadableStream() }
}

/** A Blob that says it is longer than it is (a file cut short while it was read). */
class ShortBlob extends Blob {
  override get size(): number { return super.size + 10 }
}

describe('reading a Blob by its byte stream or by slices, and its digest', () => {
  const data = Uint8Array.from({ length: 10_007 }, (_, i) => (i * 131) % 253)

  it('both ways give the bytes in place and the SHA-256 of Node\'s crypto (FIPS 180-4), at any slice size', async () => {
    for (const make of [(d: Uint8Array<ArrayBuffer>) => new Blob([d]), (d: Uint8Array<ArrayBuffer>) => new SliceOnlyBlob([d])]) {
      for (const slice of [1, 64, 1000, 1 << 20]) {
        expect(Array.from(await readInSlices(make(data), () => undefined, slice))).toEqual(Array.from(data))
        expect(await digestBlob(make(data), slice)).toBe(sha256(data))
      }
    }
  })

  it('the digest of an empty file is the empty message\'s (FIPS 180-4 example: e3b0c442…b855)', async () => {
    expect(await digestBlob(new Blob([]))).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855')
    expect(await digestsOf([])).toEqual([])
  })

  it('a held digest of a file of many slices takes no slice until the hold ends, then gives the same SHA-256; a file of a few slices is not held', async () => {
    const hold = createDigestHold()!
    expect(hold).not.toBeNull()
    holdDigests(hold, 200)
    const t0 = performance.now()
    let done = -1
    const digest = digestBlob(new Blob([data]), 1000, 1, hold).then((h) => { done = performance.now() - t0; return h })
    // a shorter hold set meanwhile does not cut the longer one short
    holdDigests(hold, 10)
    expect(await digest).toBe(sha256(data))
    expect(done).toBeGreaterThanOrEqual(150)
    // a file of HOLD_MIN_SLICES slices or fewer is hashed at once, hold or not
    holdDigests(hold, 60_000)
    expect(await digestBlob(new Blob([data]), Math.ceil(data.length / HOLD_MIN_SLICES), 1, hold)).toBe(sha256(data))
    Atomics.store(hold.until, 0, 0)
    // the hold has run out: the next digest starts at once
    expect(Atomics.load(hold.until, 0)).toBeLessThanOrEqual(Date.now() - hold.t0)
    expect(await digestBlob(new Blob([data]), 1000, 1, hold)).toBe(sha256(data))
  })

  it('a file shorter than its stated size is a clear error naming it, not a model of zeros', async () => {
    const err = await readInputFiles([{ name: 'cut.tractus', data: new ShortBlob([data]) }]).then(() => null, (e: unknown) => e as InputError)
    expect(err?.message).toMatch(/^cut\.tractus: the file could not be read whole \(the file ended before its stated size/)
  })
})

/**
 * A Blob whose byte stream gives its first `before` bytes and then nothing, ever (as headless
 * Chromium's stream of a file once did), or with no stream (`slices`) whose first slice never
 * comes. `always`: every fresh start stalls too (a drive gone away).
 */
class StallingBlob extends Blob {
  private slicedOnce = false
  constructor(parts: BlobPart[], private readonly before: number, private readonly always = false, private readonly way: 'stream' | 'slices' = 'stream') { super(parts) }
  override stream(): ReadableStream<Uint8Array<ArrayBuffer>> {
    if (this.way === 'slices') return new ReadableStream()
    let sent = false
    const head = this.before > 0 ? Blob.prototype.slice.call(this, 0, this.before) : null
    return new ReadableStream({
      type: 'bytes',
      async pull(c) {
        if (sent || !head) return new Promise<void>(() => undefined)
        sent = true
        c.enqueue(new Uint8Array(await head.arrayBuffer()))
      },
    }) as ReadableStream<Uint8Array<ArrayBuffer>>
  }
  override slice(start?: number, end?: number): Blob {
    const part = super.slice(start, end)
    if (this.way === 'stream') return this.always ? new StallingBlob([part], 0, true) : part
    if (this.always || !this.slicedOnce) { this.slicedOnce = true; return new NeverBlob([part]) }
    return part
  }
}

/** A Blob whose bytes never come by arrayBuffer(). */
class NeverBlob extends Blob {
  override arrayBuffer(): Promise<ArrayBuffer> { return new Promise(() => undefined) }
}

describe('a read that stalls', () => {
  const data = Uint8Array.from({ length: 10_007 }, (_, i) => (i * 131) % 253)
  const saved = { ...readStall }
  beforeEach(() => { readStall.ms = 30; readStall.restarts = 3 })
  afterEach(() => { Object.assign(readStall, saved) })

  it('is read again from its slice\'s first byte: the same bytes and SHA-256 (Node\'s crypto, FIPS 180-4), by stream or by slices', async () => {
    for (const before of [0, 3000]) {
      for (const slice of [1000, 1 << 20]) {
        expect(Array.from(await readInSlices(new StallingBlob([data], before), () => undefined, slice)), `stream, stall after ${before} bytes`).toEqual(Array.from(data))
        expect(await digestBlob(new StallingBlob([data], before), slice)).toBe(sha256(data))
      }
    }
    expect(Array.from(await readInSlices(new StallingBlob([data], 0, false, 'slices'), () => undefined, 1000)), 'by slices').toEqual(Array.from(data))
  })

  it('again and again fails after readStall.restarts fresh starts, naming the file and the byte, and saying what to do', async () => {
    for (const way of ['stream', 'slices'] as const) {
      const err = await readInputFiles([{ name: 'nodes.csv', data: new StallingBlob([data], 3000, true, way) }], undefined, 1000).then(() => null, (e: unknown) => e as InputError)
      expect(err).toBeInstanceOf(InputError)
      expect(err!.message).toMatch(/^nodes\.csv: the file could not be read whole \(no bytes came for 0\.03 s, 4 times, at byte \d+ of 10007: is the file on a drive that went away\?\); choose it again$/)
    }
  })
})

describe('a container read into shared memory (for the pool)', () => {
  const model = boxModel('hex8', { nx: 3, ny: 2, nz: 2, lx: 1, ly: 1, lz: 1 }, true)

  it('is the model read whole, its arrays views into one SharedArrayBuffer; a text file stays in ordinary memory', async () => {
    const bytes = writeNative(model)
    const whole = readModelFiles([{ name: 'm.tractus', data: bytes }])
    for (const slice of [5, 4096 + 3, 1 << 20]) {
      const read = await readInputFiles([{ name: 'M.TRACTUS', data: new Blob([bytes as Uint8Array<ArrayBuffer>]) }], undefined, slice, true)
      const got = readModelFiles(read.files)
      expectSameModel(whole, got)
      expect(got.mesh.coords.buffer).toBeInstanceOf(SharedArrayBuffer)
      expect(got.mesh.coords.buffer).toBe((read.files[0].data as Uint8Array).buffer)
      expect(await read.inputs).toEqual([{ name: 'M.TRACTUS', bytes: bytes.byteLength, sha256: sha256(bytes) }])
    }
    const csv = writeCsvBundle(model)
    const read = await readInputFiles(csv.map((f) => ({ name: f.name, data: new Blob([f.text]) })), undefined, 1000, true)
    expectSameModel(readModelFiles(csv.map((f) => ({ name: f.name, data: f.text }))), readModelFiles(read.files))
  })

  it('a file named as a container that is not one comes back in ordinary memory, so its error is the usual one', async () => {
    const read = await readInputFiles([{ name: 'x.tractus', data: new Blob(['id,x,y,z\n']) }], undefined, 4, true)
    expect((read.files[0].data as Uint8Array).buffer).toBeInstanceOf(ArrayBuffer)
  })
})
