/**
 * The standard step method (Chow 1959, Ch. 10): from a section of known depth, choose a distance and solve the
 * energy equation for the depth at the next section,
 *
 *     z2 + E2 = z1 + E1 + Sf_mean * dx      (stepping upstream, subcritical flow)
 *     z1 + E1 = z2 + E2 + Sf_mean * dx      (stepping downstream, supercritical flow)
 *
 * with E = y + alpha V^2 / 2g, z the invert (z rises by S0 dx upstream) and Sf_mean the arithmetic mean of the
 * Manning friction slopes at the two ends of the step, as in Chow's step methods. Both become
 *
 *     g(y) = E(y) - E1 + s (S0 - (Sf1 + Sf(y)) / 2) dx = 0,   s = +1 upstream, -1 downstream.
 *
 * On its own branch of the specific-energy curve (y > yc for subcritical, y < yc for supercritical) g is monotone
 * in y, so the step has one solution or none. There is none exactly when the profile would pass critical depth
 * within the step; since g(yc) is linear in dx, the distance at which the profile reaches critical depth then
 * follows in closed form (the direct step to yc), and the march ends there at critical depth.
 *
 * The march bounds the depth change of each step (a fraction of the local depth) by shortening the step, keeps
 * steps from carrying the profile across normal depth, and lengthens steps again up to a maximum where the depth
 * hardly changes.
 */
import type { FlowBranch } from './flow-branch.js';
import { NORMAL_DEPTH_CROSSING_BAND_RATIO, STEP_ENERGY_TOLERANCE_M, STEP_SOLVE_MAX_ITERATIONS } from './profile-defaults.js';
import { evaluateEnergyFriction, newEnergyFrictionState, type EnergyFrictionState, type ReachFlow } from './reach-flow.js';

export type StandardStepOutcome =
  | {
      readonly kind: 'solved';
      /** Depth at the new section, m. */
      readonly depthM: number;
      /** g(depth): energy-equation residual, m (|residual| <= STEP_ENERGY_TOLERANCE_M unless the bracket closed first). */
      readonly residualM: number;
      readonly specificEnergyM: number;
      /** dE/dy at the new depth. */
      readonly specificEnergySlope: number;
      readonly frictionSlope: number;
      readonly iterations: number;
    }
  /** No depth on the branch: the profile reaches critical depth after distanceToCriticalM (<= the step asked for). */
  | { readonly kind: 'passes-critical'; readonly distanceToCriticalM: number }
  /** Subcritical flow in a closed conduit would need a depth above the crown: the conduit would flow full. */
  | { readonly kind: 'above-crown' }
  | { readonly kind: 'did-not-converge'; readonly lastDepthM: number };

/**
 * One standard step of length distanceM (m, >= 0) from a section of depth knownDepthM (m) on the given branch:
 * subcritical steps go upstream, supercritical steps downstream. Tolerance: |g(y)| <= STEP_ENERGY_TOLERANCE_M.
 */
export function solveStandardStep(flow: ReachFlow, knownDepthM: number, distanceM: number, branch: FlowBranch): StandardStepOutcome {
  const known = newEnergyFrictionState();
  evaluateEnergyFriction(flow, knownDepthM, known);
  const record = newStepRecord();
  solveStepInto(flow, knownDepthM, known, distanceM, branch, newEnergyFrictionState(), record);
  switch (record.kind) {
    case 'solved':
      return {
        kind: 'solved',
        depthM: record.depthM,
        residualM: record.residualM,
        specificEnergyM: record.specificEnergyM,
        specificEnergySlope: record.specificEnergySlope,
        frictionSlope: record.frictionSlope,
        iterations: record.iterations,
      };
    case 'passes-critical':
      return { kind: 'passes-critical', distanceToCriticalM: record.distanceToCriticalM };
    case 'above-crown':
      return { kind: 'above-crown' };
    case 'did-not-converge':
      return { kind: 'did-not-converge', lastDepthM: record.depthM };
  }
}

/** The outcome of one step as a reusable record (the march solves thousands of steps without allocating). */
interface StepRecord {
  kind: StandardStepOutcome['kind'];
  depthM: number;
  residualM: number;
  specificEnergyM: number;
  specificEnergySlope: number;
  frictionSlope: number;
  iterations: number;
  distanceToCriticalM: number;
}

function newStepRecord(): StepRecord {
  return { kind: 'did-not-converge', depthM: 0, residualM: 0, specificEnergyM: 0, specificEnergySlope: 0, frictionSlope: 0, iterations: 0, distanceToCriticalM: 0 };
}

/**
 * The step when E, dE/dy and Sf at the known section are already at hand, written into `out`.
 *
 * Newton's method starts from an Euler predictor and usually closes in one or two iterations; the end of the
 * branch (critical depth, or a conduit's crown) is only evaluated when an iterate leaves the branch, which is also
 * when a step may have no solution. Every iterate keeps a bracket, and bisection replaces a step that leaves it.
 */
