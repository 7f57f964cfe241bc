/**
 * Two small scalar solvers used at junctions and jumps, where a few dozen evaluations do not matter but a
 * guarantee does: a bracketed root (false position with the Illinois modification, Dowell and Jarratt 1971,
 * which keeps the bracket and converges superlinearly) and golden-section minimisation of a unimodal function
 * (Press et al., Numerical Recipes, 3rd ed., Sec. 10.2).
 */

export type BracketedRootOutcome =
  | { readonly converged: true; readonly x: number; readonly value: number; readonly iterations: number }
  | { readonly converged: false; readonly x: number; readonly value: number; readonly iterations: number };

/**
 * Finds x in [a, b] with f(x) = 0, given f(a) and f(b) of opposite signs (or one of them zero). Stops when
 * |f(x)| <= valueTolerance or the bracket is shorter than xTolerance.
 */
export function solveBracketedRoot(
  f: (x: number) => number,
  a: number,
  b: number,
  valueTolerance: number,
  xTolerance: number,
  maxIterations = 200,
): BracketedRootOutcome {
  let lowX = a;
  let highX = b;
  let lowValue = f(lowX);
  let highValue = f(highX);
  if (Math.abs(lowValue) <= valueTolerance) return { converged: true, x: lowX, value: lowValue, iterations: 0 };
  if (Math.abs(highValue) <= valueTolerance) return { converged: true, x: highX, value: highValue, iterations: 0 };
  if (lowValue * highValue > 0) return { converged: false, x: lowX, value: lowValue, iterations: 0 };
  let side = 0;
  let x = lowX;
  let value = lowValue;
  for (let iteration = 1; iteration <= maxIterations; iteration++) {
    x = (lowX * highValue - highX * lowValue) / (highValue - lowValue);
    // Fall back to bisection when false position stalls at an end of the bracket.
    if (!(x > Math.min(lowX, highX) && x < Math.max(lowX, highX))) x = 0.5 * (lowX + highX);
    value = f(x);
    if (Math.abs(value) <= valueTolerance || Math.abs(highX - lowX) <= xTolerance) return { converged: true, x, value, iterations: iteration };
    if (value * highValue < 0) {
      lowX = highX;
      lowValue = highValue;
      highX = x;
      highValue = value;
      side = 0;
    } else {
      highX = x;
      highValue = value;
      // Illinois: halve the retained end's value when the same end is kept twice running.
      if (side === -1) lowValue *= 0.5;
      side = -1;
    }
  }
  return { converged: Math.abs(highX - lowX) <= xTolerance, x, value, iterations: maxIterations };
}

/** Minimiser of a unimodal f on [a, b] to within (b - a) * 0.618^iterations; returns x of the smallest value. */
export function minimiseUnimodal(f: (x: number) => number, a: number, b: number, iterations = 80): number {
  const inverseGolden = (Math.sqrt(5) - 1) / 2;
  let lowX = a;
  let highX = b;
  let leftX = highX - inverseGolden * (highX - lowX);
  let rightX = lowX + inverseGolden * (highX - lowX);
  let leftValue = f(leftX);
  let rightValue = f(rightX);
  for (let iteration = 0; iteration < iterations; iteration++) {
    if (leftValue <= rightValue) {
      highX = rightX;
      rightX = leftX;
      rightValue = leftValue;
      leftX = highX - inverseGolden * (highX - lowX);
      leftValue = f(leftX);
    } else {
      lowX = leftX;
      leftX = rightX;
      leftValue = rightValue;
      rightX = lowX + inverseGolden * (highX - lowX);
      rightValue = f(rightX);
    }
  }
  // The ends themselves may be the minimum (a monotone f on the interval).
  const candidates = [a, b, leftX, rightX];
  let bestX = a;
  let bestValue = Number.POSITIVE_INFINITY;
  for (const x of candidates) {
    const value = f(x);
    if (value < bestValue) {
      bestValue = value;
      bestX = x;
    }
  }
  return bestX;
}
