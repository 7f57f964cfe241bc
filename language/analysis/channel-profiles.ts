/**
 * The water-surface profile of each channel at each design flow, as the analysis model carries it: the engine's
 * standard-step profile (language/hydraulics/profile) fed with the channel's reaches, bed and outlet, computed
 * once per channel and flow inside the cached analysis. Hover, hints, the report and the JSON output read the
 * result from the model; the findings judge over-topping, freeboard and jumps on it.
 *
 * A flow whose discharge changes along the channel (an inflow, a turnout) is computed in runs of reaches of equal
 * discharge: from the outlet upstream, each run ends at the water level the run below starts with (water-surface
 * continuity at the change, the momentum of the inflow neglected); then, from the head down, a run that receives
 * supercritical flow from the run above is computed again with that depth entering it. One pass each way.
 */
import {
  computeChannelProfile,
  describeJumpType,
  INTERACTIVE_PROFILE_STEPS,
  profileProvenance,
  ProfileReuse,
  type ChannelProfile,
  type ChannelProfileResult,
  type HydraulicJump,
  type OutletControl,
  type ProfileNote,
  type ProfilePoint,
  type ProfilePointColumns,
  type ProfileReachInput,
  type ReachProfileSummary,
  type SectionGeometry,
  type StepControl,
} from '../hydraulics/index.js';
import type {
  Provenance,
  ChannelFlowProfile,
  ChannelResult,
  HydraulicJumpResult,
  ProfileNoteResult,
  ProfilePointResult,
  ProfileSegmentResult,
  ReachFlowProfile,
} from './model.js';
import { channelBed } from './channel-bed.js';

/**
 * Step control of the analysis' profiles. The engine's defaults (20 m steps, at least 10 per reach, 2 % depth
 * change) are finer than a design check needs and make several times more points on a design of hundreds of
 * reaches. These settings keep every computed depth, and each reach's deepest depth, within 1 % of the same
 * method with steps ten times finer: measured 0.73 % at worst for a depth and 0.22 % for a reach's deepest water,
 * over the samples and two generated designs of 100 reaches (depths within 1 m of a jump left out, where the two
 * place the jump a little apart); test/analysis/channel-profiles.test.ts keeps the samples within 1 %. The depth
 * bound governs where the water surface curves; the length bound only where the depth hardly changes.
 */
export const ANALYSIS_PROFILE_STEP_CONTROL: Required<StepControl> = {
  maximumStepLengthM: 100,
  minimumStepsPerReach: 1,
  maximumDepthChangeRatio: 0.05,
  // A bounded budget: the profile is recomputed on every keystroke and must never stall the editor.
  maximumSteps: INTERACTIVE_PROFILE_STEPS,
};

/** What the analysis adds to the engine's statement of method when it builds a channel's profiles. */
export const PROFILE_ANALYSIS_ASSUMPTIONS: readonly string[] = [
  'kinetic-energy coefficient alpha = 1 and no loss at junctions of reaches (loss coefficient 0)',
  'water enters the head of each channel from a pool or an inlet structure: critical depth there when its first reach is steep, otherwise the depth the profile from downstream sets',
  "where a flow's discharge changes along a channel, the runs of equal discharge are joined at the same water level (water-surface continuity; the momentum of the inflow or outflow is neglected); a supercritical flow leaving a run enters the next at the same depth",
  'bed elevations from the inverts given; a reach given only a slope continues the bed of the reach below it (or of the reach above it, below the last invert given); with no invert at all, elevations are relative to the outlet invert',
];

/** How every channel profile of the analysis is computed: the engine's method with the analysis' step control. */
export const PROFILE_PROVENANCE: Provenance = (() => {
  const engine = profileProvenance(1, 0, ANALYSIS_PROFILE_STEP_CONTROL);
  return { method: engine.method, assumptions: [...engine.assumptions, ...PROFILE_ANALYSIS_ASSUMPTIONS], references: engine.references };
})();

