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
 * Three significant figures, but whole numbers keep all their digits (1234, not 1230), no exponent notation,
 * trailing zeros dropped, thousands grouped with commas from 10,000. (Hand-made: toLocaleString is far slower.)
 */
export function formatNumber(value: number, significantDigits = 3): string {
  if (!Number.isFinite(value)) return NO_NUMBER_TEXT;
  if (value === 0) return '0';
  const magnitude = Math.floor(Math.log10(Math.abs(value)));
  const decimals = Math.min(Math.max(0, significantDigits - 1 - magnitude), 10);
  let text = value.toFixed(decimals);
  if (text.includes('.')) text = text.replace(/0+$/, '').replace(/\.$/, '');
  if (text === '-0') return '0';
  const [whole = '', fraction] = text.split('.');
  const sign = whole.startsWith('-') ? '-' : '';
  const digits = sign ? whole.slice(1) : whole;
  const grouped = digits.length > 4 ? digits.replace(/\B(?=(\d{3})+(?!\d))/g, ',') : digits;
  return fraction === undefined ? `${sign}${grouped}` : `${sign}${grouped}.${fraction}`;
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

/** Froude numbers and other ratios: two decimals. */
export function formatRatio(value: number): string {
  return Number.isFinite(value) ? value.toFixed(2) : NO_NUMBER_TEXT;
}

/** A percentage of a fraction: 0.2 -> "20 %". */
export function formatPercent(fraction: number): string {
  return `${formatNumber(fraction * 100, 2)} %`;
}
