/**
 * Every validation of the CSV bundle reader: the error kind, and a message that names the file
 * and the line (1-based, comment and blank lines counted) and the column or element id, so a user
 * can find the spot (common practice for data loaders; Tractus rule "errors a user can act on").
 */
import { describe, expect, it } from 'vitest'
import { InputError } from '../../src/model/errors.ts'
import type { InputErrorKind } from '../../src/model/errors.ts'
import { readCsvBundle } from '../../src/io/readCsvBundle.ts'
import { validateModel } from '../../src/io/validateModel.ts'
import { setLine, tinyBundle, toFiles } from './tinyBundle.ts'
import type { Bundle } from './tinyBundle.ts'

function expectError(b: Bundle, kind: InputErrorKind, fragments: string[]): InputError {
  let err: unknown = null
  try {
    readCsvBundle(toFiles(b))
  } catch (e) {
    err = e
  }
  expect(err).toBeInstanceOf(InputError)
  const ie = err as InputError
  expect(ie.kind, ie.message).toBe(kind)
  for (const f of fragments) expect(ie.message).toContain(f)
  return ie
}

function edit(file: string, change: (t: string) => string): Bundle {
  const b = tinyBundle()
  b[file] = change(b[file])
  return b
}

describe('the tiny bundle itself', () => {
  it('loads and passes validation', () => {
    const m = readCsvBundle(toFiles(tinyBundle()))
    validateModel(m)
    expect(m.mesh.elementCount).toBe(2)
    expect(m.warnings).toEqual([])
    expect(m.units).toEqual({ length: 'm', stress: 'MPa' })
  })
})

describe('files', () => {
  it('missing required file names it and lists what was given', () => {
    const b = tinyBundle()
    delete b['stress.csv']
    const e = expectError(b, 'missing-file', ['missing stress.csv', 'got: nodes.csv, elements.csv, displacement.csv, model.json'])
    expect(e.message).toMatch(/^missing stress\.csv; got: /)
  })
  it('empty file', () => {
    expectError(edit('nodes.csv', () => ''), 'empty-file', ['nodes.csv', 'empty'])
  })
  it('only comments and blank lines count as empty', () => {
    expectError(edit('elements.csv', () => '# nothing here\n\n   \n'), 'empty-file', ['elements.csv'])
  })
  it('header without rows', () => {
    expectError(edit('stress.csv', () => 'id,sxx,syy,szz,sxy,syz,sxz\n'), 'empty-file', ['stress.csv', 'line 1', 'no rows'])
    expectError(edit('elements.csv', () => '# c\nid,type,n1\n'), 'no-elements', ['elements.csv', 'line 2'])
  })
  it('two files with the same role', () => {
    const files = [...toFiles(tinyBundle()), { name: 'other/NODES.csv', text: 'id,x,y,z\n1,0,0,0\n' }]
    expect(() => readCsvBundle(files)).toThrow(/two files named nodes\.csv/)
  })
  it('two model.json files', () => {
    const files = [...toFiles(tinyBundle()), { name: 'other/model.json', text: '{}' }]
    expect(() => readCsvBundle(files)).toThrow(/two files named model\.json were given: model\.json and other\/model\.json/)
  })
  it('a file over the size limit', () => {
    const files = toFiles(tinyBundle())
    const size = files[0].text.length
    try { readCsvBundle(files, { maxBytes: 50 }); expect.unreachable() } catch (e) {
      expect((e as InputError).kind).toBe('too-large')
      expect((e as InputError).message).toBe(`nodes.csv: the file is ${size} bytes, more than the limit of 50 bytes`)
    }
  })
})

