/**
 * Uniform flow by Manning's equation in SI (k = 1): Q = (1/n) A R^(2/3) S^(1/2), with A in m2, R in m, S in m/m
 * and Q in m3/s. The US-customary coefficient 1.486 is not a separate constant: it is (1 m / 0.3048 m)^(1/3), the
 * result of converting units at the edges (Chow 1959, Sec. 5-6).
 *
 * Normal depth is the depth at which Manning's discharge equals the design discharge. It exists only on a falling
 * bed (S > 0). Open sections are solved on the prism extended above the bank. A circular conduit's conveyance peaks
 * near y/D = 0.938 above the full-pipe value, so flows between full-pipe capacity and that peak have two uniform-flow
 * depths: the lower one is reported and the result says so; flows above the peak exceed capacity.
 */
import { solveIncreasingRoot } from './depth-solver.js';
import type { SectionGeometry } from './sections/section-geometry.js';

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

/** Manning conveyance K = A R^(2/3), m^(8/3): Q = K sqrt(S) / n. */
export function conveyance(section: SectionGeometry, depthM: number): number {
  const areaM2 = section.areaM2(depthM);
  const perimeterM = section.wettedPerimeterM(depthM);
  return perimeterM > 0 ? areaM2 * Math.cbrt((areaM2 / perimeterM) ** 2) : 0;
}

/** Discharge in uniform flow at a depth, m3/s (Manning, SI). */
export function manningDischargeM3s(section: SectionGeometry, depthM: number, manningN: number, bedSlope: number): number {
  return (conveyance(section, depthM) * Math.sqrt(Math.max(bedSlope, 0))) / manningN;
}

/**
 * Depth at which a closed conduit's conveyance peaks, m (about 0.938 D for a circle); undefined for open sections,
 * whose conveyance grows without bound. Found once per section by bisection on d(ln K)/dy = 5T/(3A) - 2P'/(3P).
 */
export function depthOfMaximumConveyanceM(section: SectionGeometry): number | undefined {
  const fullDepthM = section.fullDepthM;
  if (fullDepthM === undefined) return undefined;
  const cached = maximumConveyanceDepthCache.get(section);
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
  const depthM = (lowerM + upperM) / 2;
  maximumConveyanceDepthCache.set(section, depthM);
  return depthM;
}
const maximumConveyanceDepthCache = new WeakMap<SectionGeometry, number>();

/** Full-pipe discharge of a closed conduit in uniform flow, m3/s; undefined for open sections. */
export function fullFlowCapacityM3s(section: SectionGeometry, manningN: number, bedSlope: number): number | undefined {
  return section.fullDepthM === undefined ? undefined : manningDischargeM3s(section, section.fullDepthM, manningN, bedSlope);
}

/** Largest uniform-flow discharge of a closed conduit (at the conveyance peak), m3/s; undefined for open sections. */
export function maximumUniformFlowCapacityM3s(section: SectionGeometry, manningN: number, bedSlope: number): number | undefined {
  const peakDepthM = depthOfMaximumConveyanceM(section);
  return peakDepthM === undefined ? undefined : manningDischargeM3s(section, peakDepthM, manningN, bedSlope);
}

/** Solves Manning's equation for normal depth; see the module comment for outcomes. Tolerance: |Q(y) - Q| <= 1e-10 Q. */
export function solveNormalDepth(section: SectionGeometry, input: UniformFlowInput): NormalDepthResult {
  const { dischargeM3s, manningN, bedSlope } = input;
  if (!(dischargeM3s > 0 && Number.isFinite(dischargeM3s)) || !(manningN > 0 && Number.isFinite(manningN)) || !Number.isFinite(bedSlope)) {
    return { converged: false, reason: 'invalid-input', message: 'Discharge and Manning\'s n must be positive finite numbers.', iterations: 0, evaluations: 0 };
  }
  if (bedSlope <= 0) {
    return {
      converged: false,
      reason: 'horizontal-or-adverse-slope',
      message: 'No normal depth: uniform flow needs a bed that falls downstream (slope > 0).',
      iterations: 0,
      evaluations: 0,
    };
  }
  const targetConveyance = (dischargeM3s * manningN) / Math.sqrt(bedSlope);
  const peakDepthM = depthOfMaximumConveyanceM(section);
  let branch: 'single' | 'lower-of-two' = 'single';
  if (peakDepthM !== undefined && section.fullDepthM !== undefined) {
    const peakConveyance = conveyance(section, peakDepthM);
    if (targetConveyance > peakConveyance) {
      const capacityM3s = (peakConveyance * Math.sqrt(bedSlope)) / manningN;
      return {
        converged: false,
        reason: 'exceeds-capacity',
        message: `Flow exceeds the conduit's largest uniform-flow capacity of ${capacityM3s.toPrecision(4)} m3/s (reached near ${(peakDepthM / section.fullDepthM).toFixed(3)} of the diameter); it would flow under pressure.`,
        capacityM3s,
        iterations: 0,
        evaluations: 0,
      };
    }
    if (targetConveyance > conveyance(section, section.fullDepthM)) branch = 'lower-of-two';
  }
  const outcome = solveIncreasingRoot({
    evaluate: (y) => {
      const areaM2 = section.areaM2(y);
      const perimeterM = section.wettedPerimeterM(y);
      const value = areaM2 * Math.cbrt((areaM2 / perimeterM) ** 2);
      // dK/dy = K (5T / (3A) - 2 P' / (3P)), using dA/dy = T.
      const slope = value * ((5 * section.topWidthM(y)) / (3 * areaM2) - (2 * section.wettedPerimeterSlope(y)) / (3 * perimeterM));
      return { value, slope };
    },
    target: targetConveyance,
    initialDepthM: initialNormalDepthGuessM(section, targetConveyance, peakDepthM),
    upperDepthM: peakDepthM,
    crownDepthM: section.fullDepthM,
  });
  if (!outcome.converged) {
    return {
      converged: false,
      reason: 'did-not-converge',
      message: `Normal-depth iteration did not converge in ${outcome.iterations} steps (last depth ${outcome.lastDepthM.toPrecision(6)} m).`,
      iterations: outcome.iterations,
      evaluations: outcome.evaluations,
    };
  }
  return { converged: true, depthM: outcome.depthM, branch, iterations: outcome.iterations, evaluations: outcome.evaluations };
}

/**
 * A starting depth for the solve, m. Conveyance of a wide channel grows like y^(5/3) and that of a V like y^(8/3):
 * starting from the depth at which the section's own top width at 1 m depth, treated as a wide rectangle, carries
 * the flow, the log-space Newton steps close in quickly whatever the shape.
 */
function initialNormalDepthGuessM(section: SectionGeometry, targetConveyance: number, peakDepthM: number | undefined): number {
  if (peakDepthM !== undefined) return peakDepthM / 2;
  const referenceWidthM = section.topWidthM(1);
  const wideChannelDepthM = (targetConveyance / referenceWidthM) ** 0.6;
  return Number.isFinite(wideChannelDepthM) && wideChannelDepthM > 0 ? wideChannelDepthM : 1;
}
