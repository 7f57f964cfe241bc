/**
 * Report safety end to end, in headless Chromium. test/report/ already checks the renderer with hand-made analyses
 * (hostile names shown as text, the CSP blocking an injected inline script, a nonce admitting only its own script,
 * no request with the browser offline). What this adds:
 *
 * - the hostile text is written in a design file (title, notes, and the descriptions of sections, linings, flows
 *   and channels, and a lining's source), so it goes through the parser, the analysis and the renderer as a user's
 *   would; classic injection payloads, each of which would run a script, load something or navigate if escaping
 *   failed anywhere;
 * - the page is loaded three ways: the exported report (CSP without script), the editor panel (CSP with a nonce,
 *   the panel's own script added as the extension adds it, with payloads that carry that very nonce), and the
 *   exported report with its CSP removed, so escaping alone is shown to hold (defence in depth);
 * - every request is intercepted (page.route on every URL, the browser online) and recorded: the page loads nothing
 *   remote, nothing at all beyond itself;
 * - the Markdown report of the same design rendered by markdown-it with raw HTML allowed (the most permissive
 *   renderer a reader could use) runs nothing and loads nothing either.
 *
 * Needs Chromium at /usr/bin/chromium (apt-get install -y chromium); without it the suite is skipped and says so.
 */
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import MarkdownIt from 'markdown-it';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import type { DesignAnalysis } from '../../language/analysis/model.js';
import { renderReportHtml } from '../../language/report/report-html.js';
import { renderReportMarkdown } from '../../language/report/report-markdown.js';
import { withPanelScript } from '../../extension/report-page.js';
import { buildWorkspace, sampleFiles } from '../language/language-test-kit.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';

const CHROMIUM_PATH = '/usr/bin/chromium';
const chromiumPresent = existsSync(CHROMIUM_PATH);
if (!chromiumPresent) console.warn(`report-safety.test.ts skipped: no Chromium at ${CHROMIUM_PATH} (install Debian's chromium: apt-get install -y chromium).`);

const NONCE = 'cmVwb3J0LXNhZmV0eS1ub25jZQ';
/** Where pages are served from inside the browser (page.route answers; nothing leaves the machine). */
const PAGE_URL = 'http://report.invalid/report.html';

/**
 * Payloads that run `window.__ran(id)`, load a remote URL or navigate if they ever became markup. None contains a
 * double quote or a line break, so each is a valid Runnel string.
 */
const PAYLOADS: readonly string[] = [
  `<script>window.__ran('script')</script>`,
  `<img src=x onerror=window.__ran('img')>`,
  `<svg onload=window.__ran('svg')>`,
  `<svg><script>window.__ran('svg-script')</script></svg>`,
  `</title><script>window.__ran('title')</script>`,
  `</style><script>window.__ran('style')</script>`,
  `</textarea></noscript><script>window.__ran('close')</script>`,
  `<iframe src='javascript:parent.__ran(&quot;iframe&quot;)'></iframe>`,
  `<body onload=window.__ran('body')>`,
  `<details open ontoggle=window.__ran('details')>`,
  `<math><mtext><table><mglyph><style><img src=x onerror=window.__ran('mxss')>`,
  `<!--<script>window.__ran('comment')</script>-->`,
  `]]><script>window.__ran('cdata')</script>`,
  `' onmouseover='window.__ran(1)' x='`,
  `<script nonce='${NONCE}'>window.__ran('nonce')</script>`,
  `<meta http-equiv='refresh' content='0;url=https://example.invalid/refresh'>`,
  `<link rel='stylesheet' href='https://example.invalid/x.css'>`,
  `<base href='https://example.invalid/'>`,
  `<img src='https://example.invalid/track.png'>`,
  `<style>@import url(https://example.invalid/i.css);</style>`,
  `<object data='https://example.invalid/o'></object><embed src='https://example.invalid/e'>`,
  `<form action='https://example.invalid/f'><button>x</button></form>`,
  `<a href='javascript:window.__ran(2)'>click</a> [md](javascript:window.__ran(3)) ![i](https://example.invalid/md.png)`,
  `&lt;script&gt;window.__ran('entity')&lt;/script&gt; &#60;b&#62;`,
  `＜script＞fullwidth＜/script＞ \u2028 \u202E reversed`,
];