describe('headers', () => {
  it('missing column', () => {
    expectError(edit('nodes.csv', (t) => setLine(t, 1, 'id,x,y')), 'header', ['nodes.csv', 'line 1', 'missing column z'])
  })
  it('a column of another name: the missing field, the column found instead and the model.json key that maps it', () => {
    expectError(edit('stress.csv', (t) => setLine(t, 1, 'id,sxx,syy,szz,sxy,syz,s13')), 'header', ['stress.csv', 'line 1', 'missing column sxz', '(not used: "s13")', '"columns": {"stress": {"sxz": "s13"}}'])
  })
  it('column twice', () => {
    expectError(edit('displacement.csv', (t) => setLine(t, 1, 'id,ux,ux,uz')), 'header', ['displacement.csv', 'line 1', '"ux" appears twice'])
  })
  it('header on a later line after comments keeps the line count', () => {
    expectError(edit('nodes.csv', (t) => '# exported\n\n' + setLine(t, 1, 'id,x,y,q')), 'header', ['nodes.csv', 'line 3'])
  })
  it('elements: id, type and part found by name, node columns n1..nK side by side', () => {
    // The header decides which column is which: swapped names read the id column as the type.
    expectError(edit('elements.csv', (t) => setLine(t, 1, 'type,id,n1,n2,n3,n4,n5,n6,n7,n8')), 'unknown-type', ['elements.csv', 'line 2', 'column "type"', '"1"'])
    // A part column after the nodes is read; rows without a value there end too early.
    expectError(edit('elements.csv', (t) => setLine(t, 1, 'id,type,n1,n2,n3,n4,n5,n6,n7,n8,part')), 'column-count', ['line 2', 'the row ends before column "part"'])
    expectError(edit('elements.csv', (t) => setLine(t, 1, 'id,type,n1,n2,n4')), 'header', ['line 1', 'expected "n3"'])
    expectError(edit('elements.csv', (t) => setLine(t, 1, 'id,type')), 'header', ['line 1', 'no node columns', '"columns": {"elements": {"nodes": "N1"}}'])
  })
})

describe('rows', () => {
  it('too few fields', () => {
    expectError(edit('nodes.csv', (t) => setLine(t, 4, '3,1,1')), 'column-count', ['nodes.csv', 'line 4', 'expected 4 fields', 'found 3'])
  })
  it('too many fields', () => {
    expectError(edit('stress.csv', (t) => setLine(t, 5, '4,10,0,0,0,0,0,0')), 'column-count', ['stress.csv', 'line 5', 'found 8'])
  })
  it('not a number names the column and the text', () => {
    expectError(edit('nodes.csv', (t) => setLine(t, 3, '2,1,abc,0')), 'not-a-number', ['nodes.csv', 'line 3', 'column "y"', '"abc"'])
  })
  it('empty field', () => {
    expectError(edit('stress.csv', (t) => setLine(t, 2, '1,10,,0,0,0,0')), 'not-a-number', ['stress.csv', 'line 2', 'column "syy"', 'empty field'])
  })
  it('NaN and Infinity', () => {
    expectError(edit('stress.csv', (t) => setLine(t, 6, '5,NaN,0,0,0,0,0')), 'not-finite', ['stress.csv', 'line 6', 'column "sxx"', '"NaN"'])
    expectError(edit('nodes.csv', (t) => setLine(t, 2, '1,0,0,1e999')), 'not-finite', ['nodes.csv', 'line 2', 'column "z"'])
    expectError(edit('displacement.csv', (t) => setLine(t, 2, '1,-Infinity,0,0')), 'not-finite', ['displacement.csv', 'line 2', 'column "ux"'])
  })
  it('non-positive and non-integer ids', () => {
    expectError(edit('nodes.csv', (t) => setLine(t, 2, '0,0,0,0')), 'bad-id', ['nodes.csv', 'line 2', 'column "id"', '"0"'])
    expectError(edit('nodes.csv', (t) => setLine(t, 2, '-1,0,0,0')), 'bad-id', ['nodes.csv', 'line 2'])
    expectError(edit('stress.csv', (t) => setLine(t, 3, '2.5,10,0,0,0,0,0')), 'bad-id', ['stress.csv', 'line 3', '"2.5"'])
    expectError(edit('elements.csv', (t) => setLine(t, 2, '1,hex8,1,2,3,4,5,6,7,8.5')), 'bad-id', ['elements.csv', 'line 2', 'column "n8"', 'element 1'])
    expectError(edit('nodes.csv', (t) => setLine(t, 2, '2147483648,0,0,0')), 'bad-id', ['nodes.csv', 'line 2'])
  })
  it('duplicate ids name both lines', () => {
    expectError(edit('nodes.csv', (t) => setLine(t, 10, '3,0.5,0.5,2')), 'duplicate-id', ['nodes.csv', 'line 10', 'node id 3 appears twice (lines 4 and 10)'])
    expectError(edit('elements.csv', (t) => setLine(t, 3, '1,tet4,5,6,8,9')), 'duplicate-id', ['elements.csv', 'line 3', 'element 1', 'lines 2 and 3'])
    expectError(edit('stress.csv', (t) => setLine(t, 10, '4,10,0,0,0,0,0')), 'duplicate-id', ['stress.csv', 'line 10', 'node 4 has two rows (lines 5 and 10)'])
  })
  it('duplicate ids are found with sparse ids too', () => {
    expectError(edit('nodes.csv', (t) => setLine(setLine(t, 2, '2000000000,0,0,0'), 10, '2000000000,0.5,0.5,2')), 'duplicate-id', ['nodes.csv', 'line 10', 'lines 2 and 10'])
  })
})

