/**
 * Critical depth, Froude number, specific energy, specific force and critical slope against a published example,
 * closed forms and identities. Sources and confidence words are copied from /work/shared/REFERENCES.md.
 */
import { describe, expect, it } from 'vitest';
import {
  circleSection,
  classifyRegime,
  classifySlope,
  criticalSlope,
  froudeNumber,
  GRAVITY_MS2,
  hydraulicStateAt,
  parabolaSection,
  rectangleSection,
  solveCriticalDepth,
  solveNormalDepth,
  specificEnergyM,
  specificForceM3,
  trapezoidSection,
  triangleSection,
  type SectionGeometry,
} from '../../language/hydraulics/index.js';
import { toSI } from '../../language/units/units.js';
import { argMaximum, expectRelative, expectWithin } from './engineering-check.js';

const FOOT_M = 0.3048;
const CHOW_C1 = 'Chow (1959) Ch. 4 critical-depth example on the N1 channel (Example 4-2 as recalled) (from memory (recomputes to 2.148))';
const RECTANGLE_C5 = 'rectangle closed form yc = (q^2/g)^(1/3), Emin = 1.5 yc, Fr(yc) = 1 (derived)';
const TRIANGLE_C6 = 'triangle closed form yc = (2 Q^2 / (g z^2))^(1/5), Emin = 1.25 yc (derived)';

function criticalOrFail(section: SectionGeometry, dischargeM3s: number): number {
  const result = solveCriticalDepth(section, dischargeM3s);
  if (!result.converged) throw new Error(`no critical depth for ${section.description}, Q = ${dischargeM3s}: ${result.message}`);
  return result.depthM;
}

describe('published critical-depth example', () => {
  it('C1: b = 20 ft, z = 2, Q = 400 cfs gives yc = 2.15 ft with the book\'s g = 32.2 ft/s2', () => {
    // Critical depth depends on Q^2/g only: the book's g is reproduced by scaling Q by sqrt(g_engine / g_book).
    const engineGravityFtS2 = GRAVITY_MS2 / FOOT_M;
    const section = trapezoidSection({ bottomWidthM: 20 * FOOT_M, leftSideSlopeHV: 2, rightSideSlopeHV: 2 });
    const bookEquivalentQ = toSI(400, 'cfs')! * Math.sqrt(engineGravityFtS2 / 32.2);
    const depthFt = criticalOrFail(section, bookEquivalentQ) / FOOT_M;
    expectWithin({ id: 'C1', source: CHOW_C1, input: 'b = 20 ft, z = 2, Q = 400 cfs, g = 32.2 ft/s2, alpha = 1', value: depthFt, expected: 2.15, tolerance: 0.005, unit: 'ft' });
    // With Runnel's own g = 9.80665 m/s2 (32.174 ft/s2) the depth moves by only (32.2/32.174)^(1/3) - 1 ~ 0.03%.
    const ownDepthFt = criticalOrFail(section, toSI(400, 'cfs')!) / FOOT_M;
    expectWithin({ id: 'C1-own-g', source: CHOW_C1, input: 'same, g = 9.80665 m/s2', value: ownDepthFt, expected: 2.148, tolerance: 0.0015, unit: 'ft' });
  });
});

