/**
 * The HTML report as a document: self-contained (no URL to fetch, no script), a strict Content-Security-Policy
 * whose stylesheet hash or nonce matches the stylesheet, every hostile name shown as text, the tables carrying
 * every reach and flow, and the caution, assumptions, date and file name present.
 */
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import type { DesignAnalysis } from '../../language/analysis/model.js';
import { MAX_DRAWN_REACHES, renderReportHtml } from '../../language/report/report-html.js';
import { FIXTURE_CAUTION, HOSTILE_NAMES, siDesign } from './fixtures.js';
import { byRole, parseMarkup, svgFragments } from './svg-query.js';

const GENERATED_AT = new Date('2025-05-06T09:30:00Z');
const render = (analysis: DesignAnalysis, extra: Partial<Parameters<typeof renderReportHtml>[1]> = {}): string =>
  renderReportHtml(analysis, { generatedAt: GENERATED_AT, fileName: 'northfield-road.runnel', ...extra });

function contentSecurityPolicy(html: string): Map<string, string[]> {
  const content = /<meta http-equiv="Content-Security-Policy" content="([^"]*)">/.exec(html)?.[1];
  if (content === undefined) throw new Error('no CSP meta');
  const policy = content.replace(/&#39;/g, "'");
  return new Map(policy.split(';').map((directive) => {
    const [name, ...sources] = directive.trim().split(/\s+/);
    return [name ?? '', sources];
  }));
}

function styleText(html: string): string {
  const styles = [...html.matchAll(/<style[^>]*>([\s\S]*?)<\/style>/g)];
  expect(styles).toHaveLength(1);
  return styles[0]![1]!;
}

