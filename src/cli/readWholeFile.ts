/**
 * A file's bytes in one Buffer, read a stretch at a time. Node's readFileSync refuses files over
 * 2 GiB - 1 (ERR_FS_FILE_TOO_LARGE, measured in Node 20), but one Buffer may hold up to
 * buffer.constants.MAX_LENGTH bytes (4 GiB in Node 20), so a container between the two is read
 * here; beyond that the file is refused with its size and Node's limit.
 */
import { closeSync, fstatSync, openSync, readSync } from 'node:fs'
import { constants } from 'node:buffer'
import { InputError } from '../model/errors.ts'
import { formatBytes } from '../io/sizeGuard.ts'

/** Bytes read by one readSync call: well under the 2 GiB - 1 a single read may take. */
const STRETCH_BYTES = 1 << 30

export function readWholeFile(path: string, name: string = path, stretch = STRETCH_BYTES): Buffer {
  const fd = openSync(path, 'r')
  try {
    const size = fstatSync(fd).size
    if (size > constants.MAX_LENGTH) {
      throw new InputError('too-large', `the file is ${formatBytes(size)}, more than the ${formatBytes(constants.MAX_LENGTH)} one buffer of this Node.js holds`, { file: name })
    }
    const out = Buffer.allocUnsafe(size)
    let at = 0
    while (at < size) {
      const n = readSync(fd, out, at, Math.min(stretch, size - at), at)
      if (n === 0) throw new InputError('missing-file', `the file ended at byte ${at} of its stated ${size}: was it changed while it was read?`, { file: name })
      at += n
    }
    return out
  } finally {
    closeSync(fd)
  }
}
