/**
 * The cross-section drawing, read back from its own markup: the water surface of each flow sits at the engine's
 * normal depth and spans the section's top width (closed forms, Chow 1959 Table 2-1), the labels print those
 * values, the drawing is to scale (or says by how much it is exaggerated), and the shaded flow area has the
 * engine's area.
 */
import { describe, expect, it } from 'vitest';
import type { ReachResult } from '../../language/analysis/model.js';
import { solveNormalDepth } from '../../language/hydraulics/index.js';
import { renderCrossSectionSvg } from '../../language/report/cross-section-svg.js';
import { fromSI } from '../../language/units/units.js';
import { chowTrapezoidDesign, fixtureGeometry, siDesign } from './fixtures.js';
import { axisFromTicks, byRole, numberAttribute, parseMarkup, pathVertices } from './svg-query.js';

/** A drawn line may sit this far from where the value maps, px: coordinates are written to 0.01 px. */
const PIXEL_TOLERANCE = 0.6;

const si = siDesign();
const reaches: readonly ReachResult[] = si.channels.flatMap((channel) => channel.reaches);

/** Top width at depth y by the closed forms of Chow (1959) Table 2-1 (derived), m. */
function closedFormTopWidthM(reach: ReachResult, depthM: number): number {
  const d = reach.section.dimensions;
  switch (reach.section.shape) {
    case 'rectangle':
      return d['bottomWidth_m']!;
    case 'trapezoid':
      return d['bottomWidth_m']! + (d['leftSideSlope_HV']! + d['rightSideSlope_HV']!) * depthM;
    case 'triangle':
      return (d['leftSideSlope_HV']! + d['rightSideSlope_HV']!) * depthM;
    case 'parabola':
      return d['topWidth_m']! * Math.sqrt(depthM / d['atDepth_m']!);
    case 'circle':
      return 2 * Math.sqrt(depthM * (d['diameter_m']! - depthM));
  }
}

function draw(reach: ReachResult, system: 'SI' | 'US' = 'SI') {
  const svg = renderCrossSectionSvg(reach, system, { id: 'test-section' });
  const parsed = parseMarkup(svg);
  return { svg, ...parsed, x: axisFromTicks(parsed.elements, 'x'), y: axisFromTicks(parsed.elements, 'y') };
}

