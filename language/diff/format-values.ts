/**
 * How the comparison shows a number: through the analysis' formatter (language/analysis/format-quantity.ts), so a
 * depth in "0.62 ft -> 0.31 ft" reads exactly as it does in the finding messages, hover and report.
 */
import { formatNumber, formatPercent, formatQuantity, formatRatio } from '../analysis/format-quantity.js';
import type { Dimension, UnitSystem } from '../units/units.js';
import type { QuantityKind } from './comparison-model.js';

const DIMENSIONAL_KINDS: ReadonlySet<QuantityKind> = new Set(['length', 'area', 'discharge', 'velocity', 'slope', 'shear']);

function isDimension(kind: QuantityKind): kind is Dimension {
  return DIMENSIONAL_KINDS.has(kind);
}

/** Formats a value of `kind` (SI number or text) for people, with its display unit; "none" for a missing value. */
export function formatValue(value: number | string | null, kind: QuantityKind, system: UnitSystem): string {
  if (value === null) return 'none';
  if (typeof value === 'string') return value;
  if (isDimension(kind)) return formatQuantity(value, kind, system);
  if (kind === 'side-slope') return `${formatNumber(value)}:1`;
  if (kind === 'ratio') return formatRatio(value);
  if (kind === 'fraction') return formatPercent(value);
  return formatNumber(value);
}

/** Formats a signed difference, "+0.1 ft" or "−0.31 ft" (a true minus sign, which reads better in tables). */
export function formatDifference(differenceSI: number, kind: QuantityKind, system: UnitSystem): string {
  const magnitude = formatValue(Math.abs(differenceSI), kind, system);
  if (/^0(\.0+)?( |$)/.test(magnitude)) return `±${magnitude}`;
  return `${differenceSI < 0 ? '−' : '+'}${magnitude}`;
}

/** Formats a relative change as a signed whole percentage, "−50 %". */
export function formatRelative(relative: number): string {
  const percent = Math.round(relative * 100);
  if (percent === 0) return '±0 %';
  return `${percent < 0 ? '−' : '+'}${Math.abs(percent)} %`;
}
