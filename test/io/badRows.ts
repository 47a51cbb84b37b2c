/**
 * Bad rows for the tests of the read in pieces (csvPieces.test.ts, csvPieceStream.test.ts): a
 * row of a bundle file changed so that the read refuses it, and the refusal caught, to compare a
 * read in pieces with the one-thread read message for message.
 */
import type { CsvFile, WrittenCsvFile } from '../../src/io/index.ts'
import { InputError } from '../../src/model/errors.ts'

/** File, what is wrong, and the change to one of its rows. */
export const BAD_ROWS: readonly [string, string, (line: string) => string][] = [
  ['stress.csv', 'a number that is not one', (l) => l.replace(/,([^,]*)$/, ',1.2.3')],
  ['nodes.csv', 'a missing field', (l) => l.replace(/,[^,]*$/, '')],
  ['elements.csv', 'an unknown element type', (l) => l.replace(/^(\d+),\w+/, '$1,brick27')],
  ['elements.csv', 'a node that is not in nodes.csv (found after the pieces are joined)', (l) => l.replace(/,\d+$/, ',999999')],
]

/** The files with line n (1-based) of file `name` replaced by `f(line)`. */
export function editLine(files: readonly WrittenCsvFile[], name: string, n: number, f: (line: string) => string): WrittenCsvFile[] {
  return files.map((file) => {
    if (file.name !== name) return file
    const lines = file.text.split('\n')
    lines[n - 1] = f(lines[n - 1])
    return { name: file.name, text: lines.join('\n') }
  })
}

/**
 * The files with a comment line saved in Latin-1 (the byte E9 for é, not UTF-8) put before line
 * n of file `name`, which is handed over as bytes: the read must refuse it with its line and the
 * offset of the bad byte in the file, whichever piece meets it.
 */
export function latin1Comment(files: readonly WrittenCsvFile[], name: string, n: number): CsvFile[] {
  return files.map((file) => {
    if (file.name !== name) return file
    const lines = file.text.split('\n')
    lines.splice(n - 1, 0, '# caf\u00e9')
    const utf8 = new TextEncoder().encode(lines.join('\n'))
    const at = utf8.indexOf(0xc3)
    const bytes = new Uint8Array(utf8.length - 1)
    bytes.set(utf8.subarray(0, at))
    bytes[at] = 0xe9
    bytes.set(utf8.subarray(at + 2), at + 1)
    return { name: file.name, bytes }
  })
}

/** The input error of a read that must refuse, or fails. */
export async function refusal(read: () => Promise<unknown> | unknown): Promise<InputError> {
  try { await read() } catch (e) { if (e instanceof InputError) return e; throw e }
  throw new Error('expected a refusal')
}
