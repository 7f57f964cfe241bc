/**
 * Each finding, fired by thresholds from the criteria, on designs whose numbers are known in closed form:
 * - a V-ditch (triangle): yn = [Q n (2 sqrt(1+z^2))^(2/3) / (z^(5/3) S^(1/2))]^(3/8) in SI with k = 1
 *   (REFERENCES.md N8, derived), so V = Q / (z yn^2) and tau_d = gamma yn S;
 * - a rectangle: yc = (q^2/g)^(1/3) (REFERENCES.md C5, derived), and the slope on which that is normal depth;
 * - a circular pipe: Qfull = (1/n) (pi D^2/4) (D/4)^(2/3) S^(1/2) and Qmax / Qfull = 1.076 (REFERENCES.md P2,
 *   Chow 1959 Ch. 6; from memory, high; exact 1.07571).
 * Each case has its negative twin.
 */
import { describe, expect, it } from 'vitest';
import { GRAVITY_MS2 } from '../../language/hydraulics/index.js';
import { analyse, codesOf, flowOf, reachOf } from './analysis-test-kit.js';

const UNIT_WEIGHT_NM3 = 9810; // common practice, REFERENCES.md

/** Normal depth of a symmetric triangle, SI (N8). */
function triangleNormalDepthM(dischargeM3s: number, manningN: number, sideSlope: number, bedSlope: number): number {
  return ((dischargeM3s * manningN * (2 * Math.sqrt(1 + sideSlope ** 2)) ** (2 / 3)) / (sideSlope ** (5 / 3) * Math.sqrt(bedSlope))) ** (3 / 8);
}

/** A V-ditch design in SI with the given extra lining lines and criteria. */
function vDitch(options: { liningLines?: string; criteria?: string; bank?: string; slope?: string; discharge?: string } = {}): string {
  return `
design "V-ditch"
units SI
${options.criteria ?? ''}
flows { q = ${options.discharge ?? '0.5 m3/s'} }
section vee triangle { side slopes 3:1  bank height ${options.bank ?? '1 m'} }
lining turf { n 0.03 ${options.liningLines ?? ''} }
channel c { reach r { section vee  lining turf  slope ${options.slope ?? '0.01 m/m'}  length 100 m } outlet free fall }`;
}

const Q = 0.5;
const N = 0.03;
const Z = 3;
const S = 0.01;
const YN = triangleNormalDepthM(Q, N, Z, S);
const V = Q / (Z * YN * YN);
const TAU = UNIT_WEIGHT_NM3 * YN * S;

async function findingsOf(text: string): Promise<string[]> {
  return codesOf(flowOf(reachOf(await analyse(text), 'c', 'r'), 'q'));
}

async function findingOf(text: string, code: string) {
  const finding = flowOf(reachOf(await analyse(text), 'c', 'r'), 'q').findings.find((candidate) => candidate.code === code);
  expect(finding, code).toBeDefined();
  return finding!;
}

describe('the closed-form V-ditch itself', () => {
  it(`has normal depth ${YN.toFixed(4)} m (N8, derived)`, async () => {
    const flow = flowOf(reachOf(await analyse(vDitch()), 'c', 'r'), 'q');
    expect(Math.abs((flow.normal?.depth_m ?? 0) - YN)).toBeLessThan(1e-9);
  });
});

describe('overtopping and freeboard-below-required', () => {
  it('over-tops (error) when the bank is below normal depth', async () => {
    const finding = await findingOf(vDitch({ bank: `${(YN * 0.9).toFixed(4)} m` }), 'overtopping');
    expect(finding.severity).toBe('error');
    expect(finding.data['normalDepth_m']).toBeCloseTo(YN, 9);
  });
  it('does not over-top with the bank above normal depth', async () => expect(await findingsOf(vDitch({ bank: `${(YN * 1.1).toFixed(4)} m` }))).not.toContain('overtopping'));
  it('warns when the freeboard left is less than the fixed requirement', async () => {
    const bankM = YN + 0.1;
    const finding = await findingOf(vDitch({ bank: `${bankM} m`, criteria: 'criteria { freeboard 0.15 m }' }), 'freeboard-below-required');
    expect(finding.severity).toBe('warning');
    expect(finding.data['actual_m']).toBeCloseTo(0.1, 9);
    expect(finding.data['required_m']).toBeCloseTo(0.15, 12);
  });
  it('is satisfied by a freeboard above the requirement', async () =>
    expect(await findingsOf(vDitch({ bank: `${YN + 0.2} m`, criteria: 'criteria { freeboard 0.15 m }' }))).not.toContain('freeboard-below-required'));
  it('reports over-topping rather than freeboard when both apply', async () => {
    const codes = await findingsOf(vDitch({ bank: `${YN * 0.9} m`, criteria: 'criteria { freeboard 0.15 m }' }));
    expect(codes).toContain('overtopping');
    expect(codes).not.toContain('freeboard-below-required');
  });
  it('requires the USBR freeboard sqrt(C y) with a fixed C (Chow 1959 Ch. 7, derived from the rule)', async () => {
    const coefficientM = 0.6;
    const required = Math.sqrt(coefficientM * YN);
    const finding = await findingOf(vDitch({ bank: `${YN + required * 0.5} m`, criteria: `criteria { freeboard usbr coefficient ${coefficientM} m }` }), 'freeboard-below-required');
    expect(finding.data['required_m']).toBeCloseTo(required, 9);
    expect(finding.message).toContain('USBR rule F = sqrt(C y) with C = 0.6 m');
  });
});

