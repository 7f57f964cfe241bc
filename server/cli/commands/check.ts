/**
 * `runnel check <files...>`: every problem and finding of the designs, one per line or as JSON, SARIF or
 * workflow annotations. Exit status 1 when any error is found, 0 otherwise (2 for a usage mistake).
 */
import { relative, sep } from 'node:path';
import { pathToFileURL } from 'node:url';
import { CAUTION } from '../../../language/analysis/provenance.js';
import { describeOptions, parseArguments, UsageError, type OptionSpec } from '../arguments.js';
import { checkJsonDocument, checkSarifLog, renderCheckText, renderGithubAnnotations, type CheckedFile } from '../check-output.js';
import { CRITERIA_OPTIONS, CRITERIA_OPTIONS_HELP, criteriaFromOptions, criteriaOptionsLine } from '../criteria-options.js';
import { loadDesigns } from '../load-designs.js';
import { writeOutput } from '../output-file.js';
import { PLAIN_STYLES, stylesFor, type CliContext } from '../terminal.js';
import { TOOL } from '../tool-info.js';
import { displayPath, expandTargets, gitRootAbove, isInside } from '../workspace-files.js';

export const CHECK_FORMATS = ['text', 'json', 'sarif', 'github'] as const;

export const CHECK_OPTIONS: readonly OptionSpec[] = [
  { name: 'format', short: 'f', value: 'FORMAT', choices: CHECK_FORMATS, description: 'output format; default text' },
  { name: 'out', short: 'o', value: 'FILE', description: 'write the output to FILE instead of standard output' },
  { name: 'workspace', short: 'w', value: 'FOLDER', description: 'load the other design files from FOLDER (default: see below)' },
  ...CRITERIA_OPTIONS,
  { name: 'help', short: 'h', description: 'show this help' },
];

export const CHECK_USAGE = 'runnel check [options] <files or folders...>';

export function checkHelp(): string {
  return `Usage: ${CHECK_USAGE}

Checks design files: syntax, names, units, and the hydraulic checks of every reach at every design flow.
Prints one line per problem as  path:line:column: severity code message  and exits with status 1
when any error is found, 0 otherwise, 2 for a usage mistake. A folder means every .runnel file in it.

Options:
${describeOptions(CHECK_OPTIONS)}

Formats:
  text    one line per problem, a tally and the caution
  json    one JSON document: every file's problems and its whole analysis (SI units, unit in each field name)
  sarif   SARIF 2.1.0 for code-scanning tools
  github  workflow annotation lines (::error file=...,line=...::message)

Each file is checked with the other design files of its workspace, so names from a shared library resolve:
the --workspace folder, else the git repository that holds the file, else the current folder (when the file
is inside it), else the file's folder. Folders named node_modules or starting with a dot are skipped.

${CRITERIA_OPTIONS_HELP}
`;
}

export async function runCheck(args: readonly string[], context: CliContext): Promise<number> {
  const parsed = parseArguments(args, CHECK_OPTIONS);
  if (parsed.options.has('help')) {
    context.stdout.write(checkHelp());
    return 0;
  }
  if (parsed.positionals.length === 0) throw new UsageError('no design files given');
  const format = (parsed.options.get('format') ?? 'text') as (typeof CHECK_FORMATS)[number];
  const out = parsed.options.get('out');
  const workspace = parsed.options.get('workspace');
  const criteria = await criteriaFromOptions(parsed.options);
  for (const warning of criteria.warnings) context.stderr.write(`runnel: warning: ${warning}\n`);
  const targets = expandTargets(parsed.positionals, context.cwd);
  const results = await loadDesigns(targets, context.cwd, { criteriaDefaults: criteria.defaults, ...(workspace === undefined ? {} : { workspace }) });

  const sourceRoot = gitRootAbove(context.cwd) ?? context.cwd;
  const files: CheckedFile[] = results.map((result) => ({
    displayPath: displayPath(result.path, context.cwd),
    rootRelativePath: isInside(sourceRoot, result.path) ? relative(sourceRoot, result.path).split(sep).join('/') : result.path.split(sep).join('/'),
    result,
  }));
  const caution = results.find((result) => result.analysis !== null)?.analysis?.caution ?? CAUTION;

  let text: string;
  switch (format) {
    case 'json':
      text = `${JSON.stringify(checkJsonDocument(files, caution, TOOL), null, 2)}\n`;
      break;
    case 'sarif':
      text = `${JSON.stringify(checkSarifLog(files, caution, TOOL, pathToFileURL(sourceRoot).href), null, 2)}\n`;
      break;
    case 'github':
      text = renderGithubAnnotations(files);
      break;
    case 'text':
      text = renderCheckText(files, caution, out === undefined ? stylesFor(context.stdout, context.env) : PLAIN_STYLES, criteriaOptionsLine(criteria));
      break;
  }
  writeOutput(text, out, context);
  const anyError = results.some((result) => result.diagnostics.some((diagnostic) => diagnostic.severity === 'error'));
  return anyError ? 1 : 0;
}
