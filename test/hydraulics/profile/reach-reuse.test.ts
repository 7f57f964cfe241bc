/**
 * Reach reuse (reach-reuse.ts): a profile computed with marches taken over from earlier computations equals, field
 * for field, the profile computed from nothing, whatever was computed before and whatever was edited in between;
 * and an edit to one reach of a long channel recomputes only the reaches it affects. The reference here is the
 * engine itself without reuse: reuse must change the work done, never a number.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeChannelProfile, ProfileReuse, type ChannelProfileInput, type ChannelProfileResult, type ProfileReachInput } from '../../../language/hydraulics/profile/index.js';
import { circleSection, rectangleSection, trapezoidSection, triangleSection } from '../../../language/hydraulics/sections/index.js';

// A few section objects shared by the reaches, as the analysis shares one object per unchanged section.
const SECTIONS = [
  trapezoidSection({ bottomWidthM: 1.2, leftSideSlopeHV: 3, rightSideSlopeHV: 3 }),
  rectangleSection({ bottomWidthM: 1.5 }),
  triangleSection({ leftSideSlopeHV: 4, rightSideSlopeHV: 3 }),
  circleSection({ diameterM: 1.2 }),
];

const reachArbitrary: fc.Arbitrary<Omit<ProfileReachInput, 'name'>> = fc.record({
  section: fc.constantFrom(...SECTIONS),
  manningN: fc.constantFrom(0.013, 0.025, 0.035),
  // Mild and steep slopes both, so that controls, jumps and drops all occur.
  bedSlope: fc.oneof(fc.double({ min: 2e-4, max: 0.004, noNaN: true }), fc.double({ min: 0.01, max: 0.05, noNaN: true })),
  lengthM: fc.double({ min: 10, max: 150, noNaN: true }),
  downstreamInvertElevationM: fc.option(fc.double({ min: 0, max: 20, noNaN: true }), { nil: undefined }),
});

const channelArbitrary: fc.Arbitrary<ChannelProfileInput> = fc.record({
  reaches: fc.array(reachArbitrary, { minLength: 2, maxLength: 8 }).map((reaches) => reaches.map((reach, index) => ({ ...reach, name: `r${index}` }))),
  dischargeM3s: fc.double({ min: 0.1, max: 3, noNaN: true }),
  outlet: fc.oneof(fc.constant({ kind: 'free-fall' } as const), fc.double({ min: 0, max: 25, noNaN: true }).map((elevationM) => ({ kind: 'water-level', elevationM }) as const)),
  stepControl: fc.constant({ maximumStepLengthM: 100, minimumStepsPerReach: 1, maximumDepthChangeRatio: 0.05 }),
});

/** One edit as a designer makes it: a reach's slope, length, roughness or invert, the discharge, or the outlet. */
type Edit = (input: ChannelProfileInput, reachIndex: number, factor: number) => ChannelProfileInput;
const EDITS: readonly Edit[] = [
  (input, i, f) => withReach(input, i, (reach) => ({ ...reach, bedSlope: reach.bedSlope * f })),
  (input, i, f) => withReach(input, i, (reach) => ({ ...reach, lengthM: reach.lengthM * f })),
  (input, i, f) => withReach(input, i, (reach) => ({ ...reach, manningN: reach.manningN * f })),
  (input, i, f) => withReach(input, i, (reach) => ({ ...reach, downstreamInvertElevationM: (reach.downstreamInvertElevationM ?? 5) + f - 1 })),
  (input, _i, f) => ({ ...input, dischargeM3s: input.dischargeM3s * f }),
  (input, _i, f) => ({ ...input, outlet: input.outlet.kind === 'water-level' ? { kind: 'water-level', elevationM: input.outlet.elevationM + f - 1 } : { kind: 'normal-depth' } }),
];

function withReach(input: ChannelProfileInput, index: number, change: (reach: ProfileReachInput) => ProfileReachInput): ChannelProfileInput {
  return { ...input, reaches: input.reaches.map((reach, position) => (position === index ? change(reach) : reach)) };
}