/** What the profile needs to know of one analysed reach. */
export interface ProfileReachPlan {
  readonly name: string;
  readonly section: SectionGeometry;
  /** Identifies the section's shape and dimensions (equal keys, equal geometry): part of the memo key. */
  readonly sectionKey: string;
  readonly manningN: number;
  readonly slope: number;
  readonly lengthM: number;
  /** Bank height of an open section, m; null for conduits and open sections without one. */
  readonly bankHeightM: number | null;
  readonly upstreamInvertM: number | null;
  readonly downstreamInvertM: number | null;
  /** Discharge of each flow in this reach, m3/s, by flow name. */
  readonly dischargesM3s: ReadonlyMap<string, number>;
  /** Upper end of the near-critical Froude band the criteria avoid in this reach. */
  readonly nearCriticalFroudeHigh: number;
}

export interface ChannelPlan {
  /** Analysed reaches in flow order. */
  readonly reaches: readonly ProfileReachPlan[];
  readonly outlet: ChannelResult['outlet'];
  /** Why the channel cannot carry a profile although validation says so already (incomplete reaches, no outlet); null if none. */
  readonly silentObstacle: string | null;
}

/** A jump with its reaches as indices of the channel's analysed reaches. */
export interface PlacedJump {
  readonly result: HydraulicJumpResult;
  readonly reachIndex: number;
  readonly originReachIndex: number;
  /** The first reach at or below the origin whose slope is not steep at this flow; undefined if none. */
  readonly holdingReachIndex: number | undefined;
}

/** Supercritical flow leaving the outlet without a jump, though it passed a reach that could have held one. */
export interface SweptOutExit {
  readonly originReachIndex: number;
  readonly holdingReachIndex: number;
  readonly depthM: number;
  readonly froudeNumber: number;
  readonly velocityMps: number;
  readonly stationM: number;
}

export interface ProfileFailure {
  /** 'reported': a finding should say it; 'silent': validation already reports the cause. */
  readonly kind: 'reported' | 'silent';
  readonly reason: string;
  readonly message: string;
  readonly reachIndex: number | null;
  readonly stationM: number | null;
}

/** One channel and flow: the model's profile, each reach's share and what the findings need. */
export interface ComputedFlowProfile {
  readonly model: ChannelFlowProfile;
  /** Indexed like ChannelPlan.reaches; null where no profile exists. */
  readonly reachProfiles: readonly (ReachFlowProfile | null)[];
  readonly jumps: readonly PlacedJump[];
  readonly sweptOutExit: SweptOutExit | null;
  readonly failure: ProfileFailure | null;
}

/**
 * The profiles of one document's last analysis, by everything each channel's profiles depend on. An edit
 * recomputes the analysis of the document, but only the channels whose inputs it changed need their profiles
 * computed again: the next analysis of the same document takes the others from here. Profiles are never modified,
 * so sharing them between analyses is safe; only the last analysis' are kept, so memory stays that of one
 * document's profiles.
 */
export interface ProfileMemo {
  /** The profiles of the document's previous analysis; undefined for its first. */
  readonly previous: ReadonlyMap<string, readonly ComputedFlowProfile[]> | undefined;
  /** The profiles of this analysis, filled as channels are computed. */
  readonly next: Map<string, readonly ComputedFlowProfile[]>;
  /**
   * Within a channel whose profiles must be computed again: the reaches' flow descriptions and marches carried
   * between the document's analyses (the engine's reach-reuse.ts), so an edit recomputes the reaches it affects.
   */
  readonly reaches: ProfileReuse;
  /** One section object per section key (the previous analysis' where the key is unchanged): reach reuse matches sections by object. */
  readonly previousSections: ReadonlyMap<string, SectionGeometry> | undefined;
  readonly sections: Map<string, SectionGeometry>;
}

interface KeptProfiles {
  readonly channels: ReadonlyMap<string, readonly ComputedFlowProfile[]>;
  readonly reaches: ProfileReuse;
  readonly sections: ReadonlyMap<string, SectionGeometry>;
}

let memosByDocument = new WeakMap<object, KeptProfiles>();

/** Opens the memo of an analysis of `document` (any object standing for it); `keepProfileMemo` closes it. */
export function openProfileMemo(document: object): ProfileMemo {
  const kept = memosByDocument.get(document);
  const reaches = kept?.reaches ?? new ProfileReuse();
  reaches.startGeneration();
  return { previous: kept?.channels, next: new Map(), reaches, previousSections: kept?.sections, sections: new Map() };
}

