/**
 * Safeguarded Newton iteration for depths defined by an increasing function of depth: F(y) = target, F(0) = 0.
 * This is the general entry point (a profile step or a new equation can use it); normal and critical depth use the
 * same iteration with their F evaluated inline (see depth-iteration.ts for the method, its guarantees and source).
 *
 * Tolerance: a depth is accepted when |F(y) - target| <= tolerance x target, or when the bracket around the root
 * has shrunk to two adjacent double-precision numbers with F evaluated on both sides (the root is then known to
 * machine precision even if F is too steep there for the tolerance to be met).
 */
import { DEPTH_SOLVE_RELATIVE_TOLERANCE } from './constants.js';
import { CUSTOM_FUNCTION, iterateDepth } from './depth-iteration.js';

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
  /** First depth tried, m (> 0; anything else is replaced by a default start). */
  readonly initialDepthM: number;
  /** A depth at which F >= target is known, m; undefined if F is unbounded (the bracket is then grown). */
  readonly upperDepthM: number | undefined;
  /** Crown height of a closed conduit, m: iterate on ln(y / (crown - y)) rather than ln y. */
  readonly crownDepthM?: number;
  /** Relative tolerance on F: stop when |F - target| <= tolerance x target. Default 1e-10. */
  readonly relativeTolerance?: number;
}

export type RootOutcome =
  | { readonly converged: true; readonly depthM: number; readonly iterations: number; readonly evaluations: number }
  | { readonly converged: false; readonly reason: 'did-not-converge'; readonly lastDepthM: number; readonly iterations: number; readonly evaluations: number };

/** Solves F(y) = target for y in (0, upperDepthM]; see the module comment for the tolerance and guarantees. */
export function solveIncreasingRoot(problem: IncreasingRootProblem): RootOutcome {
  const tolerance = problem.relativeTolerance ?? DEPTH_SOLVE_RELATIVE_TOLERANCE;
  const { target } = problem;
  if (!(target > 0 && Number.isFinite(target)) || !(tolerance > 0 && tolerance < 1)) {
    return { converged: false, reason: 'did-not-converge', lastDepthM: 0, iterations: 0, evaluations: 0 };
  }
  const outcome = iterateDepth(
    CUSTOM_FUNCTION,
    undefined,
    problem.evaluate,
    target,
    1 - tolerance,
    1 + tolerance,
    problem.initialDepthM,
    problem.upperDepthM ?? Number.POSITIVE_INFINITY,
    problem.crownDepthM ?? 0,
  );
  return outcome.converged
    ? { converged: true, depthM: outcome.depthM, iterations: outcome.iterations, evaluations: outcome.evaluations }
    : { converged: false, reason: 'did-not-converge', lastDepthM: outcome.depthM, iterations: outcome.iterations, evaluations: outcome.evaluations };
}
