/**
 * The water-surface profile of a channel for one steady discharge: what the user sees as the computed water
 * surface along the channel, with its profile classes, jumps, deepest points and freeboard per reach.
 *
 * Method (the classic treatment of mixed-regime profiles, Chow 1959, Ch. 9, 10 and 15):
 * 1. a subcritical pass from the outlet control upstream by the standard step method, taking critical depth
 *    wherever no subcritical depth exists (so a break from mild to steep slope, or the brink of a drop, controls
 *    the reach above it);
 * 2. a supercritical pass from the upstream controls downstream, comparing specific forces with the subcritical
 *    profile at every station and placing a hydraulic jump where they match;
 * 3. the two joined into one profile, each step's energy residual recomputed from the result.
 */
import type { ResolvedReach } from './channel-model.js';
import { resolveInletStart, resolveOutletStart } from './controls.js';
import { assembleProfile } from './profile-assembly.js';
import {
  DEFAULT_JUNCTION_LOSS_COEFFICIENT,
  DEFAULT_KINETIC_ENERGY_COEFFICIENT,
  DEFAULT_MAXIMUM_DEPTH_CHANGE_RATIO,
  DEFAULT_MAXIMUM_STEP_LENGTH_M,
  DEFAULT_MINIMUM_STEPS_PER_REACH,
  MAXIMUM_PROFILE_STEPS,
  STEP_ENERGY_TOLERANCE_M,
} from './profile-defaults.js';
import type { ChannelProfileFailure, ChannelProfileInput, ChannelProfileResult, ProfilePoint, ProfileProvenance, ProfileReachInput, ProfileStep, StepControl } from './profile-types.js';
import { describeReachFlow, type ReachFlowResult } from './reach-flow.js';
import { runSubcriticalPass, surchargeFailure } from './subcritical-pass.js';
import { runSupercriticalPass } from './supercritical-pass.js';

/**
 * Computes the steady gradually-varied-flow profile of a channel. Never throws for physical no-solution cases or
 * bad numbers: the result says `converged: false` with a reason, a message and where.
 */
export function computeChannelProfile(input: ChannelProfileInput): ChannelProfileResult {
  const invalid = validateInput(input);
  if (invalid !== undefined) return invalid;
  const alpha = input.kineticEnergyCoefficient ?? DEFAULT_KINETIC_ENERGY_COEFFICIENT;
  const lossCoefficient = input.junctionLossCoefficient ?? DEFAULT_JUNCTION_LOSS_COEFFICIENT;
  const resolved = resolveReaches(input, alpha);
  if ('converged' in resolved) return resolved;
  const reaches = resolved.reaches;
  const first = reaches[0] as ResolvedReach;
  const last = reaches[reaches.length - 1] as ResolvedReach;
  const outletStationM = last.startStationM + last.lengthM;
  const budget = { remaining: input.stepControl?.maximumSteps ?? MAXIMUM_PROFILE_STEPS };

  const outlet = resolveOutletStart(input.outlet, last.flow, last.downstreamInvertElevationM, last.index, outletStationM);
  if (!outlet.converged) return { converged: false, reason: 'no-outlet-depth', message: outlet.message, reachIndex: last.index, stationM: outletStationM };
  const inlet = resolveInletStart(input.inlet ?? { kind: 'critical-depth' }, first.flow);

  const subcritical = runSubcriticalPass(reaches, outlet.depthM, outlet.isCriticalControl, lossCoefficient, budget, input.reuse);
  if (!subcritical.converged) return subcritical;
  const supercritical = runSupercriticalPass({
    reaches,
    traces: subcritical.traces,
    inletDepthM: inlet.depthM,
    tailwaterDepthM: outlet.tailwaterDepthM,
    lossCoefficient,
    budget,
    reuse: input.reuse,
  });
  if (!supercritical.converged) return supercritical;

  const assembled = assembleProfile(reaches, subcritical.traces, subcritical.junctions, supercritical.pieces, supercritical.jumps, lossCoefficient, input.reuse);
  if (!assembled.converged) {
    const reachIndex = assembled.surchargedReachIndex;
    return surchargeFailure(reaches, subcritical.surcharge ?? { reachIndex, stationM: (reaches[reachIndex] as ResolvedReach).startStationM });
  }
  const notes = [...(outlet.note ? [outlet.note] : []), ...(inlet.note ? [inlet.note] : []), ...subcritical.notes, ...supercritical.notes];
  const table = assembled.table;
  // Points and steps are built when first read (profile-assembly.ts says why), then kept.
  let points: readonly ProfilePoint[] | undefined;
  let steps: readonly ProfileStep[] | undefined;
  return {
    converged: true,
    dischargeM3s: input.dischargeM3s,
    kineticEnergyCoefficient: alpha,
    get points() {
      return (points ??= table.points());
    },
    get steps() {
      return (steps ??= table.steps());
    },
    pointTable: table,
    segments: assembled.segments,
    jumps: supercritical.jumps,
    reaches: assembled.reaches,
    notes,
    maximumEnergyResidualM: assembled.maximumEnergyResidualM,
    energyToleranceM: STEP_ENERGY_TOLERANCE_M,
    provenance: profileProvenance(alpha, lossCoefficient, resolved.stepSettings),
  };
}

