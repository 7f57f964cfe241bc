/**
 * Critical flow and the quantities that go with it (Chow 1959, Ch. 3-4; Henderson 1966, Ch. 2), in SI with
 * kinetic-energy coefficient alpha = 1:
 * - critical depth satisfies Q^2 T = g A^3, i.e. the section factor Z = A sqrt(A/T) equals Q / sqrt(g);
 * - Froude number Fr = V / sqrt(g A / T);
 * - specific energy E = y + V^2 / (2g); its minimum for a given Q is at critical depth;
 * - specific force (momentum function) M = Q^2 / (g A) + A ybar, ybar the centroid depth below the surface;
 * - critical slope Sc: the bed slope on which normal depth equals critical depth for a given Q and n.
 */
import { CRITICAL_MATCH_RELATIVE_TOLERANCE, DEPTH_SOLVE_RELATIVE_TOLERANCE, GRAVITY_MS2 } from './constants.js';
import { iterateDepth, SECTION_FACTOR_SQUARED } from './depth-iteration.js';
import { conveyance } from './uniform-flow.js';
import type { SectionGeometry } from './sections/section-geometry.js';

export type CriticalDepthResult =
  | { readonly converged: true; readonly depthM: number; readonly iterations: number; readonly evaluations: number }
  | {
      readonly converged: false;
      readonly reason: 'invalid-input' | 'did-not-converge';
      readonly message: string;
      readonly iterations: number;
      readonly evaluations: number;
    };

// Acceptance window on Z^2 / Z_target^2 equivalent to |Z - Z_target| <= tolerance x Z_target.
const ACCEPT_LOW_SECTION_FACTOR_SQUARED = (1 - DEPTH_SOLVE_RELATIVE_TOLERANCE) ** 2;
const ACCEPT_HIGH_SECTION_FACTOR_SQUARED = (1 + DEPTH_SOLVE_RELATIVE_TOLERANCE) ** 2;
const SMALLEST_NORMAL_DOUBLE = 2.2250738585072014e-308;

/**
 * Solves Q^2 T = g A^3 for critical depth, m (g = 9.80665 m/s2, alpha = 1).
 * Tolerance: |Z(y) - Z| <= 1e-10 Z with Z = A sqrt(A/T) the section factor and Z = Q / sqrt(g) the target. Within
 * about 5e-7 D of a conduit crown Z changes faster than adjacent doubles can resolve; there the result is the depth
 * pinned between two adjacent doubles with the root between them. A root closer to the crown than one rounding step
 * is reported as not converged (the conduit cannot pass that flow with a free surface). Bad numbers and bad section
 * dimensions give 'invalid-input'; never NaN, never an exception.
 */
export function solveCriticalDepth(section: SectionGeometry, dischargeM3s: number): CriticalDepthResult {
  if (!(dischargeM3s > 0 && Number.isFinite(dischargeM3s))) {
    return { converged: false, reason: 'invalid-input', message: 'Discharge must be a positive finite number.', iterations: 0, evaluations: 0 };
  }
  if (section.dimensionProblem !== undefined) {
    return { converged: false, reason: 'invalid-input', message: section.dimensionProblem, iterations: 0, evaluations: 0 };
  }
  const targetSectionFactor = dischargeM3s / Math.sqrt(GRAVITY_MS2);
  const targetSquared = targetSectionFactor * targetSectionFactor;
  if (!(targetSquared >= SMALLEST_NORMAL_DOUBLE && Number.isFinite(targetSquared))) {
    return {
      converged: false,
      reason: 'invalid-input',
      message: `A discharge of ${dischargeM3s.toPrecision(3)} m3/s is outside the range the engine computes in.`,
      iterations: 0,
      evaluations: 0,
    };
  }
  // A closed conduit's section factor grows without bound as the surface narrows to the crown (T -> 0), so the
  // root always lies below the crown, which bounds the bracket.
  const fullDepthM = section.fullDepthM;
  const estimateM =
    section.solverHints?.criticalDepthEstimateM?.(targetSectionFactor) ?? genericCriticalDepthEstimateM(section, dischargeM3s, fullDepthM);
  const outcome = iterateDepth(
    SECTION_FACTOR_SQUARED,
    section,
    undefined,
    targetSquared,
    ACCEPT_LOW_SECTION_FACTOR_SQUARED,
    ACCEPT_HIGH_SECTION_FACTOR_SQUARED,
    estimateM,
    fullDepthM ?? Number.POSITIVE_INFINITY,
    fullDepthM ?? 0,
  );
  if (!outcome.converged) {
    const message =
      outcome.failure === 'bound'
        ? `Critical depth for ${dischargeM3s.toPrecision(4)} m3/s lies at the crown to within rounding: the conduit cannot pass this flow with a free surface.`
        : `Critical-depth iteration stopped without meeting its tolerance after ${outcome.iterations} steps (${Number.isFinite(outcome.depthM) ? `last depth ${outcome.depthM.toPrecision(6)} m` : 'the depth ran beyond the range of numbers the engine computes in: check the section dimensions'}).`;
    return { converged: false, reason: 'did-not-converge', message, iterations: outcome.iterations, evaluations: outcome.evaluations };
  }
  return { converged: true, depthM: outcome.depthM, iterations: outcome.iterations, evaluations: outcome.evaluations };
}

