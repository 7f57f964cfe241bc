/**
 * Units of measure: the one home for every unit word Runnel accepts and its exact factor to SI.
 *
 * The engine computes in SI base units (m, m2, m3/s, m/s, m/m, Pa). Values are converted here, at the edges:
 * when a design file is read and when a result is shown. Factors are exact definitions:
 * - 1 ft = 0.3048 m and 1 in = 0.0254 m exactly (international yard and pound, 1959; NIST SP 811, App. B).
 * - 1 US gallon = 231 in3 exactly = 3.785411784 L (NIST Handbook 44, App. C; NIST SP 811).
 * - 1 lbf = 0.45359237 kg x 9.80665 m/s2 exactly = 4.4482216152605 N (NIST SP 811, App. B).
 * - 1 day = 86,400 s; 1 min = 60 s.
 * Tests check every factor against an independent general-purpose units library (mathjs).
 */

/** What a quantity measures; a number with a unit of another dimension is an error at that number. */
export type Dimension = 'length' | 'area' | 'discharge' | 'velocity' | 'slope' | 'shear';

/** The two display systems; a design may mix input units freely. */
export type UnitSystem = 'SI' | 'US';

export interface UnitDefinition {
  /** The spelling shown in output, e.g. `ft3/s`. */
  readonly symbol: string;
  /** Every spelling accepted in a design file, including `symbol`. Matching is case-sensitive. */
  readonly spellings: readonly string[];
  readonly dimension: Dimension;
  /** Multiply a value in this unit by `toSI` to get SI base units. */
  readonly toSI: number;
  /** The system it belongs to; slope units are shared by both. */
  readonly system: UnitSystem | 'both';
  /** Plain-words name for completion and hover, e.g. "cubic feet per second". */
  readonly name: string;
}

const FOOT_M = 0.3048;
const INCH_M = 0.0254;
const US_GALLON_M3 = 231 * INCH_M ** 3;
const POUND_FORCE_N = 0.45359237 * 9.80665;
const SECONDS_PER_MINUTE = 60;
const SECONDS_PER_DAY = 86_400;

/** Every unit Runnel understands. Add a unit by adding one row. */
export const UNIT_TABLE: readonly UnitDefinition[] = [
  // Length
  { symbol: 'm', spellings: ['m'], dimension: 'length', toSI: 1, system: 'SI', name: 'metres' },
  { symbol: 'km', spellings: ['km'], dimension: 'length', toSI: 1000, system: 'SI', name: 'kilometres' },
  { symbol: 'cm', spellings: ['cm'], dimension: 'length', toSI: 0.01, system: 'SI', name: 'centimetres' },
  { symbol: 'mm', spellings: ['mm'], dimension: 'length', toSI: 0.001, system: 'SI', name: 'millimetres' },
  { symbol: 'ft', spellings: ['ft'], dimension: 'length', toSI: FOOT_M, system: 'US', name: 'feet' },
  { symbol: 'in', spellings: ['in'], dimension: 'length', toSI: INCH_M, system: 'US', name: 'inches' },
  { symbol: 'mi', spellings: ['mi'], dimension: 'length', toSI: 5280 * FOOT_M, system: 'US', name: 'miles (statute)' },
  // Area
  { symbol: 'm2', spellings: ['m2'], dimension: 'area', toSI: 1, system: 'SI', name: 'square metres' },
  { symbol: 'ft2', spellings: ['ft2', 'sqft'], dimension: 'area', toSI: FOOT_M ** 2, system: 'US', name: 'square feet' },
  // Discharge
  { symbol: 'm3/s', spellings: ['m3/s', 'cms'], dimension: 'discharge', toSI: 1, system: 'SI', name: 'cubic metres per second' },
  { symbol: 'L/s', spellings: ['L/s', 'l/s'], dimension: 'discharge', toSI: 0.001, system: 'SI', name: 'litres per second' },
  { symbol: 'cfs', spellings: ['cfs', 'ft3/s'], dimension: 'discharge', toSI: FOOT_M ** 3, system: 'US', name: 'cubic feet per second' },
  { symbol: 'gpm', spellings: ['gpm', 'gal/min'], dimension: 'discharge', toSI: US_GALLON_M3 / SECONDS_PER_MINUTE, system: 'US', name: 'US gallons per minute' },
  { symbol: 'MGD', spellings: ['MGD', 'Mgal/d'], dimension: 'discharge', toSI: (1e6 * US_GALLON_M3) / SECONDS_PER_DAY, system: 'US', name: 'million US gallons per day' },
  // Velocity
  { symbol: 'm/s', spellings: ['m/s'], dimension: 'velocity', toSI: 1, system: 'SI', name: 'metres per second' },
  { symbol: 'ft/s', spellings: ['ft/s', 'fps'], dimension: 'velocity', toSI: FOOT_M, system: 'US', name: 'feet per second' },
  // Slope (dimensionless ratio, but always written with a unit so that 0.5 % and 0.5 m/m cannot be confused)
  { symbol: 'm/m', spellings: ['m/m'], dimension: 'slope', toSI: 1, system: 'SI', name: 'metres per metre' },
  { symbol: 'ft/ft', spellings: ['ft/ft'], dimension: 'slope', toSI: 1, system: 'US', name: 'feet per foot' },
  { symbol: '%', spellings: ['%'], dimension: 'slope', toSI: 0.01, system: 'both', name: 'percent' },
  { symbol: 'permille', spellings: ['permille', '‰'], dimension: 'slope', toSI: 0.001, system: 'both', name: 'per mille (per thousand)' },
  // Shear stress
  { symbol: 'Pa', spellings: ['Pa', 'N/m2'], dimension: 'shear', toSI: 1, system: 'SI', name: 'pascals' },
  { symbol: 'kPa', spellings: ['kPa'], dimension: 'shear', toSI: 1000, system: 'SI', name: 'kilopascals' },
  { symbol: 'psf', spellings: ['psf', 'lb/ft2'], dimension: 'shear', toSI: POUND_FORCE_N / FOOT_M ** 2, system: 'US', name: 'pounds per square foot' },
];

