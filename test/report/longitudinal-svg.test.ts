/**
 * The longitudinal view, read back from its own markup: the bed follows the inverts and slopes, each flow's
 * normal- and critical-depth lines stand at the engine's depths above it, and a computed water-surface profile
 * with a hydraulic jump (direct-step method, Chow 1959 Sec. 10-2; sequent depth by Belanger's equation, derived)
 * lands where its stations and depths say. Profiles reach the view as the analysis model carries them
 * (ChannelResult.profiles); the last block draws the profile of a design analysed end to end.
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import type { ChannelFlowProfile, ChannelResult, HydraulicJumpResult, ProfilePointResult } from '../../language/analysis/model.js';
import { GRAVITY_MS2, solveNormalDepth, type SectionGeometry } from '../../language/hydraulics/index.js';
import { placeReaches, renderLongitudinalSvg } from '../../language/report/longitudinal-svg.js';
import { buildText } from '../language/language-test-kit.js';
import { buildAnalysis, fixtureGeometry, siDesign } from './fixtures.js';
import { axisFromTicks, byRole, numberAttribute, parseMarkup, pathVertices, type MarkupElement } from './svg-query.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';

const PIXEL_TOLERANCE = 0.6;

function draw(channel: ChannelResult) {
  const parsed = parseMarkup(renderLongitudinalSvg(channel, 'SI', { id: 'test-long' }));
  return { ...parsed, x: axisFromTicks(parsed.elements, 'x'), y: axisFromTicks(parsed.elements, 'y') };
}

function segments(element: MarkupElement | undefined): { start: { x: number; y: number }; end: { x: number; y: number } }[] {
  const vertices = pathVertices(element?.attributes['d'] ?? '');
  const result = [];
  for (let index = 0; index + 1 < vertices.length; index += 2) result.push({ start: vertices[index]!, end: vertices[index + 1]! });
  return result;
}

describe('longitudinal view', () => {
  const ditch = siDesign().channels[0]!;
  const drawing = draw(ditch);
  // Inverts: 52.40 m given at the top; each reach falls by slope x length (120 m at 0.8 %, 180 m at 0.5 %, 40 m at 4 %).
  const stations = [0, 120, 300, 340];
  const beds = [52.4, 52.4 - 0.008 * 120, 52.4 - 0.008 * 120 - 0.005 * 180, 52.4 - 0.008 * 120 - 0.005 * 180 - 0.04 * 40];

  it('is well-formed, with linear axes', () => {
    expect(drawing.problems).toEqual([]);
    expect(drawing.x.misfitPx).toBeLessThan(0.02);
    expect(drawing.y.misfitPx).toBeLessThan(0.02);
  });

  it('draws the bed through the inverts built from the upstream invert, slopes and lengths', () => {
    const vertices = pathVertices(byRole(drawing.elements, 'bed')[0]?.attributes['d'] ?? '');
    expect(vertices).toHaveLength(6);
    const expected = [0, 1, 1, 2, 2, 3];
    vertices.forEach((vertex, index) => {
      const point = expected[index]!;
      expect(Math.abs(vertex.x - drawing.x.toPx(stations[point]!))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
      expect(Math.abs(vertex.y - drawing.y.toPx(beds[point]!))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
    });
    const boundaries = byRole(drawing.elements, 'reach-boundary').map((line) => numberAttribute(line, 'data-station-m'));
    expect(boundaries).toEqual([120, 300]);
  });

  for (const flowName of ['q10', 'q100']) {
    it(`${flowName}: normal- and critical-depth lines stand at the engine's depths above the bed in every reach`, () => {
      for (const [role, kind] of [
        ['normal-depth-line', 'normal'],
        ['critical-depth-line', 'critical'],
      ] as const) {
        const path = byRole(drawing.elements, role, flowName)[0];
        expect(path?.attributes['data-reach-indices']).toBe('0 1 2');
        segments(path).forEach((segment, reachIndex) => {
          const reach = ditch.reaches[reachIndex]!;
          const flow = reach.flows.find((candidate) => candidate.flow === flowName)!;
          const depthM = kind === 'normal' ? flow.normal!.depth_m : flow.critical!.depth_m;
          expect(Math.abs(segment.start.y - drawing.y.toPx(beds[reachIndex]! + depthM))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
          expect(Math.abs(segment.end.y - drawing.y.toPx(beds[reachIndex + 1]! + depthM))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
          expect(Math.abs(segment.start.x - drawing.x.toPx(stations[reachIndex]!))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
        });
      }
    });
  }

  it('draws bank tops at bank height above the bed, and the free-fall outlet', () => {
    const bankHeights = ditch.reaches.map((reach) => reach.section.bankDepth_m!);
    segments(byRole(drawing.elements, 'bank-top')[0]).forEach((segment, index) => {
      expect(Math.abs(segment.start.y - drawing.y.toPx(beds[index]! + bankHeights[index]!))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
    });
    expect(byRole(drawing.elements, 'outlet-free-fall')).toHaveLength(1);
    expect(byRole(drawing.elements, 'outlet-label')[0]?.text).toBe('outlet: free fall');
  });

  it('marks an outlet water level at its elevation', () => {
    const culvertLine = siDesign().channels[1]!;
    const view = draw(culvertLine);
    const level = byRole(view.elements, 'outlet-water-level')[0];
    expect(Math.abs(numberAttribute(level, 'y1') - view.y.toPx(49.35))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
    expect(byRole(view.elements, 'outlet-label')[0]?.text).toBe('outlet: water level 49.35 m');
  });

  it('without any invert, plots elevations relative to the outlet invert and says so', () => {
    const relative: ChannelResult = { ...ditch, reaches: ditch.reaches.map((reach) => ({ ...reach, upstreamInvert_m: null, downstreamInvert_m: null })) };
    expect(placeReaches(relative).datum).toBe('relative-to-outlet');
    const view = draw(relative);
    expect(byRole(view.elements, 'y-axis-label')[0]?.text).toBe('elevation relative to outlet invert (m)');
    const vertices = pathVertices(byRole(view.elements, 'bed')[0]?.attributes['d'] ?? '');
    expect(Math.abs(vertices[vertices.length - 1]!.y - view.y.toPx(0))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
    expect(Math.abs(vertices[0]!.y - view.y.toPx(beds[0]! - beds[3]!))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
  });

  it('says why a channel of zero length is not drawn', () => {
    const empty: ChannelResult = { ...ditch, reaches: [] };
    const parsed = parseMarkup(renderLongitudinalSvg(empty, 'SI', { id: 'empty' }));
    expect(byRole(parsed.elements, 'not-drawn-reason')[0]?.text).toBe('Not drawn: the channel has no reach with a length.');
  });
});

/**
 * A steep rectangular chute onto a mild one, both 1.0 m wide, n = 0.014, Q = 1.0 m3/s (invented). The mild
 * reach's normal depth exceeds the sequent depth of the chute's normal depth, so the jump stands on the chute:
 * an S1 curve rises from the sequent depth at the jump to the mild normal depth at the slope break. The S1 curve
 * is computed here by the direct-step method (Chow 1959, Sec. 10-2), the sequent depth by Belanger's equation
 * y2 = y1 (sqrt(1 + 8 F1^2) - 1) / 2 (REFERENCES.md, derived).
 */
