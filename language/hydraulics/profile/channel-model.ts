/**
 * The channel as the profile passes see it: each reach with its flow properties, stations and inverts resolved,
 * and the subcritical pass's trace of depths along it. Internal to the profile modules.
 */
import type { ProfileReachInput } from './profile-types.js';
import type { ReachFlow } from './reach-flow.js';
import type { MarchSettings } from './standard-step.js';

export interface ResolvedReach {
  readonly index: number;
  readonly input: ProfileReachInput;
  readonly flow: ReachFlow;
  /** Station of the reach's upstream end, m from the channel's upstream end. */
  readonly startStationM: number;
  readonly lengthM: number;
  readonly upstreamInvertElevationM: number;
  readonly downstreamInvertElevationM: number;
  readonly march: MarchSettings;
}

/** Invert elevation at a station measured from the reach's upstream end, m. */
export function invertElevationAt(reach: ResolvedReach, localStationM: number): number {
  if (localStationM >= reach.lengthM) return reach.downstreamInvertElevationM;
  return reach.upstreamInvertElevationM - reach.flow.bedSlope * localStationM;
}

/** The subcritical pass's result in one reach. */
export interface SubcriticalTrace {
  /** Stations with a subcritical (or critical) depth, ascending, m from the reach's upstream end; the last is the reach end. */
  readonly stationsM: readonly number[];
  readonly depthsM: readonly number[];
  /**
   * Upstream of this station (m) there is no free-surface subcritical depth, for the reason below. Undefined when
   * the whole reach has one; infinite when none of it has.
   */
  readonly noSubcriticalDepthAboveM: number | undefined;
  /**
   * 'reaches-critical': the subcritical profile from downstream reached critical depth there (an S1 curve), so the
   * flow above it is critical or supercritical. 'surcharged': it reached the crown of a conduit there (or further
   * downstream), so above it the conduit would flow full unless supercritical flow from upstream holds it.
   */
  readonly noSubcriticalDepthReason: 'reaches-critical' | 'surcharged' | undefined;
  /** The depth at the reach's downstream end is critical depth imposed there (free fall, drop, choke), not a balance. */
  readonly endIsCriticalControl: boolean;
}

/** The subcritical pass's depth at a station (m from the reach's upstream end), interpolated linearly between its stations. */
export function subcriticalDepthAt(reach: ResolvedReach, trace: SubcriticalTrace, localStationM: number): number {
  if (trace.noSubcriticalDepthAboveM !== undefined && localStationM < trace.noSubcriticalDepthAboveM) return reach.flow.criticalDepthM;
  const stations = trace.stationsM;
  const depths = trace.depthsM;
  let low = 0;
  let high = stations.length - 1;
  if (localStationM <= (stations[0] ?? 0)) return depths[0] ?? reach.flow.criticalDepthM;
  if (localStationM >= (stations[high] ?? 0)) return depths[high] ?? reach.flow.criticalDepthM;
  while (high - low > 1) {
    const middle = (low + high) >> 1;
    if ((stations[middle] ?? 0) <= localStationM) low = middle;
    else high = middle;
  }
  const x0 = stations[low] ?? 0;
  const x1 = stations[high] ?? 0;
  const y0 = depths[low] ?? 0;
  const y1 = depths[high] ?? 0;
  return x1 > x0 ? y0 + ((y1 - y0) * (localStationM - x0)) / (x1 - x0) : y1;
}

/** Index of the first trace station at or downstream of a station, or -1 if there is none. */
export function firstTraceStationAtOrBelow(trace: SubcriticalTrace, localStationM: number): number {
  const stations = trace.stationsM;
  let low = 0;
  let high = stations.length;
  while (low < high) {
    const middle = (low + high) >> 1;
    if ((stations[middle] ?? 0) < localStationM) low = middle + 1;
    else high = middle;
  }
  return low < stations.length ? low : -1;
}
