// Makes sure a Chromium for the browser tests is present before they run. Playwright's own
// browser download cannot be used here, so the tests drive Debian's chromium package. When it
// is missing and we run as root on Debian (CI, a fresh container), install it; otherwise say
// exactly what to run.
import { existsSync } from 'node:fs'
import { execFileSync } from 'node:child_process'

const path = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium'
if (existsSync(path)) process.exit(0)

const isRoot = typeof process.getuid === 'function' && process.getuid() === 0
if (isRoot && existsSync('/usr/bin/apt-get')) {
  console.log(`Chromium not found at ${path}; installing Debian's chromium package (about 30 s)...`)
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' }
  execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env })
  execFileSync('apt-get', ['install', '-y', '-qq', 'chromium'], { stdio: 'inherit', env })
  if (existsSync(path)) process.exit(0)
}
console.error(`The browser tests need Chromium at ${path}.\n` +
  `Install it with:  sudo apt-get install -y chromium\n` +
  `or point CHROMIUM_PATH at another Chromium or Chrome binary.`)
process.exit(1)