const UNIT_BY_SPELLING: ReadonlyMap<string, UnitDefinition> = new Map(
  UNIT_TABLE.flatMap((unit) => unit.spellings.map((spelling) => [spelling, unit] as const)),
);

/** The unit written as `spelling`, or undefined when Runnel does not know it. */
export function findUnit(spelling: string): UnitDefinition | undefined {
  return UNIT_BY_SPELLING.get(spelling);
}

/** Every unit of a dimension, in table order (for completion and for "units accepted" messages). */
export function unitsOfDimension(dimension: Dimension): readonly UnitDefinition[] {
  return UNIT_TABLE.filter((unit) => unit.dimension === dimension);
}

/** Plain-words name of a dimension, for messages ("a length"). */
export const DIMENSION_NAMES: Readonly<Record<Dimension, string>> = {
  length: 'a length',
  area: 'an area',
  discharge: 'a discharge',
  velocity: 'a velocity',
  slope: 'a slope',
  shear: 'a shear stress',
};

/** The unit each system displays a dimension in. */
export const DISPLAY_UNITS: Readonly<Record<UnitSystem, Readonly<Record<Dimension, string>>>> = {
  SI: { length: 'm', area: 'm2', discharge: 'm3/s', velocity: 'm/s', slope: '%', shear: 'Pa' },
  US: { length: 'ft', area: 'ft2', discharge: 'cfs', velocity: 'ft/s', slope: '%', shear: 'psf' },
};

/** Converts a value written in `spelling` to SI; undefined for an unknown unit. */
export function toSI(value: number, spelling: string): number | undefined {
  const unit = findUnit(spelling);
  return unit === undefined ? undefined : value * unit.toSI;
}

/** Converts an SI value to the unit written `spelling`. Throws only on a programming error (unknown unit). */
export function fromSI(valueSI: number, spelling: string): number {
  const unit = findUnit(spelling);
  if (unit === undefined) throw new Error(`internal: unknown unit '${spelling}'`);
  return valueSI / unit.toSI;
}

/** Converts an SI value of `dimension` to the display unit of `system`, returning value and unit symbol. */
export function toDisplay(valueSI: number, dimension: Dimension, system: UnitSystem): { value: number; unit: string } {
  const unit = DISPLAY_UNITS[system][dimension];
  return { value: fromSI(valueSI, unit), unit };
}
