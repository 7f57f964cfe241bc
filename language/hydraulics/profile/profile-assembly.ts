/**
 * Joins the subcritical and supercritical passes into the channel's profile: the points in flow order, the steps
 * between them with their head losses and energy residuals (recomputed from the points, so they check the
 * passes), the classified segments, and each reach's summary (deepest point, least freeboard, over-topping).
 *
 * The points stay in each reach's own columns (station within the reach, depth), which ProfilePointTable reads in
 * flow order without copying them into channel-wide ones, and become point and step objects only when read. The
 * analysis recomputes a channel's profiles on every edit and reads the reach summaries, jumps and notes, while only
 * a report or an export reads every point: building some 1,000 point and step objects per flow on every keystroke
 * was two fifths of the analysis of a 50-reach channel (measured, issue 8).
 * The summaries and segments take their stations from the columns with the same expression as the points, so a
 * station is the same whichever is read; the energy check inside a reach uses heads above the reach's own invert
 * (below), across a junction the points' own elevations.
 *
 * Reach by reach: each reach's points, the steps between them, its segments and its extremes are made in the
 * reach's own frame (stations from its upstream end, heads from its upstream invert) from its marches and flow
 * description only, and reach reuse takes them over with the marches (reach-reuse.ts); an edit elsewhere that lifts
 * the bed above or shifts the stations leaves them equal bit for bit. Only the steps across junctions, in
 * elevations, and the placing in channel stations are made for the whole channel on every computation.
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
} from './profile-types.js';
import { frictionSlope, type ReachFlow } from './reach-flow.js';
import type { JunctionRecord } from './subcritical-pass.js';
import type { SupercriticalPiece } from './supercritical-pass.js';
import type { ProfileReuse } from './reach-reuse.js';

export type AssemblyResult = ({ readonly converged: true } & AssembledProfile) | { readonly converged: false; readonly surchargedReachIndex: number };

export interface AssembledProfile {
  readonly table: ProfilePointTable;
  readonly segments: ProfileSegment[];
  readonly reaches: ReachProfileSummary[];
  readonly maximumEnergyResidualM: number;
}

/** Step kinds as stored in the columns: a step's code is its index here. */
const STEP_KINDS: readonly ProfileStepKind[] = ['gradually-varied', 'junction', 'junction-critical-control', 'hydraulic-jump'];
const GRADUALLY_VARIED_STEP = STEP_KINDS.indexOf('gradually-varied');
const JUMP_STEP = STEP_KINDS.indexOf('hydraulic-jump');

/** What joins a point to the one before it within the same reach. */
type PointJoin = 'step' | 'jump';

/**
 * A profile's computed sections, in flow order, read from the reaches' own columns (ReachAssembly) without copying
 * them into channel-wide ones: each reach's points follow the points of the reach above, and the steps between two
 * reaches are kept apart. Points and steps are built on request, from the same expressions the assembly used.
 */
export class ProfilePointTable implements ProfilePointColumns {
  /** The point index each part's first point has, and the point count after the last part. */
  private readonly firstPoints: Int32Array;

  constructor(
    /** The reaches' parts that hold points, in flow order, with the reach each belongs to. */
    private readonly parts: readonly ReachAssembly[],
    private readonly partReaches: readonly ResolvedReach[],
    /** joining[k] joins the last point of parts[k - 1] to the first of parts[k] (none before the first part). */
    private readonly joining: readonly (JoiningStep | undefined)[],
  ) {
    this.firstPoints = new Int32Array(parts.length + 1);
    for (let position = 0; position < parts.length; position++) {
      this.firstPoints[position + 1] = (this.firstPoints[position] ?? 0) + (parts[position] as ReachAssembly).depthsM.length;
    }
  }

  get length(): number {
    return this.firstPoints[this.parts.length] ?? 0;
  }

  reachIndexAt(index: number): number {
    return this.partReaches[this.partAt(index)]?.index ?? 0;
  }

  depthAt(index: number): number {
    const position = this.partAt(index);
    return this.parts[position]?.depthsM[index - (this.firstPoints[position] ?? 0)] ?? 0;
  }

