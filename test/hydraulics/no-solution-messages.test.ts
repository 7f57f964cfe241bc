/**
 * Regression checks for inputs at the edge of double precision, found by the fuzzing of test/robustness: a
 * no-solution result must explain itself in words, never with "Infinity" or "NaN" in the sentence shown to users.
 */
import { describe, expect, it } from 'vitest';
import { rectangleSection, solveCriticalDepth, solveNormalDepth, trapezoidSection } from '../../language/hydraulics/index.js';

const CUBIC_FOOT_M3 = 0.3048 ** 3; // exact, NIST SP 811

describe('no-solution messages stay readable at the edge of double precision', () => {
  it('a section far too narrow to compute with (width 1e-300 ft) gives a message without Infinity or NaN', () => {
    const section = rectangleSection({ bottomWidthM: 3.048e-301 });
    const critical = solveCriticalDepth(section, 38 * CUBIC_FOOT_M3);
    const normal = solveNormalDepth(section, { dischargeM3s: 38 * CUBIC_FOOT_M3, manningN: 0.03, bedSlope: 0.01 });
    for (const result of [critical, normal]) {
      if (!result.converged) expect(result.message).not.toMatch(/Infinity|NaN/);
    }
    expect(critical.converged && normal.converged, 'a 1e-300 m wide channel cannot carry 1 m3/s at a finite depth').toBe(false);
  });

  it("a Manning's n of 1.8e308 is refused in words, not with an infinite conveyance", () => {
    const result = solveNormalDepth(trapezoidSection({ bottomWidthM: 2, leftSideSlopeHV: 2, rightSideSlopeHV: 2 }), {
      dischargeM3s: 1,
      manningN: 1.7976931348623157e308,
      bedSlope: 0.01,
    });
    expect(result.converged).toBe(false);
    if (!result.converged) expect(result.message).not.toMatch(/Infinity|NaN/);
  });
});
