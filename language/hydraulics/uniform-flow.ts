/**
 * Uniform flow by Manning's equation in SI (k = 1): Q = (1/n) A R^(2/3) S^(1/2), with A in m2, R in m, S in m/m
 * and Q in m3/s. The US-customary coefficient 1.486 is not a separate constant: it is (1 m / 0.3048 m)^(1/3), the
 * result of converting units at the edges (Chow 1959, Sec. 5-6).
 *
 * Normal depth is the depth at which Manning's discharge equals the design discharge. It exists only on a falling
 * bed (S > 0). Open sections are solved on the prism extended above the bank (over-topping is a check of the
 * analysis, not a failure to solve). A circular conduit's conveyance peaks near y/D = 0.938 above the full-pipe
 * value (Chow 1959, Ch. 6, properties of the circular section), so flows between full-pipe capacity and that peak
 * have two uniform-flow depths: the lower one is reported and the result says so; flows above the peak exceed
 * capacity and get that capacity in the result.
 */
import { DEPTH_SOLVE_RELATIVE_TOLERANCE } from './constants.js';
import { CONVEYANCE_CUBED, iterateDepth } from './depth-iteration.js';
import type { ConduitConveyance, SectionGeometry } from './sections/section-geometry.js';

export interface UniformFlowInput {
  /** Design discharge, m3/s (> 0). */
  readonly dischargeM3s: number;
  /** Manning's roughness coefficient n, s/m^(1/3) (> 0). */
  readonly manningN: number;
  /** Bed slope, m/m (positive downhill). */
  readonly bedSlope: number;
}

export type NormalDepthFailure = 'invalid-input' | 'horizontal-or-adverse-slope' | 'exceeds-capacity' | 'did-not-converge';

export type NormalDepthResult =
  | {
      readonly converged: true;
      /** Normal depth, m. */
      readonly depthM: number;
      /** 'lower-of-two' for a closed conduit between full-pipe capacity and the conveyance peak. */
      readonly branch: 'single' | 'lower-of-two';
      readonly iterations: number;
      /** Number of discharge (conveyance) evaluations the solve made. */
      readonly evaluations: number;
    }
  | {
      readonly converged: false;
      readonly reason: NormalDepthFailure;
      /** One sentence for people, with numbers in SI. */
      readonly message: string;
      /** For 'exceeds-capacity': the largest uniform-flow discharge the conduit carries, m3/s. */
      readonly capacityM3s?: number;
      readonly iterations: number;
      readonly evaluations: number;
    };

/** Manning conveyance K = A R^(2/3), m^(8/3): Q = K sqrt(S) / n. Zero at zero depth. */
export function conveyance(section: SectionGeometry, depthM: number): number {
  const areaM2 = section.areaM2(depthM);
  const perimeterM = section.wettedPerimeterM(depthM);
  return perimeterM > 0 ? areaM2 * Math.cbrt((areaM2 / perimeterM) ** 2) : 0;
}

/** Discharge in uniform flow at a depth, m3/s (Manning, SI); zero on a bed that does not fall. */
export function manningDischargeM3s(section: SectionGeometry, depthM: number, manningN: number, bedSlope: number): number {
  return (conveyance(section, depthM) * Math.sqrt(Math.max(bedSlope, 0))) / manningN;
}

/**
 * Conveyance facts of a closed conduit: where A R^(2/3) peaks, its value there and flowing full; undefined for
 * open sections, whose conveyance grows without bound. Taken from the shape when it knows them (the circle does,
 * from its dimensionless form), else found once per section object by bisection on
 * d(ln K)/dy = 5T/(3A) - 2P'/(3P) and cached.
 */
