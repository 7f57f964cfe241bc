/**
 * Properties of normal and critical depth over wide random ranges (fast-check). Each property is a consequence of
 * Manning's equation or of the critical-flow condition Q^2 T = g A^3 (derived), checked with formulas written
 * here, not with the engine's own discharge function. Ranges (SI): discharge 1e-4 to 1e4 m3/s, n 0.008 to 0.2,
 * slope 1e-6 to 0.5, widths 0.05 to 200 m, side slopes 0 to 10, parabola top width 0.1 to 100 m at 0.05 to 10 m,
 * diameters 0.05 to 10 m; log-uniform where the range spans decades.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  circleSection,
  conduitConveyance,
  criticalSlope,
  froudeNumber,
  GRAVITY_MS2,
  parabolaSection,
  rectangleSection,
  solveCriticalDepth,
  solveNormalDepth,
  trapezoidSection,
  triangleSection,
  type SectionGeometry,
} from '../../language/hydraulics/index.js';
import { fromSI, toSI } from '../../language/units/units.js';

const RUNS = 400;

const logUniform = (low: number, high: number): fc.Arbitrary<number> =>
  fc.double({ min: Math.log(low), max: Math.log(high), noNaN: true }).map((x) => Math.exp(x));
const uniform = (low: number, high: number): fc.Arbitrary<number> => fc.double({ min: low, max: high, noNaN: true });

const openSection: fc.Arbitrary<SectionGeometry> = fc.oneof(
  logUniform(0.05, 200).map((bottomWidthM) => rectangleSection({ bottomWidthM })),
  fc
    .tuple(logUniform(0.05, 200), uniform(0, 10), uniform(0, 10))
    .map(([bottomWidthM, leftSideSlopeHV, rightSideSlopeHV]) => trapezoidSection({ bottomWidthM, leftSideSlopeHV, rightSideSlopeHV })),
  fc.tuple(uniform(0.1, 10), uniform(0, 10)).map(([leftSideSlopeHV, rightSideSlopeHV]) => triangleSection({ leftSideSlopeHV, rightSideSlopeHV })),
  fc.tuple(logUniform(0.1, 100), logUniform(0.05, 10)).map(([topWidthM, atDepthM]) => parabolaSection({ topWidthM, atDepthM })),
);
const anySection: fc.Arbitrary<SectionGeometry> = fc.oneof(openSection, logUniform(0.05, 10).map((diameterM) => circleSection({ diameterM })));

const discharge = logUniform(1e-4, 1e4);
const roughness = uniform(0.008, 0.2);
const slope = logUniform(1e-6, 0.5);

/** Manning's discharge written out here (SI, k = 1), independent of the engine's discharge function. */
function manningQ(section: SectionGeometry, depthM: number, manningN: number, bedSlope: number): number {
  const area = section.areaM2(depthM);
  return (area * (area / section.wettedPerimeterM(depthM)) ** (2 / 3) * Math.sqrt(bedSlope)) / manningN;
}

/** For a conduit, a discharge within its uniform-flow capacity (a fraction of it); open sections keep Q. */
function withinCapacity(section: SectionGeometry, dischargeM3s: number, manningN: number, bedSlope: number, fraction: number): number {
  const facts = conduitConveyance(section);
  return facts === undefined ? dischargeM3s : (fraction * facts.peakConveyanceM83 * Math.sqrt(bedSlope)) / manningN;
}

function normalDepth(section: SectionGeometry, dischargeM3s: number, manningN: number, bedSlope: number): number {
  const result = solveNormalDepth(section, { dischargeM3s, manningN, bedSlope });
  if (!result.converged) throw new Error(`${section.description}: Q = ${dischargeM3s}, n = ${manningN}, S = ${bedSlope}: ${result.message}`);
  return result.depthM;
}

