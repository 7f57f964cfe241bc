/**
 * Joins the subcritical and supercritical passes into the channel's profile: the points in flow order, the steps
 * between them with their head losses and energy residuals (recomputed from the points, so they check the
 * passes), the classified segments, and each reach's summary (deepest point, least freeboard, over-topping).
 *
 * The points are kept as columns (reach, station within the reach, depth; ProfilePointTable) and become point and
 * step objects only when read. The analysis recomputes a channel's profiles on every edit and reads the reach
 * summaries, jumps and notes, while only a report or an export reads every point: building some 1,000 point and
 * step objects per flow on every keystroke was two fifths of the analysis of a 50-reach channel (measured, issue 8).
 * The summaries, segments and energy check are computed from the columns with the same expressions as the points,
 * so every number is the same whichever is read.
 */
import { CRITICAL_MATCH_RELATIVE_TOLERANCE, GRAVITY_MS2 } from '../constants.js';
import { invertElevationAt, type ResolvedReach, type SubcriticalTrace } from './channel-model.js';
import { classifySegment, describeSegmentClass } from './profile-class.js';
import type {
  HydraulicJump,
  ProfilePoint,
  ProfilePointColumns,
  ProfileRegime,
  ProfileSegment,
  ProfileStep,
  ProfileStepKind,
  ReachProfileSummary,
  SegmentClass,
  StationRange,
} from './profile-types.js';
import { frictionSlope, type ReachFlow } from './reach-flow.js';
import type { JunctionRecord } from './subcritical-pass.js';
import type { SupercriticalPiece } from './supercritical-pass.js';

export type AssemblyResult = ({ readonly converged: true } & AssembledProfile) | { readonly converged: false; readonly surchargedReachIndex: number };

export interface AssembledProfile {
  readonly table: ProfilePointTable;
  readonly segments: ProfileSegment[];
  readonly reaches: ReachProfileSummary[];
  readonly maximumEnergyResidualM: number;
}

/** What joins a point to the one before it within the same reach. */
type PointJoin = 'step' | 'jump';

/**
 * A profile's computed sections as columns, in flow order, with the join from each point to the next. Points and
 * steps are built on request, from the same expressions the assembly used.
 */
export class ProfilePointTable implements ProfilePointColumns {
  constructor(
    private readonly reaches: readonly ResolvedReach[],
    /** Station of each point, m from its reach's upstream end. */
    private readonly localStationsM: Float64Array,
    private readonly depthsM: Float64Array,
    private readonly reachIndices: Int32Array,
    /** stepKinds[i] joins point i to point i + 1; so do headLossesM[i] and energyResidualsM[i] (NaN: no balance imposed). */
    private readonly stepKinds: readonly ProfileStepKind[],
    private readonly headLossesM: Float64Array,
    private readonly energyResidualsM: Float64Array,
  ) {}

  get length(): number {
    return this.depthsM.length;
  }

  reachIndexAt(index: number): number {
    return this.reachIndices[index] ?? 0;
  }

  depthAt(index: number): number {
    return this.depthsM[index] ?? 0;
  }

  /** Station of a point, m from the channel's upstream end. */
  stationAt(index: number): number {
    return pointStationM(this.reachAt(index), this.localStationsM[index] ?? 0);
  }

  regimeAt(index: number): ProfileRegime {
    return regimeOf(this.reachAt(index).flow.criticalDepthM, this.depthAt(index));
  }

  point(index: number): ProfilePoint {
    return makePoint(this.reachAt(index), this.localStationsM[index] ?? 0, this.depthAt(index));
  }

  /** Every point, in flow order. */
  points(): ProfilePoint[] {
    const points = new Array<ProfilePoint>(this.length);
    for (let index = 0; index < points.length; index++) points[index] = this.point(index);
    return points;
  }

  /** Every step: steps[i] joins points i and i + 1. */
  steps(): ProfileStep[] {
    const steps = new Array<ProfileStep>(this.stepKinds.length);
    for (let index = 0; index < steps.length; index++) {
      const residualM = this.energyResidualsM[index] ?? Number.NaN;
      steps[index] = {
        kind: this.stepKinds[index] ?? 'gradually-varied',
        upstreamPointIndex: index,
        downstreamPointIndex: index + 1,
        lengthM: this.stationAt(index + 1) - this.stationAt(index),
        headLossM: this.headLossesM[index] ?? 0,
        energyResidualM: Number.isNaN(residualM) ? null : residualM,
      };
    }
    return steps;
  }

