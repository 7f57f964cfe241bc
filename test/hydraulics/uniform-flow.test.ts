/**
 * Normal depth and conduit capacity against published worked examples, closed forms and the properties of the
 * partly full circle. Sources and confidence words are copied from /work/shared/REFERENCES.md.
 *
 * About k: the classic US-customary examples use Manning's k = 1.49; Runnel computes in SI with k = 1 and exact
 * unit factors, so its US k is (1/0.3048)^(1/3) = 1.4859. Where a published figure was computed with 1.49, the
 * test reproduces the book's k by solving with n' = n x 1.4859 / 1.49 (Manning's Q depends on k/n only), so
 * the comparison is like for like and the tolerance is only the rounding of the printed figure.
 */
import { describe, expect, it } from 'vitest';
import {
  circleSection,
  conduitConveyance,
  conveyance,
  fullFlowCapacityM3s,
  hydraulicRadiusM,
  manningDischargeM3s,
  maximumUniformFlowCapacityM3s,
  rectangleSection,
  solveNormalDepth,
  trapezoidSection,
  triangleSection,
  type SectionGeometry,
} from '../../language/hydraulics/index.js';
import { fromSI, toSI } from '../../language/units/units.js';
import { argMaximum, expectRelative, expectWithin } from './engineering-check.js';

const FOOT_M = 0.3048; // exact by definition (international foot, 1959)
/** Manning's k in US units implied by SI k = 1 and the exact foot: (1 m / 1 ft)^(1/3). */
const US_K_FROM_UNITS = Math.cbrt(1 / FOOT_M);
const BOOK_K = 1.49;

const CHOW_N1 = 'Chow (1959) Open-Channel Hydraulics, Ch. 6 uniform-flow example (Example 6-2 as recalled) (from memory (recomputes exactly))';
const CHOW_N2 = 'Chow (1959) Example 6-1 as transcribed by a third party (secondary, low)';
const TRIANGLE_N8 = 'triangle, closed form from Manning with A = z y^2, P = 2 y sqrt(1+z^2) (derived)';
const CIRCLE_P = 'Chow (1959) Ch. 6, properties of the circular section; also FHWA HEC-22 partly-full charts';

function depthOrFail(section: SectionGeometry, dischargeM3s: number, manningN: number, bedSlope: number): number {
  const result = solveNormalDepth(section, { dischargeM3s, manningN, bedSlope });
  if (!result.converged) throw new Error(`no normal depth for ${section.description}, Q = ${dischargeM3s}: ${result.message}`);
  return result.depthM;
}

describe("Manning's k = 1.486 follows from the unit conversion", () => {
  it('the US coefficient implied by the unit table is 1.486 to the precision the texts print', () => {
    const footInMetres = toSI(1, 'ft')!;
    expectWithin({ id: 'k-US', source: "US-customary Manning coefficient 1.486 (common practice)", input: '(1 m / 1 ft)^(1/3) from the unit table', value: Math.cbrt(1 / footInMetres), expected: 1.486, tolerance: 0.0005, unit: '-' });
  });
  it('an engine discharge computed in SI and converted to cfs equals (1.4859/n) A R^(2/3) S^(1/2) in feet', () => {
    // Any depth and section: the engine works in SI; the US formula is evaluated here directly in feet.
    const section = trapezoidSection({ bottomWidthM: 20 * FOOT_M, leftSideSlopeHV: 2, rightSideSlopeHV: 2 });
    const depthFt = 3;
    const manningN = 0.025;
    const bedSlope = 0.0016;
    const engineCfs = fromSI(manningDischargeM3s(section, depthFt * FOOT_M, manningN, bedSlope), 'cfs');
    const areaFt2 = 20 * depthFt + 2 * depthFt * depthFt;
    const perimeterFt = 20 + 2 * depthFt * Math.sqrt(5);
    const usFormulaCfs = (US_K_FROM_UNITS / manningN) * areaFt2 * (areaFt2 / perimeterFt) ** (2 / 3) * Math.sqrt(bedSlope);
    expectRelative({ id: 'k-US-Q', source: 'unit conversion of Manning (derived)', input: 'b = 20 ft, z = 2, y = 3 ft, n = 0.025, S = 0.0016', value: engineCfs, expected: usFormulaCfs, relativeTolerance: 1e-12, unit: 'cfs' });
    // And with the rounded 1.486 of the texts the difference is only the rounding of k (under 0.01%).
    expectRelative({ id: 'k-US-1.486', source: "US-customary Manning coefficient 1.486 (common practice)", input: 'same, k = 1.486', value: engineCfs, expected: usFormulaCfs * (1.486 / US_K_FROM_UNITS), relativeTolerance: 1e-4, unit: 'cfs' });
  });
});

