/** The CSV bundle: reader and writer (see docs/FORMATS.md). */
export { readCsvBundle } from './readCsvBundle.ts'
export type { CsvFile, CsvBundleOptions } from './readCsvBundle.ts'
export { writeCsvBundle } from './writeCsvBundle.ts'