  private reachAt(index: number): ResolvedReach {
    return this.reaches[this.reachIndexAt(index)] as ResolvedReach;
  }
}

export function assembleProfile(
  reaches: readonly ResolvedReach[],
  traces: readonly SubcriticalTrace[],
  junctions: readonly JunctionRecord[],
  pieces: readonly (SupercriticalPiece | undefined)[],
  jumps: readonly HydraulicJump[],
  lossCoefficient: number,
): AssemblyResult {
  // Two passes over the reaches' points: count them (and find a surcharge), then fill columns of that length.
  let count = 0;
  for (const reach of reaches) {
    const outcome = visitReachPoints(reach, traces[reach.index] as SubcriticalTrace, pieces[reach.index], () => count++);
    if (outcome === 'surcharged') return { converged: false, surchargedReachIndex: reach.index };
  }
  const localStationsM = new Float64Array(count);
  const depthsM = new Float64Array(count);
  const reachIndices = new Int32Array(count);
  const joins = new Array<PointJoin>(count);
  const firstPointOfReach: number[] = [];
  let filled = 0;
  for (const reach of reaches) {
    firstPointOfReach.push(filled);
    visitReachPoints(reach, traces[reach.index] as SubcriticalTrace, pieces[reach.index], (localStationM, depthM, join) => {
      localStationsM[filled] = localStationM;
      depthsM[filled] = depthM;
      reachIndices[filled] = reach.index;
      joins[filled] = join;
      filled++;
    });
  }

  const stepCount = Math.max(count - 1, 0);
  const stepKinds = new Array<ProfileStepKind>(stepCount);
  const headLossesM = new Float64Array(stepCount);
  const energyResidualsM = new Float64Array(stepCount);
  let maximumEnergyResidualM = 0;
  // Each point's friction slope and energy elevation serve the steps on both sides of it.
  const reachOf = (index: number): ResolvedReach => reaches[reachIndices[index] ?? 0] as ResolvedReach;
  let upstreamReach = count > 0 ? reachOf(0) : undefined;
  let upstreamVelocityMs = upstreamReach === undefined ? 0 : pointVelocityMs(upstreamReach.flow, depthsM[0] ?? 0);
  let upstreamEnergyM = upstreamReach === undefined ? 0 : pointEnergyElevationM(upstreamReach, localStationsM[0] ?? 0, depthsM[0] ?? 0, upstreamVelocityMs);
  let upstreamFrictionSlope = upstreamReach === undefined ? 0 : frictionSlope(upstreamReach.flow, depthsM[0] ?? 0);
  for (let index = 1; index < count; index++) {
    const previousReach = upstreamReach as ResolvedReach;
    const downstreamReach = reachOf(index);
    const downstreamDepthM = depthsM[index] ?? 0;
    const downstreamLocalM = localStationsM[index] ?? 0;
    const downstreamVelocityMs = pointVelocityMs(downstreamReach.flow, downstreamDepthM);
    const downstreamEnergyM = pointEnergyElevationM(downstreamReach, downstreamLocalM, downstreamDepthM, downstreamVelocityMs);
    const headDifferenceM = upstreamEnergyM - downstreamEnergyM;
    let kind: ProfileStepKind;
    let headLossM: number;
    let energyResidualM: number | null;
    const downstreamFrictionSlope = frictionSlope(downstreamReach.flow, downstreamDepthM);
    if (joins[index] === 'jump') {
      kind = 'hydraulic-jump';
      headLossM = headDifferenceM;
      energyResidualM = null;
    } else if (previousReach.index === downstreamReach.index) {
      // Standard step: friction loss from the arithmetic mean of the end friction slopes.
      const lengthM = pointStationM(downstreamReach, downstreamLocalM) - pointStationM(previousReach, localStationsM[index - 1] ?? 0);
      kind = 'gradually-varied';
      headLossM = 0.5 * (upstreamFrictionSlope + downstreamFrictionSlope) * lengthM;
      energyResidualM = headDifferenceM - headLossM;
    } else {
      const enteredAcross = pieces[downstreamReach.index]?.enteredAcrossJunction === true && firstPointOfReach[downstreamReach.index] === index;
      const record = junctions[previousReach.index];
      // A jump at the foot of a drop: recorded on the reach below, between the brink and the water below.
      const junctionJump = jumps.find((jump) => jump.placement === 'at-junction' && jump.reachIndex === downstreamReach.index);
      if (junctionJump !== undefined && !enteredAcross) {
        kind = 'hydraulic-jump';
        headLossM = headDifferenceM;
        energyResidualM = null;
      } else if (enteredAcross || record?.kind !== 'critical-control') {
        kind = 'junction';
        const upstreamVelocityHeadM = velocityHead(previousReach, upstreamVelocityMs);
        const downstreamVelocityHeadM = velocityHead(downstreamReach, downstreamVelocityMs);
        headLossM = lossCoefficient * Math.abs(upstreamVelocityHeadM - downstreamVelocityHeadM);
        energyResidualM = headDifferenceM - headLossM;
      } else {
        kind = 'junction-critical-control';
        headLossM = headDifferenceM;
        energyResidualM = null;
      }
    }
    if (energyResidualM !== null) maximumEnergyResidualM = Math.max(maximumEnergyResidualM, Math.abs(energyResidualM));
    stepKinds[index - 1] = kind;
    headLossesM[index - 1] = headLossM;
    energyResidualsM[index - 1] = energyResidualM ?? Number.NaN;
    upstreamReach = downstreamReach;
    upstreamVelocityMs = downstreamVelocityMs;
    upstreamEnergyM = downstreamEnergyM;
    upstreamFrictionSlope = downstreamFrictionSlope;
  }

  const table = new ProfilePointTable(reaches, localStationsM, depthsM, reachIndices, stepKinds, headLossesM, energyResidualsM);
  const segments = classifySegments(reaches, table, stepKinds);
  // A reach's points are contiguous, and so are its segments (flow order): each summary reads only its own slices.
  const segmentsOfReach = reaches.map((): ProfileSegment[] => []);
  for (const segment of segments) segmentsOfReach[segment.reachIndex]?.push(segment);
  const summaries = reaches.map((reach, position) =>
    summariseReach(reach, table, firstPointOfReach[position] ?? count, firstPointOfReach[position + 1] ?? count, segmentsOfReach[reach.index] ?? []),
  );
  return { converged: true, table, segments, reaches: summaries, maximumEnergyResidualM };
}