describe('normal depth properties', () => {
  it('Manning discharge at the normal depth equals the design discharge, |Q(yn) - Q| <= 1e-9 Q', () => {
    fc.assert(
      fc.property(anySection, discharge, roughness, slope, uniform(1e-6, 1), (section, q, manningN, bedSlope, fraction) => {
        const dischargeM3s = withinCapacity(section, q, manningN, bedSlope, fraction);
        const depthM = normalDepth(section, dischargeM3s, manningN, bedSlope);
        const error = Math.abs(manningQ(section, depthM, manningN, bedSlope) / dischargeM3s - 1);
        expect(error, `${section.description}, Q = ${dischargeM3s}, n = ${manningN}, S = ${bedSlope}: yn = ${depthM}`).toBeLessThanOrEqual(1e-9);
      }),
      { numRuns: RUNS },
    );
  });

  it('yn rises with Q and with n, and falls with S', () => {
    fc.assert(
      fc.property(anySection, discharge, roughness, slope, uniform(1e-4, 0.9), uniform(1.001, 3), (section, q, manningN, bedSlope, fraction, factor) => {
        // For a conduit the larger flow stays on the rising branch: at most 0.9 x 3 / 3 of the peak (fraction / 3 scaled).
        const dischargeM3s = withinCapacity(section, q, manningN, bedSlope, fraction / 3);
        const base = normalDepth(section, dischargeM3s, manningN, bedSlope);
        const label = `${section.description}, Q = ${dischargeM3s}, n = ${manningN}, S = ${bedSlope}, factor ${factor}`;
        expect(normalDepth(section, dischargeM3s * factor, manningN, bedSlope), `more flow: ${label}`).toBeGreaterThan(base);
        expect(normalDepth(section, dischargeM3s, manningN * factor, bedSlope), `rougher: ${label}`).toBeGreaterThan(base);
        expect(normalDepth(section, dischargeM3s, manningN, bedSlope * factor), `steeper: ${label}`).toBeLessThan(base);
      }),
      { numRuns: RUNS },
    );
  });

  it('the same case in SI and in US units gives the same depth, and satisfies US Manning with k = (1/0.3048)^(1/3)', () => {
    const usManningK = Math.cbrt(1 / 0.3048);
    fc.assert(
      fc.property(logUniform(0.2, 600), uniform(0, 6), discharge, roughness, slope, (bottomWidthFt, sideSlope, q, manningN, bedSlope) => {
        // The case as a US engineer writes it: feet and cfs, read through the unit table.
        const dischargeCfs = fromSI(q, 'cfs');
        const usSection = trapezoidSection({ bottomWidthM: toSI(bottomWidthFt, 'ft')!, leftSideSlopeHV: sideSlope, rightSideSlopeHV: sideSlope });
        const usDepthFt = fromSI(normalDepth(usSection, toSI(dischargeCfs, 'cfs')!, manningN, toSI(bedSlope * 100, '%')!), 'ft');
        // The same case written in SI.
        const siSection = trapezoidSection({ bottomWidthM: bottomWidthFt * 0.3048, leftSideSlopeHV: sideSlope, rightSideSlopeHV: sideSlope });
        const siDepthM = normalDepth(siSection, q, manningN, bedSlope);
        expect(Math.abs((usDepthFt * 0.3048) / siDepthM - 1), `b = ${bottomWidthFt} ft, z = ${sideSlope}, Q = ${dischargeCfs} cfs`).toBeLessThanOrEqual(1e-12);
        // US-customary Manning in feet at that depth.
        const areaFt2 = usDepthFt * (bottomWidthFt + sideSlope * usDepthFt);
        const perimeterFt = bottomWidthFt + 2 * usDepthFt * Math.sqrt(1 + sideSlope * sideSlope);
        const usCfs = (usManningK / manningN) * areaFt2 * (areaFt2 / perimeterFt) ** (2 / 3) * Math.sqrt(bedSlope);
        expect(Math.abs(usCfs / dischargeCfs - 1), `US Manning at yn = ${usDepthFt} ft`).toBeLessThanOrEqual(1e-9);
      }),
      { numRuns: RUNS },
    );
  });

  it('mean evaluations per normal-depth solve stay within the 6 the engine promises', () => {
    let solves = 0;
    let evaluations = 0;
    fc.assert(
      fc.property(anySection, discharge, roughness, slope, uniform(1e-6, 1), (section, q, manningN, bedSlope, fraction) => {
        const result = solveNormalDepth(section, { dischargeM3s: withinCapacity(section, q, manningN, bedSlope, fraction), manningN, bedSlope });
        solves++;
        evaluations += result.evaluations;
      }),
      { numRuns: 2000 },
    );
    expect(evaluations / solves).toBeLessThanOrEqual(6);
  });
});

