/**
 * The water-surface profile in the analysis: designs in, the model's profiles and the findings they drive out.
 * Each case is an invented design whose outcome is known independently of the code:
 * - backwater: the water surface of a subcritical backwater curve stands at or above the level of the pool that
 *   causes it, everywhere upstream (Chow 1959, Ch. 9: on an M1 curve the depth grows downstream more slowly than
 *   the bed falls; common practice: the "level-pool" lower bound of a backwater profile);
 * - jumps: Belanger's sequent depth y2 / y1 = (sqrt(1 + 8 F1^2) - 1) / 2 in a rectangle (REFERENCES.md, derived)
 *   and the jump types by Froude number (USBR Engineering Monograph 25; Chow 1959 Sec. 15-3; confirmed);
 * - critical depth in a rectangle yc = (q^2 / g)^(1/3) (REFERENCES.md C5, derived);
 * - the profile in the model is the engine's (computeChannelProfile called directly on the same inputs), and the
 *   analysis' coarser step control stays within 1 % of the same method with steps ten times finer (a
 *   convergence check of the method on itself, stated as such).
 */
import { Ajv } from 'ajv';
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import { ANALYSIS_PROFILE_STEP_CONTROL } from '../../language/analysis/channel-profiles.js';
import type { DesignAnalysis, Finding } from '../../language/analysis/model.js';
import {
  GRAVITY_MS2,
  computeChannelProfile,
  trapezoidSection,
  type ChannelProfile,
  type ProfileReachInput,
} from '../../language/hydraulics/index.js';
import { sectionGeometryFromResult } from '../../language/report/section-from-result.js';
import { CHECK_JSON_SCHEMA } from '../../server/cli/check-json-schema.js';
import { CHECK_JSON_SCHEMA_VERSION } from '../../server/cli/check-output.js';
import { buildWorkspace, sampleFiles } from '../language/language-test-kit.js';
import { analyse, expectClose, flowOf, FOOT_M, CFS_M3S, reachOf } from './analysis-test-kit.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';

function findingsWith(analysis: DesignAnalysis, code: string): Finding[] {
  return analysis.findings.filter((finding) => finding.code === code);
}

// ------------------------------------------------------------------------------------------------ backwater

/**
 * A grass ditch (bank 2 ft) running into a deeper channel (bank 4 ft) that ends in a pond. Both fall 0.2 %; the
 * ditch runs from invert 100.00 ft to 99.00 ft over 500 ft, the channel on to 98.40 ft over 300 ft. At 20 cfs the
 * ditch's normal depth is about 1.6 ft (below its bank); a pond at 101.30 ft stands 2.30 ft above the ditch's
 * downstream invert, so the backwater must over-top the ditch there while the channel below keeps its banks.
 */
function pondDesign(pondLevelFt: number): string {
  return `design "Ditch into a pond"
units US
flows { q10 = 20 cfs }
section ditch trapezoid { bottom width 2 ft  side slopes 3:1  bank height 2 ft }
section deep trapezoid { bottom width 4 ft  side slopes 3:1  bank height 4 ft }
lining grass { n 0.035 }
channel c {
  reach upper { section ditch  lining grass  inverts 100.00 ft to 99.00 ft  length 500 ft }
  reach lower { section deep  lining grass  slope 0.2 %  length 300 ft }
  outlet water level ${pondLevelFt} ft
}`;
}

