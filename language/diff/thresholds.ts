/**
 * When a change of a computed result counts as significant in a comparison. A result changes significantly when
 * its difference reaches BOTH the absolute threshold of its kind and the relative threshold: the absolute one
 * ignores changes below the precision results are reported to, the relative one ignores solver-tolerance noise
 * on large values. A result that appears or disappears (e.g. no normal depth any more) is always significant.
 * `runnel diff` exposes each threshold as an option; these are the defaults.
 */

export interface SignificanceThresholds {
  /** Fraction of the old value, e.g. 0.01 for 1 %. */
  readonly relative: number;
  /** Depths and freeboard, m. */
  readonly length_m: number;
  readonly velocity_mps: number;
  /** Froude number (dimensionless). */
  readonly froudeNumber: number;
  readonly shear_Pa: number;
  /** Capacities, m3/s. */
  readonly discharge_m3s: number;
}

/**
 * Defaults (common practice for reporting precision in drainage design; the rounding steps are from memory):
 * - 1 %: smaller than the uncertainty of Manning's n by far, larger than solver tolerance (1e-10 relative).
 * - 3 mm ~ 0.01 ft: depths and freeboard are reported to the hundredth of a foot or to the millimetre.
 * - 0.01 m/s ~ 0.03 ft/s: velocities are reported to 0.1 ft/s or 0.01 m/s.
 * - 0.01: Froude numbers are reported to two decimals.
 * - 0.5 Pa ~ 0.01 psf: shear stresses are reported to 0.01 psf or 1 Pa.
 * - 0.001 m3/s = 1 L/s ~ 0.035 cfs: capacities are reported to 0.1 cfs or 1 L/s.
 */
export const DEFAULT_SIGNIFICANCE_THRESHOLDS: SignificanceThresholds = {
  relative: 0.01,
  length_m: 0.003,
  velocity_mps: 0.01,
  froudeNumber: 0.01,
  shear_Pa: 0.5,
  discharge_m3s: 0.001,
};

/** Inputs are compared exactly up to floating-point rounding of unit conversions (relative 1e-9). */
export const INPUT_EQUALITY_RELATIVE_TOLERANCE = 1e-9;