describe('critical depth properties', () => {
  it('Froude number at critical depth is 1 (Q^2 T = g A^3), for flows with a critical depth below 0.999 of a crown', () => {
    fc.assert(
      fc.property(anySection, discharge, (section, q) => {
        const dischargeM3s = section.fullDepthM === undefined ? q : Math.min(q, criticalFlowAt(section, 0.999));
        const result = solveCriticalDepth(section, dischargeM3s);
        expect(result.converged, `${section.description}, Q = ${dischargeM3s}`).toBe(true);
        if (!result.converged) return;
        const froude = froudeNumber(section, result.depthM, dischargeM3s);
        expect(Math.abs(froude - 1), `${section.description}, Q = ${dischargeM3s}, yc = ${result.depthM}`).toBeLessThanOrEqual(1e-9);
      }),
      { numRuns: RUNS },
    );
  });

  it('critical depth does not depend on n or S (the critical-slope solve finds the same yc for any n)', () => {
    fc.assert(
      fc.property(openSection, discharge, roughness, roughness, (section, dischargeM3s, firstN, secondN) => {
        const first = criticalSlope(section, dischargeM3s, firstN);
        const second = criticalSlope(section, dischargeM3s, secondN);
        const direct = solveCriticalDepth(section, dischargeM3s);
        if (!first.converged || !second.converged || !direct.converged) throw new Error('no critical depth');
        expect(first.criticalDepthM).toBe(direct.depthM);
        expect(second.criticalDepthM).toBe(direct.depthM);
        // Sc scales with n^2 exactly: Sc = (Q n / K(yc))^2.
        expect(Math.abs(second.slope / first.slope / (secondN / firstN) ** 2 - 1)).toBeLessThanOrEqual(1e-12);
      }),
      { numRuns: RUNS },
    );
  });
});

/** The discharge whose critical depth is the given fraction of a conduit's height: Q = sqrt(g A^3 / T). */
function criticalFlowAt(section: SectionGeometry, fraction: number): number {
  const depthM = fraction * section.fullDepthM!;
  return Math.sqrt((GRAVITY_MS2 * section.areaM2(depthM) ** 3) / section.topWidthM(depthM));
}

describe('every outcome is a finite depth or an explicit no-solution with a reason', () => {
  const wildNumber = fc.oneof(
    fc.constantFrom(0, -0, -1, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, 1e-320, 1e-300, 1e300, Number.MAX_VALUE),
    fc.double(),
    logUniform(1e-30, 1e30),
  );
  const wildSection: fc.Arbitrary<SectionGeometry> = fc.oneof(
    anySection,
    wildNumber.map((bottomWidthM) => rectangleSection({ bottomWidthM })),
    fc.tuple(wildNumber, wildNumber, wildNumber).map(([bottomWidthM, leftSideSlopeHV, rightSideSlopeHV]) => trapezoidSection({ bottomWidthM, leftSideSlopeHV, rightSideSlopeHV })),
    fc.tuple(wildNumber, wildNumber).map(([leftSideSlopeHV, rightSideSlopeHV]) => triangleSection({ leftSideSlopeHV, rightSideSlopeHV })),
    fc.tuple(wildNumber, wildNumber).map(([topWidthM, atDepthM]) => parabolaSection({ topWidthM, atDepthM })),
    wildNumber.map((diameterM) => circleSection({ diameterM })),
  );
  it('normal depth, critical depth and critical slope never throw, never return NaN, and always say why not', () => {
    fc.assert(
      fc.property(wildSection, wildNumber, wildNumber, wildNumber, (section, dischargeM3s, manningN, bedSlope) => {
        const normal = solveNormalDepth(section, { dischargeM3s, manningN, bedSlope });
        const critical = solveCriticalDepth(section, dischargeM3s);
        const slopeResult = criticalSlope(section, dischargeM3s, manningN);
        const label = `${section.description}, Q = ${dischargeM3s}, n = ${manningN}, S = ${bedSlope}`;
        if (normal.converged) expect(Number.isFinite(normal.depthM) && normal.depthM > 0, `normal: ${label}`).toBe(true);
        else expect(normal.reason.length > 0 && normal.message.length > 0, `normal: ${label}`).toBe(true);
        if (critical.converged) expect(Number.isFinite(critical.depthM) && critical.depthM > 0, `critical: ${label}`).toBe(true);
        else expect(critical.reason.length > 0 && critical.message.length > 0, `critical: ${label}`).toBe(true);
        if (slopeResult.converged) expect(Number.isFinite(slopeResult.slope) && slopeResult.slope > 0, `slope: ${label}`).toBe(true);
        else expect(slopeResult.message.length > 0, `slope: ${label}`).toBe(true);
        expect(Number.isFinite(normal.evaluations) && Number.isFinite(critical.evaluations)).toBe(true);
      }),
      { numRuns: 3000 },
    );
  });

  it('over the plausible ranges every open-channel solve converges (no "did-not-converge" hides in normal use)', () => {
    fc.assert(
      fc.property(openSection, discharge, roughness, slope, (section, dischargeM3s, manningN, bedSlope) => {
        expect(solveNormalDepth(section, { dischargeM3s, manningN, bedSlope }).converged).toBe(true);
        expect(solveCriticalDepth(section, dischargeM3s).converged).toBe(true);
      }),
      { numRuns: RUNS },
    );
  });
});