function solveStepInto(
  flow: ReachFlow,
  knownDepthM: number,
  known: Readonly<EnergyFrictionState>,
  distanceM: number,
  branch: FlowBranch,
  scratch: EnergyFrictionState,
  out: StepRecord,
): void {
  const subcritical = branch === 'subcritical';
  const sign = subcritical ? 1 : -1;
  const bedSlope = flow.bedSlope;
  const criticalDepthM = flow.criticalDepthM;
  const knownEnergyM = known.specificEnergyM;
  const knownFrictionSlope = known.frictionSlope;
  // g(y) of the module comment is stepResidualM(scratch, ...); module-level helpers rather than closures keep the
  // hot loop free of per-step allocation.

  // The bracket's ends: the branch's ends until evaluated (critical depth; zero or the highest free-surface depth).
  let lowerM = subcritical ? criticalDepthM : 0;
  let upperM = subcritical ? flow.highestFreeSurfaceDepthM : criticalDepthM;
  let branchEndChecked = false;

  // Predictor: one Euler step of dy/dx = (S0 - Sf) / (dE/dy) from the known section, kept on the branch.
  let depthM = knownDepthM - sign * ((bedSlope - knownFrictionSlope) / known.specificEnergySlope) * distanceM;
  if (!(depthM > lowerM && depthM < upperM)) {
    depthM = knownDepthM > lowerM && knownDepthM < upperM ? knownDepthM : subcritical ? Math.min(criticalDepthM * (1 + 1e-6), upperM) : criticalDepthM * (1 - 1e-6);
  }

  for (let iteration = 1; iteration <= STEP_SOLVE_MAX_ITERATIONS; iteration++) {
    evaluateEnergyFriction(flow, depthM, scratch);
    const residualM = stepResidualM(scratch, knownEnergyM, knownFrictionSlope, sign, bedSlope, distanceM);
    if (Math.abs(residualM) <= STEP_ENERGY_TOLERANCE_M) return writeSolved(out, scratch, depthM, residualM, iteration);
    // On the subcritical branch g increases with y, on the supercritical branch it decreases.
    if (residualM < 0 === subcritical) lowerM = depthM;
    else upperM = depthM;
    const slope = scratch.specificEnergySlope - sign * 0.5 * scratch.frictionSlopeDerivative * distanceM;
    let nextM = depthM - residualM / slope;
    if (!(nextM > lowerM && nextM < upperM)) {
      if (!branchEndChecked) {
        // The iterate heads off the branch: is there a root on it at all?
        branchEndChecked = true;
        evaluateEnergyFriction(flow, criticalDepthM, scratch);
        const criticalResidualM = stepResidualM(scratch, knownEnergyM, knownFrictionSlope, sign, bedSlope, distanceM);
        if (Math.abs(criticalResidualM) <= STEP_ENERGY_TOLERANCE_M) return writeSolved(out, scratch, criticalDepthM, criticalResidualM, iteration);
        if (criticalResidualM > 0) {
          // g(yc) is linear in the step length: the profile reaches yc after the direct step to it.
          const rate = sign * (bedSlope - 0.5 * (knownFrictionSlope + scratch.frictionSlope));
          out.kind = 'passes-critical';
          out.distanceToCriticalM = rate > 0 ? Math.min(distanceM, Math.max(0, (knownEnergyM - scratch.specificEnergyM) / rate)) : 0;
          return;
        }
        if (subcritical && Number.isFinite(flow.highestFreeSurfaceDepthM) && upperM === flow.highestFreeSurfaceDepthM) {
          evaluateEnergyFriction(flow, upperM, scratch);
          if (stepResidualM(scratch, knownEnergyM, knownFrictionSlope, sign, bedSlope, distanceM) < 0) {
            out.kind = 'above-crown';
            return;
          }
        }
      }
      nextM = midpoint(lowerM, upperM);
    }
    if (Number.isFinite(upperM) && upperM - lowerM <= 4 * Number.EPSILON * upperM) {
      // The bracket cannot shrink further in double precision: the root is here to machine accuracy.
      evaluateEnergyFriction(flow, nextM, scratch);
      return writeSolved(out, scratch, nextM, stepResidualM(scratch, knownEnergyM, knownFrictionSlope, sign, bedSlope, distanceM), iteration);
    }
    depthM = nextM;
  }
  out.kind = 'did-not-converge';
  out.depthM = depthM;
}