/** A small design whose every free-text place carries payloads, with its linings in the shared sample library. */
function hostileDesign(): string {
  const pick = (index: number): string => PAYLOADS[index % PAYLOADS.length] ?? '';
  return [
    `design "${pick(0)} ${pick(4)}"`,
    ...PAYLOADS.map((payload) => `note "${payload}"`),
    'units US',
    `section ditch trapezoid "${pick(1)} ${pick(2)}" { bottom width 2 ft  side slopes 3:1  bank height 2 ft }`,
    `section pipe circle "${pick(3)} ${pick(5)}" { diameter 18 in }`,
    `lining sod "${pick(6)} ${pick(7)}" { n 0.035  permissible velocity 4 ft/s  source "${pick(8)} ${pick(9)}" }`,
    `flows { q10 = 12 cfs "${pick(10)} ${pick(11)}"  q100 = 30 cfs "${pick(12)} ${pick(13)}" }`,
    `channel east "${pick(14)} ${pick(15)}" {`,
    `  reach upper "${pick(16)} ${pick(17)}" { section ditch  lining sod  slope 2 %  length 300 ft }`,
    `  reach culvert "${pick(18)} ${pick(19)}" { section pipe  lining concrete-trowel  slope 1 %  length 60 ft }`,
    `  reach lower "${pick(20)} ${pick(21)}" { section ditch  lining grass-medium  slope 0.4 %  length 200 ft  flows { q10 = 14 cfs } }`,
    '  outlet free fall',
    '}',
    `channel west "${pick(22)} ${pick(23)} ${pick(24)}" {`,
    '  reach only { section ditch  lining sod  slope 0.2 %  length 100 ft }',
    '  outlet water level 90 ft',
    '}',
  ].join('\n');
}

interface Visit {
  readonly page: Page;
  /** Every URL the page asked for besides itself. */
  readonly requests: string[];
  readonly dialogs: string[];
  readonly errors: string[];
}

