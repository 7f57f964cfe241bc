/**
 * Comparison of two versions of a design, on hand-built pairs whose results come from Manning's equation
 * computed in the fixtures (independently of Runnel's engine). The base channel is Chow (1959) Open-Channel
 * Hydraulics, Ch. 6 uniform-flow example (Example 6-2 as recalled; REFERENCES.md N1, from memory): trapezoid
 * b = 20 ft, z = 2, n = 0.025, S = 0.0016, Q = 400 cfs, normal depth 3.361 ft with k = 1.486.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { DesignAnalysis } from '../../language/analysis/model.js';
import { compareDesignPair, compareDesignVersions, type DesignPair } from '../../language/diff/compare-designs.js';
import type { DesignComparison, ReachComparison, ResultChange } from '../../language/diff/comparison-model.js';
import { failureReason } from '../../language/diff/fail-policy.js';
import type { SignificanceThresholds } from '../../language/diff/thresholds.js';
import { CFS_M3S, designOf, FOOT_M, type LiningSpec, type ReachSpec, type SectionSpec } from './fixtures.js';

const ZERO_THRESHOLDS: SignificanceThresholds = { relative: 0, length_m: 0, velocity_mps: 0, froudeNumber: 0, shear_Pa: 0, discharge_m3s: 0 };
const PSF_PA = 47.880259; // 1 lbf/ft2 in Pa (NIST SP 811, App. B)
const wide: SectionSpec = { name: 'wide', bottomWidth_m: 20 * FOOT_M, sideSlope_HV: 2, bankDepth_m: 5 * FOOT_M };
const earth: LiningSpec = { name: 'earth', manningN: 0.025 };
const q100 = { name: 'q100', discharge_m3s: 400 * CFS_M3S, description: '100-year storm' };
const upper: ReachSpec = { channel: 'east', name: 'upper', section: wide, lining: earth, slope: 0.0016, length_m: 900 * FOOT_M, flows: [q100], requiredFreeboard_m: 1.5 * FOOT_M };

function pairOf(before: DesignAnalysis | null, after: DesignAnalysis | null): DesignPair {
  return {
    path: 'east.runnel',
    previousPath: null,
    before: before === null ? null : { analysis: before, problems: [] },
    after: after === null ? null : { analysis: after, problems: [] },
  };
}

function compare(before: readonly ReachSpec[], after: readonly ReachSpec[]): DesignComparison {
  return compareDesignPair(pairOf(designOf('east', before), designOf('east', after)));
}

function onlyReach(comparison: DesignComparison): ReachComparison {
  expect(comparison.reaches).toHaveLength(1);
  const reach = comparison.reaches[0];
  if (reach === undefined) throw new Error('no reach');
  return reach;
}

function result(reach: ReachComparison, quantity: string, flow = 'q100'): ResultChange {
  const change = reach.flows.find((item) => item.flow === flow)?.resultChanges.find((item) => item.quantity === quantity);
  if (change === undefined) throw new Error(`no ${quantity} change at ${flow}; got ${JSON.stringify(reach.flows)}`);
  return change;
}

describe('a width change (bottom 20 ft -> 16 ft)', () => {
  const narrower = { ...upper, section: { ...wide, bottomWidth_m: 16 * FOOT_M } };
  const comparison = compare([upper], [narrower]);
  const reach = onlyReach(comparison);

  it('lists the input with before and after in SI', () => {
    expect(reach.change).toBe('modified');
    const input = reach.inputChanges.find((change) => change.field === 'section.dimensions.bottomWidth_m');
    expect(input?.before).toBeCloseTo(20 * FOOT_M, 9);
    expect(input?.after).toBeCloseTo(16 * FOOT_M, 9);
    expect(comparison.definitions).toEqual([expect.objectContaining({ kind: 'section', change: 'modified', name: 'wide' })]);
  });

  it('reports normal depth before as the published 3.361 ft, and deeper after (narrower channel, same flow)', () => {
    const depth = result(reach, 'normalDepth_m');
    // Chow (1959) Ch. 6 example, REFERENCES.md N1 (from memory): 3.361 ft with k = 1.486; 0.2 % tolerance.
    expect(Math.abs((depth.before ?? 0) / FOOT_M - 3.361)).toBeLessThan(0.0067);
    expect(depth.after ?? 0).toBeGreaterThan(depth.before ?? 0);
    expect(depth.difference).toBeCloseTo((depth.after ?? 0) - (depth.before ?? 0), 12);
    expect(depth.direction).toBe('neutral');
  });

  it('judges the freeboard loss worse and the freeboard check newly failing (1.5 ft required)', () => {
    const freeboard = result(reach, 'freeboard_m');
    expect(freeboard.direction).toBe('worse');
    expect(freeboard.before ?? 0).toBeGreaterThan(1.5 * FOOT_M);
    expect(freeboard.after ?? 0).toBeLessThan(1.5 * FOOT_M);
    expect(reach.checkChanges).toEqual([expect.objectContaining({ change: 'newly-failing', code: 'freeboard-below-required', flow: 'q100', severityBefore: null, severityAfter: 'warning' })]);
    expect(comparison.counts.newlyFailing).toBe(1);
    expect(comparison.counts.newErrors).toBe(0);
  });

  it('applies each --fail-on policy to it (a new warning only)', () => {
    const report = compareDesignVersions([pairOf(designOf('east', [upper]), designOf('east', [narrower]))], { beforeLabel: 'main', afterLabel: 'working tree' });
    expect(report.verdict).toBe('worse');
    expect(failureReason(report, 'new-errors')).toBeNull();
    expect(failureReason(report, 'errors')).toBeNull();
    expect(failureReason(report, 'warnings')).toMatch(/1 warning/);
    expect(failureReason(report, 'never')).toBeNull();
  });

  it('says less bank-full capacity is worse', () => {
    expect(reach.capacityChange?.direction).toBe('worse');
    expect(reach.capacityChange?.after ?? Infinity).toBeLessThan(reach.capacityChange?.before ?? 0);
  });
});

describe('a slope change (0.16 % -> 0.64 %) on a lining that permits 6 ft/s', () => {
  const limited = { ...upper, lining: { ...earth, maxVelocity_mps: 6 * FOOT_M } };
  const steeper = { ...limited, slope: 0.0064 };
  const reach = onlyReach(compare([limited], [steeper]));

  it('lists the slope and judges faster flow worse and more freeboard better', () => {
    expect(reach.inputChanges).toEqual([expect.objectContaining({ field: 'slope', before: 0.0016, after: 0.0064, kind: 'slope' })]);
    expect(result(reach, 'velocity_mps').direction).toBe('worse');
    expect(result(reach, 'freeboard_m').direction).toBe('better');
    // Froude number rises from subcritical into the near-critical band 0.89-1.13 (FHWA HEC-11 (1989) Sec. 3.2, secondary).
    expect(result(reach, 'froudeNumber').direction).toBe('worse');
  });

  it('has the velocity check and the near-critical check newly failing', () => {
    const codes = reach.checkChanges.filter((change) => change.change === 'newly-failing').map((change) => change.code);
    expect(codes.sort()).toEqual(['near-critical-flow', 'velocity-above-permissible']);
  });
});

describe('a lining change on a steep reach (short grass -> 6 in riprap)', () => {
  // Permissible shear, FHWA HEC-15 2nd ed. (1988) Table 3 (from memory, medium): class D grass 0.60 psf, riprap
  // D50 6 in 2.0 psf. Manning's n 0.030 and 0.033 as in the samples' library (Chow 1959 Table 5-6).
  const grass: LiningSpec = { name: 'grass-short', manningN: 0.03, maxShear_Pa: 0.6 * PSF_PA };
  const riprap: LiningSpec = { name: 'riprap-6in', manningN: 0.033, maxShear_Pa: 2.0 * PSF_PA };
  const steep = { ...upper, slope: 0.0064, lining: grass };
  const reach = onlyReach(compare([steep], [{ ...steep, lining: riprap }]));

  it('lists the lining name and its values', () => {
    const fields = reach.inputChanges.map((change) => change.field);
    expect(fields).toEqual(['lining', 'lining.manningN', 'lining.maxShear_Pa']);
    expect(reach.inputChanges[0]).toMatchObject({ before: 'grass-short', after: 'riprap-6in', kind: 'text' });
  });

  it('has the shear check newly passing, and the reach from failing to passing', () => {
    // gamma y S with y about 2.6 ft and S = 0.0064: about 50 Pa, above 1.2 x 28.7 Pa (an error) and below 95.8 Pa.
    expect(reach.checkChanges).toEqual([expect.objectContaining({ change: 'newly-passing', code: 'shear-above-permissible', severityBefore: 'error', severityAfter: null })]);
    expect(reach.statusBefore).toBe('fail');
    expect(reach.statusAfter).toBe('pass');
  });
});

describe('reaches added and removed', () => {
  const lower: ReachSpec = { ...upper, name: 'lower', slope: 0.003 };
  const outfall: ReachSpec = { ...upper, name: 'outfall', slope: 0.02, section: { ...wide, name: 'outfall', bankDepth_m: 2 * FOOT_M } };
  const comparison = compare([upper, lower], [upper, outfall]);

  it('lists the new and the removed reach and counts the unchanged one', () => {
    expect(comparison.reaches.map((reach) => [reach.reach, reach.change])).toEqual([
      ['outfall', 'added'],
      ['lower', 'removed'],
    ]);
    expect(comparison.counts.reachesUnchanged).toBe(1);
    expect(comparison.counts.reachesChanged).toBe(2);
  });

  it("counts the new reach's failing checks as newly failing, and a removed reach's as nothing", () => {
    const added = comparison.reaches.find((reach) => reach.change === 'added');
    // On a 2 % slope the fixture's 400 cfs runs below critical depth: a supercritical-flow warning, new with the reach.
    expect(added?.checkChanges.every((change) => change.change === 'newly-failing' || change.change === 'new-notice')).toBe(true);
    expect(added?.checkChanges.map((change) => change.code)).toContain('supercritical-flow');
    const removed = comparison.reaches.find((reach) => reach.change === 'removed');
    expect(removed?.checkChanges).toEqual([]);
    expect(comparison.definitions).toEqual([expect.objectContaining({ kind: 'section', change: 'added', name: 'outfall' })]);
  });
});

describe('renames', () => {
  it('recognises a reach renamed with its definition unchanged', () => {
    const comparison = compare([upper], [{ ...upper, name: 'upper-run' }]);
    const reach = onlyReach(comparison);
    expect(reach).toMatchObject({ change: 'renamed', reach: 'upper-run', previous: { channel: 'east', reach: 'upper' } });
    expect(reach.inputChanges).toEqual([]);
    expect(reach.flows).toEqual([]);
  });

  it('recognises a reach moved to a renamed channel', () => {
    const reach = onlyReach(compare([upper], [{ ...upper, channel: 'east-perimeter' }]));
    expect(reach).toMatchObject({ change: 'renamed', channel: 'east-perimeter', previous: { channel: 'east', reach: 'upper' } });
  });

  it('does not call a changed reach under a new name a rename', () => {
    const comparison = compare([upper], [{ ...upper, name: 'upper-run', slope: 0.002 }]);
    expect(comparison.reaches.map((reach) => reach.change).sort()).toEqual(['added', 'removed']);
  });

  it('recognises a renamed section, lining and flow, and leaves the reach unchanged', () => {
    const renamed: ReachSpec = {
      ...upper,
      section: { ...wide, name: 'wide-trapezoid' },
      lining: { ...earth, name: 'earth-excavated' },
      flows: [{ ...q100, name: 'q100yr' }],
    };
    const comparison = compare([upper], [renamed]);
    expect(comparison.reaches).toEqual([]);
    expect(comparison.counts.reachesUnchanged).toBe(1);
    expect(comparison.definitions.map((change) => [change.kind, change.change, change.previousName, change.name])).toEqual([
      ['section', 'renamed', 'wide', 'wide-trapezoid'],
      ['lining', 'renamed', 'earth', 'earth-excavated'],
      ['flow', 'renamed', 'q100', 'q100yr'],
    ]);
    expect(comparison.fileChange).toBe('modified');
  });
});

describe('significance thresholds', () => {
  // Manning's n 0.025 -> 0.02505 (+0.2 %) moves normal depth by about +0.12 %: below the 1 % default.
  const rougher = { ...upper, lining: { ...earth, manningN: 0.02505 } };

  it('lists the input but no result change under the defaults', () => {
    const reach = onlyReach(compare([upper], [rougher]));
    expect(reach.inputChanges.map((change) => change.field)).toEqual(['lining.manningN']);
    expect(reach.flows).toEqual([]);
    expect(reach.unchangedFlowCount).toBe(1);
  });

  it('lists the result changes when the thresholds are zero', () => {
    const comparison = compareDesignPair(pairOf(designOf('east', [upper]), designOf('east', [rougher])), ZERO_THRESHOLDS);
    const quantities = onlyReach(comparison).flows[0]?.resultChanges.map((change) => change.quantity);
    expect(quantities).toEqual(expect.arrayContaining(['normalDepth_m', 'velocity_mps', 'froudeNumber', 'freeboard_m', 'maxShear_Pa']));
    expect(quantities).not.toContain('criticalDepth_m'); // critical depth does not depend on n
  });
});

describe('files', () => {
  it('a new file: every reach added', () => {
    const comparison = compareDesignPair(pairOf(null, designOf('east', [upper])));
    expect(comparison.fileChange).toBe('added');
    expect(comparison.reaches.map((reach) => reach.change)).toEqual(['added']);
  });

  it('a removed file: every reach removed, nothing newly passing', () => {
    const comparison = compareDesignPair(pairOf(designOf('east', [upper]), null));
    expect(comparison.fileChange).toBe('removed');
    expect(comparison.counts.newlyPassing).toBe(0);
  });

  it('a file that no longer parses: the comparison is incomplete and its syntax error is a new error', () => {
    const comparison = compareDesignPair({
      path: 'east.runnel',
      previousPath: null,
      before: { analysis: designOf('east', [upper]), problems: [] },
      after: { analysis: null, problems: [{ severity: 'error', code: 'parsing-error', message: "Expecting '}'", line: 12 }] },
    });
    expect(comparison.incomplete).toBe(true);
    expect(comparison.reaches).toEqual([]);
    expect(comparison.counts.newErrors).toBe(1);
  });

  it('a problem that only moved to another line is not new', () => {
    const problem = { severity: 'warning' as const, code: 'manning-n-unusual', message: "Manning's n 0.2 is outside the usual range.", line: 4 };
    const comparison = compareDesignPair({
      path: 'east.runnel',
      previousPath: null,
      before: { analysis: designOf('east', [upper]), problems: [problem] },
      after: { analysis: designOf('east', [upper]), problems: [{ ...problem, line: 9 }] },
    });
    expect(comparison.newProblems).toEqual([]);
    expect(comparison.fileChange).toBe('unchanged');
  });
});

describe('properties', () => {
  const reachArbitrary = fc.record({
    bottomFt: fc.double({ min: 1, max: 40, noNaN: true }),
    sideSlope: fc.double({ min: 0, max: 4, noNaN: true }),
    bankFt: fc.double({ min: 1, max: 10, noNaN: true }),
    n: fc.double({ min: 0.011, max: 0.08, noNaN: true }),
    slope: fc.double({ min: 0.0002, max: 0.05, noNaN: true }),
    // Discharge per foot of bottom width, so depths stay those of real channels (0.1 ft to about 20 ft).
    cfsPerFt: fc.double({ min: 0.5, max: 50, noNaN: true }),
  });
  const specOf = (r: { bottomFt: number; sideSlope: number; bankFt: number; n: number; slope: number; cfsPerFt: number }): ReachSpec => ({
    ...upper,
    section: { name: 'x', bottomWidth_m: r.bottomFt * FOOT_M, sideSlope_HV: r.sideSlope, bankDepth_m: r.bankFt * FOOT_M },
    lining: { name: 'l', manningN: r.n },
    slope: r.slope,
    flows: [{ name: 'q', discharge_m3s: r.cfsPerFt * r.bottomFt * CFS_M3S }],
  });

  it('a design compared with itself is unchanged', () => {
    fc.assert(
      fc.property(reachArbitrary, (r) => {
        const design = designOf('east', [specOf(r)]);
        const report = compareDesignVersions([pairOf(design, design)], { beforeLabel: 'a', afterLabel: 'b' });
        expect(report.verdict).toBe('unchanged');
        expect(report.designs).toEqual([]);
        expect(report.unchangedDesignCount).toBe(1);
      }),
      { numRuns: 50 },
    );
  });

  it('swapping the versions flips the freeboard change: same size, opposite sign and judgement', () => {
    fc.assert(
      fc.property(reachArbitrary, fc.double({ min: 0.5, max: 0.8, noNaN: true }), (r, widthFactor) => {
        const before = designOf('east', [specOf(r)]);
        // Same discharge in a narrower channel.
        const after = designOf('east', [specOf({ ...r, bottomFt: r.bottomFt * widthFactor, cfsPerFt: r.cfsPerFt / widthFactor })]);
        // Zero thresholds: every nonzero change is listed, so both directions always have one to compare.
        const forward = compareDesignPair(pairOf(before, after), ZERO_THRESHOLDS);
        const backward = compareDesignPair(pairOf(after, before), ZERO_THRESHOLDS);
        const find = (comparison: DesignComparison): ResultChange | undefined =>
          comparison.reaches[0]?.flows[0]?.resultChanges.find((change) => change.quantity === 'freeboard_m');
        const there = find(forward);
        const back = find(backward);
        expect(there).toBeDefined();
        expect(back).toBeDefined();
        expect(there?.difference ?? 0).toBeCloseTo(-(back?.difference ?? 0), 12);
        expect(there?.direction).toBe('worse'); // narrower channel: deeper flow, less freeboard
        expect(back?.direction).toBe('better');
      }),
      { numRuns: 50 },
    );
  });
});
