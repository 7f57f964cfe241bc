/**
 * The comparison as Markdown that reads well as a pull-request comment and in the editor's preview: a verdict
 * line first, then a table of what got worse, then what got better, then the details of each design collapsed in
 * <details> blocks, then the caution. Values are shown in each design's display units.
 */
import type { CheckStatus } from '../analysis/model.js';
import type { UnitSystem } from '../units/units.js';
import type {
  CheckChange,
  ComparisonReport,
  DefinitionChange,
  DesignComparison,
  FlowComparison,
  InputChange,
  ReachComparison,
  ResultChange,
  Verdict,
} from './comparison-model.js';
import { COMPARED_FLOW_RESULTS } from './compared-quantities.js';
import { plural } from './fail-policy.js';
import { escapeHtml, escapeMarkdownInline as escapeText } from '../report/escape.js';
import { formatDifference, formatRelative, formatValue } from './format-values.js';

export interface MarkdownOptions {
  /** A line saying whether the comparison fails the CI policy, e.g. "Fails: 1 new error (--fail-on new-errors)". */
  readonly policyLine?: string;
}

/** Renders a whole comparison report (one or many designs). */
export function renderComparisonMarkdown(report: ComparisonReport, options: MarkdownOptions = {}): string {
  const blocks: string[] = [verdictLine(report), scopeLine(report)];
  if (options.policyLine !== undefined) blocks.push(escapeText(options.policyLine));
  const many = report.designs.length > 1;
  const worse = report.designs.flatMap((design) => worseRows(design, many));
  const better = report.designs.flatMap((design) => betterRows(design, many));
  if (worse.length > 0) blocks.push('#### What got worse', table(whereHeader(many), worse));
  if (better.length > 0) blocks.push('#### What got better', table(whereHeader(many), better));
  for (const design of report.designs) blocks.push(designDetails(design));
  blocks.push(`> **Caution:** ${escapeText(report.caution)}`);
  return `${blocks.join('\n\n')}\n`;
}

// ---------------------------------------------------------------------------------------------------------------
// Verdict.

const VERDICT_WORDS: Readonly<Record<Verdict, string>> = {
  worse: 'worse',
  better: 'better',
  mixed: 'mixed (some results worse, some better)',
  changed: 'changed, no result changed significantly',
  unchanged: 'no change',
};

function verdictLine(report: ComparisonReport): string {
  const { counts } = report;
  const parts: string[] = [];
  if (counts.newErrors > 0) parts.push(`**${plural(counts.newErrors, 'new error')}**`);
  if (counts.newlyFailing > 0) parts.push(`${plural(counts.newlyFailing, 'check')} newly failing`);
  if (counts.resultsWorse > 0) parts.push(`${plural(counts.resultsWorse, 'result')} worse`);
  if (counts.newlyPassing > 0) parts.push(`${plural(counts.newlyPassing, 'check')} newly passing`);
  if (counts.resultsBetter > 0) parts.push(`${plural(counts.resultsBetter, 'result')} better`);
  if (counts.stillFailing > 0) parts.push(`${plural(counts.stillFailing, 'check')} still failing`);
  const detail = parts.length > 0 ? `: ${parts.join(' · ')}` : '';
  return `**Runnel design review: ${VERDICT_WORDS[report.verdict]}**${detail}`;
}

function scopeLine(report: ComparisonReport): string {
  const changed = report.designs.length;
  const reaches = `${plural(report.counts.reachesChanged, 'reach', 'reaches')} changed, ${report.counts.reachesUnchanged} unchanged`;
  return (
    `Compared ${code(report.beforeLabel)} → ${code(report.afterLabel)}: ` +
    `${plural(changed, 'design')} changed, ${report.unchangedDesignCount} unchanged; ${reaches}.`
  );
}

// ---------------------------------------------------------------------------------------------------------------
// Worse and better tables.

type Row = readonly string[];

function whereHeader(many: boolean): Row {
  return [...(many ? ['Design'] : []), 'Where', 'Flow', 'What', 'Before', 'After', 'Change'];
}

function reachWhere(reach: ReachComparison): string {
  const here = `${reach.channel} › ${reach.reach}`;
  if (reach.previous === null) return here;
  return `${here} (was ${reach.previous.channel} › ${reach.previous.reach})`;
}

