/**
 * Design-criteria defaults from outside the design file: the editor's `runnel.criteria.*` settings and the command
 * line's `--freeboard`, `--near-critical-froude`, `--minimum-velocity` and `--limit-margin`. They sit between
 * Runnel's built-in defaults (criteria-defaults.ts) and the file: built-in default < setting < the design's
 * `criteria { }` < the reach's own. The file is the record, so a value it states always wins; a value taken from
 * here is marked 'setting' in ResolvedCriteria.origin, and hover, report and findings say so in plain words.
 *
 * A setting is written exactly as its line inside a `criteria { }` block, without the keywords: `0.5 ft`, `usbr`,
 * `usbr coefficient 1.8 ft`, `none`, `0.89 to 1.13`, `2 ft/s`, `20 %`. It is read by parsing a tiny design with the
 * real parser, checking it with the real validation (units from the one unit table) and resolving it with
 * resolveCriteria: one grammar, one set of messages, one resolution path. A value that does not read is refused
 * with the reason, never applied in part.
 */
import { URI, type DocumentValidator, type LangiumCoreServices } from 'langium';
import { isCriteria, isRunnelFile } from '../generated/ast.js';
import { resolveCriteria } from './design-inputs.js';
import type { ResolvedCriteria } from './model.js';

/** The criteria a setting may give, as ResolvedCriteria holds them (SI); an absent key is not set. */
export type CriteriaDefaults = Readonly<Partial<Pick<ResolvedCriteria, 'freeboard' | 'avoidFroude' | 'minVelocity_mps' | 'limitMargin'>>>;

/** No setting: the built-in defaults and the file alone decide. */
export const NO_CRITERIA_DEFAULTS: CriteriaDefaults = Object.freeze({});

export type CriterionSettingName = 'freeboard' | 'nearCriticalFroude' | 'minimumVelocity' | 'limitMargin';

/** One criterion that a setting or an option can give. */
export interface CriterionSetting {
  /** The setting's name under `runnel.criteria.` (package.json). */
  readonly name: CriterionSettingName;
  /** The command-line option, without dashes. */
  readonly option: string;
  /** The keywords that start its line in a `criteria { }` block. */
  readonly keywords: string;
  /** The AST type of that line (language/runnel.langium). */
  readonly astType: 'FreeboardCriterion' | 'FroudeBandCriterion' | 'MinimumVelocityCriterion' | 'LimitMarginCriterion';
  /** Its key in ResolvedCriteria.origin. */
  readonly originKey: 'freeboard' | 'avoidFroude' | 'minVelocity' | 'limitMargin';
  /** Its value in CriteriaDefaults. */
  readonly criterion: keyof CriteriaDefaults;
  /** What it sets, for help texts. */
  readonly what: string;
  /** Values it accepts, as written; the first is a typical one. */
  readonly examples: readonly string[];
}

/** Every criterion a setting can give: the one table the server, the command line and the manifest test read. */
export const CRITERION_SETTINGS: readonly CriterionSetting[] = [
  {
    name: 'freeboard',
    option: 'freeboard',
    keywords: 'freeboard',
    astType: 'FreeboardCriterion',
    originKey: 'freeboard',
    criterion: 'freeboard',
    what: 'the freeboard required',
    examples: ['0.5 ft', '0.15 m', 'usbr', 'usbr coefficient 1.8 ft', 'none'],
  },
  {
    name: 'nearCriticalFroude',
    option: 'near-critical-froude',
    keywords: 'avoid froude',
    astType: 'FroudeBandCriterion',
    originKey: 'avoidFroude',
    criterion: 'avoidFroude',
    what: 'the near-critical band of Froude numbers to avoid',
    examples: ['0.89 to 1.13', '0.8 to 1.2'],
  },
  {
    name: 'minimumVelocity',
    option: 'minimum-velocity',
    keywords: 'minimum velocity',
    astType: 'MinimumVelocityCriterion',
    originKey: 'minVelocity',
    criterion: 'minVelocity_mps',
    what: 'the self-cleansing minimum velocity',
    examples: ['2 ft/s', '0.6 m/s'],
  },
  {
    name: 'limitMargin',
    option: 'limit-margin',
    keywords: 'limit margin',
    astType: 'LimitMarginCriterion',
    originKey: 'limitMargin',
    criterion: 'limitMargin',
    what: "how far past a lining's permissible velocity or shear a warning becomes an error",
    examples: ['20 %', '10 %'],
  },
];

