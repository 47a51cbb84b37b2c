/**
 * Mesh refinement study of the demo scenarios (a Node script: `npx tsx src/demo/refinementStudy.ts
 * [lug|tunnel] [maxLevel]`): solves each refinement level and prints the statics figures as a
 * table and as JSON, to show the section resultants and the balance residual converge.
 */
import { buildLiftingLug, LUG_DEFAULTS, lugMeshLevel } from './liftingLug.ts'
import { lugStatics } from './lugStatics.ts'
import { solveElastic } from './solveElastic.ts'
import { buildTunnelBlock, TUNNEL_DEFAULTS, tunnelHierarchy, tunnelMeshLevel } from './tunnelBlock.ts'
import { tunnelStatics } from './tunnelStatics.ts'

const which = process.argv[2] ?? 'lug'
const maxLevel = Number(process.argv[3] ?? 2)
const pct = (v: number) => (100 * v).toFixed(3)
const rows: Record<string, number | string>[] = []
for (let level = 0; level <= maxLevel; level++) {
  if (which === 'lug') {
    // The full clamp is compared on the smaller meshes only (the finest takes minutes).
    for (const baseHold of level <= 2 ? (['in-plane', 'full'] as const) : (['in-plane'] as const)) {
      const sc = buildLiftingLug({ ...LUG_DEFAULTS, ...lugMeshLevel(level), baseHold })
      const sol = solveElastic(sc.problem)
      const st = lugStatics(sc, sol.stress, sol.reaction)
      rows.push({
        level, baseHold, elements: sol.stats.elements, iterations: sol.stats.iterations, solveSeconds: +sol.stats.solveSeconds.toFixed(2),
        sectionForcePct: pct(st.sectionForceError), sectionMomentPct: pct(st.sectionMomentError), balancePct: pct(st.balance.relative),
        peakHoopMPa: st.peakHoopStress.toFixed(1), freeHolePct: pct(st.freeHoleTraction),
      })
    }
  } else {
    const sc = buildTunnelBlock({ ...TUNNEL_DEFAULTS, ...tunnelMeshLevel(level) })
    // The finest level takes the multigrid preconditioner, as `npm run demo -- --large` does.
    const sol = solveElastic({ ...sc.problem, maxIterations: 50000, multigrid: level >= 3 ? tunnelHierarchy(TUNNEL_DEFAULTS, level) : undefined })
    const st = tunnelStatics(sc, sol.stress)
    rows.push({
      level, elements: sol.stats.elements, iterations: sol.stats.iterations, solveSeconds: +sol.stats.solveSeconds.toFixed(2),
      basePct: pct(st.baseError), axisSectionPct: pct(st.axisSectionError), midSectionPct: pct(st.midSectionError), balancePct: pct(st.balance.relative),
      springlineVsKirschPct: pct(st.springline / st.springlineKirsch - 1), crownVsKirschPct: pct(st.crown / st.crownKirsch - 1), wallRmsPct: pct(st.wallRmsDeviation), wallTractionPct: pct(st.wallTraction),
    })
  }
  console.table(rows.slice(-1))
}
console.table(rows)
console.log(JSON.stringify(rows))
