/**
 * Engine soak: millions of random valid inputs across every section shape, each answer checked against its
 * defining equation written out here, apart from the engine. Every check is an exact consequence of a published
 * formula (confidence "derived" in /work/shared/REFERENCES.md: uniform flow N8's Manning form, critical flow C5/C6's
 * condition, the hydraulic-jump momentum function, the standard step of Chow's Ch. 10):
 *
 * - normal depth: Manning's equation in SI, Q = (1/n) A R^(2/3) S^(1/2) (Chow 1959, Sec. 5-6), |Q(y)/Q - 1| <= 1e-9;
 *   the "lower of two depths" flag set exactly when Q lies above the full-pipe discharge;
 * - critical depth: Q^2 T = g A^3 (Chow 1959, Ch. 3), |Q^2 T / (g A^3) - 1| <= 1e-9, or, within rounding of a conduit
 *   crown, the target between the section factors of the two neighbouring doubles (the engine's stated exception);
 * - critical slope: Manning's discharge at the critical depth on that slope equals Q, |.| <= 1e-9;
 * - sequent depth of a hydraulic jump: equal specific force Q^2/(g A) + A ybar on both sides (Chow 1959, Ch. 3 and
 *   15), |M2/M1 - 1| <= 1e-9, the two depths on opposite sides of critical depth;
 * - one standard step (Chow 1959, Ch. 10): E(y) - E1 + s (S0 - (Sf1 + Sf(y))/2) dx = 0 to 1e-8 m, or, where the
 *   step says the profile reaches critical depth first, the same equation holding at critical depth over the
 *   distance it reports.
 *
 * Anything else must be an explicit no-solution whose reason is true here: a flow above a conduit's largest
 * uniform-flow discharge, a critical depth at a conduit's crown, a jump that would fill a conduit, a subcritical
 * step that would rise above a crown. An exception, a NaN, an answer off its equation, or a no-solution whose reason
 * does not hold is a failure; "did not converge" on these valid inputs is counted as unresolved (also a failure).
 *
 * Geometry is written out here too (Chow 1959, Table 2-1; the parabola's wetted perimeter as the exact arc length
 * of y = a x^2). Ranges (SI, log-uniform where they span decades): discharge 1e-4 to 1e4 m3/s; n 0.008 to 0.2;
 * bed slope 1e-6 to 0.5; widths 0.05 to 200 m; side slopes 0 to 10 (H:V); parabola top width 0.1 to 100 m at
 * 0.05 to 10 m; diameters 0.05 to 10 m with discharges from 1e-4 to 3 times the full-pipe discharge (so past capacity
 * too). Critical depths within rounding of a crown need far larger discharges than these ranges reach; the engine's
 * own property tests (test/hydraulics/properties.test.ts) cover them.
 *
 * Run: `npx tsx .scripts/engine-soak.ts [--cases N] [--seed S]` (N cases per shape, default 200,000: a million in
 * all). test/robustness/engine-soak.test.ts runs the same checks on a few thousand cases.
 */
import { pathToFileURL } from 'node:url';
import {
  circleSection,
  criticalSlope,
  parabolaSection,
  rectangleSection,
  solveCriticalDepth,
  solveNormalDepth,
  trapezoidSection,
  triangleSection,
  type SectionGeometry,
  type SectionShape,
} from '../language/hydraulics/index.js';
import { describeReachFlow, solveSequentDepth, solveStandardStep, type FlowBranch } from '../language/hydraulics/profile/index.js';

/** Standard gravity, m/s2 (CGPM 1901; NIST SP 330). Written here so the checks do not read the engine's constant. */
const GRAVITY = 9.80665;
const EQUATION_TOLERANCE = 1e-9;
const STEP_TOLERANCE_M = 1e-8;
export const SHAPES: readonly SectionShape[] = ['rectangle', 'trapezoid', 'triangle', 'parabola', 'circle'];

// ------------------------------------------------------------------------------------------------ geometry

/** Dimensions of one random section, SI. */
export type ShapeDimensions =
  | { readonly shape: 'rectangle'; readonly bottomWidthM: number }
  | { readonly shape: 'trapezoid'; readonly bottomWidthM: number; readonly leftHV: number; readonly rightHV: number }
  | { readonly shape: 'triangle'; readonly leftHV: number; readonly rightHV: number }
  | { readonly shape: 'parabola'; readonly topWidthM: number; readonly atDepthM: number }
  | { readonly shape: 'circle'; readonly diameterM: number };

