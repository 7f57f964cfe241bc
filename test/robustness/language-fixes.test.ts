/**
 * Regression cases for what the fuzzing found in language/ and what was fixed there: numbers a double cannot hold
 * (1e309 reads as Infinity) written where no unit follows (Manning's n, side slopes, the Froude band, the limit
 * margin) are errors at the number instead of reaching messages as "Infinity" or being dropped without a word;
 * inverts and a length whose slope overflows are an error at the inverts and leave the reach out instead of putting
 * Infinity into the analysis; a capacity that overflows is no capacity; and the number formatter never prints NaN
 * or Infinity. Each case has its negative twin.
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import { formatNumber, formatQuantity, formatRatio } from '../../language/analysis/format-quantity.js';
import { BASE, CHANNEL, buildText, expectDiagnostic, expectNoDiagnostic, plainDiagnostics } from '../language/language-test-kit.js';
import { nonFiniteNumbers } from './document-harness.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';

const TOO_LARGE = { code: 'number-too-large', severity: 'error', message: 'This number is too large to compute with.' } as const;

describe('numbers too large for a double, written without a unit', () => {
  it("Manning's n of 1e309 is too large, not an unusual n of Infinity", async () => {
    await expectDiagnostic({ ...TOO_LARGE, source: `${BASE}\nlining rough { n <|1e309|> }\n${CHANNEL}` });
    await expectNoDiagnostic(`${BASE}\nlining rough { n 1e309 }\n${CHANNEL}`, 'manning-n-unusual');
    // Twin: an n merely outside the usual range is still the warning.
    await expectNoDiagnostic(`${BASE}\nlining rough { n 0.5 }\n${CHANNEL}`, 'number-too-large');
    const document = await buildText(`${BASE}\nlining rough { n 0.5 }\n${CHANNEL}`);
    expect(plainDiagnostics(document).map((diagnostic) => diagnostic.code)).toContain('manning-n-unusual');
  });

  it('a side slope with a part of 1e309 is too large, at that part', async () => {
    const section = (slopes: string): string => `${BASE}\nsection wide trapezoid { bottom width 2 ft  side slopes ${slopes}  bank height 2 ft }\n${CHANNEL}`;
    await expectDiagnostic({ ...TOO_LARGE, source: section('<|1e309|>:1') });
    await expectDiagnostic({ ...TOO_LARGE, source: section('3:<|1e309|>') });
    await expectNoDiagnostic(section('3:1'), 'number-too-large');
    await expectNoDiagnostic(section('3:1e309'), 'side-slope-invalid');
  });

  it('a Froude band ending at 1e309 is too large and the band in force stays finite', async () => {
    await expectDiagnostic({ ...TOO_LARGE, source: `${BASE}\ncriteria { avoid froude 0.89 to <|1e309|> }\n${CHANNEL}` });
    const analysis = analyzeDocument(await buildText(`${BASE}\ncriteria { avoid froude 0.89 to 1e309 }\n${CHANNEL}`), NO_CRITERIA_DEFAULTS);
    expect(nonFiniteNumbers(analysis)).toEqual([]);
    expect(analysis.criteria.origin['avoidFroude']).toBe('default');
    await expectNoDiagnostic(`${BASE}\ncriteria { avoid froude 0.89 to 1.13 }\n${CHANNEL}`, 'number-too-large');
  });

  it('a limit margin of 1e309 % is too large (it was dropped without a word)', async () => {
    await expectDiagnostic({ ...TOO_LARGE, source: `${BASE}\ncriteria { limit margin <|1e309|> % }\n${CHANNEL}` });
    await expectNoDiagnostic(`${BASE}\ncriteria { limit margin 25 % }\n${CHANNEL}`, 'number-too-large');
  });
});

describe('results that overflow', () => {
  const invertsChannel = (inverts: string, length: string): string =>
    `${BASE}\nchannel c {\n  reach r { section ditch  lining grass  ${inverts}  length ${length} }\n  outlet free fall\n}`;

  it('inverts whose slope overflows are an error at the inverts and leave the reach out, with no Infinity in the analysis', async () => {
    await expectDiagnostic({
      source: invertsChannel('<|inverts 1e300 m to -1e300 m|>', '1e-300 m'),
      code: 'number-too-large',
      severity: 'error',
      message: 'These inverts and the reach length give a slope too large to compute with.',
    });
    const analysis = analyzeDocument(await buildText(invertsChannel('inverts 1e300 m to -1e300 m', '1e-300 m')), NO_CRITERIA_DEFAULTS);
    expect(nonFiniteNumbers(analysis)).toEqual([]);
    expect(analysis.incompleteReaches.map((reach) => reach.reason)).toEqual(['its inverts and length give a slope too large to compute with']);
    // Twin: ordinary inverts give a reach with a slope (0.5 m over 100 m = 0.005).
    await expectNoDiagnostic(invertsChannel('inverts 100.5 m to 100 m', '100 m'), 'number-too-large');
    const ordinary = analyzeDocument(await buildText(invertsChannel('inverts 100.5 m to 100 m', '100 m')), NO_CRITERIA_DEFAULTS);
    expect(Math.abs((ordinary.channels[0]?.reaches[0]?.slope ?? 0) - 0.005)).toBeLessThan(1e-12);
  });

  it('a bank-full capacity too large for a double is no capacity, never Infinity', async () => {
    const design = (bank: string): string => `${BASE}\nsection huge trapezoid { bottom width 2 ft  side slopes 3:1  bank height ${bank} }\nchannel c {\n  reach r { section huge  lining grass  slope 1 %  length 100 ft }\n  outlet free fall\n}`;
    const overflowing = analyzeDocument(await buildText(design('1e300 m')), NO_CRITERIA_DEFAULTS);
    expect(nonFiniteNumbers(overflowing)).toEqual([]);
    expect(overflowing.channels[0]?.reaches[0]?.bankfullCapacity_m3s).toBeNull();
    const ordinary = analyzeDocument(await buildText(design('2 ft')), NO_CRITERIA_DEFAULTS);
    expect(ordinary.channels[0]?.reaches[0]?.bankfullCapacity_m3s).toBeGreaterThan(0);
  });
});

describe('numbers for people', () => {
  it('never reads NaN or Infinity', () => {
    for (const value of [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY]) {
      expect(formatNumber(value)).toBe('—');
      expect(formatRatio(value)).toBe('—');
      expect(formatQuantity(value, 'length', 'US')).toBe('— ft');
    }
    // Twins: finite values as before.
    expect(formatNumber(1.5)).toBe('1.5');
    expect(formatRatio(0.8765)).toBe('0.88');
  });
});
