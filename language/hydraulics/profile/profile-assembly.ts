/**
 * Joins the subcritical and supercritical passes into the channel's profile: the points in flow order, the steps
 * between them with their head losses and energy residuals (recomputed from the points, so they check the
 * passes), the classified segments, and each reach's summary (deepest point, least freeboard, over-topping).
 */
import { CRITICAL_MATCH_RELATIVE_TOLERANCE, GRAVITY_MS2 } from '../constants.js';
import { invertElevationAt, type ResolvedReach, type SubcriticalTrace } from './channel-model.js';
import { classifySegment, describeSegmentClass } from './profile-class.js';
import type {
  HydraulicJump,
  ProfilePoint,
  ProfileRegime,
  ProfileSegment,
  ProfileStep,
  ProfileStepKind,
  ReachProfileSummary,
  SegmentClass,
  StationRange,
} from './profile-types.js';
import { frictionSlope } from './reach-flow.js';
import type { JunctionRecord } from './subcritical-pass.js';
import type { SupercriticalPiece } from './supercritical-pass.js';

export type AssemblyResult = ({ readonly converged: true } & AssembledProfile) | { readonly converged: false; readonly surchargedReachIndex: number };

export interface AssembledProfile {
  readonly points: ProfilePoint[];
  readonly steps: ProfileStep[];
  readonly segments: ProfileSegment[];
  readonly reaches: ReachProfileSummary[];
  readonly maximumEnergyResidualM: number;
}

/** What joins a point to the one before it within the same reach. */
type PointJoin = 'step' | 'jump';