describe('cross-section drawing', () => {
  for (const reach of reaches) {
    describe(`${reach.section.shape} (${reach.name})`, () => {
      const drawing = draw(reach);

      it('is well-formed and its axes are linear', () => {
        expect(drawing.problems).toEqual([]);
        expect(drawing.x.misfitPx).toBeLessThan(0.02);
        expect(drawing.y.misfitPx).toBeLessThan(0.02);
      });

      it('is to scale, or states a round vertical exaggeration', () => {
        const svgElement = drawing.elements.find((element) => element.name === 'svg');
        const exaggeration = numberAttribute(svgElement, 'data-vertical-exaggeration');
        expect([1, 2, 5, 10, 20, 50, 100]).toContain(exaggeration);
        expect(drawing.y.pxPerUnit / drawing.x.pxPerUnit).toBeCloseTo(exaggeration, 3);
        const note = byRole(drawing.elements, 'scale-note')[0]?.text ?? '';
        expect(note).toBe(exaggeration === 1 ? 'horizontal and vertical scales equal' : `vertical scale exaggerated ${exaggeration}×`);
      });

      for (const flow of reach.flows) {
        const geometry = fixtureGeometry(reach.section.shape, reach.section.dimensions);
        const solved = solveNormalDepth(geometry, { dischargeM3s: flow.discharge_m3s, manningN: reach.lining.manningN, bedSlope: reach.slope });
        if (!solved.converged) {
          it(`${flow.flow}: has no water surface and says there is no normal depth`, () => {
            expect(byRole(drawing.elements, 'water-surface', flow.flow)).toHaveLength(0);
            expect(byRole(drawing.elements, 'no-normal-depth-label', flow.flow)[0]?.text).toBe(`${flow.flow}: no normal depth`);
          });
          continue;
        }
        const depthM = solved.depthM;

        it(`${flow.flow}: water surface at the engine's normal depth, across the closed-form top width`, () => {
          const [line] = byRole(drawing.elements, 'water-surface', flow.flow);
          const y1 = numberAttribute(line, 'y1');
          expect(numberAttribute(line, 'y2')).toBe(y1);
          expect(Math.abs(y1 - drawing.y.toPx(depthM))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
          const widthPx = numberAttribute(line, 'x2') - numberAttribute(line, 'x1');
          expect(Math.abs(widthPx - closedFormTopWidthM(reach, depthM) * drawing.x.pxPerUnit)).toBeLessThanOrEqual(2 * PIXEL_TOLERANCE);
        });

        it(`${flow.flow}: depth and top-width labels print those values`, () => {
          const depthLabel = byRole(drawing.elements, 'depth-label', flow.flow)[0];
          const widthLabel = byRole(drawing.elements, 'top-width-label', flow.flow)[0];
          expect(depthLabel?.text).toBe(`depth ${Number(depthM.toPrecision(3))} m`);
          expect(widthLabel?.text).toBe(`top width ${Number(closedFormTopWidthM(reach, depthM).toPrecision(3))} m`);
        });
      }

      it('shades the deepest flow with the engine’s flow area (shoelace area of the drawn polygon, 1 %)', () => {
        const deepest = Math.max(...reach.flows.map((flow) => flow.normal?.depth_m ?? 0));
        const area = byRole(drawing.elements, 'water-area')[0];
        const vertices = pathVertices(area?.attributes['d'] ?? '').map((vertex) => ({ x: drawing.x.toValue(vertex.x), y: drawing.y.toValue(vertex.y) }));
        let twiceArea = 0;
        vertices.forEach((vertex, index) => {
          const next = vertices[(index + 1) % vertices.length]!;
          twiceArea += vertex.x * next.y - next.x * vertex.y;
        });
        const engineArea = fixtureGeometry(reach.section.shape, reach.section.dimensions).areaM2(deepest);
        expect(Math.abs(twiceArea) / 2).toBeGreaterThan(engineArea * 0.99);
        expect(Math.abs(twiceArea) / 2).toBeLessThan(engineArea * 1.01);
      });
    });
  }

  it('draws the bank top at the bank height and the freeboard limit at bank height less the required freeboard', () => {
    const reach = reaches.find((candidate) => candidate.name === 'mid-ditch')!;
    const drawing = draw(reach);
    const bank = byRole(drawing.elements, 'bank-top')[0];
    expect(Math.abs(numberAttribute(bank, 'y1') - drawing.y.toPx(0.75))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
    const limit = byRole(drawing.elements, 'freeboard-limit')[0];
    expect(Math.abs(numberAttribute(limit, 'y1') - drawing.y.toPx(0.75 - 0.15))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
    expect(byRole(drawing.elements, 'freeboard-label')[0]?.text).toBe('0.15 m below bank top');
  });

  it('draws a conduit as a circle of its diameter with the crown at the top', () => {
    const reach = reaches.find((candidate) => candidate.section.shape === 'circle')!;
    const drawing = draw(reach);
    const outline = byRole(drawing.elements, 'section-outline')[0];
    expect(outline?.name).toBe('circle');
    expect(numberAttribute(outline, 'r') / drawing.x.pxPerUnit).toBeCloseTo(0.3, 3);
    const crown = byRole(drawing.elements, 'bank-top')[0];
    expect(crown?.attributes['data-kind']).toBe('crown');
    expect(Math.abs(numberAttribute(crown, 'y1') - drawing.y.toPx(0.6))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
  });

  it('labels the Chow trapezoid in feet: normal depth 3.36 ft (Chow 1959, Example 6-2 as recalled; from memory)', () => {
    const reach = chowTrapezoidDesign().channels[0]!.reaches[0]!;
    const drawing = draw(reach, 'US');
    const label = byRole(drawing.elements, 'depth-label', 'design')[0]?.text ?? '';
    const shownFeet = Number(/depth ([\d.]+) ft/.exec(label)?.[1]);
    // Published 3.36 ft with k = 1.49; Runnel's exact k = 1.4859 gives about 0.15 % more (REFERENCES.md).
    expect(Math.abs(shownFeet - 3.36)).toBeLessThanOrEqual(0.01);
    const [line] = byRole(drawing.elements, 'water-surface', 'design');
    expect(Math.abs(drawing.y.toValue(numberAttribute(line, 'y1')) - 3.36)).toBeLessThan(0.02);
    // The axis is in feet: the water line maps to the engine depth converted exactly (1 ft = 0.3048 m).
    expect(Math.abs(numberAttribute(line, 'y1') - drawing.y.toPx(fromSI(reach.flows[0]!.normal!.depth_m, 'ft')))).toBeLessThanOrEqual(PIXEL_TOLERANCE);
  });

  it('extends the prism above the bank, dashed, for an over-topping flow', () => {
    const base = reaches.find((candidate) => candidate.name === 'outfall-chute')!;
    const lowBank: ReachResult = { ...base, section: { ...base.section, bankDepth_m: 0.2 } };
    const drawing = draw(lowBank);
    expect(byRole(drawing.elements, 'section-extension')).toHaveLength(1);
    const [line] = byRole(drawing.elements, 'water-surface', 'q100');
    expect(drawing.y.toValue(numberAttribute(line, 'y1'))).toBeGreaterThan(0.2);
  });

  it('says why it cannot draw a section with a missing dimension, and writes no number', () => {
    const base = reaches[1]!;
    const broken: ReachResult = { ...base, section: { ...base.section, dimensions: { leftSideSlope_HV: 3, rightSideSlope_HV: 2 } } };
    const svg = renderCrossSectionSvg(broken, 'SI', { id: 'broken' });
    expect(parseMarkup(svg).problems).toEqual([]);
    expect(byRole(parseMarkup(svg).elements, 'not-drawn-reason')[0]?.text).toBe('Not drawn: the trapezoid has no valid bottom width.');
  });
});
