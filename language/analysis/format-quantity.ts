/**
 * Numbers for people: a value in SI shown in the design's display units with a sensible number of digits.
 * Messages, hover and the report all format through here so a depth reads the same everywhere.
 */
import { fromSI, toDisplay, type Dimension, type UnitSystem } from '../units/units.js';

/**
 * What people see where a value is NaN or infinite (a number too large to compute with, or a result that does not
 * exist): never the words NaN or Infinity.
 */
export const NO_NUMBER_TEXT = '—';

/**
 * Magnitudes from here up are shown in powers of ten ("1.5 × 10^300"): only nonsense input reaches them, and
 * toFixed itself switches to exponent notation from 1e21, whose digits the trimming below would cut.
 */
export const POWER_OF_TEN_FROM = 1e15;

/**
 * Three significant figures, but whole numbers keep all their digits (1234, not 1230), no exponent notation,
 * trailing zeros dropped, thousands grouped with commas from 10,000; from 1e15 up in powers of ten.
 * (Hand-made: toLocaleString is far slower, and every message, hint and hover formats through here.)
 */
export function formatNumber(value: number, significantDigits = 3): string {
  if (!Number.isFinite(value)) return NO_NUMBER_TEXT;
  if (value === 0) return '0';
  if (Math.abs(value) >= POWER_OF_TEN_FROM) return formatPowerOfTen(value, significantDigits);
  const magnitude = Math.floor(Math.log10(Math.abs(value)));
  const decimals = Math.min(Math.max(0, significantDigits - 1 - magnitude), 10);
  let text = value.toFixed(decimals);
  if (decimals > 0) {
    let end = text.length;
    while (text.charCodeAt(end - 1) === 48 /* 0 */) end--;
    if (text.charCodeAt(end - 1) === 46 /* . */) end--;
    text = text.slice(0, end);
  }
  if (text === '-0') return '0';
  const signLength = text.charCodeAt(0) === 45 /* - */ ? 1 : 0;
  const point = text.indexOf('.');
  const wholeEnd = point < 0 ? text.length : point;
  const wholeDigits = wholeEnd - signLength;
  if (wholeDigits <= 4) return text;
  let grouped = text.slice(0, signLength + (wholeDigits % 3 || 3));
  for (let index = grouped.length; index < wholeEnd; index += 3) grouped += `,${text.slice(index, index + 3)}`;
  return grouped + text.slice(wholeEnd);
}

/** "1.5 × 10^300": a mantissa of `significantDigits` digits (trailing zeros kept) and a power of ten. */
export function formatPowerOfTen(value: number, significantDigits: number): string {
  const [mantissa = '', exponent = '0'] = value.toExponential(Math.max(0, significantDigits - 1)).split('e');
  return `${mantissa} × 10^${Number(exponent)}`;
}

/** "1.23 ft", "0.35 %", "120 cfs": an SI value of a dimension in the display unit of a system. */
export function formatQuantity(valueSI: number, dimension: Dimension, system: UnitSystem): string {
  const { value, unit } = toDisplay(valueSI, dimension, system);
  return `${formatNumber(value)} ${unit}`;
}

/** An SI value in a named unit, e.g. formatInUnit(0.457, 'ft') = "1.5 ft". */
export function formatInUnit(valueSI: number, unitSymbol: string): string {
  return `${formatNumber(fromSI(valueSI, unitSymbol))} ${unitSymbol}`;
}

/** Froude numbers and other ratios: two decimals; from 1e15 up in powers of ten, as formatNumber. */
export function formatRatio(value: number): string {
  if (!Number.isFinite(value)) return NO_NUMBER_TEXT;
  return Math.abs(value) >= POWER_OF_TEN_FROM ? formatPowerOfTen(value, 3) : value.toFixed(2);
}

/** A percentage of a fraction: 0.2 -> "20 %". */
export function formatPercent(fraction: number): string {
  return `${formatNumber(fraction * 100, 2)} %`;
}
