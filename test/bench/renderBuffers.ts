/**
 * Render-buffer builders on a seeded synthetic block (see syntheticModel.ts): surface triangles,
 * their spatial order and clusters, the clusters one pass draws (per frame, on the UI thread),
 * feature edges, surface arrows at the default budget, section fan, its light face (vertex
 * clustering, drawn while a software renderer drags the plane) and section arrows, each the
 * median of several runs; checks run outside the timed part. Prints a table, then JSON.
 * Run: npx tsx test/bench/renderBuffers.ts [elements] [seed]
 */
import { extractBoundaryFaces } from '../../src/mechanics/boundaryFaces.ts'
import { allocateSurfaceTractions, computeSurfaceTractions } from '../../src/mechanics/tractions.ts'
import { allocateNodalInvariants, computeNodalInvariants } from '../../src/mechanics/invariants.ts'
import { nodalStressField } from '../../src/model/stressField.ts'
import { cutSection } from '../../src/mechanics/sectionCut.ts'
import { buildSurfaceTriangles } from '../../src/mechanics/surfaceTriangles.ts'
import { sortTrianglesSpatially, surfaceClusters } from '../../src/mechanics/surfaceClusters.ts'
import { visibleClusterRuns } from '../../src/scene/clusterVisibility.ts'
import { buildFeatureEdges } from '../../src/mechanics/featureEdges.ts'
import { buildSectionTriangles } from '../../src/mechanics/sectionTriangles.ts'
import { coarsenSectionFill } from '../../src/mechanics/coarseSectionFill.ts'
import { sampleSectionArrows, sampleSurfaceArrows } from '../../src/mechanics/arrowSampling.ts'
import { syntheticModel } from './syntheticModel.ts'
import { measure } from './timing.ts'
import { BENCH_PLANE } from './benchPlane.ts'

const elements = Number(process.argv[2] ?? 200_000)
const seed = Number(process.argv[3] ?? 1)
const model = syntheticModel('tet4', elements, seed)
const mesh = model.mesh
const faces = extractBoundaryFaces(mesh)
const tractions = computeSurfaceTractions(allocateSurfaceTractions(faces), mesh, nodalStressField(mesh, model.stress), faces)
const invariants = computeNodalInvariants(allocateNodalInvariants(mesh.nodeCount), model.stress)
const { polygons } = cutSection(mesh, nodalStressField(mesh, model.stress), model.bodyForce, BENCH_PLANE, { faces, tractions, polygons: true })
if (!polygons) throw new Error('the bench plane misses the block')

const runs = 5
const surface = buildSurfaceTriangles(mesh.coords, faces, tractions, invariants)
const order = (): void => sortTrianglesSpatially(surface.positions, surface.index.slice(), [surface.triangleFace.slice()])
sortTrianglesSpatially(surface.positions, surface.index, [surface.triangleFace])
const clusters = surfaceClusters(surface.positions, surface.index, null)
const clusterRuns = new Int32Array(2 * clusters.start.length)
// a view from outside a corner, with a section plane through the middle (the per-frame work of one pass)
const view = { eye: [3, -4, 2.5], direction: [-0.5, 0.6, -0.4], facing: 1, plane: [1, 0, 0, -0.5] }
const rows = [
  ['surfaceTriangles', measure(() => buildSurfaceTriangles(mesh.coords, faces, tractions, invariants), runs)],
  ['surfaceOrder', measure(order, runs)],
  ['surfaceClusters', measure(() => surfaceClusters(surface.positions, surface.index, null), runs)],
  ['clusterRuns(frame)', measure(() => visibleClusterRuns(clusters.start, clusters.bounds, view, null, clusterRuns), 50)],
  ['featureEdges', measure(() => buildFeatureEdges(mesh.coords, faces), runs)],
  ['surfaceArrows(2000)', measure(() => sampleSurfaceArrows(faces, tractions, { budget: 2000 }), runs)],
  ['sectionTriangles', measure(() => buildSectionTriangles(polygons, BENCH_PLANE.normal), runs)],
  ['sectionLightFace(2000)', measure(() => coarsenSectionFill(polygons.fill, BENCH_PLANE.normal, 2000), runs)],
  ['sectionArrows(2000)', measure(() => sampleSectionArrows(polygons, BENCH_PLANE.normal, { budget: 2000 }), runs)],
] as const

// Checks, outside the timed loops.
const s = buildSurfaceTriangles(mesh.coords, faces, tractions, invariants)
if (s.index.length !== 3 * faces.count) throw new Error('tet4 faces must give one triangle each')
if (sampleSurfaceArrows(faces, tractions, { budget: 2000 }).count > 2000) throw new Error('arrow budget exceeded')
if (coarsenSectionFill(polygons.fill, BENCH_PLANE.normal, 2000).index.length > 3 * 3000) throw new Error('light face far over its budget')

const result = {
  seed, elements: mesh.elementCount, boundaryFaces: faces.count, sectionPolygons: polygons.count, clusters: clusters.start.length - 1,
  ms: Object.fromEntries(rows.map(([name, t]) => [name, Number(t.medianMs.toFixed(2))])),
  cpuMs: Object.fromEntries(rows.map(([name, t]) => [name, Number(t.cpuMs.toFixed(2))])),
}
console.log(`elements ${result.elements}, boundary faces ${result.boundaryFaces}, section polygons ${result.sectionPolygons}, seed ${seed}`)
// On a shared machine the CPU time is the steadier figure.
for (const [name, t] of rows) console.log(`${name.padEnd(22)} wall ${t.medianMs.toFixed(2).padStart(9)} ms, cpu ${t.cpuMs.toFixed(2).padStart(9)} ms (medians of ${runs})`)
console.log(JSON.stringify(result))
