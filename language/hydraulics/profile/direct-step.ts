/**
 * The direct step method for a prismatic reach (Chow 1959, Ch. 10): choose the depths, compute the distances,
 *
 *     dx = (E2 - E1) / (S0 - Sf_mean),   Sf_mean = (Sf1 + Sf2) / 2,
 *
 * dx measured downstream from the section of depth y1 to that of y2. It is written out here on its own (no code
 * shared with the standard step march) so that tests can check the march against it.
 */
import { GRAVITY_MS2 } from '../constants.js';
import { solveCriticalDepth } from '../critical-flow.js';
import type { SectionGeometry } from '../sections/section-geometry.js';
import { conveyance, solveNormalDepth } from '../uniform-flow.js';

export interface DirectStepInput {
  readonly section: SectionGeometry;
  readonly manningN: number;
  readonly bedSlope: number;
  readonly dischargeM3s: number;
  /** alpha, default 1. */
  readonly kineticEnergyCoefficient?: number;
  /** Depth at the control, m. */
  readonly startDepthM: number;
  /** Depth at which the computation ends, m (the profile must approach it without crossing normal or critical depth). */
  readonly endDepthM: number;
  /** Number of equal depth increments between the two (>= 1). */
  readonly increments: number;
}

export interface DirectStepPoint {
  readonly depthM: number;
  /** Distance from the start section, m, positive downstream (a backwater curve computed upstream is negative). */
  readonly distanceM: number;
}

export type DirectStepResult =
  | { readonly converged: true; readonly points: readonly DirectStepPoint[] }
  | { readonly converged: false; readonly reason: 'invalid-input' | 'crosses-normal-depth' | 'crosses-critical-depth'; readonly message: string };

export function directStepProfile(input: DirectStepInput): DirectStepResult {
  const { section, manningN, bedSlope, dischargeM3s, startDepthM, endDepthM, increments } = input;
  const alpha = input.kineticEnergyCoefficient ?? 1;
  const numbersOk = [manningN, dischargeM3s, startDepthM, endDepthM].every((value) => value > 0 && Number.isFinite(value));
  if (!numbersOk || !Number.isFinite(bedSlope) || !(Number.isInteger(increments) && increments >= 1) || !(alpha >= 1)) {
    return { converged: false, reason: 'invalid-input', message: 'Depths, discharge and n must be positive; increments a whole number of at least 1.' };
  }
  const critical = solveCriticalDepth(section, dischargeM3s * Math.sqrt(alpha));
  if (critical.converged && (startDepthM - critical.depthM) * (endDepthM - critical.depthM) < 0) {
    return { converged: false, reason: 'crosses-critical-depth', message: 'A gradually varied profile cannot pass critical depth between the two depths.' };
  }
  const normal = solveNormalDepth(section, { dischargeM3s, manningN, bedSlope });
  if (normal.converged && (startDepthM - normal.depthM) * (endDepthM - normal.depthM) <= 0) {
    return { converged: false, reason: 'crosses-normal-depth', message: 'A gradually varied profile approaches normal depth only asymptotically: the end depth must lie on the same side of it.' };
  }
  const energy = (y: number): number => {
    const velocityMs = dischargeM3s / section.areaM2(y);
    return y + (alpha * velocityMs * velocityMs) / (2 * GRAVITY_MS2);
  };
  const friction = (y: number): number => ((dischargeM3s * manningN) / conveyance(section, y)) ** 2;
  const points: DirectStepPoint[] = [{ depthM: startDepthM, distanceM: 0 }];
  let distanceM = 0;
  for (let step = 1; step <= increments; step++) {
    const y1 = startDepthM + ((endDepthM - startDepthM) * (step - 1)) / increments;
    const y2 = startDepthM + ((endDepthM - startDepthM) * step) / increments;
    distanceM += (energy(y2) - energy(y1)) / (bedSlope - 0.5 * (friction(y1) + friction(y2)));
    points.push({ depthM: y2, distanceM });
  }
  return { converged: true, points };
}