function resultRow(design: DesignComparison, where: string, flow: string, change: ResultChange, many: boolean): Row {
  const units = design.displayUnits;
  const difference = change.difference === null ? 'appears or disappears' : formatDifference(change.difference, change.kind, units);
  // A percentage only means something for a value that keeps its sign (freeboard can go negative).
  const keepsSign = change.before !== null && change.after !== null && change.before > 0 && change.after >= 0;
  const relative = change.relativeDifference === null || !keepsSign ? '' : ` (${formatRelative(change.relativeDifference)})`;
  return [
    ...(many ? [design.path] : []),
    where,
    flow,
    change.label,
    formatValue(change.before, change.kind, units),
    formatValue(change.after, change.kind, units),
    `${difference}${relative}`,
  ];
}

const SEVERITY_OR_PASS = (severity: string | null, reachExisted: boolean): string => severity ?? (reachExisted ? 'passes' : 'new');

function checkRow(design: DesignComparison, where: string, check: CheckChange, what: string, reachExisted: boolean, many: boolean): Row {
  return [
    ...(many ? [design.path] : []),
    where,
    check.flow ?? '',
    `${what}: ${code(check.code)}`,
    SEVERITY_OR_PASS(check.severityBefore, reachExisted),
    check.severityAfter ?? 'passes',
    check.severityAfter === null ? `was: ${check.message}` : check.message,
  ];
}

function resultRowsOf(design: DesignComparison, direction: 'worse' | 'better', many: boolean): Row[] {
  return design.reaches.flatMap((reach) => {
    const where = reachWhere(reach);
    const capacity = reach.capacityChange?.direction === direction ? [resultRow(design, where, '', reach.capacityChange, many)] : [];
    const flows = reach.flows.flatMap((flow) =>
      flow.resultChanges.filter((change) => change.direction === direction).map((change) => resultRow(design, where, flow.flow, change, many)),
    );
    return [...capacity, ...flows];
  });
}

function worseRows(design: DesignComparison, many: boolean): Row[] {
  const checks = design.reaches.flatMap((reach) =>
    reach.checkChanges
      .filter((check) => check.change === 'newly-failing' || (check.change === 'still-failing' && raised(check)))
      .map((check) =>
        checkRow(design, reachWhere(reach), check, check.change === 'newly-failing' ? 'newly failing' : 'more severe', reach.change !== 'added', many),
      ),
  );
  const designChecks = design.designCheckChanges
    .filter((check) => check.change === 'newly-failing')
    .map((check) => checkRow(design, 'design', check, 'newly failing', true, many));
  const problems = design.newProblems
    .filter((problem) => problem.severity !== 'information')
    .map((problem): Row => [
      ...(many ? [design.path] : []),
      `line ${problem.line}`,
      '',
      `new ${problem.severity}: ${code(problem.code)}`,
      '',
      problem.severity,
      problem.message,
    ]);
  return [...problems, ...checks, ...designChecks, ...resultRowsOf(design, 'worse', many)];
}

function betterRows(design: DesignComparison, many: boolean): Row[] {
  const checks = design.reaches.flatMap((reach) =>
    reach.checkChanges
      .filter((check) => check.change === 'newly-passing' || (check.change === 'still-failing' && lowered(check)))
      .map((check) => checkRow(design, reachWhere(reach), check, check.change === 'newly-passing' ? 'newly passing' : 'less severe', true, many)),
  );
  const designChecks = design.designCheckChanges
    .filter((check) => check.change === 'newly-passing')
    .map((check) => checkRow(design, 'design', check, 'newly passing', true, many));
  return [...checks, ...designChecks, ...resultRowsOf(design, 'better', many)];
}

const SEVERITY_ORDER = ['information', 'warning', 'error'];
function raised(check: CheckChange): boolean {
  return SEVERITY_ORDER.indexOf(check.severityAfter ?? '') > SEVERITY_ORDER.indexOf(check.severityBefore ?? '');
}
function lowered(check: CheckChange): boolean {
  return SEVERITY_ORDER.indexOf(check.severityAfter ?? '') < SEVERITY_ORDER.indexOf(check.severityBefore ?? '');
}

// ---------------------------------------------------------------------------------------------------------------
// Details of one design, collapsed.

const FILE_CHANGE_WORDS: Readonly<Record<DesignComparison['fileChange'], string>> = {
  added: 'new file',
  removed: 'file removed',
  modified: 'modified',
  renamed: 'renamed',
  unchanged: 'unchanged',
};

const STATUS_WORDS: Readonly<Record<CheckStatus, string>> = { pass: 'passes', information: 'notes only', warning: 'warnings', fail: 'fails' };