describe('backwater over-topping: normal depth fine, the pond over-tops the ditch', async () => {
  const analysis = await analyse(pondDesign(101.3));
  const upper = flowOf(reachOf(analysis, 'c', 'upper'), 'q10');
  const bankM = 2 * FOOT_M;
  const ditchOutletStationM = 500 * FOOT_M;

  it('has normal depth below the bank (so the uniform-flow check alone would pass)', () => {
    expect(upper.normal?.depth_m ?? Number.POSITIVE_INFINITY).toBeLessThan(bankM);
  });

  it('computes the profile at or above the pond level (level-pool bound), deepest at the ditch outlet', () => {
    const levelPoolDepthM = (101.3 - 99.0) * FOOT_M;
    expect(upper.profile).not.toBeNull();
    expect(upper.profile!.maximumDepth_m).toBeGreaterThanOrEqual(levelPoolDepthM - 1e-9);
    expectClose(upper.profile!.maximumDepthStation_m, ditchOutletStationM, 1e-6, 'station of the deepest water');
    const profile = analysis.channels[0]!.profiles![0]!;
    for (const point of profile.points) expect(point.waterSurface_m).toBeGreaterThanOrEqual(101.3 * FOOT_M - 1e-9);
  });

  it('reports over-topping at the ditch, judged on the profile, saying where by station in feet', () => {
    const finding = upper.findings.find((candidate) => candidate.code === 'overtopping');
    expect(finding?.severity).toBe('error');
    expect(finding?.data['judgedOn']).toBe('profile');
    expectClose(finding?.data['station_m'] as number, ditchOutletStationM, 1e-6, 'finding station');
    expect(finding?.data['normalDepth_m']).toBeLessThan(bankM);
    expect(finding?.message).toContain('station 500 ft');
    expect(finding?.message).toMatch(/Normal depth [\d.]+ ft alone would not over-top: backwater raises the water here \(M1 curve\)/);
    // The over-topped stretch ends at the ditch outlet and starts where the surface climbs past the bank.
    expectClose(finding?.data['toStation_m'] as number, ditchOutletStationM, 1e-6, 'end of the over-topped stretch');
    expect(finding?.data['fromStation_m']).toBeLessThan(ditchOutletStationM);
  });

  it('keeps the deeper channel below within its banks (pond 2.9 ft deep at the outlet, bank 4 ft)', () => {
    const lower = flowOf(reachOf(analysis, 'c', 'lower'), 'q10');
    expect(lower.findings.map((finding) => finding.code)).not.toContain('overtopping');
    expectClose(lower.profile?.maximumDepth_m, (101.3 - 98.4) * FOOT_M, 1e-6, 'depth at the outlet');
  });

  it('negative twin: a pond at 100.50 ft leaves the ditch in its banks', async () => {
    const low = await analyse(pondDesign(100.5));
    expect(findingsWith(low, 'overtopping')).toEqual([]);
  });
});

describe('freeboard judged on the profile where backwater raises the water', async () => {
  // The same ditch with a 0.5 ft freeboard required and a pond 1.85 ft above the ditch outlet: within the bank,
  // but leaving less than the freeboard there.
  const analysis = await analyse(pondDesign(100.85).replace('units US', 'units US\ncriteria { freeboard 0.5 ft }'));
  const upper = flowOf(reachOf(analysis, 'c', 'upper'), 'q10');

  it('warns with the freeboard left at the deepest point and its station', () => {
    const finding = upper.findings.find((candidate) => candidate.code === 'freeboard-below-required');
    expect(finding?.severity).toBe('warning');
    expect(finding?.data['judgedOn']).toBe('profile');
    expectClose(finding?.data['required_m'] as number, 0.5 * FOOT_M, 1e-12, 'required freeboard');
    // Freeboard left <= bank - level-pool depth = 2 - 1.85 ft.
    expect(finding?.data['actual_m']).toBeLessThanOrEqual(0.15 * FOOT_M + 1e-9);
    expect(finding?.message).toContain('station 500 ft');
  });
});

// ------------------------------------------------------------------------------------------------ engine identity

