/**
 * The words that travel with every result: the caution, the method, the assumptions and the published sources.
 * Hover, the report and the CLI show these strings as they are, so they are written once, here.
 */
import { GRAVITY_MS2, UNIT_WEIGHT_OF_WATER_NM3 } from '../hydraulics/index.js';
import type { Provenance } from './model.js';
import { PROFILE_PROVENANCE } from './channel-profiles.js';
import { DEFAULT_LIMIT_MARGIN, DEFAULT_MINIMUM_VELOCITY, DEFAULT_NEAR_CRITICAL_FROUDE_BAND, USBR_FREEBOARD_RULE } from './criteria-defaults.js';

/** Carried by every report and CLI output. */
export const CAUTION =
  'Runnel results are for checking designs, not for approving them. They rest on the assumptions listed with them ' +
  '(steady flow; normal depth in each prismatic reach and a gradually varied water-surface profile along each channel, ' +
  'with the Manning\'s n given). Verify every design against the local ' +
  'drainage criteria and have it reviewed by a licensed engineer before it is built.';

export const REFERENCES = {
  manning: 'Chow (1959) Open-Channel Hydraulics, Ch. 5-6 (Manning\'s equation, uniform flow)',
  critical: 'Chow (1959) Open-Channel Hydraulics, Ch. 3-4 (critical flow, specific energy)',
  slopeClass: 'Chow (1959) Open-Channel Hydraulics, Sec. 9-2 (mild, critical and steep slopes)',
  shear: 'FHWA HEC-15, Design of Roadside Channels with Flexible Linings, 3rd ed. (2005), Eq. 3.1 (tau_d = gamma d S)',
  froudeBand: DEFAULT_NEAR_CRITICAL_FROUDE_BAND.source,
  usbrFreeboard: USBR_FREEBOARD_RULE.source,
  partlyFullConduit: 'Chow (1959) Open-Channel Hydraulics, Ch. 6 (properties of the circular section: conveyance peaks near y/D = 0.938)',
} as const;

export const REACH_METHOD =
  'Normal depth from Manning\'s equation in SI (k = 1; US units converted exactly at input and output); critical depth from Q^2 T = g A^3; both solved by safeguarded Newton iteration to a relative residual of 1e-10.';

/** Assumptions behind every reach result. */
export const REACH_ASSUMPTIONS: readonly string[] = [
  'Steady flow; normal depth, velocity, Froude number and shear are those of uniform flow in a long prismatic reach (backwater from the outlet or the next reach is in the channel\'s water-surface profile, not in these).',
  'Manning\'s n is that of the lining and does not vary with depth.',
  `Kinetic-energy coefficient alpha = 1; g = ${GRAVITY_MS2} m/s2.`,
  `Unit weight of water ${UNIT_WEIGHT_OF_WATER_NM3} N/m3 (62.4 lb/ft3); maximum shear gamma y S on the bed at the deepest point, average shear gamma R S.`,
  'Open sections are extended above the bank to find the depth of an over-topping flow; the flow out of bank is not modelled.',
  'A circular conduit flowing between full-pipe capacity and its peak uniform-flow capacity has two normal depths: the lower one is reported.',
];

export const REACH_PROVENANCE: Provenance = {
  method: REACH_METHOD,
  assumptions: REACH_ASSUMPTIONS,
  references: [REFERENCES.manning, REFERENCES.critical, REFERENCES.slopeClass, REFERENCES.shear],
};

/** How over-topping and freeboard are judged where a channel carries a water-surface profile. */
export const OVERTOPPING_BASIS: readonly string[] = [
  'Over-topping and freeboard are judged on the deeper of normal depth and the computed water surface along the reach: backwater above normal depth governs where it exists; a drawdown below normal depth (toward a free fall or a steeper reach) is not credited, since it holds only while the control below stays as modelled (conservative practice). Where no profile could be computed, normal depth alone is used.',
];

/** How hydraulic jumps are judged. */
export const JUMP_BASIS: readonly string[] = [
  'A jump is expected in the first reach below the start of the supercritical flow whose slope is not steep at that flow; one standing further down, or swept out past the outlet, is a warning. A jump entering at a Froude number within the near-critical band to avoid is a wavy passage through critical depth and is left to the near-critical check.',
  "A jump is checked against the lining of the reach it stands in (and, at a junction, the reach below): the velocity entering the jump against the lining's permissible velocity, and the shear gamma y Sf under the entering flow (friction slope from Manning's equation) against its permissible shear. A lining with neither limit given is not checked. The turbulence of a jump is harsher than uniform flow at the same velocity: limits from uniform-flow tests do not replace the design of a stilling basin (common practice).",
];

/** Assumptions of the whole design check, for the report's assumptions section. */
export const DESIGN_ASSUMPTIONS: readonly string[] = [
  ...REACH_ASSUMPTIONS,
  'A flow\'s discharge applies to every reach of a channel; a channel\'s or a reach\'s own `flows { }` replaces it from there downstream.',
  `Near-critical band by default Froude ${DEFAULT_NEAR_CRITICAL_FROUDE_BAND.low} to ${DEFAULT_NEAR_CRITICAL_FROUDE_BAND.high}: ${DEFAULT_NEAR_CRITICAL_FROUDE_BAND.source}.`,
  `Self-cleansing minimum velocity by default: ${DEFAULT_MINIMUM_VELOCITY.source}.`,
  `A lining limit exceeded by more than the limit margin (default ${DEFAULT_LIMIT_MARGIN.fraction * 100} %) is an error, otherwise a warning: ${DEFAULT_LIMIT_MARGIN.source}.`,
  'No freeboard is required unless the design sets one; over-topping is always checked where a bank height is given. Freeboard is not required of closed conduits.',
  `USBR freeboard rule: ${USBR_FREEBOARD_RULE.source}; ${USBR_FREEBOARD_RULE.interpolation}; y is the depth the check is made at.`,
  ...OVERTOPPING_BASIS,
  ...JUMP_BASIS,
  ...PROFILE_PROVENANCE.assumptions.map((item) => `Water-surface profile: ${item}.`),
];

export const DESIGN_PROVENANCE: Provenance = {
  method: `Each reach checked at each design flow in uniform flow, and each channel's water-surface profile computed at each design flow. ${REACH_METHOD} Profiles: ${PROFILE_PROVENANCE.method}`,
  assumptions: DESIGN_ASSUMPTIONS,
  references: [...Object.values(REFERENCES), ...PROFILE_PROVENANCE.references],
};
