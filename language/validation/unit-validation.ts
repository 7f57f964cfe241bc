/**
 * Numbers and their units: every dimensional number must carry a unit of the right dimension, and dimensions
 * that cannot be zero or negative must not be. The user sees the error at the number (missing unit) or at the
 * unit (unknown or of the wrong dimension), naming what was expected and the units accepted.
 */
import type { ValidationAcceptor, ValidationChecks } from 'langium';
import type { RunnelAstType } from '../generated/ast.js';
import { QUANTITY_DIMENSIONS, readQuantity, type QuantityNode } from '../analysis/quantities.js';
import { unitsOfDimension } from '../units/units.js';
import { closestName } from './closest-name.js';
import { DIAGNOSTICS, QUANTITY_ROLES, report } from './diagnostic-messages.js';

/** `bottom width 4` lacks a unit; `4 fts` has an unknown one; `4 cfs` has one of the wrong dimension. */
export function quantityMustCarryAcceptedUnit(node: QuantityNode, accept: ValidationAcceptor): void {
  const dimension = QUANTITY_DIMENSIONS[node.$type];
  const what = roleOf(node).what;
  const reading = readQuantity(node);
  if (reading.ok) return;
  switch (reading.problem) {
    case 'no-number':
      return; // A syntax error already says what is wrong.
    case 'missing-unit':
      report(accept, DIAGNOSTICS.unitMissing, { what, dimension }, { node, property: 'value' }, { expectedDimension: dimension });
      return;
    case 'unknown-unit': {
      const spellings = unitsOfDimension(dimension).flatMap((unit) => unit.spellings);
      const suggestion = closestName(reading.unitText, spellings);
      report(
        accept,
        DIAGNOSTICS.unitUnknown,
        { written: reading.unitText, what, dimension, suggestion },
        { node, property: 'unit' },
        { expectedDimension: dimension, ...(suggestion === undefined ? {} : { suggestion }) },
      );
      return;
    }
    case 'wrong-dimension':
      report(
        accept,
        DIAGNOSTICS.unitWrongDimension,
        { written: reading.unitText, writtenDimension: reading.unit.dimension, what, dimension },
        { node, property: 'unit' },
        { expectedDimension: dimension },
      );
      return;
  }
}

/** Widths, depths, lengths, discharges and permissible values must be above zero; freeboard may be zero. */
export function quantityMustHaveAllowedSign(node: QuantityNode, accept: ValidationAcceptor): void {
  if (typeof node.value !== 'number') return;
  if (!Number.isFinite(node.value)) {
    report(accept, DIAGNOSTICS.numberTooLarge, {}, { node, property: 'value' });
    return;
  }
  const role = roleOf(node);
  if (role.sign === 'positive' && !(node.value > 0)) report(accept, DIAGNOSTICS.valueNotPositive, { what: role.what }, { node });
  else if (role.sign === 'non-negative' && node.value < 0) report(accept, DIAGNOSTICS.valueNegative, { what: role.what }, { node });
}

function roleOf(node: QuantityNode): { what: string; sign: 'positive' | 'non-negative' | 'any' } {
  const role = QUANTITY_ROLES[`${node.$container?.$type ?? ''}.${node.$containerProperty ?? ''}`];
  if (role === undefined) return { what: 'this number', sign: 'any' };
  if (node.$container?.$type === 'Flow' || node.$container?.$type === 'FlowChange') {
    const container = node.$container as { name?: string; flow?: { $refText?: string } };
    const flowName = container.name ?? container.flow?.$refText;
    if (flowName) return { ...role, what: `${role.what} of flow '${flowName}'` };
  }
  return role;
}

const quantityChecks = [quantityMustCarryAcceptedUnit, quantityMustHaveAllowedSign];

export const unitChecks: ValidationChecks<RunnelAstType> = {
  Length: quantityChecks,
  Discharge: quantityChecks,
  Velocity: quantityChecks,
  Slope: quantityChecks,
  Shear: quantityChecks,
};
