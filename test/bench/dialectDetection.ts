/**
 * What the readers spend finding out how a bundle is written: the dialect of every CSV file
 * (separator, decimal mark, preamble, header; src/io/csvTable.ts) and the match of its header to
 * our fields (src/io/columnMap.ts), without reading the rows. Shared by `npm run bench` (the share
 * of the CSV read it costs, target < 10 %) and test/bench/csvDialects.ts. Returns the number of
 * columns matched, so the work cannot be optimised away.
 */
import type { CsvFile } from '../../src/io/readCsvBundle.ts'
import { openTable } from '../../src/io/csvTable.ts'
import { sourceBytes } from '../../src/io/csvBytes.ts'
import { matchColumns } from '../../src/io/columnMap.ts'
import { fieldsOfRole } from '../../src/io/bundleLayout.ts'

export function detectAll(files: readonly CsvFile[]): number {
  let n = 0
  for (const f of files) {
    if (f.name === 'model.json') continue
    const role = f.name.startsWith('elements') ? 'elements' : f.name.includes('stress') ? 'stress' : f.name.includes('nodes') ? 'nodes' : 'displacement'
    const t = openTable(f.name, sourceBytes(f), {}, role === 'elements' ? 'elements' : 'numeric', role)
    if (role !== 'elements' && t.header.present) n += matchColumns(f.name, t.header, fieldsOfRole(role), undefined, role).length
  }
  return n
}