export function conduitConveyance(section: SectionGeometry): ConduitConveyance | undefined {
  const fullDepthM = section.fullDepthM;
  if (fullDepthM === undefined) return undefined;
  const known = section.solverHints?.conduitConveyance;
  if (known !== undefined) return known;
  const cached = conduitConveyanceCache.get(section);
  if (cached !== undefined) return cached;
  const logConveyanceSlope = (y: number): number =>
    (5 * section.topWidthM(y)) / (3 * section.areaM2(y)) - (2 * section.wettedPerimeterSlope(y)) / (3 * section.wettedPerimeterM(y));
  let lowerM = fullDepthM / 2;
  let upperM = fullDepthM * (1 - 1e-12);
  for (let step = 0; step < 200 && upperM - lowerM > 1e-14 * fullDepthM; step++) {
    const middleM = (lowerM + upperM) / 2;
    if (logConveyanceSlope(middleM) > 0) lowerM = middleM;
    else upperM = middleM;
  }
  const peakDepthM = (lowerM + upperM) / 2;
  const facts: ConduitConveyance = {
    peakDepthM,
    peakConveyanceM83: conveyance(section, peakDepthM),
    fullConveyanceM83: conveyance(section, fullDepthM),
  };
  conduitConveyanceCache.set(section, facts);
  return facts;
}
const conduitConveyanceCache = new WeakMap<SectionGeometry, ConduitConveyance>();

/**
 * Depth at which a closed conduit's conveyance peaks, m (about 0.938 D for a circle); undefined for open sections.
 */
export function depthOfMaximumConveyanceM(section: SectionGeometry): number | undefined {
  return conduitConveyance(section)?.peakDepthM;
}

/** Full-pipe discharge of a closed conduit in uniform flow, m3/s; undefined for open sections. */
export function fullFlowCapacityM3s(section: SectionGeometry, manningN: number, bedSlope: number): number | undefined {
  return section.fullDepthM === undefined ? undefined : manningDischargeM3s(section, section.fullDepthM, manningN, bedSlope);
}

/** Largest uniform-flow discharge of a closed conduit (at the conveyance peak), m3/s; undefined for open sections. */
export function maximumUniformFlowCapacityM3s(section: SectionGeometry, manningN: number, bedSlope: number): number | undefined {
  const facts = conduitConveyance(section);
  return facts === undefined ? undefined : (facts.peakConveyanceM83 * Math.sqrt(Math.max(bedSlope, 0))) / manningN;
}

// Acceptance window on K^3 / K_target^3 equivalent to |K - K_target| <= tolerance x K_target.
const ACCEPT_LOW_CONVEYANCE_CUBED = (1 - DEPTH_SOLVE_RELATIVE_TOLERANCE) ** 3;
const ACCEPT_HIGH_CONVEYANCE_CUBED = (1 + DEPTH_SOLVE_RELATIVE_TOLERANCE) ** 3;
// K^3 must be a normal double for the iteration to resolve it (about 1e-102 < K < 5e102 m^(8/3)).
const SMALLEST_NORMAL_DOUBLE = 2.2250738585072014e-308;

/**
 * Solves Manning's equation for normal depth, m; see the module comment for the outcomes.
 * Tolerance: the returned depth satisfies |Q(y) - Q| <= 1e-10 Q (DEPTH_SOLVE_RELATIVE_TOLERANCE), Q(y) by Manning.
 * Never throws and never returns NaN: bad numbers (zero, negative, NaN, infinite, or so extreme that the conveyance
 * Q n / sqrt(S) is outside double-precision range) and bad section dimensions give 'invalid-input'.
 */
