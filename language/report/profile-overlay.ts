/**
 * The computed water-surface profiles of a channel as the longitudinal view draws them, read from the analysis
 * model (ChannelResult.profiles). Stations are measured along the channel from the upstream end of its first
 * reach, as the view places reaches; elevations are on the same datum as the view's bed (language/analysis/
 * channel-bed.ts builds both). Only well-formed values are kept (finite numbers, depths >= 0), so a damaged or
 * hand-made model never draws NaN.
 */
import type { ChannelResult, HydraulicJumpResult, ProfilePointResult } from '../analysis/model.js';

export interface DrawnProfilePoint {
  readonly station_m: number;
  readonly waterSurface_m: number;
}

export interface DrawnJump {
  readonly station_m: number;
  readonly reach: string;
  /** Depth just upstream of the jump (supercritical), m. */
  readonly upstreamDepth_m: number;
  /** Depth just downstream of the jump (subcritical), m. */
  readonly downstreamDepth_m: number;
  /** Bed elevation under the jump, m. */
  readonly invert_m: number;
}

export interface DrawnProfile {
  /** The design flow, by name as in FlowResult.flow. */
  readonly flow: string;
  readonly points: readonly DrawnProfilePoint[];
  readonly jumps: readonly DrawnJump[];
}

/** The computed profiles of a channel that have points to draw, with malformed points and jumps left out. */
export function drawnProfilesOf(channel: ChannelResult): readonly DrawnProfile[] {
  const profiles = channel.profiles;
  if (!Array.isArray(profiles)) return [];
  const drawn: DrawnProfile[] = [];
  for (const profile of profiles) {
    if (typeof profile !== 'object' || profile === null || typeof profile.flow !== 'string' || !Array.isArray(profile.points)) continue;
    const points = (profile.points as readonly ProfilePointResult[]).filter(
      (point: ProfilePointResult) => Number.isFinite(point.station_m) && Number.isFinite(point.waterSurface_m) && Number.isFinite(point.invert_m) && Number.isFinite(point.depth_m) && point.depth_m >= 0,
    );
    if (points.length === 0) continue;
    const jumps: DrawnJump[] = [];
    const jumpList: readonly HydraulicJumpResult[] = Array.isArray(profile.jumps) ? (profile.jumps as readonly HydraulicJumpResult[]) : [];
    for (const jump of jumpList) {
      if (!(Number.isFinite(jump.station_m) && Number.isFinite(jump.upstreamDepth_m) && Number.isFinite(jump.downstreamDepth_m))) continue;
      // A passage through critical depth within the near-critical band is no jump to draw (model.ts).
      if (jump.nearCritical === true || jump.jumpType === 'not-a-jump') continue;
      // The bed under the jump: from the computed point of its reach nearest to it.
      let invertM: number | undefined;
      let nearestM = Number.POSITIVE_INFINITY;
      for (const point of points) {
        const distanceM = Math.abs(point.station_m - jump.station_m);
        if (point.reach === jump.reach && distanceM < nearestM) {
          nearestM = distanceM;
          invertM = point.invert_m;
        }
      }
      if (invertM === undefined) continue;
      jumps.push({ station_m: jump.station_m, reach: jump.reach, upstreamDepth_m: jump.upstreamDepth_m, downstreamDepth_m: jump.downstreamDepth_m, invert_m: invertM });
    }
    drawn.push({ flow: profile.flow, points: points.map((point) => ({ station_m: point.station_m, waterSurface_m: point.waterSurface_m })), jumps });
  }
  return drawn;
}
