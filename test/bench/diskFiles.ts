/**
 * A written bundle as the readers get files from the disk or a Blob: each file's UTF-8 bytes
 * (src/io/csvBytes.ts), so the benchmarks time the read the command line and the browser make.
 */
import type { CsvFile, WrittenCsvFile } from '../../src/io/index.ts'

export function asDiskFiles(files: readonly WrittenCsvFile[]): CsvFile[] {
  const encoder = new TextEncoder()
  return files.map((f) => ({ name: f.name, bytes: encoder.encode(f.text) }))
}

/** The bytes of the files. */
export function bytesOfFiles(files: readonly CsvFile[]): number {
  return files.reduce((s, f) => s + (f.bytes?.length ?? 0), 0)
}
