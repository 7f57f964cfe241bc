/**
 * The comparison as a pull-request comment (Markdown, rendered here by markdown-it, a general-purpose Markdown
 * library) and as JSON.
 */
import MarkdownIt from 'markdown-it';
import { describe, expect, it } from 'vitest';
import { compareDesignVersions, type DesignPair } from '../../language/diff/compare-designs.js';
import { COMPARISON_SCHEMA_VERSION } from '../../language/diff/comparison-model.js';
import { renderComparisonJson } from '../../language/diff/render-comparison-json.js';
import { renderComparisonMarkdown } from '../../language/diff/render-comparison-markdown.js';
import { renderSingleFileComparison } from '../../language/diff/single-file-comparison.js';
import { CFS_M3S, designOf, FOOT_M, type ReachSpec } from './fixtures.js';

const q100 = { name: 'q100', discharge_m3s: 400 * CFS_M3S };
const upper: ReachSpec = {
  channel: 'east',
  name: 'upper',
  section: { name: 'wide', bottomWidth_m: 20 * FOOT_M, sideSlope_HV: 2, bankDepth_m: 5 * FOOT_M },
  lining: { name: 'earth', manningN: 0.025, maxShear_Pa: 100 },
  slope: 0.0016,
  length_m: 900 * FOOT_M,
  flows: [q100],
  requiredFreeboard_m: 1.5 * FOOT_M,
};
const lower: ReachSpec = { ...upper, name: 'lower', slope: 0.003 };
const narrower: ReachSpec = { ...upper, section: { ...upper.section, bottomWidth_m: 16 * FOOT_M } };
const steeper: ReachSpec = { ...lower, slope: 0.004 };

function pair(path: string, before: readonly ReachSpec[] | null, after: readonly ReachSpec[] | null): DesignPair {
  return {
    path,
    previousPath: null,
    before: before === null ? null : { analysis: designOf(path, before), problems: [] },
    after: after === null ? null : { analysis: designOf(path, after), problems: [] },
  };
}

const report = compareDesignVersions(
  [pair('east.runnel', [upper, lower], [narrower, steeper]), pair('west.runnel', [upper], [upper]), pair('north.runnel', null, [lower])],
  { beforeLabel: 'main (3f2a9c1)', afterLabel: 'working tree' },
);
const markdown = renderComparisonMarkdown(report, { policyLine: 'CI policy --fail-on new-errors: passes.' });
const markdownIt = new MarkdownIt({ html: true });