describe('closed forms', () => {
  it.each([
    { widthM: 0.5, dischargeM3s: 0.02 },
    { widthM: 3, dischargeM3s: 6 },
    { widthM: 40, dischargeM3s: 900 },
  ])('C5: rectangle b = $widthM m, Q = $dischargeM3s m3/s: yc, Emin = 1.5 yc, Fr = 1', ({ widthM, dischargeM3s }) => {
    const section = rectangleSection({ bottomWidthM: widthM });
    const unitDischarge = dischargeM3s / widthM;
    const expected = Math.cbrt((unitDischarge * unitDischarge) / GRAVITY_MS2);
    const depthM = criticalOrFail(section, dischargeM3s);
    const input = `b = ${widthM} m, Q = ${dischargeM3s} m3/s, g = 9.80665 m/s2`;
    expectRelative({ id: 'C5-yc', source: RECTANGLE_C5, input, value: depthM, expected, relativeTolerance: 1e-10, unit: 'm' });
    expectRelative({ id: 'C5-Emin', source: RECTANGLE_C5, input, value: specificEnergyM(section, depthM, dischargeM3s), expected: 1.5 * expected, relativeTolerance: 1e-10, unit: 'm' });
    expectWithin({ id: 'C5-Fr', source: RECTANGLE_C5, input, value: froudeNumber(section, depthM, dischargeM3s), expected: 1, tolerance: 1e-9, unit: '-' });
  });

  it.each([
    { z: 1, dischargeM3s: 0.1 },
    { z: 4, dischargeM3s: 3 },
  ])('C6: triangle z = $z, Q = $dischargeM3s m3/s: yc and Emin = 1.25 yc', ({ z, dischargeM3s }) => {
    const section = triangleSection({ leftSideSlopeHV: z, rightSideSlopeHV: z });
    const expected = ((2 * dischargeM3s * dischargeM3s) / (GRAVITY_MS2 * z * z)) ** 0.2;
    const depthM = criticalOrFail(section, dischargeM3s);
    const input = `z = ${z} each side, Q = ${dischargeM3s} m3/s`;
    expectRelative({ id: 'C6-yc', source: TRIANGLE_C6, input, value: depthM, expected, relativeTolerance: 1e-10, unit: 'm' });
    expectRelative({ id: 'C6-Emin', source: TRIANGLE_C6, input, value: specificEnergyM(section, depthM, dischargeM3s), expected: 1.25 * expected, relativeTolerance: 1e-10, unit: 'm' });
  });

  it('parabola: yc from Q^2 T = g A^3 with T = c sqrt(y), A = (2/3) c y^(3/2), i.e. yc = (27 Q^2 / (8 g c^2))^(1/4)', () => {
    // Swale 6 m wide at 0.6 m depth carrying 1.5 m3/s: c = 6 / sqrt(0.6).
    const widthCoefficient = 6 / Math.sqrt(0.6);
    const expected = ((27 * 1.5 * 1.5) / (8 * GRAVITY_MS2 * widthCoefficient * widthCoefficient)) ** 0.25;
    const value = criticalOrFail(parabolaSection({ topWidthM: 6, atDepthM: 0.6 }), 1.5);
    expectRelative({ id: 'para-yc', source: 'Q^2 T = g A^3 with Chow (1959) Table 2-1 parabola elements (derived)', input: 'T = 6 m at 0.6 m, Q = 1.5 m3/s', value, expected, relativeTolerance: 1e-10, unit: 'm' });
  });
});