describe('elements', () => {
  it('unknown type', () => {
    expectError(edit('elements.csv', (t) => setLine(t, 2, '1,brick8,1,2,3,4,5,6,7,8')), 'unknown-type', ['elements.csv', 'line 2', 'element 1', '"brick8"', 'tet4, tet10, hex8, hex20, wedge6'])
  })
  it('wrong node count for the type', () => {
    expectError(edit('elements.csv', (t) => setLine(t, 3, '2,tet4,5,6,8')), 'node-count', ['elements.csv', 'line 3', 'element 2', 'tet4 has 4 nodes, the row lists 3'])
    expectError(edit('elements.csv', (t) => setLine(t, 3, '2,tet4,5,6,8,9,7')), 'node-count', ['line 3', 'element 2', 'the row lists 5'])
  })
  it('row too short for id and type', () => {
    expectError(edit('elements.csv', (t) => setLine(t, 3, '2')), 'column-count', ['elements.csv', 'line 3'])
  })
  it('node fields in any accepted spelling give the same connectivity, and bad ones the same errors', () => {
    // Blanks, a plus sign, leading zeros and "12.0" are ids as readId reads them; the row reader's
    // shortcut for plain digits must agree with it field by field (common practice: one grammar).
    const plain = readCsvBundle(toFiles(tinyBundle()))
    const spelled = readCsvBundle(toFiles(edit('elements.csv', (t) => setLine(setLine(t, 2, '1,hex8, 1,+2,03,4.0 ,5,6,7,8'), 3, '2,tet4,5,6,8,9  '))))
    expect(Array.from(spelled.mesh.blocks[0].conn)).toEqual(Array.from(plain.mesh.blocks[0].conn))
    expect(Array.from(spelled.mesh.blocks[1].conn)).toEqual(Array.from(plain.mesh.blocks[1].conn))
    expectError(edit('elements.csv', (t) => setLine(t, 3, '2,tet4,5,6,0,9')), 'bad-id', ['line 3', 'column "n3"', 'element 2'])
    expectError(edit('elements.csv', (t) => setLine(t, 3, '2,tet4,5,6,21474836470,9')), 'bad-id', ['line 3', 'column "n3"'])
    expectError(edit('elements.csv', (t) => setLine(t, 3, '2,tet4,5,6,8x,9')), 'not-a-number', ['line 3', 'column "n3"', '"8x"'])
  })
  it('element referencing a missing node', () => {
    expectError(edit('elements.csv', (t) => setLine(t, 3, '2,tet4,5,6,8,99')), 'missing-node', ['elements.csv', 'line 3', 'column "n4"', 'element 2', 'node 99 is not in nodes.csv'])
  })
  it('part column: integers ≥ 0', () => {
    const withPart = (rows: string[]) => edit('elements.csv', () => ['id,type,part,n1,n2,n3,n4,n5,n6,n7,n8', ...rows].join('\n'))
    const ok = readCsvBundle(toFiles(withPart(['1,hex8,3,1,2,3,4,5,6,7,8', '2,tet4,0,5,6,8,9'])))
    expect(Array.from(ok.mesh.blocks[0].part!)).toEqual([3])
    expectError(withPart(['1,hex8,-2,1,2,3,4,5,6,7,8', '2,tet4,0,5,6,8,9']), 'bad-id', ['elements.csv', 'line 2', 'column "part"', 'element 1'])
  })
  it('degenerate (zero-volume) element names the element', () => {
    // Node 9 moved into the plane of nodes 5, 6, 8: the tet is flat.
    expectError(edit('nodes.csv', (t) => setLine(t, 10, '9,0.5,0.5,1')), 'zero-volume', ['elements.csv', 'line 3', 'element 2', 'degenerate tet4'])
    // A repeated node collapses it too.
    expectError(edit('elements.csv', (t) => setLine(t, 3, '2,tet4,5,6,6,9')), 'zero-volume', ['element 2'])
  })
  it('inverted elements are reoriented with a warning naming them', () => {
    const b = edit('elements.csv', (t) => setLine(setLine(t, 2, '1,hex8,5,6,7,8,1,2,3,4'), 3, '2,tet4,5,8,6,9'))
    const m = readCsvBundle(toFiles(b))
    expect(m.warnings).toEqual(['elements.csv: reoriented 2 inverted elements (negative volume, local nodes mirrored): 1, 2'])
    validateModel(m)
    expect(Array.from(m.mesh.blocks[0].conn).map((i) => m.mesh.nodeIds[i])).toEqual([1, 2, 3, 4, 5, 6, 7, 8])
  })
})