describe('the profile in the model is computeChannelProfile on the same inputs', async () => {
  const analysis = await analyse(pondDesign(101.3));
  const modelProfile = analysis.channels[0]!.profiles![0]!;
  // The design's inputs, converted to SI by hand.
  const slopeUpper = (100 * FOOT_M - 99 * FOOT_M) / (500 * FOOT_M);
  const reaches: ProfileReachInput[] = [
    {
      name: 'upper',
      section: trapezoidSection({ bottomWidthM: 2 * FOOT_M, leftSideSlopeHV: 3, rightSideSlopeHV: 3 }),
      manningN: 0.035,
      bedSlope: slopeUpper,
      lengthM: 500 * FOOT_M,
      downstreamInvertElevationM: 99 * FOOT_M,
      bankHeightM: 2 * FOOT_M,
    },
    {
      name: 'lower',
      section: trapezoidSection({ bottomWidthM: 4 * FOOT_M, leftSideSlopeHV: 3, rightSideSlopeHV: 3 }),
      manningN: 0.035,
      bedSlope: 0.002,
      lengthM: 300 * FOOT_M,
      downstreamInvertElevationM: 99 * FOOT_M - 0.002 * 300 * FOOT_M,
      bankHeightM: 4 * FOOT_M,
    },
  ];
  const direct = computeChannelProfile({ reaches, dischargeM3s: 20 * CFS_M3S, outlet: { kind: 'water-level', elevationM: 101.3 * FOOT_M }, stepControl: ANALYSIS_PROFILE_STEP_CONTROL });

  it('has the same points: station, depth, water surface, velocity and Froude number (to 1e-9)', () => {
    expect(direct.converged).toBe(true);
    const engine = direct as ChannelProfile;
    expect(modelProfile.points).toHaveLength(engine.points.length);
    engine.points.forEach((point, index) => {
      const model = modelProfile.points[index]!;
      expect(model.reach).toBe(point.reachName);
      expectClose(model.station_m, point.stationM, 1e-9, `station ${index}`);
      expectClose(model.depth_m, point.depthM, 1e-9, `depth ${index}`);
      expectClose(model.waterSurface_m, point.waterSurfaceElevationM, 1e-9, `water surface ${index}`);
      expectClose(model.velocity_mps, point.velocityMs, 1e-9, `velocity ${index}`);
      expectClose(model.froudeNumber, point.froudeNumber, 1e-9, `Froude number ${index}`);
    });
  });

  it('has the same segments, and each reach the same deepest water and over-topped stretch', () => {
    const engine = direct as ChannelProfile;
    expect(modelProfile.segments.map((segment) => segment.profileClass)).toEqual(engine.segments.map((segment) => segment.profileClass));
    engine.reaches.forEach((summary) => {
      const share = flowOf(reachOf(analysis, 'c', summary.reachName), 'q10').profile!;
      expectClose(share.maximumDepth_m, summary.maximumDepthM, 1e-9, `${summary.reachName} deepest`);
      expect(share.overtoppedRanges).toHaveLength(summary.overtoppedRanges.length);
    });
  });
});

// ------------------------------------------------------------------------------------------------ jumps

/**
 * A concrete flume 2 m wide carrying 4 m3/s: a chute at 4 % (normal depth about 0.35 m, Froude number about 3)
 * onto a mild reach at 0.1 % (normal depth about 1.3 m). yc = (q^2 / g)^(1/3) with q = 2 m2/s.
 */
function flumeDesign(options: { mildLengthM: number; outlet: string; liningLimits?: string }): string {
  return `design "Flume"
units SI
flows { q = 4 m3/s }
section flume rectangle { bottom width 2 m  bank height 2.5 m }
lining concrete { n 0.014 ${options.liningLimits ?? ''} }
channel c {
  reach chute { section flume  lining concrete  inverts 110 m to 108 m  length 50 m }
  reach mild { section flume  lining concrete  slope 0.1 %  length ${options.mildLengthM} m }
  ${options.outlet}
}`;
}

const FLUME_CRITICAL_DEPTH_M = Math.cbrt(2 ** 2 / GRAVITY_MS2);

function jumpTypeOf(froude: number): string {
  if (froude < 1.7) return 'undular';
  if (froude < 2.5) return 'weak';
  if (froude < 4.5) return 'oscillating';
  if (froude < 9) return 'steady';
  return 'strong';
}

