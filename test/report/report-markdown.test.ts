/**
 * The Markdown report and results table: well-formed tables (one row per reach and flow, every row with the
 * heading's number of cells) as rendered by an independent Markdown library (markdown-it), hostile names kept as
 * text, and the same numbers and words as the HTML report.
 */
import MarkdownIt from 'markdown-it';
import { describe, expect, it } from 'vitest';
import { renderReportHtml } from '../../language/report/report-html.js';
import { renderReportMarkdown, renderResultsTableMarkdown } from '../../language/report/report-markdown.js';
import { chowTrapezoidDesign, FIXTURE_CAUTION, HOSTILE_NAMES, siDesign } from './fixtures.js';
import { decodeEntities } from './svg-query.js';

const markdown = new MarkdownIt({ html: true });

function tables(rendered: string): string[][][] {
  return [...rendered.matchAll(/<table>([\s\S]*?)<\/table>/g)].map((table) =>
    [...table[1]!.matchAll(/<tr>([\s\S]*?)<\/tr>/g)].map((row) => [...row[1]!.matchAll(/<t[hd][^>]*>([\s\S]*?)<\/t[hd]>/g)].map((cell) => decodeEntities(cell[1]!))),
  );
}

describe('Markdown results table', () => {
  const analysis = siDesign();
  const table = renderResultsTableMarkdown(analysis);
  const flows = analysis.channels.flatMap((channel) => channel.reaches.flatMap((reach) => reach.flows.map((flow) => ({ reach, flow }))));

  it('is one GitHub table: heading, rule, one line per reach and flow, equal cell counts', () => {
    const lines = table.split('\n');
    expect(lines).toHaveLength(2 + flows.length);
    const cellCounts = lines.map((line) => line.replace(/\\\|/g, '').split('|').length);
    expect(new Set(cellCounts).size).toBe(1);
    expect(lines[1]).toMatch(/^\| --- \| --- \| --- \|( ---: \|){8} --- \| --- \|$/);
  });

  it('renders with markdown-it to the same rows and numbers the HTML report shows', () => {
    const [rows] = tables(markdown.render(table));
    expect(rows).toHaveLength(1 + flows.length);
    expect(rows?.[0]).toEqual([
      'Channel', 'Reach', 'Flow', 'Discharge (m3/s)', 'Normal depth (m)', 'Critical depth (m)', 'Velocity (m/s)', 'Froude number',
      'Freeboard (m)', 'Required freeboard (m)', 'Maximum bed shear (Pa)', 'Result', 'Governing finding',
    ]);
    flows.forEach(({ reach, flow }, index) => {
      const row = rows?.[index + 1] ?? [];
      expect(row[1]).toBe(reach.name);
      expect(row[2]).toBe(flow.flow);
      expect(row[4]).toBe(flow.normal === null ? '—' : String(Number(flow.normal.depth_m.toPrecision(3))));
      expect(row[11]).toBe({ pass: 'pass', information: 'pass, with note', warning: 'warning', fail: 'fail' }[flow.status]);
    });
    const html = renderReportHtml(analysis, { generatedAt: new Date(0), fileName: 'x.runnel' });
    for (const row of rows?.slice(1) ?? []) for (const cell of row.slice(3, 11)) expect(html).toContain(`>${cell}<`);
  });

  it('keeps hostile names as text in every renderer that passes HTML through', () => {
    const hostile = siDesign({ channel: HOSTILE_NAMES.channel, reach: HOSTILE_NAMES.reach, flow: HOSTILE_NAMES.flow });
    const rendered = markdown.render(renderResultsTableMarkdown(hostile));
    expect(rendered).not.toMatch(/<script|<img|<b>|<a |<code>|<em>/i);
    const [rows] = tables(rendered);
    expect(rows).toHaveLength(1 + flows.length);
    expect(rows?.[1]?.[0]).toBe(HOSTILE_NAMES.channel);
    expect(rows?.[1]?.[1]).toBe(HOSTILE_NAMES.reach);
    expect(rows?.[2]?.[2]).toBe(HOSTILE_NAMES.flow);
  });
});

describe('Markdown report', () => {
  it('carries the title, file, caution, summary, findings, every reach and the assumptions', () => {
    const analysis = siDesign();
    const text = renderReportMarkdown(analysis);
    expect(text.startsWith('# Northfield Road drainage, stage 2\n\nFile: northfield-road.runnel · Display units: SI (metres, seconds)\n')).toBe(true);
    expect(text).toContain(`> **Caution.** ${FIXTURE_CAUTION}`);
    expect(text).toContain('## Summary of results');
    expect(text).toContain('- **fail** (culvert-line › road-culvert › q100, line 45): ');
    for (const reach of analysis.channels.flatMap((channel) => channel.reaches)) expect(text).toContain(`### Reach ${reach.name}`);
    for (const assumption of analysis.assumptions) expect(text).toContain(`- ${assumption.replace(/[()]/g, '\\$&')}`);
    expect(text).not.toMatch(/NaN|Infinity|undefined/);
    const rendered = markdown.render(text);
    // Summary, and per reach its data and its results by flow.
    expect(tables(rendered)).toHaveLength(1 + 2 * 5);
    for (const table of tables(rendered)) expect(new Set(table.map((row) => row.length)).size).toBe(1);
  });

  it('adds the date only when asked, so the same design gives the same text', () => {
    expect(renderReportMarkdown(siDesign())).toBe(renderReportMarkdown(siDesign()));
    expect(renderReportMarkdown(siDesign(), { generatedAt: new Date('2025-05-06T09:30:00Z') })).toContain('Generated: 2025-05-06 09:30 UTC');
  });

  it('shows US designs in US units (Chow trapezoid: 400 cfs, normal depth 3.36 ft, Chow 1959 Example 6-2 as recalled; from memory)', () => {
    const [rows] = tables(markdown.render(renderResultsTableMarkdown(chowTrapezoidDesign())));
    expect(rows?.[0]?.[3]).toBe('Discharge (cfs)');
    expect(rows?.[0]?.[4]).toBe('Normal depth (ft)');
    expect(rows?.[1]?.[3]).toBe('400');
    expect(Math.abs(Number(rows?.[1]?.[4]) - 3.36)).toBeLessThanOrEqual(0.01);
  });
});
