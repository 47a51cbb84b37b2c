/**
 * The defect corpus: every folder of test/fixtures/defects is one broken input (CSV bundle or
 * .tractus container, made by test/fixtures/makeDefects.ts); cases.json gives the expected error
 * kind and fragments the message must contain (file, line, column or field, element id).
 */
import { readFileSync, readdirSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { InputError } from '../../src/model/errors.ts'
import { readModelFiles } from '../../src/io/detect.ts'

interface DefectCase { case: string; what: string; kind: string; fragments: string[] }

const root = join(import.meta.dirname, '..', 'fixtures', 'defects')
const cases = JSON.parse(readFileSync(join(root, 'cases.json'), 'utf8')) as DefectCase[]

describe('defect corpus', () => {
  it('has at least 30 distinct cases, each with a folder', () => {
    expect(new Set(cases.map((c) => c.case)).size).toBe(cases.length)
    expect(cases.length).toBeGreaterThanOrEqual(30)
    const dirs = readdirSync(root, { withFileTypes: true }).filter((d) => d.isDirectory()).map((d) => d.name).sort()
    expect(dirs).toEqual(cases.map((c) => c.case).sort())
  })

  it.each(cases.map((c) => [c.case, c] as const))('%s', (_, c) => {
    const dir = join(root, c.case)
    const files = readdirSync(dir).sort().map((name) => {
      const b = readFileSync(join(dir, name))
      return { name, data: new Uint8Array(b.buffer, b.byteOffset, b.byteLength) }
    })
    let err: unknown = null
    try { readModelFiles(files) } catch (e) { err = e }
    expect(err, c.what).toBeInstanceOf(InputError)
    const ie = err as InputError
    expect(ie.kind, ie.message).toBe(c.kind)
    for (const f of c.fragments) expect(ie.message, c.what).toContain(f)
  })
})