describe('a jump at the foot of a chute', async () => {
  const analysis = await analyse(flumeDesign({ mildLengthM: 200, outlet: 'outlet normal depth' }));
  const profile = analysis.channels[0]!.profiles![0]!;
  const jump = profile.jumps[0];

  it('stands in the mild reach, held there (not swept out)', () => {
    expect(profile.jumps).toHaveLength(1);
    expect(jump?.reach).toBe('mild');
    expect(jump?.placement).toBe('within-reach');
    expect(jump?.sweptOut).toBe(false);
    expect(jump?.supercriticalFrom).toBe('chute');
  });

  it("has Belanger's sequent depth for its entering depth and Froude number (within 1e-6)", () => {
    const y1 = jump!.upstreamDepth_m;
    const froude = jump!.upstreamFroudeNumber;
    expectClose(froude, 2 / y1 / Math.sqrt(GRAVITY_MS2 * y1), 1e-9, 'F1 = q / (y1 sqrt(g y1))');
    expectClose(jump!.downstreamDepth_m / y1, (Math.sqrt(1 + 8 * froude * froude) - 1) / 2, 1e-6, 'y2 / y1');
    expect(y1).toBeLessThan(FLUME_CRITICAL_DEPTH_M);
    expect(jump!.downstreamDepth_m).toBeGreaterThan(FLUME_CRITICAL_DEPTH_M);
  });

  it('is typed by its Froude number (USBR EM 25) and reported as information, with its station', () => {
    expect(jump!.jumpType).toBe(jumpTypeOf(jump!.upstreamFroudeNumber));
    const finding = flowOf(reachOf(analysis, 'c', 'mild'), 'q').findings.find((candidate) => candidate.code === 'hydraulic-jump');
    expect(finding?.severity).toBe('information');
    expectClose(finding?.data['station_m'] as number, jump!.station_m, 1e-9, 'finding station');
    expect(finding?.message).toContain(`station ${Number(jump!.station_m.toPrecision(3))} m`);
    expect(finding?.message).toContain(`${jump!.jumpType} jump`);
    expect(finding?.message).toMatch(/states no permissible velocity or shear/);
  });

  it("warns when the entering flow is faster than the lining permits; quiet with a lining that takes it", async () => {
    const weak = await analyse(flumeDesign({ mildLengthM: 200, outlet: 'outlet normal depth', liningLimits: 'permissible velocity 3 m/s' }));
    const warning = findingsWith(weak, 'hydraulic-jump-lining-exceeded');
    expect(warning).toHaveLength(1);
    expect(warning[0]?.severity).toBe('warning');
    expect(warning[0]?.reach).toBe('mild');
    // V1 = q / y1 > 3 m/s since y1 < yc and q / yc = 2.7 m/s... and the message says what was exceeded.
    expect(warning[0]?.data['enteringVelocity_mps']).toBeGreaterThan(3);
    expect(warning[0]?.message).toMatch(/enters at [\d.]+ m\/s where the lining permits 3 m\/s/);
    const strong = await analyse(flumeDesign({ mildLengthM: 200, outlet: 'outlet normal depth', liningLimits: 'permissible velocity 20 m/s' }));
    expect(findingsWith(strong, 'hydraulic-jump-lining-exceeded')).toEqual([]);
    expect(findingsWith(strong, 'hydraulic-jump')).toHaveLength(1);
  });
});

describe('a jump swept out', () => {
  it('no jump in the channel: a 5 m mild reach and a free fall let the supercritical flow run out (warning)', async () => {
    const analysis = await analyse(flumeDesign({ mildLengthM: 5, outlet: 'outlet free fall' }));
    const swept = findingsWith(analysis, 'hydraulic-jump-swept-out');
    expect(swept).toHaveLength(1);
    expect(swept[0]?.severity).toBe('warning');
    expect(swept[0]?.reach).toBe('mild');
    expect(swept[0]?.data['placement']).toBe('no-jump');
    expect(swept[0]?.data['exitDepth_m']).toBeLessThan(FLUME_CRITICAL_DEPTH_M);
    expect(swept[0]?.message).toMatch(/no hydraulic jump forms in the channel/);
  });

  // The mild reach ends at 108 m - 0.1 % x 5 m = 107.995 m, so a level of 108.895 m is 0.9 m deep there.
  it('beyond the outlet: tailwater 0.9 m deep, above yc but below the sequent depth', async () => {
    const analysis = await analyse(flumeDesign({ mildLengthM: 5, outlet: 'outlet water level 108.895 m' }));
    const swept = findingsWith(analysis, 'hydraulic-jump-swept-out');
    expect(swept).toHaveLength(1);
    expect(swept[0]?.data['placement']).toBe('beyond-outlet');
    const y1 = swept[0]?.data['upstreamDepth_m'] as number;
    const froude = 2 / y1 / Math.sqrt(GRAVITY_MS2 * y1);
    expect((y1 * (Math.sqrt(1 + 8 * froude * froude) - 1)) / 2).toBeGreaterThan(0.9);
    expect(swept[0]?.message).toMatch(/too low to hold the hydraulic jump/);
  });

  it('negative twin: the 200 m mild reach holds the jump, nothing is swept out', async () => {
    expect(findingsWith(await analyse(flumeDesign({ mildLengthM: 200, outlet: 'outlet free fall' })), 'hydraulic-jump-swept-out')).toEqual([]);
  });
});

