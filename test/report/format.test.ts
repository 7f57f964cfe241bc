/**
 * Report number formatting: rounds exactly as the analysis' formatter does (so hover, CLI and report agree),
 * never prints NaN or Infinity, and prints dates in UTC.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { formatNumber } from '../../language/analysis/format-quantity.js';
import { formatTick, niceTicks, px } from '../../language/report/svg-scale.js';
import { formatElevation, formatFixed, formatQuantity, formatSignificant, formatTimestampUtc, MISSING_VALUE } from '../../language/report/format.js';

describe('report number formatting', () => {
  it('gives the analysis formatter’s text for every ordinary value', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e14, max: 1e14, noNaN: true }).filter((value) => value === 0 || Math.abs(value) >= 1e-6), fc.integer({ min: 2, max: 4 }), (value, digits) => {
        expect(formatSignificant(value, digits)).toBe(formatNumber(value, digits).replace(/^-0(\.0*)?$/, (zero) => zero.slice(1)));
      }),
      { numRuns: 3000 },
    );
  });

  it('shows a dash for missing and non-finite values, never NaN or Infinity', () => {
    for (const value of [null, undefined, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY]) {
      expect(formatSignificant(value)).toBe(MISSING_VALUE);
      expect(formatFixed(value, 2)).toBe(MISSING_VALUE);
      expect(formatQuantity(value, 'length', 'SI')).toBe(MISSING_VALUE);
      expect(formatElevation(value, 'US')).toBe(MISSING_VALUE);
    }
    expect(formatSignificant(1e300)).toBe('1.00 × 10^300');
    expect(formatSignificant(5e-324)).toBe('4.94 × 10^-324');
  });

  it('converts to display units exactly (1 ft = 0.3048 m, NIST SP 811)', () => {
    expect(formatQuantity(0.3048, 'length', 'US')).toBe('1 ft');
    expect(formatElevation(30.48, 'US')).toBe('100.00 ft');
    expect(formatQuantity(0.005, 'slope', 'SI')).toBe('0.5 %');
  });

  it('prints the timestamp in UTC', () => {
    expect(formatTimestampUtc(new Date('2025-12-31T23:59:30-05:00'))).toBe('2026-01-01 04:59 UTC');
    expect(formatTimestampUtc(new Date(Number.NaN))).toBe(MISSING_VALUE);
  });
});

describe('drawing coordinates', () => {
  it('property: any number becomes a finite coordinate of at most a million pixels, to the hundredth of a pixel', () => {
    fc.assert(
      fc.property(fc.double(), (value) => {
        const text = px(value);
        expect(text).toMatch(/^-?\d+(\.\d{1,2})?$/);
        expect(Math.abs(Number(text))).toBeLessThanOrEqual(1e6);
        if (Number.isFinite(value) && Math.abs(value) <= 1e6) expect(Math.abs(Number(text) - value)).toBeLessThanOrEqual(0.005 + 1e-9);
      }),
      { numRuns: 2000 },
    );
    // 1e307 times 100 overflows a double: the clamp comes first.
    expect(px(1.7e307)).toBe('1000000');
    expect(px(-1.7976931348623157e308)).toBe('-1000000');
  });

  it('property: axis ticks are finite round values within the axis, at most 40, for any finite axis', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.double({ noNaN: true, noDefaultInfinity: true }), fc.integer({ min: 1, max: 12 }), (a, b, count) => {
        const [min, max] = a <= b ? [a, b] : [b, a];
        const { values, step } = niceTicks(min, max, count);
        expect(values.length).toBeLessThanOrEqual(40);
        for (const value of values) {
          expect(Number.isFinite(value)).toBe(true);
          // Tick values are printed to at most 8 decimals (tickDecimals), so they may stand up to 5e-9 past the end.
          if (max > min) expect(value - max).toBeLessThanOrEqual(Math.abs(step) * 1e-6 + 5e-9 + Math.abs(max) * 1e-12);
        }
      }),
      { numRuns: 2000 },
    );
    // The longest channel a double can hold: no tick beyond it overflows to Infinity.
    expect(niceTicks(0, 1.7976931348623157e308, 5).values.every(Number.isFinite)).toBe(true);
  });

  it('labels ticks from 1e15 up in powers of ten, as the messages show such numbers', () => {
    expect(formatTick(2e300, 1e300)).toBe('2.00 × 10^300');
    expect(formatTick(250, 50)).toBe('250');
    expect(formatTick(-0, 0.5)).toBe('0.0');
  });
});