/** g(y) of the module comment for the depth whose values are in `state`, m. */
function stepResidualM(
  state: Readonly<EnergyFrictionState>,
  knownEnergyM: number,
  knownFrictionSlope: number,
  sign: number,
  bedSlope: number,
  distanceM: number,
): number {
  return state.specificEnergyM - knownEnergyM + sign * (bedSlope - 0.5 * (knownFrictionSlope + state.frictionSlope)) * distanceM;
}

/** Records a solved step whose new-section values are in `state`. */
function writeSolved(out: StepRecord, state: Readonly<EnergyFrictionState>, depthM: number, residualM: number, iterations: number): void {
  out.kind = 'solved';
  out.depthM = depthM;
  out.residualM = residualM;
  out.specificEnergyM = state.specificEnergyM;
  out.specificEnergySlope = state.specificEnergySlope;
  out.frictionSlope = state.frictionSlope;
  out.iterations = iterations;
}

/** Bisection point of a bracket; an open bracket (upper infinite) is grown instead. */
function midpoint(lowerM: number, upperM: number): number {
  if (!Number.isFinite(upperM)) return Math.max(2 * lowerM, 1e-3);
  return 0.5 * (lowerM + upperM);
}

// -----------------------------------------------------------------------------------------------------------------
// March along a reach

export interface MarchSettings {
  /** Longest step, m. */
  readonly maximumStepLengthM: number;
  /** Largest depth change per step as a fraction of the depth at its start. */
  readonly maximumDepthChangeRatio: number;
}

/** Shared count of steps left for the whole profile (a guard against degenerate input). */
export interface StepBudget {
  remaining: number;
}

export type MarchEnd =
  | 'reached-end'
  /** The profile reached critical depth at the last station; beyond it there is no depth on this branch. */
  | 'reached-critical'
  /** The visitor asked to stop at the last station. */
  | 'stopped'
  | 'above-crown'
  | 'did-not-converge'
  | 'step-limit';

export interface ReachMarch {
  /** Stations (m, along the reach from its upstream end) in march order, starting with the start station. */
  readonly stationsM: number[];
  readonly depthsM: number[];
  readonly end: MarchEnd;
}

/**
 * A direct step (Chow 1959, Ch. 10): the step ends at `depthM` (critical or normal depth, whose energy and friction
 * slope are in `target`) after `distanceM`, with the residual of the energy equation over that distance.
 */
function landOn(flow: ReachFlow, depthM: number, distanceM: number, sign: number, known: Readonly<EnergyFrictionState>, target: Readonly<EnergyFrictionState>, out: StepRecord): void {
  out.kind = 'solved';
  out.depthM = depthM;
  out.residualM = target.specificEnergyM - known.specificEnergyM + sign * (flow.bedSlope - 0.5 * (known.frictionSlope + target.frictionSlope)) * distanceM;
  out.specificEnergyM = target.specificEnergyM;
  out.specificEnergySlope = target.specificEnergySlope;
  out.frictionSlope = target.frictionSlope;
}

/**
 * Marches a profile from (startStationM, startDepthM) towards endStationM within one reach (stations in m from the
 * reach's upstream end): subcritical profiles upstream (endStationM < startStationM), supercritical downstream.
 * `visit` sees each new station; returning false stops the march there.
 */