/**
 * The points of one reach in flow order: the supercritical piece (and the depth after its jump), then the
 * subcritical trace below where the piece hands over. 'surcharged' when the profile needs subcritical flow where the
 * conduit would flow full (no supercritical flow holds it); the points are then incomplete.
 */
function visitReachPoints(
  reach: ResolvedReach,
  trace: SubcriticalTrace,
  piece: SupercriticalPiece | undefined,
  add: (localStationM: number, depthM: number, join: PointJoin) => void,
): 'surcharged' | undefined {
  let resumeAfterM: number | undefined = Number.NEGATIVE_INFINITY;
  if (piece !== undefined) {
    for (let i = 0; i < piece.stationsM.length; i++) add(piece.stationsM[i] ?? 0, piece.depthsM[i] ?? 0, 'step');
    if (piece.jumpDownstreamDepthM !== undefined && piece.resumeSubcriticalAfterM !== undefined) {
      add(piece.resumeSubcriticalAfterM, piece.jumpDownstreamDepthM, 'jump');
    }
    resumeAfterM = piece.resumeSubcriticalAfterM === undefined ? undefined : piece.resumeSubcriticalAfterM + 1e-9 * reach.lengthM;
  }
  if (resumeAfterM !== undefined && trace.noSubcriticalDepthReason === 'surcharged' && resumeAfterM < (trace.noSubcriticalDepthAboveM ?? 0)) return 'surcharged';
  if (resumeAfterM !== undefined) {
    for (let i = 0; i < trace.stationsM.length; i++) {
      const stationM = trace.stationsM[i] ?? 0;
      if (stationM > resumeAfterM) add(stationM, trace.depthsM[i] ?? 0, 'step');
    }
  }
  return undefined;
}