/** Starting depth without a shape estimate: the rectangular closed form with the top width at 1 m depth. */
function genericCriticalDepthEstimateM(section: SectionGeometry, dischargeM3s: number, fullDepthM: number | undefined): number {
  if (fullDepthM !== undefined) return fullDepthM / 2;
  const unitDischarge = dischargeM3s / section.topWidthM(1);
  const guessM = Math.cbrt((unitDischarge * unitDischarge) / GRAVITY_MS2);
  return Number.isFinite(guessM) && guessM > 0 ? guessM : 1;
}

/**
 * Froude number V / sqrt(g A / T) at a depth; dimensionless. Depth in m (> 0; for a conduit at most its full depth,
 * where T = 0 gives 0: no free surface), discharge in m3/s. The point functions below share these preconditions.
 */
export function froudeNumber(section: SectionGeometry, depthM: number, dischargeM3s: number): number {
  const areaM2 = section.areaM2(depthM);
  const velocityMs = dischargeM3s / areaM2;
  return velocityMs / Math.sqrt((GRAVITY_MS2 * areaM2) / section.topWidthM(depthM));
}

/** Specific energy E = y + V^2 / (2 g), m. */
export function specificEnergyM(section: SectionGeometry, depthM: number, dischargeM3s: number): number {
  const velocityMs = dischargeM3s / section.areaM2(depthM);
  return depthM + (velocityMs * velocityMs) / (2 * GRAVITY_MS2);
}

/** Specific force (momentum function) M = Q^2 / (g A) + A ybar, m3. */
export function specificForceM3(section: SectionGeometry, depthM: number, dischargeM3s: number): number {
  return (dischargeM3s * dischargeM3s) / (GRAVITY_MS2 * section.areaM2(depthM)) + section.firstMomentM3(depthM);
}

export type CriticalSlopeResult =
  | { readonly converged: true; readonly slope: number; readonly criticalDepthM: number }
  | { readonly converged: false; readonly reason: 'invalid-input' | 'did-not-converge'; readonly message: string };

/**
 * Critical slope Sc = (Q n / K(yc))^2, m/m: the bed slope on which normal depth equals critical depth for discharge
 * Q (m3/s) and Manning's n (Chow 1959, Ch. 6, from memory). Outcomes as for solveCriticalDepth.
 */
export function criticalSlope(section: SectionGeometry, dischargeM3s: number, manningN: number): CriticalSlopeResult {
  if (!(manningN > 0 && Number.isFinite(manningN))) {
    return { converged: false, reason: 'invalid-input', message: "Manning's n must be a positive finite number." };
  }
  const critical = solveCriticalDepth(section, dischargeM3s);
  if (!critical.converged) return { converged: false, reason: critical.reason, message: critical.message };
  const slope = ((dischargeM3s * manningN) / conveyance(section, critical.depthM)) ** 2;
  if (!(slope > 0 && Number.isFinite(slope))) {
    return { converged: false, reason: 'did-not-converge', message: 'Critical slope is outside the range the engine computes in.' };
  }
  return { converged: true, slope, criticalDepthM: critical.depthM };
}

export type FlowRegime = 'subcritical' | 'critical' | 'supercritical';

/** Flow regime from the Froude number; within a rounding tolerance of 1 it is critical. */
export function classifyRegime(froude: number): FlowRegime {
  if (Math.abs(froude - 1) <= CRITICAL_MATCH_RELATIVE_TOLERANCE) return 'critical';
  return froude < 1 ? 'subcritical' : 'supercritical';
}

export type SlopeClass = 'mild' | 'critical' | 'steep' | 'horizontal' | 'adverse';

/**
 * Bed-slope class for a given flow (Chow 1959, Sec. 9-2): horizontal (S = 0), adverse (S < 0), otherwise mild when
 * normal depth exceeds critical depth, steep when it is below, critical when they match within rounding.
 * `normalDepthM` undefined on a falling bed means no free-surface uniform flow exists because the flow exceeds a
 * conduit's uniform-flow capacity: its uniform-flow grade line lies above the crown and so above critical depth
 * (which is always below the crown), which is the mild case. Depths in m, slope in m/m.
 */
export function classifySlope(bedSlope: number, normalDepthM: number | undefined, criticalDepthM: number): SlopeClass {
  if (bedSlope === 0) return 'horizontal';
  if (bedSlope < 0) return 'adverse';
  if (normalDepthM === undefined) return 'mild';
  if (Math.abs(normalDepthM - criticalDepthM) <= CRITICAL_MATCH_RELATIVE_TOLERANCE * criticalDepthM) return 'critical';
  return normalDepthM > criticalDepthM ? 'mild' : 'steep';
}