/** The step control in force, with every default filled in. */
export interface ResolvedStepControl {
  readonly maximumStepLengthM: number;
  readonly minimumStepsPerReach: number;
  readonly maximumDepthChangeRatio: number;
}

/** How every profile is computed; the same text for hover, report and CLI. */
export function profileProvenance(alpha: number, lossCoefficient: number, steps: ResolvedStepControl = resolveStepControl(undefined)): ProfileProvenance {
  return {
    method:
      "Standard step method on the energy equation, friction slope from Manning's equation (SI, k = 1) averaged as the arithmetic mean of the friction slopes at the two ends of each step; subcritical flow computed upstream from downstream controls, supercritical flow downstream from upstream controls; hydraulic jumps where the specific forces of the two profiles are equal.",
    assumptions: [
      'steady flow, one discharge through every reach (no inflow along the channel)',
      'prismatic reaches: one section, roughness and bed slope each; small bed slopes (depth measured vertically, pressure hydrostatic)',
      `kinetic-energy coefficient alpha = ${alpha}; momentum coefficient beta = 1 in the jump`,
      `step length chosen so that the depth changes by at most ${steps.maximumDepthChangeRatio * 100} % of the depth per step and no step crosses normal depth; steps at most ${steps.maximumStepLengthM} m long and at most 1/${steps.minimumStepsPerReach} of a reach`,
      `each step's energy equation solved to within ${STEP_ENERGY_TOLERANCE_M} m`,
      `junctions: energy continuity with a loss of ${lossCoefficient} times the change of velocity head; where no subcritical depth exists above a junction, critical depth there`,
      'free-fall outlet: critical depth at the brink (the true brink depth is lower and critical depth stands a short distance upstream: common practice)',
      "a jump's length is not modelled: it is placed at one station",
    ],
    references: [
      'Chow (1959) Open-Channel Hydraulics, Ch. 9 (profile classes, Table 9-1), Ch. 10 (step methods), Ch. 15 (hydraulic jump, location and types)',
      'USBR Engineering Monograph 25 (Peterka): jump types by Froude number',
    ],
  };
}

function resolveStepControl(stepControl: StepControl | undefined): ResolvedStepControl {
  return {
    maximumStepLengthM: stepControl?.maximumStepLengthM ?? DEFAULT_MAXIMUM_STEP_LENGTH_M,
    minimumStepsPerReach: stepControl?.minimumStepsPerReach ?? DEFAULT_MINIMUM_STEPS_PER_REACH,
    maximumDepthChangeRatio: stepControl?.maximumDepthChangeRatio ?? DEFAULT_MAXIMUM_DEPTH_CHANGE_RATIO,
  };
}

interface ResolvedChannel {
  readonly reaches: readonly ResolvedReach[];
  readonly stepSettings: ResolvedStepControl;
}

