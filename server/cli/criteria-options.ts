/**
 * The criteria options of `check`, `report` and `diff`: --freeboard, --near-critical-froude, --minimum-velocity and
 * --limit-margin. Each takes exactly what the editor's `runnel.criteria.*` setting of the same criterion takes: the
 * criterion's line in a `criteria { }` block without its keywords (`0.5 ft`, `usbr`, `0.89 to 1.13`, `2 ft/s`,
 * `20 %`). Values are read by the language's own parser and checks (language/analysis/criteria-settings.ts), so
 * the editor, the command line and CI read them alike; a value that does not read is a usage mistake (status 2).
 * A value written in a design file always wins over an option.
 */
import { EmptyFileSystem } from 'langium';
import { CRITERION_SETTINGS, NO_CRITERIA_DEFAULTS, readCriteriaSettings, type CriteriaDefaults, type CriteriaSettingTexts } from '../../language/analysis/criteria-settings.js';
import { createRunnelServices } from '../../language/runnel-module.js';
import { UsageError, type OptionSpec } from './arguments.js';

/** One option per criterion setting, in the order of the settings table. */
export const CRITERIA_OPTIONS: readonly OptionSpec[] = CRITERION_SETTINGS.map((setting) => ({
  name: setting.option,
  value: 'VALUE',
  description: `default for ${setting.what}, e.g. ${setting.examples.map((example) => `'${example}'`).join(', ')}`,
}));

/** The paragraph every command's help gives on the criteria options. */
export const CRITERIA_OPTIONS_HELP = `Criteria options give a default for designs that do not state that criterion; a value written in a
design file (its criteria block, or a reach's) always wins. Each takes what follows the criterion's
keywords in a criteria block, with its unit: --freeboard "0.5 ft", --freeboard usbr, --freeboard none,
--near-critical-froude "0.89 to 1.13", --minimum-velocity 2ft/s, --limit-margin 20%. The editor's
runnel.criteria.* settings take the same values. The report and the JSON output mark every criterion that
came from an option as coming from a setting, not from the file.`;

export interface CriteriaFromOptions {
  readonly defaults: CriteriaDefaults;
  /** Options as given, e.g. `--freeboard 0.5 ft`, for the output to say what was applied. */
  readonly given: readonly string[];
  /** Cautions on values that still apply (as a file's would), e.g. a USBR coefficient outside the published range. */
  readonly warnings: readonly string[];
}

/** Reads the criteria options of a command; throws a UsageError naming the option and what is wrong. */
export async function criteriaFromOptions(options: ReadonlyMap<string, string>): Promise<CriteriaFromOptions> {
  const texts: Partial<Record<(typeof CRITERION_SETTINGS)[number]['name'], string>> = {};
  const given: string[] = [];
  for (const setting of CRITERION_SETTINGS) {
    const written = options.get(setting.option);
    if (written === undefined) continue;
    if (written.trim() === '') throw new UsageError(`option --${setting.option} needs a value, e.g. '${setting.examples[0] ?? ''}'`);
    texts[setting.name] = written;
    given.push(`--${setting.option} ${written.trim()}`);
  }
  if (given.length === 0) return { defaults: NO_CRITERIA_DEFAULTS, given, warnings: [] };
  const { Runnel } = createRunnelServices(EmptyFileSystem);
  const reading = await readCriteriaSettings(Runnel, texts satisfies CriteriaSettingTexts);
  const problem = reading.problems[0];
  if (problem !== undefined) {
    throw new UsageError(
      `option --${problem.setting.option} does not accept '${problem.written.trim()}': ${problem.message} ` +
        `Write it as in a criteria block after '${problem.setting.keywords}', e.g. ${problem.setting.examples.map((example) => `'${example}'`).join(', ')}.`,
    );
  }
  const warnings = reading.warnings.map((warning) => `--${warning.setting.option} ${warning.written.trim()}: ${warning.message}`);
  return { defaults: reading.defaults, given, warnings };
}

/** The line the text outputs print when options set criteria defaults; null when none did. */
export function criteriaOptionsLine(criteria: CriteriaFromOptions): string | null {
  return criteria.given.length === 0 ? null : `Criteria from command-line options where a design file states none: ${criteria.given.join(', ')}.`;
}
