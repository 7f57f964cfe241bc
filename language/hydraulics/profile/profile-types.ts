/**
 * The input and output of a channel's water-surface profile: a channel is an ordered list of prismatic reaches
 * (upstream to downstream) carrying one steady discharge to an outlet. All values SI: m, m2, m3/s, m/s, m/m.
 * Stations are horizontal distances in metres from the upstream end of the first reach.
 */
import type { SlopeClass } from '../critical-flow.js';
import type { SectionGeometry } from '../sections/section-geometry.js';
import type { ProfileReuse } from './reach-reuse.js';

// ---------------------------------------------------------------------------------------------------------------
// Input

/** One prismatic reach: one section, one roughness, one bed slope. */
export interface ProfileReachInput {
  /** Name shown with results (e.g. the reach name written in the design). */
  readonly name: string;
  readonly section: SectionGeometry;
  /** Manning's n, s/m^(1/3) (> 0). */
  readonly manningN: number;
  /** Bed slope, m/m, positive when the bed falls downstream; 0 (horizontal) and negative (adverse) are allowed. */
  readonly bedSlope: number;
  /** Horizontal length, m (> 0). */
  readonly lengthM: number;
  /**
   * Invert elevation at the downstream end, m. When omitted the bed is continuous with the next reach downstream
   * (this reach ends at that reach's upstream invert); for the last reach it then defaults to 0, i.e. elevations
   * are relative to the outlet invert. Giving it lets the bed drop or rise at a junction.
   */
  readonly downstreamInvertElevationM?: number;
  /** Depth from the invert to the top of the lower bank, m; enables the freeboard summary of the reach. */
  readonly bankHeightM?: number;
}

/**
 * The downstream boundary condition. It controls subcritical flow only; supercritical flow leaves the channel
 * whatever the outlet does (a jump beyond the outlet is reported when the tailwater cannot hold it).
 */
export type OutletControl =
  /** The channel ends in a free overfall: critical depth at the brink. */
  | { readonly kind: 'free-fall' }
  /** A given water-surface elevation at the outlet (pond, river, culvert headwater), m. */
  | { readonly kind: 'water-level'; readonly elevationM: number }
  /** The flow leaves at the last reach's normal depth (the channel continues uniformly beyond the outlet). */
  | { readonly kind: 'normal-depth' };

/**
 * The upstream boundary condition. It controls supercritical flow only; subcritical flow at the inlet is set by
 * the downstream controls.
 */
export type InletControl =
  /** Water enters from a pool or inlet structure: critical depth at the entrance when the first reach is steep. */
  | { readonly kind: 'critical-depth' }
  /** Water arrives at the first reach's normal depth (uniform approach flow). */
  | { readonly kind: 'normal-depth' }
  /** A given supercritical depth at the entrance, m (e.g. the contracted jet below a sluice gate). */
  | { readonly kind: 'depth'; readonly depthM: number };

/** Step-length control of the standard step method; every field is optional (defaults in profile-defaults.ts). */
export interface StepControl {
  /** Longest step, m. */
  readonly maximumStepLengthM?: number;
  /** Fewest steps per reach (the longest step is at most the reach length divided by this). */
  readonly minimumStepsPerReach?: number;
  /** Largest depth change per step, as a fraction of the depth at the start of the step. */
  readonly maximumDepthChangeRatio?: number;
  /**
   * Most steps the whole profile may take before it is reported as not computed (default MAXIMUM_PROFILE_STEPS).
   * Interactive callers set a smaller budget so that no input can stall the editor.
   */
  readonly maximumSteps?: number;
}

export interface ChannelProfileInput {
  /** Reaches in flow order, upstream first (at least one). */
  readonly reaches: readonly ProfileReachInput[];
  /** Steady discharge through every reach, m3/s (> 0). */
  readonly dischargeM3s: number;
  readonly outlet: OutletControl;
  /** Defaults to critical depth at the entrance. */
  readonly inlet?: InletControl;
  /**
   * Loss at a junction as a fraction of the change of velocity head across it, 0 <= k < 1 (default 0): the head
   * loss is k |alpha V_up^2/2g - alpha V_down^2/2g|. Zero wherever the velocity does not change.
   */
  readonly junctionLossCoefficient?: number;
  /** Kinetic-energy (Coriolis) coefficient alpha, >= 1 (default 1). */
  readonly kineticEnergyCoefficient?: number;
  readonly stepControl?: StepControl;
  /**
   * Reach computations remembered from earlier profiles (reach-reuse.ts), taken over where their inputs are the
   * same; the result is the same as without. Given by callers that recompute similar channels, such as an editor.
   */
  readonly reuse?: ProfileReuse;
}