describe('identities of critical flow', () => {
  const sections: SectionGeometry[] = [
    trapezoidSection({ bottomWidthM: 2, leftSideSlopeHV: 1.5, rightSideSlopeHV: 3 }),
    parabolaSection({ topWidthM: 5, atDepthM: 0.8 }),
    circleSection({ diameterM: 1.05 }),
  ];
  it.each(sections.map((section) => ({ section, name: section.description })))(
    '$name: critical depth minimises specific energy and specific force (derived)',
    ({ section }) => {
      const dischargeM3s = 0.9;
      const depthM = criticalOrFail(section, dischargeM3s);
      const input = `${section.description}, Q = ${dischargeM3s} m3/s`;
      const upper = section.fullDepthM ?? 10 * depthM;
      const energyMinimum = argMaximum((y) => -specificEnergyM(section, y, dischargeM3s), depthM / 10, upper * 0.999, 1e-10);
      const forceMinimum = argMaximum((y) => -specificForceM3(section, y, dischargeM3s), depthM / 10, upper * 0.999, 1e-10);
      // A minimum is flat, so golden-section search locates it only to about sqrt(machine epsilon).
      expectRelative({ id: 'Emin', source: 'dE/dy = 1 - Q^2 T / (g A^3) = 0 at yc (derived)', input, value: energyMinimum, expected: depthM, relativeTolerance: 1e-6, unit: 'm' });
      expectRelative({ id: 'Mmin', source: 'dM/dy = A - Q^2 T / (g A^2) = 0 at yc (derived)', input, value: forceMinimum, expected: depthM, relativeTolerance: 1e-6, unit: 'm' });
    },
  );

  it('Belanger conjugate depths have equal specific force in a rectangle', () => {
    // y2/y1 = (sqrt(1 + 8 F1^2) - 1)/2 (Belanger; any text; derived from momentum).
    const section = rectangleSection({ bottomWidthM: 2.5 });
    const dischargeM3s = 7;
    for (const upstreamDepthM of [0.15, 0.3, 0.6]) {
      const upstreamFroude = froudeNumber(section, upstreamDepthM, dischargeM3s);
      const downstreamDepthM = (upstreamDepthM * (Math.sqrt(1 + 8 * upstreamFroude ** 2) - 1)) / 2;
      expectRelative({
        id: 'Belanger',
        source: 'Belanger: y2/y1 = (sqrt(1 + 8 F1^2) - 1)/2 for a rectangular channel (any text; derived from momentum)',
        input: `b = 2.5 m, Q = 7 m3/s, y1 = ${upstreamDepthM} m, F1 = ${upstreamFroude.toFixed(3)}`,
        value: specificForceM3(section, downstreamDepthM, dischargeM3s),
        expected: specificForceM3(section, upstreamDepthM, dischargeM3s),
        relativeTolerance: 1e-12,
        unit: 'm3',
      });
    }
  });

  it('critical slope: normal depth on the critical slope equals critical depth', () => {
    for (const section of sections) {
      const dischargeM3s = 0.9;
      const manningN = 0.022;
      const critical = criticalSlope(section, dischargeM3s, manningN);
      expect(critical.converged).toBe(true);
      if (!critical.converged) continue;
      const normal = solveNormalDepth(section, { dischargeM3s, manningN, bedSlope: critical.slope });
      expect(normal.converged).toBe(true);
      if (!normal.converged) continue;
      expectRelative({ id: 'Sc', source: 'definition of critical slope (derived)', input: `${section.description}, Q = 0.9 m3/s, n = 0.022, Sc = ${critical.slope}`, value: normal.depthM, expected: critical.criticalDepthM, relativeTolerance: 1e-9, unit: 'm' });
      expect(classifySlope(critical.slope, normal.depthM, critical.criticalDepthM)).toBe('critical');
      expect(classifySlope(critical.slope * 0.5, solveDepth(section, dischargeM3s, manningN, critical.slope * 0.5), critical.criticalDepthM)).toBe('mild');
      expect(classifySlope(critical.slope * 2, solveDepth(section, dischargeM3s, manningN, critical.slope * 2), critical.criticalDepthM)).toBe('steep');
    }
  });

  it('hydraulic state at a depth gathers the same numbers as the point functions', () => {
    const section = trapezoidSection({ bottomWidthM: 1.2, leftSideSlopeHV: 2, rightSideSlopeHV: 2 });
    const state = hydraulicStateAt(section, 0.5, 1.1);
    // A = 1.2*0.5 + 2*0.25 = 1.1 m2, so V = 1 m/s; T = 3.2 m; Fr = 1 / sqrt(g * 1.1 / 3.2).
    expectRelative({ id: 'state-V', source: 'V = Q/A (derived)', input: 'b = 1.2 m, z = 2, y = 0.5 m, Q = 1.1 m3/s', value: state.velocityMs, expected: 1, relativeTolerance: 1e-14, unit: 'm/s' });
    expectRelative({ id: 'state-Fr', source: 'Fr = V / sqrt(g A/T) (derived)', input: 'same', value: state.froudeNumber, expected: 1 / Math.sqrt((GRAVITY_MS2 * 1.1) / 3.2), relativeTolerance: 1e-14, unit: '-' });
    expectRelative({ id: 'state-E', source: 'E = y + V^2/2g (derived)', input: 'same', value: state.specificEnergyM, expected: 0.5 + 1 / (2 * GRAVITY_MS2), relativeTolerance: 1e-14, unit: 'm' });
    expectRelative({ id: 'state-D', source: 'D = A/T (derived)', input: 'same', value: state.hydraulicDepthM, expected: 1.1 / 3.2, relativeTolerance: 1e-14, unit: 'm' });
  });
});

