/**
 * Safeguarded Newton iteration for depths defined by an increasing function of depth: F(y) = target, F(0) = 0.
 *
 * Why Newton on logarithms: Manning conveyance A R^(2/3) and the critical-flow section factor A sqrt(A/T) grow
 * almost like powers of depth (exponent 5/3 to 8/3 for open shapes). Newton's method on ln F against ln y is exact
 * for a pure power law and converges quadratically otherwise, so few evaluations are needed from any start.
 * For a closed conduit of height H the step is taken on the logit u = ln(y / (H - y)) instead, which also
 * straightens the growth of the section factor as the surface narrows to the crown (Z ~ (H - y)^(-1/4)).
 * The iterate is always kept inside a bracket [lower, upper] known to contain the root; a step that leaves it is
 * replaced by bisection (geometric when the bracket is positive), so the solve cannot diverge (Press et al.,
 * Numerical Recipes, 3rd ed., Sec. 9.4, "rtsafe", applied here in log space).
 */
import { DEPTH_SOLVE_MAX_ITERATIONS, DEPTH_SOLVE_RELATIVE_TOLERANCE } from './constants.js';

export interface ValueAndSlope {
  /** F(y), any positive unit. */
  readonly value: number;
  /** dF/dy in the same unit per metre. */
  readonly slope: number;
}

export interface IncreasingRootProblem {
  /** Evaluates F and dF/dy at depth y (m), y > 0. */
  readonly evaluate: (depthM: number) => ValueAndSlope;
  /** The target value of F (> 0). */
  readonly target: number;
  /** First depth tried, m (> 0). */
  readonly initialDepthM: number;
  /** A depth at which F >= target is known, m; undefined if F is unbounded (the bracket is then grown). */
  readonly upperDepthM: number | undefined;
  /** Crown height of a closed conduit, m: iterate on ln(y / (crown - y)) rather than ln y. */
  readonly crownDepthM?: number;
  /** Relative tolerance on F: stop when |F - target| <= tolerance x target. */
  readonly relativeTolerance?: number;
}

export type RootOutcome =
  | { readonly converged: true; readonly depthM: number; readonly iterations: number; readonly evaluations: number }
  | { readonly converged: false; readonly reason: 'did-not-converge'; readonly lastDepthM: number; readonly iterations: number; readonly evaluations: number };

/** Solves F(y) = target for y in (0, upperDepthM]; see the module comment for the method and its guarantees. */
export function solveIncreasingRoot(problem: IncreasingRootProblem): RootOutcome {
  const tolerance = problem.relativeTolerance ?? DEPTH_SOLVE_RELATIVE_TOLERANCE;
  const { target, evaluate } = problem;
  let lowerM = 0;
  let upperM = problem.upperDepthM ?? Number.POSITIVE_INFINITY;
  let depthM = Math.min(problem.initialDepthM, upperM);
  let evaluations = 0;
  const crownM = problem.crownDepthM;
  for (let iteration = 1; iteration <= DEPTH_SOLVE_MAX_ITERATIONS; iteration++) {
    const { value, slope } = evaluate(depthM);
    evaluations++;
    const residual = value - target;
    if (Math.abs(residual) <= tolerance * target) {
      return { converged: true, depthM, iterations: iteration, evaluations };
    }
    if (residual < 0) lowerM = depthM;
    else upperM = depthM;
    const logResidual = Math.log(value / target);
    let nextM = Number.NaN;
    if (crownM === undefined) {
      // Newton step on ln F versus ln y: ln y_next = ln y - (ln F - ln target) / (d ln F / d ln y).
      const logSlope = (depthM * slope) / value;
      if (value > 0 && logSlope > 0 && Number.isFinite(logSlope)) nextM = depthM * Math.exp(-logResidual / logSlope);
    } else {
      // Newton step on ln F versus u = ln(y / (H - y)); dy/du = y (H - y) / H.
      const logitSlope = (slope / value) * ((depthM * (crownM - depthM)) / crownM);
      if (value > 0 && logitSlope > 0 && Number.isFinite(logitSlope)) {
        const nextLogit = Math.log(depthM / (crownM - depthM)) - logResidual / logitSlope;
        nextM = crownM / (1 + Math.exp(-nextLogit));
      }
    }
    if (!(nextM > lowerM && nextM < upperM)) {
      // Safeguard: bisect the bracket (geometrically when both ends are positive; grow an open bracket).
      if (!Number.isFinite(upperM)) nextM = Math.max(depthM, lowerM) * 4;
      else if (lowerM > 0) nextM = Math.sqrt(lowerM * upperM);
      else nextM = upperM / 4;
    }
    if (Number.isFinite(upperM) && upperM - lowerM <= Number.EPSILON * upperM) {
      // The bracket cannot shrink further in double precision: the root is here to machine accuracy.
      return { converged: true, depthM: nextM, iterations: iteration, evaluations };
    }
    depthM = nextM;
  }
  return { converged: false, reason: 'did-not-converge', lastDepthM: depthM, iterations: DEPTH_SOLVE_MAX_ITERATIONS, evaluations };
}