export function assembleProfile(
  reaches: readonly ResolvedReach[],
  traces: readonly SubcriticalTrace[],
  junctions: readonly JunctionRecord[],
  pieces: readonly (SupercriticalPiece | undefined)[],
  jumps: readonly HydraulicJump[],
  lossCoefficient: number,
): AssemblyResult {
  const points: ProfilePoint[] = [];
  const joins: PointJoin[] = [];
  const firstPointOfReach: number[] = [];
  for (const reach of reaches) {
    firstPointOfReach.push(points.length);
    const trace = traces[reach.index] as SubcriticalTrace;
    const piece = pieces[reach.index];
    const add = (localStationM: number, depthM: number, join: PointJoin): void => {
      points.push(makePoint(reach, localStationM, depthM));
      joins.push(join);
    };
    let resumeAfterM: number | undefined = Number.NEGATIVE_INFINITY;
    if (piece !== undefined) {
      for (let i = 0; i < piece.stationsM.length; i++) add(piece.stationsM[i] ?? 0, piece.depthsM[i] ?? 0, 'step');
      if (piece.jumpDownstreamDepthM !== undefined && piece.resumeSubcriticalAfterM !== undefined) {
        add(piece.resumeSubcriticalAfterM, piece.jumpDownstreamDepthM, 'jump');
      }
      resumeAfterM = piece.resumeSubcriticalAfterM === undefined ? undefined : piece.resumeSubcriticalAfterM + 1e-9 * reach.lengthM;
    }
    if (resumeAfterM !== undefined && trace.noSubcriticalDepthReason === 'surcharged' && resumeAfterM < (trace.noSubcriticalDepthAboveM ?? 0)) {
      // The profile needs the subcritical flow where the conduit would flow full: no supercritical flow holds it.
      return { converged: false, surchargedReachIndex: reach.index };
    }
    if (resumeAfterM !== undefined) {
      for (let i = 0; i < trace.stationsM.length; i++) {
        const stationM = trace.stationsM[i] ?? 0;
        if (stationM > resumeAfterM) add(stationM, trace.depthsM[i] ?? 0, 'step');
      }
    }
  }

  const steps: ProfileStep[] = [];
  let maximumEnergyResidualM = 0;
  // Each point's friction slope serves the steps on both sides of it.
  let upstreamFrictionSlope = points.length > 0 ? frictionSlope((reaches[0] as ResolvedReach).flow, (points[0] as ProfilePoint).depthM) : 0;
  for (let index = 1; index < points.length; index++) {
    const upstream = points[index - 1] as ProfilePoint;
    const downstream = points[index] as ProfilePoint;
    const upstreamReach = reaches[upstream.reachIndex] as ResolvedReach;
    const downstreamReach = reaches[downstream.reachIndex] as ResolvedReach;
    const headDifferenceM = upstream.energyElevationM - downstream.energyElevationM;
    let kind: ProfileStepKind;
    let headLossM: number;
    let energyResidualM: number | null;
    const lengthM = downstream.stationM - upstream.stationM;
    const downstreamFrictionSlope = frictionSlope(downstreamReach.flow, downstream.depthM);
    if (joins[index] === 'jump') {
      kind = 'hydraulic-jump';
      headLossM = headDifferenceM;
      energyResidualM = null;
    } else if (upstream.reachIndex === downstream.reachIndex) {
      // Standard step: friction loss from the arithmetic mean of the end friction slopes.
      kind = 'gradually-varied';
      headLossM = 0.5 * (upstreamFrictionSlope + downstreamFrictionSlope) * lengthM;
      energyResidualM = headDifferenceM - headLossM;
    } else {
      const enteredAcross = pieces[downstream.reachIndex]?.enteredAcrossJunction === true && firstPointOfReach[downstream.reachIndex] === index;
      const record = junctions[upstream.reachIndex];
      // A jump at the foot of a drop: recorded on the reach below, between the brink and the water below.
      const junctionJump = jumps.find((jump) => jump.placement === 'at-junction' && jump.reachIndex === downstream.reachIndex);
      if (junctionJump !== undefined && !enteredAcross) {
        kind = 'hydraulic-jump';
        headLossM = headDifferenceM;
        energyResidualM = null;
      } else if (enteredAcross || record?.kind !== 'critical-control') {
        kind = 'junction';
        const upstreamVelocityHeadM = velocityHead(upstreamReach, upstream.velocityMs);
        const downstreamVelocityHeadM = velocityHead(downstreamReach, downstream.velocityMs);
        headLossM = lossCoefficient * Math.abs(upstreamVelocityHeadM - downstreamVelocityHeadM);
        energyResidualM = headDifferenceM - headLossM;
      } else {
        kind = 'junction-critical-control';
        headLossM = headDifferenceM;
        energyResidualM = null;
      }
    }
    upstreamFrictionSlope = downstreamFrictionSlope;
    if (energyResidualM !== null) maximumEnergyResidualM = Math.max(maximumEnergyResidualM, Math.abs(energyResidualM));
    steps.push({ kind, upstreamPointIndex: index - 1, downstreamPointIndex: index, lengthM, headLossM, energyResidualM });
  }

  const segments = classifySegments(reaches, points, steps);
  // A reach's points are contiguous: each summary reads only its own slice.
  const summaries = reaches.map((reach, position) =>
    summariseReach(reach, points, firstPointOfReach[position] ?? points.length, firstPointOfReach[position + 1] ?? points.length, segments),
  );
  return { converged: true, points, steps, segments, reaches: summaries, maximumEnergyResidualM };
}

function velocityHead(reach: ResolvedReach, velocityMs: number): number {
  return (reach.flow.kineticEnergyCoefficient * velocityMs * velocityMs) / (2 * GRAVITY_MS2);
}

function makePoint(reach: ResolvedReach, localStationM: number, depthM: number): ProfilePoint {
  const flow = reach.flow;
  const areaM2 = flow.section.areaM2(depthM);
  const velocityMs = flow.dischargeM3s / areaM2;
  const invertElevationM = invertElevationAt(reach, localStationM);
  const waterSurfaceElevationM = invertElevationM + depthM;
  const criticalDepthM = flow.criticalDepthM;
  let regime: ProfileRegime;
  if (Math.abs(depthM - criticalDepthM) <= CRITICAL_MATCH_RELATIVE_TOLERANCE * criticalDepthM) regime = 'critical';
  else regime = depthM > criticalDepthM ? 'subcritical' : 'supercritical';
  return {
    stationM: reach.startStationM + localStationM,
    reachIndex: reach.index,
    reachName: reach.input.name,
    depthM,
    invertElevationM,
    waterSurfaceElevationM,
    energyElevationM: waterSurfaceElevationM + (flow.kineticEnergyCoefficient * velocityMs * velocityMs) / (2 * GRAVITY_MS2),
    velocityMs,
    // V / sqrt(g A / T), as froudeNumber in critical-flow.ts, with the area already at hand.
    froudeNumber: velocityMs / Math.sqrt((GRAVITY_MS2 * areaM2) / flow.section.topWidthM(depthM)),
    regime,
  };
}

