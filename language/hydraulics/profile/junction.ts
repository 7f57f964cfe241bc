/**
 * Energy continuity across the junction of two reaches (a change of section, of roughness or slope, or a step in
 * the bed), over zero length:
 *
 *     z_up + y_up + hv_up = z_down + y_down + hv_down + k |hv_up - hv_down|,   hv = alpha V^2 / 2g,
 *
 * k the transition loss coefficient on the change of velocity head (common practice for gradual transitions).
 * A subcritical pass knows the downstream side and solves for the upstream depth on its subcritical branch; a
 * supercritical pass knows the upstream side and solves for the downstream depth on the supercritical branch:
 *
 *     subcritical:    f(y) = z_up + y + hv(y) - k |hv(y) - hv_down| - H_down = 0,   y >= yc
 *     supercritical:  f(y) = z_down + y + hv(y) + k |hv(y) - hv_up| - H_up = 0,     y <= yc
 *
 * With df/dy = 1 - alpha (1 +/- k) Fr^2 on either side of the velocity-head match, the shape of f is known:
 * - supercritical branch: f falls from +infinity to one minimum, which lies between the critical depths for
 *   alpha (1 - k) and alpha; the root taken is the one on the falling part;
 * - subcritical branch: f rises without bound above the critical depth for alpha (1 + k), and below it may rise,
 *   fall and rise again; the deepest root is taken (the one above that critical depth when f is not positive
 *   there), which is the subcritical state continuous with deep, slow flow.
 * When f has no root on the branch the unknown side cannot stay on it: subcritical flow then passes through
 * critical depth at the junction (the brink of a drop, a choke), and supercritical flow cannot pass the junction.
 */
import type { FlowBranch } from './flow-branch.js';
import type { ProfileReuse } from './reach-reuse.js';
import { STEP_ENERGY_TOLERANCE_M } from './profile-defaults.js';
import { criticalDepthWithAlphaM, reachSpecificEnergyM, velocityHeadM, type ReachFlow } from './reach-flow.js';
import { minimiseUnimodal, solveBracketedRoot } from './scalar-solvers.js';

export interface JunctionSide {
  readonly flow: ReachFlow;
  /** Invert elevation at the junction on this side, m. */
  readonly invertElevationM: number;
}

export type JunctionOutcome =
  | {
      readonly kind: 'balanced';
      readonly depthM: number;
      /** k |hv_up - hv_down|, m. */
      readonly headLossM: number;
      /** Upstream head - downstream head - head loss, m. */
      readonly residualM: number;
    }
  /** No depth on the branch: the known head is too low for the unknown side to stay on it. */
  | { readonly kind: 'no-depth-on-branch' }
  | { readonly kind: 'above-crown' }
  | { readonly kind: 'did-not-converge' };

/** solveJunction, taken over from `reuse` (reach-reuse.ts) when the same junction was balanced before. */
export function solveJunctionReusing(
  reuse: ProfileReuse | undefined,
  known: JunctionSide,
  knownDepthM: number,
  unknown: JunctionSide,
  branch: FlowBranch,
  lossCoefficient: number,
): JunctionOutcome {
  const solve = (): JunctionOutcome => solveJunction(known, knownDepthM, unknown, branch, lossCoefficient);
  if (reuse === undefined) return solve();
  return reuse.junction(known.flow, knownDepthM, unknown.flow, unknownAboveKnownM(known, unknown), branch, lossCoefficient, solve);
}

/** The unknown side's invert above the known side's, m: the only elevation the balance uses. */
function unknownAboveKnownM(known: JunctionSide, unknown: JunctionSide): number {
  return unknown.invertElevationM - known.invertElevationM;
}

/**
 * Solves the junction for the unknown side's depth on `branch` (m). `known` is the downstream side for a
 * subcritical pass and the upstream side for a supercritical one; knownDepthM is its depth, m.
 */