describe('lining limits: velocity-above-permissible and shear-above-permissible', () => {
  it('warns within the limit margin (default 20 %) and fails past it', async () => {
    const warning = await findingOf(vDitch({ liningLines: `permissible velocity ${V / 1.1} m/s` }), 'velocity-above-permissible');
    expect(warning.severity).toBe('warning');
    const error = await findingOf(vDitch({ liningLines: `permissible velocity ${V / 1.3} m/s` }), 'velocity-above-permissible');
    expect(error.severity).toBe('error');
    expect(error.data['velocity_mps']).toBeCloseTo(V, 9);
  });
  it('follows a limit margin set in the criteria', async () => {
    const finding = await findingOf(vDitch({ liningLines: `permissible velocity ${V / 1.1} m/s`, criteria: 'criteria { limit margin 5 % }' }), 'velocity-above-permissible');
    expect(finding.severity).toBe('error');
  });
  it('is quiet below the permissible velocity', async () => expect(await findingsOf(vDitch({ liningLines: `permissible velocity ${V * 1.05} m/s` }))).not.toContain('velocity-above-permissible'));
  it('compares the maximum shear gamma y S (FHWA HEC-15 3rd ed. 2005, Eq. 3.1; confirmed) with the lining', async () => {
    const finding = await findingOf(vDitch({ liningLines: `permissible shear ${TAU / 1.1} Pa` }), 'shear-above-permissible');
    expect(finding.severity).toBe('warning');
    expect(finding.data['maxShear_Pa']).toBeCloseTo(TAU, 6);
    expect(await findingsOf(vDitch({ liningLines: `permissible shear ${TAU * 1.05} Pa` }))).not.toContain('shear-above-permissible');
  });
});

describe('velocity-below-self-cleansing', () => {
  it('informs when the velocity is below the minimum', async () => {
    const finding = await findingOf(vDitch({ criteria: `criteria { minimum velocity ${V * 1.1} m/s }` }), 'velocity-below-self-cleansing');
    expect(finding.severity).toBe('information');
  });
  it('is quiet above it', async () => expect(await findingsOf(vDitch({ criteria: `criteria { minimum velocity ${V * 0.9} m/s }` }))).not.toContain('velocity-below-self-cleansing'));
  it('defaults to 0.6 m/s in an SI design (common practice)', async () => {
    const reach = reachOf(await analyse(vDitch()), 'c', 'r');
    expect(reach.criteria.minVelocity_mps).toBe(0.6);
    expect(reach.criteria.origin['minVelocity']).toBe('default');
  });
});

describe('near-critical-flow and supercritical-flow', () => {
  // Rectangle b = 2 m, Q = 2 m3/s, n = 0.013: yc = (q^2/g)^(1/3) (C5, derived); the critical slope follows from
  // Manning at yc. On that slope normal depth is critical depth, Fr = 1.
  const widthM = 2;
  const dischargeM3s = 2;
  const manningN = 0.013;
  const criticalDepthM = Math.cbrt((dischargeM3s / widthM) ** 2 / GRAVITY_MS2);
  const areaM2 = widthM * criticalDepthM;
  const radiusM = areaM2 / (widthM + 2 * criticalDepthM);
  const criticalSlope = ((dischargeM3s * manningN) / (areaM2 * radiusM ** (2 / 3))) ** 2;
  const flume = (slope: number, criteria = ''): string => `
design "Flume"
units SI
${criteria}
flows { q = ${dischargeM3s} m3/s }
section flume rectangle { bottom width ${widthM} m  bank height 2 m }
lining concrete { n ${manningN} }
channel c { reach r { section flume  lining concrete  slope ${slope} m/m  length 50 m } outlet free fall }`;

  it('flags Fr = 1 on the critical slope as near-critical (FHWA HEC-11 (1989) Sec. 3.2 band 0.89-1.13; secondary)', async () => {
    const flow = flowOf(reachOf(await analyse(flume(criticalSlope)), 'c', 'r'), 'q');
    expect(Math.abs((flow.normal?.froudeNumber ?? 0) - 1)).toBeLessThan(1e-6);
    expect(Math.abs((flow.critical?.depth_m ?? 0) - criticalDepthM)).toBeLessThan(1e-9);
    expect(codesOf(flow)).toEqual(['near-critical-flow']);
    expect(flow.findings[0]?.message).toContain('FHWA HEC-11');
  });
  it('flags a steep slope as supercritical, with the jump and superelevation warnings', async () => {
    const flow = flowOf(reachOf(await analyse(flume(criticalSlope * 4)), 'c', 'r'), 'q');
    expect(flow.regime).toBe('supercritical');
    expect(flow.slopeClass).toBe('steep');
    expect(codesOf(flow)).toEqual(['supercritical-flow']);
    expect(flow.findings[0]?.message).toMatch(/hydraulic jump forms where the flow returns to subcritical, and bends need a superelevation check/);
  });
  it('flags neither on a mild slope', async () => {
    const flow = flowOf(reachOf(await analyse(flume(criticalSlope / 4)), 'c', 'r'), 'q');
    expect(flow.regime).toBe('subcritical');
    expect(codesOf(flow)).toEqual([]);
  });
  it('uses a band set in the criteria', async () =>
    expect(await findingsOf(flume(criticalSlope / 4, 'criteria { avoid froude 0.3 to 1.2 }'))).toEqual(['near-critical-flow']));
});

