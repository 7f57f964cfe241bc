/**
 * The analysis model: what Runnel computed for one design document. Every view (diagnostics, inlay hints, hover,
 * the report, `runnel check --format json`, `runnel diff`) reads this one structure, computed once per document
 * version. All numbers are SI; the unit is part of each field name (`normalDepth_m`), so the JSON output is this
 * model serialised as it is. Values that do not exist are `null`, never NaN.
 */
import type { Dimension, UnitSystem } from '../units/units.js';

/** Position in a document: zero-based line and UTF-16 character, as in LSP. */
export interface SourcePosition {
  readonly line: number;
  readonly character: number;
}

export interface SourceRange {
  readonly start: SourcePosition;
  readonly end: SourcePosition;
}

/** A place in a file: the document URI and a range in it. */
export interface SourceLocation {
  readonly uri: string;
  readonly range: SourceRange;
}

/** How a result was obtained, shown identically by hover, report and CLI. */
export interface Provenance {
  /** e.g. "Manning's equation (SI, k = 1), normal depth by safeguarded Newton iteration". */
  readonly method: string;
  /** e.g. "steady flow", "uniform flow in a long prismatic reach", "kinetic-energy coefficient alpha = 1". */
  readonly assumptions: readonly string[];
  /** Published sources, e.g. "Chow (1959) Open-Channel Hydraulics, Sec. 5-6". */
  readonly references: readonly string[];
}

export type Severity = 'error' | 'warning' | 'information';

/** A check outcome for people: pass, or the worst severity of its findings. */
export type CheckStatus = 'pass' | 'information' | 'warning' | 'fail';

/**
 * One finding of the analysis. `code` is stable kebab-case (e.g. `overtopping`, `freeboard-below-required`,
 * `supercritical-flow`, `near-critical-flow`, `velocity-above-permissible`, `shear-above-permissible`,
 * `velocity-below-self-cleansing`, `conduit-over-capacity`, `conduit-two-depth-zone`, `no-normal-depth`,
 * `hydraulic-jump`, `hydraulic-jump-swept-out`, `hydraulic-jump-lining-exceeded`, `conduit-surcharged`,
 * `profile-not-computed`; the full list is FINDING_CODES in finding-messages.ts). Over-topping and freeboard say in
 * `data.judgedOn` whether the computed water surface ('profile') or normal depth ('normal-depth') decided them.
 */
export interface Finding {
  readonly code: string;
  readonly severity: Severity;
  /** One or two sentences with numbers and units in the document's display units. */
  readonly message: string;
  readonly location: SourceLocation;
  readonly channel: string | null;
  readonly reach: string | null;
  readonly flow: string | null;
  /** Other places involved, e.g. the lining whose limit is exceeded. */
  readonly related: readonly { readonly message: string; readonly location: SourceLocation }[];
  /** Values a quick fix or a diff needs, SI, unit in the key (e.g. { required_m: 0.15, actual_m: 0.08 }). */
  readonly data: Readonly<Record<string, number | string>>;
}

/** The hydraulic state at one depth (mirrors language/hydraulics HydraulicState, with unit-suffixed names). */
export interface StateResult {
  readonly depth_m: number;
  readonly area_m2: number;
  readonly wettedPerimeter_m: number;
  readonly topWidth_m: number;
  readonly hydraulicRadius_m: number;
  readonly hydraulicDepth_m: number;
  readonly velocity_mps: number;
  readonly froudeNumber: number;
  readonly specificEnergy_m: number;
  readonly specificForce_m3: number;
}

