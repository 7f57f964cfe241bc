/**
 * The rating curve, read back from its own markup against closed forms: Manning's equation (Chow 1959, Sec. 5-6)
 * for the normal-depth curve of a rectangle and a trapezoid, the rectangular critical-depth relation
 * yc = (q^2/g)^(1/3) (REFERENCES.md C5, derived), the partly-full circle's conveyance peak (P1, P2, from memory,
 * high), and the design-flow markers at the engine's depths.
 */
import { describe, expect, it } from 'vitest';
import type { ReachResult } from '../../language/analysis/model.js';
import { GRAVITY_MS2, solveCriticalDepth, solveNormalDepth } from '../../language/hydraulics/index.js';
import { renderRatingCurveSvg } from '../../language/report/rating-curve-svg.js';
import { chowTrapezoidDesign, fixtureGeometry, siDesign } from './fixtures.js';
import { axisFromTicks, byRole, numberAttribute, parseMarkup, pathVertices } from './svg-query.js';

const PIXEL_TOLERANCE = 0.6;
const reaches = siDesign().channels.flatMap((channel) => channel.reaches);
const reachByName = (name: string): ReachResult => reaches.find((reach) => reach.name === name)!;

function draw(reach: ReachResult, system: 'SI' | 'US' = 'SI') {
  const parsed = parseMarkup(renderRatingCurveSvg(reach, system, { id: 'test-rating' }));
  return { ...parsed, x: axisFromTicks(parsed.elements, 'x'), y: axisFromTicks(parsed.elements, 'y') };
}

/** Manning's equation in SI, Q = (1/n) A R^(2/3) S^(1/2), with A and P of a trapezoid (b, zL, zR; a rectangle has z = 0). */
function manningTrapezoidM3s(bottomM: number, zLeft: number, zRight: number, n: number, slope: number, depthM: number): number {
  const area = depthM * (bottomM + ((zLeft + zRight) * depthM) / 2);
  const perimeter = bottomM + depthM * (Math.hypot(1, zLeft) + Math.hypot(1, zRight));
  return (area * (area / perimeter) ** (2 / 3) * Math.sqrt(slope)) / n;
}

