/**
 * The standard step method on its own: each step closes the energy equation, the march agrees with the direct
 * step method and with an accurate integration of the gradually-varied-flow equation (derived), and the step
 * control keeps its promise on the depth change per step.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { GRAVITY_MS2 } from '../../../language/hydraulics/constants.js';
import {
  computeChannelProfile,
  DEFAULT_MAXIMUM_DEPTH_CHANGE_RATIO,
  describeReachFlow,
  directStepProfile,
  solveStandardStep,
  STEP_ENERGY_TOLERANCE_M,
} from '../../../language/hydraulics/profile/index.js';
import { circleSection, parabolaSection, rectangleSection, trapezoidSection, triangleSection } from '../../../language/hydraulics/sections/index.js';
import type { SectionGeometry } from '../../../language/hydraulics/sections/section-geometry.js';
import { depthAtStation, distancePerDepth, gvfDistanceM, gvfDistanceTable, stationOfDepthFromDownstream } from './reference-integration.js';

/** Energy-equation residual of one step, computed here from its definition (x positive downstream). */
function stepResidualM(section: SectionGeometry, n: number, s0: number, q: number, upstreamDepthM: number, downstreamDepthM: number, lengthM: number): number {
  const energy = (y: number): number => y + (q / section.areaM2(y)) ** 2 / (2 * GRAVITY_MS2);
  const friction = (y: number): number => {
    const a = section.areaM2(y);
    return ((q * n) / (a * (a / section.wettedPerimeterM(y)) ** (2 / 3))) ** 2;
  };
  // Upstream head = downstream head + mean friction slope x length, with the upstream bed s0 x length higher.
  return s0 * lengthM + energy(upstreamDepthM) - energy(downstreamDepthM) - 0.5 * (friction(upstreamDepthM) + friction(downstreamDepthM)) * lengthM;
}

const trapezoid = trapezoidSection({ bottomWidthM: 2, leftSideSlopeHV: 1.5, rightSideSlopeHV: 1.5 });

describe('one standard step', () => {
  it('closes the energy equation within the stated tolerance (subcritical, upstream)', () => {
    const described = describeReachFlow(trapezoid, 0.02, 0.001, 8, 1);
    if (!described.converged) throw new Error(described.message);
    for (const lengthM of [0.5, 5, 50, 500]) {
      const step = solveStandardStep(described.flow, 2.5, lengthM, 'subcritical');
      expect(step.kind).toBe('solved');
      if (step.kind !== 'solved') continue;
      expect(Math.abs(stepResidualM(trapezoid, 0.02, 0.001, 8, step.depthM, 2.5, lengthM))).toBeLessThanOrEqual(STEP_ENERGY_TOLERANCE_M * 1.001);
      expect(step.depthM).toBeLessThan(2.5); // M1: shallower upstream
    }
  });

  it('closes the energy equation on the supercritical branch (downstream)', () => {
    const described = describeReachFlow(trapezoid, 0.014, 0.03, 8, 1);
    if (!described.converged) throw new Error(described.message);
    const startM = described.flow.criticalDepthM;
    const step = solveStandardStep(described.flow, startM, 3, 'supercritical');
    expect(step.kind).toBe('solved');
    if (step.kind !== 'solved') return;
    // Downstream point is the new one here: swap roles in the residual.
    expect(Math.abs(stepResidualM(trapezoid, 0.014, 0.03, 8, startM, step.depthM, 3))).toBeLessThanOrEqual(STEP_ENERGY_TOLERANCE_M * 1.001);
    expect(step.depthM).toBeLessThan(startM);
  });

  it('reports the distance to critical depth when a step would pass it (S1 going upstream), never a depth off the branch', () => {
    const described = describeReachFlow(trapezoid, 0.014, 0.03, 8, 1);
    if (!described.converged) throw new Error(described.message);
    const yc = described.flow.criticalDepthM;
    const step = solveStandardStep(described.flow, 1.2 * yc, 1000, 'subcritical');
    expect(step.kind).toBe('passes-critical');
    if (step.kind !== 'passes-critical') return;
    // At that distance the energy equation holds with critical depth upstream (the direct step to yc).
    expect(Math.abs(stepResidualM(trapezoid, 0.014, 0.03, 8, yc, 1.2 * yc, step.distanceToCriticalM))).toBeLessThan(1e-9);
  });
});

