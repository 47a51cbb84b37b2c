/**
 * Field parsing of the CSV readers. The reference is ECMAScript's own Number() conversion
 * (ECMA-262, StringToNumber; correctly rounded): every decimal token must give the very same
 * double, including the sign of zero. Random inputs are seeded; the seed is printed.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  PARSE_BAD_INTEGER, PARSE_BAD_QUOTE, PARSE_EMPTY, PARSE_NOT_A_NUMBER, PARSE_NOT_FINITE, PARSE_OK, PARSE_OPEN_QUOTE, atLineEnd, createCursor,
  moveCursor, nextRecord, readId, readNumber, skipField, takeSeparator,
} from '../../src/io/csvCursor.ts'
import { textOf } from '../../src/io/csvBytes.ts'

/** The cursor reads UTF-8 bytes, as files arrive. */
const enc = (s: string) => new TextEncoder().encode(s)

const SEED = 20261201
console.log(`csvCursor property tests: fast-check seed ${SEED}`)

function parse(token: string): { value: number; status: number; rest: string } {
  const cur = createCursor('t.csv', enc(token + ',next'))
  const value = readNumber(cur)
  return { value, status: cur.status, rest: textOf(cur.bytes, cur.pos, cur.bytes.length) }
}

describe('readNumber equals Number()', () => {
  it('on the shortest round-trip text of any double (String(d))', () => {
    fc.assert(fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (d) => {
      const s = String(d)
      const r = parse(s)
      expect(r.status).toBe(PARSE_OK)
      expect(Object.is(r.value, Number(s))).toBe(true)
      expect(r.rest).toBe(',next')
    }), { seed: SEED, numRuns: 1500 })
  })

  it('on exponent, fixed and precision forms of doubles', () => {
    fc.assert(fc.property(fc.double({ min: -1e30, max: 1e30, noNaN: true }), fc.integer({ min: 0, max: 20 }), (d, k) => {
      for (const s of [d.toExponential(k), d.toFixed(Math.min(k, 20)), d.toPrecision(Math.max(1, k)), d.toExponential(k).toUpperCase()]) {
        const r = parse(s)
        expect(r.status).toBe(PARSE_OK)
        expect(Object.is(r.value, Number(s))).toBe(true)
      }
    }), { seed: SEED + 1, numRuns: 800 })
  })

  it('on random digit strings with signs, dots and exponents (long mantissas included)', () => {
    const digits = fc.string({ unit: fc.constantFrom('0', '1', '2', '5', '7', '9'), minLength: 1, maxLength: 25 })
    const tok = fc.tuple(fc.constantFrom('', '-', '+'), digits, fc.option(digits), fc.option(fc.tuple(fc.constantFrom('e', 'E'), fc.constantFrom('', '-', '+'), fc.integer({ min: 0, max: 400 }))))
      .map(([s, a, b, e]) => s + a + (b === null ? '' : '.' + b) + (e === null ? '' : e[0] + e[1] + e[2]))
    fc.assert(fc.property(tok, (s) => {
      const r = parse(s)
      const ref = Number(s)
      if (Number.isFinite(ref)) {
        expect(r.status).toBe(PARSE_OK)
        expect(Object.is(r.value, ref)).toBe(true)
      } else {
        expect(r.status).toBe(PARSE_NOT_FINITE)
      }
    }), { seed: SEED + 2, numRuns: 1500 })
  })

  it('on hand-picked edge cases', () => {
    // Values near the limits of the fast path (2^53, 10^22) and the sign of zero.
    for (const s of ['0', '-0', '+0', '0.0', '-0.0', '.5', '5.', '-.5', '9007199254740991', '9007199254740993', '1e22', '1e23',
      '123456789012345678', '0.1', '0.3', '1.7976931348623157e308', '5e-324', '2.2250738585072014e-308', '1E-7', '  3.25  ', '\t-1\t']) {
      const r = parse(s)
      expect(r.status, s).toBe(PARSE_OK)
      expect(Object.is(r.value, Number(s)), s).toBe(true)
    }
  })
})

describe('readNumber rejects what is not a plain decimal', () => {
  it.each(['abc', '0x10', '1e', '1e+', '--1', '1.2.3', '1 2', '"1""2"', '"x"', '١٢', '1_000', '.', '-', 'e5', '1d'])('%s is not a number', (s) => {
    expect(parse(s).status).toBe(PARSE_NOT_A_NUMBER)
  })
  it.each(['NaN', 'nan', '-inf', 'Infinity', '+INF', '1e400', '-1e999'])('%s is not finite', (s) => {
    expect(parse(s).status).toBe(PARSE_NOT_FINITE)
  })
  it('an empty field is reported as empty', () => {
    expect(parse('').status).toBe(PARSE_EMPTY)
    expect(parse('   ').status).toBe(PARSE_EMPTY)
  })
})

describe('readId', () => {
  const id = (s: string) => { const c = createCursor('t.csv', enc(s + '\n')); const v = readId(c); return { v, st: c.status } }
  it('accepts positive integers up to 2^31-1, also written as 12.0', () => {
    expect(id('1')).toEqual({ v: 1, st: PARSE_OK })
    expect(id('2147483647')).toEqual({ v: 2147483647, st: PARSE_OK })
    expect(id('12.0')).toEqual({ v: 12, st: PARSE_OK })
    expect(id(' 7 ')).toEqual({ v: 7, st: PARSE_OK })
  })
  it('rejects zero, negatives, fractions and too large values as bad ids', () => {
    for (const s of ['0', '-3', '2.5', '2147483648', '99999999999999', '1e300', 'inf']) expect(id(s).st, s).toBe(PARSE_BAD_INTEGER)
  })
  it('reports text as not a number', () => {
    expect(id('x1').st).toBe(PARSE_NOT_A_NUMBER)
  })
})