describe('conduit-two-depth-zone and conduit-over-capacity', () => {
  const diameterM = 0.9;
  const manningN = 0.013;
  const bedSlope = 0.005;
  const fullCapacity = (1 / manningN) * ((Math.PI * diameterM ** 2) / 4) * (diameterM / 4) ** (2 / 3) * Math.sqrt(bedSlope);
  const pipe = (dischargeM3s: number): string => `
design "Pipe"
units SI
flows { q = ${dischargeM3s} m3/s }
section pipe circle { diameter ${diameterM} m }
lining concrete { n ${manningN} }
channel c { reach r { section pipe  lining concrete  slope ${bedSlope} m/m  length 50 m } outlet free fall }`;

  it('runs partly full with neither finding below full-pipe capacity', async () => {
    const codes = await findingsOf(pipe(0.9 * fullCapacity));
    expect(codes).not.toContain('conduit-two-depth-zone');
    expect(codes).not.toContain('conduit-over-capacity');
  });
  it('warns between Qfull and Qmax = 1.076 Qfull, reporting the lower depth (P2)', async () => {
    const flow = flowOf(reachOf(await analyse(pipe(1.05 * fullCapacity)), 'c', 'r'), 'q');
    expect(codesOf(flow)).toContain('conduit-two-depth-zone');
    expect(flow.findings.find((finding) => finding.code === 'conduit-two-depth-zone')?.severity).toBe('warning');
    // The lower of the two depths lies below the depth of peak capacity, 0.938 D (P1, from memory, high).
    expect(flow.normal?.depth_m ?? 1).toBeLessThan(0.938 * diameterM);
    expect(flow.normalDepthNote).toMatch(/Lower of two normal depths/);
  });
  it('fails above Qmax = 1.076 Qfull, with no normal depth (P2)', async () => {
    const flow = flowOf(reachOf(await analyse(pipe(1.09 * fullCapacity)), 'c', 'r'), 'q');
    expect(codesOf(flow)).toEqual(['conduit-over-capacity']);
    expect(flow.findings[0]?.severity).toBe('error');
    expect(flow.normal).toBeNull();
    expect(Number(flow.findings[0]?.data['peakCapacity_m3s']) / fullCapacity).toBeCloseTo(1.076, 2);
  });
});

describe('no-normal-depth', () => {
  it('informs, per flow, that a horizontal reach has no normal depth, and keeps the critical depth', async () => {
    const flow = flowOf(reachOf(await analyse(vDitch({ slope: '0 %' })), 'c', 'r'), 'q');
    expect(codesOf(flow)).toEqual(['no-normal-depth']);
    expect(flow.findings[0]?.severity).toBe('information');
    expect(flow.normal).toBeNull();
    expect(flow.slopeClass).toBe('horizontal');
    // Triangle closed form yc = (2 Q^2 / (g z^2))^(1/5) (REFERENCES.md C6, derived).
    expect(Math.abs((flow.critical?.depth_m ?? 0) - ((2 * Q * Q) / (GRAVITY_MS2 * Z * Z)) ** 0.2)).toBeLessThan(1e-9);
  });
  it('classes a rising bed as adverse', async () => expect(flowOf(reachOf(await analyse(vDitch({ slope: '-0.5 %' })), 'c', 'r'), 'q').slopeClass).toBe('adverse'));
});

describe('finding records', () => {
  it('point at the reach name, name channel, reach and flow, and link the flow definition and the lining', async () => {
    const text = vDitch({ liningLines: `permissible velocity ${V / 1.1} m/s` });
    const finding = await findingOf(text, 'velocity-above-permissible');
    const lines = text.split('\n');
    const reachLine = lines.findIndex((line) => line.includes('reach r'));
    expect(finding.location.range.start).toEqual({ line: reachLine, character: lines[reachLine]!.indexOf('reach r') + 'reach '.length });
    expect([finding.channel, finding.reach, finding.flow]).toEqual(['c', 'r', 'q']);
    expect(finding.related.map((related) => related.message)).toEqual(['Discharge of q set here', "Lining 'turf'"]);
    expect(finding.message).toMatch(/^Velocity at q is [\d.]+ m\/s, above the [\d.]+ m\/s that lining 'turf' permits \(by 10 %; more than 20 % over is an error\)\.$/);
  });
});
