/**
 * The findings a channel's water-surface profile gives beyond over-topping and freeboard: where hydraulic jumps
 * form and whether the channel holds and resists them, and why a profile could not be computed. Each finding is
 * drafted here for the reach it concerns and added to that reach's results by the analysis.
 *
 * What a drainage engineer expects of a jump (the rules, also stated in the design's assumptions):
 * - a jump entering at a Froude number within the near-critical band the criteria avoid is no jump to speak of
 *   (a wavy passage through critical depth, which the near-critical check already reports): no jump finding;
 * - it forms in the first reach below the start of the supercritical flow whose slope is not steep at that flow
 *   (the foot of the chute): an information finding says where, its type and the head it dissipates;
 * - swept further down, or out past the outlet, or never formed although a reach could have held it: a warning,
 *   since the turbulence then lands where nothing was designed for it;
 * - standing on a lining whose permissible velocity or shear the entering flow exceeds: a warning. The entering
 *   velocity and the shear gamma y Sf under the entering flow (Sf from Manning's equation, as for non-uniform
 *   flow) are compared with the lining's limits; a lining that states neither is not checked, and the finding
 *   says so.
 */
import { UNIT_WEIGHT_OF_WATER_NM3, type SectionGeometry } from '../hydraulics/index.js';
import type { ComputedFlowProfile, PlacedJump } from './channel-profiles.js';
import { FINDING_CODES, FINDING_MESSAGES, type JumpWords, type MessageFormatter } from './finding-messages.js';
import type { Finding, Severity, SourceLocation } from './model.js';

/** What the jump findings need to know of one analysed reach. */
export interface ReachForFindings {
  readonly name: string;
  readonly sectionName: string;
  readonly section: SectionGeometry;
  readonly sectionLocation: SourceLocation;
  readonly manningN: number;
  readonly liningName: string;
  readonly liningLocation: SourceLocation;
  readonly maxVelocityMps: number | null;
  readonly maxShearPa: number | null;
}

/** A finding before the analysis attaches the reach, the flow and the discharge to it. */
export interface FindingDraft {
  readonly code: string;
  readonly severity: Severity;
  readonly message: string;
  readonly data: Record<string, number | string>;
  readonly related: Finding['related'];
  /** Where the finding points when not at the reach's name (e.g. the outlet). */
  readonly location?: SourceLocation;
}

