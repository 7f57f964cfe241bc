/**
 * The iteration behind every depth solve (internal: the public entry points are solveNormalDepth,
 * solveCriticalDepth and solveIncreasingRoot). It finds y with F(y) = target for an F that increases with depth.
 *
 * Method: Newton's method on ln F against ln y (open sections) or against the logit u = ln(y / (H - y)) (closed
 * conduits of height H), kept inside a bracket [lower, upper] known to contain the root; a step that would leave
 * the bracket is replaced by a bisection (geometric in y, or in y / (H - y) under a crown), so the solve cannot
 * diverge (Press et al., Numerical Recipes, 3rd ed., Sec. 9.4, "rtsafe", here applied in log space).
 * Why logarithms: Manning conveyance and the critical-flow section factor grow almost like powers of depth, and
 * Newton on ln F versus ln y is exact for a pure power law; under a crown the section factor grows like
 * (H - y)^(-1/4), which the logit straightens in the same way.
 *
 * The hot paths (normal and critical depth) evaluate their F inline from the section, not through a callback, and
 * use F = K^3 = A^3 R^2 and F = Z^2 = A^3 / T, which need no cube or square roots; the acceptance window is
 * widened to the same power so the tolerance still reads on K or Z. Near the root the logarithm and exponential of
 * the Newton step are replaced by Pade approximants that agree to well beyond the step's own accuracy; they only
 * choose the next trial depth, never the acceptance, which is always the exact test on F.
 */
import { DEPTH_SOLVE_MAX_ITERATIONS } from './constants.js';
import {
  newHydraulicTerms,
  TERM_AREA,
  TERM_TOP_WIDTH,
  TERM_TOP_WIDTH_SLOPE,
  TERM_WETTED_PERIMETER,
  TERM_WETTED_PERIMETER_SLOPE,
  type SectionGeometry,
} from './sections/section-geometry.js';

/** F = K^3 = A^3 R^2 (Manning conveyance cubed), m^8. */
export const CONVEYANCE_CUBED = 0;
/** F = Z^2 = A^3 / T (critical-flow section factor squared), m^5. */
export const SECTION_FACTOR_SQUARED = 1;
/** F and dF/dy from a callback. */
export const CUSTOM_FUNCTION = 2;

/** The section's terms at the trial depth, filled by one call per evaluation (SectionGeometry.fillHydraulicTerms). */
const terms = newHydraulicTerms();

export type DepthEquation = typeof CONVEYANCE_CUBED | typeof SECTION_FACTOR_SQUARED | typeof CUSTOM_FUNCTION;

export interface DepthIterationOutcome {
  /** True when |F/target - 1| met the acceptance window, or the root is pinned between adjacent doubles. */
  readonly converged: boolean;
  /** The accepted depth, or the last trial depth when not converged, m. */
  readonly depthM: number;
  readonly iterations: number;
  readonly evaluations: number;
  /**
   * Why it stopped without converging: 'limit' (iteration cap), 'not-finite' (F was NaN), 'bound' (the root is
   * within one rounding step of the given upper bound, which was never confirmed by an evaluation).
   */
  readonly failure: 'limit' | 'not-finite' | 'bound' | undefined;
}

/**
 * Solves F(y) = targetValue. Accepts y when acceptLowRatio <= F(y) / targetValue <= acceptHighRatio.
 * `upperDepthM` must satisfy F(upper) >= target (Infinity for an unbounded open section); `crownDepthM` is the
 * conduit height for the logit step, or 0 for open sections. `evaluate` is used only for CUSTOM_FUNCTION.
 */
