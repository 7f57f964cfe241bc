/**
 * The report's water-surface profile summary: one row per flow and reach of each channel's computed profile,
 * saying the deepest water and where, and under it the jumps and the profiles left incomplete. The numbers are
 * the model's (the analysis computes them; test/analysis/channel-profiles.test.ts checks them against closed-form
 * bounds): here only that the report shows them, in display units, and the same in HTML and Markdown.
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import { renderReportHtml, renderReportMarkdown } from '../../language/report/index.js';
import { buildProfileSummary } from '../../language/report/results-table.js';
import { buildText } from '../language/language-test-kit.js';
import { byRole, parseMarkup } from './svg-query.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';

const FOOT_M = 0.3048;

const DESIGN = `design "Chute and culvert"
units US
flows { q10 = 60 cfs  q100 = 110 cfs }
section flume rectangle { bottom width 6 ft  bank height 6 ft }
section pipe circle { diameter 24 in }
lining concrete { n 0.014 }
channel spillway {
  reach chute { section flume  lining concrete  inverts 300 ft to 292 ft  length 160 ft }
  reach basin { section flume  lining concrete  slope 0.1 %  length 600 ft }
  outlet normal depth
}
channel crossing {
  reach barrel { section pipe  lining concrete  inverts 100 ft to 99.5 ft  length 100 ft }
  outlet water level 103 ft
}`;

describe('the profile summary of a channel', async () => {
  const analysis = analyzeDocument(await buildText(DESIGN), NO_CRITERIA_DEFAULTS);
  const spillway = analysis.channels.find((channel) => channel.name === 'spillway')!;
  const summary = buildProfileSummary(spillway, 'US')!;

  it('has a row per flow and reach, in feet, with the deepest water of the model', () => {
    expect(summary.rows).toHaveLength(4);
    expect(summary.headings).toContain('Deepest water (ft)');
    const basinRow = summary.rows.find((row) => row[0] === 'q100' && row[1] === 'basin')!;
    const deepestM = spillway.reaches[1]!.flows.find((flow) => flow.flow === 'q100')!.profile!.maximumDepth_m;
    expect(Number(basinRow[3])).toBeCloseTo(deepestM / FOOT_M, 1);
    expect(basinRow[8]).toBe('none');
  });

  it('says where each jump forms under the table', () => {
    expect(summary.notes.some((note) => /^q10: hydraulic jump in reach basin at station [\d,.]+ ft, from [\d.]+ ft \(Froude number [\d.]+\) to [\d.]+ ft; \w+ jump/.test(note))).toBe(true);
  });

  it('says when a profile covers only the reaches below a conduit filled by the outlet water', () => {
    const crossing = analysis.channels.find((channel) => channel.name === 'crossing')!;
    const notes = buildProfileSummary(crossing, 'US')!.notes;
    expect(notes.some((note) => note.includes('no water-surface profile'))).toBe(true);
  });

  it('is in the HTML report as a table with the same rows, and in the Markdown report', () => {
    const html = renderReportHtml(analysis, { generatedAt: new Date(0), fileName: 'design.runnel' });
    const table = byRole(parseMarkup(html).elements, 'profile-table');
    expect(table).toHaveLength(2);
    expect(html).toContain('Water-surface profile');
    const markdown = renderReportMarkdown(analysis);
    expect(markdown).toContain('### Water-surface profile');
    expect(markdown).toMatch(/q10: hydraulic jump in reach basin at station/);
  });
});
