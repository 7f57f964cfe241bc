/**
 * `runnel diff OLD NEW` and `runnel diff --base REV [PATHS...]`: what a change did to the designs, as Markdown for
 * a pull-request comment or as JSON, with an exit status chosen by `--fail-on`.
 */
import { resolve } from 'node:path';
import {
  compareDesignVersions,
  DEFAULT_FAIL_POLICY,
  DEFAULT_SIGNIFICANCE_THRESHOLDS,
  FAIL_POLICIES,
  FAIL_POLICY_DESCRIPTIONS,
  failureReason,
  renderComparisonJson,
  renderComparisonMarkdown,
  type DesignPair,
  type DesignVersion,
  type FailPolicy,
  type SignificanceThresholds,
} from '../../../language/diff/index.js';
import { formatPercent, formatQuantity } from '../../../language/analysis/format-quantity.js';
import { GitError } from '../../git/run-git.js';
import { findRepositoryRoot, resolveCommit, shortCommitId } from '../../git/repository.js';
import { revisionComparisonFiles } from '../../git/revision-workspace.js';
import { analyseWorkspace, designProblemsOf, type AnalysedFile } from '../analyse-workspace.js';
import { describeOptions, parseArguments, UsageError, type OptionSpec } from '../arguments.js';
import { CRITERIA_OPTIONS, CRITERIA_OPTIONS_HELP, criteriaFromOptions, criteriaOptionsLine } from '../criteria-options.js';
import type { CriteriaDefaults } from '../../../language/analysis/criteria-settings.js';
import { loadDesigns } from '../load-designs.js';
import { writeOutput } from '../output-file.js';
import { parseNumberOption, parsePercentOption, parseQuantityOption } from '../quantity-option.js';
import type { CliContext } from '../terminal.js';
import { displayPath, expandTargets, isInside } from '../workspace-files.js';

export const DIFF_FORMATS = ['markdown', 'json'] as const;

export const DIFF_OPTIONS: readonly OptionSpec[] = [
  { name: 'base', short: 'b', value: 'REV', description: 'compare the working tree with git revision REV (a branch, tag or commit)' },
  { name: 'format', short: 'f', value: 'FORMAT', choices: DIFF_FORMATS, description: 'output format; default markdown' },
  { name: 'out', short: 'o', value: 'FILE', description: 'write the comparison to FILE instead of standard output' },
  { name: 'fail-on', value: 'POLICY', choices: FAIL_POLICIES, description: `when to exit with status 1; default ${DEFAULT_FAIL_POLICY}` },
  { name: 'min-change', value: 'PERCENT', description: 'smallest relative change of a result that counts' },
  { name: 'min-depth-change', value: 'LENGTH', description: 'smallest change of a depth or freeboard that counts, e.g. 0.01ft' },
  { name: 'min-velocity-change', value: 'VELOCITY', description: 'smallest change of a velocity that counts, e.g. 0.05ft/s' },
  { name: 'min-froude-change', value: 'NUMBER', description: 'smallest change of a Froude number that counts' },
  { name: 'min-shear-change', value: 'SHEAR', description: 'smallest change of a shear stress that counts, e.g. 0.01psf' },
  { name: 'min-capacity-change', value: 'DISCHARGE', description: 'smallest change of a capacity that counts, e.g. 0.1cfs' },
  { name: 'workspace', short: 'w', value: 'FOLDER', description: 'for OLD NEW: load the other design files from FOLDER' },
  ...CRITERIA_OPTIONS,
  { name: 'help', short: 'h', description: 'show this help' },
];

export const DIFF_USAGE = 'runnel diff [options] OLD NEW\n       runnel diff --base REV [options] [PATHS...]';