  /** Station of a point, m from the channel's upstream end. */
  stationAt(index: number): number {
    const position = this.partAt(index);
    return pointStationM(this.partReaches[position] as ResolvedReach, this.parts[position]?.localStationsM[index - (this.firstPoints[position] ?? 0)] ?? 0);
  }

  regimeAt(index: number): ProfileRegime {
    return regimeOf((this.partReaches[this.partAt(index)] as ResolvedReach).flow.criticalDepthM, this.depthAt(index));
  }

  point(index: number): ProfilePoint {
    const position = this.partAt(index);
    const local = index - (this.firstPoints[position] ?? 0);
    return makePoint(this.partReaches[position] as ResolvedReach, this.parts[position]?.localStationsM[local] ?? 0, this.parts[position]?.depthsM[local] ?? 0);
  }

  /** Every point, in flow order. */
  points(): ProfilePoint[] {
    const points = new Array<ProfilePoint>(this.length);
    for (let index = 0; index < points.length; index++) points[index] = this.point(index);
    return points;
  }

  /** Every step: steps[i] joins points i and i + 1. */
  steps(): ProfileStep[] {
    const steps = new Array<ProfileStep>(Math.max(this.length - 1, 0));
    for (let index = 0; index < steps.length; index++) {
      const position = this.partAt(index);
      const local = index - (this.firstPoints[position] ?? 0);
      const part = this.parts[position] as ReachAssembly;
      let kind: ProfileStepKind;
      let headLossM: number;
      let residualM: number | null;
      if (local + 1 < part.depthsM.length) {
        kind = STEP_KINDS[part.stepKinds[local] ?? 0] ?? 'gradually-varied';
        headLossM = part.headLossesM[local] ?? 0;
        const residual = part.energyResidualsM[local] ?? Number.NaN;
        residualM = Number.isNaN(residual) ? null : residual;
      } else {
        const step = this.joining[position + 1] as JoiningStep;
        ({ kind, headLossM } = step);
        residualM = step.energyResidualM;
      }
      steps[index] = { kind, upstreamPointIndex: index, downstreamPointIndex: index + 1, lengthM: this.stationAt(index + 1) - this.stationAt(index), headLossM, energyResidualM: residualM };
    }
    return steps;
  }

  /** The part holding point `index`: the last whose first point is at or before it (parts hold at least one point). */
  private partAt(index: number): number {
    let low = 0;
    let high = this.parts.length - 1;
    while (low < high) {
      const middle = (low + high + 1) >> 1;
      if ((this.firstPoints[middle] ?? 0) <= index) low = middle;
      else high = middle - 1;
    }
    return low;
  }
}

/** The step from the last point of one reach to the first point of the next, in elevations. */
interface JoiningStep {
  readonly kind: ProfileStepKind;
  readonly headLossM: number;
  readonly energyResidualM: number | null;
}

