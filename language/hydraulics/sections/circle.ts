/**
 * Circular conduit flowing partly full, diameter D (m). With s = y/D and theta the central angle of the wetted arc
 * (radians), theta = 2 acos(1 - 2s) = 4 asin(sqrt(s)): A = D^2 (theta - sin theta) / 8, P = D theta / 2,
 * T = 2 sqrt(y (D - y)) (Chow 1959, Table 2-1). The first moment of the area about the surface is
 * A (y - D/2) + T^3 / 12, from the centroid of a circular segment at 4 r sin^3(theta/2) / (3 (theta - sin theta))
 * below the centre, with D sin(theta/2) = T. Depths above D are clamped to D.
 *
 * Rounding: theta is taken from asin of sqrt(s) below half depth and of sqrt(1 - s) above it, with 1 - s formed
 * as (D - y)/D, so neither a shallow flow nor a surface a hair below the crown loses digits; theta - sin theta uses
 * its Taylor series for small theta, and the first moment its series in s for s < 0.02, where the two terms of the
 * closed form nearly cancel. Without this a 1e-8 D deep flow would carry errors near 1e-9 in its area.
 *
 * Solver hints: every circle is the same shape scaled by D, so the depth solvers start from a dimensionless table
 * (built once when the module loads) of ln K/D^(8/3) and ln Z/D^(5/2) against the logit u = ln(s / (1 - s)),
 * read backwards by cubic Hermite interpolation. The conveyance peak (s = 0.9382) is found on the same table.
 */
import {
  positiveLengthProblem,
  TERM_AREA,
  TERM_TOP_WIDTH,
  TERM_TOP_WIDTH_SLOPE,
  TERM_WETTED_PERIMETER,
  TERM_WETTED_PERIMETER_SLOPE,
  type ConduitConveyance,
  type SectionGeometry,
  type SectionSolverHints,
} from './section-geometry.js';

export interface CircleDimensions {
  readonly diameterM: number;
}

export function circleSection({ diameterM }: CircleDimensions): SectionGeometry {
  const dimensionProblem = positiveLengthProblem('diameter', diameterM);
  const clamp = (y: number): number => (y > 0 ? (y < diameterM ? y : diameterM) : 0);
  // The central angle of the wetted arc at depth y, and P = D theta / 2 from it.
  const wettedAngle = (y: number): number => centralAngle(clamp(y) / diameterM, (diameterM - clamp(y)) / diameterM);
  const perimeterOfAngle = (theta: number): number => (diameterM * theta) / 2;
  const topWidthM = (y: number): number => {
    const depthM = clamp(y);
    return 2 * Math.sqrt(depthM * (diameterM - depthM));
  };
  // dP/dy = (D/2) dtheta/dy = D / sqrt(y (D - y)).
  const wettedPerimeterSlope = (y: number): number => {
    const depthM = clamp(y);
    return diameterM / Math.sqrt(depthM * (diameterM - depthM));
  };
  // T = 2 sqrt(y (D - y)), so dT/dy = (D - 2y) / sqrt(y (D - y)).
  const topWidthSlope = (y: number): number => {
    const depthM = clamp(y);
    const gapM = diameterM - depthM;
    return (gapM - depthM) / Math.sqrt(depthM * gapM);
  };
  return {
    shape: 'circle',
    description: `circular conduit, diameter ${Number(diameterM.toPrecision(4))} m`,
    fullDepthM: diameterM,
    areaM2: (y) => diameterM * diameterM * unitAreaOfAngle(wettedAngle(y)),
    wettedPerimeterM: (y) => perimeterOfAngle(wettedAngle(y)),
    topWidthM,
    firstMomentM3: (y) => diameterM ** 3 * unitFirstMoment(clamp(y) / diameterM, (diameterM - clamp(y)) / diameterM),
    wettedPerimeterSlope,
    topWidthSlope,
    // The central angle once for area and perimeter.
    fillHydraulicTerms: (y, terms) => {
      const theta = wettedAngle(y);
      terms[TERM_AREA] = diameterM * diameterM * unitAreaOfAngle(theta);
      terms[TERM_WETTED_PERIMETER] = perimeterOfAngle(theta);
      terms[TERM_TOP_WIDTH] = topWidthM(y);
      terms[TERM_WETTED_PERIMETER_SLOPE] = wettedPerimeterSlope(y);
      terms[TERM_TOP_WIDTH_SLOPE] = topWidthSlope(y);
    },
    dimensionProblem,
    solverHints: dimensionProblem === undefined ? circleHints(diameterM) : undefined,
  };
}