function statusWords(status: CheckStatus | null): string {
  return status === null ? 'none' : STATUS_WORDS[status];
}

function designDetails(design: DesignComparison): string {
  const what = [FILE_CHANGE_WORDS[design.fileChange]];
  if (design.previousPath !== null) what.push(`from ${design.previousPath}`);
  const reachCount = `${plural(design.counts.reachesChanged, 'reach', 'reaches')} changed, ${design.counts.reachesUnchanged} unchanged`;
  const summary = `<summary><b>${escapeHtml(design.path)}</b> (${escapeHtml(design.title)}): ${escapeHtml(what.join(' '))}; ${reachCount}</summary>`;
  const parts: string[] = [];
  if (design.incomplete) {
    parts.push('Not every version of this design could be analysed (see the problems below), so its reaches are not compared.');
  }
  if (design.newProblems.length > 0) parts.push(`New problems:\n\n${design.newProblems.map((p) => `- line ${p.line}: ${p.severity} ${code(p.code)}: ${escapeText(p.message)}`).join('\n')}`);
  if (design.resolvedProblems.length > 0) {
    parts.push(`Problems resolved:\n\n${design.resolvedProblems.map((p) => `- ${p.severity} ${code(p.code)}: ${escapeText(p.message)}`).join('\n')}`);
  }
  if (design.definitions.length > 0) {
    parts.push(`Definitions:\n\n${design.definitions.map((change) => `- ${definitionLine(change, design.displayUnits)}`).join('\n')}`);
  }
  for (const reach of design.reaches) parts.push(reachDetails(reach, design.displayUnits));
  if (design.designCheckChanges.length > 0) {
    parts.push(`Design-wide checks:\n\n${design.designCheckChanges.map((check) => `- ${checkLine(check)}`).join('\n')}`);
  }
  if (design.counts.reachesUnchanged > 0) {
    parts.push(`${plural(design.counts.reachesUnchanged, 'other reach', 'other reaches')} unchanged.`);
  }
  return ['<details>', summary, '', ...parts.flatMap((part) => [part, '']), '</details>'].join('\n');
}

const DEFINITION_WORDS: Readonly<Record<DefinitionChange['kind'], string>> = {
  section: 'section',
  lining: 'lining',
  flow: 'flow',
  criteria: 'criteria',
};

function definitionLine(change: DefinitionChange, units: UnitSystem): string {
  const name = change.kind === 'criteria' ? 'design criteria' : `${DEFINITION_WORDS[change.kind]} ${code(change.name)}`;
  switch (change.change) {
    case 'added':
      return `${name} added`;
    case 'removed':
      return `${name} removed`;
    case 'renamed':
      return `${name} renamed from ${code(change.previousName ?? '')} (unchanged)`;
    case 'modified':
      return `${name}: ${change.inputChanges.map((input) => inputText(input, units)).join('; ')}`;
  }
}

function inputText(change: InputChange, units: UnitSystem): string {
  return `${escapeText(change.label)} ${escapeText(formatValue(change.before, change.kind, units))} → ${escapeText(formatValue(change.after, change.kind, units))}`;
}

const REACH_CHANGE_WORDS: Readonly<Record<ReachComparison['change'], string>> = {
  added: 'new reach',
  removed: 'reach removed',
  modified: 'changed',
  renamed: 'renamed, otherwise unchanged',
  'not-analysed': 'can no longer be analysed',
};

function reachDetails(reach: ReachComparison, units: UnitSystem): string {
  const status =
    reach.statusBefore === reach.statusAfter ? statusWords(reach.statusAfter) : `${statusWords(reach.statusBefore)} → ${statusWords(reach.statusAfter)}`;
  const line = `${reach.change === 'removed' || reach.change === 'not-analysed' ? 'old line' : 'line'} ${reach.location.range.start.line + 1}`;
  const lines = [`**${escapeText(reachWhere(reach))}**: ${REACH_CHANGE_WORDS[reach.change]} (${line}; checks: ${status})`];
  const bullets: string[] = [];
  if (reach.note !== null) bullets.push(escapeText(reach.note));
  for (const input of reach.inputChanges) bullets.push(`input: ${inputText(input, units)}`);
  if (reach.capacityChange !== null) bullets.push(resultText(reach.capacityChange, units));
  for (const flow of reach.flows) bullets.push(...flowBullets(flow, units));
  for (const check of reach.checkChanges) bullets.push(checkLine(check));
  if (reach.unchangedFlowCount > 0) bullets.push(`${plural(reach.unchangedFlowCount, 'other flow')} unchanged`);
  if (bullets.length > 0) lines.push('', ...bullets.map((bullet) => `- ${bullet}`));
  if (reach.results.length > 0) lines.push('', resultsTable(reach, units));
  return lines.join('\n');
}