// ------------------------------------------------------------------------------------------------ no profile, partial profile

describe('where no profile, or only part of one, can be computed', () => {
  it('says so at the outlet when a water level has no invert elevations to stand on', async () => {
    const text = `design "No datum"
units SI
flows { q = 0.5 m3/s }
section ditch trapezoid { bottom width 1 m  side slopes 2:1  bank height 1 m }
lining grass { n 0.03 }
channel c {
  reach r { section ditch  lining grass  slope 0.5 %  length 100 m }
  outlet water level 52 m
}`;
    const analysis = await analyse(text);
    const finding = findingsWith(analysis, 'profile-not-computed')[0];
    expect(finding?.severity).toBe('warning');
    expect(finding?.location.range.start.line).toBe(text.split('\n').findIndex((line) => line.includes('outlet water level')));
    expect(finding?.message).toMatch(/no reach of the channel gives invert elevations/);
    expect(analysis.channels[0]!.profiles![0]!.computed).toBe(false);
    expect(flowOf(reachOf(analysis, 'c', 'r'), 'q').profile).toBeNull();
  });

  // A 0.6 m pipe (0.3 m3/s, below its full-flow capacity at 0.5 %) into a channel ending in a pond at 101.0 m:
  // the pond stands 1.0 m above the pipe's outlet invert (100.0 m), higher than the pipe.
  const pipeText = `design "Pipe into a pond"
units SI
flows { q = 0.3 m3/s }
section pipe circle { diameter 0.6 m }
section ditch trapezoid { bottom width 1 m  side slopes 2:1  bank height 1.5 m }
lining concrete { n 0.013 }
channel c {
  reach culvert { section pipe  lining concrete  inverts 100.25 m to 100.0 m  length 50 m }
  reach outfall { section ditch  lining concrete  slope 0.2 %  length 100 m }
  outlet water level 101.0 m
}`;

  it('reports a conduit filled by backwater, and keeps the profile of the reaches below it', async () => {
    const analysis = await analyse(pipeText);
    const culvert = flowOf(reachOf(analysis, 'c', 'culvert'), 'q');
    expect(culvert.findings.map((finding) => finding.code)).not.toContain('conduit-over-capacity');
    const surcharge = culvert.findings.find((finding) => finding.code === 'conduit-surcharged');
    expect(surcharge?.severity).toBe('warning');
    expect(culvert.profile).toBeNull();
    const profile = analysis.channels[0]!.profiles![0]!;
    expect(profile.computed).toBe(true);
    expect(profile.failure?.reason).toBe('conduit-surcharged');
    // The points of the part below are still built only when read, as for any computed profile (analysis speed).
    expect(Object.getOwnPropertyDescriptor(profile, 'points')?.get).toBeTypeOf('function');
    expect(profile.points[0]?.station_m).toBeCloseTo(50, 9);
    const outfall = flowOf(reachOf(analysis, 'c', 'outfall'), 'q').profile;
    // Level pool: at least 101.0 - 100.0 m deep at the head of the outfall reach.
    expect(outfall?.maximumDepth_m).toBeGreaterThanOrEqual(1.0 - 1e-9);
  });

  it('negative twin: with the pond at 100.3 m the pipe flows part full and the profile covers the whole channel', async () => {
    const analysis = await analyse(pipeText.replace('outlet water level 101.0 m', 'outlet water level 100.3 m'));
    expect(findingsWith(analysis, 'conduit-surcharged')).toEqual([]);
    expect(analysis.channels[0]!.profiles![0]!.failure).toBeNull();
    expect(flowOf(reachOf(analysis, 'c', 'culvert'), 'q').profile?.maximumDepth_m).toBeLessThan(0.6);
  });
});

