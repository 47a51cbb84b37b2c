/**
 * Little-endian typed arrays in a byte buffer: a zero-copy view when the platform is
 * little-endian and the data is aligned, else a copy read through DataView (which also swaps
 * bytes on a big-endian platform).
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
  if (allowView && HOST_LITTLE_ENDIAN && at % size === 0) {
    return dtype === 'f64' ? new Float64Array(bytes.buffer, at, length) : new Int32Array(bytes.buffer, at, length)
  }
  const dv = new DataView(bytes.buffer, at, length * size)
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
