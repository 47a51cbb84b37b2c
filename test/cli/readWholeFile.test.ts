/**
 * src/cli/readWholeFile.ts: a file's bytes in one Buffer, read a stretch at a time, past the
 * 2 GiB - 1 that Node's readFileSync refuses (ERR_FS_FILE_TOO_LARGE, Node 20).
 */
import { closeSync, ftruncateSync, openSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { readWholeFile } from '../../src/cli/readWholeFile.ts'
import { tempDir } from './cliHarness.ts'

const root = tempDir()
afterAll(() => { rmSync(root, { recursive: true, force: true }) })

describe('reading a whole file', () => {
  it('gives the bytes readFileSync gives, in stretches of any size', () => {
    const path = join(root, 'a.bin')
    const data = Uint8Array.from({ length: 100_003 }, (_, i) => (i * 7919) % 251)
    writeFileSync(path, data)
    for (const stretch of [1, 4096, 99_999, 1 << 30]) expect(readWholeFile(path, 'a.bin', stretch).equals(readFileSync(path))).toBe(true)
    writeFileSync(path, new Uint8Array(0))
    expect(readWholeFile(path).byteLength).toBe(0)
  })

  it('reads a file over 2 GiB, which readFileSync refuses', { timeout: 120_000 }, () => {
    const path = join(root, 'sparse.bin')
    const size = 2 ** 31 + 4096
    const fd = openSync(path, 'w')
    ftruncateSync(fd, size - 1)
    closeSync(fd)
    writeFileSync(path, new Uint8Array([42]), { flag: 'a' })
    expect(() => readFileSync(path)).toThrow(/greater than 2 GiB/)
    const b = readWholeFile(path)
    expect(b.byteLength).toBe(size)
    expect(b[size - 1]).toBe(42)
    expect(b[2 ** 31]).toBe(0)
  })
})
