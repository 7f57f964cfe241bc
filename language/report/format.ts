/**
 * Number formatting for the report: every value the engineer reads goes through here, so a missing or
 * non-finite value is shown as a dash and never as "NaN" or "Infinity". Ordinary values are rounded by the
 * analysis' own formatter (language/analysis/format-quantity.ts), so a depth reads the same in hover, messages,
 * the CLI and the report.
 */
import { formatNumber, formatPowerOfTen, POWER_OF_TEN_FROM } from '../analysis/format-quantity.js';
import { toDisplay, type Dimension, type UnitSystem } from '../units/units.js';

/** Shown where a value does not exist (no normal depth, no bank height, ...). */
export const MISSING_VALUE = '—';

/** Significant figures for measured quantities: three, as design data rarely justify more. */
export const DEFAULT_SIGNIFICANT_FIGURES = 3;

/**
 * Formats a number to `significantFigures` significant figures, as the analysis formats it; magnitudes outside
 * 1e-6 to 1e15 (only ever seen from nonsense input) in powers of ten. Non-finite or missing -> dash.
 */
export function formatSignificant(value: number | null | undefined, significantFigures = DEFAULT_SIGNIFICANT_FIGURES): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return MISSING_VALUE;
  if (value === 0) return '0';
  // Below 1e-6 (only ever seen from nonsense input) in powers of ten; the analysis formatter does so from 1e15 up.
  if (Math.abs(value) < 1e-6) return formatPowerOfTen(value, significantFigures);
  return normaliseNegativeZero(formatNumber(value, significantFigures));
}

/** Formats with a fixed number of decimals (elevations, Froude numbers); non-finite or missing -> dash. */
export function formatFixed(value: number | null | undefined, decimals: number): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return MISSING_VALUE;
  if (Math.abs(value) >= POWER_OF_TEN_FROM) return formatPowerOfTen(value, decimals + 1);
  return normaliseNegativeZero(value.toFixed(decimals));
}

/** The display value of an SI quantity in the design's display system. */
export function displayValue(valueSI: number, dimension: Dimension, system: UnitSystem): number {
  return toDisplay(valueSI, dimension, system).value;
}

/** The unit symbol a dimension is shown in, e.g. `m3/s` or `cfs`. */
export function displayUnit(dimension: Dimension, system: UnitSystem): string {
  return toDisplay(1, dimension, system).unit;
}

/** A value with its unit, e.g. "0.734 m"; missing -> dash without unit. */
export function formatQuantity(valueSI: number | null | undefined, dimension: Dimension, system: UnitSystem, significantFigures = DEFAULT_SIGNIFICANT_FIGURES): string {
  const number = formatDisplayNumber(valueSI, dimension, system, significantFigures);
  if (number === MISSING_VALUE) return number;
  const unit = displayUnit(dimension, system);
  return unit === '%' ? `${number} %` : `${number} ${unit}`;
}

/** The number alone in display units (for table cells whose heading carries the unit). */
export function formatDisplayNumber(valueSI: number | null | undefined, dimension: Dimension, system: UnitSystem, significantFigures = DEFAULT_SIGNIFICANT_FIGURES): string {
  if (valueSI === null || valueSI === undefined || !Number.isFinite(valueSI)) return MISSING_VALUE;
  return formatSignificant(displayValue(valueSI, dimension, system), significantFigures);
}

/** An elevation or station-like length with fixed decimals in display units (two: centimetres or hundredths of a foot). */
export function formatElevation(valueSI: number | null | undefined, system: UnitSystem): string {
  if (valueSI === null || valueSI === undefined || !Number.isFinite(valueSI)) return MISSING_VALUE;
  return `${formatFixed(displayValue(valueSI, 'length', system), 2)} ${displayUnit('length', system)}`;
}

/** A Froude number: two decimals, the precision at which the near-critical band is stated. */
export function formatFroude(value: number | null | undefined): string {
  return formatFixed(value, 2);
}

/** Manning's n: three decimals, as tabulated in the handbooks. */
export function formatManningN(value: number | null | undefined): string {
  return formatFixed(value, 3);
}

/** A date as "2025-03-04 14:05 UTC" (UTC so two machines export the same text for the same instant). */
export function formatTimestampUtc(date: Date): string {
  if (!Number.isFinite(date.getTime())) return MISSING_VALUE;
  const pad = (value: number): string => value.toString().padStart(2, '0');
  return `${date.getUTCFullYear()}-${pad(date.getUTCMonth() + 1)}-${pad(date.getUTCDate())} ${pad(date.getUTCHours())}:${pad(date.getUTCMinutes())} UTC`;
}

function normaliseNegativeZero(text: string): string {
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}
