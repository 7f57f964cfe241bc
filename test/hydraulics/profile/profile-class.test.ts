/**
 * Profile classes (Chow 1959, Ch. 9, Table 9-1; from memory, high): M1 y > yn > yc; M2 yn > y > yc; M3 yn > yc > y;
 * S1 y > yc > yn; S2 yc > y > yn; S3 yc > yn > y; C1 y > yc = yn; C3 y < yc = yn; H2 y > yc and H3 y < yc on a
 * horizontal bed; A2 and A3 likewise on an adverse bed. There is no C2, H1 or A1.
 * First the table itself, then every class met in a computed profile of a channel built to show it.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { criticalSlope } from '../../../language/hydraulics/critical-flow.js';
import {
  classifyProfile,
  computeChannelProfile,
  type ChannelProfileInput,
  type ProfileClass,
  type SegmentClass,
} from '../../../language/hydraulics/profile/index.js';
import { rectangleSection } from '../../../language/hydraulics/sections/index.js';

describe('Chow (1959) Table 9-1 (from memory, high)', () => {
  const table: readonly { slope: Parameters<typeof classifyProfile>[0]; yn: number | undefined; yc: number; y: number; expected: ProfileClass }[] = [
    { slope: 'mild', yn: 2, yc: 1, y: 3, expected: 'M1' },
    { slope: 'mild', yn: 2, yc: 1, y: 1.5, expected: 'M2' },
    { slope: 'mild', yn: 2, yc: 1, y: 0.5, expected: 'M3' },
    { slope: 'steep', yn: 1, yc: 2, y: 3, expected: 'S1' },
    { slope: 'steep', yn: 1, yc: 2, y: 1.5, expected: 'S2' },
    { slope: 'steep', yn: 1, yc: 2, y: 0.5, expected: 'S3' },
    { slope: 'critical', yn: 1, yc: 1, y: 1.5, expected: 'C1' },
    { slope: 'critical', yn: 1, yc: 1, y: 0.5, expected: 'C3' },
    { slope: 'horizontal', yn: undefined, yc: 1, y: 1.5, expected: 'H2' },
    { slope: 'horizontal', yn: undefined, yc: 1, y: 0.5, expected: 'H3' },
    { slope: 'adverse', yn: undefined, yc: 1, y: 1.5, expected: 'A2' },
    { slope: 'adverse', yn: undefined, yc: 1, y: 0.5, expected: 'A3' },
  ];
  it.each(table)('$slope slope, y = $y, yn = $yn, yc = $yc: $expected', ({ slope, yn, yc, y, expected }) => {
    expect(classifyProfile(slope, y, yn, yc)).toBe(expected);
  });

  it('property: there is no C2, H1 or A1, and the zone follows the order of y, yn and yc', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 10, noNaN: true }), fc.double({ min: 0.01, max: 10, noNaN: true }), fc.double({ min: 0.01, max: 10, noNaN: true }), (y, a, b) => {
        expect(['C1', 'C3']).toContain(classifyProfile('critical', y, a, a));
        expect(['H2', 'H3']).toContain(classifyProfile('horizontal', y, undefined, a));
        expect(['A2', 'A3']).toContain(classifyProfile('adverse', y, undefined, a));
        const [yc, yn] = a < b ? [a, b] : [b, a]; // mild: yn above yc
        const mild = classifyProfile('mild', y, yn, yc);
        expect(mild).toBe(y >= yn ? 'M1' : y >= yc ? 'M2' : 'M3');
        const steep = classifyProfile('steep', y, yc, yn); // steep: normal depth is the smaller one
        expect(steep).toBe(y >= yn ? 'S1' : y >= yc ? 'S2' : 'S3');
      }),
    );
  });
});

describe('every class in a computed profile', () => {
  const width = 3;
  const q = 6;
  const rectangle = rectangleSection({ bottomWidthM: width });
  const n = 0.015;
  const single = (bedSlope: number, outlet: ChannelProfileInput['outlet'], inlet?: ChannelProfileInput['inlet']): readonly SegmentClass[] => {
    const result = computeChannelProfile({ reaches: [{ name: 'reach', section: rectangle, manningN: n, bedSlope, lengthM: 150 }], dischargeM3s: q, outlet, inlet });
    if (!result.converged) throw new Error(result.message);
    return result.reaches[0]?.profileClasses ?? [];
  };
  const mild = 0.0008;
  const steep = 0.03;
  const critical = criticalSlope(rectangle, q, n);
  if (!critical.converged) throw new Error('critical slope');

  const cases: readonly { label: string; classes: () => readonly SegmentClass[]; expected: readonly SegmentClass[] }[] = [
    { label: 'M1 behind a high outlet level on a mild slope', classes: () => single(mild, { kind: 'water-level', elevationM: 3 }), expected: ['M1'] },
    { label: 'M2 above a free fall on a mild slope', classes: () => single(mild, { kind: 'free-fall' }), expected: ['M2'] },
    { label: 'M3 below a gate on a mild slope, then the jump and M2', classes: () => single(mild, { kind: 'free-fall' }, { kind: 'depth', depthM: 0.2 }), expected: ['M3', 'M2'] },
    // The S2 curve from critical depth at the entrance reaches normal depth well within 150 m before the jump.
    { label: 'S1 behind a high outlet level on a steep slope, below S2 and the jump', classes: () => single(steep, { kind: 'water-level', elevationM: 2.5 }), expected: ['S2', 'uniform', 'S1'] },
    { label: 'S2 from critical depth at the entrance of a steep reach', classes: () => single(steep, { kind: 'free-fall' }), expected: ['S2', 'uniform'] },
    { label: 'S3 below a gate on a steep slope', classes: () => single(steep, { kind: 'free-fall' }, { kind: 'depth', depthM: 0.15 }), expected: ['S3', 'uniform'] },
    // A C1 surface is nearly level: over 150 m it falls about S0 L = 0.7 m below the outlet's 1.5 m, still above yc = 0.74 m.
    { label: 'C1 behind a high outlet level on a critical slope', classes: () => single(critical.slope, { kind: 'water-level', elevationM: 1.5 }), expected: ['C1'] },
    { label: 'C3 below a gate on a critical slope', classes: () => single(critical.slope, { kind: 'free-fall' }, { kind: 'depth', depthM: 0.3 }), expected: ['C3', 'uniform'] },
    { label: 'H2 above a free fall on a horizontal bed', classes: () => single(0, { kind: 'free-fall' }), expected: ['H2'] },
    { label: 'H3 below a gate on a horizontal bed, then H2', classes: () => single(0, { kind: 'water-level', elevationM: 1.2 }, { kind: 'depth', depthM: 0.2 }), expected: ['H3', 'H2'] },
    { label: 'A2 above a free fall on an adverse bed', classes: () => single(-0.002, { kind: 'free-fall' }), expected: ['A2'] },
    { label: 'A3 below a gate on an adverse bed, then A2', classes: () => single(-0.002, { kind: 'free-fall' }, { kind: 'depth', depthM: 0.2 }), expected: ['A3', 'A2'] },
  ];
  it.each(cases)('$label', ({ classes, expected }) => {
    expect(classes()).toEqual(expected);
  });
});