describe('rating curve', () => {
  for (const reach of reaches) {
    it(`${reach.name}: markers sit at each design flow's discharge and the engine's normal and critical depths`, () => {
      const drawing = draw(reach);
      expect(drawing.problems).toEqual([]);
      const geometry = fixtureGeometry(reach.section.shape, reach.section.dimensions);
      for (const flow of reach.flows) {
        const normal = solveNormalDepth(geometry, { dischargeM3s: flow.discharge_m3s, manningN: reach.lining.manningN, bedSlope: reach.slope });
        const critical = solveCriticalDepth(geometry, flow.discharge_m3s);
        if (!critical.converged) throw new Error('fixture flow has no critical depth');
        const criticalMark = byRole(drawing.elements, 'critical-point', flow.flow)[0];
        expect(Math.abs(numberAttribute(criticalMark, 'data-cx') - drawing.x.toPx(flow.discharge_m3s))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
        expect(Math.abs(numberAttribute(criticalMark, 'data-cy') - drawing.y.toPx(critical.depthM))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
        const normalMark = byRole(drawing.elements, 'design-point', flow.flow)[0];
        if (!normal.converged) {
          expect(normalMark).toBeUndefined();
          continue;
        }
        expect(Math.abs(numberAttribute(normalMark, 'cx') - drawing.x.toPx(flow.discharge_m3s))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
        expect(Math.abs(numberAttribute(normalMark, 'cy') - drawing.y.toPx(normal.depthM))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
        const legend = byRole(drawing.elements, 'legend-flow').map((row) => row.deepText);
        expect(legend).toContain(
          `${flow.flow}: ${flow.discharge_m3s} m3/s, normal ${Number(normal.depthM.toPrecision(3))} m, critical ${Number(critical.depthM.toPrecision(3))} m`,
        );
      }
    });
  }

  for (const name of ['outfall-chute', 'mid-ditch']) {
    it(`${name}: every vertex of the normal-depth curve satisfies Manning's equation (Chow 1959, Sec. 5-6)`, () => {
      const reach = reachByName(name);
      const drawing = draw(reach);
      const d = reach.section.dimensions;
      const vertices = pathVertices(byRole(drawing.elements, 'normal-depth-curve')[0]?.attributes['d'] ?? '');
      expect(vertices.length).toBeGreaterThan(50);
      for (const vertex of vertices) {
        const depthM = drawing.y.toValue(vertex.y);
        const dischargeM3s = manningTrapezoidM3s(d['bottomWidth_m']!, d['leftSideSlope_HV'] ?? 0, d['rightSideSlope_HV'] ?? 0, reach.lining.manningN, reach.slope, Math.max(depthM, 0));
        expect(Math.abs(drawing.x.toPx(dischargeM3s) - vertex.x)).toBeLessThanOrEqual(PIXEL_TOLERANCE);
      }
    });
  }

  it('rectangle: the critical-depth curve follows yc = (q^2/g)^(1/3) (REFERENCES.md C5, derived)', () => {
    const reach = reachByName('outfall-chute');
    const widthM = reach.section.dimensions['bottomWidth_m']!;
    const drawing = draw(reach);
    const vertices = pathVertices(byRole(drawing.elements, 'critical-depth-curve')[0]?.attributes['d'] ?? '');
    expect(vertices.length).toBeGreaterThan(20);
    for (const vertex of vertices) {
      const depthM = Math.max(drawing.y.toValue(vertex.y), 0);
      // Inverted: q = sqrt(g yc^3) per metre of width.
      const dischargeM3s = widthM * Math.sqrt(GRAVITY_MS2 * depthM ** 3);
      expect(Math.abs(drawing.x.toPx(dischargeM3s) - vertex.x)).toBeLessThanOrEqual(PIXEL_TOLERANCE);
    }
  });

  it('circle: the curve peaks near y/D = 0.938 at about 1.076 times the full-pipe discharge (REFERENCES.md P1, P2; from memory, high)', () => {
    const reach = reachByName('road-culvert');
    const drawing = draw(reach);
    const vertices = pathVertices(byRole(drawing.elements, 'normal-depth-curve')[0]?.attributes['d'] ?? '').map((vertex) => ({
      dischargeM3s: drawing.x.toValue(vertex.x),
      depthM: drawing.y.toValue(vertex.y),
    }));
    const peak = vertices.reduce((best, vertex) => (vertex.dischargeM3s > best.dischargeM3s ? vertex : best));
    const full = vertices[vertices.length - 1]!;
    expect(full.depthM).toBeCloseTo(0.6, 2);
    // The curve is sampled every D/120, so the peak's depth is known to about 0.01 D.
    expect(Math.abs(peak.depthM / 0.6 - 0.938)).toBeLessThan(0.01);
    expect(Math.abs(peak.dischargeM3s / full.dischargeM3s - 1.076)).toBeLessThan(0.005);
    expect(byRole(drawing.elements, 'bank-top')[0]?.attributes['data-kind']).toBe('crown');
  });

  it('Chow trapezoid in US units: the legend gives critical depth 2.15 ft (Chow 1959, Example 4-2 as recalled; from memory)', () => {
    const reach = chowTrapezoidDesign().channels[0]!.reaches[0]!;
    const drawing = draw(reach, 'US');
    const legend = byRole(drawing.elements, 'legend-flow')[0]?.deepText ?? '';
    expect(legend).toMatch(/^design: 400 cfs, normal [\d.]+ ft, critical [\d.]+ ft$/);
    expect(Math.abs(Number(/critical ([\d.]+) ft/.exec(legend)?.[1]) - 2.15)).toBeLessThanOrEqual(0.01);
    expect(Math.abs(Number(/normal ([\d.]+) ft/.exec(legend)?.[1]) - 3.36)).toBeLessThanOrEqual(0.01);
    expect(byRole(drawing.elements, 'x-axis-label')[0]?.text).toBe('discharge (cfs)');
    expect(byRole(drawing.elements, 'y-axis-label')[0]?.text).toBe('depth (ft)');
  });

  it('on an adverse bed it draws the critical-depth curve only and says why', () => {
    const base = reachByName('mid-ditch');
    const adverse: ReachResult = { ...base, slope: -0.002, flows: base.flows.map((flow) => ({ ...flow, normal: null })) };
    const drawing = draw(adverse);
    expect(byRole(drawing.elements, 'normal-depth-curve')).toHaveLength(0);
    expect(byRole(drawing.elements, 'critical-depth-curve')).toHaveLength(1);
    expect(byRole(drawing.elements, 'no-uniform-flow')[0]?.text).toBe('No uniform-flow curve: the bed is horizontal or adverse.');
  });
});
