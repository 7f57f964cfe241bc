/**
 * `runnel report <file> [--out FILE]`: the design's report, Markdown by default, one self-contained HTML page
 * when --out ends in .html or with --format html. The report is written even when the design has problems; the
 * exit status is 1 when the file has parse or validation errors (the report is then partial), 0 otherwise.
 */
import { basename } from 'node:path';
import { renderReportHtml, renderReportMarkdown } from '../../../language/report/index.js';
import { describeOptions, parseArguments, UsageError, type OptionSpec } from '../arguments.js';
import { formatDiagnosticLine } from '../check-output.js';
import { CRITERIA_OPTIONS, CRITERIA_OPTIONS_HELP, criteriaFromOptions } from '../criteria-options.js';
import { loadDesigns } from '../load-designs.js';
import { writeOutput } from '../output-file.js';
import { stylesFor, type CliContext } from '../terminal.js';
import { displayPath, expandTargets } from '../workspace-files.js';

export const REPORT_FORMATS = ['markdown', 'html'] as const;

export const REPORT_OPTIONS: readonly OptionSpec[] = [
  { name: 'out', short: 'o', value: 'FILE', description: 'write the report to FILE (HTML when it ends in .html or .htm)' },
  { name: 'format', short: 'f', value: 'FORMAT', choices: REPORT_FORMATS, description: 'report format; default markdown, or html for an .html FILE' },
  { name: 'workspace', short: 'w', value: 'FOLDER', description: 'load the other design files from FOLDER (as for runnel check)' },
  ...CRITERIA_OPTIONS,
  { name: 'help', short: 'h', description: 'show this help' },
];

export const REPORT_USAGE = 'runnel report [options] <file>';

export function reportHelp(): string {
  return `Usage: ${REPORT_USAGE}

Writes the report of one design: every reach at every design flow, the findings, the method, the
assumptions and the caution. Markdown on standard output by default; with --out FILE.html (or
--format html) one self-contained HTML page with drawings. Problems in the file are listed on standard
error; the exit status is 1 when the file has parse or validation errors (the report is then partial),
0 otherwise, 2 for a usage mistake.

Options:
${describeOptions(REPORT_OPTIONS)}

${CRITERIA_OPTIONS_HELP}
`;
}

export async function runReport(args: readonly string[], context: CliContext): Promise<number> {
  const parsed = parseArguments(args, REPORT_OPTIONS);
  if (parsed.options.has('help')) {
    context.stdout.write(reportHelp());
    return 0;
  }
  if (parsed.positionals.length !== 1) throw new UsageError(parsed.positionals.length === 0 ? 'no design file given' : 'give exactly one design file');
  const out = parsed.options.get('out');
  const format = parsed.options.get('format') ?? (out !== undefined && /\.html?$/i.test(out) ? 'html' : 'markdown');
  const workspace = parsed.options.get('workspace');
  const criteria = await criteriaFromOptions(parsed.options);
  for (const warning of criteria.warnings) context.stderr.write(`runnel: warning: ${warning}\n`);
  const targets = expandTargets(parsed.positionals, context.cwd);
  if (targets.length !== 1) throw new UsageError('give exactly one design file, not a folder');
  const [result] = await loadDesigns(targets, context.cwd, { criteriaDefaults: criteria.defaults, ...(workspace === undefined ? {} : { workspace }) });
  if (result === undefined) throw new UsageError(`cannot read '${parsed.positionals[0] ?? ''}'`);

  const shownPath = displayPath(result.path, context.cwd);
  const problems = result.diagnostics.filter((diagnostic) => diagnostic.source !== 'analysis');
  const styles = stylesFor(context.stderr, context.env);
  for (const problem of problems) context.stderr.write(`${formatDiagnosticLine(shownPath, problem, styles)}\n`);
  if (result.analysis === null) return 1;

  const fileName = basename(result.path);
  const text =
    format === 'html'
      ? renderReportHtml(result.analysis, { generatedAt: new Date(), fileName })
      : renderReportMarkdown(result.analysis, { fileName });
  writeOutput(text, out, context);
  return problems.some((problem) => problem.severity === 'error') ? 1 : 0;
}