export function iterateDepth(
  equation: DepthEquation,
  section: SectionGeometry | undefined,
  evaluate: ((depthM: number) => { readonly value: number; readonly slope: number }) | undefined,
  targetValue: number,
  acceptLowRatio: number,
  acceptHighRatio: number,
  initialDepthM: number,
  upperDepthM: number,
  crownDepthM: number,
): DepthIterationOutcome {
  let lowerM = 0;
  let upperM = upperDepthM;
  let lowerRatio = 0;
  let upperRatio = Number.POSITIVE_INFINITY;
  let upperEvaluated = false;
  let depthM = initialDepthM;
  // A start at or above the bound (a conduit flow at its capacity peak, rounded up) begins just below the bound,
  // which is then the right neighbourhood; a start that is no positive number begins mid-bracket or at 1 m.
  if (!(depthM > 0)) depthM = Number.isFinite(upperM) ? upperM / 2 : 1;
  else if (!(depthM < upperM)) depthM = upperM * (1 - 1e-7);
  let evaluations = 0;
  for (let iteration = 1; iteration <= DEPTH_SOLVE_MAX_ITERATIONS; iteration++) {
    let value: number;
    let logDerivative: number; // d ln F / dy, 1/m
    if (equation === CONVEYANCE_CUBED) {
      section!.fillHydraulicTerms(depthM, terms);
      const areaM2 = terms[TERM_AREA]!;
      const perimeterM = terms[TERM_WETTED_PERIMETER]!;
      const areaTimesRadius = areaM2 * (areaM2 / perimeterM);
      value = areaTimesRadius * areaTimesRadius * areaM2;
      logDerivative = (5 * terms[TERM_TOP_WIDTH]!) / areaM2 - (2 * terms[TERM_WETTED_PERIMETER_SLOPE]!) / perimeterM;
    } else if (equation === SECTION_FACTOR_SQUARED) {
      section!.fillHydraulicTerms(depthM, terms);
      const areaM2 = terms[TERM_AREA]!;
      const topWidthM = terms[TERM_TOP_WIDTH]!;
      value = areaM2 * areaM2 * (areaM2 / topWidthM);
      logDerivative = (3 * topWidthM) / areaM2 - terms[TERM_TOP_WIDTH_SLOPE]! / topWidthM;
    } else {
      const point = evaluate!(depthM);
      value = point.value;
      logDerivative = point.slope / point.value;
    }
    evaluations++;
    const ratio = value / targetValue;
    if (ratio >= acceptLowRatio && ratio <= acceptHighRatio) {
      return { converged: true, depthM, iterations: iteration, evaluations, failure: undefined };
    }
    if (!(ratio >= 0)) return { converged: false, depthM, iterations: iteration, evaluations, failure: 'not-finite' };
    if (ratio < 1) {
      lowerM = depthM;
      lowerRatio = ratio;
    } else {
      upperM = depthM;
      upperRatio = ratio;
      upperEvaluated = true;
    }
    if (upperM - lowerM <= 2 * Number.EPSILON * upperM && Number.isFinite(upperM)) {
      // The bracket cannot shrink further in double precision: the root lies between two adjacent depths. Return
      // the end whose F is nearer the target, provided both ends were evaluated (else the root may be the bound).
      if (!upperEvaluated) return { converged: false, depthM: lowerM, iterations: iteration, evaluations, failure: 'bound' };
      const lowerIsNearer = lowerM > 0 && 1 / lowerRatio < upperRatio;
      return { converged: true, depthM: lowerIsNearer ? lowerM : upperM, iterations: iteration, evaluations, failure: undefined };
    }
    // Newton step on ln F: ln F + s dx = ln target, with x = ln y (open) or x = logit (closed).
    const logRatio = naturalLogNearOne(ratio);
    let nextM: number;
    if (crownDepthM === 0) {
      nextM = depthM * exponentialNearZero(-logRatio / (depthM * logDerivative));
    } else {
      const gapM = crownDepthM - depthM;
      const logitStep = -logRatio / ((logDerivative * depthM * gapM) / crownDepthM);
      nextM = crownDepthM / (1 + (gapM / depthM) * exponentialNearZero(-logitStep));
    }
    // A step of a few rounding units or less means F is resolved no better than its rounding here (a surface a hair
    // below a crown): step a few units towards the root instead, so the next evaluation can land on its far side
    // and pin the root between adjacent doubles rather than creeping along one side.
    const minimumStepM = 4 * Number.EPSILON * depthM;
    if (Math.abs(nextM - depthM) < minimumStepM) nextM = ratio < 1 ? depthM + minimumStepM : depthM - minimumStepM;
    if (!(nextM > lowerM && nextM < upperM)) {
      // Safeguard. Grow an open bracket; otherwise bisect it (geometrically when both ends are positive).
      if (!Number.isFinite(upperM)) nextM = 4 * Math.max(depthM, lowerM);
      else if (lowerM === 0) nextM = upperM / 4;
      else if (crownDepthM === 0 || upperM < crownDepthM) nextM = Math.sqrt(lowerM * upperM);
      else nextM = crownDepthM - (crownDepthM - lowerM) / 4; // upper is the crown itself: close in geometrically
      if (!(nextM > lowerM && nextM < upperM)) nextM = lowerM + (upperM - lowerM) / 2;
    }
    depthM = nextM;
  }
  return { converged: false, depthM, iterations: DEPTH_SOLVE_MAX_ITERATIONS, evaluations, failure: 'limit' };
}

/** ln r; near r = 1 by the series 2 artanh(w), w = (r - 1)/(r + 1), to w^5 (relative error below 5e-6 there). */
function naturalLogNearOne(ratio: number): number {
  if (ratio > 0.7 && ratio < 1.4) {
    const w = (ratio - 1) / (ratio + 1);
    const w2 = w * w;
    return 2 * w * (1 + w2 * (1 / 3 + w2 / 5));
  }
  return Math.log(ratio);
}

/** e^x; for |x| < 0.25 by the (2,2) Pade approximant (relative error below 2e-6 there). */
function exponentialNearZero(x: number): number {
  if (x > -0.25 && x < 0.25) {
    const x2 = x * x;
    return (12 + 6 * x + x2) / (12 - 6 * x + x2);
  }
  return Math.exp(x);
}
