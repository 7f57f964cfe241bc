/**
 * The results a comparison looks at, with the rule that says whether a change is for the worse: one table, so the
 * Markdown, the JSON and the exit policy agree. Keys are the analysis model's field names (SI unit in the name).
 */
import type { FlowResult, ReachResult } from '../analysis/model.js';
import type { ChangeDirection, QuantityKind } from './comparison-model.js';
import type { SignificanceThresholds } from './thresholds.js';

/** The limits in force for a reach, read from its new version, that decide which way is worse. */
export interface DirectionContext {
  readonly maxVelocity_mps: number | null;
  readonly minVelocity_mps: number | null;
  readonly maxShear_Pa: number | null;
  readonly avoidFroude: { readonly low: number; readonly high: number };
}

export interface ComparedQuantity {
  readonly key: string;
  readonly label: string;
  readonly kind: QuantityKind;
  /** The absolute significance threshold that applies to it. */
  readonly threshold: (thresholds: SignificanceThresholds) => number;
  readonly read: (flow: FlowResult) => number | null;
  /** Direction of a change between two present values. */
  readonly direction: (before: number, after: number, context: DirectionContext) => ChangeDirection;
}

function sign(before: number, after: number, increaseIs: ChangeDirection): ChangeDirection {
  if (after === before) return 'neutral';
  if (increaseIs === 'neutral') return 'neutral';
  const opposite: ChangeDirection = increaseIs === 'worse' ? 'better' : 'worse';
  return after > before ? increaseIs : opposite;
}

/**
 * Velocity: below the self-cleansing minimum (before or after) sediment settles, so faster is better there;
 * elsewhere faster flow erodes, so an increase is worse when the lining has a permissible velocity. Without either
 * limit in play the change is shown but not judged (shear carries the erosion check of a lining limited by shear).
 */
function velocityDirection(before: number, after: number, context: DirectionContext): ChangeDirection {
  const { maxVelocity_mps: upper, minVelocity_mps: lower } = context;
  if (lower !== null && Math.min(before, after) < lower) return sign(before, after, 'better');
  if (upper !== null) return sign(before, after, 'worse');
  return 'neutral';
}

/**
 * Froude number: near-critical flow (inside the band to avoid) is unstable, so entering the band is worse and
 * leaving it better; in subcritical flow a rise toward the band is worse; in supercritical flow a rise is worse
 * (faster flow, a stronger jump where it returns to subcritical); turning supercritical is worse.
 */
function froudeDirection(before: number, after: number, context: DirectionContext): ChangeDirection {
  const zone = (froude: number): 0 | 1 | 2 => (froude < context.avoidFroude.low ? 0 : froude > context.avoidFroude.high ? 1 : 2);
  const zoneBefore = zone(before);
  const zoneAfter = zone(after);
  if (zoneBefore !== zoneAfter) return zoneAfter > zoneBefore ? 'worse' : 'better';
  if (zoneAfter === 2) return 'neutral';
  return sign(before, after, 'worse');
}

/** Shear above the lining's permissible value erodes it; without a limit the change is shown but not judged. */
function shearDirection(before: number, after: number, context: DirectionContext): ChangeDirection {
  return context.maxShear_Pa === null ? 'neutral' : sign(before, after, 'worse');
}

/** The per-flow results compared, in the order tables list them. */
export const COMPARED_FLOW_RESULTS: readonly ComparedQuantity[] = [
  {
    key: 'normalDepth_m',
    label: 'normal depth',
    kind: 'length',
    threshold: (t) => t.length_m,
    read: (flow) => flow.normal?.depth_m ?? null,
    // Depth itself is neither good nor bad; its consequence is judged through freeboard.
    direction: () => 'neutral',
  },
  {
    key: 'criticalDepth_m',
    label: 'critical depth',
    kind: 'length',
    threshold: (t) => t.length_m,
    read: (flow) => flow.critical?.depth_m ?? null,
    direction: () => 'neutral',
  },
  {
    key: 'velocity_mps',
    label: 'velocity',
    kind: 'velocity',
    threshold: (t) => t.velocity_mps,
    read: (flow) => flow.normal?.velocity_mps ?? null,
    direction: velocityDirection,
  },
  {
    key: 'froudeNumber',
    label: 'Froude number',
    kind: 'ratio',
    threshold: (t) => t.froudeNumber,
    read: (flow) => flow.normal?.froudeNumber ?? null,
    direction: froudeDirection,
  },
  {
    key: 'freeboard_m',
    label: 'freeboard',
    kind: 'length',
    threshold: (t) => t.length_m,
    read: (flow) => flow.freeboard_m,
    direction: (before, after) => sign(before, after, 'better'),
  },
  // Along the reach, from the channel's water-surface profile: what a change downstream (an outlet level, a
  // culvert) does to a reach whose own inputs did not change. Absent where no profile was computed.
  {
    key: 'profileMaximumDepth_m',
    label: 'deepest water along the reach (profile)',
    kind: 'length',
    threshold: (t) => t.length_m,
    read: (flow) => flow.profile?.maximumDepth_m ?? null,
    // As with normal depth, its consequence is judged through the freeboard along the reach.
    direction: () => 'neutral',
  },
  {
    key: 'profileMinimumFreeboard_m',
    label: 'least freeboard along the reach (profile)',
    kind: 'length',
    threshold: (t) => t.length_m,
    read: (flow) => flow.profile?.minimumFreeboard_m ?? null,
    direction: (before, after) => sign(before, after, 'better'),
  },
  {
    key: 'maxShear_Pa',
    label: 'maximum shear',
    kind: 'shear',
    threshold: (t) => t.shear_Pa,
    read: (flow) => flow.maxShear_Pa,
    direction: shearDirection,
  },
];

/** Capacity of the reach at bank-full depth or full pipe: less capacity is worse. */
export const COMPARED_CAPACITY = {
  key: 'bankfullCapacity_m3s',
  label: 'capacity (bank-full or full pipe)',
  kind: 'discharge',
  threshold: (t: SignificanceThresholds) => t.discharge_m3s,
  read: (reach: ReachResult) => reach.bankfullCapacity_m3s,
  direction: (before: number, after: number): ChangeDirection => sign(before, after, 'better'),
} as const;

/** The limits that judge a reach's changes, from its new version. */
export function directionContextOf(reach: ReachResult): DirectionContext {
  return {
    maxVelocity_mps: reach.lining.maxVelocity_mps,
    minVelocity_mps: reach.criteria.minVelocity_mps,
    maxShear_Pa: reach.lining.maxShear_Pa,
    avoidFroude: reach.criteria.avoidFroude,
  };
}
