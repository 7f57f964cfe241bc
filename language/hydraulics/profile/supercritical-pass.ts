/**
 * The supercritical pass: from upstream controls downstream, and where the supercritical profile meets the
 * subcritical one, the hydraulic jump. Supercritical flow starts at the inlet (a given supercritical depth, or
 * critical depth where the subcritical pass found no subcritical depth at the entrance), at the top of any reach
 * where the subcritical pass found none (a break from mild to steep slope), and below a junction where the
 * subcritical pass put critical depth (the brink of a drop).
 *
 * At every computed station the specific force M = Q^2/(gA) + A ybar of the supercritical depth is compared with
 * that of the subcritical depth there. While the supercritical flow carries more, it pushes the jump further
 * downstream; the jump stands where the two are equal (Chow 1959, Ch. 15), found by refining the station between
 * the last two stations with standard steps from both profiles.
 */
import { froudeNumber } from '../critical-flow.js';
import { firstTraceStationAtOrBelow, subcriticalDepthAt, type ResolvedReach, type SubcriticalTrace } from './channel-model.js';
import { fixed } from './controls.js';
import { classifyJump, describeJumpType, solveSequentDepth } from './hydraulic-jump.js';
import { solveJunctionReusing } from './junction.js';
import { JUMP_LOCATION_TOLERANCE_M } from './profile-defaults.js';
import type { HydraulicJump, JumpPlacement, ProfileFailureReason, ProfileNote } from './profile-types.js';
import { reachSpecificEnergyM, reachSpecificForceM3 } from './reach-flow.js';
import { solveBracketedRoot } from './scalar-solvers.js';
import { marchInputs, type ProfileReuse } from './reach-reuse.js';
import { marchAlongReach, solveStandardStep, type StepBudget } from './standard-step.js';

/** The supercritical profile within one reach: from the reach's upstream end to where it ends. */
export interface SupercriticalPiece {
  /** Stations from 0, ascending, m from the reach's upstream end. */
  readonly stationsM: number[];
  readonly depthsM: number[];
  /** True when the flow entered supercritical across the junction from the reach above (energy balanced there). */
  readonly enteredAcrossJunction: boolean;
  /** After the piece's last station the subcritical trace takes over from this station (a jump, or critical depth); undefined if the piece reaches the end. */
  readonly resumeSubcriticalAfterM: number | undefined;
  /** The subcritical depth just after a jump at the piece's end, m. */
  readonly jumpDownstreamDepthM: number | undefined;
}

export type SupercriticalPassResult =
  | {
      readonly converged: true;
      /** pieces[i]: the supercritical part of reach i, if any. */
      readonly pieces: readonly (SupercriticalPiece | undefined)[];
      readonly jumps: readonly HydraulicJump[];
      readonly notes: readonly ProfileNote[];
    }
  | { readonly converged: false; readonly reason: ProfileFailureReason; readonly message: string; readonly reachIndex: number; readonly stationM: number };

export interface SupercriticalPassInput {
  readonly reaches: readonly ResolvedReach[];
  readonly traces: readonly SubcriticalTrace[];
  readonly inletDepthM: number | undefined;
  /** Depth beyond the outlet that supercritical flow leaving the channel meets, m; undefined for a free fall. */
  readonly tailwaterDepthM: number | undefined;
  readonly lossCoefficient: number;
  readonly budget: StepBudget;
  /** Marches remembered from earlier profiles (reach-reuse.ts). */
  readonly reuse?: ProfileReuse | undefined;
}

interface ActiveFlow {
  /** Supercritical depth at the downstream end of the reach just finished, m. */
  readonly depthM: number;
  /** Reach where this supercritical flow began. */
  readonly fromReachIndex: number;
  /** Began at a critical-depth control at the end of the reach just finished (not carried through it). */
  readonly beganAtControl: boolean;
}