describe('march against the direct step method and an accurate integration', () => {
  const shapes: readonly { label: string; section: SectionGeometry }[] = [
    { label: 'rectangle', section: rectangleSection({ bottomWidthM: 3 }) },
    { label: 'trapezoid', section: trapezoid },
    { label: 'triangle', section: triangleSection({ leftSideSlopeHV: 3, rightSideSlopeHV: 3 }) },
    { label: 'parabola', section: parabolaSection({ topWidthM: 4, atDepthM: 1 }) },
    { label: 'circle', section: circleSection({ diameterM: 2.5 }) },
  ];

  it.each(shapes)('$label: M1 curve depths agree with the direct step method within 0.1 % at every direct-step section', ({ section }) => {
    const q = 3;
    const n = 0.016;
    const s0 = 0.001;
    const described = describeReachFlow(section, n, s0, q, 1);
    if (!described.converged || described.flow.normalDepthM === undefined) throw new Error('set-up');
    const yn = described.flow.normalDepthM;
    const controlDepthM = section.fullDepthM === undefined ? 1.8 * yn : Math.min(1.3 * yn, 0.9 * section.fullDepthM);
    const lengthM = 3000;
    const profile = computeChannelProfile({
      reaches: [{ name: 'r', section, manningN: n, bedSlope: s0, lengthM }],
      dischargeM3s: q,
      outlet: { kind: 'water-level', elevationM: controlDepthM },
      stepControl: { maximumStepLengthM: 2 },
    });
    if (!profile.converged) throw new Error(profile.message);
    const direct = directStepProfile({ section, manningN: n, bedSlope: s0, dischargeM3s: q, startDepthM: controlDepthM, endDepthM: 1.02 * yn, increments: 400 });
    if (!direct.converged) throw new Error(direct.message);
    let compared = 0;
    let worst = { relativeDifference: 0, stationM: 0 };
    for (const point of direct.points) {
      const stationM = lengthM + point.distanceM;
      if (stationM < 0) continue;
      const depthM = depthAtStation(profile.points, stationM) ?? Number.NaN;
      const relativeDifference = Math.abs(depthM - point.depthM) / point.depthM;
      if (!(relativeDifference <= worst.relativeDifference)) worst = { relativeDifference, stationM };
      compared++;
    }
    expect(compared).toBeGreaterThan(100);
    expect(worst.relativeDifference, `worst at station ${worst.stationM.toFixed(1)} m`).toBeLessThan(0.001);
  });

  const mildChannel = fc.record({
    widthM: fc.double({ min: 0.5, max: 10, noNaN: true }),
    side: fc.double({ min: 0, max: 4, noNaN: true }),
    q: fc.double({ min: 0.2, max: 40, noNaN: true }),
    n: fc.double({ min: 0.011, max: 0.05, noNaN: true }),
    s0: fc.double({ min: 2e-4, max: 3e-3, noNaN: true }),
    backwater: fc.boolean(),
  });

  /** The channel, its control depth and the depth near normal depth where the reach starts, for a clearly mild case. */
  function mildCase(c: { widthM: number; side: number; q: number; n: number; s0: number; backwater: boolean }) {
    const section = trapezoidSection({ bottomWidthM: c.widthM, leftSideSlopeHV: c.side, rightSideSlopeHV: c.side });
    const described = describeReachFlow(section, c.n, c.s0, c.q, 1);
    if (!described.converged || described.flow.normalDepthM === undefined) return undefined;
    const yn = described.flow.normalDepthM;
    const yc = described.flow.criticalDepthM;
    if (yn < 1.2 * yc) return undefined;
    const channel = { section, manningN: c.n, bedSlope: c.s0, dischargeM3s: c.q };
    const controlDepthM = c.backwater ? 1.6 * yn : yc;
    const profile = (lengthM: number) =>
      computeChannelProfile({
        reaches: [{ name: 'r', section, manningN: c.n, bedSlope: c.s0, lengthM }],
        dischargeM3s: c.q,
        outlet: c.backwater ? { kind: 'water-level', elevationM: controlDepthM } : { kind: 'free-fall' },
      });
    return { channel, yn, yc, controlDepthM, profile };
  }

  it('property: depth at every station within 0.05 % of an accurate integration (M1 and M2, default steps; derived)', () => {
    fc.assert(
      fc.property(mildChannel, (c) => {
        const setUp = mildCase(c);
        if (setUp === undefined) return;
        const { channel, yn, yc, controlDepthM } = setUp;
        const endDepthM = c.backwater ? 1.02 * yn : 0.98 * yn;
        const distanceTo = gvfDistanceTable(channel, controlDepthM, endDepthM);
        const lengthM = -distanceTo(endDepthM);
        const profile = setUp.profile(lengthM);
        if (!profile.converged) throw new Error(profile.message);
        let worst = { relativeError: 0, stationM: 0 };
        for (const point of profile.points) {
          if (Math.abs(point.depthM - yc) < 1e-6 * yc) continue; // the control itself: dy/dx is infinite there
          // Distance error of this point against the integration, turned into a depth error by the local slope dy/dx.
          const distanceErrorM = lengthM - point.stationM + distanceTo(point.depthM);
          const relativeError = Math.abs(distanceErrorM / distancePerDepth(channel, point.depthM)) / point.depthM;
          if (relativeError > worst.relativeError) worst = { relativeError, stationM: point.stationM };
        }
        expect(worst.relativeError, `worst at station ${worst.stationM.toFixed(2)} m`).toBeLessThan(5e-4);
      }),
      { numRuns: 25 },
    );
  });

  // Over 3,770 random mild channels the worst distance error was 0.77 % (a shallow M2 curve with normal depth only
  // 1.24 times critical depth, where the distance is short and sensitive to depth) and 99 % were within 0.29 %:
  // 1 % bounds it with a margin, so a random seed cannot fail this on an accurate engine.
  it('property: distance from the control to 5 % of normal depth within 1 % of an accurate integration (derived)', () => {
    fc.assert(
      fc.property(mildChannel, (c) => {
        const setUp = mildCase(c);
        if (setUp === undefined) return;
        const { channel, yn, controlDepthM } = setUp;
        const targetDepthM = c.backwater ? 1.05 * yn : 0.95 * yn;
        const exactDistanceM = -gvfDistanceM(channel, controlDepthM, targetDepthM);
        const lengthM = 1.5 * exactDistanceM + 10;
        const profile = setUp.profile(lengthM);
        if (!profile.converged) throw new Error(profile.message);
        const stationM = stationOfDepthFromDownstream(profile.points, targetDepthM);
        expect(stationM).toBeDefined();
        const stepDistanceM = lengthM - (stationM ?? 0);
        expect(Math.abs(stepDistanceM - exactDistanceM) / exactDistanceM, `step ${stepDistanceM} m vs integration ${exactDistanceM} m`).toBeLessThan(0.01);
      }),
      { numRuns: 40 },
    );
  });
});

