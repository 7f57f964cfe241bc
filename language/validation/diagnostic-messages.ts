/**
 * Every validation diagnostic Runnel reports: its stable kebab-case code, its severity and its message, in one
 * place. Checks refer to these entries by name; quick fixes look diagnostics up by `data.code`.
 * (Findings of the analysis, reported through validation as well, have their own catalogue in
 * language/analysis/finding-messages.ts.)
 */
import type { AstNode, CstNode, DiagnosticInfo, ValidationAcceptor, ValidationSeverity } from 'langium';
import { DIMENSION_NAMES, unitsOfDimension, type Dimension } from '../units/units.js';
import { TYPICAL_MANNING_N, USBR_FREEBOARD_RULE } from '../analysis/criteria-defaults.js';
import { formatInUnit } from '../analysis/format-quantity.js';

export interface DiagnosticRule<P> {
  readonly code: string;
  readonly severity: ValidationSeverity;
  readonly message: (parameters: P) => string;
}

function rule<P>(code: string, severity: ValidationSeverity, message: (parameters: P) => string): DiagnosticRule<P> {
  return { code, severity, message };
}

/** "m, km, cm, mm, ft, in or mi": the units accepted for a dimension, from the unit table. */
export function acceptedUnitsText(dimension: Dimension): string {
  const symbols = unitsOfDimension(dimension).map((unit) => unit.symbol);
  return symbols.length <= 1 ? (symbols[0] ?? '') : `${symbols.slice(0, -1).join(', ')} or ${symbols[symbols.length - 1]}`;
}

/** "length", "shear stress": the dimension's name without its article. */
const dimensionNoun = (dimension: Dimension): string => DIMENSION_NAMES[dimension].replace(/^an? /, '');
const didYouMean = (suggestion: string | undefined): string => (suggestion === undefined ? '' : ` Did you mean '${suggestion}'?`);
const capitalise = (text: string): string => text.charAt(0).toUpperCase() + text.slice(1);

