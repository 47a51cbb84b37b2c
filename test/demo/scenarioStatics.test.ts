import { describe, expect, it } from 'vitest'
import { buildLiftingLug, LUG_DEFAULTS, lugMeshLevel } from '../../src/demo/liftingLug.ts'
import { lugStatics } from '../../src/demo/lugStatics.ts'
import { solveElastic } from '../../src/demo/solveElastic.ts'
import { buildTunnelBlock, TUNNEL_DEFAULTS, tunnelMeshLevel } from '../../src/demo/tunnelBlock.ts'
import { kirschWallHoop, tunnelStatics } from '../../src/demo/tunnelStatics.ts'
import { buildPipeSegment, PIPE_DEFAULTS, pipeLame, pipeMeshLevel } from '../../src/demo/pipeSegment.ts'
import { pipeStatics } from '../../src/demo/pipeStatics.ts'

// Coarse meshes of the demo scenarios keep these tests fast; the full-size figures are printed by
// `npm run demo` and `npx tsx src/demo/refinementStudy.ts`.

describe('demo scenario: lifting lug (coarse mesh)', () => {
  const solveLevel = (level: number) => {
    const sc = buildLiftingLug({ ...LUG_DEFAULTS, ...lugMeshLevel(level) })
    const sol = solveElastic(sc.problem)
    return { sc, sol, st: lugStatics(sc, sol.stress, sol.reaction) }
  }
  const coarse = solveLevel(0)
  const { sc, sol, st } = solveLevel(1)

  it('applies the pin load it says, at the angle it says', () => {
    const [px, py, pz] = sc.pinForce
    expect(Math.hypot(px, py, pz)).toBeCloseTo(50_000, -1)
    expect((Math.atan2(px, py) * 180) / Math.PI).toBeCloseTo(30, 1)
    expect(pz).toBeCloseTo(0, 6)
  })

  it('the base reactions balance the pin load (solver statics)', () => {
    // Free-body diagram of the whole lug (statics, common practice): Σ reactions + P = 0.
    expect(st.reactionError).toBeLessThan(1e-6)
  })

  it('a section through the shank carries the pin load within 2 % (force and moment)', () => {
    // Free body above a horizontal cut (statics, common practice): the section resultant equals
    // the pin load, and its moment about the section centroid equals the pin load's moment there.
    console.log(`lug level 1: section force error ${(100 * st.sectionForceError).toFixed(3)} %, moment ${(100 * st.sectionMomentError).toFixed(3)} %, balance ${(100 * st.balance.relative).toFixed(3)} % (level 0: ${(100 * coarse.st.balance.relative).toFixed(3)} %)`)
    expect(st.sectionForceError).toBeLessThan(0.02)
    expect(st.sectionMomentError).toBeLessThan(0.02)
    expect(st.sectionForce[1]).toBeGreaterThan(0)
  })

  it('whole-body balance of the written stress improves with the mesh', () => {
    // Cauchy's equation integrated over the body (Malvern 1969, ch. 3): ∮ σn dA + ∫ ρb dV = 0.
    // The full-size demo reaches < 1 % of the gross load; the coarse meshes here are near 2 %.
    expect(st.balance.relative).toBeLessThan(0.025)
    expect(st.balance.relative).toBeLessThan(coarse.st.balance.relative)
  })

  it('the hole edge shows a stress concentration, across the pull direction', () => {
    // A loaded pin hole concentrates hoop stress at its edge, largest roughly 90° either side of
    // the load direction (common practice; Kirsch 1898 for the open-hole analogue).
    expect(st.peakHoopStress / st.nominalStress).toBeGreaterThan(2)
    const loadAngle = 90 - sc.spec.angleDeg
    const off = Math.abs(((st.peakHoopAngleDeg - loadAngle + 540) % 360) - 180)
    expect(off).toBeGreaterThan(50)
    expect(off).toBeLessThan(130)
  })

  it('the plate faces are nearly traction-free', () => {
    expect(st.freeFaceTraction).toBeLessThan(0.02)
    expect(sol.stats.converged).toBe(true)
  })
})