function solveDepth(section: SectionGeometry, dischargeM3s: number, manningN: number, bedSlope: number): number | undefined {
  const result = solveNormalDepth(section, { dischargeM3s, manningN, bedSlope });
  return result.converged ? result.depthM : undefined;
}

describe('classification', () => {
  it.each([
    { froude: 0.5, regime: 'subcritical' },
    { froude: 1 - 1e-9, regime: 'critical' },
    { froude: 1.2, regime: 'supercritical' },
  ] as const)('Froude $froude is $regime', ({ froude, regime }) => {
    expect(classifyRegime(froude)).toBe(regime);
  });
  it.each([
    { slope: 0, normal: undefined, critical: 0.5, expected: 'horizontal' },
    { slope: -0.001, normal: undefined, critical: 0.5, expected: 'adverse' },
    { slope: 0.001, normal: 0.8, critical: 0.5, expected: 'mild' },
    { slope: 0.05, normal: 0.3, critical: 0.5, expected: 'steep' },
    // A conduit over its uniform-flow capacity has no free-surface normal depth: its grade line is above the crown.
    { slope: 0.001, normal: undefined, critical: 0.5, expected: 'mild' },
  ] as const)('slope $slope, yn $normal, yc $critical is $expected (Chow 1959, Sec. 9-2; from memory, high)', ({ slope, normal, critical, expected }) => {
    expect(classifySlope(slope, normal, critical)).toBe(expected);
  });
});

describe('critical depth: explicit outcomes for bad or extreme input', () => {
  it.each([0, -1, Number.NaN, Number.POSITIVE_INFINITY, 1e-320, 1e300])('Q = %f m3/s is invalid input', (dischargeM3s) => {
    const result = solveCriticalDepth(rectangleSection({ bottomWidthM: 2 }), dischargeM3s);
    expect(result.converged).toBe(false);
    if (!result.converged) expect(result.reason).toBe('invalid-input');
  });
  it('a bad section is invalid input, naming the dimension', () => {
    const result = solveCriticalDepth(circleSection({ diameterM: 0 }), 1);
    expect(!result.converged && result.message).toContain('diameter');
  });
  it('a flow whose critical depth is at a conduit crown within rounding is reported, not faked', () => {
    // D = 0.2 m carrying 5000 m3/s: Z/D^(5/2) ~ 9e4, beyond the ~4.8e3 reached one rounding step below the crown.
    const result = solveCriticalDepth(circleSection({ diameterM: 0.2 }), 5000);
    expect(result.converged).toBe(false);
    if (!result.converged) expect(result.message).toMatch(/crown/);
  });
  it('a critical depth a hair below the crown is still found, to the precision doubles allow', () => {
    const diameterM = 0.6;
    const section = circleSection({ diameterM });
    // Choose yc = D (1 - 1e-9) and compute the flow from Q^2 T = g A^3 directly.
    const depthM = diameterM * (1 - 1e-9);
    const dischargeM3s = Math.sqrt((GRAVITY_MS2 * section.areaM2(depthM) ** 3) / section.topWidthM(depthM));
    const value = criticalOrFail(section, dischargeM3s);
    // Z ~ (D - y)^(-1/4) there, so a 1e-10 tolerance on Z pins D - y to about 4e-10 of itself, i.e. y to ~1e-18 D;
    // the spacing of doubles (1.1e-16 D) is the real limit.
    expectWithin({ id: 'near-crown', source: 'Q^2 T = g A^3 (derived)', input: `D = 0.6 m, Q = ${dischargeM3s.toPrecision(6)} m3/s`, value: (diameterM - value) / diameterM, expected: 1e-9, tolerance: 1e-15, unit: '1 - y/D' });
  });
});
