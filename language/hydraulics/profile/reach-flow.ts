/**
 * The flow in one prismatic reach as the step methods see it: the reach's critical and normal depth for the
 * discharge, and the energy and friction quantities at any depth, in SI.
 *
 * With a kinetic-energy coefficient alpha the specific energy is E = y + alpha Q^2 / (2 g A^2) and critical depth
 * (minimum E) satisfies alpha Q^2 T = g A^3 (Chow 1959, Ch. 3). That is the alpha = 1 condition for the discharge
 * Q sqrt(alpha), so the engine's critical-depth solver serves unchanged. The friction slope is Manning's,
 * Sf = (Q n / K)^2 with K = A R^(2/3) (SI, k = 1).
 */
import { GRAVITY_MS2 } from '../constants.js';
import { classifySlope, solveCriticalDepth, type SlopeClass } from '../critical-flow.js';
import { newHydraulicTerms, TERM_AREA, TERM_TOP_WIDTH, TERM_WETTED_PERIMETER, TERM_WETTED_PERIMETER_SLOPE, type SectionGeometry } from '../sections/section-geometry.js';
import { solveNormalDepth } from '../uniform-flow.js';

export interface ReachFlow {
  readonly section: SectionGeometry;
  readonly manningN: number;
  readonly bedSlope: number;
  readonly dischargeM3s: number;
  readonly kineticEnergyCoefficient: number;
  /** Critical depth for alpha, m. */
  readonly criticalDepthM: number;
  /** Normal depth, m; undefined on a horizontal or adverse bed or beyond a conduit's capacity. */
  readonly normalDepthM: number | undefined;
  readonly normalDepthNote: string | undefined;
  readonly slopeClass: SlopeClass;
  /** Highest depth with a free surface, m: just below the crown of a closed conduit, infinite for open sections. */
  readonly highestFreeSurfaceDepthM: number;
}

export type ReachFlowResult =
  | { readonly converged: true; readonly flow: ReachFlow }
  | { readonly converged: false; readonly message: string };

/** Critical depth, m, of discharge Q (m3/s) with kinetic-energy coefficient alpha: alpha Q^2 T = g A^3. */
export function criticalDepthWithAlphaM(section: SectionGeometry, dischargeM3s: number, alpha: number): number | undefined {
  const critical = solveCriticalDepth(section, dischargeM3s * Math.sqrt(alpha));
  return critical.converged ? critical.depthM : undefined;
}

/** Builds the reach flow; fails only when critical depth cannot be found (invalid geometry). */
export function describeReachFlow(
  section: SectionGeometry,
  manningN: number,
  bedSlope: number,
  dischargeM3s: number,
  kineticEnergyCoefficient: number,
): ReachFlowResult {
  const critical = solveCriticalDepth(section, dischargeM3s * Math.sqrt(kineticEnergyCoefficient));
  if (!critical.converged) return { converged: false, message: critical.message };
  const normal = solveNormalDepth(section, { dischargeM3s, manningN, bedSlope });
  const normalDepthM = normal.converged ? normal.depthM : undefined;
  let normalDepthNote: string | undefined;
  if (!normal.converged) normalDepthNote = normal.message;
  else if (normal.branch === 'lower-of-two') normalDepthNote = 'The lower of two uniform-flow depths of the conduit.';
  // Flow beyond a conduit's capacity has no normal depth, but its friction slope at any free-surface depth exceeds
  // the bed slope, as on a mild slope with normal depth above the crown: classify it so.
  const slopeClass: SlopeClass =
    !normal.converged && normal.reason === 'exceeds-capacity' ? 'mild' : classifySlope(bedSlope, normalDepthM, critical.depthM);
  const highestFreeSurfaceDepthM = section.fullDepthM === undefined ? Number.POSITIVE_INFINITY : section.fullDepthM * (1 - 1e-9);
  return {
    converged: true,
    flow: {
      section,
      manningN,
      bedSlope,
      dischargeM3s,
      kineticEnergyCoefficient,
      criticalDepthM: critical.depthM,
      normalDepthM,
      normalDepthNote,
      slopeClass,
      highestFreeSurfaceDepthM,
    },
  };
}

