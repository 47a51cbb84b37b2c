/**
 * Test helper: rewrites the JSON header of a native container while keeping its arrays. The new
 * header gets room to grow (padded with spaces, which JSON allows), the data moves behind it and
 * every array offset (and field-table offset) is shifted before `mutate` sees the header, so a mutation can break exactly
 * one thing.
 */
import { NATIVE_PREAMBLE_BYTES } from '../../src/io/nativeContainer.ts'

export type Header = Record<string, unknown> & { arrays: { name: string; dtype: string; offset: number; length: number }[] }

export function readHeader(bytes: Uint8Array): Header {
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength)
  const len = dv.getUint32(12, true)
  return JSON.parse(new TextDecoder().decode(bytes.subarray(NATIVE_PREAMBLE_BYTES, NATIVE_PREAMBLE_BYTES + len))) as Header
}

export function patchNative(bytes: Uint8Array, mutate: (h: Header) => void, room = 512): Uint8Array {
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength)
  const len = dv.getUint32(12, true)
  const oldStart = Math.ceil((NATIVE_PREAMBLE_BYTES + len) / 8) * 8
  const h = readHeader(bytes)
  const reserved = len + room
  const newStart = Math.ceil((NATIVE_PREAMBLE_BYTES + reserved) / 8) * 8
  const delta = newStart - oldStart
  for (const a of h.arrays) a.offset += delta
  // Version 2: the field table points at arrays by offset.
  for (const f of (h.fields as { offset: number }[] | undefined) ?? []) f.offset += delta
  mutate(h)
  const text = JSON.stringify(h)
  if (text.length > reserved) throw new Error('patchNative: header grew past the reserved room')
  const head = new TextEncoder().encode(text.padEnd(reserved, ' '))
  const out = new Uint8Array(newStart + (bytes.length - oldStart))
  out.set(bytes.subarray(0, 12), 0)
  new DataView(out.buffer).setUint32(12, reserved, true)
  out.set(head, NATIVE_PREAMBLE_BYTES)
  out.set(bytes.subarray(oldStart), newStart)
  return out
}

/** Overwrites one element of a named array (little-endian) in a copy of the container. */
export function patchArrayValue(bytes: Uint8Array, name: string, index: number, value: number): Uint8Array {
  const out = bytes.slice()
  const e = readHeader(out).arrays.find((a) => a.name === name)
  if (!e) throw new Error(`no array ${name}`)
  const dv = new DataView(out.buffer)
  if (e.dtype === 'f64') dv.setFloat64(e.offset + 8 * index, value, true)
  else dv.setInt32(e.offset + 4 * index, value, true)
  return out
}