describe('published uniform-flow examples (US customary)', () => {
  const chowChannel = trapezoidSection({ bottomWidthM: 20 * FOOT_M, leftSideSlopeHV: 2, rightSideSlopeHV: 2 });
  it('N1: b = 20 ft, z = 2, n = 0.025, S = 0.0016, Q = 400 cfs gives yn = 3.36 ft with the book\'s k = 1.49', () => {
    const bookEquivalentN = (0.025 * US_K_FROM_UNITS) / BOOK_K;
    const depthFt = depthOrFail(chowChannel, toSI(400, 'cfs')!, bookEquivalentN, 0.0016) / FOOT_M;
    // Printed to 0.01 ft: half a unit in the last place.
    expectWithin({ id: 'N1', source: CHOW_N1, input: 'b = 20 ft, z = 2, n = 0.025, S = 0.0016, Q = 400 cfs, k = 1.49', value: depthFt, expected: 3.36, tolerance: 0.005, unit: 'ft' });
  });
  it('N1 with k = 1.486 (Runnel\'s own k): 3.361 ft', () => {
    const depthFt = depthOrFail(chowChannel, toSI(400, 'cfs')!, 0.025, 0.0016) / FOOT_M;
    expectWithin({ id: 'N1-1.486', source: CHOW_N1, input: 'same, k = 1.4859 from the unit conversion', value: depthFt, expected: 3.361, tolerance: 0.0005, unit: 'ft' });
  });
  it('N2: b = 20 ft, z = 1.5, y = 4 ft, n = 0.025, S = 0.0016 carries 519 cfs (k = 1.49)', () => {
    const section = trapezoidSection({ bottomWidthM: 20 * FOOT_M, leftSideSlopeHV: 1.5, rightSideSlopeHV: 1.5 });
    const engineCfs = fromSI(manningDischargeM3s(section, 4 * FOOT_M, 0.025, 0.0016), 'cfs') * (BOOK_K / US_K_FROM_UNITS);
    // Secondary, low-confidence third-party copy: 1% covers a mis-rounded or mis-copied last digit, nothing more.
    expectRelative({ id: 'N2', source: CHOW_N2, input: 'b = 20 ft, z = 1.5, y = 4 ft, n = 0.025, S = 0.0016, k = 1.49', value: engineCfs, expected: 519, relativeTolerance: 0.01, unit: 'cfs' });
  });
});

describe('closed forms', () => {
  it.each([
    { z: 1, dischargeM3s: 0.05, manningN: 0.016, bedSlope: 0.004 },
    { z: 3, dischargeM3s: 1.2, manningN: 0.03, bedSlope: 0.0008 },
    { z: 6, dischargeM3s: 40, manningN: 0.045, bedSlope: 0.02 },
  ])('N8: triangle z = $z, Q = $dischargeM3s m3/s, n = $manningN, S = $bedSlope', ({ z, dischargeM3s, manningN, bedSlope }) => {
    const expected = ((dischargeM3s * manningN * (2 * Math.sqrt(1 + z * z)) ** (2 / 3)) / (1 * z ** (5 / 3) * Math.sqrt(bedSlope))) ** (3 / 8);
    const value = depthOrFail(triangleSection({ leftSideSlopeHV: z, rightSideSlopeHV: z }), dischargeM3s, manningN, bedSlope);
    expectRelative({ id: 'N8', source: TRIANGLE_N8, input: `z = ${z}, Q = ${dischargeM3s} m3/s, n = ${manningN}, S = ${bedSlope}, k = 1 (SI)`, value, expected, relativeTolerance: 1e-10, unit: 'm' });
  });

  it('wide-rectangle limit: yn -> (q n / sqrt(S))^(3/5), from above, by a factor within (1 + 2 yn / b)^(2/5)', () => {
    // q = 2 m2/s per metre of width, n = 0.03, S = 0.001: the limit is (q n / sqrt S)^(3/5).
    const unitDischarge = 2;
    const manningN = 0.03;
    const bedSlope = 0.001;
    const limitM = ((unitDischarge * manningN) / Math.sqrt(bedSlope)) ** 0.6;
    for (const widthM of [10, 100, 1e3, 1e4, 1e5]) {
      const depthM = depthOrFail(rectangleSection({ bottomWidthM: widthM }), unitDischarge * widthM, manningN, bedSlope);
      // Exactly yn = limit (1 + 2 yn / b)^(2/5) for a rectangle (P = b + 2y), so the excess is known in advance.
      expectRelative({ id: 'wide-limit', source: 'Manning with P = b + 2y -> b (derived)', input: `b = ${widthM} m, q = 2 m2/s, n = 0.03, S = 0.001`, value: depthM, expected: limitM * (1 + (2 * depthM) / widthM) ** 0.4, relativeTolerance: 1e-10, unit: 'm' });
      expect(depthM / limitM - 1, `excess over the wide-channel limit at b = ${widthM} m`).toBeLessThanOrEqual((0.8 * depthM) / widthM);
    }
    const widest = depthOrFail(rectangleSection({ bottomWidthM: 1e5 }), unitDischarge * 1e5, manningN, bedSlope);
    expectRelative({ id: 'wide-limit', source: 'Manning, wide channel R -> y (derived)', input: 'b = 1e5 m', value: widest, expected: limitM, relativeTolerance: 1e-4, unit: 'm' });
  });
});