function resolveReaches(input: ChannelProfileInput, alpha: number): ResolvedChannel | ChannelProfileFailure {
  const count = input.reaches.length;
  const stepSettings = resolveStepControl(input.stepControl);
  const { maximumStepLengthM, minimumStepsPerReach, maximumDepthChangeRatio } = stepSettings;
  // Inverts from the outlet upstream: a reach without its own downstream invert continues the bed of the next.
  const downstreamInvertsM = new Array<number>(count);
  let nextUpstreamInvertM = 0;
  for (let index = count - 1; index >= 0; index--) {
    const reach = input.reaches[index] as ProfileReachInput;
    const downstreamInvertM = reach.downstreamInvertElevationM ?? nextUpstreamInvertM;
    downstreamInvertsM[index] = downstreamInvertM;
    nextUpstreamInvertM = downstreamInvertM + reach.bedSlope * reach.lengthM;
  }
  const reaches: ResolvedReach[] = [];
  let stationM = 0;
  for (let index = 0; index < count; index++) {
    const reach = input.reaches[index] as ProfileReachInput;
    const describe = (): ReachFlowResult => describeReachFlow(reach.section, reach.manningN, reach.bedSlope, input.dischargeM3s, alpha);
    const described = input.reuse === undefined ? describe() : input.reuse.reachFlow(reach.section, reach.manningN, reach.bedSlope, input.dischargeM3s, alpha, describe);
    if (!described.converged) {
      return { converged: false, reason: 'invalid-input', message: `Reach "${reach.name}": ${described.message}`, reachIndex: index, stationM };
    }
    const downstreamInvertElevationM = downstreamInvertsM[index] ?? 0;
    reaches.push({
      index,
      input: reach,
      flow: described.flow,
      startStationM: stationM,
      lengthM: reach.lengthM,
      upstreamInvertElevationM: downstreamInvertElevationM + reach.bedSlope * reach.lengthM,
      downstreamInvertElevationM,
      march: { maximumStepLengthM: Math.min(maximumStepLengthM, reach.lengthM / minimumStepsPerReach), maximumDepthChangeRatio },
    });
    stationM += reach.lengthM;
  }
  return { reaches, stepSettings };
}

function validateInput(input: ChannelProfileInput): ChannelProfileFailure | undefined {
  const fail = (message: string, reachIndex: number | null = null): ChannelProfileFailure => ({ converged: false, reason: 'invalid-input', message, reachIndex, stationM: null });
  const positive = (value: number | undefined): boolean => value !== undefined && value > 0 && Number.isFinite(value);
  if (input.reaches.length === 0) return fail('A channel needs at least one reach.');
  if (!positive(input.dischargeM3s)) return fail('The discharge must be a positive finite number of m3/s.');
  const alpha = input.kineticEnergyCoefficient;
  if (alpha !== undefined && !(alpha >= 1 && Number.isFinite(alpha))) return fail('The kinetic-energy coefficient alpha must be a finite number of at least 1.');
  const loss = input.junctionLossCoefficient;
  if (loss !== undefined && !(loss >= 0 && loss < 1)) return fail('The junction loss coefficient must be at least 0 and less than 1.');
  const control = input.stepControl;
  if (control !== undefined) {
    if (control.maximumStepLengthM !== undefined && !positive(control.maximumStepLengthM)) return fail('The longest step must be a positive length.');
    if (control.minimumStepsPerReach !== undefined && !(Number.isInteger(control.minimumStepsPerReach) && control.minimumStepsPerReach >= 1)) {
      return fail('The fewest steps per reach must be a whole number of at least 1.');
    }
    const ratio = control.maximumDepthChangeRatio;
    if (ratio !== undefined && !(positive(ratio) && ratio <= 0.5)) return fail('The largest depth change per step must be a fraction above 0 and at most 0.5.');
  }
  if (input.outlet.kind === 'water-level' && !Number.isFinite(input.outlet.elevationM)) return fail('The outlet water level must be a finite elevation.');
  if (input.inlet?.kind === 'depth' && !positive(input.inlet.depthM)) return fail('The inlet depth must be a positive length.', 0);
  for (let index = 0; index < input.reaches.length; index++) {
    const reach = input.reaches[index] as ProfileReachInput;
    const name = `Reach "${reach.name}"`;
    if (!positive(reach.lengthM)) return fail(`${name}: the length must be a positive number of metres.`, index);
    if (!positive(reach.manningN)) return fail(`${name}: Manning's n must be a positive number.`, index);
    if (!Number.isFinite(reach.bedSlope)) return fail(`${name}: the bed slope must be a finite number.`, index);
    if (reach.downstreamInvertElevationM !== undefined && !Number.isFinite(reach.downstreamInvertElevationM)) return fail(`${name}: the invert elevation must be finite.`, index);
    if (reach.bankHeightM !== undefined && !positive(reach.bankHeightM)) return fail(`${name}: the bank height must be a positive length.`, index);
    const section = reach.section;
    const probeM = section.fullDepthM ?? 1;
    if (!positive(section.areaM2(probeM)) || !positive(section.wettedPerimeterM(probeM))) return fail(`${name}: the section has no flow area.`, index);
  }
  return undefined;
}
