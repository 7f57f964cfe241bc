/**
 * Hydraulic jumps: the momentum-function sequent-depth solver against Belanger's equation for rectangles, the
 * jump-type bands of USBR Engineering Monograph 25 as given in Chow (1959) Sec. 15-3, and jumps placed in
 * computed profiles where the specific forces match.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { GRAVITY_MS2 } from '../../../language/hydraulics/constants.js';
import { classifyJump, computeChannelProfile, jumpEnergyLossM, solveSequentDepth } from '../../../language/hydraulics/profile/index.js';
import { circleSection, parabolaSection, rectangleSection, trapezoidSection, triangleSection } from '../../../language/hydraulics/sections/index.js';
import type { SectionGeometry } from '../../../language/hydraulics/sections/section-geometry.js';
import { belangerRatio, rectangleCriticalDepthM } from './reference-integration.js';

/** Specific force Q^2/(gA) + A ybar, written here from the section's area and first moment. */
function specificForce(section: SectionGeometry, depthM: number, q: number): number {
  return (q * q) / (GRAVITY_MS2 * section.areaM2(depthM)) + section.firstMomentM3(depthM);
}

describe("sequent depths: Belanger's equation for rectangles (derived from momentum; any text)", () => {
  it('property: y2/y1 = (sqrt(1 + 8 Fr1^2) - 1)/2 within 1e-9 for supercritical inflow in any rectangle', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.2, max: 20, noNaN: true }),
        fc.double({ min: 0.05, max: 50, noNaN: true }),
        fc.double({ min: 0.05, max: 0.999, noNaN: true }),
        (widthM, q, fractionOfCritical) => {
          const section = rectangleSection({ bottomWidthM: widthM });
          const y1 = fractionOfCritical * rectangleCriticalDepthM(q, widthM);
          const froude = q / (widthM * y1) / Math.sqrt(GRAVITY_MS2 * y1);
          const result = solveSequentDepth(section, y1, q);
          expect(result.converged).toBe(true);
          if (!result.converged) return;
          expect(Math.abs(result.sequentDepthM / y1 - belangerRatio(froude)) / belangerRatio(froude)).toBeLessThan(1e-9);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('works from the subcritical side too: the sequent of the sequent is the original depth', () => {
    const section = rectangleSection({ bottomWidthM: 2 });
    const first = solveSequentDepth(section, 0.3, 4);
    if (!first.converged) throw new Error(first.message);
    const back = solveSequentDepth(section, first.sequentDepthM, 4);
    if (!back.converged) throw new Error(back.message);
    expect(back.sequentDepthM).toBeCloseTo(0.3, 9);
  });

  it('energy loss in a rectangular jump is (y2 - y1)^3 / (4 y1 y2) (derived: closed form from momentum and energy)', () => {
    const section = rectangleSection({ bottomWidthM: 3 });
    for (const y1 of [0.15, 0.3, 0.6]) {
      const result = solveSequentDepth(section, y1, 6);
      if (!result.converged) throw new Error(result.message);
      const y2 = result.sequentDepthM;
      expect(jumpEnergyLossM(section, y1, y2, 6)).toBeCloseTo((y2 - y1) ** 3 / (4 * y1 * y2), 9);
    }
  });
});

describe('sequent depths in other shapes: specific forces equal on both sides of critical depth', () => {
  const shapes: readonly { label: string; section: SectionGeometry }[] = [
    { label: 'trapezoid', section: trapezoidSection({ bottomWidthM: 1.5, leftSideSlopeHV: 2, rightSideSlopeHV: 1 }) },
    { label: 'triangle', section: triangleSection({ leftSideSlopeHV: 2, rightSideSlopeHV: 2 }) },
    { label: 'parabola', section: parabolaSection({ topWidthM: 3, atDepthM: 1 }) },
    { label: 'circle', section: circleSection({ diameterM: 1.8 }) },
  ];
  it.each(shapes)('$label', ({ section }) => {
    const q = 1.5;
    const result = solveSequentDepth(section, 0.2, q);
    if (!result.converged) throw new Error(result.message);
    expect(result.sequentDepthM).toBeGreaterThan(result.criticalDepthM);
    expect(result.criticalDepthM).toBeGreaterThan(0.2);
    const m1 = specificForce(section, 0.2, q);
    expect(Math.abs(specificForce(section, result.sequentDepthM, q) - m1) / m1).toBeLessThan(1e-10);
  });

  it('a jump that would fill a conduit has no sequent depth, and says so', () => {
    const result = solveSequentDepth(circleSection({ diameterM: 0.6 }), 0.05, 0.4);
    expect(result.converged).toBe(false);
    if (result.converged) return;
    expect(result.reason).toBe('conduit-fills');
  });

  it('bad input gives a reason, not NaN or an exception', () => {
    for (const [y, q] of [[0, 1], [-1, 1], [Number.NaN, 1], [0.5, 0], [0.5, Number.POSITIVE_INFINITY]] as const) {
      const result = solveSequentDepth(rectangleSection({ bottomWidthM: 1 }), y, q);
      expect(result.converged).toBe(false);
    }
  });
});

