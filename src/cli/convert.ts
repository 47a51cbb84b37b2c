/**
 * `tractus convert <model> --out <file>`: a CSV bundle to the native container (the usual way),
 * or a native file back to a CSV bundle when --out names a folder.
 */
import { mkdirSync, writeFileSync } from 'node:fs'
import { extname, join } from 'node:path'
import type { Command } from './command.ts'
import { HELP_OPTION, JSON_OPTION, printJson } from './command.ts'
import { CASE_OPTION, caseModel } from './caseOption.ts'
import { loadModelAsync, NATIVE_EXTENSION } from './loadModel.ts'
import { InputError } from '../model/errors.ts'
import { writeCsvBundle, writeNative } from '../io/index.ts'

export const convertCommand: Command = {
  name: 'convert',
  summary: `CSV bundle to the native ${NATIVE_EXTENSION} container (or back, when --out is a folder)`,
  usage: `tractus convert <model> --out <file${NATIVE_EXTENSION}|folder> [--case NAME] [--json]`,
  positionals: ['<model>'],
  options: [
    { name: 'out', kind: 'string', value: `file${NATIVE_EXTENSION}|folder`, required: true, help: `where to write: a ${NATIVE_EXTENSION} file, or a folder for a CSV bundle` },
    CASE_OPTION, JSON_OPTION, HELP_OPTION,
  ],
  details: `The model is read and checked completely before anything is written. Every load case and combination is written (container: one field per case; bundle: stress.NAME.csv and model.json "cases"); --case NAME writes that case or combination alone. An existing output file is replaced. --json prints {"file", "format", "bytes", "nodes", "elements"} of what was written.`,
  async run(args, io) {
    const out = args.options.out as string
    const loaded = await loadModelAsync(args.positionals[0])
    const picked = caseModel(loaded.model, args, 'convert').model
    // --case writes that case (or combination) alone, as a model of one field; without it every case goes
    const { cases: _c, combinations: _k, ...single } = picked
    const model = args.options.case === undefined ? picked : single
    let bytes = 0
    let format: 'native' | 'bundle'
    try {
      if (extname(out).toLowerCase() === NATIVE_EXTENSION) {
        const data = writeNative(model)
        writeFileSync(out, data)
        bytes = data.byteLength
        format = 'native'
      } else {
        mkdirSync(out, { recursive: true })
        for (const f of writeCsvBundle(model)) {
          writeFileSync(join(out, f.name), f.text)
          bytes += Buffer.byteLength(f.text)
        }
        format = 'bundle'
      }
    } catch (e) {
      const code = (e as { code?: string }).code
      if (code) throw new InputError('bad-argument', `could not write: ${(e as Error).message}`, { file: out })
      throw e
    }
    if (args.options.json) {
      printJson(io, { file: out, format, bytes, nodes: model.mesh.nodeCount, elements: model.mesh.elementCount })
    } else {
      io.stdout(`wrote ${out} (${format === 'native' ? `native ${NATIVE_EXTENSION} container` : 'CSV bundle'}, ${bytes} bytes, ${model.mesh.nodeCount} nodes, ${model.mesh.elementCount} elements)\n`)
    }
    for (const w of model.warnings) io.stderr(`warning: ${w}\n`)
    return 0
  },
}
