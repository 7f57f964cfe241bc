/**
 * The hydraulic jump in a prismatic channel of any section, from the momentum equation with no bed friction or
 * weight component over the jump's length (Chow 1959, Ch. 3 and Ch. 15): the specific force
 * M = Q^2 / (g A) + A ybar is the same on both sides. M has its minimum at critical depth (beta = 1), so each
 * supercritical depth has one subcritical sequent depth and the reverse. For a rectangle this reduces to
 * Belanger's y2 / y1 = (sqrt(1 + 8 Fr1^2) - 1) / 2.
 *
 * Types by the upstream Froude number follow USBR Engineering Monograph 25 (Peterka) as given in Chow (1959),
 * Sec. 15-3: undular 1.0 to 1.7, weak 1.7 to 2.5, oscillating 2.5 to 4.5, steady 4.5 to 9.0, strong above 9.0.
 * Each band includes its lower bound.
 */
import { GRAVITY_MS2 } from '../constants.js';
import { solveCriticalDepth, specificForceM3 } from '../critical-flow.js';
import type { SectionGeometry } from '../sections/section-geometry.js';
import type { JumpType } from './profile-types.js';
import { solveBracketedRoot } from './scalar-solvers.js';

/** Upper Froude-number bound of each jump type (USBR Engineering Monograph 25; Chow 1959, Sec. 15-3). */
const JUMP_TYPE_UPPER_FROUDE: readonly { readonly type: JumpType; readonly belowFroude: number }[] = [
  { type: 'undular', belowFroude: 1.7 },
  { type: 'weak', belowFroude: 2.5 },
  { type: 'oscillating', belowFroude: 4.5 },
  { type: 'steady', belowFroude: 9.0 },
  { type: 'strong', belowFroude: Number.POSITIVE_INFINITY },
];

/** Jump type by the upstream Froude number; 'not-a-jump' for Fr <= 1 (no supercritical inflow). */
export function classifyJump(upstreamFroudeNumber: number): JumpType | 'not-a-jump' {
  if (!(upstreamFroudeNumber > 1)) return 'not-a-jump';
  for (const band of JUMP_TYPE_UPPER_FROUDE) if (upstreamFroudeNumber < band.belowFroude) return band.type;
  return 'strong';
}

/** Plain words for a jump type, with its Froude range. */
export function describeJumpType(jumpType: JumpType | 'not-a-jump'): string {
  switch (jumpType) {
    case 'undular':
      return 'undular jump (Froude number 1.0 to 1.7)';
    case 'weak':
      return 'weak jump (Froude number 1.7 to 2.5)';
    case 'oscillating':
      return 'oscillating jump (Froude number 2.5 to 4.5)';
    case 'steady':
      return 'steady jump (Froude number 4.5 to 9.0)';
    case 'strong':
      return 'strong jump (Froude number above 9.0)';
    case 'not-a-jump':
      return 'a passage through critical depth rather than a jump (inflow Froude number not above 1)';
  }
}

export type SequentDepthResult =
  | {
      readonly converged: true;
      /** Depth with the same specific force on the other side of critical depth, m (equal to the given depth at critical). */
      readonly sequentDepthM: number;
      /** Depth of minimum specific force (critical depth with alpha = beta = 1), m. */
      readonly criticalDepthM: number;
      readonly iterations: number;
    }
  | {
      readonly converged: false;
      readonly reason: 'invalid-input' | 'conduit-fills' | 'did-not-converge';
      readonly message: string;
    };

/**
 * Sequent (conjugate) depth of depthM (m) for discharge Q (m3/s): the depth on the other side of critical depth with
 * the same specific force. Tolerance: |M(y2) - M(y1)| <= 1e-12 M(y1). A closed conduit whose subcritical sequent
 * depth would exceed the crown has none ('conduit-fills': the jump would fill the conduit).
 */
export function solveSequentDepth(section: SectionGeometry, depthM: number, dischargeM3s: number): SequentDepthResult {
  if (!(depthM > 0 && Number.isFinite(depthM)) || !(dischargeM3s > 0 && Number.isFinite(dischargeM3s))) {
    return { converged: false, reason: 'invalid-input', message: 'Depth and discharge must be positive finite numbers.' };
  }
  const critical = solveCriticalDepth(section, dischargeM3s);
  if (!critical.converged) return { converged: false, reason: critical.reason, message: critical.message };
  const criticalDepthM = critical.depthM;
  const targetM3 = specificForceM3(section, depthM, dischargeM3s);
  const mismatch = (y: number): number => specificForceM3(section, y, dischargeM3s) - targetM3;
  const valueTolerance = 1e-12 * targetM3;
  if (Math.abs(depthM - criticalDepthM) <= 1e-12 * criticalDepthM) {
    return { converged: true, sequentDepthM: depthM, criticalDepthM, iterations: 0 };
  }
  let lowM: number;
  let highM: number;
  if (depthM < criticalDepthM) {
    // Subcritical sequent: M grows without bound above yc in open sections; a conduit caps it at the crown.
    lowM = criticalDepthM;
    highM = 2 * criticalDepthM;
    const crownM = section.fullDepthM;
    if (crownM !== undefined) {
      highM = Math.min(highM, crownM);
      if (mismatch(crownM) < 0) {
        return {
          converged: false,
          reason: 'conduit-fills',
          message: `The sequent depth would exceed the conduit's height of ${crownM.toPrecision(4)} m: the jump would fill the conduit.`,
        };
      }
    }
    for (let doubling = 0; mismatch(highM) < 0; doubling++) {
      if (doubling > 200) return { converged: false, reason: 'did-not-converge', message: 'No subcritical sequent depth was bracketed.' };
      highM = crownM === undefined ? 2 * highM : Math.min(2 * highM, crownM);
    }
  } else {
    // Supercritical sequent: M grows without bound as the depth goes to zero.
    highM = criticalDepthM;
    lowM = 0.5 * criticalDepthM;
    for (let halving = 0; mismatch(lowM) < 0; halving++) {
      if (halving > 200) return { converged: false, reason: 'did-not-converge', message: 'No supercritical sequent depth was bracketed.' };
      lowM *= 0.5;
    }
  }
  const root = solveBracketedRoot(mismatch, lowM, highM, valueTolerance, 4 * Number.EPSILON * highM);
  if (!root.converged) return { converged: false, reason: 'did-not-converge', message: 'The sequent-depth iteration did not converge.' };
  return { converged: true, sequentDepthM: root.x, criticalDepthM, iterations: root.iterations };
}

/** Specific energy lost in a jump from y1 to y2 (m), with kinetic-energy coefficient alpha: E(y1) - E(y2), m. */
export function jumpEnergyLossM(section: SectionGeometry, upstreamDepthM: number, downstreamDepthM: number, dischargeM3s: number, alpha = 1): number {
  const energy = (y: number): number => {
    const velocityMs = dischargeM3s / section.areaM2(y);
    return y + (alpha * velocityMs * velocityMs) / (2 * GRAVITY_MS2);
  };
  return energy(upstreamDepthM) - energy(downstreamDepthM);
}