/** The results of one design flow in one reach. */
export interface FlowResult {
  /** Flow name as written in the file, e.g. `q100`. */
  readonly flow: string;
  /** Its description, e.g. "100-year storm", or null. */
  readonly description: string | null;
  readonly discharge_m3s: number;
  /** Where the flow is defined (a flows block or the reach's own flow). */
  readonly flowLocation: SourceLocation;
  /** Uniform flow at normal depth; null when there is none (see normalDepthNote). */
  readonly normal: StateResult | null;
  /** Why there is no normal depth, or a remark on it (the lower of two depths near a conduit crown); null if none. */
  readonly normalDepthNote: string | null;
  readonly critical: StateResult | null;
  /** Bed slope on which this flow would be critical, m/m. */
  readonly criticalSlope: number | null;
  readonly regime: 'subcritical' | 'critical' | 'supercritical' | null;
  readonly slopeClass: 'mild' | 'critical' | 'steep' | 'horizontal' | 'adverse';
  /** gamma y S at normal depth, Pa. */
  readonly maxShear_Pa: number | null;
  /** gamma R S at normal depth, Pa. */
  readonly averageShear_Pa: number | null;
  /** Bank (or crown) height minus normal depth, m; negative when over-topped. */
  readonly freeboard_m: number | null;
  /** Freeboard the criteria require at this flow, m. */
  readonly requiredFreeboard_m: number | null;
  readonly status: CheckStatus;
  /** Findings about this reach and flow (also listed in DesignAnalysis.findings). */
  readonly findings: readonly Finding[];
  /**
   * This reach's part of its channel's water-surface profile at this flow (ChannelResult.profiles); null when the
   * channel's profile could not be computed (the channel's profile entry says why). Over-topping and freeboard are
   * judged on the deeper of this profile and normal depth. Added by the profile work (optional so hand-made results
   * stay valid).
   */
  readonly profile?: ReachFlowProfile | null;
}

/**
 * One reach's share of a channel's water-surface profile at one flow. Stations are distances along the channel
 * from the upstream end of its first reach, m (the longitudinal view's stations).
 */
export interface ReachFlowProfile {
  /** Stations of the reach's upstream and downstream ends, m. */
  readonly startStation_m: number;
  readonly endStation_m: number;
  /** Deepest water along the reach, m, and where. */
  readonly maximumDepth_m: number;
  readonly maximumDepthStation_m: number;
  /** Least bank height minus depth along the reach, m (negative when over-topped), and where; null for conduits and sections without a bank height. */
  readonly minimumFreeboard_m: number | null;
  readonly minimumFreeboardStation_m: number | null;
  /** Where the water surface stands above the bank (stations interpolated between computed points). */
  readonly overtoppedRanges: readonly StationRange[];
  /** Classes of the profile along the reach in flow order, without repeats: 'M1', 'S2', ..., or 'uniform'. */
  readonly profileClasses: readonly string[];
}

/** A stretch along a channel, m from its upstream end. */
export interface StationRange {
  readonly fromStation_m: number;
  readonly toStation_m: number;
}

/** One computed section of a water-surface profile. */
export interface ProfilePointResult {
  /** Distance from the channel's upstream end, m. */
  readonly station_m: number;
  /** The reach the point belongs to (a junction or a jump appears as two points at one station). */
  readonly reach: string;
  readonly depth_m: number;
  /** Bed elevation, m (relative to the outlet invert when the channel gives no inverts: see `datum`). */
  readonly invert_m: number;
  /** Water-surface elevation, m (same datum). */
  readonly waterSurface_m: number;
  readonly velocity_mps: number;
  readonly froudeNumber: number;
}

/** A stretch of the profile with one class (Chow 1959, Table 9-1), or 'uniform' within 1 % of normal depth. */
export interface ProfileSegmentResult {
  readonly reach: string;
  readonly fromStation_m: number;
  readonly toStation_m: number;
  readonly profileClass: 'M1' | 'M2' | 'M3' | 'S1' | 'S2' | 'S3' | 'C1' | 'C3' | 'H2' | 'H3' | 'A2' | 'A3' | 'uniform';
  /** e.g. "M1 backwater curve (mild slope, above normal depth)". */
  readonly description: string;
}

/** A hydraulic jump of a profile. */
export interface HydraulicJumpResult {
  /** Where it stands, m from the channel's upstream end. */
  readonly station_m: number;
  readonly reach: string;
  /** Inside a reach, at a junction of two reaches, or beyond the outlet (the tailwater cannot hold it in the channel). */
  readonly placement: 'within-reach' | 'at-junction' | 'beyond-outlet';
  /** Supercritical depth entering the jump and subcritical sequent depth leaving it, m. */
  readonly upstreamDepth_m: number;
  readonly downstreamDepth_m: number;
  readonly upstreamFroudeNumber: number;
  /** Velocity entering the jump, m/s. */
  readonly upstreamVelocity_mps: number;
  readonly energyLoss_m: number;
  /** By upstream Froude number (USBR Engineering Monograph 25; Chow 1959, Sec. 15-3); 'not-a-jump' for Froude number 1 or less. */
  readonly jumpType: 'undular' | 'weak' | 'oscillating' | 'steady' | 'strong' | 'not-a-jump';
  /** The reach where the supercritical flow that the jump ends began. */
  readonly supercriticalFrom: string;
  /**
   * True when the jump stands below the first reach that could hold it (the first reach below the start of the
   * supercritical flow whose slope is not steep at this flow), or beyond the outlet.
   */
  readonly sweptOut: boolean;
  /**
   * True when the flow enters within the near-critical Froude band the criteria avoid in that reach: a wavy
   * passage through critical depth rather than a jump to speak of. Findings, drawings and tables leave it out
   * (the near-critical check reports the reach).
   */
  readonly nearCritical: boolean;
  readonly description: string;
}