/** Keeps this analysis' profiles for the document's next analysis. */
export function keepProfileMemo(document: object, memo: ProfileMemo): void {
  memosByDocument.set(document, { channels: memo.next, reaches: memo.reaches, sections: memo.sections });
}

/**
 * The reach computations (flow descriptions, marches, junction balances) of the document's analyses so far: how
 * many were taken over, how many computed and the time spent computing them (benchmarks: test/bench/documents.ts).
 */
export function reachComputationCounts(document: object): Readonly<ProfileReuse['counts']> | undefined {
  return memosByDocument.get(document)?.reaches.counts;
}

/** Forgets every remembered channel profile (benchmarks and tests use it to time a fresh computation). */
export function forgetChannelProfiles(): void {
  memosByDocument = new WeakMap();
}

/** The profile of every flow of a channel, in the order of `flowNames`; taken from the memo when its inputs are unchanged. */
export function computeChannelProfiles(plan: ChannelPlan, flowNames: readonly string[], memo?: ProfileMemo): readonly ComputedFlowProfile[] {
  if (memo === undefined) return computeUnremembered(plan, flowNames, undefined);
  const key = memoKey(plan, flowNames);
  const profiles = memo.previous?.get(key) ?? memo.next.get(key) ?? computeUnremembered(plan, flowNames, memo);
  memo.next.set(key, profiles);
  return profiles;
}

function memoKey(plan: ChannelPlan, flowNames: readonly string[]): string {
  const reaches = plan.reaches.map((reach) =>
    [reach.name, reach.sectionKey, reach.manningN, reach.slope, reach.lengthM, reach.bankHeightM, reach.upstreamInvertM, reach.downstreamInvertM, reach.nearCriticalFroudeHigh, ...[...reach.dischargesM3s].flat()].join('|'),
  );
  return JSON.stringify([plan.outlet, plan.silentObstacle, flowNames, reaches]);
}

function computeUnremembered(plan: ChannelPlan, flowNames: readonly string[], memo: ProfileMemo | undefined): ComputedFlowProfile[] {
  const bed = channelBed(plan.reaches.map((reach) => ({ slope: reach.slope, length_m: reach.lengthM, upstreamInvert_m: reach.upstreamInvertM, downstreamInvert_m: reach.downstreamInvertM })));
  const engineReaches: ProfileReachInput[] = plan.reaches.map((reach, index) => ({
    name: reach.name,
    section: memo === undefined ? reach.section : sameSection(memo, reach),
    manningN: reach.manningN,
    bedSlope: reach.slope,
    lengthM: reach.lengthM,
    downstreamInvertElevationM: bed.downstreamInvertsM[index] ?? 0,
    ...(reach.bankHeightM === null ? {} : { bankHeightM: reach.bankHeightM }),
  }));
  return flowNames
    .filter((flowName) => plan.reaches.some((reach) => reach.dischargesM3s.has(flowName)))
    .map((flowName) => {
      try {
        return computeFlowProfile(plan, engineReaches, bed.datum, flowName, memo?.reaches);
      } catch (error) {
        // The engine reports every physical no-solution case as a result; an exception here is a defect, and the
        // analysis must still never throw on user input: say it where the user sees it.
        const detail = error instanceof Error ? error.message : String(error);
        return unexpectedFailure(plan, bed.datum, flowName, `the computation stopped unexpectedly (${detail}).`);
      }
    });
}

/** The section object of the previous analysis when the reach's section key is unchanged, else the reach's own. */
function sameSection(memo: ProfileMemo, reach: ProfileReachPlan): SectionGeometry {
  let section = memo.sections.get(reach.sectionKey) ?? memo.previousSections?.get(reach.sectionKey);
  if (section === undefined) section = reach.section;
  memo.sections.set(reach.sectionKey, section);
  return section;
}

/** The engine's outlet control for the outlet written in the design (elevations in the bed's datum). */
function engineOutlet(outlet: NonNullable<ChannelResult['outlet']>): OutletControl {
  switch (outlet.kind) {
    case 'free-fall':
      return { kind: 'free-fall' };
    case 'normal-depth':
      return { kind: 'normal-depth' };
    case 'water-level':
      return { kind: 'water-level', elevationM: outlet.elevation_m };
  }
}