export function runSupercriticalPass(input: SupercriticalPassInput): SupercriticalPassResult {
  const { reaches, traces, lossCoefficient, budget } = input;
  const pieces: (SupercriticalPiece | undefined)[] = new Array<SupercriticalPiece | undefined>(reaches.length).fill(undefined);
  const jumps: HydraulicJump[] = [];
  const notes: ProfileNote[] = [];
  let active: ActiveFlow | undefined;

  for (let index = 0; index < reaches.length; index++) {
    const reach = reaches[index] as ResolvedReach;
    const trace = traces[index] as SubcriticalTrace;
    const flow = reach.flow;
    const subcriticalForceAt = (localStationM: number): number => subcriticalSpecificForceM3(reach, trace, localStationM);
    let start: { depthM: number; fromReachIndex: number; acrossJunction: boolean } | undefined;

    if (index === 0 && input.inletDepthM !== undefined) {
      const inletDepthM = input.inletDepthM;
      if (reachSpecificForceM3(flow, inletDepthM) >= subcriticalForceAt(0)) {
        start = { depthM: inletDepthM, fromReachIndex: 0, acrossJunction: false };
      } else {
        // No jump record: the given inflow cannot exist as given (a gate, say, would be submerged).
        const downstreamDepthM = subcriticalDepthAt(reach, trace, 0);
        notes.push({
          code: 'inlet-drowned',
          message: `The water downstream (depth ${fixed(downstreamDepthM)} m at the inlet) carries more specific force than the given supercritical inflow (${fixed(inletDepthM)} m): the inflow is drowned at the entrance and the given inlet depth does not hold; the profile follows the downstream control.`,
          reachIndex: 0,
          stationM: reach.startStationM,
        });
      }
    } else if (active !== undefined) {
      const above = reaches[index - 1] as ResolvedReach;
      const aboveTrace = traces[index - 1] as SubcriticalTrace;
      const crossing = solveJunctionReusing(
        input.reuse,
        { flow: above.flow, invertElevationM: above.downstreamInvertElevationM },
        active.depthM,
        { flow, invertElevationM: reach.upstreamInvertElevationM },
        'supercritical',
        lossCoefficient,
      );
      if (crossing.kind === 'balanced' && reachSpecificForceM3(flow, crossing.depthM) >= subcriticalForceAt(0)) {
        start = { depthM: crossing.depthM, fromReachIndex: active.fromReachIndex, acrossJunction: true };
      } else if (crossing.kind === 'balanced' && active.beganAtControl) {
        // Below the brink of a drop the water downstream drowns the falling jet: the jump stands at the foot.
        const downstreamDepthM = subcriticalDepthAt(reach, trace, 0);
        // The head lost from the brink to the water below, drop included.
        const brinkHeadM = above.downstreamInvertElevationM + reachSpecificEnergyM(above.flow, active.depthM);
        const belowHeadM = reach.upstreamInvertElevationM + reachSpecificEnergyM(flow, downstreamDepthM);
        const jump = makeJump(reach, 'at-junction', 0, crossing.depthM, downstreamDepthM, index, brinkHeadM - belowHeadM);
        jumps.push(jump);
        notes.push({
          code: 'jump-at-junction',
          message: `The water below the junction of "${above.input.name}" and "${reach.input.name}" drowns the flow falling over the brink: a jump stands at the foot of the junction (station ${jump.stationM.toFixed(2)} m).`,
          reachIndex: index,
          stationM: jump.stationM,
        });
      } else if (crossing.kind === 'balanced' || (crossing.kind === 'no-depth-on-branch' && !active.beganAtControl)) {
        // The jump stands at the downstream end of the reach above: the water below drowns the supercritical flow
        // at the junction, or the junction (a rise of the bed, a narrowing) is more than it can pass.
        const forced = crossing.kind === 'no-depth-on-branch';
        const downstreamDepthM = subcriticalDepthAt(above, aboveTrace, above.lengthM);
        const previous = pieces[index - 1];
        const jump = makeJump(above, 'at-junction', above.lengthM, active.depthM, downstreamDepthM, active.fromReachIndex);
        jumps.push(jump);
        if (previous !== undefined) {
          pieces[index - 1] = { ...previous, resumeSubcriticalAfterM: above.lengthM, jumpDownstreamDepthM: downstreamDepthM };
        }
        notes.push({
          code: 'jump-at-junction',
          message: forced
            ? `Supercritical flow cannot pass the junction of "${above.input.name}" and "${reach.input.name}" on its own energy (a rise of the bed or a narrowing): a jump is forced there (station ${jump.stationM.toFixed(2)} m). The flow there is rapidly varied: check it with a local model.`
            : `The water below the junction of "${above.input.name}" and "${reach.input.name}" drowns the supercritical flow: the jump stands at the junction (station ${jump.stationM.toFixed(2)} m).`,
          reachIndex: above.index,
          stationM: jump.stationM,
        });
      } else if (crossing.kind === 'above-crown' || crossing.kind === 'did-not-converge') {
        return failure('did-not-converge', `The supercritical energy balance at the junction at station ${reach.startStationM.toFixed(2)} m did not converge.`, reach, 0);
      }
      active = undefined;
    }
    // Where the subcritical profile reached critical depth going upstream, supercritical flow starts at the top of
    // the reach; above a surcharged conduit only a steep reach is known to start so (its flow is supercritical
    // unless backed up, which the subcritical pass could not follow).
    const startsAtCritical =
      trace.noSubcriticalDepthReason === 'reaches-critical' || (trace.noSubcriticalDepthReason === 'surcharged' && flow.slopeClass === 'steep' && (trace.noSubcriticalDepthAboveM ?? 0) > 0);
    if (start === undefined && startsAtCritical) {
      start = { depthM: flow.criticalDepthM, fromReachIndex: index, acrossJunction: false };
    }

    if (start !== undefined) {
      const { depthM, fromReachIndex, acrossJunction } = start;
      const march = (): MarchOutcome => marchSupercritical(reach, trace, depthM, fromReachIndex, acrossJunction, budget);
      const reuse = input.reuse;
      // Keyed by the subcritical march it is compared with (the same array object when that march was taken over).
      const outcome =
        reuse === undefined
          ? march()
          : reuse.march(
              flow,
              depthM,
              [
                ...marchInputs('supercritical', reach.lengthM, reach.march),
                trace.stationsM,
                trace.noSubcriticalDepthAboveM,
                trace.noSubcriticalDepthReason,
                fromReachIndex,
                acrossJunction,
                reach.index,
                reach.startStationM,
                reach.input.name,
              ],
              budget,
              march,
              (result) => result.converged,
            );
      if (!outcome.converged) return outcome.failure;
      pieces[index] = outcome.piece;
      if (outcome.jump !== undefined) {
        jumps.push(outcome.jump);
        if (outcome.jump.sweptOutOfReach) {
          const from = reaches[outcome.jump.supercriticalFromReachIndex] as ResolvedReach;
          notes.push({
            code: 'jump-swept-out-of-reach',
            message: `The jump is swept out of reach "${from.input.name}", where the supercritical flow begins, into reach "${reach.input.name}" (station ${outcome.jump.stationM.toFixed(2)} m).`,
            reachIndex: index,
            stationM: outcome.jump.stationM,
          });
        }
      }
      if (outcome.piece.resumeSubcriticalAfterM === undefined) {
        active = { depthM: outcome.piece.depthsM[outcome.piece.depthsM.length - 1] ?? flow.criticalDepthM, fromReachIndex: start.fromReachIndex, beganAtControl: false };
      }
    }
    // A critical-depth control at this reach's downstream end (the brink of a drop) starts supercritical flow below it.
    if (active === undefined && index < reaches.length - 1 && trace.endIsCriticalControl) {
      active = { depthM: flow.criticalDepthM, fromReachIndex: index + 1, beganAtControl: true };
    }
  }

  if (active !== undefined) {
    const last = reaches[reaches.length - 1] as ResolvedReach;
    const exitDepthM = active.depthM;
    const outletStationM = last.startStationM + last.lengthM;
    const exitFroude = froudeNumber(last.flow.section, exitDepthM, last.flow.dischargeM3s);
    const tailwaterDepthM = input.tailwaterDepthM;
    const sequent = solveSequentDepth(last.flow.section, exitDepthM, last.flow.dischargeM3s);
    // Only subcritical water beyond the outlet can hold a jump; shallower water lets the flow run on (or fall) freely.
    if (tailwaterDepthM !== undefined && sequent.converged && tailwaterDepthM > last.flow.criticalDepthM) {
      const jump = makeJump(last, 'beyond-outlet', last.lengthM, exitDepthM, sequent.sequentDepthM, active.fromReachIndex);
      jumps.push(jump);
      notes.push({
        code: 'jump-swept-out-of-channel',
        message: `The depth beyond the outlet (${fixed(tailwaterDepthM)} m) is below the sequent depth (${fixed(sequent.sequentDepthM)} m) of the supercritical outflow (${fixed(exitDepthM)} m, Froude number ${exitFroude.toFixed(2)}): the jump is swept out of the channel.`,
        reachIndex: last.index,
        stationM: outletStationM,
      });
    } else {
      notes.push({
        code: 'supercritical-at-outlet',
        message: `The flow leaves the channel supercritical (depth ${fixed(exitDepthM)} m, Froude number ${exitFroude.toFixed(2)}).`,
        reachIndex: last.index,
        stationM: outletStationM,
      });
    }
  }
  return { converged: true, pieces, jumps, notes };
}