/** A remark on a profile; `code` is stable kebab-case (e.g. `critical-depth-at-junction`, `supercritical-at-outlet`). */
export interface ProfileNoteResult {
  readonly code: string;
  /** One sentence, numbers in SI. */
  readonly message: string;
  readonly reach: string | null;
  readonly station_m: number | null;
}

/**
 * The steady gradually-varied-flow profile of a channel at one design flow: every computed point from the head of
 * the channel to its outlet, the profile classes, the jumps and the remarks. Where a flow's discharge changes
 * along the channel the profile is computed in runs of equal discharge joined at the same water level.
 */
export interface ChannelFlowProfile {
  readonly flow: string;
  /** False when no part of the profile could be computed: `failure` says why and the lists are empty. */
  readonly computed: boolean;
  /**
   * Why the profile, or part of it, could not be computed; null when it covers the whole channel. Where the water
   * fills a conduit (`conduit-surcharged`) the profile covers only the reaches below that conduit.
   */
  readonly failure: { readonly reason: string; readonly message: string; readonly reach: string | null; readonly station_m: number | null } | null;
  /** 'absolute' when some reach gives invert elevations; otherwise elevations are relative to the outlet invert. */
  readonly datum: 'absolute' | 'relative-to-outlet';
  readonly points: readonly ProfilePointResult[];
  readonly segments: readonly ProfileSegmentResult[];
  readonly jumps: readonly HydraulicJumpResult[];
  readonly notes: readonly ProfileNoteResult[];
  /** Largest energy-equation residual over all steps, m; null when not computed. */
  readonly maximumEnergyResidual_m: number | null;
  readonly provenance: Provenance;
}

export type SectionShapeName = 'rectangle' | 'trapezoid' | 'triangle' | 'parabola' | 'circle';

export interface SectionResult {
  readonly name: string;
  readonly shape: SectionShapeName;
  /** Shape dimensions in SI with unit-suffixed keys, e.g. { bottomWidth_m, leftSideSlope_HV, rightSideSlope_HV }. */
  readonly dimensions: Readonly<Record<string, number>>;
  /** Bank height of an open section (the depth at which it over-tops), m; null when not given. */
  readonly bankDepth_m: number | null;
  /** Inside height of a closed conduit, m; null for open sections. */
  readonly fullDepth_m: number | null;
  readonly location: SourceLocation;
  /** The section's description as written, e.g. "Standard V ditch"; null if none. Added by the language work (optional so hand-made results stay valid). */
  readonly description?: string | null;
}

export interface LiningResult {
  readonly name: string;
  readonly manningN: number;
  readonly maxVelocity_mps: number | null;
  readonly maxShear_Pa: number | null;
  readonly description: string | null;
  readonly location: SourceLocation;
  /** Where the lining's values come from, as written in its `source "..."` line; null if none. Added by the language work (optional so hand-made results stay valid). */
  readonly source?: string | null;
}

/** The criteria in force for a reach after project-wide values and reach overrides are merged, SI. */
export interface ResolvedCriteria {
  /** A fixed freeboard, m, or the USBR rule F = sqrt(C y); null if none is required. */
  readonly freeboard: { readonly kind: 'fixed'; readonly height_m: number } | { readonly kind: 'usbr-rule'; readonly coefficientC_SI: number | null } | null;
  /** Near-critical Froude band to avoid. */
  readonly avoidFroude: { readonly low: number; readonly high: number };
  /** Self-cleansing minimum velocity, m/s; null if none. */
  readonly minVelocity_mps: number | null;
  /**
   * How far past a lining's permissible velocity or shear a warning becomes an error, as a fraction of the
   * permissible value (0.2 = 20 %). Added by the language work.
   */
  readonly limitMargin: number;
  /** Where each value came from (keys `freeboard`, `avoidFroude`, `minVelocity`, `limitMargin`); see CriterionOrigin. */
  readonly origin: Readonly<Record<string, CriterionOrigin>>;
}

