/**
 * A small run of the engine soak (.scripts/engine-soak.ts, which runs a million cases): random valid inputs across
 * every section shape, each answer checked against its defining equation with geometry and formulas written apart
 * from the engine (Manning's equation, Chow 1959 Sec. 5-6; Q^2 T = g A^3, Chow 1959 Ch. 3; equal specific force
 * across a jump, Chow 1959 Ch. 3 and 15; the standard-step energy equation, Chow 1959 Ch. 10; all "derived" in
 * /work/shared/REFERENCES.md terms: exact consequences of the published formulas), or an explicit
 * no-solution whose reason is confirmed independently. The seed is printed with any failure
 * (RUNNEL_FUZZ_SEED=<n> replays it).
 */
import { describe, expect, it } from 'vitest';
import { circleSection, parabolaSection, solveCriticalDepth, solveNormalDepth, trapezoidSection } from '../../language/hydraulics/index.js';
import { checkCase, closedForm, criticalDepthProblem, drawCase, emptyCounts, engineSection, formatReport, normalDepthProblem, randomSource, runSoak, SHAPES, type ShapeDimensions } from '../../.scripts/engine-soak.js';
import { FUZZ_SCALE, fuzzSeed } from './fuzz-settings.js';

describe('engine soak, in-suite size', () => {
  it('every answer satisfies its defining equation or is a confirmed no-solution', { timeout: 60_000 }, () => {
    const seed = fuzzSeed();
    const report = runSoak({ casesPerShape: Math.round(3_000 * FUZZ_SCALE), seed });
    expect(report.failureCount, `seed ${seed} (RUNNEL_FUZZ_SEED=${seed} replays it)\n${formatReport(report)}`).toBe(0);
    for (const shape of SHAPES) {
      const counts = report.counts[shape];
      expect(counts.normalSolved + counts.criticalSolved + counts.sequentSolved + counts.stepSolved, shape).toBeGreaterThan(0);
    }
    // The conduit draws reach past capacity, so the no-solution paths are exercised too.
    expect(report.counts.circle.normalNoSolution['exceeds-capacity'] ?? 0, formatReport(report)).toBeGreaterThan(0);
  });

  it("the closed-form geometry agrees with the engine's sections (Chow 1959, Table 2-1) at random depths", () => {
    const random = randomSource(11);
    const cases: [ShapeDimensions, ReturnType<typeof trapezoidSection>][] = [
      [{ shape: 'trapezoid', bottomWidthM: 3, leftHV: 2, rightHV: 1.5 }, trapezoidSection({ bottomWidthM: 3, leftSideSlopeHV: 2, rightSideSlopeHV: 1.5 })],
      [{ shape: 'parabola', topWidthM: 4, atDepthM: 1 }, parabolaSection({ topWidthM: 4, atDepthM: 1 })],
      [{ shape: 'circle', diameterM: 1.2 }, circleSection({ diameterM: 1.2 })],
    ];
    for (const [dimensions, section] of cases) {
      for (let index = 0; index < 200; index++) {
        const y = (dimensions.shape === 'circle' ? dimensions.diameterM : 3) * (0.001 + 0.998 * random());
        const mine = closedForm(dimensions, y);
        const label = `${dimensions.shape} at y = ${y}`;
        expect(Math.abs(mine.areaM2 / section.areaM2(y) - 1), label).toBeLessThan(1e-12);
        expect(Math.abs(mine.perimeterM / section.wettedPerimeterM(y) - 1), label).toBeLessThan(1e-12);
        expect(Math.abs(mine.topWidthM - section.topWidthM(y)), label).toBeLessThan(1e-12);
        expect(Math.abs(mine.firstMomentM3 / section.firstMomentM3(y) - 1), label).toBeLessThan(1e-10);
      }
    }
    // Circle, half full (derived: a half disc): A = pi D^2 / 8, P = pi D / 2, T = D, A ybar = D^3 / 12.
    const half = closedForm({ shape: 'circle', diameterM: 2 }, 1);
    expect(half.areaM2).toBeCloseTo(Math.PI / 2, 12);
    expect(half.perimeterM).toBeCloseTo(Math.PI, 12);
    expect(half.topWidthM).toBeCloseTo(2, 12);
    expect(half.firstMomentM3).toBeCloseTo(8 / 12, 12);
  });

  it('the checks catch a wrong answer (negative twin): depths 0.1 % off fail their equations', () => {
    const random = randomSource(3);
    for (const shape of SHAPES) {
      const soakCase = drawCase(shape, random);
      expect(checkCase(soakCase, emptyCounts()), shape).toEqual([]);
      const normal = solveNormalDepth(engineSection(soakCase.dimensions), soakCase);
      const critical = solveCriticalDepth(engineSection(soakCase.dimensions), soakCase.dischargeM3s);
      if (!normal.converged || !critical.converged) throw new Error(`${shape}: the twin needs a case with both depths`);
      expect(normalDepthProblem(soakCase, normal.depthM), shape).toBeUndefined();
      expect(normalDepthProblem(soakCase, normal.depthM * 1.001), shape).toBeDefined();
      expect(criticalDepthProblem(soakCase, critical.depthM), shape).toBeUndefined();
      expect(criticalDepthProblem(soakCase, critical.depthM * 0.999), shape).toBeDefined();
    }
  });
});
