/**
 * The subcritical pass: from the outlet control upstream through every reach and junction. Where no subcritical
 * depth exists (the profile would pass critical depth, as an S1 curve does going upstream, or a junction's
 * downstream head is too low for subcritical flow above it) the pass takes critical depth, which is the control
 * for the reaches above (the brink of a drop, a break from mild to steep slope).
 */
import { invertElevationAt, type ResolvedReach, type SubcriticalTrace } from './channel-model.js';
import { fixed } from './controls.js';
import { solveJunctionReusing } from './junction.js';
import type { ProfileNote, ProfileFailureReason } from './profile-types.js';
import { marchInputs, type ProfileReuse } from './reach-reuse.js';
import { marchAlongReach, type MarchEnd, type StepBudget } from './standard-step.js';

export interface JunctionRecord {
  /** 'balanced': energy continuity holds; 'critical-control': the flow passes critical depth at the junction. */
  readonly kind: 'balanced' | 'critical-control';
}

/** Where a backwater profile first reached a conduit's crown. */
export interface SurchargeOrigin {
  readonly reachIndex: number;
  /** m from the channel's upstream end. */
  readonly stationM: number;
}

export type SubcriticalPassResult =
  | {
      readonly converged: true;
      readonly traces: readonly SubcriticalTrace[];
      /** Set when the subcritical profile reached a conduit's crown: it was not continued above that point. */
      readonly surcharge: SurchargeOrigin | undefined;
      /** junctions[i] joins reach i to reach i + 1. */
      readonly junctions: readonly JunctionRecord[];
      readonly notes: readonly ProfileNote[];
    }
  | { readonly converged: false; readonly reason: ProfileFailureReason; readonly message: string; readonly reachIndex: number; readonly stationM: number };

export function runSubcriticalPass(
  reaches: readonly ResolvedReach[],
  outletDepthM: number,
  outletIsCriticalControl: boolean,
  lossCoefficient: number,
  budget: StepBudget,
  reuse?: ProfileReuse,
): SubcriticalPassResult {
  const traces: SubcriticalTrace[] = new Array<SubcriticalTrace>(reaches.length);
  const junctions: JunctionRecord[] = new Array<JunctionRecord>(Math.max(reaches.length - 1, 0));
  const notes: ProfileNote[] = [];
  let surcharge: SurchargeOrigin | undefined;
  for (let index = reaches.length - 1; index >= 0; index--) {
    const reach = reaches[index] as ResolvedReach;
    if (surcharge !== undefined) {
      // Above a surcharged conduit the subcritical profile is not known (pressure flow is not modelled).
      traces[index] = surchargedTrace();
      junctions[index] = { kind: 'balanced' };
      continue;
    }
    let startDepthM = outletDepthM;
    let endIsCriticalControl = outletIsCriticalControl;
    const below = reaches[index + 1];
    const belowTrace = traces[index + 1];
    if (below !== undefined && belowTrace !== undefined) {
      const belowDepthM = belowTrace.noSubcriticalDepthAboveM !== undefined ? below.flow.criticalDepthM : (belowTrace.depthsM[0] ?? below.flow.criticalDepthM);
      const outcome = solveJunctionReusing(
        reuse,
        { flow: below.flow, invertElevationM: below.upstreamInvertElevationM },
        belowDepthM,
        { flow: reach.flow, invertElevationM: reach.downstreamInvertElevationM },
        'subcritical',
        lossCoefficient,
      );
      const junctionStationM = below.startStationM;
      if (outcome.kind === 'balanced') {
        startDepthM = outcome.depthM;
        endIsCriticalControl = false;
        junctions[index] = { kind: 'balanced' };
      } else if (outcome.kind === 'no-depth-on-branch') {
        startDepthM = reach.flow.criticalDepthM;
        endIsCriticalControl = true;
        junctions[index] = { kind: 'critical-control' };
        notes.push({
          code: 'critical-depth-at-junction',
          message: `The flow passes through critical depth (${fixed(startDepthM)} m) at the junction of reaches "${reach.input.name}" and "${below.input.name}" (station ${junctionStationM.toFixed(2)} m): it controls the profile upstream.`,
          reachIndex: index,
          stationM: junctionStationM,
        });
      } else if (outcome.kind === 'above-crown') {
        surcharge = { reachIndex: index, stationM: junctionStationM };
        traces[index] = surchargedTrace();
        junctions[index] = { kind: 'balanced' };
        continue;
      } else {
        return { converged: false, reason: 'did-not-converge', message: `The energy balance at the junction above station ${junctionStationM.toFixed(2)} m did not converge.`, reachIndex: index, stationM: junctionStationM };
      }
    }
    if (below === undefined && startDepthM >= reach.flow.highestFreeSurfaceDepthM) {
      // Water at the outlet at or above the conduit's crown submerges it: the flow there is under pressure, which a
      // free-surface profile does not model, whatever the flow does upstream (a jump would fill the conduit).
      const crownM = reach.flow.section.fullDepthM ?? 0;
      return {
        converged: false,
        reason: 'conduit-surcharged',
        message: `The water at the outlet (${fixed(startDepthM)} m deep) stands at or above the crown of the conduit of reach "${reach.input.name}" (elevation ${(reach.downstreamInvertElevationM + crownM).toFixed(3)} m): the outlet is submerged and the conduit flows under pressure there, which the free-surface profile does not model.`,
        reachIndex: index,
        stationM: reach.startStationM + reach.lengthM,
      };
    }
    const march = subcriticalMarch(reach, startDepthM, budget, reuse);
    if (march.end === 'above-crown') {
      const stationsM = march.stationsM;
      const crownReachedAtM = stationsM[0] ?? reach.lengthM;
      surcharge = { reachIndex: index, stationM: reach.startStationM + crownReachedAtM };
      traces[index] = {
        stationsM,
        depthsM: march.depthsM,
        noSubcriticalDepthAboveM: crownReachedAtM,
        noSubcriticalDepthReason: 'surcharged',
        endIsCriticalControl,
      };
      continue;
    }
    if (march.end === 'did-not-converge' || march.end === 'step-limit' || march.end === 'stopped') {
      const stationM = reach.startStationM + (march.stationsM[0] ?? reach.lengthM);
      return {
        converged: false,
        reason: 'did-not-converge',
        message: march.end === 'step-limit' ? 'The profile needed more steps than allowed.' : `A standard step did not converge near station ${stationM.toFixed(2)} m.`,
        reachIndex: index,
        stationM,
      };
    }
    const { stationsM, depthsM } = march;
    traces[index] = {
      stationsM,
      depthsM,
      noSubcriticalDepthAboveM: march.end === 'reached-critical' ? stationsM[0] : undefined,
      noSubcriticalDepthReason: march.end === 'reached-critical' ? 'reaches-critical' : undefined,
      endIsCriticalControl,
    };
  }
  return { converged: true, traces, surcharge, junctions, notes };
}