function velocityHead(reach: ResolvedReach, velocityMs: number): number {
  return (reach.flow.kineticEnergyCoefficient * velocityMs * velocityMs) / (2 * GRAVITY_MS2);
}

/** Station of a point, m from the channel's upstream end. */
function pointStationM(reach: ResolvedReach, localStationM: number): number {
  return reach.startStationM + localStationM;
}

function pointVelocityMs(flow: ReachFlow, depthM: number): number {
  return flow.dischargeM3s / flow.section.areaM2(depthM);
}

/** Invert plus depth plus alpha V^2 / 2g, m. */
function pointEnergyElevationM(reach: ResolvedReach, localStationM: number, depthM: number, velocityMs: number): number {
  const waterSurfaceElevationM = invertElevationAt(reach, localStationM) + depthM;
  return waterSurfaceElevationM + (reach.flow.kineticEnergyCoefficient * velocityMs * velocityMs) / (2 * GRAVITY_MS2);
}

function regimeOf(criticalDepthM: number, depthM: number): ProfileRegime {
  if (Math.abs(depthM - criticalDepthM) <= CRITICAL_MATCH_RELATIVE_TOLERANCE * criticalDepthM) return 'critical';
  return depthM > criticalDepthM ? 'subcritical' : 'supercritical';
}

function makePoint(reach: ResolvedReach, localStationM: number, depthM: number): ProfilePoint {
  const flow = reach.flow;
  const areaM2 = flow.section.areaM2(depthM);
  const velocityMs = flow.dischargeM3s / areaM2;
  const invertElevationM = invertElevationAt(reach, localStationM);
  return {
    stationM: pointStationM(reach, localStationM),
    reachIndex: reach.index,
    reachName: reach.input.name,
    depthM,
    invertElevationM,
    waterSurfaceElevationM: invertElevationM + depthM,
    energyElevationM: pointEnergyElevationM(reach, localStationM, depthM, velocityMs),
    velocityMs,
    // V / sqrt(g A / T), as froudeNumber in critical-flow.ts, with the area already at hand.
    froudeNumber: velocityMs / Math.sqrt((GRAVITY_MS2 * areaM2) / flow.section.topWidthM(depthM)),
    regime: regimeOf(flow.criticalDepthM, depthM),
  };
}

/** Segments: runs of standard steps in one reach whose mid-step depths fall in the same class. */
function classifySegments(reaches: readonly ResolvedReach[], table: ProfilePointTable, stepKinds: readonly ProfileStepKind[]): ProfileSegment[] {
  const segments: ProfileSegment[] = [];
  let current: { reachIndex: number; fromStationM: number; toStationM: number; profileClass: SegmentClass; lastStep: number } | undefined;
  const close = (): void => {
    if (current === undefined) return;
    const reach = reaches[current.reachIndex] as ResolvedReach;
    segments.push({
      reachIndex: current.reachIndex,
      reachName: reach.input.name,
      fromStationM: current.fromStationM,
      toStationM: current.toStationM,
      profileClass: current.profileClass,
      description: describeSegmentClass(current.profileClass),
    });
    current = undefined;
  };
  for (let stepIndex = 0; stepIndex < stepKinds.length; stepIndex++) {
    if (stepKinds[stepIndex] !== 'gradually-varied') continue;
    const upstreamStationM = table.stationAt(stepIndex);
    const downstreamStationM = table.stationAt(stepIndex + 1);
    if (!(downstreamStationM - upstreamStationM > 0)) continue;
    const reachIndex = table.reachIndexAt(stepIndex);
    const flow = (reaches[reachIndex] as ResolvedReach).flow;
    const middleDepthM = 0.5 * (table.depthAt(stepIndex) + table.depthAt(stepIndex + 1));
    const profileClass = classifySegment(flow.slopeClass, middleDepthM, flow.normalDepthM, flow.criticalDepthM);
    if (current !== undefined && current.reachIndex === reachIndex && current.profileClass === profileClass && current.lastStep === stepIndex - 1) {
      current.toStationM = downstreamStationM;
      current.lastStep = stepIndex;
      continue;
    }
    close();
    current = { reachIndex, fromStationM: upstreamStationM, toStationM: downstreamStationM, profileClass, lastStep: stepIndex };
  }
  close();
  return segments;
}