describe('jump types by upstream Froude number (USBR Engineering Monograph 25; Chow 1959, Sec. 15-3; confirmed)', () => {
  const table: readonly { froude: number; expected: ReturnType<typeof classifyJump> }[] = [
    { froude: 0.8, expected: 'not-a-jump' },
    { froude: 1.0, expected: 'not-a-jump' },
    { froude: 1.2, expected: 'undular' },
    { froude: 1.69, expected: 'undular' },
    { froude: 1.7, expected: 'weak' },
    { froude: 2.4, expected: 'weak' },
    { froude: 2.5, expected: 'oscillating' },
    { froude: 4.4, expected: 'oscillating' },
    { froude: 4.5, expected: 'steady' },
    { froude: 8.9, expected: 'steady' },
    { froude: 9.0, expected: 'strong' },
    { froude: 14, expected: 'strong' },
  ];
  it.each(table)('Fr1 = $froude: $expected', ({ froude, expected }) => {
    expect(classifyJump(froude)).toBe(expected);
  });
});

describe('jumps in computed profiles', () => {
  const width = 3;
  const rectangle = rectangleSection({ bottomWidthM: width });

  it('below a gate on a horizontal rectangular channel: depths satisfy Belanger, on the H3 and H2 curves', () => {
    const q = 10;
    const result = computeChannelProfile({
      reaches: [{ name: 'apron', section: rectangle, manningN: 0.014, bedSlope: 0, lengthM: 150 }],
      dischargeM3s: q,
      inlet: { kind: 'depth', depthM: 0.4 },
      outlet: { kind: 'water-level', elevationM: 1.6 },
    });
    if (!result.converged) throw new Error(result.message);
    expect(result.jumps).toHaveLength(1);
    const jump = result.jumps[0];
    if (jump === undefined) return;
    expect(jump.placement).toBe('within-reach');
    const froude = q / (width * jump.upstreamDepthM) / Math.sqrt(GRAVITY_MS2 * jump.upstreamDepthM);
    expect(jump.upstreamFroudeNumber).toBeCloseTo(froude, 9);
    expect(Math.abs(jump.downstreamDepthM / jump.upstreamDepthM - belangerRatio(froude)) / belangerRatio(froude)).toBeLessThan(1e-4);
    expect(jump.energyLossM).toBeCloseTo((jump.downstreamDepthM - jump.upstreamDepthM) ** 3 / (4 * jump.upstreamDepthM * jump.downstreamDepthM), 4);
    expect(jump.jumpType).toBe(classifyJump(froude));
    expect(result.reaches[0]?.profileClasses).toEqual(['H3', 'H2']);
    // The jump is a zero-length step in the profile, between the two depths.
    const jumpStep = result.steps.find((step) => step.kind === 'hydraulic-jump');
    expect(jumpStep?.lengthM).toBe(0);
  });

  it('raising the tailwater pushes the jump upstream (towards the gate)', () => {
    const stationFor = (tailwaterM: number): number => {
      const result = computeChannelProfile({
        reaches: [{ name: 'apron', section: rectangle, manningN: 0.014, bedSlope: 0, lengthM: 150 }],
        dischargeM3s: 10,
        inlet: { kind: 'depth', depthM: 0.4 },
        outlet: { kind: 'water-level', elevationM: tailwaterM },
      });
      if (!result.converged) throw new Error(result.message);
      return result.jumps[0]?.stationM ?? Number.NaN;
    };
    expect(stationFor(1.5)).toBeGreaterThan(stationFor(1.7));
  });

  it('a trapezoidal jump below a steep chute stands where the specific forces of both profiles are equal', () => {
    const section = trapezoidSection({ bottomWidthM: 2, leftSideSlopeHV: 1.5, rightSideSlopeHV: 1.5 });
    const q = 9;
    const result = computeChannelProfile({
      reaches: [
        { name: 'chute', section, manningN: 0.014, bedSlope: 0.04, lengthM: 120 },
        { name: 'basin reach', section, manningN: 0.02, bedSlope: 0.0008, lengthM: 400 },
      ],
      dischargeM3s: q,
      outlet: { kind: 'normal-depth' },
    });
    if (!result.converged) throw new Error(result.message);
    const jump = result.jumps[0];
    expect(jump).toBeDefined();
    if (jump === undefined) return;
    const m1 = specificForce(section, jump.upstreamDepthM, q);
    expect(Math.abs(specificForce(section, jump.downstreamDepthM, q) - m1) / m1).toBeLessThan(1e-4);
    expect(jump.upstreamDepthM).toBeLessThan(jump.downstreamDepthM);
  });
});
