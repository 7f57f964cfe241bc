/**
 * Criteria blocks: each criterion once per block, a Froude band that runs upward, a USBR coefficient within the
 * range the rule was published with, and a limit margin of zero or more.
 */
import type { ValidationAcceptor, ValidationChecks } from 'langium';
import type { Criteria, FreeboardCriterion, FroudeBandCriterion, LimitMarginCriterion, RunnelAstType } from '../generated/ast.js';
import { USBR_FREEBOARD_RULE } from '../analysis/criteria-defaults.js';
import { quantitySI } from '../analysis/quantities.js';
import { DIAGNOSTICS, PROPERTY_WORDS, report } from './diagnostic-messages.js';

/** Published values are quoted to two decimals in SI (0.46 and 0.76 m): accept those roundings. */
const USBR_COEFFICIENT_ROUNDING_M = 0.005;

export function criteriaMustNotRepeat(criteria: Criteria, accept: ValidationAcceptor): void {
  const seen = new Set<string>();
  for (const item of criteria.items ?? []) {
    if (seen.has(item.$type)) report(accept, DIAGNOSTICS.propertyRepeated, { what: PROPERTY_WORDS[item.$type] ?? item.$type, where: 'this criteria block' }, { node: item });
    seen.add(item.$type);
  }
}

export function froudeBandMustRunUpward(band: FroudeBandCriterion, accept: ValidationAcceptor): void {
  if (typeof band.low !== 'number' || typeof band.high !== 'number') return;
  if (!Number.isFinite(band.low) || !Number.isFinite(band.high)) {
    report(accept, DIAGNOSTICS.numberTooLarge, {}, { node: band, property: Number.isFinite(band.low) ? 'high' : 'low' });
    return;
  }
  if (!(band.low >= 0 && band.high > band.low)) report(accept, DIAGNOSTICS.froudeBandInvalid, {}, { node: band });
}

export function usbrCoefficientShouldBeInPublishedRange(criterion: FreeboardCriterion, accept: ValidationAcceptor): void {
  if (criterion.coefficient === undefined) return;
  const coefficientM = quantitySI(criterion.coefficient);
  if (coefficientM === undefined || !(coefficientM > 0)) return;
  const low = USBR_FREEBOARD_RULE.lowCoefficient_m - USBR_COEFFICIENT_ROUNDING_M;
  const high = USBR_FREEBOARD_RULE.highCoefficient_m + USBR_COEFFICIENT_ROUNDING_M;
  if (coefficientM < low || coefficientM > high) {
    const written = criterion.coefficient.$cstNode?.text ?? '';
    report(accept, DIAGNOSTICS.usbrCoefficientUnusual, { written }, { node: criterion.coefficient });
  }
}

export function limitMarginMustNotBeNegative(margin: LimitMarginCriterion, accept: ValidationAcceptor): void {
  if (typeof margin.percent === 'number' && !Number.isFinite(margin.percent)) report(accept, DIAGNOSTICS.numberTooLarge, {}, { node: margin, property: 'percent' });
  else if (typeof margin.percent === 'number' && margin.percent < 0) report(accept, DIAGNOSTICS.valueNegative, { what: 'the limit margin' }, { node: margin, property: 'percent' });
}

export const criteriaChecks: ValidationChecks<RunnelAstType> = {
  Criteria: criteriaMustNotRepeat,
  FroudeBandCriterion: froudeBandMustRunUpward,
  FreeboardCriterion: usbrCoefficientShouldBeInPublishedRange,
  LimitMarginCriterion: limitMarginMustNotBeNegative,
};