export function assembleProfile(
  reaches: readonly ResolvedReach[],
  traces: readonly SubcriticalTrace[],
  junctions: readonly JunctionRecord[],
  pieces: readonly (SupercriticalPiece | undefined)[],
  jumps: readonly HydraulicJump[],
  lossCoefficient: number,
  reuse?: ProfileReuse,
): AssemblyResult {
  // Each reach's share in its own frame, taken over with the marches it is made from (reach-reuse.ts).
  const parts: ReachAssembly[] = [];
  for (const reach of reaches) {
    const trace = traces[reach.index] as SubcriticalTrace;
    const piece = pieces[reach.index];
    const assemble = (): ReachAssembly => assembleReach(reach, trace, piece);
    const part = reuse === undefined ? assemble() : reuse.reachAssembly(trace, piece, reach.flow, reach.lengthM, reach.input.bankHeightM, assemble);
    if (part.surcharged) return { converged: false, surchargedReachIndex: reach.index };
    parts.push(part);
  }

  const pointParts: ReachAssembly[] = [];
  const pointReaches: ResolvedReach[] = [];
  const joining: (JoiningStep | undefined)[] = [];
  const segments: ProfileSegment[] = [];
  const summaries: ReachProfileSummary[] = [];
  let maximumEnergyResidualM = 0;
  let lastReach: ResolvedReach | undefined;
  let lastPart: ReachAssembly | undefined;
  // Reaches with a jump at their head (the foot of a drop above them).
  const jumpAtHead = new Set(jumps.filter((jump) => jump.placement === 'at-junction').map((jump) => jump.reachIndex));
  for (let position = 0; position < reaches.length; position++) {
    const reach = reaches[position] as ResolvedReach;
    const part = parts[position] as ReachAssembly;
    const pointCount = part.depthsM.length;
    if (pointCount > 0) {
      if (lastReach !== undefined && lastPart !== undefined) {
        // The step from the last point above (another reach) to this reach's first point, in elevations.
        const lastIndex = lastPart.depthsM.length - 1;
        const step = joiningStep(lastReach, lastPart.localStationsM[lastIndex] ?? 0, lastPart.depthsM[lastIndex] ?? 0, reach, part, junctions, pieces, jumpAtHead, lossCoefficient);
        joining.push(step);
        if (step.energyResidualM !== null) maximumEnergyResidualM = Math.max(maximumEnergyResidualM, Math.abs(step.energyResidualM));
      } else {
        joining.push(undefined);
      }
      pointParts.push(part);
      pointReaches.push(reach);
      lastReach = reach;
      lastPart = part;
    }
    maximumEnergyResidualM = Math.max(maximumEnergyResidualM, part.maximumEnergyResidualM);
    const placed = placedShare(reach, part);
    for (const segment of placed.segments) segments.push(segment);
    summaries.push(placed.summary);
  }
  const table = new ProfilePointTable(pointParts, pointReaches, joining);
  return { converged: true, table, segments, reaches: summaries, maximumEnergyResidualM };
}

/**
 * One reach's share of the profile in its own frame: stations from its upstream end, elevations from its upstream
 * invert. It is made from the reach's marches (subcritical trace, supercritical piece) and its flow description
 * only, so that an edit elsewhere, which may lift the whole bed above it or shift its stations, leaves it equal bit
 * for bit and reach reuse can take it over with the marches.
 */
interface ReachAssembly {
  /** The profile needs subcritical flow where the conduit would flow full (see visitReachPoints). */
  readonly surcharged: boolean;
  readonly localStationsM: Float64Array;
  readonly depthsM: Float64Array;
  /** How the reach's first point joins the point before it (a jump may land on a reach's first station). */
  readonly firstJoin: PointJoin;
  /** The steps between the reach's consecutive points (STEP_KINDS codes): stepKinds[i] joins points i and i + 1. */
  readonly stepKinds: Uint8Array;
  readonly headLossesM: Float64Array;
  /** NaN where no balance is imposed. */
  readonly energyResidualsM: Float64Array;
  readonly maximumEnergyResidualM: number;
  readonly segments: readonly { readonly fromLocalM: number; readonly toLocalM: number; readonly profileClass: SegmentClass }[];
  readonly maximumDepthM: number;
  readonly maximumDepthLocalM: number;
  readonly minimumFreeboardM: number;
  readonly minimumFreeboardLocalM: number;
  readonly overtoppedLocal: readonly { readonly fromLocalM: number; readonly toLocalM: number }[];
  /** The share placed in the channel the last time (placedShare), kept while the reach stays where it was. */
  placed?: PlacedShare;
}

/** A reach's segments and summary in channel stations, and where the reach stood when they were made. */
interface PlacedShare {
  readonly reach: Pick<ResolvedReach, 'index' | 'startStationM'> & { readonly name: string };
  readonly segments: readonly ProfileSegment[];
  readonly summary: ReachProfileSummary;
}

/**
 * The reach's share in channel stations: the same objects as last time when the reach has not moved along the
 * channel. Its segments and summary hold stations and depths only, no elevations, so an edit below that lifts the bed
 * under it leaves them as they were (the part itself is the same only for the same length, flow description and bank
 * height: reach-reuse.ts).
 */