/** The drafts of one channel and flow, by reach index (the channel's analysed reaches). */
export function profileFindingDrafts(
  reaches: readonly ReachForFindings[],
  profile: ComputedFlowProfile,
  formatter: MessageFormatter,
  outletLocation: SourceLocation | null,
): Map<number, FindingDraft[]> {
  const drafts = new Map<number, FindingDraft[]>();
  const add = (reachIndex: number, draft: FindingDraft): void => {
    const list = drafts.get(reachIndex) ?? [];
    list.push(draft);
    drafts.set(reachIndex, list);
  };
  const flow = profile.model.flow;
  const lastIndex = reaches.length - 1;
  const failure = profile.failure;
  if (failure !== null && failure.kind === 'reported') {
    const reachIndex = failure.reachIndex ?? lastIndex;
    const reach = reaches[reachIndex];
    if (failure.reason === 'conduit-surcharged' && reach !== undefined) {
      add(reachIndex, {
        code: FINDING_CODES.conduitSurcharged,
        severity: 'warning',
        message: FINDING_MESSAGES.conduitSurcharged(formatter, { flow, section: reach.sectionName, reach: reach.name, stationM: failure.stationM ?? 0 }),
        data: { station_m: failure.stationM ?? 0 },
        related: [{ message: `Section '${reach.sectionName}'`, location: reach.sectionLocation }],
      });
    } else if (reachIndex >= 0) {
      const noDatum = failure.reason === 'no-elevation-datum';
      add(reachIndex, {
        code: FINDING_CODES.profileNotComputed,
        severity: 'warning',
        message: FINDING_MESSAGES.profileNotComputed(formatter, { flow, detail: noDatum ? FINDING_MESSAGES.noElevationDatum : failure.message }),
        data: { reason: failure.reason },
        related: [],
        ...(noDatum && outletLocation !== null ? { location: outletLocation } : {}),
      });
    }
  }

  for (const jump of profile.jumps) {
    const reachIndex = jump.result.placement === 'beyond-outlet' ? lastIndex : jump.reachIndex;
    const reach = reaches[jump.reachIndex];
    if (reach === undefined) continue;
    // Entering within the near-critical band, the "jump" is a wavy passage through critical depth: the
    // near-critical check speaks for it, not a jump finding.
    if (jump.result.jumpType === 'not-a-jump' || jump.result.nearCritical) continue;
    const words = jumpWords(flow, jump, Math.abs(jump.result.station_m - (profile.reachProfiles[jump.reachIndex]?.startStation_m ?? Number.NaN)) <= 1e-6);
    const data = jumpData(jump);
    if (jump.result.placement === 'beyond-outlet') {
      add(reachIndex, {
        code: FINDING_CODES.hydraulicJumpSweptOut,
        severity: 'warning',
        message: FINDING_MESSAGES.hydraulicJumpSweptOutOfChannel(formatter, {
          flow,
          origin: jump.result.supercriticalFrom,
          exitDepthM: jump.result.upstreamDepth_m,
          froude: jump.result.upstreamFroudeNumber,
          velocityMps: jump.result.upstreamVelocity_mps,
          sequentDepthM: jump.result.downstreamDepth_m,
        }),
        data,
        related: outletLocation === null ? [] : [{ message: 'Outlet condition', location: outletLocation }],
      });
      continue;
    }
    // The linings under the jump: its own reach, and at a junction at the end of that reach the one below as well.
    const underIndices = [jump.reachIndex];
    const atReachEnd = jump.result.placement === 'at-junction' && Math.abs(jump.result.station_m - endStationOf(profile, jump.reachIndex)) <= 1e-6;
    if (atReachEnd && jump.reachIndex + 1 < reaches.length) underIndices.push(jump.reachIndex + 1);
    const unchecked = underIndices.map((index) => reaches[index]).filter((under): under is ReachForFindings => under !== undefined && under.maxVelocityMps === null && under.maxShearPa === null);
    const liningRemark = FINDING_MESSAGES.jumpLiningNotChecked({ linings: [...new Set(unchecked.map((under) => under.liningName))] });
    const liningRelated = { message: `Lining '${reach.liningName}'`, location: reach.liningLocation };
    if (jump.result.sweptOut && jump.holdingReachIndex !== undefined) {
      add(reachIndex, {
        code: FINDING_CODES.hydraulicJumpSweptOut,
        severity: 'warning',
        message: FINDING_MESSAGES.hydraulicJumpSweptDown(formatter, { ...words, origin: jump.result.supercriticalFrom, holding: reaches[jump.holdingReachIndex]?.name ?? '', liningRemark }),
        data,
        related: [liningRelated],
      });
    } else {
      add(reachIndex, { code: FINDING_CODES.hydraulicJump, severity: 'information', message: FINDING_MESSAGES.hydraulicJump(formatter, { ...words, liningRemark }), data, related: [liningRelated] });
    }
    // The entering flow against each lining under the jump (section and roughness of the reach it enters from).
    const velocityMps = jump.result.upstreamVelocity_mps;
    const shearPa = enteringShearPa(reach.section, reach.manningN, jump.result.upstreamDepth_m, velocityMps);
    for (const index of underIndices) {
      const under = reaches[index];
      if (under === undefined) continue;
      const velocityExceeded = under.maxVelocityMps !== null && velocityMps > under.maxVelocityMps;
      const shearExceeded = under.maxShearPa !== null && shearPa > under.maxShearPa;
      if (!velocityExceeded && !shearExceeded) continue;
      add(index, {
        code: FINDING_CODES.hydraulicJumpLiningExceeded,
        severity: 'warning',
        message: FINDING_MESSAGES.hydraulicJumpLiningExceeded(formatter, {
          flow,
          lining: under.liningName,
          reach: reach.name,
          stationM: jump.result.station_m,
          velocityMps,
          permissibleMps: under.maxVelocityMps,
          shearPa,
          permissiblePa: under.maxShearPa,
        }),
        data: {
          ...data,
          enteringVelocity_mps: velocityMps,
          enteringShear_Pa: shearPa,
          ...(under.maxVelocityMps === null ? {} : { permissible_mps: under.maxVelocityMps }),
          ...(under.maxShearPa === null ? {} : { permissible_Pa: under.maxShearPa }),
        },
        related: [{ message: `Lining '${under.liningName}'`, location: under.liningLocation }],
      });
    }
  }

  const exit = profile.sweptOutExit;
  if (exit !== null && lastIndex >= 0) {
    add(lastIndex, {
      code: FINDING_CODES.hydraulicJumpSweptOut,
      severity: 'warning',
      message: FINDING_MESSAGES.hydraulicJumpNotFormed(formatter, {
        flow,
        origin: reaches[exit.originReachIndex]?.name ?? '',
        holding: reaches[exit.holdingReachIndex]?.name ?? '',
        exitDepthM: exit.depthM,
        froude: exit.froudeNumber,
        velocityMps: exit.velocityMps,
      }),
      data: { station_m: exit.stationM, exitDepth_m: exit.depthM, exitFroudeNumber: exit.froudeNumber, exitVelocity_mps: exit.velocityMps, placement: 'no-jump' },
      related: outletLocation === null ? [] : [{ message: 'Outlet condition', location: outletLocation }],
    });
  }
  return drafts;
}

