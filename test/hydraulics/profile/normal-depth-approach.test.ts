/**
 * Far from a control, in a long prismatic mild reach, the profile tends to normal depth (Chow 1959, Ch. 9: normal
 * depth is the asymptote of M1 and M2 curves; a closed result of the gradually-varied-flow equation).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeChannelProfile } from '../../../language/hydraulics/profile/index.js';
import { rectangleSection, trapezoidSection, triangleSection } from '../../../language/hydraulics/sections/index.js';
import { solveCriticalDepth } from '../../../language/hydraulics/critical-flow.js';
import { solveNormalDepth } from '../../../language/hydraulics/uniform-flow.js';
import { FOOT_M, nReproducingK149 } from './reference-integration.js';

describe('profile tends to normal depth far upstream of a control', () => {
  // N1: Chow (1959) Ch. 6 uniform-flow example (Example 6-2 as recalled): trapezoid b = 20 ft, z = 2, n = 0.025,
  // S = 0.0016, Q = 400 cfs; yn = 3.36 ft with k = 1.49 (from memory; recomputes exactly). Tolerance 0.5 %.
  const section = trapezoidSection({ bottomWidthM: 20 * FOOT_M, leftSideSlopeHV: 2, rightSideSlopeHV: 2 });
  const published = 3.36 * FOOT_M;
  for (const outlet of [{ kind: 'water-level', elevationM: 6 * FOOT_M }, { kind: 'free-fall' }] as const) {
    it(`N1 channel, ${outlet.kind} outlet: depth 20,000 ft upstream is the published normal depth 3.36 ft (from memory, 0.5 %)`, () => {
      const result = computeChannelProfile({
        reaches: [{ name: 'N1', section, manningN: nReproducingK149(0.025), bedSlope: 0.0016, lengthM: 20_000 * FOOT_M }],
        dischargeM3s: 400 * FOOT_M ** 3,
        outlet,
      });
      if (!result.converged) throw new Error(result.message);
      const upstreamDepthM = result.points[0]?.depthM ?? 0;
      expect(Math.abs(upstreamDepthM - published) / published).toBeLessThan(0.005);
    });
  }

  it('property: in a reach 40 yn/S0 long the upstream depth equals normal depth within 1e-6, approached monotonically', () => {
    fc.assert(
      fc.property(
        fc.constantFrom('rectangle', 'trapezoid', 'triangle'),
        fc.double({ min: 0.5, max: 8, noNaN: true }),
        fc.double({ min: 0.1, max: 30, noNaN: true }),
        fc.double({ min: 0.012, max: 0.05, noNaN: true }),
        fc.double({ min: 1e-4, max: 4e-3, noNaN: true }),
        fc.double({ min: 0.3, max: 2.5, noNaN: true }),
        (shape, size, q, n, s0, controlRatio) => {
          const section =
            shape === 'rectangle'
              ? rectangleSection({ bottomWidthM: size })
              : shape === 'trapezoid'
                ? trapezoidSection({ bottomWidthM: size, leftSideSlopeHV: 2, rightSideSlopeHV: 2 })
                : triangleSection({ leftSideSlopeHV: size, rightSideSlopeHV: size });
          const normal = solveNormalDepth(section, { dischargeM3s: q, manningN: n, bedSlope: s0 });
          const critical = solveCriticalDepth(section, q);
          if (!normal.converged || !critical.converged || normal.depthM < 1.1 * critical.depthM) return;
          const yn = normal.depthM;
          const lengthM = (40 * yn) / s0;
          const result = computeChannelProfile({
            reaches: [{ name: 'long reach', section, manningN: n, bedSlope: s0, lengthM }],
            dischargeM3s: q,
            outlet: { kind: 'water-level', elevationM: controlRatio * yn },
            stepControl: { maximumStepLengthM: lengthM / 200 },
          });
          if (!result.converged) throw new Error(result.message);
          const depths = result.points.map((point) => point.depthM);
          expect(Math.abs((depths[0] ?? 0) - yn) / yn).toBeLessThan(1e-6);
          // Monotone (points run downstream): an M2 drawdown falls towards the control, an M1 curve rises towards it.
          // Changes the wrong way below a micrometre per metre of depth are the noise of steps solved to 1e-9 m of energy.
          const drawdown = (depths[depths.length - 1] ?? 0) < yn;
          let monotone = true;
          for (let i = 1; i < depths.length; i++) {
            const change = (depths[i] ?? 0) - (depths[i - 1] ?? 0);
            if (drawdown ? change > 1e-6 * yn : change < -1e-6 * yn) monotone = false;
          }
          expect(monotone).toBe(true);
        },
      ),
      { numRuns: 60 },
    );
  });
});