/** Area, wetted perimeter, top width and first moment of area about the surface at depth y, from closed forms. */
export interface ClosedFormState {
  readonly areaM2: number;
  readonly perimeterM: number;
  readonly topWidthM: number;
  readonly firstMomentM3: number;
}

export function closedForm(dimensions: ShapeDimensions, y: number): ClosedFormState {
  switch (dimensions.shape) {
    case 'rectangle':
    case 'trapezoid':
    case 'triangle': {
      const b = dimensions.shape === 'triangle' ? 0 : dimensions.bottomWidthM;
      const zl = dimensions.shape === 'rectangle' ? 0 : dimensions.leftHV;
      const zr = dimensions.shape === 'rectangle' ? 0 : dimensions.rightHV;
      return {
        areaM2: y * (b + ((zl + zr) * y) / 2),
        perimeterM: b + y * (Math.hypot(1, zl) + Math.hypot(1, zr)),
        topWidthM: b + (zl + zr) * y,
        firstMomentM3: (b * y * y) / 2 + ((zl + zr) * y * y * y) / 6,
      };
    }
    case 'parabola': {
      // y = a x^2 through (T_r/2, y_r); T(y) = T_r sqrt(y / y_r); arc length s(x) = x/2 sqrt(1 + 4a^2x^2) + asinh(2ax)/(4a).
      const a = dimensions.atDepthM / (dimensions.topWidthM / 2) ** 2;
      const topWidthM = dimensions.topWidthM * Math.sqrt(y / dimensions.atDepthM);
      const x = topWidthM / 2;
      const arc = (x / 2) * Math.sqrt(1 + 4 * a * a * x * x) + Math.asinh(2 * a * x) / (4 * a);
      return { areaM2: (2 / 3) * topWidthM * y, perimeterM: 2 * arc, topWidthM, firstMomentM3: (4 / 15) * topWidthM * y * y };
    }
    case 'circle': {
      const d = dimensions.diameterM;
      const r = d / 2;
      const depth = Math.min(Math.max(y, 0), d);
      // Half the central angle of the wetted arc, alpha = theta / 2, from asin of sqrt(y/D) or of sqrt(1 - y/D)
      // (whichever keeps its digits), 1 - y/D formed as (D - y)/D.
      const s = depth / d;
      const alpha = s <= 0.5 ? 2 * Math.asin(Math.sqrt(s)) : Math.PI - 2 * Math.asin(Math.sqrt((d - depth) / d));
      const theta = 2 * alpha;
      // theta - sin(theta) by its series where the difference loses digits.
      const thetaMinusSine = theta < 0.05 ? theta ** 3 / 6 - theta ** 5 / 120 + theta ** 7 / 5040 : theta - Math.sin(theta);
      const areaM2 = (d * d * thetaMinusSine) / 8;
      const topWidthM = 2 * Math.sqrt(depth * (d - depth));
      // First moment of the segment about its chord (the surface): the segment's area times its centroid's distance
      // from the chord, 2/3 r sin^3(alpha) / (alpha - sin alpha cos alpha) - r cos(alpha), gives
      // r^3 (sin alpha - sin^3(alpha) / 3 - alpha cos alpha); for small alpha its series (the first terms cancel).
      const f =
        alpha < 0.1
          ? (2 / 15) * alpha ** 5 - (11 / 315) * alpha ** 7 + (17 / 3780) * alpha ** 9 - (14750 / 39916800) * alpha ** 11
          : Math.sin(alpha) - Math.sin(alpha) ** 3 / 3 - alpha * Math.cos(alpha);
      return { areaM2, perimeterM: d * alpha, topWidthM, firstMomentM3: r * r * r * f };
    }
  }
}

export function engineSection(dimensions: ShapeDimensions): SectionGeometry {
  switch (dimensions.shape) {
    case 'rectangle':
      return rectangleSection({ bottomWidthM: dimensions.bottomWidthM });
    case 'trapezoid':
      return trapezoidSection({ bottomWidthM: dimensions.bottomWidthM, leftSideSlopeHV: dimensions.leftHV, rightSideSlopeHV: dimensions.rightHV });
    case 'triangle':
      return triangleSection({ leftSideSlopeHV: dimensions.leftHV, rightSideSlopeHV: dimensions.rightHV });
    case 'parabola':
      return parabolaSection({ topWidthM: dimensions.topWidthM, atDepthM: dimensions.atDepthM });
    case 'circle':
      return circleSection({ diameterM: dimensions.diameterM });
  }
}

