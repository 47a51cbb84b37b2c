/**
 * Process entry of the `tractus` command line (src/cli/tractus.mjs starts it through tsx).
 */
import { run } from './run.ts'

const code = await run(process.argv.slice(2), {
  stdout: (text) => { process.stdout.write(text) },
  stderr: (text) => { process.stderr.write(text) },
})
// exitCode rather than exit(): lets piped stdout drain completely.
process.exitCode = code