// ------------------------------------------------------------------------------------------------ one flow

interface Run {
  /** Index of the run's first reach in the channel. */
  readonly firstReachIndex: number;
  readonly reaches: ProfileReachInput[];
  readonly dischargeM3s: number;
  readonly startStationM: number;
  result: ChannelProfile | undefined;
  /** True when the run was computed with the supercritical depth leaving the run above as its inlet. */
  carriedIn: boolean;
}

/**
 * The profile of one flow from reach `fromReachIndex` to the outlet. Where the water fills a conduit, the part of
 * the channel below that conduit is computed on its own (its head takes critical depth when steep, as below any
 * inlet); the part above it flows under pressure and has no free-surface profile.
 */
function computeFlowProfile(
  plan: ChannelPlan,
  engineReaches: readonly ProfileReachInput[],
  datum: ChannelFlowProfile['datum'],
  flowName: string,
  reuse: ProfileReuse | undefined,
  fromReachIndex = 0,
): ComputedFlowProfile {
  const fail = (failure: ProfileFailure): ComputedFlowProfile => ({
    model: {
      flow: flowName,
      computed: false,
      failure: modelFailure(plan, failure),
      datum,
      points: [],
      segments: [],
      jumps: [],
      notes: [],
      maximumEnergyResidual_m: null,
      provenance: PROFILE_PROVENANCE,
    },
    reachProfiles: plan.reaches.map(() => null),
    jumps: [],
    sweptOutExit: null,
    failure,
  });
  if (plan.silentObstacle !== null) return fail({ kind: 'silent', reason: 'incomplete-channel', message: plan.silentObstacle, reachIndex: null, stationM: null });
  const outlet = plan.outlet;
  if (outlet === null) return fail({ kind: 'silent', reason: 'no-outlet', message: 'The channel has no outlet condition.', reachIndex: null, stationM: null });
  const missing = plan.reaches.findIndex((reach) => !reach.dischargesM3s.has(flowName));
  if (missing >= 0) {
    return fail({ kind: 'silent', reason: 'no-discharge', message: `Flow ${flowName} has no discharge in reach '${plan.reaches[missing]?.name ?? ''}'.`, reachIndex: missing, stationM: null });
  }
  if (outlet.kind === 'water-level' && datum === 'relative-to-outlet') {
    return fail({
      kind: 'reported',
      reason: 'no-elevation-datum',
      message: 'The outlet water level is an elevation, but no reach of the channel gives invert elevations, so the depth it sets at the outlet is unknown.',
      reachIndex: plan.reaches.length - 1,
      stationM: null,
    });
  }

  const runs = splitIntoRuns(plan, engineReaches, flowName, fromReachIndex);
  const channelOutlet = engineOutlet(outlet);
  const outletOf = (runIndex: number): OutletControl => {
    const below = runs[runIndex + 1]?.result;
    const head = below === undefined ? undefined : firstPointOf(below.pointTable);
    if (runIndex === runs.length - 1 || head === undefined) return channelOutlet;
    return { kind: 'water-level', elevationM: head.waterSurfaceElevationM };
  };
  const runFailure = (run: Run, result: ChannelProfileResult & { converged: false }): ComputedFlowProfile => {
    const failure: ProfileFailure = {
      kind: 'reported',
      reason: result.reason,
      message: inChannelStations(result.message, run.startStationM),
      reachIndex: result.reachIndex === null ? null : run.firstReachIndex + result.reachIndex,
      stationM: result.stationM === null ? null : run.startStationM + result.stationM,
    };
    if (failure.reason === 'conduit-surcharged' && failure.reachIndex !== null && failure.reachIndex + 1 < plan.reaches.length) {
      const below = computeFlowProfile(plan, engineReaches, datum, flowName, reuse, failure.reachIndex + 1);
      if (below.failure === null) {
        // The model's points are read through a getter that builds them (assemble): copy it, do not call it.
        const model = Object.defineProperties({}, { ...Object.getOwnPropertyDescriptors(below.model), failure: { value: modelFailure(plan, failure), enumerable: true } }) as ChannelFlowProfile;
        return { ...below, model, failure };
      }
    }
    return fail(failure);
  };

  // From the outlet upstream: each run ends at the level the run below starts with.
  for (let index = runs.length - 1; index >= 0; index--) {
    const run = runs[index] as Run;
    const result = computeChannelProfile({ reaches: run.reaches, dischargeM3s: run.dischargeM3s, outlet: outletOf(index), stepControl: ANALYSIS_PROFILE_STEP_CONTROL, ...(reuse ? { reuse } : {}) });
    if (!result.converged) return runFailure(run, result);
    run.result = result;
  }
  // From the head down: supercritical flow leaving a run enters the next one.
  for (let index = 1; index < runs.length; index++) {
    const above = (runs[index - 1] as Run).result as ChannelProfile;
    const exit = lastPointOf(above.pointTable);
    if (exit?.regime !== 'supercritical') continue;
    const run = runs[index] as Run;
    const result = computeChannelProfile({
      reaches: run.reaches,
      dischargeM3s: run.dischargeM3s,
      outlet: outletOf(index),
      inlet: { kind: 'depth', depthM: exit.depthM },
      stepControl: ANALYSIS_PROFILE_STEP_CONTROL,
      ...(reuse ? { reuse } : {}),
    });
    if (!result.converged) return runFailure(run, result);
    run.result = result;
    run.carriedIn = true;
  }
  return assemble(plan, runs, datum, flowName);
}

