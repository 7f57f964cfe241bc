/**
 * Reading the numbers of a design file: each dimensional number is a node whose type names its dimension
 * (Length, Discharge, ...), and its unit is looked up in the unit table. Validation reports what this module
 * cannot read; analysis uses only what it can. Units come from language/units/units.ts and nowhere else.
 */
import type { Discharge, Length, Shear, Slope, Velocity } from '../generated/ast.js';
import { findUnit, type Dimension, type UnitDefinition } from '../units/units.js';

/** Any number written with a unit. */
export type QuantityNode = Length | Discharge | Velocity | Slope | Shear;

/** The dimension each quantity node type measures: the one home of that mapping. */
export const QUANTITY_DIMENSIONS: Readonly<Record<QuantityNode['$type'], Dimension>> = {
  Length: 'length',
  Discharge: 'discharge',
  Velocity: 'velocity',
  Slope: 'slope',
  Shear: 'shear',
};

const QUANTITY_TYPES: ReadonlySet<string> = new Set(Object.keys(QUANTITY_DIMENSIONS));

export function isQuantityNode(node: { readonly $type: string }): node is QuantityNode {
  return QUANTITY_TYPES.has(node.$type);
}

export type QuantityReading =
  | { readonly ok: true; readonly valueSI: number; readonly unit: UnitDefinition }
  | { readonly ok: false; readonly problem: 'no-number' }
  | { readonly ok: false; readonly problem: 'missing-unit' }
  | { readonly ok: false; readonly problem: 'unknown-unit'; readonly unitText: string }
  | { readonly ok: false; readonly problem: 'wrong-dimension'; readonly unitText: string; readonly unit: UnitDefinition };

/** Reads a quantity as SI; never throws (a node left incomplete by a syntax error reads as 'no-number'). */
export function readQuantity(node: QuantityNode): QuantityReading {
  if (typeof node.value !== 'number' || Number.isNaN(node.value)) return { ok: false, problem: 'no-number' };
  if (node.unit === undefined || node.unit === '') return { ok: false, problem: 'missing-unit' };
  const unit = findUnit(node.unit);
  if (unit === undefined) return { ok: false, problem: 'unknown-unit', unitText: node.unit };
  if (unit.dimension !== QUANTITY_DIMENSIONS[node.$type]) return { ok: false, problem: 'wrong-dimension', unitText: node.unit, unit };
  return { ok: true, valueSI: node.value * unit.toSI, unit };
}

/** The SI value of a quantity, or undefined when it is absent or unreadable. */
export function quantitySI(node: QuantityNode | undefined): number | undefined {
  if (node === undefined) return undefined;
  const reading = readQuantity(node);
  return reading.ok && Number.isFinite(reading.valueSI) ? reading.valueSI : undefined;
}