// ---------------------------------------------------------------------------------------------------------------
// Output

export type ProfileClass = 'M1' | 'M2' | 'M3' | 'S1' | 'S2' | 'S3' | 'C1' | 'C3' | 'H2' | 'H3' | 'A2' | 'A3';

/** A segment's class: a profile type of Chow (1959) Table 9-1, or 'uniform' where the depth is within the normal-depth band. */
export type SegmentClass = ProfileClass | 'uniform';

export type ProfileRegime = 'subcritical' | 'critical' | 'supercritical';

/** One computed section of the profile. */
export interface ProfilePoint {
  /** Distance from the upstream end of the channel, m. */
  readonly stationM: number;
  readonly reachIndex: number;
  readonly reachName: string;
  readonly depthM: number;
  readonly invertElevationM: number;
  readonly waterSurfaceElevationM: number;
  /** Water surface plus alpha V^2 / 2g, m. */
  readonly energyElevationM: number;
  readonly velocityMs: number;
  /** V / sqrt(g A / T). */
  readonly froudeNumber: number;
  /** Relative to the critical depth of the reach (which includes alpha). */
  readonly regime: ProfileRegime;
}

/** A profile's points as columns: index i is points[i]. */
export interface ProfilePointColumns {
  readonly length: number;
  reachIndexAt(index: number): number;
  depthAt(index: number): number;
  /** m from the channel's upstream end. */
  stationAt(index: number): number;
  regimeAt(index: number): ProfileRegime;
  /** points[index], built on request. */
  point(index: number): ProfilePoint;
}

/**
 * How two consecutive points are joined.
 * - 'gradually-varied': a standard step; headLossM is the friction loss, energyResidualM closes the energy equation.
 * - 'junction': energy continuity across a junction of reaches; headLossM is the transition loss.
 * - 'junction-critical-control': the flow passes critical depth at the junction (a drop, a narrowing or a
 *   mild-to-steep break); headLossM is the head dissipated; energyResidualM is null (no balance is imposed).
 * - 'hydraulic-jump': headLossM is the jump's energy loss; energyResidualM is null (momentum is balanced instead).
 */
export type ProfileStepKind = 'gradually-varied' | 'junction' | 'junction-critical-control' | 'hydraulic-jump';

export interface ProfileStep {
  readonly kind: ProfileStepKind;
  readonly upstreamPointIndex: number;
  readonly downstreamPointIndex: number;
  /** Horizontal length, m (0 at junctions and jumps). */
  readonly lengthM: number;
  /** Head lost between the two points, m. */
  readonly headLossM: number;
  /**
   * Upstream head minus downstream head minus headLossM, m; null where no energy balance is imposed. It is
   * recomputed from the reported points (inside a reach from its stations and depths, heads measured from the
   * reach's upstream invert; across a junction from the two points' elevations), so besides the step's solve
   * tolerance it carries their rounding: a few units in the last place of the heads, and of the stations times the
   * friction slope (which only matters for flow a millimetre deep at tens of metres per second, as below a drop of
   * tens of metres).
   */
  readonly energyResidualM: number | null;
}

export interface ProfileSegment {
  readonly reachIndex: number;
  readonly reachName: string;
  readonly fromStationM: number;
  readonly toStationM: number;
  readonly profileClass: SegmentClass;
  /** One phrase for people, e.g. "M1 backwater curve (mild slope, above normal depth)". */
  readonly description: string;
}

export type JumpType = 'undular' | 'weak' | 'oscillating' | 'steady' | 'strong';

/**
 * Where a jump stands.
 * - 'within-reach': inside a reach, where the specific forces of the two profiles match.
 * - 'at-junction': at a junction of two reaches (forced by the junction, or just below a drop).
 * - 'beyond-outlet': the tailwater is too low to hold the jump in the channel; it is swept out past the outlet.
 */
export type JumpPlacement = 'within-reach' | 'at-junction' | 'beyond-outlet';