// ---------------------------------------------------------------------------------------------------------------
// Dimensionless geometry of the unit circle (D = 1), in s = y/D and its complement gap = 1 - s.

/** Central angle of the wetted arc, radians. */
function centralAngle(s: number, gap: number): number {
  return s <= 0.5 ? 4 * Math.asin(Math.sqrt(s)) : 2 * Math.PI - 4 * Math.asin(Math.sqrt(gap));
}

/** theta - sin theta; by its Taylor series below 0.6 rad (terms to theta^17, relative error below 1e-16). */
function angleMinusSine(theta: number): number {
  if (theta >= 0.6) return theta - Math.sin(theta);
  const t2 = theta * theta;
  // Sum over k of (-1)^k theta^(2k+3) / (2k+3)!.
  const series =
    1 / 6 - t2 * (1 / 120 - t2 * (1 / 5040 - t2 * (1 / 362880 - t2 * (1 / 39916800 - t2 * (1 / 6227020800 - t2 / 1307674368000)))));
  return theta * t2 * series;
}

/** A / D^2. */
function unitArea(s: number, gap: number): number {
  return unitAreaOfAngle(centralAngle(s, gap));
}

/** A / D^2 for a central angle theta: (theta - sin theta) / 8. */
function unitAreaOfAngle(theta: number): number {
  return angleMinusSine(theta) / 8;
}

/** Coefficients of (1 - x)^(1/2) = sum a_k x^k divided by (k + 3/2)(k + 5/2), for the first-moment series. */
const FIRST_MOMENT_SERIES: readonly number[] = (() => {
  const coefficients: number[] = [];
  let binomial = 1;
  for (let k = 0; k < 10; k++) {
    if (k > 0) binomial *= (k - 1.5) / k;
    coefficients.push(binomial / ((k + 1.5) * (k + 2.5)));
  }
  return coefficients;
})();

/**
 * First moment of the area about the surface / D^3. For small s the closed form A (s - 1/2) + T^3/12 subtracts two
 * nearly equal numbers, so there it is integrated term by term instead: M = int_0^y T(eta) (y - eta) d eta with
 * T = 2 sqrt(eta) sqrt(D - eta) expanded in eta/D gives M/D^3 = 2 s^(5/2) sum a_k s^k / ((k + 3/2)(k + 5/2)).
 */
function unitFirstMoment(s: number, gap: number): number {
  if (s < 0.02) {
    let sum = 0;
    for (let k = FIRST_MOMENT_SERIES.length - 1; k >= 0; k--) sum = sum * s + FIRST_MOMENT_SERIES[k]!;
    return 2 * s * s * Math.sqrt(s) * sum;
  }
  const unitTopWidth = 2 * Math.sqrt(s * gap);
  return unitArea(s, gap) * (s - 0.5) + (unitTopWidth * unitTopWidth * unitTopWidth) / 12;
}

/** ln of K / D^(8/3) and its derivative with respect to u = ln(s / (1 - s)). */
function unitLogConveyance(u: number): { readonly value: number; readonly slope: number } {
  const { s, gap } = logisticSplit(u);
  const area = unitArea(s, gap);
  const perimeter = centralAngle(s, gap) / 2;
  const topWidth = 2 * Math.sqrt(s * gap);
  const perimeterSlope = 1 / Math.sqrt(s * gap);
  return {
    value: (5 / 3) * Math.log(area) - (2 / 3) * Math.log(perimeter),
    slope: ((5 * topWidth) / (3 * area) - (2 * perimeterSlope) / (3 * perimeter)) * s * gap,
  };
}

