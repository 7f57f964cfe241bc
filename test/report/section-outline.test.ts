/**
 * The drawn section agrees with the engine for any dimensions: the width between the water-surface edges is the
 * engine's top width, and the section boundary clipped at a depth encloses the engine's flow area (exactly for
 * straight-sided shapes, within the sampling error for curved ones). The SectionResult -> SectionGeometry rebuild
 * reads the agreed unit-suffixed keys and refuses missing or non-physical dimensions.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { SectionResult, SectionShapeName } from '../../language/analysis/model.js';
import { sectionGeometryFromResult } from '../../language/report/section-from-result.js';
import { clipPolygonBelow, polygonAreaM2, sectionBoundaryM, surfaceEdgesM } from '../../language/report/section-outline.js';
import { fixtureGeometry } from './fixtures.js';

const LOCATION = { uri: 'file:///x.runnel', range: { start: { line: 0, character: 0 }, end: { line: 0, character: 1 } } };

function section(shape: SectionShapeName, dimensions: Record<string, number>): SectionResult {
  return { name: 's', shape, dimensions, bankDepth_m: null, fullDepth_m: shape === 'circle' ? (dimensions['diameter_m'] ?? null) : null, location: LOCATION };
}

const length = fc.double({ min: 0.05, max: 40, noNaN: true });
const sideSlope = fc.double({ min: 0, max: 8, noNaN: true });
const depthFraction = fc.double({ min: 0.02, max: 0.98, noNaN: true });

const anySection = fc.oneof(
  length.map((b) => section('rectangle', { bottomWidth_m: b })),
  fc.tuple(length, sideSlope, sideSlope).map(([b, zl, zr]) => section('trapezoid', { bottomWidth_m: b, leftSideSlope_HV: zl, rightSideSlope_HV: zr })),
  fc.tuple(fc.double({ min: 0.2, max: 8, noNaN: true }), sideSlope).map(([zl, zr]) => section('triangle', { leftSideSlope_HV: zl, rightSideSlope_HV: zr })),
  fc.tuple(length, length).map(([t, y]) => section('parabola', { topWidth_m: t, atDepth_m: y })),
  length.map((d) => section('circle', { diameter_m: d })),
);

describe('section outline', () => {
  it('water-surface edges are the engine top width apart at every depth (relative 1e-9)', () => {
    fc.assert(
      fc.property(anySection, depthFraction, (result, fraction) => {
        const rebuilt = sectionGeometryFromResult(result);
        if (!rebuilt.ok) throw new Error(rebuilt.reason);
        const engine = fixtureGeometry(result.shape, result.dimensions);
        const depthM = fraction * (engine.fullDepthM ?? 5);
        const edges = surfaceEdgesM(result, rebuilt.geometry, depthM);
        const expected = engine.topWidthM(depthM);
        expect(Math.abs(edges.rightM - edges.leftM - expected)).toBeLessThanOrEqual(1e-9 * Math.max(1, expected));
      }),
      { numRuns: 300 },
    );
  });

  it('the boundary clipped at a depth encloses the engine flow area (1e-9 straight sides; curved: 0.1 % of the drawn section)', () => {
    fc.assert(
      fc.property(anySection, depthFraction, (result, fraction) => {
        const rebuilt = sectionGeometryFromResult(result);
        if (!rebuilt.ok) throw new Error(rebuilt.reason);
        const engine = fixtureGeometry(result.shape, result.dimensions);
        const topM = engine.fullDepthM ?? 5;
        const depthM = fraction * topM;
        const polygon = clipPolygonBelow(sectionBoundaryM(result, rebuilt.geometry, topM).points, depthM);
        const curved = result.shape === 'parabola' || result.shape === 'circle';
        const expected = engine.areaM2(depthM);
        // A curved side is drawn as chords: its error is judged at the scale of the drawing (the whole section).
        const tolerance = curved ? 1e-3 * engine.areaM2(topM) : 1e-9 * expected;
        expect(Math.abs(polygonAreaM2(polygon) - expected)).toBeLessThanOrEqual(tolerance);
      }),
      { numRuns: 300 },
    );
  });
});

describe('rebuilding the engine geometry from a SectionResult', () => {
  const cases: readonly { id: string; result: SectionResult; reason: string }[] = [
    { id: 'rectangle without width', result: section('rectangle', {}), reason: 'the rectangle has no valid bottom width' },
    { id: 'rectangle of zero width', result: section('rectangle', { bottomWidth_m: 0 }), reason: 'the rectangle has no valid bottom width' },
    { id: 'trapezoid with a negative side', result: section('trapezoid', { bottomWidth_m: 1, leftSideSlope_HV: -1, rightSideSlope_HV: 2 }), reason: 'the trapezoid has no valid left side slope' },
    { id: 'flat triangle', result: section('triangle', { leftSideSlope_HV: 0, rightSideSlope_HV: 0 }), reason: 'the triangle has no width' },
    { id: 'parabola without depth', result: section('parabola', { topWidth_m: 2 }), reason: 'the parabola has no valid reference depth' },
    { id: 'circle with NaN diameter', result: section('circle', { diameter_m: Number.NaN }), reason: 'the circle has no valid diameter' },
    { id: 'old key names', result: section('circle', { diameterM: 0.6 }), reason: 'the circle has no valid diameter' },
  ];
  for (const testCase of cases) {
    it(`refuses a ${testCase.id}`, () => {
      expect(sectionGeometryFromResult(testCase.result)).toEqual({ ok: false, reason: testCase.reason });
    });
  }

  it('builds each shape with the engine factory: same area at a depth as the factory', () => {
    const valid: readonly SectionResult[] = [
      section('rectangle', { bottomWidth_m: 1.2 }),
      section('trapezoid', { bottomWidth_m: 0.9, leftSideSlope_HV: 3, rightSideSlope_HV: 2 }),
      section('triangle', { leftSideSlope_HV: 4, rightSideSlope_HV: 2 }),
      section('parabola', { topWidth_m: 2.4, atDepth_m: 0.45 }),
      section('circle', { diameter_m: 0.6 }),
    ];
    for (const result of valid) {
      const rebuilt = sectionGeometryFromResult(result);
      expect(rebuilt.ok).toBe(true);
      if (rebuilt.ok) {
        expect(rebuilt.geometry.shape).toBe(result.shape);
        expect(rebuilt.geometry.areaM2(0.3)).toBe(fixtureGeometry(result.shape, result.dimensions).areaM2(0.3));
      }
    }
  });
});