/**
 * Where a criterion in force came from, from weakest to strongest: Runnel's built-in default ('default'), an editor
 * setting or command-line option ('setting'; criteria-settings.ts), the design's `criteria { }` ('design'), or the
 * reach's own ('reach'). The file always wins over a setting: it is the record.
 */
export type CriterionOrigin = 'default' | 'setting' | 'design' | 'reach';

export interface ReachResult {
  readonly channel: string;
  readonly name: string;
  /** The whole `reach ... { }` block. */
  readonly location: SourceLocation;
  /** Just the reach's name (where findings point). Added by the language work. */
  readonly nameLocation: SourceLocation;
  readonly section: SectionResult;
  readonly lining: LiningResult;
  /** Bed slope, m/m (positive downhill). */
  readonly slope: number;
  readonly length_m: number;
  readonly upstreamInvert_m: number | null;
  readonly downstreamInvert_m: number | null;
  /** Uniform-flow discharge at bank-full depth (open) or full pipe (closed), m3/s; null when no bank height. */
  readonly bankfullCapacity_m3s: number | null;
  readonly criteria: ResolvedCriteria;
  readonly flows: readonly FlowResult[];
  /** Worst status over its flows. */
  readonly status: CheckStatus;
  readonly provenance: Provenance;
}

export interface ChannelResult {
  readonly name: string;
  readonly location: SourceLocation;
  /** The channel's description as written; null if none. Added by the language work (optional so hand-made results stay valid). */
  readonly description?: string | null;
  /** Outlet condition: free fall (critical depth at the brink), a given water level (m), or normal depth. */
  readonly outlet: { readonly kind: 'free-fall' } | { readonly kind: 'water-level'; readonly elevation_m: number } | { readonly kind: 'normal-depth' } | null;
  readonly reaches: readonly ReachResult[];
  /** The water-surface profile of each design flow, in design flow order. Added by the profile work (optional so hand-made results stay valid). */
  readonly profiles?: readonly ChannelFlowProfile[];
}

export interface DesignAnalysis {
  readonly uri: string;
  readonly title: string;
  readonly notes: readonly string[];
  readonly displayUnits: UnitSystem;
  readonly channels: readonly ChannelResult[];
  /** Every finding, in document order. */
  readonly findings: readonly Finding[];
  /** The short caution that every report and CLI output carries. */
  readonly caution: string;
  /** Assumptions behind every number, for the report's assumptions section. */
  readonly assumptions: readonly string[];
  readonly provenance: Provenance;
  /** The document version analysed (LSP text-document version). Added by the language work. */
  readonly version: number;
  /** A design, or a library of shared linings and sections (no channels). Added by the language work. */
  readonly kind: 'design' | 'library';
  /** Whether displayUnits came from the file's `units` setting or was inferred from the units most used in it. */
  readonly displayUnitsOrigin: 'setting' | 'inferred';
  /** The design's named flows as defined in its flow tables (a channel or reach may give its own values). */
  readonly flows: readonly DesignFlowResult[];
  /** The design-level criteria in force (reaches may override them; see ReachResult.criteria). */
  readonly criteria: ResolvedCriteria;
  /** Reaches that could not be analysed because the file is incomplete there; validation reports why. */
  readonly incompleteReaches: readonly IncompleteReach[];
}

/** A named flow of the design. Added by the language work. */
export interface DesignFlowResult {
  readonly name: string;
  readonly description: string | null;
  /** Discharge from the flow table, m3/s; null when each channel gives its own. */
  readonly discharge_m3s: number | null;
  readonly location: SourceLocation;
}

/** A reach left out of the analysis. Added by the language work. */
export interface IncompleteReach {
  readonly channel: string;
  readonly reach: string;
  /** Plain words, e.g. "it has no lining". */
  readonly reason: string;
  readonly location: SourceLocation;
}

/** The quantity kinds the views format, used to pick display units. */
export type QuantityDimension = Dimension;