/** The written values of the settings by name; an empty or absent value is not set. */
export type CriteriaSettingTexts = Readonly<Partial<Record<CriterionSettingName, string>>>;

/** A setting's value read: the criterion it gives, and cautions that do not stop it applying (as in a file). */
export type CriterionSettingReading =
  | { readonly ok: true; readonly defaults: CriteriaDefaults; readonly warnings: readonly string[] }
  | { readonly ok: false; readonly problem: string };

/** One setting whose value is refused or carries a caution. */
export interface CriterionSettingNote {
  readonly setting: CriterionSetting;
  readonly written: string;
  readonly message: string;
}

export interface CriteriaSettingsReading {
  /** The criteria of every setting that read, merged. */
  readonly defaults: CriteriaDefaults;
  /** Settings refused: they are not applied. */
  readonly problems: readonly CriterionSettingNote[];
  /** Settings applied with a caution (e.g. a USBR coefficient outside the published range). */
  readonly warnings: readonly CriterionSettingNote[];
}

/**
 * Reads one setting's value (see the module comment). Empty or blank means not set: `{ ok: true }` with no
 * criterion. Never throws on what the user wrote.
 */
export async function readCriterionSetting(services: LangiumCoreServices, setting: CriterionSetting, written: string): Promise<CriterionSettingReading> {
  const value = written.trim();
  if (value === '') return { ok: true, defaults: NO_CRITERIA_DEFAULTS, warnings: [] };
  const text = `design "setting"\ncriteria {\n  ${setting.keywords} ${value}\n}\n`;
  const document = services.shared.workspace.LangiumDocumentFactory.fromString(text, URI.parse(`inmemory:/runnel-setting/${setting.name}.runnel`));
  const diagnostics: Diagnostic[] = await services.validation.DocumentValidator.validateDocument(document);
  const error = diagnostics.find((diagnostic) => diagnostic.severity === 1);
  if (error !== undefined) {
    // The parser meets the tiny design's closing brace where the value stops short: say so in the value's terms.
    const atEnd = error.range.start.line > 2;
    return { ok: false, problem: atEnd ? messageText(error).replace(/,? but found '\}'/, ', but the value ends there') : messageText(error) };
  }
  const root = document.parseResult.value;
  const members = isRunnelFile(root) ? (root.members ?? []) : [];
  const block = members.length === 1 && isCriteria(members[0]) ? members[0] : undefined;
  const items = block?.items ?? [];
  if (block === undefined || items.length !== 1 || items[0]?.$type !== setting.astType) {
    return { ok: false, problem: `It is not one value of ${setting.what}.` };
  }
  const resolved = resolveCriteria([block], [], 'SI', NO_CRITERIA_DEFAULTS);
  if (resolved.origin[setting.originKey] !== 'design') return { ok: false, problem: `It cannot be read as ${setting.what}.` };
  // Cautions about the value itself (line 3 of the tiny design), not about the design around it.
  const warnings = diagnostics.filter((diagnostic) => diagnostic.severity === 2 && diagnostic.range.start.line === 2).map(messageText);
  return { ok: true, defaults: { [setting.criterion]: resolved[setting.criterion] }, warnings };
}

