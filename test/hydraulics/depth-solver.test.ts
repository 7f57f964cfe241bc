/**
 * The general safeguarded solver: the meaning of its tolerance, its bracket, and its outcomes. Test functions are
 * chosen with known roots (power laws, a logistic-like crown function) so every expected value is exact.
 */
import { describe, expect, it } from 'vitest';
import { solveIncreasingRoot } from '../../language/hydraulics/index.js';
import { expectRelative } from './engineering-check.js';

describe('solveIncreasingRoot', () => {
  it('a pure power law is solved in two evaluations from any start (Newton on logarithms is exact for it)', () => {
    for (const initialDepthM of [1e-4, 0.3, 50]) {
      const outcome = solveIncreasingRoot({ evaluate: (y) => ({ value: y ** 2.5, slope: 2.5 * y ** 1.5 }), target: 32, initialDepthM, upperDepthM: undefined });
      expect(outcome.converged).toBe(true);
      if (!outcome.converged) continue;
      expectRelative({ id: 'power', source: 'y^2.5 = 32 at y = 4 (derived)', input: `start ${initialDepthM} m`, value: outcome.depthM, expected: 4, relativeTolerance: 1e-10, unit: 'm' });
      expect(outcome.evaluations).toBeLessThanOrEqual(3);
    }
  });

  it('meets its stated tolerance |F - target| <= tolerance x target and no tighter than asked', () => {
    const evaluate = (y: number): { value: number; slope: number } => ({ value: y + y ** 3, slope: 1 + 3 * y * y });
    for (const relativeTolerance of [1e-3, 1e-8, 1e-12]) {
      const outcome = solveIncreasingRoot({ evaluate, target: 10, initialDepthM: 0.1, upperDepthM: undefined, relativeTolerance });
      expect(outcome.converged).toBe(true);
      if (!outcome.converged) continue;
      expect(Math.abs(evaluate(outcome.depthM).value - 10)).toBeLessThanOrEqual(relativeTolerance * 10);
    }
  });

  it('stays inside the bracket when the slope it is given is wrong', () => {
    // A wrong (negative) derivative would send plain Newton away; bisection takes over. Root: y^3 = 27 -> 3.
    const outcome = solveIncreasingRoot({ evaluate: (y) => ({ value: y ** 3, slope: -1 }), target: 27, initialDepthM: 1, upperDepthM: 10 });
    expect(outcome.converged).toBe(true);
    if (outcome.converged) expectRelative({ id: 'bracket', source: 'y^3 = 27 (derived)', input: 'wrong slope', value: outcome.depthM, expected: 3, relativeTolerance: 1e-10, unit: 'm' });
  });

  it('uses the crown logit for a closed conduit and converges near the crown', () => {
    // F = y / (1 - y) on (0, 1): the root of F = 1e6 is 1e6 / (1e6 + 1).
    const outcome = solveIncreasingRoot({ evaluate: (y) => ({ value: y / (1 - y), slope: 1 / (1 - y) ** 2 }), target: 1e6, initialDepthM: 0.5, upperDepthM: 1, crownDepthM: 1 });
    expect(outcome.converged).toBe(true);
    if (outcome.converged) {
      expectRelative({ id: 'crown', source: 'y/(1-y) = 1e6 (derived)', input: 'crown 1 m', value: outcome.depthM, expected: 1e6 / (1e6 + 1), relativeTolerance: 1e-15, unit: 'm' });
      expect(outcome.evaluations).toBeLessThanOrEqual(3);
    }
  });

  it.each([
    { id: 'NaN target', target: Number.NaN },
    { id: 'zero target', target: 0 },
    { id: 'infinite target', target: Number.POSITIVE_INFINITY },
  ])('$id: not converged, with a reason', ({ target }) => {
    const outcome = solveIncreasingRoot({ evaluate: (y) => ({ value: y, slope: 1 }), target, initialDepthM: 1, upperDepthM: undefined });
    expect(outcome.converged).toBe(false);
    if (!outcome.converged) expect(outcome.reason).toBe('did-not-converge');
  });

  it('a function that returns NaN stops at once with a reason', () => {
    const outcome = solveIncreasingRoot({ evaluate: () => ({ value: Number.NaN, slope: 1 }), target: 1, initialDepthM: 1, upperDepthM: undefined });
    expect(outcome.converged).toBe(false);
    expect(outcome.evaluations).toBe(1);
  });

  it('a function that never reaches the target stops at the iteration cap with a reason', () => {
    const outcome = solveIncreasingRoot({ evaluate: (y) => ({ value: 1 - 1 / (1 + y), slope: 1 / (1 + y) ** 2 }), target: 2, initialDepthM: 1, upperDepthM: undefined });
    expect(outcome.converged).toBe(false);
    if (!outcome.converged) expect(Number.isFinite(outcome.lastDepthM)).toBe(true);
  });
});
