/**
 * Option values that are quantities, written as in a design file with their unit: `--min-depth-change 0.01ft`,
 * `3mm`, `0.05 ft/s`. A number without a unit, or with a unit of another dimension, is a usage mistake naming
 * the units accepted (the unit table in language/units is the one home of unit words).
 */
import { DIMENSION_NAMES, findUnit, unitsOfDimension, type Dimension } from '../../language/units/units.js';
import { UsageError } from './arguments.js';

const QUANTITY_PATTERN = /^\s*((?:\d+(?:\.\d+)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(\S+)?\s*$/;

/** The SI value of a non-negative quantity option of `dimension`. */
export function parseQuantityOption(option: string, written: string, dimension: Dimension): number {
  const accepted = unitsOfDimension(dimension)
    .map((unit) => unit.symbol)
    .join(', ');
  const match = QUANTITY_PATTERN.exec(written);
  if (match === null) throw new UsageError(`option --${option} needs ${DIMENSION_NAMES[dimension]} such as 0.01ft, not '${written}'`);
  const [, number = '', unitWritten] = match;
  if (unitWritten === undefined) throw new UsageError(`option --${option} needs a unit after ${number} (one of: ${accepted})`);
  const unit = findUnit(unitWritten);
  if (unit === undefined || unit.dimension !== dimension) {
    throw new UsageError(`option --${option}: '${unitWritten}' is not a unit of ${DIMENSION_NAMES[dimension]} (use one of: ${accepted})`);
  }
  return Number(number) * unit.toSI;
}

/** A non-negative plain number option (a Froude number difference). */
export function parseNumberOption(option: string, written: string): number {
  const value = Number(written);
  if (written.trim() === '' || !Number.isFinite(value) || value < 0) throw new UsageError(`option --${option} needs a number of 0 or more, not '${written}'`);
  return value;
}

/** A percentage option, written `1`, `1%` or `0.5 %`; returned as a fraction. */
export function parsePercentOption(option: string, written: string): number {
  return parseNumberOption(option, written.replace(/\s*%\s*$/, '')) / 100;
}