/** Specific energy y + alpha V^2 / 2g, m. */
export function reachSpecificEnergyM(flow: ReachFlow, depthM: number): number {
  const velocityMs = flow.dischargeM3s / flow.section.areaM2(depthM);
  return depthM + (flow.kineticEnergyCoefficient * velocityMs * velocityMs) / (2 * GRAVITY_MS2);
}

/** Velocity head alpha V^2 / 2g, m. */
export function velocityHeadM(flow: ReachFlow, depthM: number): number {
  const velocityMs = flow.dischargeM3s / flow.section.areaM2(depthM);
  return (flow.kineticEnergyCoefficient * velocityMs * velocityMs) / (2 * GRAVITY_MS2);
}

/** Manning friction slope (Q n / K)^2, m/m. */
export function frictionSlope(flow: ReachFlow, depthM: number): number {
  const areaM2 = flow.section.areaM2(depthM);
  const perimeterM = flow.section.wettedPerimeterM(depthM);
  const conveyance = areaM2 * Math.cbrt((areaM2 / perimeterM) ** 2);
  const ratio = (flow.dischargeM3s * flow.manningN) / conveyance;
  return ratio * ratio;
}

/** Specific force Q^2 / (g A) + A ybar, m3 (momentum coefficient beta = 1). */
export function reachSpecificForceM3(flow: ReachFlow, depthM: number): number {
  const q = flow.dischargeM3s;
  return (q * q) / (GRAVITY_MS2 * flow.section.areaM2(depthM)) + flow.section.firstMomentM3(depthM);
}

/** Values at one depth used by a step's Newton iteration; a mutable scratch record avoids allocation in the hot loop. */
export interface EnergyFrictionState {
  specificEnergyM: number;
  /** dE/dy = 1 - alpha Q^2 T / (g A^3). */
  specificEnergySlope: number;
  frictionSlope: number;
  /** dSf/dy = -2 Sf (5T/(3A) - 2P'/(3P)), 1/m. */
  frictionSlopeDerivative: number;
}

export function newEnergyFrictionState(): EnergyFrictionState {
  return { specificEnergyM: 0, specificEnergySlope: 0, frictionSlope: 0, frictionSlopeDerivative: 0 };
}

/** The section's terms at the depth being evaluated, filled by one call (SectionGeometry.fillHydraulicTerms). */
const terms = newHydraulicTerms();

/** Fills `state` with E, dE/dy, Sf and dSf/dy at a depth. */
export function evaluateEnergyFriction(flow: ReachFlow, depthM: number, state: EnergyFrictionState): void {
  flow.section.fillHydraulicTerms(depthM, terms);
  const areaM2 = terms[TERM_AREA]!;
  const perimeterM = terms[TERM_WETTED_PERIMETER]!;
  const topWidthM = terms[TERM_TOP_WIDTH]!;
  const q = flow.dischargeM3s;
  const alphaQ2OverG = (flow.kineticEnergyCoefficient * q * q) / GRAVITY_MS2;
  const inverseArea2 = 1 / (areaM2 * areaM2);
  state.specificEnergyM = depthM + 0.5 * alphaQ2OverG * inverseArea2;
  state.specificEnergySlope = 1 - (alphaQ2OverG * topWidthM * inverseArea2) / areaM2;
  const conveyance = areaM2 * Math.cbrt((areaM2 / perimeterM) ** 2);
  const ratio = (q * flow.manningN) / conveyance;
  const sf = ratio * ratio;
  state.frictionSlope = sf;
  state.frictionSlopeDerivative = -2 * sf * ((5 * topWidthM) / (3 * areaM2) - (2 * terms[TERM_WETTED_PERIMETER_SLOPE]!) / (3 * perimeterM));
}
