/**
 * Physical constants and solver defaults used by the engine. One home for each; SI base units.
 */

/** Standard acceleration of gravity, m/s2 (CGPM 1901; NIST SP 330). */
export const GRAVITY_MS2 = 9.80665;

/** Unit weight of water, N/m3 (about 62.4 lb/ft3; common practice in drainage design). */
export const UNIT_WEIGHT_OF_WATER_NM3 = 9810;

/**
 * Relative tolerance on the defining equation of a depth solve: normal depth stops when
 * |Q(y) - Q| <= tolerance x Q; critical depth when |Z(y) - Z| <= tolerance x Z, Z = A sqrt(A/T) the section factor.
 * The one exception is a root where F changes faster than adjacent doubles can resolve (a critical depth within
 * about 5e-7 D of a conduit crown): there the depth returned is pinned between two adjacent doubles, F evaluated on
 * both sides of the target.
 */
export const DEPTH_SOLVE_RELATIVE_TOLERANCE = 1e-10;

/** Upper bound on iterations of a safeguarded depth solve; hitting it is reported, never hidden. */
export const DEPTH_SOLVE_MAX_ITERATIONS = 100;

/**
 * Froude numbers within this relative distance of 1 are classed as critical flow, and normal depths within it of
 * critical depth give a critical slope class. It only absorbs rounding: the near-critical band to avoid in design
 * is a criterion of the analysis, not this constant.
 */
export const CRITICAL_MATCH_RELATIVE_TOLERANCE = 1e-6;