function placedShare(reach: ResolvedReach, part: ReachAssembly): PlacedShare {
  const last = part.placed?.reach;
  if (last !== undefined && last.index === reach.index && last.name === reach.input.name && Object.is(last.startStationM, reach.startStationM)) {
    return part.placed as PlacedShare;
  }
  const placed: PlacedShare = {
    reach: { index: reach.index, name: reach.input.name, startStationM: reach.startStationM },
    segments: part.segments.map((segment) => ({
      reachIndex: reach.index,
      reachName: reach.input.name,
      fromStationM: pointStationM(reach, segment.fromLocalM),
      toStationM: pointStationM(reach, segment.toLocalM),
      profileClass: segment.profileClass,
      description: describeSegmentClass(segment.profileClass),
    })),
    summary: summaryOf(reach, part),
  };
  part.placed = placed;
  return placed;
}

function assembleReach(reach: ResolvedReach, trace: SubcriticalTrace, piece: SupercriticalPiece | undefined): ReachAssembly {
  const localStations: number[] = [];
  const depths: number[] = [];
  const joins: PointJoin[] = [];
  const surcharged =
    visitReachPoints(reach, trace, piece, (localStationM, depthM, join) => {
      localStations.push(localStationM);
      depths.push(depthM);
      joins.push(join);
    }) === 'surcharged';
  const localStationsM = Float64Array.from(localStations);
  const depthsM = Float64Array.from(depths);
  const count = depthsM.length;
  const flow = reach.flow;

  // Steps inside the reach: heads from the reach's upstream invert (the bed falls bedSlope per metre).
  const stepCount = Math.max(count - 1, 0);
  const stepKinds = new Uint8Array(stepCount);
  const headLossesM = new Float64Array(stepCount);
  const energyResidualsM = new Float64Array(stepCount);
  let maximumEnergyResidualM = 0;
  let upstreamEnergyM = count > 0 ? localEnergyM(reach, localStationsM[0] ?? 0, depthsM[0] ?? 0) : 0;
  let upstreamFrictionSlope = count > 0 ? frictionSlope(flow, depthsM[0] ?? 0) : 0;
  for (let index = 1; index < count; index++) {
    const depthM = depthsM[index] ?? 0;
    const energyM = localEnergyM(reach, localStationsM[index] ?? 0, depthM);
    const downstreamFrictionSlope = frictionSlope(flow, depthM);
    const headDifferenceM = upstreamEnergyM - energyM;
    if (joins[index] === 'jump') {
      stepKinds[index - 1] = JUMP_STEP;
      headLossesM[index - 1] = headDifferenceM;
      energyResidualsM[index - 1] = Number.NaN;
    } else {
      // Standard step: friction loss from the arithmetic mean of the end friction slopes.
      const lengthM = (localStationsM[index] ?? 0) - (localStationsM[index - 1] ?? 0);
      const headLossM = 0.5 * (upstreamFrictionSlope + downstreamFrictionSlope) * lengthM;
      const residualM = headDifferenceM - headLossM;
      stepKinds[index - 1] = GRADUALLY_VARIED_STEP;
      headLossesM[index - 1] = headLossM;
      energyResidualsM[index - 1] = residualM;
      maximumEnergyResidualM = Math.max(maximumEnergyResidualM, Math.abs(residualM));
    }
    upstreamEnergyM = energyM;
    upstreamFrictionSlope = downstreamFrictionSlope;
  }

  const segments = classifyReachSegments(flow, localStationsM, depthsM, stepKinds);
  return {
    surcharged,
    localStationsM,
    depthsM,
    firstJoin: joins[0] ?? 'step',
    stepKinds,
    headLossesM,
    energyResidualsM,
    maximumEnergyResidualM,
    segments,
    ...reachExtremes(reach, localStationsM, depthsM),
  };
}

/** Head at a point of a reach, m above the reach's upstream invert: bed, depth and alpha V^2 / 2g. */
function localEnergyM(reach: ResolvedReach, localStationM: number, depthM: number): number {
  const velocityMs = pointVelocityMs(reach.flow, depthM);
  return -reach.flow.bedSlope * Math.min(localStationM, reach.lengthM) + depthM + velocityHead(reach, velocityMs);
}