export interface HydraulicJump {
  readonly placement: JumpPlacement;
  readonly stationM: number;
  /** Reach the jump stands in; for 'at-junction' the reach (just above or just below the junction) whose section carries its depths. */
  readonly reachIndex: number;
  readonly reachName: string;
  /** Supercritical depth entering the jump, m. */
  readonly upstreamDepthM: number;
  /** Subcritical depth leaving the jump, m (for 'beyond-outlet': the sequent depth the tailwater would need). */
  readonly downstreamDepthM: number;
  readonly upstreamFroudeNumber: number;
  /** Energy lost in the jump, m (for a jump at the foot of a drop: from the brink's head to the head below). */
  readonly energyLossM: number;
  /** By upstream Froude number (USBR Engineering Monograph 25; Chow 1959, Sec. 15-3). */
  readonly jumpType: JumpType | 'not-a-jump';
  /** Reach in which the supercritical flow entering the jump began. */
  readonly supercriticalFromReachIndex: number;
  /** True when the jump stands downstream of the reach where the supercritical flow began (swept out of it). */
  readonly sweptOutOfReach: boolean;
  /** One sentence for people. */
  readonly description: string;
}

/** A stretch of a reach over which the water stands above the bank. */
export interface StationRange {
  readonly fromStationM: number;
  readonly toStationM: number;
}

export interface ReachProfileSummary {
  readonly reachIndex: number;
  readonly reachName: string;
  readonly startStationM: number;
  readonly endStationM: number;
  /** Null when there is none (horizontal or adverse bed, or flow beyond a conduit's capacity); see normalDepthNote. */
  readonly normalDepthM: number | null;
  readonly normalDepthNote: string | null;
  /** Critical depth, m, for the profile's alpha (alpha Q^2 T = g A^3). */
  readonly criticalDepthM: number;
  readonly slopeClass: SlopeClass;
  readonly maximumDepthM: number;
  readonly maximumDepthStationM: number;
  readonly bankHeightM: number | null;
  /** Least of bank height minus depth along the reach, m (negative when over-topped); null without a bank height. */
  readonly minimumFreeboardM: number | null;
  readonly minimumFreeboardStationM: number | null;
  /** Where the water surface stands above the bank (stations interpolated between computed points). */
  readonly overtoppedRanges: readonly StationRange[];
  /** The classes of the reach's segments in flow order, without repeats. */
  readonly profileClasses: readonly SegmentClass[];
}

/** Something a reader should know about the profile; `code` is stable kebab-case. */
export interface ProfileNote {
  readonly code:
    | 'tailwater-below-critical-depth'
    | 'outlet-normal-depth-supercritical'
    | 'supercritical-at-outlet'
    | 'jump-swept-out-of-channel'
    | 'jump-swept-out-of-reach'
    | 'jump-at-junction'
    | 'inlet-drowned'
    | 'critical-depth-at-junction'
    | 'inlet-depth-not-supercritical';
  readonly message: string;
  readonly reachIndex: number | null;
  readonly stationM: number | null;
}

/** How the profile was obtained; the same fields as the analysis model's provenance. */
export interface ProfileProvenance {
  readonly method: string;
  readonly assumptions: readonly string[];
  readonly references: readonly string[];
}

export interface ChannelProfile {
  readonly converged: true;
  readonly dischargeM3s: number;
  readonly kineticEnergyCoefficient: number;
  /** Computed sections in flow order; a junction or a jump appears as two points at the same station. Built on first read. */
  readonly points: readonly ProfilePoint[];
  /** points.length - 1 joins, in order. Built on first read. */
  readonly steps: readonly ProfileStep[];
  /** The same points, read one value at a time without building the point objects. */
  readonly pointTable: ProfilePointColumns;
  readonly segments: readonly ProfileSegment[];
  readonly jumps: readonly HydraulicJump[];
  readonly reaches: readonly ReachProfileSummary[];
  readonly notes: readonly ProfileNote[];
  /** Largest |energyResidualM| over all steps, m. */
  readonly maximumEnergyResidualM: number;
  /** The tolerance every step's energy equation was solved to, m. */
  readonly energyToleranceM: number;
  readonly provenance: ProfileProvenance;
}

export type ProfileFailureReason =
  | 'invalid-input'
  /** A closed conduit would have to flow full (under pressure): the free-surface profile ends there. */
  | 'conduit-surcharged'
  /** The outlet control gives no depth (normal depth asked for on a horizontal or adverse last reach, or beyond capacity). */
  | 'no-outlet-depth'
  | 'did-not-converge';

export interface ChannelProfileFailure {
  readonly converged: false;
  readonly reason: ProfileFailureReason;
  /** One sentence for people, numbers in SI. */
  readonly message: string;
  readonly reachIndex: number | null;
  readonly stationM: number | null;
}

export type ChannelProfileResult = ChannelProfile | ChannelProfileFailure;