describe('partly full circular conduit, constant n', () => {
  const diameterM = 1.2;
  const section = circleSection({ diameterM });
  const manningN = 0.013;
  const bedSlope = 0.005;
  const fullCapacity = fullFlowCapacityM3s(section, manningN, bedSlope)!;
  const dischargeAt = (ratio: number): number => manningDischargeM3s(section, ratio * diameterM, manningN, bedSlope);
  const velocityAt = (ratio: number): number => dischargeAt(ratio) / section.areaM2(ratio * diameterM);
  const fullVelocity = fullCapacity / section.areaM2(diameterM);

  it('P1, P2: the largest discharge is near y/D = 0.938 and about 1.076 Qfull', () => {
    const searchedRatio = argMaximum(dischargeAt, 0.5, 1, 1e-9);
    const facts = conduitConveyance(section)!;
    const input = `D = ${diameterM} m, n = ${manningN}, S = ${bedSlope}`;
    expectWithin({ id: 'P1', source: `${CIRCLE_P} (from memory, high)`, input, value: facts.peakDepthM / diameterM, expected: 0.938, tolerance: 0.0005, unit: 'y/D' });
    expectWithin({ id: 'P1-exact', source: `${CIRCLE_P}, exact value 0.93818 (derived)`, input, value: facts.peakDepthM / diameterM, expected: 0.93818, tolerance: 5e-6, unit: 'y/D' });
    expectWithin({ id: 'P1-search', source: 'golden-section search of Manning Q(y) (derived)', input, value: facts.peakDepthM / diameterM, expected: searchedRatio, tolerance: 1e-6, unit: 'y/D' });
    const capacity = maximumUniformFlowCapacityM3s(section, manningN, bedSlope)!;
    expectWithin({ id: 'P2', source: `${CIRCLE_P} (from memory, high)`, input, value: capacity / fullCapacity, expected: 1.076, tolerance: 0.0005, unit: 'Q/Qfull' });
    expectWithin({ id: 'P2-exact', source: `${CIRCLE_P}, exact value 1.07571 (derived)`, input, value: capacity / fullCapacity, expected: 1.07571, tolerance: 5e-6, unit: 'Q/Qfull' });
  });

  it('P3, P4: the largest velocity is near y/D = 0.81 and about 1.14 Vfull', () => {
    const ratio = argMaximum((r) => hydraulicRadiusM(section, r * diameterM), 0.5, 1, 1e-10);
    const input = `D = ${diameterM} m, constant n`;
    expectWithin({ id: 'P3', source: `${CIRCLE_P} (confirmed)`, input, value: ratio, expected: 0.81, tolerance: 0.005, unit: 'y/D' });
    expectWithin({ id: 'P3-exact', source: `${CIRCLE_P}, exact value 0.81280 (derived)`, input, value: ratio, expected: 0.8128, tolerance: 5e-6, unit: 'y/D' });
    expectWithin({ id: 'P4', source: `${CIRCLE_P} (confirmed)`, input, value: velocityAt(ratio) / fullVelocity, expected: 1.14, tolerance: 0.005, unit: 'V/Vfull' });
    expectWithin({ id: 'P4-exact', source: `${CIRCLE_P}, exact value 1.14003 (derived)`, input, value: velocityAt(ratio) / fullVelocity, expected: 1.14003, tolerance: 5e-6, unit: 'V/Vfull' });
  });

  it('P5: at half depth Q = Qfull / 2 and V = Vfull exactly', () => {
    const input = `D = ${diameterM} m, y/D = 0.5`;
    expectWithin({ id: 'P5', source: 'identity (derived)', input, value: dischargeAt(0.5) / fullCapacity, expected: 0.5, tolerance: 1e-13, unit: 'Q/Qfull' });
    expectWithin({ id: 'P5', source: 'identity (derived)', input, value: velocityAt(0.5) / fullVelocity, expected: 1, tolerance: 1e-13, unit: 'V/Vfull' });
  });

  it('P6: Q/Qfull = 0.91 at y/D = 0.75, and Q = Qfull at y/D = 0.82 on the lower branch', () => {
    const source = 'design-memo values quoted by a third party (secondary)';
    expectWithin({ id: 'P6a', source, input: 'y/D = 0.75', value: dischargeAt(0.75) / fullCapacity, expected: 0.9119, tolerance: 0.0005, unit: 'Q/Qfull' });
    const lowerDepth = depthOrFail(section, fullCapacity * (1 + 1e-9), manningN, bedSlope);
    expectWithin({ id: 'P6b', source, input: 'Q = Qfull', value: lowerDepth / diameterM, expected: 0.8196, tolerance: 0.0005, unit: 'y/D' });
  });

  it('between Qfull and the peak two depths carry the flow: the lower is reported and marked', () => {
    const below = solveNormalDepth(section, { dischargeM3s: 0.999 * fullCapacity, manningN, bedSlope });
    const between = solveNormalDepth(section, { dischargeM3s: 1.05 * fullCapacity, manningN, bedSlope });
    expect(below.converged && below.branch).toBe('single');
    expect(between.converged && between.branch).toBe('lower-of-two');
    if (!between.converged) return;
    // The other root lies between the peak and the crown: the reported one is the lower.
    const facts = conduitConveyance(section)!;
    expect(between.depthM).toBeLessThan(facts.peakDepthM);
    const upperRootRatio = argMaximum((r) => -Math.abs(dischargeAt(r) - 1.05 * fullCapacity), facts.peakDepthM / diameterM, 1, 1e-12);
    expect(upperRootRatio * diameterM).toBeGreaterThan(between.depthM);
    expectRelative({ id: 'two-depth', source: 'Manning (derived)', input: 'Q = 1.05 Qfull', value: dischargeAt(upperRootRatio), expected: 1.05 * fullCapacity, relativeTolerance: 1e-6, unit: 'm3/s' });
  });

  it('a flow equal to the largest capacity is carried at the peak depth, not reported as exceeding it', () => {
    const capacity = maximumUniformFlowCapacityM3s(section, manningN, bedSlope)!;
    for (const factor of [1 - 1e-12, 1, 1 + 1e-11]) {
      const result = solveNormalDepth(section, { dischargeM3s: capacity * factor, manningN, bedSlope });
      expect(result.converged, `Q = capacity x ${factor}`).toBe(true);
      if (!result.converged) continue;
      expect(result.branch).toBe('lower-of-two');
      expectRelative({ id: 'at-capacity', source: 'Manning (derived)', input: `Q = capacity x ${factor}`, value: dischargeAt(result.depthM / diameterM), expected: capacity * factor, relativeTolerance: 1e-10, unit: 'm3/s' });
      expect(result.evaluations).toBeLessThanOrEqual(4);
    }
  });

  it('above the peak the flow exceeds capacity, and the result carries that capacity', () => {
    const result = solveNormalDepth(section, { dischargeM3s: 1.08 * fullCapacity, manningN, bedSlope });
    expect(result.converged).toBe(false);
    if (result.converged) return;
    expect(result.reason).toBe('exceeds-capacity');
    expectWithin({ id: 'capacity', source: `${CIRCLE_P} (from memory, high)`, input: 'Q = 1.08 Qfull', value: result.capacityM3s! / fullCapacity, expected: 1.076, tolerance: 0.0005, unit: 'Q/Qfull' });
    expect(result.message).toMatch(/capacity/);
  });

  it('conveyance at the peak and flowing full from the shape agree with the general formula', () => {
    const facts = conduitConveyance(section)!;
    expectRelative({ id: 'Kfull', source: 'K = A R^(2/3) with A = pi D^2/4, R = D/4 (derived)', input: `D = ${diameterM} m`, value: facts.fullConveyanceM83, expected: ((Math.PI * diameterM ** 2) / 4) * (diameterM / 4) ** (2 / 3), relativeTolerance: 1e-13, unit: 'm^(8/3)' });
    expectRelative({ id: 'Kpeak', source: 'K = A R^(2/3) (derived)', input: `D = ${diameterM} m`, value: facts.peakConveyanceM83, expected: conveyance(section, facts.peakDepthM), relativeTolerance: 1e-13, unit: 'm^(8/3)' });
  });
});