function unexpectedFailure(plan: ChannelPlan, datum: ChannelFlowProfile['datum'], flowName: string, message: string): ComputedFlowProfile {
  const failure: ProfileFailure = { kind: 'reported', reason: 'internal-error', message, reachIndex: null, stationM: null };
  return {
    model: { flow: flowName, computed: false, failure: modelFailure(plan, failure), datum, points: [], segments: [], jumps: [], notes: [], maximumEnergyResidual_m: null, provenance: PROFILE_PROVENANCE },
    reachProfiles: plan.reaches.map(() => null),
    jumps: [],
    sweptOutExit: null,
    failure,
  };
}

function modelFailure(plan: ChannelPlan, failure: ProfileFailure): NonNullable<ChannelFlowProfile['failure']> {
  return {
    reason: failure.reason,
    message: failure.message,
    reach: failure.reachIndex === null ? null : (plan.reaches[failure.reachIndex]?.name ?? null),
    station_m: failure.stationM,
  };
}

/** Consecutive reaches, from `fromReachIndex` on, with the same discharge of the flow. */
function splitIntoRuns(plan: ChannelPlan, engineReaches: readonly ProfileReachInput[], flowName: string, fromReachIndex: number): Run[] {
  const runs: Run[] = [];
  let stationM = 0;
  plan.reaches.forEach((reach, index) => {
    if (index < fromReachIndex) {
      stationM += reach.lengthM;
      return;
    }
    const dischargeM3s = reach.dischargesM3s.get(flowName) as number;
    const current = runs[runs.length - 1];
    if (current !== undefined && current.dischargeM3s === dischargeM3s) {
      current.reaches.push(engineReaches[index] as ProfileReachInput);
    } else {
      runs.push({ firstReachIndex: index, reaches: [engineReaches[index] as ProfileReachInput], dischargeM3s, startStationM: stationM, result: undefined, carriedIn: false });
    }
    stationM += reach.lengthM;
  });
  return runs;
}

/** Notes that describe a run's own ends, which are not the channel's ends when the run is not the first or last. */
const OUTLET_NOTES: ReadonlySet<ProfileNote['code']> = new Set(['tailwater-below-critical-depth', 'jump-swept-out-of-channel', 'supercritical-at-outlet', 'outlet-normal-depth-supercritical']);
const INLET_NOTES: ReadonlySet<ProfileNote['code']> = new Set(['inlet-depth-not-supercritical', 'inlet-drowned']);