describe.skipIf(!chromiumPresent)('report safety in headless Chromium', () => {
  let context: BrowserContext;
  let profile: string;
  let analysis: DesignAnalysis;

  beforeAll(async () => {
    const { documents } = await buildWorkspace({ 'hostile.runnel': hostileDesign(), 'linings.runnel': sampleFiles()['linings.runnel'] ?? '' });
    const document = documents[0];
    if (document === undefined) throw new Error('no document');
    analysis = analyzeDocument(document, NO_CRITERIA_DEFAULTS);
    profile = mkdtempSync(join(tmpdir(), 'runnel-report-safety-'));
    context = await chromium.launchPersistentContext(profile, {
      executablePath: CHROMIUM_PATH,
      headless: true,
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    });
  }, 60_000);

  afterAll(async () => {
    await context?.close();
    if (profile) rmSync(profile, { recursive: true, force: true });
  });

  /** Serves `html` at PAGE_URL, intercepting every other request (recorded, then refused). */
  async function visit(html: string, initScript?: string): Promise<Visit> {
    const page = await context.newPage();
    const requests: string[] = [];
    const dialogs: string[] = [];
    const errors: string[] = [];
    page.on('dialog', (dialog) => {
      dialogs.push(dialog.message());
      void dialog.dismiss();
    });
    page.on('pageerror', (error) => errors.push(error.message));
    page.on('request', (request) => {
      if (request.url() !== PAGE_URL) requests.push(request.url());
    });
    await page.route('**/*', (route) => (route.request().url() === PAGE_URL ? route.fulfill({ contentType: 'text/html; charset=utf-8', body: html }) : route.abort()));
    await page.addInitScript(`window.__ranIds = []; window.__ran = function (id) { window.__ranIds.push(String(id)); };${initScript ?? ''}`);
    await page.goto(PAGE_URL, { waitUntil: 'load' });
    // Give timers, refreshes and lazy loads a moment to fire if anything scheduled them.
    await page.waitForTimeout(60);
    return { page, requests, dialogs, errors };
  }

  /** What markup the payloads would have made, had any of it survived as markup. */
  async function injectedMarkup(page: Page): Promise<unknown> {
    return page.evaluate(`(() => {
      const found = [];
      for (const element of document.querySelectorAll('script, iframe, object, embed, form, base, link, meta[http-equiv=refresh], img, math, details, textarea, noscript')) {
        if (element.tagName === 'SCRIPT' && element.getAttribute('nonce') === ${JSON.stringify(NONCE)} && !element.textContent.includes('__ran')) continue;
        found.push(element.tagName.toLowerCase());
      }
      for (const element of document.querySelectorAll('*')) {
        for (const attribute of element.attributes) {
          if (/^on/i.test(attribute.name)) found.push(element.tagName.toLowerCase() + '[' + attribute.name + ']');
          if (/^\\s*javascript:/i.test(attribute.value)) found.push(element.tagName.toLowerCase() + '[' + attribute.name + '=javascript:]');
        }
      }
      return found;
    })()`);
  }

  async function expectInert(visit: Visit, what: string): Promise<void> {
    expect(await visit.page.evaluate('window.__ranIds'), `${what}: payloads that ran`).toEqual([]);
    expect(visit.dialogs, `${what}: dialogs`).toEqual([]);
    expect(visit.requests, `${what}: requests beyond the page itself`).toEqual([]);
    expect(visit.page.url(), `${what}: the page navigated`).toBe(PAGE_URL);
  }

  it('the exported report runs no payload, makes no markup of them and loads nothing', async () => {
    const html = renderReportHtml(analysis, { generatedAt: new Date('2025-03-04T05:06:07Z'), fileName: `${PAYLOADS[0]}.runnel` });
    const exported = await visit(html);
    await expectInert(exported, 'exported report');
    expect(await injectedMarkup(exported.page)).toEqual([]);
    // The text reads as written: the title heading is the title, every note is a note.
    expect(await exported.page.evaluate(`document.querySelector('h1').textContent`)).toBe(analysis.title);
    expect(await exported.page.evaluate(`[...document.querySelectorAll('ul.notes li')].map((item) => item.textContent)`)).toEqual(PAYLOADS);
    await exported.page.close();
  });

  it('the same page with its Content-Security-Policy removed is still inert: escaping alone holds', async () => {
    const html = renderReportHtml(analysis, { generatedAt: new Date(0), fileName: 'hostile.runnel' });
    const withoutPolicy = html.replace(/<meta[^>]+http-equiv="Content-Security-Policy"[^>]*>/i, '');
    expect(withoutPolicy).not.toBe(html);
    const bare = await visit(withoutPolicy);
    await expectInert(bare, 'report without CSP');
    expect(await injectedMarkup(bare.page)).toEqual([]);
    await bare.page.close();
  });

  it('the editor panel (nonce policy and the panel script) runs only its own script, even with payloads that carry the nonce', async () => {
    const html = withPanelScript(renderReportHtml(analysis, { generatedAt: new Date(0), fileName: 'hostile.runnel', nonce: NONCE, cspSource: 'https://report.invalid' }), NONCE, 'file:///designs/hostile.runnel');
    const stub = `window.__posted = []; window.acquireVsCodeApi = () => ({ postMessage: (m) => window.__posted.push(m), getState: () => null, setState: () => undefined });`;
    const panel = await visit(html, stub);
    await expectInert(panel, 'editor panel');
    expect(await injectedMarkup(panel.page)).toEqual([]);
    // The panel's own script did run (the policy admits its nonce), so the payloads were stopped by escaping.
    expect(await panel.page.evaluate('window.__posted.map((message) => message.type)')).toContain('ready');
    expect(panel.errors).toEqual([]);
    await panel.page.close();
  });

  it('the Markdown report rendered with raw HTML allowed runs nothing and loads nothing', async () => {
    const markdown = renderReportMarkdown(analysis, { fileName: 'hostile.runnel' });
    const body = new MarkdownIt({ html: true, linkify: true }).render(markdown);
    const rendered = await visit(`<!doctype html><html><head><meta charset="utf-8"><title>report</title></head><body>${body}</body></html>`);
    await expectInert(rendered, 'Markdown report');
    expect(await injectedMarkup(rendered.page)).toEqual([]);
    expect(await rendered.page.evaluate(`document.querySelectorAll('table').length`)).toBeGreaterThan(0);
    await rendered.page.close();
  });

  it('the checks above see a payload that does get through (negative twin)', async () => {
    const broken = renderReportHtml(analysis, { generatedAt: new Date(0), fileName: 'x.runnel' })
      .replace(/<meta[^>]+http-equiv="Content-Security-Policy"[^>]*>/i, '')
      .replace('</h1>', `</h1>${PAYLOADS[0]}${PAYLOADS[18]}`);
    const leaky = await visit(broken);
    expect(await leaky.page.evaluate('window.__ranIds')).toEqual(['script']);
    expect(leaky.requests).toEqual(['https://example.invalid/track.png']);
    expect(await injectedMarkup(leaky.page)).toEqual(['script', 'img']);
    await leaky.page.close();
  });
});
