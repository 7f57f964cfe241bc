/**
 * The inputs of a reach and of the definitions it uses, compared field by field: what a reviewer sees as
 * "section wide: bottom width 1.829 m -> 1.524 m". Also the signatures that recognise a definition moved unchanged
 * under a new name.
 */
import type { LiningResult, ReachResult, ResolvedCriteria, SectionResult } from '../analysis/model.js';
import type { InputChange, QuantityKind } from './comparison-model.js';
import { INPUT_EQUALITY_RELATIVE_TOLERANCE } from './thresholds.js';

/** Unit suffixes of the analysis model's field names and what they measure. */
const KIND_BY_SUFFIX: Readonly<Record<string, QuantityKind>> = {
  m: 'length',
  m2: 'area',
  m3s: 'discharge',
  mps: 'velocity',
  Pa: 'shear',
  HV: 'side-slope',
};

/** What a model field measures, from its unit suffix (`bottomWidth_m` is a length, `leftSideSlope_HV` a side slope). */
export function kindOfField(key: string): QuantityKind {
  const underscore = key.lastIndexOf('_');
  if (underscore < 0) return 'number';
  return KIND_BY_SUFFIX[key.slice(underscore + 1)] ?? 'number';
}

/** Plain words for a model field: `bottomWidth_m` -> "bottom width". */
export function wordsOfField(key: string): string {
  const underscore = key.lastIndexOf('_');
  const base = underscore < 0 ? key : key.slice(0, underscore);
  return base.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase();
}

export function valuesDiffer(before: number | string | null, after: number | string | null): boolean {
  if (typeof before === 'number' && typeof after === 'number') {
    const scale = Math.max(Math.abs(before), Math.abs(after));
    return Math.abs(after - before) > INPUT_EQUALITY_RELATIVE_TOLERANCE * scale;
  }
  return before !== after;
}

class InputChangeList {
  readonly changes: InputChange[] = [];

  add(field: string, label: string, kind: QuantityKind, before: number | string | null, after: number | string | null): void {
    if (valuesDiffer(before, after)) this.changes.push({ field, label, kind, before, after });
  }
}

function prefixed(prefix: string, words: string): string {
  return prefix === '' ? words : `${prefix}: ${words}`;
}

/** Field-by-field differences of two sections (names excluded); `prefix` starts each label, e.g. "section wide". */
export function compareSections(before: SectionResult, after: SectionResult, prefix: string, fieldPrefix: string): InputChange[] {
  const list = new InputChangeList();
  list.add(`${fieldPrefix}shape`, prefixed(prefix, 'shape'), 'text', before.shape, after.shape);
  const keys = [...new Set([...Object.keys(before.dimensions), ...Object.keys(after.dimensions)])];
  for (const key of keys) {
    list.add(`${fieldPrefix}dimensions.${key}`, prefixed(prefix, wordsOfField(key)), kindOfField(key), before.dimensions[key] ?? null, after.dimensions[key] ?? null);
  }
  list.add(`${fieldPrefix}bankDepth_m`, prefixed(prefix, 'bank height'), 'length', before.bankDepth_m, after.bankDepth_m);
  list.add(`${fieldPrefix}fullDepth_m`, prefixed(prefix, 'inside height'), 'length', before.fullDepth_m, after.fullDepth_m);
  return list.changes;
}

/** Field-by-field differences of two linings (names excluded). */
export function compareLinings(before: LiningResult, after: LiningResult, prefix: string, fieldPrefix: string): InputChange[] {
  const list = new InputChangeList();
  list.add(`${fieldPrefix}manningN`, prefixed(prefix, "Manning's n"), 'number', before.manningN, after.manningN);
  list.add(`${fieldPrefix}maxVelocity_mps`, prefixed(prefix, 'permissible velocity'), 'velocity', before.maxVelocity_mps, after.maxVelocity_mps);
  list.add(`${fieldPrefix}maxShear_Pa`, prefixed(prefix, 'permissible shear'), 'shear', before.maxShear_Pa, after.maxShear_Pa);
  return list.changes;
}

function freeboardRule(criteria: ResolvedCriteria): string | null {
  const rule = criteria.freeboard;
  if (rule === null) return null;
  return rule.kind === 'fixed' ? 'fixed height' : 'USBR rule F = sqrt(C y)';
}

