/**
 * The bed of a channel along its reaches: the invert elevation at both ends of every reach. The water-surface
 * profile and the report's longitudinal view both place reaches with this one function, so the drawn bed is the
 * bed the profile was computed on.
 *
 * Inverts written in the design are used as they are (a difference at a junction is a drop). A reach given only
 * its slope continues the bed of the next reach downstream (its downstream invert is that reach's upstream
 * invert) and rises upstream by slope x length; below the last reach with a known invert the bed continues down
 * from the reach above. With no invert anywhere the outlet invert is taken as zero: elevations are then relative
 * to the outlet invert.
 */

export interface BedReach {
  /** Bed slope, m/m, positive downhill. */
  readonly slope: number;
  readonly length_m: number;
  readonly upstreamInvert_m: number | null;
  readonly downstreamInvert_m: number | null;
}

export interface ChannelBed {
  /** Invert at the upstream and downstream end of each reach, m. */
  readonly upstreamInvertsM: readonly number[];
  readonly downstreamInvertsM: readonly number[];
  /** 'absolute' when some reach gives an invert; 'relative-to-outlet' when every elevation is relative to the outlet invert. */
  readonly datum: 'absolute' | 'relative-to-outlet';
}

/** The invert elevations of every reach; see the module comment. Non-finite inputs count as not given. */
export function channelBed(reaches: readonly BedReach[]): ChannelBed {
  const count = reaches.length;
  const lengths = reaches.map((reach) => (Number.isFinite(reach.length_m) && reach.length_m > 0 ? reach.length_m : 0));
  const falls = reaches.map((reach, index) => (Number.isFinite(reach.slope) ? reach.slope : 0) * (lengths[index] ?? 0));
  const upstream = reaches.map((reach) => finiteOrNaN(reach.upstreamInvert_m));
  const downstream = reaches.map((reach) => finiteOrNaN(reach.downstreamInvert_m));
  const anyInvert = [...upstream, ...downstream].some(Number.isFinite);
  if (!anyInvert && count > 0) downstream[count - 1] = 0;
  // A reach with one invert written: the other from its slope.
  const completeFromOwnEnd = (index: number): void => {
    const up = upstream[index] as number;
    const down = downstream[index] as number;
    if (Number.isNaN(up) && Number.isFinite(down)) upstream[index] = down + (falls[index] as number);
    if (Number.isNaN(down) && Number.isFinite(up)) downstream[index] = up - (falls[index] as number);
  };
  for (let index = 0; index < count; index++) completeFromOwnEnd(index);
  // Continuity with the reach below, from the outlet upstream.
  for (let index = count - 2; index >= 0; index--) {
    if (Number.isNaN(downstream[index] as number) && Number.isNaN(upstream[index] as number) && Number.isFinite(upstream[index + 1] as number)) {
      downstream[index] = upstream[index + 1] as number;
      completeFromOwnEnd(index);
    }
  }
  // Below the last known invert, continuity with the reach above.
  for (let index = 1; index < count; index++) {
    if (Number.isNaN(upstream[index] as number) && Number.isNaN(downstream[index] as number) && Number.isFinite(downstream[index - 1] as number)) {
      upstream[index] = downstream[index - 1] as number;
      completeFromOwnEnd(index);
    }
  }
  return {
    upstreamInvertsM: upstream.map((value) => (Number.isFinite(value) ? value : 0)),
    downstreamInvertsM: downstream.map((value) => (Number.isFinite(value) ? value : 0)),
    datum: anyInvert ? 'absolute' : 'relative-to-outlet',
  };
}

function finiteOrNaN(value: number | null): number {
  return value !== null && Number.isFinite(value) ? value : Number.NaN;
}
