/**
 * Little-endian typed arrays in a byte buffer: on a little-endian platform a zero-copy view when
 * the data is aligned, else one bulk copy of its bytes (ArrayBuffer.slice); on a big-endian
 * platform a copy read value by value through DataView, which swaps the bytes.
 */
export type Dtype = 'f64' | 'i32'

export const DTYPE_SIZE: Readonly<Record<Dtype, number>> = { f64: 8, i32: 4 }

export function isDtype(s: unknown): s is Dtype {
  return s === 'f64' || s === 'i32'
}

export const HOST_LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1

/**
 * Array of `length` elements of `dtype` starting at byte `offset` of `bytes` (range already
 * checked by the caller). `allowView` false forces the copying path.
 */
export function readLittleEndian(bytes: Uint8Array, offset: number, length: number, dtype: Dtype, allowView = true): Float64Array | Int32Array {
  const size = DTYPE_SIZE[dtype]
  const at = bytes.byteOffset + offset
  if (HOST_LITTLE_ENDIAN) {
    // A view where allowed and aligned, else one bulk copy of the bytes (aligned by construction).
    const buffer = allowView && at % size === 0 ? bytes.buffer : bytes.buffer.slice(at, at + length * size)
    const start = buffer === bytes.buffer ? at : 0
    return dtype === 'f64' ? new Float64Array(buffer, start, length) : new Int32Array(buffer, start, length)
  }
  return readLittleEndianByValue(bytes, offset, length, dtype)
}

/** The big-endian platform's path of readLittleEndian: a copy read value by value through DataView. */
export function readLittleEndianByValue(bytes: Uint8Array, offset: number, length: number, dtype: Dtype): Float64Array | Int32Array {
  const dv = new DataView(bytes.buffer, bytes.byteOffset + offset, length * DTYPE_SIZE[dtype])
  if (dtype === 'f64') {
    const out = new Float64Array(length)
    for (let i = 0; i < length; i++) out[i] = dv.getFloat64(8 * i, true)
    return out
  }
  const out = new Int32Array(length)
  for (let i = 0; i < length; i++) out[i] = dv.getInt32(4 * i, true)
  return out
}

/** Writes `a` little-endian at byte `offset` of `out`. */
export function writeLittleEndian(out: Uint8Array, offset: number, a: Float64Array | Int32Array, allowCopy = true): void {
  if (allowCopy && HOST_LITTLE_ENDIAN) {
    out.set(new Uint8Array(a.buffer, a.byteOffset, a.byteLength), offset)
    return
  }
  const dv = new DataView(out.buffer, out.byteOffset + offset, a.byteLength)
  if (a instanceof Float64Array) for (let i = 0; i < a.length; i++) dv.setFloat64(8 * i, a[i], true)
  else for (let i = 0; i < a.length; i++) dv.setInt32(4 * i, a[i], true)
}
