/**
 * Long fuzz run of the readers (npm run fuzz): 100 000 mutated inputs by default, in seeded
 * batches. Prints the count of each error kind, the inputs that loaded, every crash (anything but
 * an InputError, or a loaded model that fails validateModel) and the slowest case.
 * Options: --cases N, --seed S, --verbose (print the first messages of each kind).
 * Exit code 1 when a case crashed.
 */
import fc from 'fast-check'
import { InputError } from '../../src/model/errors.ts'
import { readModelFiles } from '../../src/io/detect.ts'
import { validateModel } from '../../src/io/validateModel.ts'
import { applyCase, describeCase, fuzzCase } from './mutations.ts'
import type { FuzzCase } from './mutations.ts'

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(name)
  return i >= 0 ? Number(process.argv[i + 1]) : fallback
}
const total = arg('--cases', 100000)
const seed = arg('--seed', Date.now() % 1000000)
const verbose = process.argv.includes('--verbose')
console.log(`fuzz: ${total} cases, seed ${seed} (replay with --seed ${seed})`)

const kinds = new Map<string, number>()
const examples = new Map<string, string[]>()
const crashes: { c: FuzzCase; error: string }[] = []
let loaded = 0
let slowest = { ms: 0, c: null as FuzzCase | null }
const batch = 1000
const t0 = performance.now()
for (let done = 0; done < total; done += batch) {
  const cases = fc.sample(fuzzCase, { seed: seed + done, numRuns: Math.min(batch, total - done) })
  for (const c of cases) {
    const files = applyCase(c)
    const t = performance.now()
    try {
      const m = readModelFiles(files)
      try {
        validateModel(m)
        loaded++
      } catch (e) {
        crashes.push({ c, error: `loaded model fails validation: ${e instanceof Error ? e.message : String(e)}` })
      }
    } catch (e) {
      if (e instanceof InputError) {
        kinds.set(e.kind, (kinds.get(e.kind) ?? 0) + 1)
        const ex = examples.get(e.kind) ?? []
        if (ex.length < 3) ex.push(e.message)
        examples.set(e.kind, ex)
      } else {
        crashes.push({ c, error: e instanceof Error ? `${e.name}: ${e.message}` : String(e) })
      }
    }
    const ms = performance.now() - t
    if (ms > slowest.ms) slowest = { ms, c }
  }
}
const elapsed = (performance.now() - t0) / 1000
console.log(`done in ${elapsed.toFixed(1)} s (${(total / elapsed).toFixed(0)} cases/s)`)
console.log(`loaded and valid: ${loaded}`)
console.log('errors by kind:')
for (const [k, n] of [...kinds].sort((a, b) => b[1] - a[1])) {
  console.log(`  ${k.padEnd(22)} ${String(n).padStart(7)}`)
  if (verbose) for (const m of examples.get(k)!) console.log(`      ${m.slice(0, 160)}`)
}
console.log(`crashes: ${crashes.length}`)
for (const x of crashes.slice(0, 10)) console.log(`  ${x.error}\n    case: ${describeCase(x.c)}`)
if (slowest.c) console.log(`slowest case: ${slowest.ms.toFixed(2)} ms — ${describeCase(slowest.c)}`)
console.log(JSON.stringify({ fuzz: 'io', seed, cases: total, loaded, kinds: Object.fromEntries(kinds), crashes: crashes.length, slowestMs: slowest.ms }))
process.exitCode = crashes.length ? 1 : 0