describe('Markdown for a pull-request comment', () => {
  it('renders with markdown-it without errors, to tables and a collapsed details block', () => {
    const html = markdownIt.render(markdown);
    expect(html).toContain('<table>');
    expect(html).toContain('<details>');
    expect(html).toContain('<summary><b>east.runnel</b>');
    // The tables inside <details> are Markdown too: a blank line after <summary> lets GitHub and markdown-it parse them.
    expect(html.match(/<table>/g)?.length ?? 0).toBeGreaterThanOrEqual(4);
  });

  it('puts the verdict first, then what got worse, then what got better, then the details, then the caution', () => {
    const lines = markdown.split('\n');
    expect(lines[0]).toMatch(/^\*\*Runnel design review: (worse|mixed)/);
    const order = ['#### What got worse', '#### What got better', '<details>', '> **Caution:**'].map((marker) => markdown.indexOf(marker));
    expect(order.every((position) => position >= 0)).toBe(true);
    expect([...order].sort((a, b) => a - b)).toEqual(order);
    expect(markdown).toContain('Results are for design checking only');
  });

  it('counts the unchanged design and does not list it', () => {
    expect(report.unchangedDesignCount).toBe(1);
    expect(markdown).toContain('2 designs changed, 1 unchanged');
    expect(markdown).not.toContain('west.runnel');
  });

  it('shows before -> after in the design display units with the difference', () => {
    // Freeboard of the Chow (1959) N1 channel: 5 ft bank - 3.361 ft normal depth = 1.64 ft (from memory, derived).
    expect(markdown).toMatch(/\| east\.runnel \| east › upper \| q100 \| freeboard \| 1\.64 ft \| 1\.28 ft \| −0\.363 ft \\?\(−22 %\\?\) \|/);
  });

  it('keeps every table row intact when a message contains a pipe or markup', () => {
    // The fixtures' shear message contains "|"; make the shear check fail so its message reaches a table.
    const weak: ReachSpec = { ...upper, lining: { ...upper.lining, name: 'weak', maxShear_Pa: 5 } };
    const risky = compareDesignVersions([pair('east.runnel', [upper], [{ ...weak, name: 'upper' }])], { beforeLabel: 'a', afterLabel: 'b' });
    const text = renderComparisonMarkdown(risky);
    const tokens = markdownIt.parse(text, {});
    // Cells per row, table by table: every row must have as many cells as its header.
    const rowWidths: number[][] = [];
    let cells = 0;
    for (const token of tokens) {
      if (token.type === 'table_open') rowWidths.push([]);
      if (token.type === 'tr_open') cells = 0;
      if (token.type === 'td_open' || token.type === 'th_open') cells++;
      if (token.type === 'tr_close') rowWidths[rowWidths.length - 1]?.push(cells);
    }
    expect(rowWidths.length).toBeGreaterThan(0);
    for (const widths of rowWidths) expect(new Set(widths).size).toBe(1);
    expect(text.split('\n').some((line) => line.startsWith('| ') && line.includes('shear-above-permissible') && line.includes('\\|'))).toBe(true);
    expect(markdownIt.render(text)).not.toMatch(/<script|<img/);
  });

  it('says "no change" when nothing changed', () => {
    const none = compareDesignVersions([pair('west.runnel', [upper], [upper])], { beforeLabel: 'a', afterLabel: 'b' });
    const text = renderComparisonMarkdown(none);
    expect(text.split('\n')[0]).toBe('**Runnel design review: no change**');
    expect(text).not.toContain('<details>');
  });
});

describe('JSON', () => {
  const document = JSON.parse(renderComparisonJson(report, 'new-errors')) as Record<string, unknown>;

  it('carries the schema version, the labels, the counts and the policy outcome', () => {
    expect(document['schemaVersion']).toBe(COMPARISON_SCHEMA_VERSION);
    expect(document['beforeLabel']).toBe('main (3f2a9c1)');
    expect(document['policy']).toEqual({ failOn: 'new-errors', fails: false, reason: null });
    expect(document['unchangedDesignCount']).toBe(1);
  });

  it('keeps SI numbers with the unit in the quantity key', () => {
    const east = (document['designs'] as { path: string; reaches: { flows: { resultChanges: { quantity: string; before: number }[] }[] }[] }[]).find(
      (design) => design.path === 'east.runnel',
    );
    const freeboard = east?.reaches[0]?.flows[0]?.resultChanges.find((change) => change.quantity === 'freeboard_m');
    // 5 ft - 3.361 ft (Chow 1959, N1, from memory) = 1.639 ft = 0.4996 m.
    expect(freeboard?.before ?? 0).toBeCloseTo(1.639 * FOOT_M, 3);
  });
});

describe('one file against its last commit (the editor command)', () => {
  it('renders the same Markdown for a single pair', () => {
    const text = renderSingleFileComparison({
      path: 'east.runnel',
      previousPath: null,
      before: { analysis: designOf('east', [upper]), problems: [] },
      after: { analysis: designOf('east', [narrower]), problems: [] },
      beforeLabel: 'last commit (3f2a9c1)',
      afterLabel: 'editor',
    });
    expect(text).toContain('Compared `last commit (3f2a9c1)` → `editor`');
    expect(text).toContain('freeboard-below-required');
    expect(() => markdownIt.render(text)).not.toThrow();
  });
});