export const DIAGNOSTICS = {
  // ------------------------------------------------------------------------------------------ file
  stringNotClosed: rule<Record<string, never>>('string-not-closed', 'error', () => 'This text has no closing quote: add " before the end of the line.'),
  headerMissing: rule<Record<string, never>>(
    'header-missing',
    'warning',
    () => 'A Runnel file starts with `design "title"` (a design) or `library "title"` (shared linings and sections).',
  ),
  unitsSettingUnknown: rule<{ written: string; suggestion: string | undefined }>(
    'units-setting-unknown',
    'error',
    (p) => `Unknown display units '${p.written}': write \`units SI\` or \`units US\`.${didYouMean(p.suggestion)}`,
  ),
  libraryHoldsDefinitionsOnly: rule<{ what: string }>(
    'library-holds-definitions-only',
    'error',
    (p) => `A library holds linings and sections only; move ${p.what} to a design file.`,
  ),
  propertyRepeated: rule<{ what: string; where: string }>('property-repeated', 'error', (p) => `${capitalise(p.what)} is given twice in ${p.where}; remove one.`),

  // ------------------------------------------------------------------------------------------ names and references
  duplicateName: rule<{ kind: string; scope: 'file' | 'channel'; name: string; line: number }>(
    'duplicate-name',
    'error',
    (p) => `Another ${p.kind} in this ${p.scope} is already named '${p.name}' (line ${p.line}); names must be unique.`,
  ),
  unknownReference: rule<{ kind: string; name: string; suggestion: string | undefined; known: readonly string[] }>('unknown-reference', 'error', (p) => {
    const base = `No ${p.kind} named '${p.name}' is defined in this file or the workspace.`;
    if (p.suggestion !== undefined) return `${base}${didYouMean(p.suggestion)}`;
    if (p.known.length === 0) return `${base} None is defined yet.`;
    const shown = p.known.slice(0, 6);
    return `${base} Known: ${shown.join(', ')}${p.known.length > shown.length ? ', ...' : ''}.`;
  }),
  ambiguousReference: rule<{ kind: string; name: string; files: readonly string[]; used: string }>(
    'ambiguous-reference',
    'warning',
    (p) => `${p.files.length} ${p.kind}s named '${p.name}' are defined in the workspace (${p.files.join(', ')}); this uses the one in ${p.used}. Rename one to make the choice explicit.`,
  ),

  // ------------------------------------------------------------------------------------------ numbers and units
  unitMissing: rule<{ what: string; dimension: Dimension }>(
    'unit-missing',
    'error',
    (p) => `Missing unit: ${p.what} needs a unit of ${dimensionNoun(p.dimension)} (${acceptedUnitsText(p.dimension)}).`,
  ),
  unitUnknown: rule<{ written: string; what: string; dimension: Dimension; suggestion: string | undefined }>(
    'unit-unknown',
    'error',
    (p) => `Unknown unit '${p.written}': ${p.what} needs a unit of ${dimensionNoun(p.dimension)} (${acceptedUnitsText(p.dimension)}).${didYouMean(p.suggestion)}`,
  ),
  unitWrongDimension: rule<{ written: string; writtenDimension: Dimension; what: string; dimension: Dimension }>(
    'unit-wrong-dimension',
    'error',
    (p) => `'${p.written}' is a unit of ${dimensionNoun(p.writtenDimension)}, but ${p.what} needs a unit of ${dimensionNoun(p.dimension)} (${acceptedUnitsText(p.dimension)}).`,
  ),
  valueNotPositive: rule<{ what: string }>('value-not-positive', 'error', (p) => `${capitalise(p.what)} must be greater than zero.`),
  valueNegative: rule<{ what: string }>('value-negative', 'error', (p) => `${capitalise(p.what)} cannot be negative.`),
  numberTooLarge: rule<Record<string, never>>('number-too-large', 'error', () => 'This number is too large to compute with.'),

  // ------------------------------------------------------------------------------------------ sections
  sectionDimensionMissing: rule<{ shape: string; what: string; example: string }>(
    'section-dimension-missing',
    'error',
    (p) => `A ${p.shape} needs ${p.what}: add \`${p.example}\`.`,
  ),
  sectionDimensionNotApplicable: rule<{ shape: string; what: string; takes: string }>(
    'section-dimension-not-applicable',
    'error',
    (p) => `A ${p.shape} has no ${p.what}; a ${p.shape} takes ${p.takes}.`,
  ),
  sideSlopeInvalid: rule<Record<string, never>>(
    'side-slope-invalid',
    'error',
    () => 'A side slope is horizontal:vertical with a vertical part above zero and a horizontal part of zero or more, e.g. 3:1.',
  ),
  triangleHasNoWidth: rule<Record<string, never>>('side-slope-invalid', 'error', () => 'A triangle with both sides vertical (0:1) has no width.'),
  bankHeightMissing: rule<{ section: string }>(
    'bank-height-missing',
    'warning',
    (p) => `Section '${p.section}' has no bank height, so over-topping and freeboard are not checked: add \`bank height ...\`.`,
  ),

  // ------------------------------------------------------------------------------------------ linings
  manningNMissing: rule<{ lining: string }>('manning-n-missing', 'error', (p) => `Lining '${p.lining}' needs Manning's n, e.g. \`n 0.035\`.`),
  manningNUnusual: rule<{ value: number }>(
    'manning-n-unusual',
    'warning',
    (p) =>
      `Manning's n ${p.value} is outside the usual range ${TYPICAL_MANNING_N.low} to ${TYPICAL_MANNING_N.high} (${TYPICAL_MANNING_N.source}): check for a misplaced decimal point.`,
  ),

  // ------------------------------------------------------------------------------------------ reaches and channels
  reachIncomplete: rule<{ reach: string; what: string; example: string }>(
    'reach-incomplete',
    'error',
    (p) => `Reach '${p.reach}' needs ${p.what}: add ${p.example}.`,
  ),
  invertSlopeTooLarge: rule<Record<string, never>>('number-too-large', 'error', () => 'These inverts and the reach length give a slope too large to compute with.'),
  slopeAndInverts: rule<Record<string, never>>('slope-and-inverts', 'error', () => 'Give either a slope or inverts, not both.'),
  slopeNotFalling: rule<{ slopeText: string; horizontal: boolean }>(
    'slope-not-falling',
    'warning',
    (p) =>
      (p.horizontal ? `A slope of ${p.slopeText} is horizontal` : `A slope of ${p.slopeText} rises downstream (adverse)`) +
      ': there is no normal depth, so uniform-flow checks are skipped for this reach.',
  ),
  channelHasNoReaches: rule<{ channel: string }>('channel-has-no-reaches', 'warning', (p) => `Channel '${p.channel}' has no reaches: add \`reach name { ... }\`.`),
  noFlows: rule<{ channel: string }>(
    'no-flows',
    'warning',
    (p) => `No flows are defined, so channel '${p.channel}' is not checked: add \`flows { q10 = ... }\`.`,
  ),
  flowDischargeMissing: rule<{ flow: string; channel: string; reaches: readonly string[]; allReaches: boolean }>(
    'flow-discharge-missing',
    'error',
    (p) =>
      `Flow '${p.flow}' has no discharge ${p.allReaches ? `in channel '${p.channel}'` : `in reach${p.reaches.length > 1 ? 'es' : ''} ${p.reaches.map((name) => `'${name}'`).join(', ')} of channel '${p.channel}'`}: ` +
      `give one in the flow table (\`${p.flow} = ...\`) or in the channel's \`flows { }\`.`,
  ),
  outletMissing: rule<{ channel: string }>(
    'outlet-missing',
    'info',
    (p) => `Channel '${p.channel}' has no outlet condition: add \`outlet free fall\`, \`outlet normal depth\` or \`outlet water level ...\`.`,
  ),

  // ------------------------------------------------------------------------------------------ criteria
  froudeBandInvalid: rule<Record<string, never>>(
    'froude-band-invalid',
    'error',
    () => 'The Froude band runs from a lower to a higher number, both zero or more, e.g. `avoid froude 0.89 to 1.13`.',
  ),
  usbrCoefficientUnusual: rule<{ written: string }>(
    'usbr-coefficient-unusual',
    'warning',
    (p) =>
      `The USBR rule's C runs from ${formatInUnit(USBR_FREEBOARD_RULE.lowCoefficient_m, 'ft')} (${formatInUnit(USBR_FREEBOARD_RULE.lowCoefficient_m, 'm')}) at 20 cfs to ` +
      `${formatInUnit(USBR_FREEBOARD_RULE.highCoefficient_m, 'ft')} (${formatInUnit(USBR_FREEBOARD_RULE.highCoefficient_m, 'm')}) at 3,000 cfs (${USBR_FREEBOARD_RULE.source}); ${p.written} is outside that range.`,
  ),
} as const;