// ------------------------------------------------------------------------------------------------ discharge changes

describe('a flow whose discharge changes along the channel', async () => {
  // A culvert adds 0.4 m3/s at the head of the second reach; both reaches mild, the outlet at normal depth.
  const analysis = await analyse(`design "Inflow"
units SI
flows { q = 0.6 m3/s }
section ditch trapezoid { bottom width 1 m  side slopes 2:1  bank height 1.2 m }
lining grass { n 0.03 }
channel c {
  reach upper { section ditch  lining grass  inverts 20.5 m to 20.2 m  length 150 m }
  reach lower { section ditch  lining grass  slope 0.2 %  length 150 m  flows { q = 1.0 m3/s } }
  outlet normal depth
}`);
  const profile = analysis.channels[0]!.profiles![0]!;

  it('is computed through both reaches, joined at the same water level where the discharge changes', () => {
    expect(profile.computed).toBe(true);
    const lastUpper = [...profile.points].reverse().find((point) => point.reach === 'upper')!;
    const firstLower = profile.points.find((point) => point.reach === 'lower')!;
    expectClose(lastUpper.station_m, 150, 1e-9, 'end of the upper reach');
    expectClose(firstLower.station_m, 150, 1e-9, 'head of the lower reach');
    expectClose(lastUpper.waterSurface_m, firstLower.waterSurface_m, 1e-9, 'water level at the change');
  });

  it('carries each discharge in its own reach (velocity x area = Q at every point)', () => {
    for (const point of profile.points) {
      const dischargeM3s = point.reach === 'upper' ? 0.6 : 1.0;
      const areaM2 = (1 + 2 * point.depth_m) * point.depth_m;
      expectClose(point.velocity_mps * areaM2, dischargeM3s, 1e-9, `Q at station ${point.station_m}`);
    }
  });
});

// ------------------------------------------------------------------------------------------------ samples