describe('HTML report', () => {
  const html = render(siDesign());

  it('is self-contained: no http(s) URL, no script, no external reference', () => {
    expect(html).not.toMatch(/https?:\/\//i);
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/\s(src|srcset|action|formaction|xlink:href)=/i);
    expect(html).not.toMatch(/@import|url\((?!#)/i);
    for (const link of html.matchAll(/href="([^"]*)"/g)) expect(link[1]).toMatch(/^#[\w-]+$/);
  });

  it('has a strict CSP that allows exactly its stylesheet by hash, and no script', () => {
    const policy = contentSecurityPolicy(html);
    expect(policy.get('default-src')).toEqual(["'none'"]);
    expect(policy.get('script-src')).toEqual(["'none'"]);
    expect(policy.get('base-uri')).toEqual(["'none'"]);
    const hash = createHash('sha256').update(styleText(html), 'utf8').digest('base64');
    expect(policy.get('style-src')).toEqual([`'sha256-${hash}'`]);
    expect(html.indexOf('Content-Security-Policy')).toBeLessThan(html.indexOf('<style'));
  });

  it('with a nonce, allows the stylesheet and scripts by that nonce only, and adds the webview source for images and styles', () => {
    const nonce = 'r4nd0mN0nce+/=abc';
    const withNonce = render(siDesign(), { nonce, cspSource: 'https://*.vscode-cdn.net' });
    const policy = contentSecurityPolicy(withNonce);
    expect(policy.get('style-src')).toEqual([`'nonce-${nonce}'`, 'https://*.vscode-cdn.net']);
    expect(policy.get('script-src')).toEqual([`'nonce-${nonce}'`]);
    expect(policy.get('img-src')).toEqual(['data:', 'https://*.vscode-cdn.net']);
    expect(withNonce).toContain(`<style nonce="${nonce}">`);
    expect(withNonce).not.toMatch(/<script/i);
  });

  it('ignores a nonce or CSP source that could inject into the policy', () => {
    const policy = contentSecurityPolicy(render(siDesign(), { nonce: "abc' 'unsafe-inline", cspSource: "x; script-src 'unsafe-inline'" }));
    expect(policy.get('script-src')).toEqual(["'none'"]);
    expect(policy.get('style-src')?.[0]).toMatch(/^'sha256-/);
    expect([...policy.values()].flat()).not.toContain("'unsafe-inline'");
  });

  it('lists every reach and flow in the summary with its result', () => {
    const analysis = siDesign();
    const rows = [...html.matchAll(/<tr class="row-(\w+)" data-status="(\w+)">/g)];
    const flows = analysis.channels.flatMap((channel) => channel.reaches.flatMap((reach) => reach.flows));
    expect(rows).toHaveLength(flows.length);
    expect(rows.map((row) => row[2])).toEqual(flows.map((flow) => flow.status));
    expect(html).toContain('5 reaches, 10 results (reach and flow): 4 pass, 5 warning, 1 fail');
  });

  it('draws a longitudinal view per channel and a cross-section and rating curve per reach, all well-formed', () => {
    const figures = svgFragments(html);
    const kinds = figures.map((svg) => /data-figure="([\w-]+)"/.exec(svg)?.[1]);
    expect(kinds.filter((kind) => kind === 'longitudinal')).toHaveLength(2);
    expect(kinds.filter((kind) => kind === 'cross-section')).toHaveLength(5);
    expect(kinds.filter((kind) => kind === 'rating-curve')).toHaveLength(5);
    for (const svg of figures) expect(parseMarkup(svg).problems).toEqual([]);
    const ids = [...html.matchAll(/\sid="([^"]+)"/g)].map((match) => match[1]);
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('carries the caution, assumptions, method, date and file name', () => {
    const parsed = parseMarkup(html);
    expect(byRole(parsed.elements, 'caution')[0]?.deepText).toBe(`Caution. ${FIXTURE_CAUTION}`);
    expect(byRole(parsed.elements, 'generated-at')[0]?.text).toBe('2025-05-06 09:30 UTC');
    expect(byRole(parsed.elements, 'file-name')[0]?.text).toBe('northfield-road.runnel');
    const assumptions = byRole(parsed.elements, 'assumptions')[0]?.deepText ?? '';
    for (const assumption of siDesign().assumptions) expect(assumptions).toContain(assumption);
  });

  it('follows the editor theme, the reader’s colour scheme, a forced theme and print', () => {
    const style = styleText(html);
    expect(style).toContain('body.vscode-dark');
    expect(style).toContain('body.vscode-high-contrast');
    expect(style).toContain('var(--vscode-editor-background');
    expect(style).toContain('@media (prefers-color-scheme: dark)');
    expect(style).toContain('@media print');
    expect(render(siDesign(), { theme: 'dark' })).toMatch(/<html lang="en" class="theme-dark">/);
    expect(render(siDesign(), { theme: 'light' })).toMatch(/<meta name="color-scheme" content="light">/);
  });

  it('writes no NaN or Infinity and is the same text every time', () => {
    expect(html).not.toMatch(/NaN|Infinity/);
    expect(render(siDesign())).toBe(html);
  });

  it('shows hostile names, titles, descriptions and notes as text, never as markup', () => {
    const analysis = siDesign({ title: HOSTILE_NAMES.title, channel: HOSTILE_NAMES.channel, reach: HOSTILE_NAMES.reach, flow: HOSTILE_NAMES.flow, note: HOSTILE_NAMES.note });
    const [first, ...rest] = analysis.channels;
    const described: DesignAnalysis = {
      ...analysis,
      channels: [
        {
          ...first!,
          description: '<svg onload="window.__reportScriptRan = 4">',
          reaches: first!.reaches.map((reach) => ({
            ...reach,
            section: { ...reach.section, description: '</td></tr></table><script>1</script>' },
            lining: { ...reach.lining, source: '<a href="javascript:alert(1)">source</a>', description: '<style>body{display:none}</style>' },
          })),
        },
        ...rest,
      ],
    };
    const hostile = render(described, { fileName: '<script>x</script>.runnel' });
    expect(hostile).not.toMatch(/<svg onload|<a href="javascript|<style>body{display/i);
    expect(hostile).toContain('&lt;/td&gt;&lt;/tr&gt;&lt;/table&gt;&lt;script&gt;1&lt;/script&gt;');
    expect(hostile).toContain('&lt;svg onload=&quot;window.__reportScriptRan = 4&quot;&gt;');
    expect(hostile).not.toMatch(/<script|<img|<iframe|<b>|<!--/i);
    expect(hostile.match(/<\/style>/g)).toHaveLength(1);
    expect(hostile.match(/<title[\s>]/g)?.length).toBe(1 + svgFragments(hostile).length);
    // A URL written in a note is shown as text, never as an attribute that could load it.
    expect(hostile).not.toMatch(/\s(src|href|srcdoc)="(?!#)/i);
    // The same text, decoded, is what the reader sees.
    const parsed = parseMarkup(hostile);
    expect(parsed.problems).toEqual([]);
    const heading = parsed.elements.find((element) => element.name === 'h1');
    expect(heading?.text).toBe(HOSTILE_NAMES.title);
    const channelHeading = parsed.elements.filter((element) => element.name === 'h2').map((element) => element.deepText);
    expect(channelHeading).toContain(`3Channel ${HOSTILE_NAMES.channel}`);
    expect(byRole(parsed.elements, 'file-name')[0]?.text).toBe('<script>x</script>.runnel');
    for (const svg of svgFragments(hostile)) expect(parseMarkup(svg).problems).toEqual([]);
    const flowLabels = parsed.elements.filter((element) => element.attributes['data-flow'] === HOSTILE_NAMES.flow);
    expect(flowLabels.length).toBeGreaterThan(3);
  });

  it('lists reaches the analysis left out, and explains a library file', () => {
    const base = siDesign();
    const location = { uri: base.uri, range: { start: { line: 40, character: 2 }, end: { line: 40, character: 9 } } };
    const withIncomplete: DesignAnalysis = { ...base, incompleteReaches: [{ channel: 'east-ditch', reach: 'spur <x>', reason: 'it has no lining', location }] };
    const parsed = parseMarkup(render(withIncomplete));
    expect(byRole(parsed.elements, 'incomplete-reach')[0]?.deepText).toBe('not analysedeast-ditch › spur <x> · line 41it has no lining');
    const library: DesignAnalysis = { ...base, kind: 'library', channels: [], findings: [] };
    expect(byRole(parseMarkup(render(library)).elements, 'library-note')).toHaveLength(1);
  });

  it(`draws at most ${MAX_DRAWN_REACHES} reaches and says so, but tabulates them all`, () => {
    const base = siDesign();
    const channel = base.channels[0]!;
    const many = Array.from({ length: MAX_DRAWN_REACHES + 5 }, (_, index) => ({ ...channel.reaches[1]!, name: `r${index}` }));
    const big: DesignAnalysis = { ...base, channels: [{ ...channel, reaches: many }] };
    const output = render(big);
    expect(svgFragments(output).filter((svg) => svg.includes('data-figure="cross-section"'))).toHaveLength(MAX_DRAWN_REACHES);
    expect(output).toContain(`Drawings are shown for the first ${MAX_DRAWN_REACHES} of ${MAX_DRAWN_REACHES + 5} reaches`);
    expect([...output.matchAll(/<tr class="row-/g)]).toHaveLength((MAX_DRAWN_REACHES + 5) * 2);
  });
});