/**
 * Shear on the bed under the flow entering a jump, Pa: gamma y Sf with Sf = (n V / R^(2/3))^2 from Manning's
 * equation (SI), the friction slope of the actual flow rather than the bed slope, as for non-uniform flow
 * (FHWA HEC-15 3rd ed. 2005, Eq. 3.1 with Sf for S: common practice).
 */
export function enteringShearPa(section: SectionGeometry, manningN: number, depthM: number, velocityMps: number): number {
  const areaM2 = section.areaM2(depthM);
  const perimeterM = section.wettedPerimeterM(depthM);
  if (!(areaM2 > 0 && perimeterM > 0)) return 0;
  const frictionSlope = ((manningN * velocityMps) / (areaM2 / perimeterM) ** (2 / 3)) ** 2;
  return UNIT_WEIGHT_OF_WATER_NM3 * depthM * frictionSlope;
}

function jumpWords(flow: string, jump: PlacedJump, atReachHead: boolean): JumpWords {
  const result = jump.result;
  return {
    atReachHead,
    flow,
    reach: result.reach,
    stationM: result.station_m,
    placement: result.placement,
    upstreamDepthM: result.upstreamDepth_m,
    downstreamDepthM: result.downstreamDepth_m,
    froude: result.upstreamFroudeNumber,
    jumpType: result.jumpType,
    energyLossM: result.energyLoss_m,
  };
}

function jumpData(jump: PlacedJump): Record<string, number | string> {
  const result = jump.result;
  return {
    station_m: result.station_m,
    upstreamDepth_m: result.upstreamDepth_m,
    downstreamDepth_m: result.downstreamDepth_m,
    upstreamFroudeNumber: result.upstreamFroudeNumber,
    energyLoss_m: result.energyLoss_m,
    jumpType: result.jumpType,
    placement: result.placement,
  };
}

function endStationOf(profile: ComputedFlowProfile, reachIndex: number): number {
  return profile.reachProfiles[reachIndex]?.endStation_m ?? Number.NaN;
}