/** The step joining the last point of the reach above (`above`, at its local station and depth) to `reach`'s first. */
function joiningStep(
  above: ResolvedReach,
  aboveLocalM: number,
  aboveDepthM: number,
  reach: ResolvedReach,
  part: ReachAssembly,
  junctions: readonly JunctionRecord[],
  pieces: readonly (SupercriticalPiece | undefined)[],
  jumpAtHead: ReadonlySet<number>,
  lossCoefficient: number,
): { readonly kind: ProfileStepKind; readonly headLossM: number; readonly energyResidualM: number | null } {
  const upstreamVelocityMs = pointVelocityMs(above.flow, aboveDepthM);
  const downstreamLocalM = part.localStationsM[0] ?? 0;
  const downstreamDepthM = part.depthsM[0] ?? 0;
  const downstreamVelocityMs = pointVelocityMs(reach.flow, downstreamDepthM);
  const headDifferenceM = pointEnergyElevationM(above, aboveLocalM, aboveDepthM, upstreamVelocityMs) - pointEnergyElevationM(reach, downstreamLocalM, downstreamDepthM, downstreamVelocityMs);
  if (part.firstJoin === 'jump') return { kind: 'hydraulic-jump', headLossM: headDifferenceM, energyResidualM: null };
  const enteredAcross = pieces[reach.index]?.enteredAcrossJunction === true;
  const record = junctions[above.index];
  // A jump at the foot of a drop: recorded on the reach below, between the brink and the water below.
  if (jumpAtHead.has(reach.index) && !enteredAcross) return { kind: 'hydraulic-jump', headLossM: headDifferenceM, energyResidualM: null };
  if (enteredAcross || record?.kind !== 'critical-control') {
    const headLossM = lossCoefficient * Math.abs(velocityHead(above, upstreamVelocityMs) - velocityHead(reach, downstreamVelocityMs));
    return { kind: 'junction', headLossM, energyResidualM: headDifferenceM - headLossM };
  }
  return { kind: 'junction-critical-control', headLossM: headDifferenceM, energyResidualM: null };
}

