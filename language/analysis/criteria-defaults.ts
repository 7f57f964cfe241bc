/**
 * Default design criteria, each with its source. An editor setting or command-line option overrides any of them
 * (criteria-settings.ts), a design's `criteria { }` block overrides those, and a reach's own `criteria { }`
 * overrides the design's. Every threshold a finding uses is defined here, in a setting or in the design file,
 * never as a literal in the checks.
 */
import { findUnit, type UnitSystem } from '../units/units.js';

const FOOT_M = unitFactor('ft');
const CFS_M3S = unitFactor('cfs');

/**
 * The near-critical band of Froude numbers to avoid: flow there is unstable, with standing waves on the surface.
 * FHWA HEC-11 Design of Riprap Revetment (1989), Sec. 3.2, "transition zone" between Froude numbers 0.89 and 1.13
 * (secondary: seen as a verbatim quote).
 */
export const DEFAULT_NEAR_CRITICAL_FROUDE_BAND = {
  low: 0.89,
  high: 1.13,
  source: 'FHWA HEC-11, Design of Riprap Revetment (1989), Sec. 3.2: "transition zone" of Froude numbers 0.89 to 1.13',
} as const;

/**
 * The USBR freeboard rule for canals, F = sqrt(C y), as quoted in Chow (1959), Open-Channel Hydraulics, Ch. 7:
 * F and y in feet with C from 1.5 at 20 cfs to 2.5 at 3,000 cfs and above (0.46 to 0.76 with metres). Because
 * F^2 = C y, C is a length: in metres it is 0.3048 times its value in feet (1.5 ft = 0.457 m, 2.5 ft = 0.762 m; the
 * quoted SI values are these, rounded). y is taken as the normal depth of the flow being checked.
 *
 * The source gives C only at the two ends. Between them Runnel interpolates C linearly in the logarithm of the
 * discharge (the flows span two orders of magnitude), and holds it at 1.5 ft below 20 cfs and at 2.5 ft above
 * 3,000 cfs. This interpolation is Runnel's choice, not the source's: a design can fix C with
 * `freeboard usbr coefficient ...`.
 */
export const USBR_FREEBOARD_RULE = {
  lowDischarge_m3s: 20 * CFS_M3S,
  highDischarge_m3s: 3000 * CFS_M3S,
  lowCoefficient_m: 1.5 * FOOT_M,
  highCoefficient_m: 2.5 * FOOT_M,
  source: 'USBR freeboard rule F = sqrt(C y), quoted in Chow (1959) Open-Channel Hydraulics, Ch. 7',
  interpolation:
    'C interpolated linearly in log(discharge) between 1.5 ft (0.457 m) at 20 cfs and 2.5 ft (0.762 m) at 3,000 cfs, held constant outside; the interpolation is Runnel\'s choice (the source gives the end values only)',
} as const;

/** The USBR coefficient C (m) for a discharge (m3/s); see USBR_FREEBOARD_RULE for the interpolation. */
export function usbrFreeboardCoefficientM(dischargeM3s: number): number {
  const { lowDischarge_m3s, highDischarge_m3s, lowCoefficient_m, highCoefficient_m } = USBR_FREEBOARD_RULE;
  if (!(dischargeM3s > lowDischarge_m3s)) return lowCoefficient_m;
  if (dischargeM3s >= highDischarge_m3s) return highCoefficient_m;
  const fraction = Math.log(dischargeM3s / lowDischarge_m3s) / Math.log(highDischarge_m3s / lowDischarge_m3s);
  return lowCoefficient_m + fraction * (highCoefficient_m - lowCoefficient_m);
}

/** Required USBR freeboard F = sqrt(C y), m, for a depth y (m) and a coefficient C (m). */
export function usbrFreeboardM(coefficientM: number, depthM: number): number {
  return Math.sqrt(coefficientM * Math.max(depthM, 0));
}

/**
 * Default self-cleansing minimum velocity: 2 ft/s in US practice and 0.6 m/s in SI practice, the usual minimum at
 * design flow for drains that must not silt up (common practice). Picked by the design's display units.
 */
export const DEFAULT_MINIMUM_VELOCITY = {
  US_mps: 2 * FOOT_M,
  SI_mps: 0.6,
  source: 'common practice: 2 ft/s (0.6 m/s) minimum velocity at design flow for a self-cleansing drain',
} as const;

export function defaultMinimumVelocityMps(system: UnitSystem): number {
  return system === 'US' ? DEFAULT_MINIMUM_VELOCITY.US_mps : DEFAULT_MINIMUM_VELOCITY.SI_mps;
}

/**
 * How far past a lining's permissible velocity or shear a warning becomes an error, as a fraction (0.2 = 20 %).
 * This default is Runnel's judgement, not a published value: a small exceedance is worth a look, a large one is a
 * failed check. Set `limit margin` to your agency's rule.
 */
export const DEFAULT_LIMIT_MARGIN = {
  fraction: 0.2,
  source: 'Runnel default (engineering judgement, not a published value); set `limit margin` to your agency\'s rule',
} as const;

/**
 * With no freeboard criterion in the design, none is required: only over-topping (normal depth above the bank)
 * is checked. Freeboard rules vary too much between agencies and channel types for a silent default.
 */
export const DEFAULT_FREEBOARD = null;

/**
 * How a criterion taken from an editor setting or a command-line option (criteria-settings.ts) is described wherever
 * its origin is shown (hover, report, findings): plain words that send a reviewer outside the file.
 */
export const CRITERION_FROM_SETTING = 'from the editor or command-line setting, not from the file';

/**
 * Typical range of Manning's n for the channels Runnel checks, used only to warn about likely typos: Chow (1959)
 * Table 5-6 runs from about 0.009 (smooth glass or plastic) to about 0.20 (dense brush) (common practice; the end
 * values are from memory).
 */
export const TYPICAL_MANNING_N = { low: 0.009, high: 0.2, source: 'Chow (1959) Open-Channel Hydraulics, Table 5-6; range from memory' } as const;

function unitFactor(spelling: string): number {
  const unit = findUnit(spelling);
  if (unit === undefined) throw new Error(`internal: unit '${spelling}' missing from the unit table`);
  return unit.toSI;
}