function assemble(plan: ChannelPlan, runs: readonly Run[], datum: ChannelFlowProfile['datum'], flowName: string): ComputedFlowProfile {
  const reachName = (index: number): string => plan.reaches[index]?.name ?? '';
  // The model's points are built when first read (the report and exports read them; checks need only the regimes).
  const pointRuns: { readonly table: ProfilePointColumns; readonly offsetM: number; readonly reachOffset: number }[] = [];
  const segments: ProfileSegmentResult[] = [];
  const notes: ProfileNoteResult[] = [];
  const summaries: (ReachProfileSummary | undefined)[] = plan.reaches.map(() => undefined);
  const rawJumps: { jump: HydraulicJump; reachIndex: number; originReachIndex: number; placement: HydraulicJump['placement'] }[] = [];
  let maximumResidualM = 0;

  runs.forEach((run, runIndex) => {
    const result = run.result as ChannelProfile;
    const offsetM = run.startStationM;
    const reachOffset = run.firstReachIndex;
    const isLast = runIndex === runs.length - 1;
    const next = runs[runIndex + 1];
    // The origin of supercritical flow carried in from the run above: where it began there.
    const carriedOriginIndex = run.carriedIn ? supercriticalOriginReachIndex(pointRuns) : undefined;
    pointRuns.push({ table: result.pointTable, offsetM, reachOffset });
    for (const segment of result.segments) {
      const reach = reachName(segment.reachIndex + reachOffset);
      segments.push(
        inModel(segment, offsetM, reach, () => ({
          reach,
          fromStation_m: segment.fromStationM + offsetM,
          toStation_m: segment.toStationM + offsetM,
          profileClass: segment.profileClass,
          description: segment.description,
        })),
      );
    }
    for (const summary of result.reaches) summaries[summary.reachIndex + reachOffset] = summary;
    // A jump the run put beyond its outlet stands at the change of discharge unless the run below carries the flow on.
    const carriedOn = next !== undefined && next.carriedIn && !(next.result?.notes ?? []).some((note) => INLET_NOTES.has(note.code));
    for (const engineJump of result.jumps) {
      let jump = engineJump;
      if (jump.placement === 'beyond-outlet' && !isLast) {
        if (carriedOn) continue;
        // The water below the change of discharge holds it at the junction: its depths and loss are those there.
        const exit = lastPointOf(result.pointTable);
        const below = next?.result === undefined ? undefined : firstPointOf(next.result.pointTable);
        if (exit === undefined || below === undefined) continue;
        const energyLossM = exit.energyElevationM - below.energyElevationM;
        jump = {
          ...jump,
          placement: 'at-junction',
          downstreamDepthM: below.depthM,
          energyLossM,
          description: `Hydraulic jump at the junction where the discharge changes below reach "${jump.reachName}" (station ${jump.stationM.toFixed(2)} m): ${describeJumpType(jump.jumpType)}, from ${jump.upstreamDepthM.toFixed(3)} m to ${below.depthM.toFixed(3)} m, energy loss ${energyLossM.toFixed(3)} m.`,
        };
      }
      if (offsetM !== 0) jump = { ...jump, description: inChannelStations(jump.description, offsetM) };
      const local = jump.supercriticalFromReachIndex;
      const originReachIndex = run.carriedIn && local === 0 && carriedOriginIndex !== undefined ? carriedOriginIndex : local + reachOffset;
      rawJumps.push({ jump, reachIndex: jump.reachIndex + reachOffset, originReachIndex, placement: jump.placement });
    }
    for (const note of result.notes) {
      if (!isLast && OUTLET_NOTES.has(note.code)) {
        if (note.code === 'tailwater-below-critical-depth') {
          const lastReach = run.reaches[run.reaches.length - 1] as ProfileReachInput;
          notes.push({
            code: 'critical-depth-at-junction',
            message: `Where the discharge changes below reach "${lastReach.name}", the water below stands lower than critical depth above: the flow passes critical depth at the end of reach "${lastReach.name}".`,
            reach: lastReach.name,
            station_m: note.stationM === null ? null : note.stationM + offsetM,
          });
        }
        continue;
      }
      if (runIndex > 0 && run.carriedIn && INLET_NOTES.has(note.code)) continue;
      // The jump records say whether a jump is swept out, by the rule of this module (PlacedJump).
      if (note.code === 'jump-swept-out-of-reach') continue;
      notes.push({
        code: note.code,
        message: inChannelStations(note.message, offsetM),
        reach: note.reachIndex === null ? null : reachName(note.reachIndex + reachOffset),
        station_m: note.stationM === null ? null : note.stationM + offsetM,
      });
    }
    maximumResidualM = Math.max(maximumResidualM, result.maximumEnergyResidualM);
  });

  // Each run's summaries in channel stations; reaches above a surcharged conduit have none.
  const reachProfiles: (ReachFlowProfile | null)[] = summaries.map((summary, index) => {
    const run = runs.find((candidate) => index >= candidate.firstReachIndex && index < candidate.firstReachIndex + candidate.reaches.length);
    if (summary === undefined || run === undefined) return null;
    const offsetM = run.startStationM;
    return inModel(summary, offsetM, '', () => ({
      startStation_m: summary.startStationM + offsetM,
      endStation_m: summary.endStationM + offsetM,
      maximumDepth_m: summary.maximumDepthM,
      maximumDepthStation_m: summary.maximumDepthStationM + offsetM,
      minimumFreeboard_m: summary.minimumFreeboardM,
      minimumFreeboardStation_m: summary.minimumFreeboardStationM === null ? null : summary.minimumFreeboardStationM + offsetM,
      overtoppedRanges: summary.overtoppedRanges.map((range) => ({ fromStation_m: range.fromStationM + offsetM, toStation_m: range.toStationM + offsetM })),
      profileClasses: [...summary.profileClasses],
    }));
  });
  // The first reach at or below each reach whose slope can hold a jump (not steep), found once from the outlet up.
  const holdingAtOrBelow = new Array<number | undefined>(summaries.length);
  for (let index = summaries.length - 1, below: number | undefined; index >= 0; index--) {
    const summary = summaries[index];
    if (summary !== undefined && (summary.slopeClass === 'mild' || summary.slopeClass === 'horizontal' || summary.slopeClass === 'adverse')) below = index;
    holdingAtOrBelow[index] = below;
  }
  const holdingReachAtOrBelow = (originIndex: number): number | undefined => holdingAtOrBelow[Math.max(0, originIndex)];

  const jumps: PlacedJump[] = rawJumps.map(({ jump, reachIndex, originReachIndex, placement }) => {
    const holdingReachIndex = holdingReachAtOrBelow(originReachIndex);
    const sweptOut = placement === 'beyond-outlet' || (holdingReachIndex !== undefined && reachIndex > holdingReachIndex);
    const section = plan.reaches[reachIndex]?.section;
    const dischargeM3s = plan.reaches[reachIndex]?.dischargesM3s.get(flowName) ?? 0;
    const upstreamAreaM2 = section?.areaM2(jump.upstreamDepthM) ?? Number.NaN;
    const runOffsetM = runs.find((run) => reachIndex >= run.firstReachIndex && reachIndex < run.firstReachIndex + run.reaches.length)?.startStationM ?? 0;
    const result: HydraulicJumpResult = {
      station_m: jump.stationM + runOffsetM,
      reach: reachName(reachIndex),
      placement,
      upstreamDepth_m: jump.upstreamDepthM,
      downstreamDepth_m: jump.downstreamDepthM,
      upstreamFroudeNumber: jump.upstreamFroudeNumber,
      upstreamVelocity_mps: upstreamAreaM2 > 0 ? dischargeM3s / upstreamAreaM2 : 0,
      energyLoss_m: jump.energyLossM,
      jumpType: jump.jumpType,
      supercriticalFrom: reachName(originReachIndex),
      sweptOut,
      nearCritical: jump.upstreamFroudeNumber <= (plan.reaches[reachIndex]?.nearCriticalFroudeHigh ?? 1),
      description: jump.description,
    };
    return { result, reachIndex, originReachIndex, holdingReachIndex };
  });

  // Supercritical flow leaving the channel with no jump, although it crossed a reach that could have held one.
  let sweptOutExit: SweptOutExit | null = null;
  const lastRun = pointRuns.findLast((run) => run.table.length > 0);
  const lastPoint =
    lastRun === undefined ? undefined : modelPoint(lastRun.table.point(lastRun.table.length - 1), lastRun.offsetM, (reachIndex) => reachName(reachIndex + lastRun.reachOffset));
  const endsWithJump = jumps.some((jump) => jump.result.placement === 'beyond-outlet');
  const exitOriginReachIndex = supercriticalOriginReachIndex(pointRuns);
  if (lastPoint !== undefined && exitOriginReachIndex !== undefined && !endsWithJump) {
    const originReachIndex = exitOriginReachIndex;
    const holdingReachIndex = holdingReachAtOrBelow(originReachIndex);
    if (holdingReachIndex !== undefined) {
      sweptOutExit = {
        originReachIndex,
        holdingReachIndex,
        depthM: lastPoint.depth_m,
        froudeNumber: lastPoint.froudeNumber,
        velocityMps: lastPoint.velocity_mps,
        stationM: lastPoint.station_m,
      };
    }
  }

  let points: readonly ProfilePointResult[] | undefined;
  return {
    model: {
      flow: flowName,
      computed: true,
      failure: null,
      datum,
      get points() {
        return (points ??= pointRuns.flatMap(({ table, offsetM, reachOffset }) => {
          const runPoints = new Array<ProfilePointResult>(table.length);
          for (let index = 0; index < table.length; index++) runPoints[index] = modelPoint(table.point(index), offsetM, (reachIndex) => reachName(reachIndex + reachOffset));
          return runPoints;
        }));
      },
      segments,
      jumps: jumps.map((jump) => jump.result),
      notes,
      maximumEnergyResidual_m: maximumResidualM,
      provenance: PROFILE_PROVENANCE,
    },
    reachProfiles,
    jumps,
    sweptOutExit,
    failure: null,
  };
}