/** Differences of two sets of criteria in force (their origins excluded). */
export function compareCriteria(before: ResolvedCriteria, after: ResolvedCriteria): InputChange[] {
  const list = new InputChangeList();
  list.add('criteria.freeboard.kind', 'required freeboard: rule', 'text', freeboardRule(before), freeboardRule(after));
  const heightOf = (criteria: ResolvedCriteria): number | null => (criteria.freeboard?.kind === 'fixed' ? criteria.freeboard.height_m : null);
  const coefficientOf = (criteria: ResolvedCriteria): number | null =>
    criteria.freeboard?.kind === 'usbr-rule' ? criteria.freeboard.coefficientC_SI : null;
  list.add('criteria.freeboard.height_m', 'required freeboard', 'length', heightOf(before), heightOf(after));
  list.add('criteria.freeboard.coefficientC_SI', 'required freeboard: coefficient C (SI)', 'number', coefficientOf(before), coefficientOf(after));
  list.add('criteria.avoidFroude.low', 'Froude band to avoid: lower end', 'ratio', before.avoidFroude.low, after.avoidFroude.low);
  list.add('criteria.avoidFroude.high', 'Froude band to avoid: upper end', 'ratio', before.avoidFroude.high, after.avoidFroude.high);
  list.add('criteria.minVelocity_mps', 'self-cleansing minimum velocity', 'velocity', before.minVelocity_mps, after.minVelocity_mps);
  list.add('criteria.limitMargin', 'margin past a lining limit before it is an error', 'fraction', before.limitMargin, after.limitMargin);
  return list.changes;
}

/** Renames of definitions between the versions, old name -> new name. */
export interface DefinitionRenames {
  readonly sections: ReadonlyMap<string, string>;
  readonly linings: ReadonlyMap<string, string>;
  readonly flows: ReadonlyMap<string, string>;
}

/**
 * Every input of a reach that changed, except its flows (compared flow by flow). A section or lining referred to
 * under a new name is a change only when the definition was not simply renamed.
 */
export function compareReachInputs(before: ReachResult, after: ReachResult, renames: DefinitionRenames): InputChange[] {
  const list = new InputChangeList();
  list.add('section', 'section', 'text', renames.sections.get(before.section.name) ?? before.section.name, after.section.name);
  list.changes.push(...compareSections(before.section, after.section, `section ${after.section.name}`, 'section.'));
  list.add('lining', 'lining', 'text', renames.linings.get(before.lining.name) ?? before.lining.name, after.lining.name);
  list.changes.push(...compareLinings(before.lining, after.lining, `lining ${after.lining.name}`, 'lining.'));
  list.add('slope', 'bed slope', 'slope', before.slope, after.slope);
  list.add('length_m', 'length', 'length', before.length_m, after.length_m);
  list.add('upstreamInvert_m', 'upstream invert', 'length', before.upstreamInvert_m, after.upstreamInvert_m);
  list.add('downstreamInvert_m', 'downstream invert', 'length', before.downstreamInvert_m, after.downstreamInvert_m);
  list.changes.push(...compareCriteria(before.criteria, after.criteria));
  return list.changes;
}

/** Identity of a section apart from its name and place, for rename detection. */
export function sectionSignature(section: SectionResult): string {
  const dimensions = Object.keys(section.dimensions)
    .sort()
    .map((key) => [key, section.dimensions[key]]);
  return JSON.stringify([section.shape, dimensions, section.bankDepth_m, section.fullDepth_m]);
}

export function liningSignature(lining: LiningResult): string {
  return JSON.stringify([lining.manningN, lining.maxVelocity_mps, lining.maxShear_Pa, lining.description]);
}

/** Identity of a reach apart from its name, channel and place: a reach moved unchanged keeps this signature. */
export function reachSignature(reach: ReachResult): string {
  const { origin: _origin, ...criteria } = reach.criteria;
  const discharges = reach.flows.map((flow) => flow.discharge_m3s).sort((a, b) => a - b);
  return JSON.stringify([
    sectionSignature(reach.section),
    liningSignature(reach.lining),
    reach.slope,
    reach.length_m,
    reach.upstreamInvert_m,
    reach.downstreamInvert_m,
    criteria,
    discharges,
  ]);
}