/** False upstream of the station where the subcritical pass reached critical depth: no subcritical flow exists there. */
function hasSubcriticalDepth(trace: SubcriticalTrace, localStationM: number): boolean {
  return trace.noSubcriticalDepthAboveM === undefined || localStationM >= trace.noSubcriticalDepthAboveM;
}

/**
 * Specific force of the subcritical profile at a station, m3; minus infinity where there is no subcritical flow,
 * so that supercritical flow always carries on there. (With alpha > 1 critical depth for energy lies above the
 * depth of least specific force, so a supercritical depth just below it can carry less specific force than
 * critical depth does: comparing with critical depth there would put a jump where no subcritical flow exists.)
 */
function subcriticalSpecificForceM3(reach: ResolvedReach, trace: SubcriticalTrace, localStationM: number): number {
  if (!hasSubcriticalDepth(trace, localStationM)) return Number.NEGATIVE_INFINITY;
  return reachSpecificForceM3(reach.flow, subcriticalDepthAt(reach, trace, localStationM));
}

type MarchOutcome =
  | { readonly converged: true; readonly piece: SupercriticalPiece; readonly jump: HydraulicJump | undefined }
  | { readonly converged: false; readonly failure: SupercriticalPassResult & { converged: false } };

function marchSupercritical(
  reach: ResolvedReach,
  trace: SubcriticalTrace,
  startDepthM: number,
  fromReachIndex: number,
  enteredAcrossJunction: boolean,
  budget: StepBudget,
): MarchOutcome {
  const flow = reach.flow;
  const visit = (stationM: number, depthM: number): boolean => reachSpecificForceM3(flow, depthM) >= subcriticalSpecificForceM3(reach, trace, stationM);
  let march = marchAlongReach(flow, 0, startDepthM, reach.lengthM, 'supercritical', reach.march, budget, visit);
  const stationsM = march.stationsM;
  const depthsM = march.depthsM;
  // Reaching critical depth where no subcritical flow exists leaves nothing to hand over to: the flow is critical
  // there and carries on supercritical from it (a safeguard; on a steep reach the march does not reach yc).
  for (let restart = 0; restart < 100 && march.end === 'reached-critical'; restart++) {
    const lastStationM = stationsM[stationsM.length - 1] ?? 0;
    if (hasSubcriticalDepth(trace, lastStationM) || lastStationM >= reach.lengthM) break;
    const more = marchAlongReach(flow, lastStationM, flow.criticalDepthM, reach.lengthM, 'supercritical', reach.march, budget, visit);
    if (more.stationsM.length <= 1) break;
    stationsM.push(...more.stationsM.slice(1));
    depthsM.push(...more.depthsM.slice(1));
    march = more;
  }
  switch (march.end) {
    case 'reached-end':
      return { converged: true, piece: { stationsM, depthsM, enteredAcrossJunction, resumeSubcriticalAfterM: undefined, jumpDownstreamDepthM: undefined }, jump: undefined };
    case 'reached-critical':
      // The supercritical profile ends at critical depth without a jump: the subcritical depth there is critical too.
      return {
        converged: true,
        piece: { stationsM, depthsM, enteredAcrossJunction, resumeSubcriticalAfterM: stationsM[stationsM.length - 1] ?? 0, jumpDownstreamDepthM: undefined },
        jump: undefined,
      };
    case 'stopped': {
      // The march stopped at the first station where the subcritical depth, interpolated in the trace, carries more
      // specific force; the refinement compares with depths stepped from the trace. Near critical depth the two
      // can differ enough (a tenth of a millimetre on a curved M2 profile) that the forces already fail to balance
      // at the station above: the bracket then moves up a station at a time until its upper end is one by the
      // refinement's own depths, so the jump stands where they balance and loses head (found by the energy-balance
      // property: a jump at Froude number 1.02 placed at the upper end gained 3 micrometres).
      let count = stationsM.length;
      let located = locateJump(reach, trace, stationsM[count - 2] ?? 0, depthsM[count - 2] ?? startDepthM, stationsM[count - 1] ?? 0);
      while (count > 2 && located.stationM <= (stationsM[count - 2] ?? 0) && reachSpecificForceM3(flow, located.supercriticalDepthM) < reachSpecificForceM3(flow, located.subcriticalDepthM)) {
        count--;
        located = locateJump(reach, trace, stationsM[count - 2] ?? 0, depthsM[count - 2] ?? startDepthM, stationsM[count - 1] ?? 0);
      }
      const upstreamStationM = stationsM[count - 2] ?? 0;
      // Where the backwater fills a conduit, the refinement can only end at the end of the full stretch (the
      // specific force below jumps there); if the water there still carries more specific force than the
      // supercritical flow, the flow cannot hold it back: the jump is driven up into the full conduit, which then
      // flows under pressure. No jump stands on the free surface (placing one there would report a jump that gains
      // energy).
      const subcriticalForceM3 = reachSpecificForceM3(flow, located.subcriticalDepthM);
      const supercriticalForceM3 = reachSpecificForceM3(flow, located.supercriticalDepthM);
      // The water below pushes harder than the supercritical flow can: the jump belongs further upstream.
      const overpowered = subcriticalForceM3 - supercriticalForceM3 > SPECIFIC_FORCE_MATCH_RATIO * subcriticalForceM3;
      if (overpowered && trace.noSubcriticalDepthReason === 'surcharged') {
        const crownM = flow.section.fullDepthM ?? 0;
        return {
          converged: false,
          failure: failure(
            'conduit-surcharged',
            `The backwater fills the conduit of reach "${reach.input.name}" up to station ${(reach.startStationM + located.stationM).toFixed(2)} m, and the supercritical flow from upstream (${fixed(located.supercriticalDepthM)} m deep) carries less specific force than the water there (${fixed(located.subcriticalDepthM)} m deep, crown at ${fixed(crownM)} m): no jump can hold it back, so the conduit flows under pressure and the free-surface profile cannot be continued upstream.`,
            reach,
            located.stationM,
          ),
        };
      }
      stationsM.length = count - 1;
      depthsM.length = count - 1;
      if (located.stationM > upstreamStationM) {
        stationsM.push(located.stationM);
        depthsM.push(located.supercriticalDepthM);
      }
      const jump = makeJump(reach, 'within-reach', located.stationM, located.supercriticalDepthM, located.subcriticalDepthM, fromReachIndex);
      return {
        converged: true,
        piece: { stationsM, depthsM, enteredAcrossJunction, resumeSubcriticalAfterM: located.stationM, jumpDownstreamDepthM: located.subcriticalDepthM },
        jump,
      };
    }
    case 'above-crown':
    case 'did-not-converge':
    case 'step-limit': {
      const stationM = stationsM[stationsM.length - 1] ?? 0;
      const message =
        march.end === 'step-limit' ? 'The profile needed more steps than allowed.' : `A supercritical standard step did not converge near station ${(reach.startStationM + stationM).toFixed(2)} m.`;
      return { converged: false, failure: failure('did-not-converge', message, reach, stationM) };
    }
  }
}