describe('no normal depth: explicit outcomes, never NaN, never an exception', () => {
  const section = trapezoidSection({ bottomWidthM: 1, leftSideSlopeHV: 2, rightSideSlopeHV: 2 });
  const cases: { id: string; section?: SectionGeometry; dischargeM3s: number; manningN: number; bedSlope: number; reason: string }[] = [
    { id: 'horizontal', dischargeM3s: 1, manningN: 0.03, bedSlope: 0, reason: 'horizontal-or-adverse-slope' },
    { id: 'adverse', dischargeM3s: 1, manningN: 0.03, bedSlope: -0.002, reason: 'horizontal-or-adverse-slope' },
    { id: 'zero flow', dischargeM3s: 0, manningN: 0.03, bedSlope: 0.001, reason: 'invalid-input' },
    { id: 'negative flow', dischargeM3s: -2, manningN: 0.03, bedSlope: 0.001, reason: 'invalid-input' },
    { id: 'NaN flow', dischargeM3s: Number.NaN, manningN: 0.03, bedSlope: 0.001, reason: 'invalid-input' },
    { id: 'infinite flow', dischargeM3s: Number.POSITIVE_INFINITY, manningN: 0.03, bedSlope: 0.001, reason: 'invalid-input' },
    { id: 'zero n', dischargeM3s: 1, manningN: 0, bedSlope: 0.001, reason: 'invalid-input' },
    { id: 'NaN n', dischargeM3s: 1, manningN: Number.NaN, bedSlope: 0.001, reason: 'invalid-input' },
    { id: 'NaN slope', dischargeM3s: 1, manningN: 0.03, bedSlope: Number.NaN, reason: 'invalid-input' },
    { id: 'infinite slope', dischargeM3s: 1, manningN: 0.03, bedSlope: Number.POSITIVE_INFINITY, reason: 'invalid-input' },
    { id: 'flow too small to compute', dischargeM3s: 1e-300, manningN: 0.03, bedSlope: 0.001, reason: 'invalid-input' },
    { id: 'flow too large to compute', dischargeM3s: 1e300, manningN: 0.03, bedSlope: 0.001, reason: 'invalid-input' },
    { id: 'slope too small to compute', dischargeM3s: 1, manningN: 0.03, bedSlope: 1e-320, reason: 'invalid-input' },
    { id: 'bad section', section: rectangleSection({ bottomWidthM: -1 }), dischargeM3s: 1, manningN: 0.03, bedSlope: 0.001, reason: 'invalid-input' },
    { id: 'conduit over capacity', section: circleSection({ diameterM: 0.3 }), dischargeM3s: 5, manningN: 0.013, bedSlope: 0.001, reason: 'exceeds-capacity' },
  ];
  it.each(cases)('$id', ({ section: caseSection, dischargeM3s, manningN, bedSlope, reason }) => {
    const result = solveNormalDepth(caseSection ?? section, { dischargeM3s, manningN, bedSlope });
    expect(result.converged).toBe(false);
    if (result.converged) return;
    expect(result.reason).toBe(reason);
    expect(result.message.length).toBeGreaterThan(10);
    expect(Number.isFinite(result.evaluations)).toBe(true);
  });

  it.each([
    { id: 'tiny flow', dischargeM3s: 1e-12 },
    { id: 'huge flow', dischargeM3s: 1e9 },
  ])('$id still solves: a finite positive depth that carries the flow', ({ dischargeM3s }) => {
    const depthM = depthOrFail(section, dischargeM3s, 0.03, 0.001);
    expect(Number.isFinite(depthM) && depthM > 0).toBe(true);
    expectRelative({ id: 'extreme', source: 'Manning (derived)', input: `Q = ${dischargeM3s} m3/s`, value: manningDischargeM3s(section, depthM, 0.03, 0.001), expected: dischargeM3s, relativeTolerance: 1e-9, unit: 'm3/s' });
  });
});