/** Reads every setting of `texts`; refused ones are listed in `problems` and left out of `defaults`. */
export async function readCriteriaSettings(services: LangiumCoreServices, texts: CriteriaSettingTexts): Promise<CriteriaSettingsReading> {
  let defaults: CriteriaDefaults = NO_CRITERIA_DEFAULTS;
  const problems: CriterionSettingNote[] = [];
  const warnings: CriterionSettingNote[] = [];
  for (const setting of CRITERION_SETTINGS) {
    const written = texts[setting.name] ?? '';
    const reading = await readCriterionSetting(services, setting, written);
    if (!reading.ok) {
      problems.push({ setting, written, message: reading.problem });
      continue;
    }
    defaults = { ...defaults, ...reading.defaults };
    for (const message of reading.warnings) warnings.push({ setting, written, message });
  }
  return { defaults: Object.keys(defaults).length === 0 ? NO_CRITERIA_DEFAULTS : defaults, problems, warnings };
}

/**
 * A canonical text of the defaults, equal for equal values: the analysis cache is keyed on it, so a changed
 * setting recomputes and an unchanged one does not.
 */
export function criteriaDefaultsKey(defaults: CriteriaDefaults): string {
  let key = keys.get(defaults);
  if (key === undefined) {
    const part = (value: unknown): unknown => (value === undefined ? 'unset' : value);
    key = JSON.stringify([part(defaults.freeboard), part(defaults.avoidFroude), part(defaults.minVelocity_mps), part(defaults.limitMargin)]);
    keys.set(defaults, key);
  }
  return key;
}

/**
 * The criteria defaults in force for one set of language services: set by the language server from the editor's
 * settings and by the command line from its options; read by validation and by every analysis of a document. An
 * editor may give a workspace folder settings of its own (a multi-root workspace): a document in such a folder
 * takes that folder's defaults, any other document the window's.
 */
export class CriteriaDefaultsSource {
  private defaults: CriteriaDefaults = NO_CRITERIA_DEFAULTS;
  private byFolder: ReadonlyMap<string, CriteriaDefaults> = new Map();

  /** The window's defaults (the command line's options): for documents outside every folder with its own. */
  get current(): CriteriaDefaults {
    return this.defaults;
  }

  /** The defaults for a document, by its URI: its workspace folder's, else the window's. */
  forDocument(documentUri: string): CriteriaDefaults {
    const folder = containingFolder(documentUri, this.byFolder.keys());
    return folder === undefined ? this.defaults : (this.byFolder.get(folder) ?? this.defaults);
  }

  /** Puts the window's `defaults` and each folder's in force; true when anything differs from before. */
  replace(defaults: CriteriaDefaults, byFolder: ReadonlyMap<string, CriteriaDefaults> = new Map()): boolean {
    // A folder whose defaults are the window's changes nothing: it is not kept.
    const windowKey = criteriaDefaultsKey(defaults);
    const own = new Map([...byFolder].filter(([, value]) => criteriaDefaultsKey(value) !== windowKey));
    const keyOf = (window: CriteriaDefaults, folders: ReadonlyMap<string, CriteriaDefaults>): string =>
      JSON.stringify([criteriaDefaultsKey(window), [...folders].map(([folder, value]) => [folder, criteriaDefaultsKey(value)]).sort()]);
    const changed = keyOf(defaults, own) !== keyOf(this.defaults, this.byFolder);
    this.defaults = defaults;
    this.byFolder = own;
    return changed;
  }
}

/**
 * The workspace folder a document lies in: the longest folder URI that is a prefix of its URI at a path boundary;
 * undefined when none is.
 */
export function containingFolder(documentUri: string, folderUris: Iterable<string>): string | undefined {
  let best: string | undefined;
  for (const folder of folderUris) {
    const prefix = folder.endsWith('/') ? folder : `${folder}/`;
    if (documentUri.startsWith(prefix) && (best === undefined || folder.length > best.length)) best = folder;
  }
  return best;
}

/** Langium's diagnostic type, named without importing the LSP types package into language/. */
type Diagnostic = Awaited<ReturnType<DocumentValidator['validateDocument']>>[number];

function messageText(diagnostic: Diagnostic): string {
  return typeof diagnostic.message === 'string' ? diagnostic.message : diagnostic.message.value;
}

const keys = new WeakMap<CriteriaDefaults, string>();