/** Summary of one reach from its points, table rows fromIndex up to (not including) toIndex, and its own segments. */
function summariseReach(reach: ResolvedReach, table: ProfilePointTable, fromIndex: number, toIndex: number, reachSegments: readonly ProfileSegment[]): ReachProfileSummary {
  const bankHeightM = reach.input.bankHeightM;
  let maximumDepthM = Number.NEGATIVE_INFINITY;
  let maximumDepthStationM = reach.startStationM;
  let minimumFreeboardM = Number.POSITIVE_INFINITY;
  let minimumFreeboardStationM = reach.startStationM;
  const overtoppedRanges: StationRange[] = [];
  let openRangeFromM: number | undefined;
  let previousIndex = -1;
  for (let index = fromIndex; index < toIndex; index++) {
    if (table.reachIndexAt(index) !== reach.index) continue;
    const depthM = table.depthAt(index);
    const stationM = table.stationAt(index);
    if (depthM > maximumDepthM) {
      maximumDepthM = depthM;
      maximumDepthStationM = stationM;
    }
    if (bankHeightM !== undefined) {
      const freeboardM = bankHeightM - depthM;
      if (freeboardM < minimumFreeboardM) {
        minimumFreeboardM = freeboardM;
        minimumFreeboardStationM = stationM;
      }
      const over = freeboardM < 0;
      const wasOver = openRangeFromM !== undefined;
      if (over !== wasOver) {
        const crossingM = previousIndex < 0 ? stationM : bankCrossingStationM(table.stationAt(previousIndex), table.depthAt(previousIndex), stationM, depthM, bankHeightM);
        if (over) openRangeFromM = crossingM;
        else {
          overtoppedRanges.push({ fromStationM: openRangeFromM ?? crossingM, toStationM: crossingM });
          openRangeFromM = undefined;
        }
      }
    }
    previousIndex = index;
  }
  if (openRangeFromM !== undefined && previousIndex >= 0) overtoppedRanges.push({ fromStationM: openRangeFromM, toStationM: table.stationAt(previousIndex) });
  const profileClasses: SegmentClass[] = [];
  for (const segment of reachSegments) {
    if (profileClasses[profileClasses.length - 1] !== segment.profileClass) profileClasses.push(segment.profileClass);
  }
  const flow = reach.flow;
  return {
    reachIndex: reach.index,
    reachName: reach.input.name,
    startStationM: reach.startStationM,
    endStationM: reach.startStationM + reach.lengthM,
    upstreamInvertElevationM: reach.upstreamInvertElevationM,
    downstreamInvertElevationM: reach.downstreamInvertElevationM,
    normalDepthM: flow.normalDepthM ?? null,
    normalDepthNote: flow.normalDepthNote ?? null,
    criticalDepthM: flow.criticalDepthM,
    slopeClass: flow.slopeClass,
    maximumDepthM,
    maximumDepthStationM,
    bankHeightM: bankHeightM ?? null,
    minimumFreeboardM: bankHeightM === undefined ? null : minimumFreeboardM,
    minimumFreeboardStationM: bankHeightM === undefined ? null : minimumFreeboardStationM,
    overtoppedRanges,
    profileClasses,
  };
}

/** Station where the depth crosses the bank height between two points (upstream, then downstream), by linear interpolation, m. */
function bankCrossingStationM(upstreamStationM: number, upstreamDepthM: number, downstreamStationM: number, downstreamDepthM: number, bankHeightM: number): number {
  const depthChangeM = downstreamDepthM - upstreamDepthM;
  if (depthChangeM === 0 || downstreamStationM === upstreamStationM) return downstreamStationM;
  const fraction = (bankHeightM - upstreamDepthM) / depthChangeM;
  return upstreamStationM + Math.min(Math.max(fraction, 0), 1) * (downstreamStationM - upstreamStationM);
}
