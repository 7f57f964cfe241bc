/**
 * Linings: Manning's n is required and should lie in the usual range (a warning catches 0.35 for 0.035); each
 * property is given once.
 */
import type { ValidationAcceptor, ValidationChecks } from 'langium';
import { isManningRoughness, type Lining, type ManningRoughness, type RunnelAstType } from '../generated/ast.js';
import { TYPICAL_MANNING_N } from '../analysis/criteria-defaults.js';
import { DIAGNOSTICS, PROPERTY_WORDS, report } from './diagnostic-messages.js';

export function liningMustGiveManningN(lining: Lining, accept: ValidationAcceptor): void {
  const properties = lining.properties ?? [];
  if (!properties.some(isManningRoughness)) {
    report(accept, DIAGNOSTICS.manningNMissing, { lining: lining.name ?? '' }, { node: lining, property: 'name' });
  }
  const seen = new Set<string>();
  for (const property of properties) {
    if (seen.has(property.$type)) {
      report(accept, DIAGNOSTICS.propertyRepeated, { what: PROPERTY_WORDS[property.$type] ?? property.$type, where: `lining '${lining.name ?? ''}'` }, { node: property });
    }
    seen.add(property.$type);
  }
}

export function manningNShouldBeTypical(roughness: ManningRoughness, accept: ValidationAcceptor): void {
  const value = roughness.value;
  if (typeof value !== 'number') return;
  if (!Number.isFinite(value)) {
    report(accept, DIAGNOSTICS.numberTooLarge, {}, { node: roughness, property: 'value' });
    return;
  }
  if (!(value > 0)) {
    report(accept, DIAGNOSTICS.valueNotPositive, { what: "Manning's n" }, { node: roughness, property: 'value' });
    return;
  }
  if (value < TYPICAL_MANNING_N.low || value > TYPICAL_MANNING_N.high) {
    report(accept, DIAGNOSTICS.manningNUnusual, { value }, { node: roughness, property: 'value' });
  }
}

export const liningChecks: ValidationChecks<RunnelAstType> = {
  Lining: liningMustGiveManningN,
  ManningRoughness: manningNShouldBeTypical,
};
