/**
 * Starts `vite preview` of the built app on 127.0.0.1:4173 for the end-to-end tests and stops it
 * afterwards. `npm run e2e` builds first, as the end-to-end build (`vite build --mode e2e`, the
 * release build plus the hooks of src/app/testHooks.ts); a missing dist/ is an error that says so.
 */
import { spawn } from 'node:child_process'
import type { ChildProcess } from 'node:child_process'
import { existsSync } from 'node:fs'
import { resolve } from 'node:path'

const PORT = Number(process.env.E2E_PORT ?? 4173)
export const ORIGIN = `http://127.0.0.1:${PORT}`

let server: ChildProcess | null = null

async function waitForServer(timeoutMs: number): Promise<void> {
  const until = Date.now() + timeoutMs
  let last: unknown = null
  while (Date.now() < until) {
    try {
      const r = await fetch(ORIGIN + '/')
      if (r.ok) return
    } catch (e) { last = e }
    await new Promise((r) => setTimeout(r, 200))
  }
  throw new Error(`vite preview did not answer on ${ORIGIN} within ${timeoutMs} ms (${String(last)})`)
}

export async function setup(): Promise<void> {
  const root = resolve(import.meta.dirname, '../..')
  if (!existsSync(resolve(root, 'dist/index.html'))) throw new Error('dist/ is missing: run `vite build --mode e2e` first (npm run e2e does).')
  const vite = resolve(root, 'node_modules/vite/bin/vite.js')
  server = spawn(process.execPath, [vite, 'preview', '--host', '127.0.0.1', '--port', String(PORT), '--strictPort'], {
    cwd: root, stdio: ['ignore', 'pipe', 'pipe'],
  })
  let output = ''
  server.stdout?.on('data', (d) => { output += String(d) })
  server.stderr?.on('data', (d) => { output += String(d) })
  const exited = new Promise<never>((_, reject) => server!.once('exit', (code) => reject(new Error(`vite preview exited (${code}): ${output}`))))
  // Generous: on a loaded two-core machine the preview server can take tens of seconds to start.
  await Promise.race([waitForServer(90_000), exited])
}

export async function teardown(): Promise<void> {
  if (server && server.exitCode === null) {
    server.kill('SIGTERM')
    await new Promise((r) => setTimeout(r, 200))
  }
  server = null
}
