/**
 * The report as Markdown: the same tables and words as the HTML report (results-table.ts), for `runnel report`
 * on a terminal or in a pull request and for the editor's "copy results table". Every name and message is
 * escaped so it cannot break a table row or inject markup into a renderer that passes HTML through.
 */
import type { DesignAnalysis } from '../analysis/model.js';
import { escapeMarkdownInline } from './escape.js';
import { formatTimestampUtc } from './format.js';
import {
  buildProfileSummary,
  buildReachFacts,
  buildReachFlowTable,
  buildSummaryTable,
  criteriaFromSettingsText,
  findingLineText,
  findingPlaceText,
  lineText,
  tallyText,
  type TextTable,
} from './results-table.js';
import { REPORT_WORDS, SEVERITY_WORDS } from './report-wording.js';

export interface ReportMarkdownOptions {
  /** Adds a "Generated" line; left out by default so the same design gives the same text. */
  readonly generatedAt?: Date;
  /** The design file's name; defaults to the last part of the analysis URI. */
  readonly fileName?: string;
}

/** The summary of results alone, as one Markdown table. */
export function renderResultsTableMarkdown(analysis: DesignAnalysis): string {
  const summary = buildSummaryTable(analysis);
  return markdownTable({ headings: summary.headings, numeric: summary.numeric, rows: summary.rows.map((row) => row.cells) });
}

/** The whole report as Markdown; see the module comment. */
export function renderReportMarkdown(analysis: DesignAnalysis, options: ReportMarkdownOptions = {}): string {
  const system = analysis.displayUnits;
  const fileName = options.fileName ?? fileNameFromUri(analysis.uri);
  const lines: string[] = [];
  lines.push(`# ${escapeMarkdownInline(analysis.title || fileName)}`, '');
  const meta = [`${REPORT_WORDS.fileLabel}: ${escapeMarkdownInline(fileName)}`];
  if (options.generatedAt !== undefined) meta.push(`${REPORT_WORDS.generatedLabel}: ${formatTimestampUtc(options.generatedAt)}`);
  meta.push(`${REPORT_WORDS.unitsLabel}: ${REPORT_WORDS.unitSystemNames[system] ?? system}`);
  lines.push(meta.join(' · '), '');
  lines.push(`> **${REPORT_WORDS.cautionLead}** ${escapeMarkdownInline(analysis.caution)}`, '');
  const fromSettings = criteriaFromSettingsText(analysis);
  if (fromSettings !== null) lines.push(`> **${REPORT_WORDS.criteriaFromSettingsLead}** ${escapeMarkdownInline(fromSettings)}`, '');
  if (analysis.notes.length > 0) {
    lines.push(`**${REPORT_WORDS.notesHeading}**`, '', ...analysis.notes.map((note) => `- ${escapeMarkdownInline(note)}`), '');
  }

  lines.push(`## ${REPORT_WORDS.summaryHeading}`, '', tallyText(analysis), '', renderResultsTableMarkdown(analysis), '');

  lines.push(`## ${REPORT_WORDS.findingsHeading}`, '');
  if (analysis.findings.length === 0) lines.push(REPORT_WORDS.noFindings);
  for (const finding of analysis.findings) {
    const place = [findingPlaceText(finding), findingLineText(finding)].filter((part) => part !== '').join(', ');
    lines.push(`- **${SEVERITY_WORDS[finding.severity] ?? finding.severity}**${place ? ` (${escapeMarkdownInline(place)})` : ''}: ${escapeMarkdownInline(finding.message)}`);
    for (const related of finding.related ?? []) lines.push(`  - ${escapeMarkdownInline(related.message)}`);
  }
  lines.push('');

  if (analysis.kind === 'library') lines.push(REPORT_WORDS.libraryNote, '');
  else if (analysis.channels.length === 0) lines.push(REPORT_WORDS.noChannels, '');
  const incomplete = analysis.incompleteReaches ?? [];
  if (incomplete.length > 0) {
    lines.push(`## ${REPORT_WORDS.incompleteHeading}`, '');
    for (const item of incomplete) {
      const line = lineText(item.location);
      lines.push(`- **${REPORT_WORDS.notAnalysedWord}** (${escapeMarkdownInline([`${item.channel} › ${item.reach}`, line].filter((part) => part !== '').join(', '))}): ${escapeMarkdownInline(item.reason)}`);
    }
    lines.push('');
  }

  for (const channel of analysis.channels) {
    lines.push(`## ${REPORT_WORDS.channelHeading} ${escapeMarkdownInline(channel.name)}`, '');
    if (channel.description) lines.push(escapeMarkdownInline(channel.description), '');
    const profileSummary = buildProfileSummary(channel, system);
    if (profileSummary !== null) {
      lines.push(`### ${REPORT_WORDS.profileHeading}`, '', REPORT_WORDS.profileIntro, '', markdownTable(profileSummary), '');
      if (profileSummary.notes.length > 0) lines.push(...profileSummary.notes.map((note) => `- ${escapeMarkdownInline(note)}`), '');
    }
    for (const reach of channel.reaches) {
      lines.push(`### ${REPORT_WORDS.reachHeading} ${escapeMarkdownInline(reach.name)}`, '');
      lines.push(markdownTable(buildReachFacts(reach, system)), '');
      const flowTable = buildReachFlowTable(reach, system);
      lines.push(markdownTable(flowTable), '');
      if (flowTable.notes.length > 0) lines.push(...flowTable.notes.map((note) => `- ${escapeMarkdownInline(`${note.flow}: ${note.note}`)}`), '');
    }
  }
  lines.push(`_${REPORT_WORDS.markdownDrawingsNote}_`, '');

  lines.push(`## ${REPORT_WORDS.basisHeading}`, '');
  lines.push(`**${REPORT_WORDS.methodLabel}:** ${escapeMarkdownInline(analysis.provenance.method)}`, '');
  const assumptions = [...analysis.assumptions, ...analysis.provenance.assumptions.filter((item) => !analysis.assumptions.includes(item))];
  lines.push(`**${REPORT_WORDS.assumptionsLabel}:**`, '', ...assumptions.map((item) => `- ${escapeMarkdownInline(item)}`), '');
  if (analysis.provenance.references.length > 0) {
    lines.push(`**${REPORT_WORDS.referencesLabel}:**`, '', ...analysis.provenance.references.map((item) => `- ${escapeMarkdownInline(item)}`), '');
  }
  return `${lines.join('\n').replace(/\n{3,}/g, '\n\n').trimEnd()}\n`;
}

/** A GitHub-flavoured Markdown table; numeric columns are right-aligned. */
export function markdownTable(table: TextTable): string {
  const columnCount = table.headings.length;
  const row = (cells: readonly string[]): string =>
    `| ${Array.from({ length: columnCount }, (_, index) => escapeMarkdownInline(cells[index] ?? '') || ' ').join(' | ')} |`;
  const rule = `| ${table.headings.map((_, index) => (table.numeric[index] ? '---:' : '---')).join(' | ')} |`;
  return [row(table.headings), rule, ...table.rows.map(row)].join('\n');
}

function fileNameFromUri(uri: string): string {
  const last = uri.split(/[\\/]/).pop() ?? uri;
  try {
    return decodeURIComponent(last);
  } catch {
    return last;
  }
}
