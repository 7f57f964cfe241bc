/**
 * Defaults and tolerances of the water-surface profile computation, each with the reason for its value. One home
 * for each: the profile modules and their tests read them from here.
 */

/**
 * Largest step length, m, unless the caller asks for another. Accuracy is governed by the depth-change bound
 * below; this bound only keeps the drawn profile and the stations of over-topping finely resolved along reaches
 * where the depth hardly changes (near normal depth).
 */
export const DEFAULT_MAXIMUM_STEP_LENGTH_M = 20;

/**
 * A step whose depth lands on the other side of normal depth, farther from it than this fraction of it, is
 * shortened (the exact profile never crosses normal depth). A tenth of a micrometre per metre of depth is far
 * below any depth that matters and far above the noise of steps solved to STEP_ENERGY_TOLERANCE_M.
 */
export const NORMAL_DEPTH_CROSSING_BAND_RATIO = 1e-7;

/** Every reach gets at least this many steps, so a short reach (a culvert barrel) is still drawn and searched. */
export const DEFAULT_MINIMUM_STEPS_PER_REACH = 10;

/**
 * Largest change of depth in one step, as a fraction of the depth at the start of the step. With the
 * arithmetic-mean friction slope (a trapezoidal rule, second-order accurate) 2 % keeps the depth at every computed
 * station within about 0.03 % of an accurate integration of the gradually-varied-flow equation, and the distance
 * over which an M1 or M2 curve comes within 5 % of normal depth within 0.3 % in 99 % of cases and 0.8 % at worst
 * (measured over some 4,000 random trapezoidal channels against the integration in
 * test/hydraulics/profile/standard-step.test.ts).
 */
export const DEFAULT_MAXIMUM_DEPTH_CHANGE_RATIO = 0.02;

/**
 * Each step's energy equation is iterated until |residual| <= this, m: the head at the new section, minus the
 * head at the known one, minus (plus) the friction loss. A nanometre is far below any depth that matters and
 * still well above the rounding of heads of a few hundred metres (about 1e-13 m).
 */
export const STEP_ENERGY_TOLERANCE_M = 1e-9;

/** Iteration cap of one step or junction solve; hitting it is reported as a failure, never hidden. */
export const STEP_SOLVE_MAX_ITERATIONS = 200;

/** Cap on the number of steps in one profile (all passes together), so a degenerate input cannot run for ever. */
export const MAXIMUM_PROFILE_STEPS = 5_000_000;

/**
 * The step budget of a profile computed while an engineer types (the analysis behind the editor and the CLI):
 * ten times a 10 km channel at 1 m steps, about 0.1 s. A profile that needs more (a reach many kilometres long
 * with millimetre-deep flow, or a typo such as 1e9 ft) is reported as not computed and its reaches are judged on
 * normal depth.
 */
export const INTERACTIVE_PROFILE_STEPS = 100_000;

/**
 * A jump's station is refined until the bracket on it is shorter than this, m (or one part in 10^9 of the reach
 * length if larger). Jumps are several sequent depths long, so a millimetre is far finer than their position is
 * physically defined.
 */
export const JUMP_LOCATION_TOLERANCE_M = 1e-3;

/**
 * A profile within this fraction of normal depth is reported as running at normal depth ("uniform"), not as an
 * M1, M2, S2 or S3 curve still approaching it. Chow (1959) Example 10-1 ends a backwater computation at a depth
 * 1 % above normal depth in the same spirit (common practice).
 */
export const NORMAL_DEPTH_BAND_RATIO = 0.01;

/** Kinetic-energy coefficient alpha when the caller gives none (uniform velocity across the section). */
export const DEFAULT_KINETIC_ENERGY_COEFFICIENT = 1;

/** Junction (transition) loss coefficient on the velocity-head change when the caller gives none. */
export const DEFAULT_JUNCTION_LOSS_COEFFICIENT = 0;
