/**
 * Focused measure of what regions add to one section cut at about 10^6 elements (tet4, hex8):
 * the fastest of 15 cuts without and with `regions: true`. Not part of `npm run bench`.
 * Run: npx tsx test/bench/regionsCost.ts
 */
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { BENCH_PLANE } from './benchPlane.ts'
import { syntheticModel } from './syntheticModel.ts'
for (const type of (process.argv[2] ? [process.argv[2]] : ['tet4', 'hex8']) as ('tet4' | 'hex8')[]) {
  const model = syntheticModel(type, 1e6, 1)
  const field = nodalStressField(model.mesh, model.stress)
  const faces = extractBoundaryFaces(model.mesh)
  const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), model.mesh, field, faces)
  const opts = { faces, tractions }
  const time = (o: object) => { const s: number[] = []; for (let i = 0; i < 15; i++) { const t = performance.now(); cutSection(model.mesh, field, [0, 0, 0], BENCH_PLANE, { ...opts, ...o }); s.push(performance.now() - t) } s.sort((a, b) => a - b); return s[0] }
  for (let r = 0; r < 2; r++) {
    const a = time({}), b = time({ regions: true })
    const res = cutSection(model.mesh, field, [0, 0, 0], BENCH_PLANE, { ...opts, regions: true }).result
    console.log(type, 'plain', a.toFixed(1), 'ms; regions', b.toFixed(1), 'ms;', ((b / a - 1) * 100).toFixed(0), '%; regions', res.regions!.length, 'cut', res.cutElements)
  }
}