/** A reach's summary in channel stations, from its share in its own frame. */
function summaryOf(reach: ResolvedReach, part: ReachAssembly): ReachProfileSummary {
  const bankHeightM = reach.input.bankHeightM;
  const profileClasses: SegmentClass[] = [];
  for (const segment of part.segments) {
    if (profileClasses[profileClasses.length - 1] !== segment.profileClass) profileClasses.push(segment.profileClass);
  }
  const flow = reach.flow;
  return {
    reachIndex: reach.index,
    reachName: reach.input.name,
    startStationM: reach.startStationM,
    endStationM: reach.startStationM + reach.lengthM,
    normalDepthM: flow.normalDepthM ?? null,
    normalDepthNote: flow.normalDepthNote ?? null,
    criticalDepthM: flow.criticalDepthM,
    slopeClass: flow.slopeClass,
    maximumDepthM: part.maximumDepthM,
    maximumDepthStationM: pointStationM(reach, part.maximumDepthLocalM),
    bankHeightM: bankHeightM ?? null,
    minimumFreeboardM: bankHeightM === undefined ? null : part.minimumFreeboardM,
    minimumFreeboardStationM: bankHeightM === undefined ? null : pointStationM(reach, part.minimumFreeboardLocalM),
    overtoppedRanges: part.overtoppedLocal.map((range) => ({ fromStationM: pointStationM(reach, range.fromLocalM), toStationM: pointStationM(reach, range.toLocalM) })),
    profileClasses,
  };
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
  return waterSurfaceElevationM + velocityHead(reach, velocityMs);
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

/** Segments of one reach, in its stations: runs of standard steps whose mid-step depths fall in the same class. */
function classifyReachSegments(flow: ReachFlow, localStationsM: Float64Array, depthsM: Float64Array, stepKinds: Uint8Array): ReachAssembly['segments'] {
  const segments: { fromLocalM: number; toLocalM: number; profileClass: SegmentClass }[] = [];
  let current: { fromLocalM: number; toLocalM: number; profileClass: SegmentClass; lastStep: number } | undefined;
  for (let stepIndex = 0; stepIndex < stepKinds.length; stepIndex++) {
    if (stepKinds[stepIndex] !== GRADUALLY_VARIED_STEP) continue;
    const upstreamLocalM = localStationsM[stepIndex] ?? 0;
    const downstreamLocalM = localStationsM[stepIndex + 1] ?? 0;
    if (!(downstreamLocalM - upstreamLocalM > 0)) continue;
    const middleDepthM = 0.5 * ((depthsM[stepIndex] ?? 0) + (depthsM[stepIndex + 1] ?? 0));
    const profileClass = classifySegment(flow.slopeClass, middleDepthM, flow.normalDepthM, flow.criticalDepthM);
    if (current !== undefined && current.profileClass === profileClass && current.lastStep === stepIndex - 1) {
      current.toLocalM = downstreamLocalM;
      current.lastStep = stepIndex;
      continue;
    }
    if (current !== undefined) segments.push({ fromLocalM: current.fromLocalM, toLocalM: current.toLocalM, profileClass: current.profileClass });
    current = { fromLocalM: upstreamLocalM, toLocalM: downstreamLocalM, profileClass, lastStep: stepIndex };
  }
  if (current !== undefined) segments.push({ fromLocalM: current.fromLocalM, toLocalM: current.toLocalM, profileClass: current.profileClass });
  return segments;
}

/** The deepest point, the least freeboard and the over-topped stretches of one reach, in its stations. */
function reachExtremes(
  reach: ResolvedReach,
  localStationsM: Float64Array,
  depthsM: Float64Array,
): Pick<ReachAssembly, 'maximumDepthM' | 'maximumDepthLocalM' | 'minimumFreeboardM' | 'minimumFreeboardLocalM' | 'overtoppedLocal'> {
  const bankHeightM = reach.input.bankHeightM;
  let maximumDepthM = Number.NEGATIVE_INFINITY;
  let maximumDepthLocalM = 0;
  let minimumFreeboardM = Number.POSITIVE_INFINITY;
  let minimumFreeboardLocalM = 0;
  const overtoppedLocal: { fromLocalM: number; toLocalM: number }[] = [];
  let openRangeFromM: number | undefined;
  for (let index = 0; index < depthsM.length; index++) {
    const depthM = depthsM[index] ?? 0;
    const stationM = localStationsM[index] ?? 0;
    if (depthM > maximumDepthM) {
      maximumDepthM = depthM;
      maximumDepthLocalM = stationM;
    }
    if (bankHeightM !== undefined) {
      const freeboardM = bankHeightM - depthM;
      if (freeboardM < minimumFreeboardM) {
        minimumFreeboardM = freeboardM;
        minimumFreeboardLocalM = stationM;
      }
      const over = freeboardM < 0;
      const wasOver = openRangeFromM !== undefined;
      if (over !== wasOver) {
        const crossingM = index === 0 ? stationM : bankCrossingStationM(localStationsM[index - 1] ?? 0, depthsM[index - 1] ?? 0, stationM, depthM, bankHeightM);
        if (over) openRangeFromM = crossingM;
        else {
          overtoppedLocal.push({ fromLocalM: openRangeFromM ?? crossingM, toLocalM: crossingM });
          openRangeFromM = undefined;
        }
      }
    }
  }
  if (openRangeFromM !== undefined && depthsM.length > 0) overtoppedLocal.push({ fromLocalM: openRangeFromM, toLocalM: localStationsM[depthsM.length - 1] ?? 0 });
  return { maximumDepthM, maximumDepthLocalM, minimumFreeboardM, minimumFreeboardLocalM, overtoppedLocal };
}

/** Station where the depth crosses the bank height between two points (upstream, then downstream), by linear interpolation, m. */
function bankCrossingStationM(upstreamStationM: number, upstreamDepthM: number, downstreamStationM: number, downstreamDepthM: number, bankHeightM: number): number {
  const depthChangeM = downstreamDepthM - upstreamDepthM;
  if (depthChangeM === 0 || downstreamStationM === upstreamStationM) return downstreamStationM;
  const fraction = (bankHeightM - upstreamDepthM) / depthChangeM;
  return upstreamStationM + Math.min(Math.max(fraction, 0), 1) * (downstreamStationM - upstreamStationM);
}