/** Segments: runs of standard steps in one reach whose mid-step depths fall in the same class. */
function classifySegments(reaches: readonly ResolvedReach[], points: readonly ProfilePoint[], steps: readonly ProfileStep[]): ProfileSegment[] {
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
  steps.forEach((step, stepIndex) => {
    if (step.kind !== 'gradually-varied' || step.lengthM <= 0) return;
    const upstream = points[step.upstreamPointIndex] as ProfilePoint;
    const downstream = points[step.downstreamPointIndex] as ProfilePoint;
    const flow = (reaches[upstream.reachIndex] as ResolvedReach).flow;
    const middleDepthM = 0.5 * (upstream.depthM + downstream.depthM);
    const profileClass = classifySegment(flow.slopeClass, middleDepthM, flow.normalDepthM, flow.criticalDepthM);
    if (current !== undefined && current.reachIndex === upstream.reachIndex && current.profileClass === profileClass && current.lastStep === stepIndex - 1) {
      current.toStationM = downstream.stationM;
      current.lastStep = stepIndex;
      return;
    }
    close();
    current = { reachIndex: upstream.reachIndex, fromStationM: upstream.stationM, toStationM: downstream.stationM, profileClass, lastStep: stepIndex };
  });
  close();
  return segments;
}

/** Summary of one reach from its points, points[fromIndex] up to (not including) points[toIndex]. */
function summariseReach(
  reach: ResolvedReach,
  points: readonly ProfilePoint[],
  fromIndex: number,
  toIndex: number,
  segments: readonly ProfileSegment[],
): ReachProfileSummary {
  const bankHeightM = reach.input.bankHeightM;
  let maximumDepthM = Number.NEGATIVE_INFINITY;
  let maximumDepthStationM = reach.startStationM;
  let minimumFreeboardM = Number.POSITIVE_INFINITY;
  let minimumFreeboardStationM = reach.startStationM;
  const overtoppedRanges: StationRange[] = [];
  let openRangeFromM: number | undefined;
  let previous: ProfilePoint | undefined;
  for (let index = fromIndex; index < toIndex; index++) {
    const point = points[index] as ProfilePoint;
    if (point.reachIndex !== reach.index) continue;
    if (point.depthM > maximumDepthM) {
      maximumDepthM = point.depthM;
      maximumDepthStationM = point.stationM;
    }
    if (bankHeightM !== undefined) {
      const freeboardM = bankHeightM - point.depthM;
      if (freeboardM < minimumFreeboardM) {
        minimumFreeboardM = freeboardM;
        minimumFreeboardStationM = point.stationM;
      }
      const over = freeboardM < 0;
      const wasOver = openRangeFromM !== undefined;
      if (over !== wasOver) {
        const crossingM = previous === undefined ? point.stationM : bankCrossingStationM(previous, point, bankHeightM);
        if (over) openRangeFromM = crossingM;
        else {
          overtoppedRanges.push({ fromStationM: openRangeFromM ?? crossingM, toStationM: crossingM });
          openRangeFromM = undefined;
        }
      }
    }
    previous = point;
  }
  if (openRangeFromM !== undefined && previous !== undefined) overtoppedRanges.push({ fromStationM: openRangeFromM, toStationM: previous.stationM });
  const profileClasses: SegmentClass[] = [];
  for (const segment of segments) {
    if (segment.reachIndex !== reach.index) continue;
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

/** Station where the depth crosses the bank height between two points, by linear interpolation, m. */
function bankCrossingStationM(upstream: ProfilePoint, downstream: ProfilePoint, bankHeightM: number): number {
  const depthChangeM = downstream.depthM - upstream.depthM;
  if (depthChangeM === 0 || downstream.stationM === upstream.stationM) return downstream.stationM;
  const fraction = (bankHeightM - upstream.depthM) / depthChangeM;
  return upstream.stationM + Math.min(Math.max(fraction, 0), 1) * (downstream.stationM - upstream.stationM);
}