export function marchAlongReach(
  flow: ReachFlow,
  startStationM: number,
  startDepthM: number,
  endStationM: number,
  branch: FlowBranch,
  settings: MarchSettings,
  budget: StepBudget,
  visit?: (stationM: number, depthM: number) => boolean,
): ReachMarch {
  // Stations decrease when marching upstream; `sign` is the s of the module comment.
  const direction = branch === 'subcritical' ? -1 : 1;
  const sign = -direction;
  const stationsM = [startStationM];
  const depthsM = [startDepthM];
  const scratch = newEnergyFrictionState();
  const known = newEnergyFrictionState();
  evaluateEnergyFriction(flow, startDepthM, known);
  let stationM = startStationM;
  let depthM = startDepthM;
  const totalDistanceM = Math.abs(endStationM - startStationM);
  const negligibleDistanceM = 1e-12 * Math.max(totalDistanceM, 1);
  let stepLengthM = settings.maximumStepLengthM;
  // Whether the gradually-varied-flow equation can carry this branch to critical depth in the march direction:
  // subcritical flow going upstream only where the bed is steeper than the friction slope at yc (an S1 curve),
  // supercritical flow going downstream only where it is flatter (M3, H3, A3). Elsewhere a step reported as
  // passing critical depth is the trapezoidal rule overshooting over too long a step (near a normal depth close
  // to critical depth), and the step is shortened instead.
  evaluateEnergyFriction(flow, flow.criticalDepthM, scratch);
  const criticalReachable = branch === 'subcritical' ? scratch.frictionSlope < flow.bedSlope : scratch.frictionSlope > flow.bedSlope;
  // A gradually varied profile never crosses normal depth (Chow 1959, Ch. 9), but the trapezoidal rule does when a
  // step is long against the distance over which the profile closes on it (it then oscillates about yn while
  // converging): such a step is shortened. Crossings within a hair of yn are rounding and are let through.
  const normalDepthM = flow.slopeClass === 'mild' || flow.slopeClass === 'steep' ? flow.normalDepthM : undefined;
  const normalDepthBandM = NORMAL_DEPTH_CROSSING_BAND_RATIO * (normalDepthM ?? 0);
  const finish = (end: MarchEnd): ReachMarch => ({ stationsM, depthsM, end });

  const step = newStepRecord();
  for (;;) {
    const remainingM = Math.abs(endStationM - stationM);
    if (remainingM <= negligibleDistanceM) return finish('reached-end');
    if (budget.remaining <= 0) return finish('step-limit');
    budget.remaining--;
    // Avoid a sliver of a last step: split the last stretch evenly when it is a little longer than one step.
    let trialM = remainingM <= stepLengthM ? remainingM : remainingM < 1.25 * stepLengthM ? remainingM / 2 : stepLengthM;
    const depthChangeBoundM = settings.maximumDepthChangeRatio * depthM;
    let shortened = false;
    let accepted = false;
    let reachedCritical = false;
    for (let attempt = 0; attempt < STEP_SOLVE_MAX_ITERATIONS && !accepted; attempt++) {
      solveStepInto(flow, depthM, known, trialM, branch, scratch, step);
      if (step.kind === 'solved') {
        const changeM = Math.abs(step.depthM - depthM);
        if (changeM > depthChangeBoundM && trialM > negligibleDistanceM) {
          trialM *= Math.max(0.1, (0.8 * depthChangeBoundM) / changeM);
          shortened = true;
          continue;
        }
        if (
          normalDepthM !== undefined &&
          (depthM - normalDepthM) * (step.depthM - normalDepthM) < 0 &&
          Math.abs(step.depthM - normalDepthM) > normalDepthBandM &&
          trialM > negligibleDistanceM
        ) {
          // The profile reaches normal depth within the step: land on it by the direct step (the distance at which
          // the energy equation puts yn, within the step), as for critical depth. Where the reach's normal depth
          // lies a hair above or below critical depth, the profile closes on yn within micrometres, far shorter
          // than any step, and halving the step until it no longer crossed would crawl for millions of steps.
          evaluateEnergyFriction(flow, normalDepthM, scratch);
          const toNormalM = -(scratch.specificEnergyM - known.specificEnergyM) / (sign * (flow.bedSlope - 0.5 * (known.frictionSlope + scratch.frictionSlope)));
          if (toNormalM > negligibleDistanceM && toNormalM < trialM) {
            landOn(flow, normalDepthM, toNormalM, sign, known, scratch, step);
            trialM = toNormalM;
            accepted = true;
            continue;
          }
          trialM *= 0.5;
          shortened = true;
          continue;
        }
        accepted = true;
      } else if (step.kind === 'passes-critical') {
        const toCriticalM = step.distanceToCriticalM;
        const landsOnCritical = criticalReachable && Math.abs(flow.criticalDepthM - depthM) <= depthChangeBoundM;
        if (landsOnCritical || toCriticalM <= negligibleDistanceM) {
          // The last step lands on critical depth: the direct step to yc, which closes the energy equation exactly.
          evaluateEnergyFriction(flow, flow.criticalDepthM, scratch);
          landOn(flow, flow.criticalDepthM, toCriticalM, sign, known, scratch, step);
          trialM = toCriticalM;
          accepted = true;
          reachedCritical = true;
        } else {
          trialM = 0.5 * toCriticalM;
          shortened = true;
        }
      } else if (step.kind === 'above-crown') {
        return finish('above-crown');
      } else {
        return finish('did-not-converge');
      }
    }
    if (!accepted) return finish('did-not-converge');
    if (reachedCritical && trialM <= negligibleDistanceM) return finish('reached-critical');
    const changeM = Math.abs(step.depthM - depthM);
    stationM = trialM >= remainingM - negligibleDistanceM ? endStationM : stationM + direction * trialM;
    depthM = step.depthM;
    known.specificEnergyM = step.specificEnergyM;
    known.specificEnergySlope = step.specificEnergySlope;
    known.frictionSlope = step.frictionSlope;
    stationsM.push(stationM);
    depthsM.push(depthM);
    if (visit !== undefined && !visit(stationM, depthM)) return finish('stopped');
    if (reachedCritical) return finish('reached-critical');
    if (shortened) stepLengthM = trialM;
    if (changeM < 0.5 * depthChangeBoundM) stepLengthM = Math.min(settings.maximumStepLengthM, 2 * stepLengthM);
  }
}
