/**
 * Peak memory of the command-line path, measured in a fresh process:
 *   node --import tsx test/bench/memoryProbe.ts <file.tractus>   the real model
 *   node --import tsx test/bench/memoryProbe.ts --empty          a one-cell model, same code path
 *   node --import tsx test/bench/memoryProbe.ts --write <file.tractus> <elements> <seed>
 *                                                               writes the tet4 bench model
 * A probe reads the native container (zero-copy), runs boundary faces with tractions, the
 * element and body balance audit and one section cut, then prints
 * {"peakRssBytes", "maxRssBytes", "elements"} as JSON.
 *
 * Peak RSS is the kernel's high-water mark of this process's own memory (VmHWM in
 * /proc/self/status), which starts afresh at exec. process.resourceUsage().maxRSS is reported
 * beside it but on Linux it also keeps the parent's resident size at fork, so a probe started
 * from a large benchmark process would report the parent's size.
 */
import { readFileSync, writeFileSync } from 'node:fs'
import { readNative, writeNative } from '../../src/io/index.ts'
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { allocateElementBalance, computeBodyBalance, computeElementBalance } from '../../src/mechanics/balanceAudit.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { syntheticModel } from './syntheticModel.ts'
import { BENCH_PLANE } from './benchPlane.ts'

/** VmHWM of this process in bytes, or null where /proc is not available. */
export function highWaterRss(): number | null {
  try {
    const m = /VmHWM:\s*(\d+)\s*kB/.exec(readFileSync('/proc/self/status', 'utf8'))
    return m ? Number(m[1]) * 1024 : null
  } catch {
    return null
  }
}

const arg = process.argv[2]
if (arg === '--write') {
  const [file, elements, seed] = process.argv.slice(3)
  writeFileSync(file, writeNative(syntheticModel('tet4', Number(elements), Number(seed))))
} else {
  let bytes: Uint8Array
  if (arg === '--empty' || arg === undefined) {
    bytes = writeNative(syntheticModel('tet4', 6, 1))
  } else {
    const buf = readFileSync(arg)
    bytes = new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength)
  }
  const model = readNative(bytes, 'probe.tractus')
  const { mesh, stress, bodyForce } = model
  const field = nodalStressField(mesh, stress)
  const faces = extractBoundaryFaces(mesh)
  const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, field, faces)
  const elements = computeElementBalance(allocateElementBalance(mesh.elementCount, 'single'), mesh, field, bodyForce)
  const body = computeBodyBalance(mesh, faces, tractions, bodyForce)
  const cut = cutSection(mesh, nodalStressField(mesh, stress), bodyForce, BENCH_PLANE, { faces, tractions })
  // Keep every result reachable until the measurement, as a user session would.
  const keep = [faces.count, tractions.force.length, elements.indicator.length, body.relative, cut.result.area]
  const maxRssBytes = process.resourceUsage().maxRSS * 1024
  process.stdout.write(JSON.stringify({ peakRssBytes: highWaterRss() ?? maxRssBytes, maxRssBytes, elements: mesh.elementCount, keep: keep.length }) + '\n')
}