/**
 * The model's words for an engine segment or reach summary, in channel stations (`offsetM`: where its run starts)
 * and under a reach name: the same object as last time for the same engine object, offset and name. The engine
 * keeps a reach's segments and summary while the reach's marches and place are unchanged (profile-assembly.ts), so
 * the reach's share of the model is then the same object too, and the analysis recognises it at once.
 */
function inModel<T extends object>(engineObject: object, offsetM: number, reachName: string, make: () => T): T {
  const last = modelObjects.get(engineObject);
  if (last !== undefined && Object.is(last.offsetM, offsetM) && last.reachName === reachName) return last.result as T;
  const result = make();
  modelObjects.set(engineObject, { offsetM, reachName, result });
  return result;
}

const modelObjects = new WeakMap<object, { readonly offsetM: number; readonly reachName: string; readonly result: object }>();

/** The first and last point of a profile's columns; undefined when it has none. */
function firstPointOf(table: ProfilePointColumns): ProfilePoint | undefined {
  return table.length > 0 ? table.point(0) : undefined;
}

function lastPointOf(table: ProfilePointColumns): ProfilePoint | undefined {
  return table.length > 0 ? table.point(table.length - 1) : undefined;
}

/** An engine point in the model's words and the channel's stations (offsetM: where the point's run starts). */
function modelPoint(point: ProfilePoint, offsetM: number, reachName: (index: number) => string): ProfilePointResult {
  return {
    station_m: point.stationM + offsetM,
    reach: reachName(point.reachIndex),
    depth_m: point.depthM,
    invert_m: point.invertElevationM,
    waterSurface_m: point.waterSurfaceElevationM,
    velocity_mps: point.velocityMs,
    froudeNumber: point.froudeNumber,
  };
}

/**
 * The engine words a station as "station 12.34 m", measured from the head of the reaches it was given; a run that
 * starts further down the channel has its stations shifted to the channel's.
 */
function inChannelStations(text: string, offsetM: number): string {
  if (offsetM === 0) return text;
  return text.replace(/station (-?\d+(?:\.\d+)?) m/g, (_match, value: string) => `station ${(Number(value) + offsetM).toFixed(2)} m`);
}

/**
 * The reach (channel index) of the first point of the unbroken supercritical stretch that ends at the last point of
 * the runs so far; undefined if that point is not supercritical.
 */
function supercriticalOriginReachIndex(pointRuns: readonly { readonly table: ProfilePointColumns; readonly reachOffset: number }[]): number | undefined {
  let origin: number | undefined;
  for (let runIndex = pointRuns.length - 1; runIndex >= 0; runIndex--) {
    const { table, reachOffset } = pointRuns[runIndex] as (typeof pointRuns)[number];
    for (let index = table.length - 1; index >= 0; index--) {
      if (table.regimeAt(index) !== 'supercritical') return origin;
      origin = table.reachIndexAt(index) + reachOffset;
    }
  }
  return origin;
}