describe('the dialects read the same numbers', () => {
  /** Every field of one line, read with the cursor of a dialect. */
  function fields(line: string, sep: string, dec: string): { values: number[]; statuses: number[] } {
    const cur = createCursor('t.csv', enc(line + '\n'), sep, dec)
    const values: number[] = [], statuses: number[] = []
    do {
      values.push(readNumber(cur))
      statuses.push(cur.status)
    } while (takeSeparator(cur))
    expect(atLineEnd(cur)).toBe(true)
    return { values, statuses }
  }

  it('decimal commas, D exponents and the separators give what Number() gives for the point form', () => {
    // Reference: ECMAScript Number() of the same token written with a point and an e exponent.
    fc.assert(fc.property(fc.array(fc.double({ min: -1e30, max: 1e30, noNaN: true }), { minLength: 1, maxLength: 6 }), fc.integer({ min: 1, max: 17 }), (ds, k) => {
      const toks = ds.map((d) => d.toExponential(k - 1))
      const ref = toks.map(Number)
      const comma = toks.map((t) => t.replace('.', ','))
      const dexp = toks.map((t) => t.replace('e', 'D'))
      for (const [line, sep, dec] of [
        [comma.join(';'), ';', ','], [comma.join('\t'), '\t', ','], [comma.join('   '), ' ', ','],
        [dexp.join(','), ',', '.'], [dexp.join(' \t '), ' ', '.'], [toks.map((t) => `"${t}"`).join(','), ',', '.'],
        ['  ' + toks.join('  \t') + '  ', ' ', '.'],
      ] as const) {
        const r = fields(line, sep, dec)
        expect(r.statuses.every((st) => st === PARSE_OK), line).toBe(true)
        expect(r.values.length).toBe(ref.length)
        r.values.forEach((v, i) => expect(Object.is(v, ref[i]), line).toBe(true))
      }
    }), { seed: SEED + 3, numRuns: 400 })
  })

  it('a quoted field may hold the separator; "" is a quote inside', () => {
    const cur = createCursor('t.csv', enc('"a,b","c ""d""",3\n'))
    skipField(cur)
    expect(textOf(cur.bytes, cur.tokStart, cur.tokEnd)).toBe('"a,b"')
    expect(takeSeparator(cur)).toBe(true)
    skipField(cur)
    expect(textOf(cur.bytes, cur.tokStart, cur.tokEnd)).toBe('"c ""d"""')
    expect(takeSeparator(cur)).toBe(true)
    expect(readNumber(cur)).toBe(3)
  })

  it('a quote left open on its line, or text after the closing quote, is reported as such', () => {
    expect(parse('"1').status).toBe(PARSE_OPEN_QUOTE)
    expect(parse('"1\n2"').status).toBe(PARSE_OPEN_QUOTE)
    expect(parse('"1"x').status).toBe(PARSE_BAD_QUOTE)
  })

  it('with a decimal comma a point is not a decimal mark (it would be a thousands separator)', () => {
    const cur = createCursor('t.csv', enc('1.5;2\n'), ';', ',')
    readNumber(cur)
    expect(cur.status).toBe(PARSE_NOT_A_NUMBER)
  })

  it('runs of blanks: leading and trailing blanks are no fields', () => {
    expect(fields('   1  2\t\t3   ', ' ', '.').values).toEqual([1, 2, 3])
    // Tab-separated: empty fields between tabs stay fields, spaces around them are trimmed.
    const r = fields('1\t \t3', '\t', '.')
    expect(r.statuses).toEqual([PARSE_OK, PARSE_EMPTY, PARSE_OK])
  })
})

describe('nextRecord', () => {
  const text = '1,2\n# a\n\n  # b\r\n3,4\n# c\n# d\n5,6\n'
  const at = (needle: string) => text.indexOf(needle)

  it('skips blank and comment lines (any line end) and counts them', () => {
    const cur = createCursor('t.csv', enc(text))
    moveCursor(cur, at('# a'), 2)
    expect(nextRecord(cur)).toBe(true)
    expect(cur.pos).toBe(at('3,4'))
    expect(cur.line).toBe(5)
  })

  it('stops at the limit, a piece\'s end: the comment lines after it are left for the next piece', () => {
    const cur = createCursor('t.csv', enc(text))
    moveCursor(cur, at('# c'), 6)
    expect(nextRecord(cur, at('# d'))).toBe(false)
    expect(cur.pos).toBe(at('# d'))
    expect(cur.line).toBe(7)
    // a record that starts at the limit is the next piece's
    moveCursor(cur, at('3,4'), 5)
    expect(nextRecord(cur, at('3,4'))).toBe(false)
    expect(cur.pos).toBe(at('3,4'))
    expect(nextRecord(cur)).toBe(true)
    moveCursor(cur, at('5,6') + 4, 8)
    expect(nextRecord(cur)).toBe(false)
    expect(cur.line).toBe(8)
  })
})
