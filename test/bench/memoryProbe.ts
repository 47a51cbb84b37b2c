/**
 * Peak memory of the command-line path, measured in a fresh process:
 *   node --import tsx test/bench/memoryProbe.ts <file.tractus>   the real model
 *   node --import tsx test/bench/memoryProbe.ts --empty          a one-cell model, same code path
 * reads the native container (zero-copy), runs boundary faces with tractions, the element and
 * body balance audit and one section cut, then prints {"maxRssBytes", "elements"} as JSON.
 */
import { readFileSync } from 'node:fs'
import { readNative, writeNative } from '../../src/io/index.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { computeBodyBalance, computeElementBalance } from '../../src/mechanics/balanceAudit.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { syntheticModel } from './syntheticModel.ts'
import { BENCH_PLANE } from './benchPlane.ts'

const arg = process.argv[2]
let bytes: Uint8Array
if (arg === '--empty' || arg === undefined) {
  bytes = writeNative(syntheticModel('tet4', 6, 1))
} else {
  const buf = readFileSync(arg)
  bytes = new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength)
}
const model = readNative(bytes, 'probe.tractus')
const { mesh, stress, bodyForce } = model
const faces = extractBoundaryFaces(mesh)
const tractions = computeSurfaceTractions(mesh, stress, faces)
const elements = computeElementBalance(mesh, stress, bodyForce)
const body = computeBodyBalance(mesh, faces, tractions, bodyForce)
const cut = cutSection(mesh, stress, bodyForce, BENCH_PLANE, { faces, tractions })
// Keep every result reachable until the measurement, as a user session would.
const keep = [faces.count, tractions.force.length, elements.indicator.length, body.relative, cut.result.area]
process.stdout.write(JSON.stringify({ maxRssBytes: process.resourceUsage().maxRSS * 1024, elements: mesh.elementCount, keep: keep.length }) + '\n')