export function solveJunction(
  known: JunctionSide,
  knownDepthM: number,
  unknown: JunctionSide,
  branch: FlowBranch,
  lossCoefficient: number,
): JunctionOutcome {
  // Heads measured from the known side's invert: the balance depends on the drop between the inverts, not on
  // where the bed stands, so the same junction gives the same depth bit for bit when an edit elsewhere moves the
  // whole bed up or down (reach-reuse.ts), and no digits go to large elevations.
  const knownEnergyM = reachSpecificEnergyM(known.flow, knownDepthM);
  const knownVelocityHeadM = velocityHeadM(known.flow, knownDepthM);
  const dropM = unknownAboveKnownM(known, unknown);
  const flow = unknown.flow;
  // The loss is on the downstream side of the balance: subtracted when the unknown side is upstream.
  const lossSign = branch === 'subcritical' ? -1 : 1;
  const excessHead = (depthM: number): number => {
    const hv = velocityHeadM(flow, depthM);
    return dropM + depthM + hv + lossSign * lossCoefficient * Math.abs(hv - knownVelocityHeadM) - knownEnergyM;
  };
  const criticalDepthM = flow.criticalDepthM;
  const alpha = flow.kineticEnergyCoefficient;
  const rootOn = (lowM: number, highM: number): JunctionOutcome => {
    const root = solveBracketedRoot(excessHead, lowM, highM, STEP_ENERGY_TOLERANCE_M, 4 * Number.EPSILON * highM);
    if (!root.converged) return { kind: 'did-not-converge' };
    const depthM = root.x;
    const headLossM = lossCoefficient * Math.abs(velocityHeadM(flow, depthM) - knownVelocityHeadM);
    // As upstream head minus downstream head minus loss: f itself when the unknown side is upstream.
    return { kind: 'balanced', depthM, headLossM, residualM: branch === 'subcritical' ? root.value : -root.value };
  };

  if (branch === 'supercritical') {
    let minimumDepthM = criticalDepthM;
    if (lossCoefficient > 0) {
      const lowerEndM = criticalDepthWithAlphaM(flow.section, flow.dischargeM3s, alpha * (1 - lossCoefficient));
      if (lowerEndM !== undefined && lowerEndM < criticalDepthM) minimumDepthM = minimiseUnimodal(excessHead, lowerEndM, criticalDepthM);
    }
    if (excessHead(minimumDepthM) > STEP_ENERGY_TOLERANCE_M) return { kind: 'no-depth-on-branch' };
    let lowM = 0.5 * minimumDepthM;
    for (let halving = 0; excessHead(lowM) < 0; halving++) {
      if (halving > 200) return { kind: 'did-not-converge' };
      lowM *= 0.5;
    }
    return rootOn(lowM, minimumDepthM);
  }

  // Subcritical branch: f increases without bound from the critical depth for alpha (1 + k) upward.
  let risingFromM = criticalDepthM;
  if (lossCoefficient > 0) {
    const upperCriticalM = criticalDepthWithAlphaM(flow.section, flow.dischargeM3s, alpha * (1 + lossCoefficient));
    if (upperCriticalM !== undefined) risingFromM = Math.min(Math.max(upperCriticalM, criticalDepthM), flow.highestFreeSurfaceDepthM);
  }
  const bracketAbove = (lowM: number): JunctionOutcome => {
    let highM = Math.max(2 * lowM, 1e-3);
    for (let doubling = 0; excessHead(Math.min(highM, flow.highestFreeSurfaceDepthM)) < 0; doubling++) {
      if (highM >= flow.highestFreeSurfaceDepthM) return { kind: 'above-crown' };
      if (doubling > 200) return { kind: 'did-not-converge' };
      highM *= 2;
    }
    return rootOn(lowM, Math.min(highM, flow.highestFreeSurfaceDepthM));
  };
  if (excessHead(risingFromM) <= STEP_ENERGY_TOLERANCE_M) return bracketAbove(risingFromM);
  // f > 0 where it starts rising for good: a shallower root exists only where f rises from yc through zero.
  if (excessHead(criticalDepthM) <= STEP_ENERGY_TOLERANCE_M) return rootOn(criticalDepthM, risingFromM);
  return { kind: 'no-depth-on-branch' };
}