export function solveNormalDepth(section: SectionGeometry, input: UniformFlowInput): NormalDepthResult {
  const { dischargeM3s, manningN, bedSlope } = input;
  if (!(dischargeM3s > 0 && Number.isFinite(dischargeM3s)) || !(manningN > 0 && Number.isFinite(manningN)) || !Number.isFinite(bedSlope)) {
    return noNormalDepth('invalid-input', "Discharge and Manning's n must be positive finite numbers and the slope a finite number.");
  }
  if (section.dimensionProblem !== undefined) return noNormalDepth('invalid-input', section.dimensionProblem);
  if (bedSlope <= 0) {
    return noNormalDepth('horizontal-or-adverse-slope', 'No normal depth: uniform flow needs a bed that falls downstream (slope > 0).');
  }
  const targetConveyance = (dischargeM3s * manningN) / Math.sqrt(bedSlope);
  const targetCubed = targetConveyance * targetConveyance * targetConveyance;
  if (!(targetCubed >= SMALLEST_NORMAL_DOUBLE && Number.isFinite(targetCubed))) {
    return noNormalDepth(
      'invalid-input',
      Number.isFinite(targetConveyance)
        ? `Discharge, Manning's n and slope give a conveyance Q n / sqrt(S) of ${targetConveyance.toPrecision(3)} m^(8/3), outside the range the engine computes in.`
        : "Discharge, Manning's n and slope give a conveyance Q n / sqrt(S) too large for the engine to compute with: check Manning's n and the discharge.",
    );
  }
  let branch: 'single' | 'lower-of-two' = 'single';
  let upperDepthM = Number.POSITIVE_INFINITY;
  const fullDepthM = section.fullDepthM;
  if (fullDepthM !== undefined) {
    const facts = conduitConveyance(section)!;
    // A flow equal to the capacity within the solve tolerance is carried at the peak depth (not "exceeds").
    if (targetConveyance > facts.peakConveyanceM83 * (1 + DEPTH_SOLVE_RELATIVE_TOLERANCE)) {
      const capacityM3s = (facts.peakConveyanceM83 * Math.sqrt(bedSlope)) / manningN;
      return {
        converged: false,
        reason: 'exceeds-capacity',
        message: `Flow exceeds the conduit's largest uniform-flow capacity of ${capacityM3s.toPrecision(4)} m3/s (reached near ${(facts.peakDepthM / fullDepthM).toFixed(3)} of the full depth); it would flow under pressure.`,
        capacityM3s,
        iterations: 0,
        evaluations: 0,
      };
    }
    if (targetConveyance > facts.fullConveyanceM83) branch = 'lower-of-two';
    if (targetConveyance >= facts.peakConveyanceM83) {
      return { converged: true, depthM: facts.peakDepthM, branch, iterations: 0, evaluations: 0 };
    }
    upperDepthM = facts.peakDepthM;
  }
  const estimateM = section.solverHints?.normalDepthEstimateM?.(targetConveyance) ?? genericNormalDepthEstimateM(section, targetConveyance, upperDepthM);
  const outcome = iterateDepth(
    CONVEYANCE_CUBED,
    section,
    undefined,
    targetCubed,
    ACCEPT_LOW_CONVEYANCE_CUBED,
    ACCEPT_HIGH_CONVEYANCE_CUBED,
    estimateM,
    upperDepthM,
    fullDepthM ?? 0,
  );
  if (!outcome.converged) {
    return {
      converged: false,
      reason: 'did-not-converge',
      message: `Normal-depth iteration stopped without meeting its tolerance after ${outcome.iterations} steps (${Number.isFinite(outcome.depthM) ? `last depth ${outcome.depthM.toPrecision(6)} m` : 'the depth ran beyond the range of numbers the engine computes in: check the section dimensions'}).`,
      iterations: outcome.iterations,
      evaluations: outcome.evaluations,
    };
  }
  return { converged: true, depthM: outcome.depthM, branch, iterations: outcome.iterations, evaluations: outcome.evaluations };
}

function noNormalDepth(reason: NormalDepthFailure, message: string): NormalDepthResult {
  return { converged: false, reason, message, iterations: 0, evaluations: 0 };
}

/**
 * A starting depth for shapes without their own estimate, m: half the conveyance peak under a crown; otherwise the
 * depth at which a wide rectangle as wide as the section's top width at 1 m depth carries the flow (conveyance of
 * a wide channel grows like y^(5/3), of a V like y^(8/3), and the log-space Newton steps close in from either).
 */
function genericNormalDepthEstimateM(section: SectionGeometry, targetConveyance: number, upperDepthM: number): number {
  if (Number.isFinite(upperDepthM)) return upperDepthM / 2;
  const wideChannelDepthM = (targetConveyance / section.topWidthM(1)) ** 0.6;
  return Number.isFinite(wideChannelDepthM) && wideChannelDepthM > 0 ? wideChannelDepthM : 1;
}