describe('stress, displacement and model.json', () => {
  it('stress row missing for a node used by an element', () => {
    expectError(edit('stress.csv', (t) => setLine(t, 10, null)), 'missing-stress', ['stress.csv', 'no stress row for node 9', 'element 2'])
  })
  it('stress row for a node that does not exist', () => {
    expectError(edit('stress.csv', (t) => setLine(t, 4, '33,10,0,0,0,0,0')), 'missing-node', ['stress.csv', 'line 4', 'node 33 is not in nodes.csv'])
  })
  it('unused nodes without stress get zero and a warning', () => {
    const b = tinyBundle()
    b['nodes.csv'] += '10,5,5,5\n'
    const m = readCsvBundle(toFiles(b))
    expect(m.warnings).toEqual(['stress.csv: 1 node used by no element has no stress row; stress set to zero there'])
    expect(Array.from(m.stress.subarray(54, 60))).toEqual([0, 0, 0, 0, 0, 0])
  })
  it('displacement row missing', () => {
    expectError(edit('displacement.csv', (t) => setLine(t, 2, null)), 'missing-displacement', ['displacement.csv', 'node 1', 'element 1'])
  })
  it('model.json syntax, units and body force', () => {
    expectError(edit('model.json', () => '{"name": "a",\n "units": }'), 'bad-json', ['model.json', 'line 2', 'column 11'])
    expectError(edit('model.json', () => '{"name": "a"'), 'bad-json', ['model.json', 'line 1', 'column 13'])
    expectError(edit('model.json', () => '{"name": "a"} x'), 'bad-json', ['model.json', 'line 1', 'column 15'])
    expectError(edit('model.json', () => '{"units": {"length": "furlong"}}'), 'bad-unit', ['model.json', 'field "units.length"', '"furlong"'])
    expectError(edit('model.json', () => '{"units": {"stress": "bar"}}'), 'bad-unit', ['field "units.stress"'])
    expectError(edit('model.json', () => '{"bodyForce": [0, 0]}'), 'bad-json', ['model.json', 'field "bodyForce"'])
    expectError(edit('model.json', () => '[1, 2]'), 'bad-json', ['model.json', 'JSON object'])
    const m = readCsvBundle(toFiles(edit('model.json', () => '{"name": "n", "colour": "red"}')))
    expect(m.warnings[0]).toBe('model.json: unknown key "colour" ignored')
    // No units in model.json nor in the headers: loaded, and said so.
    expect(m.warnings[1]).toMatch(/^no units declared: lengths are read as m and stresses as Pa/)
    expect(m.intake.unitsDeclared).toBe(false)
  })
})

describe('counting lines', () => {
  it('comment and blank lines count, CRLF counts once per line', () => {
    const b = edit('nodes.csv', (t) => ('# a\r\n\r\n' + setLine(t, 5, '4,0,one,0')).replace(/\n/g, '\r\n').replace(/\r\r/g, '\r'))
    expectError(b, 'not-a-number', ['nodes.csv', 'line 7', '"one"'])
  })
})
