/**
 * Critical flow and the quantities that go with it (Chow 1959, Ch. 3-4; Henderson 1966, Ch. 2), in SI with
 * kinetic-energy coefficient alpha = 1:
 * - critical depth satisfies Q^2 T = g A^3, i.e. the section factor Z = A sqrt(A/T) equals Q / sqrt(g);
 * - Froude number Fr = V / sqrt(g A / T);
 * - specific energy E = y + V^2 / (2g); its minimum for a given Q is at critical depth;
 * - specific force (momentum function) M = Q^2 / (g A) + A ybar, ybar the centroid depth below the surface;
 * - critical slope Sc: the bed slope on which normal depth equals critical depth for a given Q and n.
 */
import { CRITICAL_MATCH_RELATIVE_TOLERANCE, GRAVITY_MS2 } from './constants.js';
import { solveIncreasingRoot } from './depth-solver.js';
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

/** Solves Q^2 T = g A^3 for critical depth, m. Tolerance: |Z(y) - Z| <= 1e-10 Z with Z = A sqrt(A/T). */
export function solveCriticalDepth(section: SectionGeometry, dischargeM3s: number): CriticalDepthResult {
  if (!(dischargeM3s > 0 && Number.isFinite(dischargeM3s))) {
    return { converged: false, reason: 'invalid-input', message: 'Discharge must be a positive finite number.', iterations: 0, evaluations: 0 };
  }
  const targetSectionFactor = dischargeM3s / Math.sqrt(GRAVITY_MS2);
  // A closed conduit's section factor grows without bound as the surface narrows to the crown, so the root lies
  // below the crown; the last sliver is excluded to keep T > 0.
  const upperDepthM = section.fullDepthM === undefined ? undefined : section.fullDepthM * (1 - 1e-9);
  const outcome = solveIncreasingRoot({
    evaluate: (y) => {
      const areaM2 = section.areaM2(y);
      const topWidthM = section.topWidthM(y);
      const value = areaM2 * Math.sqrt(areaM2 / topWidthM);
      // d ln Z / dy = 3T / (2A) - T' / (2T).
      const slope = value * ((3 * topWidthM) / (2 * areaM2) - section.topWidthSlope(y) / (2 * topWidthM));
      return { value, slope };
    },
    target: targetSectionFactor,
    initialDepthM: initialCriticalDepthGuessM(section, dischargeM3s, upperDepthM),
    upperDepthM,
    crownDepthM: section.fullDepthM,
  });
  if (!outcome.converged) {
    return {
      converged: false,
      reason: 'did-not-converge',
      message: `Critical-depth iteration did not converge in ${outcome.iterations} steps.`,
      iterations: outcome.iterations,
      evaluations: outcome.evaluations,
    };
  }
  return { converged: true, depthM: outcome.depthM, iterations: outcome.iterations, evaluations: outcome.evaluations };
}

/** Starting depth: the rectangular closed form (q^2/g)^(1/3) with the section's top width at 1 m depth. */
function initialCriticalDepthGuessM(section: SectionGeometry, dischargeM3s: number, upperDepthM: number | undefined): number {
  if (upperDepthM !== undefined) return upperDepthM / 2;
  const unitDischarge = dischargeM3s / section.topWidthM(1);
  const guessM = Math.cbrt((unitDischarge * unitDischarge) / GRAVITY_MS2);
  return Number.isFinite(guessM) && guessM > 0 ? guessM : 1;
}

/** Froude number V / sqrt(g A / T) at a depth; dimensionless. */
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

/** Critical slope Sc = (Q n / K(yc))^2, m/m, for discharge Q (m3/s) and Manning's n. */
export function criticalSlope(section: SectionGeometry, dischargeM3s: number, manningN: number): CriticalSlopeResult {
  if (!(manningN > 0 && Number.isFinite(manningN))) {
    return { converged: false, reason: 'invalid-input', message: "Manning's n must be a positive finite number." };
  }
  const critical = solveCriticalDepth(section, dischargeM3s);
  if (!critical.converged) return { converged: false, reason: critical.reason, message: critical.message };
  const slope = ((dischargeM3s * manningN) / conveyance(section, critical.depthM)) ** 2;
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
 */
export function classifySlope(bedSlope: number, normalDepthM: number | undefined, criticalDepthM: number): SlopeClass {
  if (bedSlope === 0) return 'horizontal';
  if (bedSlope < 0) return 'adverse';
  if (normalDepthM === undefined) return 'steep';
  if (Math.abs(normalDepthM - criticalDepthM) <= CRITICAL_MATCH_RELATIVE_TOLERANCE * criticalDepthM) return 'critical';
  return normalDepthM > criticalDepthM ? 'mild' : 'steep';
}