/** Where a diagnostic goes: a node, optionally narrowed to one of its properties or given an explicit range. */
export interface DiagnosticPlace {
  readonly node: AstNode;
  readonly property?: string;
  readonly index?: number;
  readonly range?: CstNode['range'];
  readonly keyword?: string;
}

/** What each number measures, in words, and whether it must be positive, keyed by `Container.property`. */
export const QUANTITY_ROLES: Readonly<Record<string, { readonly what: string; readonly sign: 'positive' | 'non-negative' | 'any' }>> = {
  'BottomWidth.value': { what: 'the bottom width', sign: 'positive' },
  'BankHeight.value': { what: 'the bank height', sign: 'positive' },
  'Diameter.value': { what: 'the diameter', sign: 'positive' },
  'TopWidthAtDepth.value': { what: 'the top width', sign: 'positive' },
  'TopWidthAtDepth.depth': { what: 'the depth of that top width', sign: 'positive' },
  'FreeboardCriterion.height': { what: 'the freeboard', sign: 'non-negative' },
  'FreeboardCriterion.coefficient': { what: "the USBR rule's coefficient C", sign: 'positive' },
  'MinimumVelocityCriterion.value': { what: 'the minimum velocity', sign: 'non-negative' },
  'PermissibleVelocity.value': { what: 'the permissible velocity', sign: 'positive' },
  'PermissibleShear.value': { what: 'the permissible shear', sign: 'positive' },
  'Flow.discharge': { what: 'the discharge', sign: 'positive' },
  'FlowChange.discharge': { what: 'the discharge', sign: 'positive' },
  'BedSlope.value': { what: 'the slope', sign: 'any' },
  'Inverts.upstream': { what: 'the upstream invert', sign: 'any' },
  'Inverts.downstream': { what: 'the downstream invert', sign: 'any' },
  'ReachLength.value': { what: 'the length', sign: 'positive' },
  'Outlet.level': { what: 'the outlet water level', sign: 'any' },
};

/** How section properties are named in messages, with an example line for each. */
export const SECTION_PROPERTY_WORDS: Readonly<Record<string, { readonly what: string; readonly example: string }>> = {
  BottomWidth: { what: 'a bottom width', example: 'bottom width 4 ft' },
  SideSlopes: { what: 'side slopes', example: 'side slopes 3:1' },
  BankHeight: { what: 'a bank height', example: 'bank height 2 ft' },
  Diameter: { what: 'a diameter', example: 'diameter 24 in' },
  TopWidthAtDepth: { what: 'a top width at a depth', example: 'top width 12 ft at depth 2 ft' },
};

/** How repeatable properties are named in "given twice" messages, by AST type. */
export const PROPERTY_WORDS: Readonly<Record<string, string>> = {
  BottomWidth: 'the bottom width',
  SideSlopes: 'the side slopes',
  BankHeight: 'the bank height',
  Diameter: 'the diameter',
  TopWidthAtDepth: 'the top width',
  ManningRoughness: "Manning's n",
  PermissibleVelocity: 'the permissible velocity',
  PermissibleShear: 'the permissible shear',
  SourceNote: 'the source',
  SectionUse: 'the section',
  LiningUse: 'the lining',
  BedSlope: 'the slope',
  Inverts: 'the inverts',
  ReachLength: 'the length',
  FreeboardCriterion: 'the freeboard',
  FroudeBandCriterion: 'the Froude band',
  MinimumVelocityCriterion: 'the minimum velocity',
  LimitMarginCriterion: 'the limit margin',
  UnitsSetting: 'the units setting',
  Outlet: 'the outlet condition',
};

/** How kinds of named things and references are called in messages. */
export const KIND_WORDS: Readonly<Record<string, string>> = {
  Lining: 'lining',
  Section: 'section',
  Flow: 'flow',
  Channel: 'channel',
  Reach: 'reach',
};

/** Reports a catalogued diagnostic with its code in both `code` and `data.code` (plus any data a quick fix needs). */
export function report<P>(accept: ValidationAcceptor, diagnostic: DiagnosticRule<P>, parameters: P, place: DiagnosticPlace, data: Record<string, unknown> = {}): void {
  accept(diagnostic.severity, diagnostic.message(parameters), { ...place, code: diagnostic.code, data: { ...data, code: diagnostic.code } } as DiagnosticInfo<AstNode>);
}