function flowBullets(flow: FlowComparison, units: UnitSystem): string[] {
  const name = code(flow.flow);
  if (flow.change === 'added') return [`flow ${name} added: ${formatValue(flow.dischargeAfter_m3s, 'discharge', units)} (${statusWords(flow.statusAfter)})`];
  if (flow.change === 'removed') return [`flow ${name} removed (was ${formatValue(flow.dischargeBefore_m3s, 'discharge', units)})`];
  const bullets: string[] = [];
  if (flow.previousFlow !== null) bullets.push(`flow ${name} was ${code(flow.previousFlow)}`);
  if (flow.dischargeBefore_m3s !== flow.dischargeAfter_m3s) {
    bullets.push(
      `flow ${name}: discharge ${formatValue(flow.dischargeBefore_m3s, 'discharge', units)} → ${formatValue(flow.dischargeAfter_m3s, 'discharge', units)}`,
    );
  }
  // Result changes are in the table below the bullets (before -> after) and in the worse/better tables.
  return bullets;
}

function resultText(change: ResultChange, units: UnitSystem): string {
  const values = `${formatValue(change.before, change.kind, units)} → ${formatValue(change.after, change.kind, units)}`;
  const difference = change.difference === null ? '' : ` (${formatDifference(change.difference, change.kind, units)})`;
  const direction = change.direction === 'neutral' ? '' : `, ${change.direction}`;
  return `${escapeText(change.label)} ${values}${difference}${direction}`;
}

const CHECK_WORDS: Readonly<Record<CheckChange['change'], string>> = {
  'newly-failing': 'newly failing',
  'newly-passing': 'newly passing',
  'still-failing': 'still failing',
  'new-notice': 'new note',
  'cleared-notice': 'note cleared',
};

function checkLine(check: CheckChange): string {
  const { severityBefore: before, severityAfter: after } = check;
  const severity =
    after === null ? `was ${before ?? ''}` : before !== null && before !== after ? `${before} → ${after}` : after;
  const flow = check.flow === null ? '' : ` at ${code(check.flow)}`;
  return `${CHECK_WORDS[check.change]} (${severity}): ${code(check.code)}${flow}: ${escapeText(check.message)}`;
}

/** Before -> after of every flow's main results, one row per flow. */
function resultsTable(reach: ReachComparison, units: UnitSystem): string {
  const header = ['Flow', ...COMPARED_FLOW_RESULTS.map((quantity) => quantity.label)];
  const rows = reach.results.map((snapshot): Row => [
    snapshot.flow,
    ...COMPARED_FLOW_RESULTS.map((quantity) => {
      const before = snapshot.before === null ? undefined : (snapshot.before[quantity.key] ?? null);
      const after = snapshot.after === null ? undefined : (snapshot.after[quantity.key] ?? null);
      if (before === undefined) return after === undefined ? '' : formatValue(after, quantity.kind, units);
      if (after === undefined) return `${formatValue(before, quantity.kind, units)} → (removed)`;
      const beforeText = formatValue(before, quantity.kind, units);
      const afterText = formatValue(after, quantity.kind, units);
      return beforeText === afterText ? afterText : `${beforeText} → ${afterText}`;
    }),
  ]);
  return table(header, rows);
}

// ---------------------------------------------------------------------------------------------------------------
// Markdown helpers.

function table(header: Row, rows: readonly Row[]): string {
  const line = (cells: Row): string => `| ${cells.map(escapeCell).join(' | ')} |`;
  return [line(header), `|${header.map(() => '---').join('|')}|`, ...rows.map(line)].join('\n');
}

/** Text in a table cell: Markdown-escaped and on one line; code spans made by `code()` are kept as they are. */
function escapeCell(text: string): string {
  return text
    .split(/(`[^`]*`)/)
    .map((part, index) => (index % 2 === 1 ? part.replace(/\|/g, '\\|') : escapeText(part)))
    .join('');
}

/** A code span that survives any backtick inside the text. */
function code(text: string): string {
  const fence = text.includes('`') ? '``' : '`';
  const pad = text.startsWith('`') || text.endsWith('`') ? ' ' : '';
  return `${fence}${pad}${text}${pad}${fence}`;
}
