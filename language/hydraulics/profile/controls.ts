/**
 * Boundary conditions of a channel profile. The outlet sets the depth from which subcritical flow is computed
 * upstream; the inlet sets the depth from which supercritical flow is computed downstream. A control that would
 * put the flow on the wrong branch does not control it, and the result says so.
 */
import type { ProfileNote, InletControl, OutletControl } from './profile-types.js';
import type { ReachFlow } from './reach-flow.js';

export type OutletStart =
  | {
      readonly converged: true;
      /** Depth at the outlet from which the subcritical profile starts, m (>= critical depth). */
      readonly depthM: number;
      /** True when that depth is critical depth imposed by the outlet (free fall, low tailwater). */
      readonly isCriticalControl: boolean;
      /**
       * Depth just beyond the outlet that a supercritical flow leaving the channel meets, m: the tailwater depth
       * or the outlet normal depth; undefined for a free fall.
       */
      readonly tailwaterDepthM: number | undefined;
      readonly note: ProfileNote | undefined;
    }
  | { readonly converged: false; readonly message: string };

/** The subcritical starting depth at the outlet of the last reach (outletInvertElevationM in m). */
export function resolveOutletStart(
  outlet: OutletControl,
  lastFlow: ReachFlow,
  outletInvertElevationM: number,
  lastReachIndex: number,
  outletStationM: number,
): OutletStart {
  const criticalDepthM = lastFlow.criticalDepthM;
  switch (outlet.kind) {
    case 'free-fall':
      return { converged: true, depthM: criticalDepthM, isCriticalControl: true, tailwaterDepthM: undefined, note: undefined };
    case 'water-level': {
      const tailwaterDepthM = outlet.elevationM - outletInvertElevationM;
      if (tailwaterDepthM > criticalDepthM) {
        return { converged: true, depthM: tailwaterDepthM, isCriticalControl: false, tailwaterDepthM, note: undefined };
      }
      return {
        converged: true,
        depthM: criticalDepthM,
        isCriticalControl: true,
        tailwaterDepthM: tailwaterDepthM > 0 ? tailwaterDepthM : undefined,
        note: {
          code: 'tailwater-below-critical-depth',
          message: `The outlet water level (${fixed(outlet.elevationM)} m) gives a depth of ${fixed(tailwaterDepthM)} m, not above critical depth ${fixed(criticalDepthM)} m: it does not hold the flow back, and the outlet acts as a free fall with critical depth at the brink.`,
          reachIndex: lastReachIndex,
          stationM: outletStationM,
        },
      };
    }
    case 'normal-depth': {
      const normalDepthM = lastFlow.normalDepthM;
      if (normalDepthM === undefined) {
        return {
          converged: false,
          message: `The outlet is set to normal depth, but the last reach has none: ${lastFlow.normalDepthNote ?? 'no uniform flow is possible.'}`,
        };
      }
      if (normalDepthM > criticalDepthM) {
        return { converged: true, depthM: normalDepthM, isCriticalControl: false, tailwaterDepthM: normalDepthM, note: undefined };
      }
      return {
        converged: true,
        depthM: criticalDepthM,
        isCriticalControl: true,
        tailwaterDepthM: normalDepthM,
        note: {
          code: 'outlet-normal-depth-supercritical',
          message: `Normal depth at the outlet (${fixed(normalDepthM)} m) is below critical depth (${fixed(criticalDepthM)} m): the outlet does not control subcritical flow, so critical depth is taken there.`,
          reachIndex: lastReachIndex,
          stationM: outletStationM,
        },
      };
    }
  }
}

export interface InletStart {
  /** Supercritical depth entering the first reach, m; undefined when the inlet does not impose one. */
  readonly depthM: number | undefined;
  readonly note: ProfileNote | undefined;
}

/**
 * The supercritical depth the inlet imposes on the first reach, if any. Critical depth at the entrance is not
 * returned here: it acts wherever the subcritical computation finds no subcritical depth at the entrance, which
 * the profile handles for every reach alike.
 */
export function resolveInletStart(inlet: InletControl, firstFlow: ReachFlow): InletStart {
  const criticalDepthM = firstFlow.criticalDepthM;
  switch (inlet.kind) {
    case 'critical-depth':
      return { depthM: undefined, note: undefined };
    case 'normal-depth': {
      const normalDepthM = firstFlow.normalDepthM;
      return { depthM: normalDepthM !== undefined && normalDepthM < criticalDepthM ? normalDepthM : undefined, note: undefined };
    }
    case 'depth':
      if (inlet.depthM < criticalDepthM) return { depthM: inlet.depthM, note: undefined };
      return {
        depthM: undefined,
        note: {
          code: 'inlet-depth-not-supercritical',
          message: `The given inlet depth (${fixed(inlet.depthM)} m) is not below critical depth (${fixed(criticalDepthM)} m): it does not control the flow, which is set by the downstream controls.`,
          reachIndex: 0,
          stationM: 0,
        },
      };
  }
}

/** Metres to three decimals (millimetres) for notes. */
export function fixed(valueM: number): string {
  return valueM.toFixed(3);
}