/** ln of Z / D^(5/2) (Z = A sqrt(A/T)) and its derivative with respect to u. */
function unitLogSectionFactor(u: number): { readonly value: number; readonly slope: number } {
  const { s, gap } = logisticSplit(u);
  const area = unitArea(s, gap);
  const topWidth = 2 * Math.sqrt(s * gap);
  const topWidthSlope = (gap - s) / Math.sqrt(s * gap);
  return {
    value: 1.5 * Math.log(area) - 0.5 * Math.log(topWidth),
    slope: ((1.5 * topWidth) / area - (0.5 * topWidthSlope) / topWidth) * s * gap,
  };
}

/** s = 1 / (1 + e^-u) and 1 - s, each without cancellation. */
function logisticSplit(u: number): { readonly s: number; readonly gap: number } {
  const e = Math.exp(-Math.abs(u));
  return u >= 0 ? { s: 1 / (1 + e), gap: e / (1 + e) } : { s: e / (1 + e), gap: 1 / (1 + e) };
}

// ---------------------------------------------------------------------------------------------------------------
// Tables for the solver starts, built once.

/** Logit range of the tables: s from 1.1e-7 up to 1 - 3e-17 (beyond, the ends are extended along their slopes). */
const TABLE_LOWEST_LOGIT = -16;
const TABLE_HIGHEST_LOGIT = 38;
const TABLE_STEP = 0.25;

interface InverseTable {
  readonly logits: Float64Array;
  readonly values: Float64Array;
  readonly slopes: Float64Array;
}

function buildTable(evaluate: (u: number) => { readonly value: number; readonly slope: number }, lowestLogit: number, highestLogit: number): InverseTable {
  const count = Math.ceil((highestLogit - lowestLogit) / TABLE_STEP) + 1;
  const step = (highestLogit - lowestLogit) / (count - 1);
  const logits = new Float64Array(count);
  const values = new Float64Array(count);
  const slopes = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    const u = i === count - 1 ? highestLogit : lowestLogit + i * step;
    const point = evaluate(u);
    logits[i] = u;
    values[i] = point.value;
    slopes[i] = point.slope;
  }
  return { logits, values, slopes };
}

/** Logit at which the unit circle's conveyance peaks: d ln K / du = 0, by bisection to rounding. */
const PEAK_LOGIT = (() => {
  let lower = 1;
  let upper = 4;
  for (let step = 0; step < 200 && upper - lower > 1e-15; step++) {
    const middle = (lower + upper) / 2;
    if (unitLogConveyance(middle).slope > 0) lower = middle;
    else upper = middle;
  }
  return (lower + upper) / 2;
})();
const PEAK_DEPTH_RATIO = logisticSplit(PEAK_LOGIT).s;
const PEAK_LOG_CONVEYANCE = unitLogConveyance(PEAK_LOGIT).value;
/** -(1/2) d2 ln K / du2 at the peak, so that ln K = peak - c (u - u_peak)^2 near it. */
const PEAK_CURVATURE = (() => {
  const delta = 1e-4;
  return -(unitLogConveyance(PEAK_LOGIT + delta).slope - unitLogConveyance(PEAK_LOGIT - delta).slope) / (4 * delta);
})();
/** K / D^(8/3) flowing full: (pi/4) (1/4)^(2/3). */
const FULL_UNIT_CONVEYANCE = (Math.PI / 4) * Math.cbrt(1 / 16);

const CONVEYANCE_TABLE = buildTable(unitLogConveyance, TABLE_LOWEST_LOGIT, PEAK_LOGIT);
const SECTION_FACTOR_TABLE = buildTable(unitLogSectionFactor, TABLE_LOWEST_LOGIT, TABLE_HIGHEST_LOGIT);