describe('step control', () => {
  it('no standard step changes the depth by more than the bound (2 % of the depth at its start)', () => {
    const profile = computeChannelProfile({
      reaches: [
        { name: 'mild', section: trapezoid, manningN: 0.02, bedSlope: 0.001, lengthM: 2000 },
        { name: 'steep', section: trapezoid, manningN: 0.014, bedSlope: 0.03, lengthM: 300 },
        { name: 'pool', section: trapezoid, manningN: 0.02, bedSlope: 0.0005, lengthM: 500 },
      ],
      dischargeM3s: 8,
      outlet: { kind: 'water-level', elevationM: 3 },
    });
    if (!profile.converged) throw new Error(profile.message);
    let checked = 0;
    let worstRatio = 0;
    for (const step of profile.steps) {
      if (step.kind !== 'gradually-varied') continue;
      const upstream = profile.points[step.upstreamPointIndex];
      const downstream = profile.points[step.downstreamPointIndex];
      if (!upstream || !downstream) continue;
      // The bound applies to the depth at the start of the step, which is the downstream end for subcritical steps.
      const startDepthM = upstream.regime === 'supercritical' ? upstream.depthM : downstream.depthM;
      worstRatio = Math.max(worstRatio, Math.abs(downstream.depthM - upstream.depthM) / startDepthM);
      checked++;
    }
    expect(checked).toBeGreaterThan(100);
    expect(worstRatio).toBeLessThanOrEqual(DEFAULT_MAXIMUM_DEPTH_CHANGE_RATIO * (1 + 1e-9));
  });

  it('a 10 km reach at 1 m steps has 10,000 steps when the depth barely changes', () => {
    const profile = computeChannelProfile({
      reaches: [{ name: 'canal', section: trapezoid, manningN: 0.02, bedSlope: 0.001, lengthM: 10_000 }],
      dischargeM3s: 8,
      outlet: { kind: 'normal-depth' },
      stepControl: { maximumStepLengthM: 1 },
    });
    if (!profile.converged) throw new Error(profile.message);
    expect(profile.steps.length).toBe(10_000);
  });
});
