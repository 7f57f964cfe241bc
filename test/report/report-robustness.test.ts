/**
 * Bad numbers never break the report: any numeric field of the analysis replaced by 0, -1, 1e-300, 1e300, NaN or
 * +-Infinity, and any name by arbitrary text, still gives a well-formed report within a time bound, with no
 * "NaN" or "Infinity" where a reader looks. Seeds are printed by fast-check on failure.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { DesignAnalysis } from '../../language/analysis/model.js';
import { renderReportHtml } from '../../language/report/report-html.js';
import { renderReportMarkdown } from '../../language/report/report-markdown.js';
import { siDesign } from './fixtures.js';
import { parseMarkup, svgFragments } from './svg-query.js';

type Path = readonly (string | number)[];

function leafPaths(value: unknown, predicate: (leaf: unknown) => boolean, path: Path = []): Path[] {
  if (predicate(value)) return [path];
  if (value === null || typeof value !== 'object') return [];
  return Object.entries(value).flatMap(([key, child]) => leafPaths(child, predicate, [...path, Array.isArray(value) ? Number(key) : key]));
}

function setAt(root: unknown, path: Path, leaf: unknown): void {
  let node = root as Record<string | number, unknown>;
  for (const key of path.slice(0, -1)) node = node[key] as Record<string | number, unknown>;
  node[path[path.length - 1]!] = leaf;
}

const base = siDesign();
const numberPaths = leafPaths(base, (leaf) => typeof leaf === 'number');
const namePaths = leafPaths(base, (leaf) => typeof leaf === 'string').filter((path) => {
  const key = path[path.length - 1];
  return key === 'name' || key === 'flow' || key === 'title' || key === 'description' || key === 'channel' || key === 'reach';
});
const weirdNumber = fc.constantFrom(0, -1, 1e-300, 1e300, 1e309, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, -0, 5e-324);

const mutatedAnalysis = fc
  .tuple(
    fc.array(fc.tuple(fc.nat(numberPaths.length - 1), weirdNumber), { minLength: 1, maxLength: 25 }),
    fc.array(fc.tuple(fc.nat(namePaths.length - 1), fc.string({ unit: 'binary', maxLength: 300 })), { maxLength: 5 }),
  )
  .map(([numbers, names]) => {
    const copy = structuredClone(base) as DesignAnalysis;
    for (const [index, value] of numbers) setAt(copy, numberPaths[index]!, value);
    for (const [index, value] of names) setAt(copy, namePaths[index]!, value);
    return copy;
  });

/** What a reader sees: the text between tags, and attribute values that are drawn as coordinates. */
function readableNumbersAreFinite(html: string): void {
  const withoutNames = html.replace(/data-(flow|value|depth-m|top-width-m|discharge-m3s|station-m|[\w-]+-m)="[^"]*"/g, '');
  const found = /NaN|Infinity/.exec(withoutNames);
  expect(found === null ? '' : withoutNames.slice(Math.max(0, found.index - 160), found.index + 40)).toBe('');
}

describe('report robustness', () => {
  it('renders HTML and Markdown for analyses with absurd numbers and names, well-formed and without NaN', () => {
    fc.assert(
      fc.property(mutatedAnalysis, (analysis) => {
        const started = performance.now();
        const html = renderReportHtml(analysis, { generatedAt: new Date('2025-05-06T09:30:00Z'), fileName: 'fuzz.runnel' });
        const markdownText = renderReportMarkdown(analysis);
        expect(performance.now() - started).toBeLessThan(2000);
        // Names may themselves contain "NaN"; only the numbers are checked, so blank the names out first.
        const mutatedNames = new Set(namePaths.map((path) => path.reduce<unknown>((node, key) => (node as Record<string | number, unknown>)[key], analysis) as string));
        let htmlNumbers = html;
        let markdownNumbers = markdownText;
        for (const name of mutatedNames) {
          if (name.length === 0) continue;
          htmlNumbers = htmlNumbers.split(name).join('');
          markdownNumbers = markdownNumbers.split(name).join('');
        }
        readableNumbersAreFinite(htmlNumbers.replace(/&[#\w]+;/g, ''));
        expect(markdownNumbers.replace(/\\./g, '')).not.toMatch(/NaN|Infinity/);
        for (const svg of svgFragments(html)) expect(parseMarkup(svg).problems).toEqual([]);
      }),
      { numRuns: 60 },
    );
  });
});
