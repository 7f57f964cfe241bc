/**
 * Which way a result change is judged: the rules of compared-quantities.ts, case by case, each with its twin.
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';
import type { DesignAnalysis } from '../../language/analysis/model.js';
import { compareDesignPair } from '../../language/diff/compare-designs.js';
import { COMPARED_CAPACITY, COMPARED_FLOW_RESULTS, type DirectionContext } from '../../language/diff/compared-quantities.js';
import { buildText } from '../language/language-test-kit.js';

function rule(key: string): (before: number, after: number, context: DirectionContext) => string {
  const quantity = COMPARED_FLOW_RESULTS.find((item) => item.key === key);
  if (quantity === undefined) throw new Error(key);
  return quantity.direction;
}

// Near-critical band 0.89 to 1.13: FHWA HEC-11, Design of Riprap Revetment (1989), Sec. 3.2 (secondary).
const context: DirectionContext = { maxVelocity_mps: null, minVelocity_mps: null, maxShear_Pa: null, avoidFroude: { low: 0.89, high: 1.13 } };

describe('Froude number', () => {
  const froude = rule('froudeNumber');
  it.each([
    ['subcritical, rising toward the band', 0.5, 0.7, 'worse'],
    ['subcritical, falling away from the band', 0.7, 0.5, 'better'],
    ['entering the band from below', 0.8, 0.95, 'worse'],
    ['leaving the band downward', 0.95, 0.8, 'better'],
    ['turning supercritical past the band', 0.7, 1.5, 'worse'],
    ['returning to subcritical', 1.5, 0.7, 'better'],
    ['supercritical, rising (stronger jump)', 1.5, 2.0, 'worse'],
    ['supercritical, falling', 2.0, 1.5, 'better'],
    ['moving inside the band', 0.95, 1.05, 'neutral'],
  ])('%s: %f -> %f is %s', (_case, before, after, expected) => {
    expect(froude(before, after, context)).toBe(expected);
  });
});

describe('velocity', () => {
  const velocity = rule('velocity_mps');
  it('faster is worse on a lining with a permissible velocity, slower better', () => {
    const limited = { ...context, maxVelocity_mps: 1.8 };
    expect(velocity(1.0, 1.2, limited)).toBe('worse');
    expect(velocity(1.2, 1.0, limited)).toBe('better');
  });
  it('below the self-cleansing minimum, faster is better and slower worse', () => {
    const minimum = { ...context, minVelocity_mps: 0.6 };
    expect(velocity(0.5, 0.55, minimum)).toBe('better');
    expect(velocity(0.7, 0.5, minimum)).toBe('worse');
  });
  it('well above the minimum with no upper limit, not judged', () => {
    expect(velocity(1.5, 1.2, { ...context, minVelocity_mps: 0.6 })).toBe('neutral');
    expect(velocity(1.2, 1.5, context)).toBe('neutral');
  });
});

describe('freeboard, shear, capacity, depth', () => {
  it('less freeboard is worse, more is better', () => {
    expect(rule('freeboard_m')(0.3, 0.2, context)).toBe('worse');
    expect(rule('freeboard_m')(0.2, 0.3, context)).toBe('better');
  });
  it('more shear is worse only against a permissible shear', () => {
    expect(rule('maxShear_Pa')(20, 25, { ...context, maxShear_Pa: 30 })).toBe('worse');
    expect(rule('maxShear_Pa')(25, 20, { ...context, maxShear_Pa: 30 })).toBe('better');
    expect(rule('maxShear_Pa')(20, 25, context)).toBe('neutral');
  });
  it('less capacity is worse, more is better', () => {
    expect(COMPARED_CAPACITY.direction(10, 8)).toBe('worse');
    expect(COMPARED_CAPACITY.direction(8, 10)).toBe('better');
  });
  it('depths are shown but not judged (freeboard carries the consequence)', () => {
    expect(rule('normalDepth_m')(1, 2, context)).toBe('neutral');
    expect(rule('criticalDepth_m')(2, 1, context)).toBe('neutral');
  });
});

describe('the water surface along a reach, from the profile', () => {
  // A mild rectangular channel of two reaches ending in a pool: raising the pool raises the backwater (an M1 curve)
  // in both reaches while nothing else in the file changes. At the outlet the water stands at the pool level, so the
  // deepest water of the lower reach is the pool level minus its downstream invert (the outlet control; common
  // practice), 1.20 m then 1.60 m here.
  const design = (poolLevelM: number): string =>
    [
      'design "Pool outlet"',
      'units SI',
      'criteria {\n  freeboard 0.1 m\n}',
      'flows {\n  q = 2 m3/s\n}',
      'section box rectangle {\n  bottom width 3 m\n  bank height 2 m\n}',
      'lining concrete {\n  n 0.015\n}',
      'channel c {',
      '  reach upper {\n    section box\n    lining concrete\n    inverts 10.20 m to 10.10 m\n    length 200 m\n  }',
      '  reach lower {\n    section box\n    lining concrete\n    inverts 10.10 m to 10.00 m\n    length 200 m\n  }',
      `  outlet water level ${poolLevelM.toFixed(2)} m`,
      '}',
    ].join('\n');
  const analysed = async (text: string): Promise<DesignAnalysis> => analyzeDocument(await buildText(text), NO_CRITERIA_DEFAULTS);

  it('a higher pool shows as deeper water and less freeboard along both reaches, normal depth unchanged', async () => {
    const before = await analysed(design(11.2));
    const after = await analysed(design(11.6));
    const comparison = compareDesignPair({ path: 'pool.runnel', previousPath: null, before: { analysis: before, problems: [] }, after: { analysis: after, problems: [] } });
    const lowerBefore = before.channels[0]?.reaches[1]?.flows[0]?.profile;
    const lowerAfter = after.channels[0]?.reaches[1]?.flows[0]?.profile;
    expect(lowerBefore?.maximumDepth_m).toBeCloseTo(1.2, 9);
    expect(lowerAfter?.maximumDepth_m).toBeCloseTo(1.6, 9);
    for (const reachName of ['upper', 'lower']) {
      const changes = comparison.reaches.find((reach) => reach.reach === reachName)?.flows[0]?.resultChanges ?? [];
      const deepest = changes.find((change) => change.quantity === 'profileMaximumDepth_m');
      const freeboard = changes.find((change) => change.quantity === 'profileMinimumFreeboard_m');
      expect(deepest?.difference ?? 0, reachName).toBeGreaterThan(0);
      expect(deepest?.direction).toBe('neutral');
      expect(freeboard?.difference ?? 0, reachName).toBeLessThan(0);
      expect(freeboard?.direction).toBe('worse');
      expect(changes.some((change) => change.quantity === 'normalDepth_m')).toBe(false);
    }
  });
});