export function diffHelp(): string {
  const t = DEFAULT_SIGNIFICANCE_THRESHOLDS;
  const policies = FAIL_POLICIES.map((policy) => `  ${policy.padEnd(11)} ${FAIL_POLICY_DESCRIPTIONS[policy]}`).join('\n');
  return `Usage: ${DIFF_USAGE}

Shows what a change did to the designs: for every reach and flow matched by name, the inputs that changed,
the results that changed (before -> after and the difference) and the checks newly failing, newly passing
or still failing. Renamed reaches, sections, linings and flows are recognised when their definition moved
unchanged. Unchanged items are counted, not listed.

With OLD NEW, two design files are compared, each with the other design files of its own workspace. With
--base REV, every design file of the repository at REV is compared with the working tree (added, removed
and renamed files included; a library change shows in every design that uses it); PATHS limit the
comparison to those files or folders.

Options:
${describeOptions(DIFF_OPTIONS)}

Exit status (--fail-on):
${policies}
  A usage mistake or a git problem exits with status 2.

A result counts as changed when its difference reaches both the relative threshold (default
${formatPercent(t.relative)}) and the absolute one of its kind (defaults ${formatQuantity(t.length_m, 'length', 'SI')} ~ ${formatQuantity(t.length_m, 'length', 'US')}, ${formatQuantity(t.velocity_mps, 'velocity', 'SI')},
Froude ${t.froudeNumber}, ${formatQuantity(t.shear_Pa, 'shear', 'SI')}, ${formatQuantity(t.discharge_m3s, 'discharge', 'SI')}).

${CRITERIA_OPTIONS_HELP} Both versions are judged with the same options.
`;
}

function thresholdsFrom(options: ReadonlyMap<string, string>): SignificanceThresholds {
  const base = DEFAULT_SIGNIFICANCE_THRESHOLDS;
  const read = (name: string, parse: (written: string) => number, fallback: number): number => {
    const written = options.get(name);
    return written === undefined ? fallback : parse(written);
  };
  return {
    relative: read('min-change', (w) => parsePercentOption('min-change', w), base.relative),
    length_m: read('min-depth-change', (w) => parseQuantityOption('min-depth-change', w, 'length'), base.length_m),
    velocity_mps: read('min-velocity-change', (w) => parseQuantityOption('min-velocity-change', w, 'velocity'), base.velocity_mps),
    froudeNumber: read('min-froude-change', (w) => parseNumberOption('min-froude-change', w), base.froudeNumber),
    shear_Pa: read('min-shear-change', (w) => parseQuantityOption('min-shear-change', w, 'shear'), base.shear_Pa),
    discharge_m3s: read('min-capacity-change', (w) => parseQuantityOption('min-capacity-change', w, 'discharge'), base.discharge_m3s),
  };
}

function versionOf(file: AnalysedFile | undefined): DesignVersion | null {
  return file === undefined ? null : { analysis: file.analysis, problems: designProblemsOf(file) };
}

export async function runDiff(args: readonly string[], context: CliContext): Promise<number> {
  const parsed = parseArguments(args, DIFF_OPTIONS);
  if (parsed.options.has('help')) {
    context.stdout.write(diffHelp());
    return 0;
  }
  const format = (parsed.options.get('format') ?? 'markdown') as (typeof DIFF_FORMATS)[number];
  const failOn = (parsed.options.get('fail-on') ?? DEFAULT_FAIL_POLICY) as FailPolicy;
  const thresholds = thresholdsFrom(parsed.options);
  const base = parsed.options.get('base');

  if (parsed.options.has('workspace') && base !== undefined) throw new UsageError('--workspace applies to OLD NEW only; --base uses the repository');
  const criteria = await criteriaFromOptions(parsed.options);
  for (const warning of criteria.warnings) context.stderr.write(`runnel: warning: ${warning}\n`);
  const comparison =
    base === undefined
      ? await compareTwoFiles(parsed.positionals, parsed.options.get('workspace'), criteria.defaults, context)
      : await compareWithRevision(base, parsed.positionals, criteria.defaults, context);

  const report = compareDesignVersions(comparison.pairs, { beforeLabel: comparison.beforeLabel, afterLabel: comparison.afterLabel, thresholds });
  const reason = failureReason(report, failOn);
  const text =
    format === 'json'
      ? renderComparisonJson(report, failOn)
      : renderComparisonMarkdown(report, {
          policyLine: [reason === null ? `CI policy --fail-on ${failOn}: passes.` : `CI policy: fails, ${reason}.`, criteriaOptionsLine(criteria)].filter((line) => line !== null).join(' '),
        });
  writeOutput(text, parsed.options.get('out'), context);
  return reason === null ? 0 : 1;
}

interface Comparison {
  readonly pairs: readonly DesignPair[];
  readonly beforeLabel: string;
  readonly afterLabel: string;
}

