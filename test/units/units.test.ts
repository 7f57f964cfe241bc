/**
 * Every factor in the unit table against an independent general-purpose units library, mathjs (npm), as the
 * outside reference; plus the exact definitions the table cites (1 ft = 0.3048 m, 1 in = 0.0254 m, 1 US gal =
 * 231 in3, 1 lbf = 0.45359237 kg x 9.80665 m/s2; NIST SP 811, App. B, and NIST Handbook 44, App. C; common practice).
 */
import { createRequire } from 'node:module';
import type { MathJsInstance } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { DISPLAY_UNITS, findUnit, fromSI, toDisplay, toSI, UNIT_TABLE, unitsOfDimension, type Dimension } from '../../language/units/units.js';

// mathjs's single-file build loads in a fraction of the time of its many-module ESM build; same library, same API.
const mathjs = createRequire(import.meta.url)('mathjs/lib/browser/math.js') as MathJsInstance;
const mathUnit = mathjs.unit.bind(mathjs);
const mathEvaluate = mathjs.evaluate.bind(mathjs);

/** The SI base unit of each dimension, as mathjs writes it. */
const SI_BASE_IN_MATHJS: Readonly<Record<Dimension, string>> = {
  length: 'm',
  area: 'm^2',
  discharge: 'm^3/s',
  velocity: 'm/s',
  slope: 'm/m',
  shear: 'Pa',
};

/**
 * How each Runnel unit is written in mathjs. mathjs has no percent or per-mille unit, so those slopes are written
 * as the length ratios they are: 1 % of slope is 1 cm of fall per m, 1 per mille is 1 mm per m.
 */
const MATHJS_SPELLING: Readonly<Record<string, string>> = {
  m: 'm',
  cm: 'cm',
  km: 'km',
  mi: 'mi',
  mm: 'mm',
  ft: 'ft',
  in: 'inch',
  m2: 'm^2',
  ft2: 'ft^2',
  'm3/s': 'm^3/s',
  'L/s': 'L/s',
  cfs: 'ft^3/s',
  gpm: 'gal/minute',
  MGD: '1e6 gal/day',
  'm/s': 'm/s',
  'ft/s': 'ft/s',
  'm/m': 'm/m',
  'ft/ft': 'ft/ft',
  '%': 'cm/m',
  permille: 'mm/m',
  Pa: 'Pa',
  kPa: 'kPa',
  psf: 'lbf/ft^2',
};

function mathjsFactorToSI(symbol: string, dimension: Dimension): number {
  const spelling = MATHJS_SPELLING[symbol];
  if (spelling === undefined) throw new Error(`no mathjs spelling for '${symbol}': add one to this test`);
  if (dimension === 'slope') return Number(mathEvaluate(`(1 ${spelling})`));
  const [amount, unitText] = spelling.includes(' ') ? [Number(spelling.split(' ')[0]), spelling.split(' ')[1]!] : [1, spelling];
  return mathUnit(amount, unitText).toNumber(SI_BASE_IN_MATHJS[dimension]);
}

describe('unit table against mathjs', () => {
  it.each(UNIT_TABLE.map((unit) => ({ symbol: unit.symbol, unit })))('$symbol', ({ symbol, unit }) => {
    const reference = mathjsFactorToSI(symbol, unit.dimension);
    const relativeDifference = Math.abs(unit.toSI / reference - 1);
    expect(relativeDifference, `${symbol}: table ${unit.toSI}, mathjs ${reference} (${SI_BASE_IN_MATHJS[unit.dimension]}), tolerance 1e-14`).toBeLessThanOrEqual(1e-14);
  });

  it('every unit in the table has a mathjs spelling (the check above covers the whole table)', () => {
    expect(UNIT_TABLE.filter((unit) => MATHJS_SPELLING[unit.symbol] === undefined).map((unit) => unit.symbol)).toEqual([]);
  });
});

describe('exact definitions', () => {
  it.each([
    { spelling: 'ft', expected: 0.3048 },
    { spelling: 'in', expected: 0.0254 },
    { spelling: 'gpm', expected: (231 * 0.0254 ** 3) / 60 },
    { spelling: 'MGD', expected: (1e6 * 231 * 0.0254 ** 3) / 86400 },
    { spelling: 'psf', expected: (0.45359237 * 9.80665) / 0.3048 ** 2 },
    { spelling: 'cfs', expected: 0.028316846592 },
  ])('1 $spelling = $expected in SI', ({ spelling, expected }) => {
    expect(Math.abs(toSI(1, spelling)! / expected - 1)).toBeLessThanOrEqual(1e-15);
  });
});

describe('the table is well formed', () => {
  it('no spelling names two units, and every symbol is one of its own spellings', () => {
    const spellings = UNIT_TABLE.flatMap((unit) => unit.spellings);
    expect(new Set(spellings).size).toBe(spellings.length);
    for (const unit of UNIT_TABLE) expect(unit.spellings).toContain(unit.symbol);
  });
  it('each display unit exists and has the dimension it displays', () => {
    for (const system of ['SI', 'US'] as const) {
      for (const [dimension, spelling] of Object.entries(DISPLAY_UNITS[system])) {
        expect(findUnit(spelling)?.dimension, `${system} ${dimension} -> ${spelling}`).toBe(dimension);
      }
    }
  });
  it('every dimension has an SI unit with factor 1', () => {
    for (const dimension of Object.keys(SI_BASE_IN_MATHJS) as Dimension[]) {
      expect(unitsOfDimension(dimension).some((unit) => unit.toSI === 1 && unit.system !== 'US')).toBe(true);
    }
  });
});

describe('conversions', () => {
  it('to SI and back returns the value to rounding, for every spelling', () => {
    for (const unit of UNIT_TABLE) {
      for (const spelling of unit.spellings) {
        const back = fromSI(toSI(123.456, spelling)!, spelling);
        expect(Math.abs(back / 123.456 - 1), spelling).toBeLessThanOrEqual(2e-16);
      }
    }
  });
  it('unknown spellings give undefined from toSI; fromSI throws only as an internal error', () => {
    expect(toSI(1, 'furlong')).toBeUndefined();
    expect(findUnit('CFS')).toBeUndefined(); // matching is case-sensitive
    expect(() => fromSI(1, 'furlong')).toThrow(/internal/);
  });
  it('display: 1 m3/s is 35.3147 cfs and 1 m is 3.28084 ft (mathjs)', () => {
    const cfs = toDisplay(1, 'discharge', 'US');
    expect(cfs.unit).toBe('cfs');
    expect(Math.abs(cfs.value - mathUnit(1, 'm^3/s').toNumber('ft^3/s'))).toBeLessThanOrEqual(1e-12);
    expect(Math.abs(toDisplay(1, 'length', 'US').value - mathUnit(1, 'm').toNumber('ft'))).toBeLessThanOrEqual(1e-14);
  });
});
