#!/usr/bin/env node
// Launcher for the `tractus` command line: runs src/cli/main.ts through tsx in a child Node
// process. Paths are resolved from this file, not from the working directory, so the command
// works from any folder and through `npx tractus`.
import { spawn } from 'node:child_process'
import { fileURLToPath } from 'node:url'

const main = fileURLToPath(new URL('./main.ts', import.meta.url))
// tsx is resolved from this package, so the loader is found whatever the working directory.
const tsx = import.meta.resolve('tsx')

const child = spawn(process.execPath, ['--import', tsx, main, ...process.argv.slice(2)], { stdio: 'inherit' })

// Forward interrupts so Ctrl-C stops the child cleanly.
for (const sig of ['SIGINT', 'SIGTERM']) process.on(sig, () => child.kill(sig))

child.on('error', (err) => {
  process.stderr.write(`tractus: could not start Node: ${err.message}\n`)
  process.exit(3)
})
child.on('exit', (code, signal) => {
  if (signal) process.kill(process.pid, signal)
  else process.exit(code ?? 1)
})