function manningDischarge(dimensions: ShapeDimensions, y: number, n: number, slope: number): number {
  const { areaM2, perimeterM } = closedForm(dimensions, y);
  return (areaM2 * Math.cbrt((areaM2 / perimeterM) ** 2) * Math.sqrt(slope)) / n;
}

/** The largest Manning discharge of a circular conduit: golden-section search on y/D in [0.9, 0.97]. */
function conduitPeakDischarge(dimensions: ShapeDimensions & { shape: 'circle' }, n: number, slope: number): number {
  let low = 0.9 * dimensions.diameterM;
  let high = 0.97 * dimensions.diameterM;
  const ratio = (Math.sqrt(5) - 1) / 2;
  for (let step = 0; step < 80; step++) {
    const left = high - ratio * (high - low);
    const right = low + ratio * (high - low);
    if (manningDischarge(dimensions, left, n, slope) < manningDischarge(dimensions, right, n, slope)) low = left;
    else high = right;
  }
  return manningDischarge(dimensions, (low + high) / 2, n, slope);
}

function specificForce(dimensions: ShapeDimensions, y: number, q: number): number {
  const state = closedForm(dimensions, y);
  return (q * q) / (GRAVITY * state.areaM2) + state.firstMomentM3;
}

function nextDouble(value: number, direction: 1 | -1): number {
  const buffer = new Float64Array([value]);
  const bits = new BigInt64Array(buffer.buffer);
  bits[0] = (bits[0] ?? 0n) + (direction > 0 ? 1n : -1n);
  return buffer[0] ?? value;
}

// ------------------------------------------------------------------------------------------------ random inputs