describe('demo scenario: tunnel block (coarse mesh)', () => {
  const sc = buildTunnelBlock({ ...TUNNEL_DEFAULTS, ...tunnelMeshLevel(1) })
  const sol = solveElastic(sc.problem)
  const st = tunnelStatics(sc, sol.stress)

  it('the base carries weight + overburden within 1 %', () => {
    // Free-body diagram of the block (statics, common practice); the side pressures balance.
    console.log(`tunnel level 1: base ${(100 * st.baseError).toFixed(3)} %, springline ${st.springline.toFixed(0)} vs Kirsch ${st.springlineKirsch.toFixed(0)} kPa, crown ${st.crown.toFixed(0)} vs ${st.crownKirsch.toFixed(0)} kPa, RMS ${(100 * st.wallRmsDeviation).toFixed(2)} % of p`)
    expect(st.baseError).toBeLessThan(0.01)
    expect(st.balance.relative).toBeLessThan(0.01)
  })

  it('sections through the tunnel axis carry what statics says', () => {
    // Horizontal cut: overburden + weight of the rock above; vertical cut: the side pressure
    // resultant K0 ∫ σv dy on one side (statics, common practice).
    expect(st.axisSectionError).toBeLessThan(0.01)
    expect(st.midSectionError).toBeLessThan(0.01)
  })

  it('the wall hoop stress follows Kirsch for a biaxial far field', () => {
    // Kirsch (1898): σθ = p[(1 + K) + 2(1 - K) cos 2θ] at the wall (derived in tunnelStatics.ts).
    // The block is finite (7.5 diameters) and its stress grows with depth, so a few % remain.
    expect(Math.abs(st.springline / st.springlineKirsch - 1)).toBeLessThan(0.05)
    expect(Math.abs(st.crown - st.crownKirsch) / st.p).toBeLessThan(0.05)
    expect(Math.abs(st.invert - st.crownKirsch) / st.p).toBeLessThan(0.05)
    expect(st.wallRmsDeviation).toBeLessThan(0.04)
    expect(st.wallTraction).toBeLessThan(0.05)
  })

  it('Kirsch formula: known special cases', () => {
    // Uniaxial (K = 0): 3p across the load at θ = 0, -p (tension) along it at θ = 90°; hydrostatic
    // (K = 1): 2p all round (Kirsch 1898; Timoshenko & Goodier §35, from memory).
    expect(kirschWallHoop(1, 0, 0)).toBeCloseTo(3, 12)
    expect(kirschWallHoop(1, 0, Math.PI / 2)).toBeCloseTo(-1, 12)
    for (const th of [0, 0.3, 1, 2]) expect(kirschWallHoop(5, 1, th)).toBeCloseTo(10, 12)
  })
})

describe('demo scenario: thick pipe segment (coarse mesh)', () => {
  const sc = buildPipeSegment({ ...PIPE_DEFAULTS, ...pipeMeshLevel(0) })
  const sol = solveElastic(sc.problem)
  const st = pipeStatics(sc, sol.stress)

  it('applies the loads it says, and they balance (the supports only stop rigid motion)', () => {
    // The cap's pressure force over the faceted bore (a regular 24-gon of radius a).
    expect(sc.thrust).toBeCloseTo(PIPE_DEFAULTS.pressure * sc.boreArea, 6)
    expect(sc.transverse).toBeCloseTo(PIPE_DEFAULTS.endForce, 6)
    // Statics of the whole segment (common practice): the loads sum to zero, so the six
    // restraints of a statically determinate support carry nothing.
    for (const f of sc.netLoad) expect(Math.abs(f)).toBeLessThan(1e-6 * sc.thrust)
    let reaction = 0
    for (const r of sol.reaction) reaction = Math.max(reaction, Math.abs(r))
    expect(reaction).toBeLessThan(1e-3 * PIPE_DEFAULTS.endForce)
    expect(sol.stats.converged).toBe(true)
  })

  it('a section at mid-length carries the thrust, the transverse force and its moment (free body of the free end)', () => {
    console.log(`pipe level 0: thrust ${(100 * st.axialError).toFixed(3)} %, shear ${(100 * st.shearError).toFixed(3)} %, moment ${(100 * st.momentError).toFixed(3)} %`)
    expect(st.axialError).toBeLessThan(0.01)
    // Coarse (8 layers, 3 elements through the wall): measured 0.7 % and 2.8 %; the committed
    // demo 0.3 % and 0.5 % (npm run demo prints them).
    expect(st.shearError).toBeLessThan(0.02)
    expect(st.momentError).toBeLessThan(0.05)
  })

  it('through the wall at mid-length the hoop stress matches Lamé (Timoshenko & Goodier §28)', () => {
    const lame = pipeLame(PIPE_DEFAULTS)
    console.log(`pipe level 0: membrane hoop ${st.membraneHoop.toFixed(2)} vs ${lame.hoopMembrane.toFixed(2)} MPa, bore hoop ${st.boreHoop.toFixed(2)} vs ${lame.hoopInner.toFixed(2)}, bending hoop ${st.bendingHoop.toFixed(2)} vs ${st.bendingHoopLame.toFixed(2)}`)
    // Coarse: 24 faceted elements round, 3 through the wall (the committed demo: 0.8 % and 0.2 %).
    expect(st.membraneHoopError).toBeLessThan(0.03)
    expect(st.boreHoopError).toBeLessThan(0.02)
    expect(Math.abs(st.bendingHoop - st.bendingHoopLame) / st.bendingHoopLame).toBeLessThan(0.2)
  })
})
