/**
 * The optional input by which a computed water-surface profile reaches the longitudinal view. The analysis model
 * does not carry profiles yet; when it does, `ChannelResult` gains the optional field below
 * (`waterSurfaceProfiles`) and the longitudinal view draws it with no other change. Stations are measured along
 * the channel from the upstream end of its first reach, over the reaches in order (the same stations the view
 * uses); depths are measured vertically from the bed at that station. All SI.
 */
import type { ChannelResult } from '../analysis/model.js';

export interface WaterSurfaceProfilePoint {
  /** Distance from the channel's upstream end, m. */
  readonly station_m: number;
  /** Depth of flow above the bed at that station, m. */
  readonly depth_m: number;
}

export interface HydraulicJumpMarker {
  /** Where the jump stands, m from the channel's upstream end. */
  readonly station_m: number;
  /** Depth just upstream of the jump (supercritical), m. */
  readonly upstreamDepth_m: number;
  /** Sequent depth just downstream of the jump (subcritical), m. */
  readonly downstreamDepth_m: number;
}

export interface WaterSurfaceProfile {
  /** The design flow, by name as in FlowResult.flow. */
  readonly flow: string;
  /** Points in order of station. */
  readonly points: readonly WaterSurfaceProfilePoint[];
  readonly jumps: readonly HydraulicJumpMarker[];
}

/** A channel that may carry computed profiles. */
export interface ChannelWithProfiles extends ChannelResult {
  readonly waterSurfaceProfiles?: readonly WaterSurfaceProfile[];
}

/** The profiles a channel carries, keeping only well-formed points and jumps (finite numbers, depth >= 0). */
export function waterSurfaceProfilesOf(channel: ChannelWithProfiles): readonly WaterSurfaceProfile[] {
  const profiles = channel.waterSurfaceProfiles;
  if (!Array.isArray(profiles)) return [];
  return profiles
    .filter((profile): profile is WaterSurfaceProfile => typeof profile === 'object' && profile !== null && typeof profile.flow === 'string')
    .map((profile) => ({
      flow: profile.flow,
      points: (Array.isArray(profile.points) ? profile.points : []).filter(
        (point) => Number.isFinite(point.station_m) && Number.isFinite(point.depth_m) && point.depth_m >= 0,
      ),
      jumps: (Array.isArray(profile.jumps) ? profile.jumps : []).filter(
        (jump) => Number.isFinite(jump.station_m) && Number.isFinite(jump.upstreamDepth_m) && Number.isFinite(jump.downstreamDepth_m),
      ),
    }));
}