/** mulberry32: a small, fast, seeded generator (plenty for drawing test inputs). */
export function randomSource(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export interface SoakCase {
  readonly dimensions: ShapeDimensions;
  readonly dischargeM3s: number;
  readonly manningN: number;
  readonly bedSlope: number;
  /** Kinetic-energy coefficient for the step check. */
  readonly alpha: number;
  /** Where the step starts, as a multiple of critical depth on the chosen branch; and the step length, m. */
  readonly stepDepthRatio: number;
  readonly stepLengthM: number;
  /** Where the jump's known depth lies, as a multiple of critical depth. */
  readonly jumpDepthRatio: number;
}

export function drawCase(shape: SectionShape, random: () => number): SoakCase {
  const logUniform = (low: number, high: number): number => Math.exp(Math.log(low) + random() * (Math.log(high) - Math.log(low)));
  const uniform = (low: number, high: number): number => low + random() * (high - low);
  let dimensions: ShapeDimensions;
  switch (shape) {
    case 'rectangle':
      dimensions = { shape, bottomWidthM: logUniform(0.05, 200) };
      break;
    case 'trapezoid':
      dimensions = { shape, bottomWidthM: logUniform(0.05, 200), leftHV: uniform(0, 10), rightHV: uniform(0, 10) };
      break;
    case 'triangle':
      dimensions = { shape, leftHV: uniform(0.1, 10), rightHV: uniform(0, 10) };
      break;
    case 'parabola':
      dimensions = { shape, topWidthM: logUniform(0.1, 100), atDepthM: logUniform(0.05, 10) };
      break;
    case 'circle':
      dimensions = { shape, diameterM: logUniform(0.05, 10) };
      break;
  }
  const manningN = uniform(0.008, 0.2);
  const bedSlope = logUniform(1e-6, 0.5);
  let dischargeM3s = logUniform(1e-4, 1e4);
  if (dimensions.shape === 'circle') {
    const fullDischarge = manningDischarge(dimensions, dimensions.diameterM, manningN, bedSlope);
    dischargeM3s = logUniform(1e-4, 3) * fullDischarge;
  }
  return {
    dimensions,
    dischargeM3s,
    manningN,
    bedSlope,
    alpha: random() < 0.5 ? 1 : uniform(1, 1.2),
    stepDepthRatio: random() < 0.5 ? uniform(1.01, 4) : uniform(0.1, 0.99),
    stepLengthM: logUniform(0.01, 500),
    jumpDepthRatio: random() < 0.5 ? uniform(0.05, 0.98) : uniform(1.02, 3),
  };
}

// ------------------------------------------------------------------------------------------------ checks

export interface ShapeCounts {
  cases: number;
  normalSolved: number;
  /** Explicit no-solutions whose reason was confirmed, by reason. */
  normalNoSolution: Record<string, number>;
  criticalSolved: number;
  criticalNoSolution: Record<string, number>;
  criticalSlopeSolved: number;
  criticalSlopeNoSolution: Record<string, number>;
  sequentSolved: number;
  sequentNoSolution: Record<string, number>;
  stepSolved: number;
  stepToCritical: number;
  stepNoSolution: Record<string, number>;
  /** Largest relative residual of each defining equation over the solved cases. */
  worstNormalResidual: number;
  worstCriticalResidual: number;
  worstCriticalSlopeResidual: number;
  worstSequentResidual: number;
  /** Largest absolute step-equation residual, m. */
  worstStepResidualM: number;
}

export interface SoakFailure {
  readonly check: string;
  readonly problem: string;
  readonly soakCase: SoakCase;
}

export interface SoakReport {
  readonly seed: number;
  readonly counts: Record<SectionShape, ShapeCounts>;
  readonly failures: SoakFailure[];
  /** Failures beyond the first 50 are counted, not kept. */
  failureCount: number;
  elapsedMs: number;
}

export function emptyCounts(): ShapeCounts {
  return {
    cases: 0,
    normalSolved: 0,
    normalNoSolution: {},
    criticalSolved: 0,
    criticalNoSolution: {},
    criticalSlopeSolved: 0,
    criticalSlopeNoSolution: {},
    sequentSolved: 0,
    sequentNoSolution: {},
    stepSolved: 0,
    stepToCritical: 0,
    stepNoSolution: {},
    worstNormalResidual: 0,
    worstCriticalResidual: 0,
    worstCriticalSlopeResidual: 0,
    worstSequentResidual: 0,
    worstStepResidualM: 0,
  };
}

const increment = (record: Record<string, number>, key: string): void => {
  record[key] = (record[key] ?? 0) + 1;
};

/** Q^2 T / (g A^3) - 1 at depth y: zero at critical depth. */
function criticalResidual(dimensions: ShapeDimensions, q: number, y: number): number {
  const state = closedForm(dimensions, y);
  return (q * q * state.topWidthM) / (GRAVITY * state.areaM2 ** 3) - 1;
}

/** Why `depthM` is not the normal depth of the case (Manning's equation to 1e-9), or undefined when it is. */
export function normalDepthProblem(soakCase: SoakCase, depthM: number): string | undefined {
  if (!(depthM > 0 && Number.isFinite(depthM))) return `depth ${depthM}`;
  const residual = Math.abs(manningDischarge(soakCase.dimensions, depthM, soakCase.manningN, soakCase.bedSlope) / soakCase.dischargeM3s - 1);
  return residual <= EQUATION_TOLERANCE ? undefined : `Manning residual ${residual.toExponential(2)} at y = ${depthM} m`;
}

/**
 * Why `depthM` is not the critical depth of the case (Q^2 T = g A^3 to 1e-9; within 1e-6 D of a crown, the equation
 * changing sign between the neighbouring doubles), or undefined when it is.
 */
export function criticalDepthProblem(soakCase: SoakCase, depthM: number): string | undefined {
  const { dimensions, dischargeM3s: q } = soakCase;
  if (!(depthM > 0 && Number.isFinite(depthM))) return `depth ${depthM}`;
  const residual = Math.abs(criticalResidual(dimensions, q, depthM));
  if (residual <= EQUATION_TOLERANCE) return undefined;
  const crownM = dimensions.shape === 'circle' ? dimensions.diameterM : undefined;
  const pinned =
    crownM !== undefined && depthM > crownM * (1 - 1e-6) && Math.sign(criticalResidual(dimensions, q, nextDouble(depthM, -1))) !== Math.sign(criticalResidual(dimensions, q, nextDouble(depthM, 1)));
  return pinned ? undefined : `Q^2 T / (g A^3) - 1 = ${residual.toExponential(2)} at y = ${depthM} m`;
}

/** Runs every check on one case, adding to `counts`; returns the failures found. */
export function checkCase(soakCase: SoakCase, counts: ShapeCounts): SoakFailure[] {
  const failures: SoakFailure[] = [];
  const fail = (check: string, problem: string): void => {
    failures.push({ check, problem, soakCase });
  };
  const { dimensions, dischargeM3s: q, manningN: n, bedSlope: slope } = soakCase;
  counts.cases++;
  try {
    const section = engineSection(dimensions);
    const crownM = dimensions.shape === 'circle' ? dimensions.diameterM : undefined;

    // Normal depth.
    const normal = solveNormalDepth(section, { dischargeM3s: q, manningN: n, bedSlope: slope });
    if (normal.converged) {
      counts.worstNormalResidual = Math.max(counts.worstNormalResidual, Math.abs(manningDischarge(dimensions, normal.depthM, n, slope) / q - 1));
      const problem = normalDepthProblem(soakCase, normal.depthM);
      if (problem !== undefined) fail('normal depth', problem);
      else counts.normalSolved++;
      if (crownM !== undefined) {
        const aboveFull = q > manningDischarge(dimensions, crownM, n, slope);
        const flaggedLower = normal.branch === 'lower-of-two';
        // Within rounding of the full-pipe discharge either answer is right.
        const nearFull = Math.abs(q / manningDischarge(dimensions, crownM, n, slope) - 1) <= 1e-9;
        if (aboveFull !== flaggedLower && !nearFull) fail('normal depth', `branch '${normal.branch}' but Q is ${aboveFull ? 'above' : 'below'} the full-pipe discharge`);
      }
    } else if (normal.reason === 'exceeds-capacity' && dimensions.shape === 'circle') {
      const peak = conduitPeakDischarge(dimensions, n, slope);
      if (q >= peak * (1 - 1e-9)) increment(counts.normalNoSolution, normal.reason);
      else fail('normal depth', `says the flow exceeds capacity, but Q = ${q} is below the peak ${peak}: ${normal.message}`);
    } else {
      fail('normal depth', `${normal.reason}: ${normal.message}`);
    }

    // Critical depth.
    const critical = solveCriticalDepth(section, q);
    let criticalDepthM: number | undefined;
    const froudeResidual = (y: number): number => criticalResidual(dimensions, q, y);
    if (critical.converged) {
      const y = critical.depthM;
      const problem = criticalDepthProblem(soakCase, y);
      if (problem !== undefined) fail('critical depth', problem);
      else {
        counts.criticalSolved++;
        const residual = Math.abs(froudeResidual(y));
        if (residual <= EQUATION_TOLERANCE) counts.worstCriticalResidual = Math.max(counts.worstCriticalResidual, residual);
        criticalDepthM = y;
      }
    } else if (crownM !== undefined && critical.reason === 'did-not-converge' && froudeResidual(crownM * (1 - 1e-7)) > 0) {
      // Still above critical (Q^2 T > g A^3) a ten-millionth of the diameter below the crown: critical depth is at the crown to within rounding.
      increment(counts.criticalNoSolution, 'at-the-crown');
    } else {
      fail('critical depth', `${critical.reason}: ${critical.message}`);
    }

    // Critical slope.
    const slopeResult = criticalSlope(section, q, n);
    if (slopeResult.converged) {
      const residual = Math.abs(manningDischarge(dimensions, slopeResult.criticalDepthM, n, slopeResult.slope) / q - 1);
      counts.worstCriticalSlopeResidual = Math.max(counts.worstCriticalSlopeResidual, residual);
      if (!(residual <= EQUATION_TOLERANCE)) fail('critical slope', `Manning at yc on Sc = ${slopeResult.slope}: residual ${residual.toExponential(2)}`);
      else counts.criticalSlopeSolved++;
    } else if (criticalDepthM === undefined && !critical.converged) {
      increment(counts.criticalSlopeNoSolution, 'no-critical-depth');
    } else {
      fail('critical slope', `${slopeResult.reason}: ${slopeResult.message}`);
    }

    if (criticalDepthM !== undefined) {
      // Sequent depth of a jump from a depth on one side of critical.
      const y1 = criticalDepthM * soakCase.jumpDepthRatio;
      if (crownM === undefined || y1 < crownM * 0.999) {
        const sequent = solveSequentDepth(section, y1, q);
        if (sequent.converged) {
          const y2 = sequent.sequentDepthM;
          const residual = Math.abs(specificForce(dimensions, y2, q) / specificForce(dimensions, y1, q) - 1);
          counts.worstSequentResidual = Math.max(counts.worstSequentResidual, residual);
          if ((y1 - criticalDepthM) * (y2 - criticalDepthM) > 0) fail('sequent depth', `y1 = ${y1} and y2 = ${y2} lie on the same side of yc = ${criticalDepthM}`);
          else if (!(residual <= EQUATION_TOLERANCE)) fail('sequent depth', `specific force residual ${residual.toExponential(2)}: y1 = ${y1}, y2 = ${y2}`);
          else counts.sequentSolved++;
        } else if (sequent.reason === 'conduit-fills' && crownM !== undefined && y1 < criticalDepthM && specificForce(dimensions, crownM, q) < specificForce(dimensions, y1, q) * (1 + 1e-9)) {
          increment(counts.sequentNoSolution, sequent.reason);
        } else {
          fail('sequent depth', `${sequent.reason}: ${sequent.message}`);
        }
      }
      checkStep(soakCase, section, crownM, counts, fail);
    }
  } catch (error) {
    fail('exception', error instanceof Error ? (error.stack ?? error.message) : String(error));
  }
  return failures;
}

/** One standard step from a depth on one branch; see the module comment. */
function checkStep(soakCase: SoakCase, section: SectionGeometry, crownM: number | undefined, counts: ShapeCounts, fail: (check: string, problem: string) => void): void {
  const { dimensions, dischargeM3s: q, manningN: n, bedSlope: slope, alpha } = soakCase;
  const described = describeReachFlow(section, n, slope, q, alpha);
  if (!described.converged) {
    // alpha > 1 raises the critical flow: a conduit may then have no free-surface critical depth.
    if (crownM !== undefined && alpha > 1) increment(counts.stepNoSolution, 'no-critical-depth-with-alpha');
    else fail('standard step', `no reach flow: ${described.message}`);
    return;
  }
  const flow = described.flow;
  const branch: FlowBranch = soakCase.stepDepthRatio > 1 ? 'subcritical' : 'supercritical';
  const yc = flow.criticalDepthM;
  const knownDepthM = yc * soakCase.stepDepthRatio;
  if (crownM !== undefined && knownDepthM >= crownM * 0.999) return;
  const energy = (y: number): number => {
    const { areaM2 } = closedForm(dimensions, y);
    return y + (alpha * q * q) / (2 * GRAVITY * areaM2 * areaM2);
  };
  const friction = (y: number): number => {
    const { areaM2, perimeterM } = closedForm(dimensions, y);
    return ((q * n) / (areaM2 * Math.cbrt((areaM2 / perimeterM) ** 2))) ** 2;
  };
  const direction = branch === 'subcritical' ? 1 : -1;
  const residual = (y: number, distanceM: number): number => energy(y) - energy(knownDepthM) + direction * (slope - (friction(knownDepthM) + friction(y)) / 2) * distanceM;
  const dx = soakCase.stepLengthM;
  const outcome = solveStandardStep(flow, knownDepthM, dx, branch);
  switch (outcome.kind) {
    case 'solved': {
      const r = Math.abs(residual(outcome.depthM, dx));
      counts.worstStepResidualM = Math.max(counts.worstStepResidualM, r);
      const onBranch = branch === 'subcritical' ? outcome.depthM >= yc * (1 - 1e-9) : outcome.depthM <= yc * (1 + 1e-9);
      if (!onBranch) fail('standard step', `depth ${outcome.depthM} left the ${branch} branch (yc = ${yc})`);
      else if (!(r <= STEP_TOLERANCE_M * Math.max(1, energy(knownDepthM)))) fail('standard step', `energy residual ${r.toExponential(2)} m at y = ${outcome.depthM}`);
      else counts.stepSolved++;
      return;
    }
    case 'passes-critical': {
      const distanceM = outcome.distanceToCriticalM;
      const r = Math.abs(residual(yc, distanceM));
      if (!(distanceM >= 0 && distanceM <= dx * (1 + 1e-9))) fail('standard step', `reaches critical after ${distanceM} m, outside the step of ${dx} m`);
      else if (!(r <= STEP_TOLERANCE_M * Math.max(1, energy(knownDepthM)))) fail('standard step', `energy equation at critical depth off by ${r.toExponential(2)} m after ${distanceM} m`);
      else counts.stepToCritical++;
      return;
    }
    case 'above-crown':
      if (crownM !== undefined && branch === 'subcritical') increment(counts.stepNoSolution, 'above-crown');
      else fail('standard step', 'says the depth rises above a crown in a section without one (or on the supercritical branch)');
      return;
    case 'did-not-converge':
      fail('standard step', `did not converge (last depth ${outcome.lastDepthM})`);
      return;
  }
}

export interface SoakOptions {
  /** Cases per shape. */
  readonly casesPerShape: number;
  readonly seed: number;
}

export function runSoak(options: SoakOptions): SoakReport {
  const started = performance.now();
  const random = randomSource(options.seed);
  const counts = Object.fromEntries(SHAPES.map((shape) => [shape, emptyCounts()])) as Record<SectionShape, ShapeCounts>;
  const report: SoakReport = { seed: options.seed, counts, failures: [], failureCount: 0, elapsedMs: 0 };
  for (let index = 0; index < options.casesPerShape; index++) {
    for (const shape of SHAPES) {
      const found = checkCase(drawCase(shape, random), counts[shape]);
      report.failureCount += found.length;
      for (const failure of found) if (report.failures.length < 50) report.failures.push(failure);
    }
  }
  report.elapsedMs = performance.now() - started;
  return report;
}

export function formatReport(report: SoakReport): string {
  const lines: string[] = [];
  const total = SHAPES.reduce((sum, shape) => sum + report.counts[shape].cases, 0);
  lines.push(`Engine soak, seed ${report.seed}: ${total.toLocaleString('en-US')} cases in ${(report.elapsedMs / 1000).toFixed(1)} s (${Math.round(total / (report.elapsedMs / 1000)).toLocaleString('en-US')} cases/s)`);
  const reasons = (record: Record<string, number>): string => Object.entries(record).map(([reason, count]) => `${reason} ${count}`).join(', ') || 'none';
  for (const shape of SHAPES) {
    const c = report.counts[shape];
    lines.push(`\n${shape}: ${c.cases.toLocaleString('en-US')} cases`);
    lines.push(`  normal depth    solved ${c.normalSolved}, no solution (reason confirmed): ${reasons(c.normalNoSolution)}; worst |Q(y)/Q - 1| ${c.worstNormalResidual.toExponential(1)}`);
    lines.push(`  critical depth  solved ${c.criticalSolved}, no solution: ${reasons(c.criticalNoSolution)}; worst |Q^2T/(gA^3) - 1| ${c.worstCriticalResidual.toExponential(1)}`);
    lines.push(`  critical slope  solved ${c.criticalSlopeSolved}, no solution: ${reasons(c.criticalSlopeNoSolution)}; worst residual ${c.worstCriticalSlopeResidual.toExponential(1)}`);
    lines.push(`  sequent depth   solved ${c.sequentSolved}, no solution: ${reasons(c.sequentNoSolution)}; worst |M2/M1 - 1| ${c.worstSequentResidual.toExponential(1)}`);
    lines.push(`  standard step   solved ${c.stepSolved}, reached critical ${c.stepToCritical}, no solution: ${reasons(c.stepNoSolution)}; worst residual ${c.worstStepResidualM.toExponential(1)} m`);
  }
  lines.push(`\nFailures: ${report.failureCount}`);
  for (const failure of report.failures.slice(0, 20)) lines.push(`  ${failure.check}: ${failure.problem}\n    input ${JSON.stringify(failure.soakCase)}`);
  return lines.join('\n');
}

function argument(name: string, fallback: number): number {
  const index = process.argv.indexOf(`--${name}`);
  const value = index >= 0 ? Number(process.argv[index + 1]) : fallback;
  if (!Number.isFinite(value) || value < 0) throw new Error(`--${name} needs a number`);
  return value;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const report = runSoak({ casesPerShape: argument('cases', 200_000), seed: argument('seed', 20_250_101) });
  console.log(formatReport(report));
  if (report.failureCount > 0) process.exitCode = 1;
}