describe('the samples', async () => {
  const { documents } = await buildWorkspace(sampleFiles());
  const analyses = documents.map((document) => analyzeDocument(document, NO_CRITERIA_DEFAULTS));
  const canal = analyses.find((analysis) => analysis.uri.endsWith('irrigation-canal.runnel'))!;

  it('the irrigation canal shows backwater over-topping a reach whose normal depth is well within its bank', () => {
    const drop = reachOf(canal, 'lateral', 'drop');
    const caught = drop.flows.map((flow) => ({ flow, finding: flow.findings.find((finding) => finding.code === 'overtopping' && finding.data['judgedOn'] === 'profile') })).find((item) => item.finding !== undefined);
    expect(caught).toBeDefined();
    expect(caught!.flow.normal!.depth_m).toBeLessThan(drop.section.bankDepth_m!);
    expect(caught!.finding!.message).toMatch(/at station [\d,.]+ m/);
    // The drain's level (1412.10 m) less the chute's foot invert (1412.41 m - 4 % x 40 m = 1410.81 m) is 1.29 m
    // above the 1.2 m wall: the level-pool bound alone over-tops the foot of the chute.
    expect(caught!.flow.profile!.maximumDepth_m).toBeGreaterThanOrEqual(1412.1 - (1412.41 - 0.04 * 40) - 1e-9);
  });

  /**
   * The analysis' step control against the same method with steps ten times finer, on every sample channel and
   * flow of constant discharge: each reach's deepest water within 1 %.
   */
  it('keep every reach\'s deepest water within 1 % of a ten times finer computation', () => {
    const fine = { maximumStepLengthM: ANALYSIS_PROFILE_STEP_CONTROL.maximumStepLengthM / 10, minimumStepsPerReach: 20, maximumDepthChangeRatio: ANALYSIS_PROFILE_STEP_CONTROL.maximumDepthChangeRatio / 10 };
    let compared = 0;
    for (const analysis of analyses) {
      for (const channel of analysis.channels) {
        for (const profile of channel.profiles ?? []) {
          const flows = channel.reaches.map((reach) => reach.flows.find((flow) => flow.flow === profile.flow));
          if (!profile.computed || profile.failure !== null || new Set(flows.map((flow) => flow?.discharge_m3s)).size !== 1 || channel.outlet === null) continue;
          const reaches: ProfileReachInput[] = channel.reaches.map((reach) => {
            const rebuilt = sectionGeometryFromResult(reach.section);
            if (!rebuilt.ok) throw new Error(rebuilt.reason);
            const invert = profile.points.filter((point) => point.reach === reach.name).at(-1)!.invert_m;
            return { name: reach.name, section: rebuilt.geometry, manningN: reach.lining.manningN, bedSlope: reach.slope, lengthM: reach.length_m, downstreamInvertElevationM: invert, ...(reach.section.bankDepth_m === null ? {} : { bankHeightM: reach.section.bankDepth_m }) };
          });
          const outlet = channel.outlet.kind === 'water-level' ? { kind: 'water-level' as const, elevationM: channel.outlet.elevation_m } : channel.outlet;
          const reference = computeChannelProfile({ reaches, dischargeM3s: flows[0]!.discharge_m3s, outlet, stepControl: fine });
          expect(reference.converged, `${channel.name} ${profile.flow}`).toBe(true);
          (reference as ChannelProfile).reaches.forEach((summary) => {
            const share = flows[summary.reachIndex]!.profile!;
            const error = Math.abs(share.maximumDepth_m - summary.maximumDepthM) / summary.maximumDepthM;
            expect(error, `${channel.name} ${profile.flow} ${summary.reachName}: ${share.maximumDepth_m} vs ${summary.maximumDepthM}`).toBeLessThanOrEqual(0.01);
            compared++;
          });
        }
      }
    }
    expect(compared).toBeGreaterThan(5);
  });
});

// ------------------------------------------------------------------------------------------------ JSON output

describe('the profiles in `runnel check --format json`', () => {
  it('match the documented schema, for whole, partial and missing profiles alike', async () => {
    const designs = [
      ...Object.entries(sampleFiles()).filter(([name]) => name !== 'linings.runnel').map(([, text]) => text),
      pondDesign(101.3),
      flumeDesign({ mildLengthM: 5, outlet: 'outlet water level 108.895 m' }),
      flumeDesign({ mildLengthM: 5, outlet: 'outlet free fall' }),
    ];
    const ajv = new Ajv({ allErrors: true, strict: false });
    const validate = ajv.compile(CHECK_JSON_SCHEMA);
    const { documents } = await buildWorkspace({ ...Object.fromEntries(designs.map((text, index) => [`d${index}.runnel`, text])), 'linings.runnel': sampleFiles()['linings.runnel'] ?? '' });
    const tally = { errors: 0, warnings: 0, information: 0 };
    const files = documents
      .filter((document) => !document.uri.path.endsWith('linings.runnel'))
      .map((document) => ({ path: document.uri.path, uri: document.uri.toString(), summary: tally, diagnostics: [], analysis: JSON.parse(JSON.stringify(analyzeDocument(document, NO_CRITERIA_DEFAULTS))) as unknown }));
    const output = { schemaVersion: CHECK_JSON_SCHEMA_VERSION, tool: { name: 'runnel', version: '0' }, caution: 'c', summary: { ...tally, files: files.length }, files };
    expect(validate(output), JSON.stringify(validate.errors?.slice(0, 5))).toBe(true);
    const profiles = files.flatMap((file) => (file.analysis as DesignAnalysis).channels.flatMap((channel) => channel.profiles ?? []));
    expect(profiles.some((profile) => profile.failure?.reason === 'conduit-surcharged' && profile.computed)).toBe(true);
    expect(profiles.some((profile) => profile.jumps.some((jump) => jump.placement === 'beyond-outlet'))).toBe(true);
  });
});