interface LocatedJump {
  readonly stationM: number;
  readonly supercriticalDepthM: number;
  readonly subcriticalDepthM: number;
}

/**
 * Refines the jump's station between two stations of the supercritical march (m from the reach's upstream end):
 * at the upper one the supercritical specific force is at least the subcritical one, at the lower one it is less.
 * Both depths at a trial station come from standard steps (supercritical from the upper station, subcritical from
 * the nearest subcritical station below it), so the jump sits on the two computed profiles exactly.
 */
function locateJump(reach: ResolvedReach, trace: SubcriticalTrace, upperStationM: number, upperDepthM: number, lowerStationM: number): LocatedJump {
  const flow = reach.flow;
  const supercriticalDepthAt = (stationM: number): number => {
    const step = solveStandardStep(flow, upperDepthM, stationM - upperStationM, 'supercritical');
    return step.kind === 'solved' ? step.depthM : flow.criticalDepthM;
  };
  const subcriticalDepthByStepAt = (stationM: number): number => {
    if (trace.noSubcriticalDepthAboveM !== undefined && stationM < trace.noSubcriticalDepthAboveM) return flow.criticalDepthM;
    const belowIndex = firstTraceStationAtOrBelow(trace, stationM);
    if (belowIndex < 0) return subcriticalDepthAt(reach, trace, stationM);
    const belowStationM = trace.stationsM[belowIndex] ?? stationM;
    const belowDepthM = trace.depthsM[belowIndex] ?? flow.criticalDepthM;
    if (belowStationM <= stationM) return belowDepthM;
    const step = solveStandardStep(flow, belowDepthM, belowStationM - stationM, 'subcritical');
    return step.kind === 'solved' ? step.depthM : flow.criticalDepthM;
  };
  const forceExcess = (stationM: number): number =>
    hasSubcriticalDepth(trace, stationM) ? reachSpecificForceM3(flow, supercriticalDepthAt(stationM)) - reachSpecificForceM3(flow, subcriticalDepthByStepAt(stationM)) : 1;
  const stationTolerance = Math.max(JUMP_LOCATION_TOLERANCE_M, 1e-9 * reach.lengthM);
  const root = solveBracketedRoot(forceExcess, upperStationM, lowerStationM, 0, stationTolerance);
  // The bracket's ends are the fallback should the refinement stop early; either way the jump lies between them.
  // Nor can it stand where no subcritical flow exists: at the latest it stands where the S1 curve begins.
  const firstSubcriticalM = trace.noSubcriticalDepthAboveM ?? Number.NEGATIVE_INFINITY;
  const stationM = Math.min(Math.max(root.x, upperStationM, firstSubcriticalM), lowerStationM);
  return { stationM, supercriticalDepthM: supercriticalDepthAt(stationM), subcriticalDepthM: subcriticalDepthByStepAt(stationM) };
}

