/**
 * The deepest water along a reach from its channel's water-surface profile, for the `runnel.inlayHints.maximum
 * ProfileDepth` hint. Profiles reach the views through the optional `waterSurfaceProfiles` of a channel result
 * (language/report/profile-overlay.ts); where the analysis carries none, there is no such hint. Stations are
 * measured from the channel's upstream end over its reaches in order, as the longitudinal view places them.
 */
import type { ChannelResult } from '../../language/analysis/model.js';
import { placeReaches } from '../../language/report/longitudinal-svg.js';
import { waterSurfaceProfilesOf, type ChannelWithProfiles } from '../../language/report/profile-overlay.js';

const placementsByChannel = new WeakMap<ChannelResult, ReturnType<typeof placeReaches>['placements']>();

/** The largest profile depth of `flow` within reach number `reachIndex` of the channel, m; undefined without one. */
export function maximumProfileDepthM(channel: ChannelResult, reachIndex: number, flow: string): number | undefined {
  const profile = waterSurfaceProfilesOf(channel as ChannelWithProfiles).find((candidate) => candidate.flow === flow);
  if (profile === undefined || profile.points.length === 0) return undefined;
  let placements = placementsByChannel.get(channel);
  if (placements === undefined) {
    placements = placeReaches(channel).placements;
    placementsByChannel.set(channel, placements);
  }
  const placement = placements[reachIndex];
  if (placement === undefined) return undefined;
  let deepestM: number | undefined;
  for (const point of profile.points) {
    if (point.station_m < placement.startStationM || point.station_m > placement.endStationM) continue;
    if (deepestM === undefined || point.depth_m > deepestM) deepestM = point.depth_m;
  }
  return deepestM;
}
