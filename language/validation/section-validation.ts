/**
 * Cross-sections: each shape gets the dimensions it needs and no others, side slopes make sense, and open
 * sections say how high their banks are (without it over-topping cannot be checked).
 */
import type { ValidationAcceptor, ValidationChecks } from 'langium';
import type { RunnelAstType, Section, SideSlope } from '../generated/ast.js';
import { isSectionShapeName, SHAPE_PROPERTIES, sideSlopeRatio } from '../analysis/design-inputs.js';
import { DIAGNOSTICS, PROPERTY_WORDS, SECTION_PROPERTY_WORDS, report } from './diagnostic-messages.js';

/** A trapezoid needs a bottom width and side slopes; a circle a diameter; and so on. */
export function sectionMustHaveItsDimensions(section: Section, accept: ValidationAcceptor): void {
  const shape = section.shape;
  if (!isSectionShapeName(shape)) return;
  const allowed = SHAPE_PROPERTIES[shape];
  const present = new Set<string>();
  for (const property of section.properties ?? []) {
    const type = property.$type;
    if (![...allowed.required, ...allowed.optional].includes(type)) {
      const takes = [...allowed.required, ...allowed.optional].map((name) => SECTION_PROPERTY_WORDS[name]?.what ?? name).join(' and ');
      report(accept, DIAGNOSTICS.sectionDimensionNotApplicable, { shape, what: withoutArticle(SECTION_PROPERTY_WORDS[type]?.what ?? type), takes }, { node: property });
      continue;
    }
    if (present.has(type)) {
      report(accept, DIAGNOSTICS.propertyRepeated, { what: PROPERTY_WORDS[type] ?? type, where: `section '${section.name ?? ''}'` }, { node: property });
    }
    present.add(type);
  }
  for (const required of allowed.required) {
    if (present.has(required)) continue;
    const words = SECTION_PROPERTY_WORDS[required];
    report(accept, DIAGNOSTICS.sectionDimensionMissing, { shape, what: words?.what ?? required, example: words?.example ?? required }, { node: section, property: 'name' }, { missing: required });
  }
  if (allowed.optional.includes('BankHeight') && !present.has('BankHeight')) {
    report(accept, DIAGNOSTICS.bankHeightMissing, { section: section.name ?? '' }, { node: section, property: 'name' });
  }
  if (shape === 'triangle') {
    const slopes = section.properties?.find((property) => property.$type === 'SideSlopes');
    if (slopes !== undefined && slopes.$type === 'SideSlopes') {
      const left = sideSlopeRatio(slopes.left);
      const right = slopes.right === undefined ? left : sideSlopeRatio(slopes.right);
      if (left === 0 && right === 0) report(accept, DIAGNOSTICS.triangleHasNoWidth, {}, { node: slopes });
    }
  }
}

/** `3:1` is three horizontal to one vertical; `3:0` and `-1:1` are not side slopes. */
export function sideSlopeMustBeValid(slope: SideSlope, accept: ValidationAcceptor): void {
  if (typeof slope.horizontal !== 'number' || typeof slope.vertical !== 'number') return;
  if (!Number.isFinite(slope.horizontal) || !Number.isFinite(slope.vertical)) {
    report(accept, DIAGNOSTICS.numberTooLarge, {}, { node: slope, property: Number.isFinite(slope.horizontal) ? 'vertical' : 'horizontal' });
    return;
  }
  if (sideSlopeRatio(slope) === undefined) report(accept, DIAGNOSTICS.sideSlopeInvalid, {}, { node: slope });
}

function withoutArticle(words: string): string {
  return words.replace(/^an? /, '');
}

export const sectionChecks: ValidationChecks<RunnelAstType> = {
  Section: sectionMustHaveItsDimensions,
  SideSlope: sideSlopeMustBeValid,
};