async function compareTwoFiles(positionals: readonly string[], workspace: string | undefined, criteriaDefaults: CriteriaDefaults, context: CliContext): Promise<Comparison> {
  if (positionals.length !== 2) {
    throw new UsageError(positionals.length < 2 ? 'give two design files (OLD NEW), or --base REV' : 'give exactly two design files (OLD NEW), or --base REV with PATHS');
  }
  const [oldTargets, newTargets] = positionals.map((path) => expandTargets([path], context.cwd));
  const oldPath = oldTargets?.length === 1 ? oldTargets[0] : undefined;
  const newPath = newTargets?.length === 1 ? newTargets[0] : undefined;
  if (oldPath === undefined || newPath === undefined) throw new UsageError('OLD and NEW must be design files, not folders');
  const options = { criteriaDefaults, ...(workspace === undefined ? {} : { workspace }) };
  // Each version is loaded without the other: both define the same names.
  const [before] = await loadDesigns([oldPath], context.cwd, { ...options, exclude: [newPath] });
  const [after] = await loadDesigns([newPath], context.cwd, { ...options, exclude: [oldPath] });
  const oldShown = displayPath(oldPath, context.cwd);
  const newShown = displayPath(newPath, context.cwd);
  return {
    pairs: [{ path: newShown, previousPath: null, before: versionOf(before), after: versionOf(after) }],
    beforeLabel: oldShown,
    afterLabel: newShown,
  };
}

async function compareWithRevision(revision: string, positionals: readonly string[], criteriaDefaults: CriteriaDefaults, context: CliContext): Promise<Comparison> {
  const root = await gitOrUsage(() => findRepositoryRoot(context.cwd));
  if (root === null) throw new UsageError('--base needs a git repository, and the current folder is not in one');
  const commit = await gitOrUsage(() => resolveCommit(root, revision));
  const files = await gitOrUsage(() => revisionComparisonFiles(root, commit));
  const limits = positionals.map((path) => resolve(context.cwd, path));
  const inScope = (path: string | null): boolean => path !== null && (limits.length === 0 || limits.some((limit) => isInside(limit, path)));
  const pairs = files.pairs.filter((pair) => inScope(pair.workingPath) || inScope(pair.basePath));
  if (limits.length > 0 && pairs.length === 0) {
    throw new UsageError(`no design files under ${positionals.map((path) => `'${path}'`).join(', ')} in the working tree or at ${revision}`);
  }
  const baseResults = await analyseWorkspace(files.baseFiles, pairs.flatMap((pair) => (pair.basePath === null ? [] : [pair.basePath])), criteriaDefaults);
  const workingResults = await analyseWorkspace(files.workingFiles, pairs.flatMap((pair) => (pair.workingPath === null ? [] : [pair.workingPath])), criteriaDefaults);
  const shown = (repositoryPath: string): string => displayPath(resolve(root, ...repositoryPath.split('/')), context.cwd);
  const designPairs: DesignPair[] = pairs
    .map((pair) => ({
      path: shown(pair.path),
      previousPath: pair.previousPath === null ? null : shown(pair.previousPath),
      before: pair.basePath === null ? null : versionOf(baseResults.get(pair.basePath)),
      after: pair.workingPath === null ? null : versionOf(workingResults.get(pair.workingPath)),
    }))
    .filter((pair) => !isUnchangedLibrary(pair));
  const shortId = await gitOrUsage(() => shortCommitId(root, commit));
  return { pairs: designPairs, beforeLabel: shortId === revision ? revision : `${revision} (${shortId})`, afterLabel: 'working tree' };
}

/**
 * A library file (shared linings and sections) has no reaches of its own: its changes show in the designs that
 * use it. It is listed only when its own problems changed.
 */
function isUnchangedLibrary(pair: DesignPair): boolean {
  const versions = [pair.before, pair.after].filter((version): version is DesignVersion => version !== null);
  if (!versions.every((version) => version.analysis?.kind === 'library')) return false;
  const problems = (version: DesignVersion | null): string =>
    JSON.stringify((version?.problems ?? []).map((problem) => [problem.severity, problem.code, problem.message]));
  return problems(pair.before) === problems(pair.after);
}

/** Git problems (not a repository, unknown revision, git missing) are the user's to fix: status 2, no trace. */
async function gitOrUsage<T>(action: () => Promise<T>): Promise<T> {
  try {
    return await action();
  } catch (error) {
    if (error instanceof GitError) throw new UsageError(error.message);
    throw error;
  }
}
