/**
 * Helpers that make engine tests read like engineering checks: each case has an id, the cited source (copied from
 * /work/shared/REFERENCES.md with its confidence word), the published or derived value and a tolerance; a failure
 * prints the input, the computed value, the expected value and the tolerance.
 */
import { expect } from 'vitest';

export interface CheckedValue {
  /** Short id, e.g. "N1". */
  readonly id: string;
  /** Citation and confidence word, e.g. "Chow (1959) ... (from memory)". */
  readonly source: string;
  /** The input in words, with units. */
  readonly input: string;
  readonly value: number;
  readonly expected: number;
  /** Absolute tolerance, in the unit of the value. */
  readonly tolerance: number;
  /** Unit of value, expected and tolerance, for the message. */
  readonly unit: string;
}

export function describeCheck(check: CheckedValue): string {
  const difference = check.value - check.expected;
  return (
    `[${check.id}] ${check.source}\n  input: ${check.input}\n  value: ${check.value} ${check.unit}\n` +
    `  expected: ${check.expected} ${check.unit} +/- ${check.tolerance} ${check.unit} (difference ${difference.toPrecision(3)})`
  );
}

/** Asserts |value - expected| <= tolerance (a NaN value fails). */
export function expectWithin(check: CheckedValue): void {
  const passes = Math.abs(check.value - check.expected) <= check.tolerance;
  expect(passes, describeCheck(check)).toBe(true);
}

/** Asserts |value / expected - 1| <= relativeTolerance, printing the same message. */
export function expectRelative(check: Omit<CheckedValue, 'tolerance'> & { readonly relativeTolerance: number }): void {
  const tolerance = Math.abs(check.expected) * check.relativeTolerance;
  const passes = Math.abs(check.value - check.expected) <= tolerance;
  expect(passes, describeCheck({ ...check, tolerance })).toBe(true);
}

/** Golden-section search for the maximum of a unimodal f on [low, high]; returns the argument. */
export function argMaximum(f: (x: number) => number, low: number, high: number, absoluteTolerance: number): number {
  const inverseGolden = (Math.sqrt(5) - 1) / 2;
  let a = low;
  let b = high;
  let c = b - inverseGolden * (b - a);
  let d = a + inverseGolden * (b - a);
  let fc = f(c);
  let fd = f(d);
  while (b - a > absoluteTolerance) {
    if (fc > fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - inverseGolden * (b - a);
      fc = f(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + inverseGolden * (b - a);
      fd = f(d);
    }
  }
  return (a + b) / 2;
}

/** Composite Gauss-Legendre quadrature (5 points per panel) of f on [low, high]. */
export function integrate(f: (x: number) => number, low: number, high: number, panels = 200): number {
  const nodes = [0, -0.5384693101056831, 0.5384693101056831, -0.906179845938664, 0.906179845938664];
  const weights = [0.5688888888888889, 0.47862867049936647, 0.47862867049936647, 0.23692688505618908, 0.23692688505618908];
  const width = (high - low) / panels;
  let sum = 0;
  for (let panel = 0; panel < panels; panel++) {
    const middle = low + (panel + 0.5) * width;
    for (let i = 0; i < nodes.length; i++) sum += weights[i]! * f(middle + (nodes[i]! * width) / 2);
  }
  return (sum * width) / 2;
}
