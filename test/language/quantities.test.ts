/**
 * Units as written in design files: read to SI through the unit table, with exact factors (1 ft = 0.3048 m and
 * 1 in = 0.0254 m exactly, NIST SP 811 App. B; 1 lbf = 4.4482216152605 N exactly, NIST SP 811 App. B: derived).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { displayUnitsOf } from '../../language/analysis/analyze-design.js';
import { formatNumber, formatQuantity, formatRatio } from '../../language/analysis/format-quantity.js';
import { readQuantity } from '../../language/analysis/quantities.js';
import { isFlowTable, isSection, type Diameter, type Discharge } from '../../language/generated/ast.js';
import { buildText } from './language-test-kit.js';

async function firstDischarge(written: string): Promise<Discharge> {
  const document = await buildText(`design "T"\nflows { q = ${written} }`);
  const discharge = document.parseResult.value.members.filter(isFlowTable)[0]?.flows[0]?.discharge;
  if (discharge === undefined) throw new Error('no discharge parsed');
  return discharge;
}

describe('reading quantities to SI', () => {
  const cases = [
    // id, written, SI value, source
    { id: 'litres', written: '900 L/s', si: 0.9, source: '1 L = 0.001 m3 (SI definition; derived)' },
    { id: 'cfs', written: '100 cfs', si: 100 * 0.3048 ** 3, source: '1 ft = 0.3048 m exactly (NIST SP 811; derived)' },
    { id: 'ft3/s', written: '1 ft3/s', si: 0.3048 ** 3, source: 'same unit, other spelling' },
    { id: 'gpm', written: '1000 gpm', si: (1000 * 231 * 0.0254 ** 3) / 60, source: '1 US gal = 231 in3 exactly (NIST Handbook 44; derived)' },
  ];
  for (const testCase of cases) {
    it(`${testCase.id}: ${testCase.written} = ${testCase.si} m3/s (${testCase.source})`, async () => {
      const reading = readQuantity(await firstDischarge(testCase.written));
      expect(reading.ok).toBe(true);
      if (reading.ok) expect(reading.valueSI).toBeCloseTo(testCase.si, 12);
    });
  }

  it('reads 36 in as 0.9144 m (1 in = 0.0254 m exactly; derived)', async () => {
    const document = await buildText('design "T"\nsection p circle { diameter 36 in }');
    const diameter = document.parseResult.value.members.find(isSection)?.properties[0] as Diameter | undefined;
    const reading = diameter === undefined ? undefined : readQuantity(diameter.value);
    expect(reading?.ok && reading.valueSI).toBeCloseTo(0.9144, 12);
  });

  it('says why a quantity cannot be read', async () => {
    expect(readQuantity(await firstDischarge('5'))).toEqual({ ok: false, problem: 'missing-unit' });
    expect(readQuantity(await firstDischarge('5 cfz'))).toEqual({ ok: false, problem: 'unknown-unit', unitText: 'cfz' });
    expect(readQuantity(await firstDischarge('5 ft'))).toMatchObject({ ok: false, problem: 'wrong-dimension', unitText: 'ft' });
  });
});

describe('display units', () => {
  it('uses the units setting when there is one', async () => {
    const document = await buildText('design "T"\nunits SI\nflows { a = 1 cfs  b = 2 cfs }');
    expect(displayUnitsOf(document.parseResult.value)).toEqual({ system: 'SI', origin: 'setting' });
  });
  it('otherwise takes the system most of the file is written in', async () => {
    const document = await buildText('design "T"\nflows { a = 1 cfs  b = 2 cfs  c = 1 m3/s }');
    expect(displayUnitsOf(document.parseResult.value)).toEqual({ system: 'US', origin: 'inferred' });
  });
  it('counts slope units as neither', async () => {
    const document = await buildText('design "T"\nflows { a = 1 m3/s }\nsection s rectangle { bottom width 1 ft  bank height 1 ft }');
    expect(displayUnitsOf(document.parseResult.value).system).toBe('US');
  });
});

describe('formatting numbers for messages', () => {
  it.each([
    [1.23456, '1.23'],
    [0.0012345, '0.00123'],
    [120, '120'],
    [1234.5, '1235'],
    [25_400, '25,400'],
    [-0.005, '-0.005'],
    [2.0, '2'],
    [0, '0'],
  ])('%d reads as %s', (value, expected) => expect(formatNumber(value)).toBe(expected));
  it('shows a depth in the display system', () => {
    expect(formatQuantity(0.3048, 'length', 'US')).toBe('1 ft');
    expect(formatQuantity(0.0035, 'slope', 'SI')).toBe('0.35 %');
    expect(formatQuantity(47.880258980335, 'shear', 'US')).toBe('1 psf');
  });
  it('shows every finite number so that it reads back to within its rounding, huge ones in powers of ten', () => {
    // Rounding to n significant figures errs by at most half a unit in the nth figure, 0.5 x 10^(1-n) of the value
    // (closed form; common practice). Whole numbers keep all their digits (error at most 0.5), and the decimals stop
    // at ten (error at most 0.5e-10): both within the same bound or the absolute one. The text is read back as
    // written: commas dropped, "× 10^" as an exponent.
    // Powers of ten are compared mantissa to mantissa, since "2 × 10^308" (1.5e308 to one figure) does not fit a double.
    const shownError = (text: string, value: number): number => {
      const [mantissa = '', exponent] = text.split(' × 10^');
      if (exponent === undefined) return Math.abs(Number(mantissa.replaceAll(',', '')) - value);
      const scale = 10 ** Number(exponent);
      return Math.abs(Number(mantissa) - value / scale) * scale;
    };
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.integer({ min: 1, max: 6 }), (value, digits) => {
        const bound = Math.max(0.5 * 10 ** (1 - digits) * Math.abs(value), 0.5e-10) * (1 + 1e-9);
        expect(shownError(formatNumber(value, digits), value)).toBeLessThanOrEqual(bound);
      }),
      { numRuns: 20_000 },
    );
    // Ratios (Froude numbers) show two decimals, an error of at most 0.005; from 1e15 up three figures as above.
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (value) => {
        const bound = Math.abs(value) >= 1e15 ? 0.5e-2 * Math.abs(value) * (1 + 1e-9) : 0.005 * (1 + 1e-9) + Math.abs(value) * 2 ** -52;
        expect(shownError(formatRatio(value), value)).toBeLessThanOrEqual(bound);
      }),
      { numRuns: 20_000 },
    );
    // toFixed writes 1.5e300 as "1.5e+300"; trimming its "trailing zeros" once showed "1.5e+3".
    expect(formatNumber(1.5e300)).toBe('1.50 × 10^300');
    expect(formatRatio(2.5e21)).toBe('2.50 × 10^21');
    expect(formatNumber(-2.5e15)).toBe('-2.50 × 10^15');
    expect(formatNumber(999_999_999_999_999)).toBe('999,999,999,999,999');
  });
});