/** Everything a reader sees of a result, points and steps included (they are built on first read). */
function readable(result: ChannelProfileResult): unknown {
  if (!result.converged) return result;
  const { pointTable: _columns, ...rest } = result;
  return { ...rest, points: result.points, steps: result.steps };
}

describe('profiles computed with reach reuse equal profiles computed from nothing', () => {
  it('property: after any sequence of edits, each computation with reuse equals the fresh computation', () => {
    fc.assert(
      fc.property(
        channelArbitrary,
        fc.array(fc.tuple(fc.nat(EDITS.length - 1), fc.nat(7), fc.double({ min: 0.5, max: 1.6, noNaN: true })), { minLength: 1, maxLength: 4 }),
        (original, edits) => {
          const reuse = new ProfileReuse();
          let input = original;
          for (const [editIndex, reachIndex, factor] of [[0, 0, 1] as const, ...edits]) {
            input = (EDITS[editIndex] as Edit)(input, reachIndex % input.reaches.length, factor);
            reuse.startGeneration();
            expect(readable(computeChannelProfile({ ...input, reuse }))).toEqual(readable(computeChannelProfile(input)));
          }
          // Back to the first channel: taken over where it can be, still equal.
          reuse.startGeneration();
          expect(readable(computeChannelProfile({ ...original, reuse }))).toEqual(readable(computeChannelProfile(original)));
        },
      ),
      { numRuns: 150 },
    );
  });

  it('an edit to one reach of a 12-reach channel recomputes only the reaches it affects, and the result equals the fresh one', () => {
    // Alternating mild grass reaches and steep concrete chutes: each chute's head is a critical-depth control.
    const reaches: ProfileReachInput[] = Array.from({ length: 12 }, (_, index) => ({
      name: `r${index}`,
      section: index % 2 === 0 ? (SECTIONS[0] as ProfileReachInput['section']) : (SECTIONS[1] as ProfileReachInput['section']),
      manningN: index % 2 === 0 ? 0.035 : 0.013,
      bedSlope: index % 2 === 0 ? 0.002 : 0.03,
      lengthM: 60 + 7 * index,
    }));
    const channel: ChannelProfileInput = { reaches, dischargeM3s: 1.5, outlet: { kind: 'free-fall' }, stepControl: { maximumStepLengthM: 100, minimumStepsPerReach: 1, maximumDepthChangeRatio: 0.05 } };
    const reuse = new ProfileReuse();
    const before = computeChannelProfile({ ...channel, reuse });
    const first = { ...reuse.counts };
    // A different slope in the middle reach moves the bed above it up; the drops at the junctions stay 0.
    const edited = withReach(channel, 6, (reach) => ({ ...reach, bedSlope: 0.0015 }));
    reuse.startGeneration();
    const result = computeChannelProfile({ ...edited, reuse });
    expect(readable(result)).toEqual(readable(computeChannelProfile(edited)));
    const reused = reuse.counts.reused - first.reused;
    const computed = reuse.counts.computed - first.computed;
    // 12 flow descriptions, 12 subcritical marches and the supercritical ones: most are taken over.
    // What the edit can reach, by the rule of reach-reuse.ts (not counted from a run): the edited reach r6 (its flow
    // description, its subcritical and supercritical marches: 3), the chute r5 above it, whose foot meets the new
    // water (its two marches: 2; its flow description is unchanged), and the balances at the junctions next to them,
    // r4|r5, r5|r6 and r6|r7, in each pass (6): at most 11. Every other reach and junction must be taken over: the
    // bed above the edit moved, the drops at the junctions did not. Without reuse the channel needs some 50 (12 flow descriptions, 12 subcritical marches, 11 junctions, and the supercritical marches and crossings).
    expect(computed).toBeGreaterThan(0);
    expect(computed).toBeLessThanOrEqual(11);
    expect(reused).toBeGreaterThan(3 * computed);
    // The time of the computations is counted with them (the benchmark reports it), and nothing else is.
    expect(reuse.counts.computedMs).toBeGreaterThan(first.computedMs);
    const afterEdit = { ...reuse.counts };
    reuse.startGeneration();
    computeChannelProfile({ ...edited, reuse });
    expect(reuse.counts.computed).toBe(afterEdit.computed);
    expect(reuse.counts.computedMs).toBe(afterEdit.computedMs);
    // The reaches above r5 stand higher but at the same stations: their summaries and segments, which hold stations
    // and depths only, are the very objects of the first computation (so the analysis compares nothing for them).
    if (!before.converged || !result.converged) throw new Error('expected both profiles');
    for (let index = 0; index <= 4; index++) {
      expect(result.reaches[index]).toBe(before.reaches[index]);
      const segmentsOf = (profile: typeof result) => profile.segments.filter((segment) => segment.reachIndex === index);
      expect(segmentsOf(result).length).toBeGreaterThan(0);
      segmentsOf(result).forEach((segment, position) => expect(segment).toBe(segmentsOf(before)[position]));
    }
  });

  it('a jump moves when the water below it rises, although the supercritical flow reaching it is the same', () => {
    // A steep chute onto a mild apron: raising the outlet level pushes the jump up the apron. The supercritical
    // march on the apron starts from the same depth both times; only the subcritical profile it meets has changed.
    const chute: ProfileReachInput = { name: 'chute', section: SECTIONS[1] as ProfileReachInput['section'], manningN: 0.013, bedSlope: 0.04, lengthM: 40 };
    const apron: ProfileReachInput = { name: 'apron', section: SECTIONS[1] as ProfileReachInput['section'], manningN: 0.013, bedSlope: 0.001, lengthM: 120, downstreamInvertElevationM: 10 };
    const low: ChannelProfileInput = { reaches: [chute, apron], dischargeM3s: 2, outlet: { kind: 'water-level', elevationM: 10.9 } };
    const high: ChannelProfileInput = { ...low, outlet: { kind: 'water-level', elevationM: 11.0 } };
    const reuse = new ProfileReuse();
    const lowJump = computeChannelProfile({ ...low, reuse });
    reuse.startGeneration();
    const highJump = computeChannelProfile({ ...high, reuse });
    expect(readable(highJump)).toEqual(readable(computeChannelProfile(high)));
    if (!lowJump.converged || !highJump.converged) throw new Error('expected both profiles');
    expect(highJump.jumps[0]?.stationM).toBeLessThan(lowJump.jumps[0]?.stationM ?? 0);
  });

  it('a remembered march is not taken over when the step budget left could not have paid for it', () => {
    const channel: ChannelProfileInput = {
      reaches: [{ name: 'long', section: SECTIONS[0] as ProfileReachInput['section'], manningN: 0.03, bedSlope: 0.001, lengthM: 2000 }],
      dischargeM3s: 2,
      outlet: { kind: 'water-level', elevationM: 2.5 },
      stepControl: { maximumStepLengthM: 5 },
    };
    const reuse = new ProfileReuse();
    expect(computeChannelProfile({ ...channel, reuse }).converged).toBe(true);
    const starved = { ...channel, stepControl: { maximumStepLengthM: 5, maximumSteps: 50 } };
    reuse.startGeneration();
    const result = computeChannelProfile({ ...starved, reuse });
    expect(result).toEqual(computeChannelProfile(starved));
    expect(result.converged).toBe(false);
  });

  it('keeps what the current or the previous computation used, and drops what neither did', () => {
    // One flow description per generation of use: computed, taken over the next two times in a row, then left
    // unused for a generation and computed again.
    const reuse = new ProfileReuse();
    const section = SECTIONS[0] as ProfileReachInput['section'];
    let computed = 0;
    const describe = (): never => {
      computed++;
      return { converged: false, reason: 'invalid-input', message: 'counted' } as never;
    };
    const ask = (slope: number): void => void reuse.reachFlow(section, 0.03, slope, 1, 1, describe);
    ask(0.001);
    reuse.startGeneration();
    ask(0.001);
    reuse.startGeneration();
    ask(0.001);
    expect(computed).toBe(1);
    reuse.startGeneration();
    ask(0.002);
    reuse.startGeneration();
    ask(0.001);
    expect(computed).toBe(3);
    // Exact numbers: -0 is not 0 (a horizontal bed written either way is looked up apart).
    ask(-0);
    ask(0);
    expect(computed).toBe(5);
  });
});