function makeJump(
  reach: ResolvedReach,
  placement: JumpPlacement,
  localStationM: number,
  upstreamDepthM: number,
  downstreamDepthM: number,
  fromReachIndex: number,
  headLossM?: number,
): HydraulicJump {
  const flow = reach.flow;
  const upstreamFroudeNumber = froudeNumber(flow.section, upstreamDepthM, flow.dischargeM3s);
  const jumpType = classifyJump(upstreamFroudeNumber);
  const energyLossM = headLossM ?? reachSpecificEnergyM(flow, upstreamDepthM) - reachSpecificEnergyM(flow, downstreamDepthM);
  const stationM = reach.startStationM + localStationM;
  const where =
    placement === 'within-reach'
      ? `in reach "${reach.input.name}" at station ${stationM.toFixed(2)} m`
      : placement === 'at-junction'
        ? `at the downstream end of reach "${reach.input.name}" (station ${stationM.toFixed(2)} m)`
        : `beyond the outlet (station ${stationM.toFixed(2)} m): the tailwater cannot hold it in the channel`;
  return {
    placement,
    stationM,
    reachIndex: reach.index,
    reachName: reach.input.name,
    upstreamDepthM,
    downstreamDepthM,
    upstreamFroudeNumber,
    energyLossM,
    jumpType,
    supercriticalFromReachIndex: fromReachIndex,
    sweptOutOfReach: reach.index > fromReachIndex || placement === 'beyond-outlet',
    description: `Hydraulic jump ${where}: ${describeJumpType(jumpType)}, from ${fixed(upstreamDepthM)} m to ${fixed(downstreamDepthM)} m, energy loss ${fixed(energyLossM)} m.`,
  };
}

/**
 * Specific forces closer than this fraction are a match: the jump's refinement solves the match to a station
 * tolerance, which leaves differences of this order (a mismatch of a conduit held full is of order one).
 */
const SPECIFIC_FORCE_MATCH_RATIO = 1e-6;

function failure(reason: ProfileFailureReason, message: string, reach: ResolvedReach, localStationM: number): SupercriticalPassResult & { converged: false } {
  return { converged: false, reason, message, reachIndex: reach.index, stationM: reach.startStationM + localStationM };
}