/** A subcritical march up a whole reach, its stations ascending (from the reach's upstream end, m). */
interface SubcriticalMarch {
  readonly end: MarchEnd;
  readonly stationsM: readonly number[];
  readonly depthsM: readonly number[];
}

/** The march from the reach's downstream end upstream, taken over from `reuse` when it has the same inputs. */
function subcriticalMarch(reach: ResolvedReach, startDepthM: number, budget: StepBudget, reuse: ProfileReuse | undefined): SubcriticalMarch {
  const compute = (): SubcriticalMarch => {
    const march = marchAlongReach(reach.flow, reach.lengthM, startDepthM, 0, 'subcritical', reach.march, budget);
    // The march ran upstream: reverse its arrays in place to ascending stations.
    return { end: march.end, stationsM: march.stationsM.reverse(), depthsM: march.depthsM.reverse() };
  };
  if (reuse === undefined) return compute();
  return reuse.march(reach.flow, startDepthM, marchInputs('subcritical', reach.lengthM, reach.march), budget, compute, (march) => march.end !== 'step-limit');
}

/** A reach with no known free-surface subcritical depth anywhere (above a surcharged conduit). */
function surchargedTrace(): SubcriticalTrace {
  return { stationsM: [], depthsM: [], noSubcriticalDepthAboveM: Number.POSITIVE_INFINITY, noSubcriticalDepthReason: 'surcharged', endIsCriticalControl: false };
}

/** The failure reported when the finished profile needs a subcritical depth where the conduit would flow full. */
export function surchargeFailure(reaches: readonly ResolvedReach[], origin: SurchargeOrigin): SubcriticalPassResult & { converged: false } {
  const reach = reaches[origin.reachIndex] as ResolvedReach;
  const localStationM = origin.stationM - reach.startStationM;
  const crownM = reach.flow.section.fullDepthM ?? 0;
  return {
    converged: false,
    reason: 'conduit-surcharged',
    message: `The backwater profile in the conduit of reach "${reach.input.name}" reaches the crown (elevation ${(invertElevationAt(reach, localStationM) + crownM).toFixed(3)} m) near station ${origin.stationM.toFixed(2)} m: the conduit is surcharged there and the free-surface profile cannot be continued upstream.`,
    reachIndex: origin.reachIndex,
    stationM: origin.stationM,
  };
}