/** Largest i with values[i] <= x (values increasing), clamped to [0, length - 2]. */
function intervalIndex(values: Float64Array, x: number): number {
  let low = 0;
  let high = values.length - 2;
  while (low < high) {
    const middle = (low + high + 1) >> 1;
    if (values[middle]! <= x) low = middle;
    else high = middle - 1;
  }
  return low;
}

/** Cubic Hermite interpolation of u between (x0, u0, du/dx = d0) and (x1, u1, d1) at x. */
function hermite(x: number, x0: number, x1: number, u0: number, u1: number, d0: number, d1: number): number {
  const h = x1 - x0;
  const t = (x - x0) / h;
  const t2 = t * t;
  const t3 = t2 * t;
  return (2 * t3 - 3 * t2 + 1) * u0 + (t3 - 2 * t2 + t) * h * d0 + (-2 * t3 + 3 * t2) * u1 + (t3 - t2) * h * d1;
}

/** The logit at which ln(Z / D^(5/2)) = x. */
function sectionFactorLogit(x: number): number {
  const { logits, values, slopes } = SECTION_FACTOR_TABLE;
  const last = values.length - 1;
  if (x <= values[0]!) return logits[0]! + (x - values[0]!) / slopes[0]!;
  if (x >= values[last]!) return logits[last]! + (x - values[last]!) / slopes[last]!;
  const i = intervalIndex(values, x);
  return hermite(x, values[i]!, values[i + 1]!, logits[i]!, logits[i + 1]!, 1 / slopes[i]!, 1 / slopes[i + 1]!);
}

/** The logit at which ln(K / D^(8/3)) = x on the rising branch (x at most the peak value). */
function conveyanceLogit(x: number): number {
  const { logits, values, slopes } = CONVEYANCE_TABLE;
  const last = values.length - 1; // the peak
  if (x <= values[0]!) return logits[0]! + (x - values[0]!) / slopes[0]!;
  if (x >= PEAK_LOG_CONVEYANCE) return PEAK_LOGIT;
  const i = intervalIndex(values, x);
  if (i < last - 1) return hermite(x, values[i]!, values[i + 1]!, logits[i]!, logits[i + 1]!, 1 / slopes[i]!, 1 / slopes[i + 1]!);
  // Last interval: du/dx is infinite at the peak, but u is smooth in w = sqrt(peak - x), with du/dw = -1/sqrt(c)
  // at the peak and du/dw = -2 w / (dx/du) at the interval's lower end.
  const lowerGap = Math.sqrt(PEAK_LOG_CONVEYANCE - values[i]!);
  const gap = Math.sqrt(PEAK_LOG_CONVEYANCE - x);
  return hermite(gap, lowerGap, 0, logits[i]!, PEAK_LOGIT, (-2 * lowerGap) / slopes[i]!, -1 / Math.sqrt(PEAK_CURVATURE));
}

function circleHints(diameterM: number): SectionSolverHints {
  const logDiameter = Math.log(diameterM);
  const conduitConveyance: ConduitConveyance = {
    peakDepthM: PEAK_DEPTH_RATIO * diameterM,
    peakConveyanceM83: Math.exp(PEAK_LOG_CONVEYANCE + (8 / 3) * logDiameter),
    fullConveyanceM83: FULL_UNIT_CONVEYANCE * Math.exp((8 / 3) * logDiameter),
  };
  // A start that rounds to the crown itself is moved one rounding step below it (the solver needs 0 < y < D).
  const belowCrown = (depthM: number): number => (depthM < diameterM ? depthM : diameterM * (1 - Number.EPSILON));
  return {
    conduitConveyance,
    normalDepthEstimateM: (conveyanceM83) => diameterM * logisticSplit(conveyanceLogit(Math.log(conveyanceM83) - (8 / 3) * logDiameter)).s,
    criticalDepthEstimateM: (sectionFactorM52) =>
      belowCrown(diameterM * logisticSplit(sectionFactorLogit(Math.log(sectionFactorM52) - 2.5 * logDiameter)).s),
  };
}