describe('longitudinal view with a computed water-surface profile', () => {
  const widthM = 1.0;
  const manningN = 0.014;
  const dischargeM3s = 1.0;
  const steepSlope = 0.03;
  const mildSlope = 0.001;
  const steepLengthM = 60;
  const mildLengthM = 100;
  const geometry: SectionGeometry = fixtureGeometry('rectangle', { bottomWidth_m: widthM });
  const normalDepth = (slope: number): number => {
    const result = solveNormalDepth(geometry, { dischargeM3s, manningN, bedSlope: slope });
    if (!result.converged) throw new Error('no normal depth');
    return result.depthM;
  };
  const steepNormalM = normalDepth(steepSlope);
  const mildNormalM = normalDepth(mildSlope);
  const froude = dischargeM3s / (widthM * steepNormalM) / Math.sqrt(GRAVITY_MS2 * steepNormalM);
  const sequentM = (steepNormalM * (Math.sqrt(1 + 8 * froude * froude) - 1)) / 2;

  const energy = (y: number): number => y + (dischargeM3s / (widthM * y)) ** 2 / (2 * GRAVITY_MS2);
  const frictionSlope = (y: number): number => {
    const area = widthM * y;
    const radius = area / (widthM + 2 * y);
    return ((manningN * dischargeM3s) / (area * radius ** (2 / 3))) ** 2;
  };
  // S1 from the slope break (station = steepLengthM, depth = mild normal depth) upstream to the sequent depth.
  const s1: { station_m: number; depth_m: number }[] = [{ station_m: steepLengthM, depth_m: mildNormalM }];
  const steps = 40;
  for (let index = 1; index <= steps; index++) {
    const previous = s1[s1.length - 1]!;
    const depth = mildNormalM + ((sequentM - mildNormalM) * index) / steps;
    const meanFriction = (frictionSlope(depth) + frictionSlope(previous.depth_m)) / 2;
    s1.push({ station_m: previous.station_m + (energy(depth) - energy(previous.depth_m)) / (steepSlope - meanFriction), depth_m: depth });
  }
  const jumpStationM = s1[s1.length - 1]!.station_m;
  const bedAt = (stationM: number): number => (stationM <= steepLengthM ? 20 - steepSlope * stationM : 20 - steepSlope * steepLengthM - mildSlope * (stationM - steepLengthM));
  const depths = [
    { station_m: 0, depth_m: steepNormalM },
    { station_m: jumpStationM, depth_m: steepNormalM },
    ...[...s1].reverse(),
    { station_m: steepLengthM + mildLengthM, depth_m: mildNormalM },
  ];
  const points: ProfilePointResult[] = depths.map((point, index) => ({
    ...point,
    reach: point.station_m < steepLengthM || (point.station_m === steepLengthM && index < depths.length - 2) ? 'chute' : 'apron-channel',
    invert_m: bedAt(point.station_m),
    waterSurface_m: bedAt(point.station_m) + point.depth_m,
    velocity_mps: dischargeM3s / (widthM * point.depth_m),
    froudeNumber: dischargeM3s / (widthM * point.depth_m) / Math.sqrt(GRAVITY_MS2 * point.depth_m),
  }));
  const jump: HydraulicJumpResult = {
    station_m: jumpStationM,
    reach: 'chute',
    placement: 'within-reach',
    upstreamDepth_m: steepNormalM,
    downstreamDepth_m: sequentM,
    upstreamFroudeNumber: froude,
    upstreamVelocity_mps: dischargeM3s / (widthM * steepNormalM),
    energyLoss_m: energy(steepNormalM) - energy(sequentM),
    jumpType: 'oscillating',
    supercriticalFrom: 'chute',
    sweptOut: false,
    nearCritical: false,
    description: 'invented for the drawing',
  };
  const profileOf = (pointList: ProfilePointResult[], jumps: HydraulicJumpResult[]): ChannelFlowProfile => ({
    flow: 'q100',
    computed: true,
    failure: null,
    datum: 'absolute',
    points: pointList,
    segments: [],
    jumps,
    notes: [],
    maximumEnergyResidual_m: 0,
    provenance: { method: '', assumptions: [], references: [] },
  });

  const analysis = buildAnalysis({
    title: 'Chute onto a mild channel',
    system: 'SI',
    channels: [
      {
        name: 'spillway-channel',
        outlet: { kind: 'normal-depth' },
        reaches: [
          { channel: 'spillway-channel', name: 'chute', sectionName: 'r1', shape: 'rectangle', dimensions: { bottomWidth_m: widthM }, bankDepth_m: 1.2, liningName: 'concrete', manningN, slope: steepSlope, length_m: steepLengthM, upstreamInvert_m: 20, requiredFreeboard_m: 0.15, flows: [{ flow: 'q100', description: null, discharge_m3s: dischargeM3s }], line: 4 },
          { channel: 'spillway-channel', name: 'apron-channel', sectionName: 'r1', shape: 'rectangle', dimensions: { bottomWidth_m: widthM }, bankDepth_m: 1.2, liningName: 'concrete', manningN, slope: mildSlope, length_m: mildLengthM, requiredFreeboard_m: 0.15, flows: [{ flow: 'q100', description: null, discharge_m3s: dischargeM3s }], line: 9 },
        ],
      },
    ],
  });
  const channel: ChannelResult = { ...analysis.channels[0]!, profiles: [profileOf(points, [jump])] };
  const view = draw(channel);

  it('the scenario has its jump on the chute (mild normal depth above the sequent depth)', () => {
    expect(mildNormalM).toBeGreaterThan(sequentM);
    expect(jumpStationM).toBeGreaterThan(0);
    expect(jumpStationM).toBeLessThan(steepLengthM);
  });

  it('draws the profile through every computed point', () => {
    expect(view.problems).toEqual([]);
    const vertices = pathVertices(byRole(view.elements, 'water-surface-profile', 'q100')[0]?.attributes['d'] ?? '');
    expect(vertices).toHaveLength(points.length);
    vertices.forEach((vertex, index) => {
      const point = points[index]!;
      expect(Math.abs(vertex.x - view.x.toPx(point.station_m))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
      expect(Math.abs(vertex.y - view.y.toPx(bedAt(point.station_m) + point.depth_m))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
    });
  });

  it('marks the jump from the supercritical depth up to the sequent depth at its station', () => {
    const jump = byRole(view.elements, 'hydraulic-jump', 'q100')[0];
    expect(numberAttribute(jump, 'data-station-m')).toBeCloseTo(jumpStationM, 9);
    const jumpPath = view.elements[view.elements.indexOf(jump!) + 1];
    const [low, high] = pathVertices(jumpPath?.attributes['d'] ?? '');
    expect(Math.abs(low!.x - view.x.toPx(jumpStationM))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
    expect(Math.abs(low!.y - view.y.toPx(bedAt(jumpStationM) + steepNormalM))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
    expect(Math.abs(high!.y - view.y.toPx(bedAt(jumpStationM) + sequentM))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
  });

  it('ignores malformed profile points rather than drawing NaN', () => {
    const broken: ChannelResult = {
      ...channel,
      profiles: [profileOf([...points, { ...points[0]!, station_m: Number.NaN }, { ...points[1]!, waterSurface_m: Number.POSITIVE_INFINITY, depth_m: Number.POSITIVE_INFINITY }], [])],
    };
    const svg = renderLongitudinalSvg(broken, 'SI', { id: 'broken' });
    expect(svg).not.toMatch(/NaN|Infinity/);
    expect(pathVertices(byRole(parseMarkup(svg).elements, 'water-surface-profile')[0]?.attributes['d'] ?? '')).toHaveLength(points.length);
  });
});

/**
 * A design analysed end to end (invented): a concrete chute onto a mild lined channel ending in a pond, so the
 * profile has a drawdown to critical depth at the slope break, a jump below it and a backwater curve from the
 * pond. Whatever the analysis computed, the view must draw exactly that: one vertex per computed point at its
 * station and water-surface elevation, each jump at its station, and the bank tops the profile is judged against.
 */
describe('longitudinal view of an analysed design draws the model profile', async () => {
  const document = await buildText(`design "Chute to pond"
units SI
flows { q = 2.5 m3/s }
section flume rectangle { bottom width 1.5 m  bank height 1.2 m }
section lined trapezoid { bottom width 2 m  side slopes 1.5:1  bank height 1.4 m }
lining concrete { n 0.014 }
channel c {
  reach approach { section lined  lining concrete  inverts 105.0 m to 104.8 m  length 200 m }
  reach chute { section flume  lining concrete  slope 5 %  length 60 m }
  reach tail { section lined  lining concrete  slope 0.1 %  length 300 m }
  outlet water level 102.9 m
}`);
  const analysis = analyzeDocument(document, NO_CRITERIA_DEFAULTS);
  const channel = analysis.channels[0]!;
  const profile = channel.profiles?.[0];
  const view = draw(channel);

  it('has a computed profile with a jump to draw', () => {
    expect(profile?.computed).toBe(true);
    expect(profile?.points.length).toBeGreaterThan(10);
    expect(profile?.jumps.length).toBeGreaterThan(0);
  });

  it('draws one vertex per computed point, at its station and water-surface elevation', () => {
    expect(view.problems).toEqual([]);
    const vertices = pathVertices(byRole(view.elements, 'water-surface-profile', 'q')[0]?.attributes['d'] ?? '');
    expect(vertices).toHaveLength(profile!.points.length);
    vertices.forEach((vertex, index) => {
      const point = profile!.points[index]!;
      expect(Math.abs(vertex.x - view.x.toPx(point.station_m))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
      expect(Math.abs(vertex.y - view.y.toPx(point.waterSurface_m))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
    });
  });

  it('stands the water surface on the drawn bed (the same bed the profile was computed on)', () => {
    const { placements } = placeReaches(channel);
    for (const point of profile!.points) {
      const placement = placements.find((candidate) => candidate.reach.name === point.reach)!;
      const fraction = (point.station_m - placement.startStationM) / (placement.endStationM - placement.startStationM);
      const bedM = placement.upstreamBedM + fraction * (placement.downstreamBedM - placement.upstreamBedM);
      expect(Math.abs(bedM - point.invert_m)).toBeLessThan(1e-9);
    }
  });

  it('marks each jump at its station, from its supercritical depth to its sequent depth above the bed', () => {
    const marks = byRole(view.elements, 'hydraulic-jump', 'q');
    const jumps = profile!.jumps.filter((jump) => !jump.nearCritical && jump.jumpType !== 'not-a-jump');
    expect(jumps.length).toBeGreaterThan(0);
    expect(marks).toHaveLength(jumps.length);
    jumps.forEach((jump, index) => {
      expect(numberAttribute(marks[index], 'data-station-m')).toBeCloseTo(jump.station_m, 9);
      const [low, high] = pathVertices(view.elements[view.elements.indexOf(marks[index]!) + 1]?.attributes['d'] ?? '');
      const bed = profile!.points.find((point) => point.reach === jump.reach && Math.abs(point.station_m - jump.station_m) < 1e-9)!.invert_m;
      expect(Math.abs(low!.y - view.y.toPx(bed + jump.upstreamDepth_m))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
      expect(Math.abs(high!.y - view.y.toPx(bed + jump.downstreamDepth_m))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
    });
  });

  it('draws the bank tops and both depth lines of the flow, and a legend entry for the computed water surface', () => {
    expect(byRole(view.elements, 'bank-top')).toHaveLength(1);
    expect(byRole(view.elements, 'normal-depth-line', 'q')).toHaveLength(1);
    expect(byRole(view.elements, 'critical-depth-line', 'q')).toHaveLength(1);
    expect(view.elements.some((element) => element.text === 'computed water surface')).toBe(true);
  });
});

describe('a passage through critical depth within the near-critical band', () => {
  it('is not drawn as a jump', () => {
    const ditch = siDesign().channels[0]!;
    const reach = ditch.reaches[0]!;
    const point = (station: number, depth: number): ProfilePointResult => ({ station_m: station, reach: reach.name, depth_m: depth, invert_m: 50, waterSurface_m: 50 + depth, velocity_mps: 1, froudeNumber: 1 });
    const nearCriticalJump: HydraulicJumpResult = {
      station_m: 10, reach: reach.name, placement: 'within-reach', upstreamDepth_m: 0.5, downstreamDepth_m: 0.502, upstreamFroudeNumber: 1.01, upstreamVelocity_mps: 1,
      energyLoss_m: 0, jumpType: 'undular', supercriticalFrom: reach.name, sweptOut: false, nearCritical: true, description: '',
    };
    const profile: ChannelFlowProfile = {
      flow: 'q10', computed: true, failure: null, datum: 'absolute', points: [point(0, 0.5), point(10, 0.5), point(10, 0.502), point(20, 0.502)], segments: [], jumps: [nearCriticalJump],
      notes: [], maximumEnergyResidual_m: 0, provenance: { method: '', assumptions: [], references: [] },
    };
    const view = draw({ ...ditch, profiles: [profile] });
    expect(byRole(view.elements, 'water-surface-profile', 'q10')).toHaveLength(1);
    expect(byRole(view.elements, 'hydraulic-jump')).toEqual([]);
    // Its twin, entering above the band, is drawn.
    const twin = draw({ ...ditch, profiles: [{ ...profile, jumps: [{ ...nearCriticalJump, nearCritical: false }] }] });
    expect(byRole(twin.elements, 'hydraulic-jump')).toHaveLength(1);
  });
});
