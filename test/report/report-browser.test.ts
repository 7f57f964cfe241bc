/**
 * The exported report in a real browser (headless Chromium driven by playwright-core): it renders with its
 * stylesheet applied and no console error, loads nothing but itself, every label fits inside its drawing, a
 * script written into a name never runs, and the Content-Security-Policy blocks an inline script that has no
 * nonce even if one got into the page. Saves screenshots to test-output/ for the README.
 *
 * Needs Debian's `chromium` at /usr/bin/chromium (CI installs it with apt-get); without it the suite is skipped
 * with a message saying so.
 */
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DesignAnalysis } from '../../language/analysis/model.js';
import { renderReportHtml } from '../../language/report/report-html.js';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';
import { LspWorkspace, sampleTexts } from '../server/lsp-workspace.js';
import { HOSTILE_NAMES, siDesign } from './fixtures.js';

const CHROMIUM_PATH = '/usr/bin/chromium';
const OUTPUT_DIRECTORY = path.resolve('test-output');
const chromiumPresent = existsSync(CHROMIUM_PATH);

if (!chromiumPresent) {
  console.warn(`report-browser.test.ts skipped: no Chromium at ${CHROMIUM_PATH} (install Debian's chromium: apt-get install -y chromium).`);
}

interface LoadedPage {
  readonly page: Page;
  readonly consoleErrors: string[];
  readonly requests: string[];
}

describe.skipIf(!chromiumPresent)('exported report in headless Chromium', () => {
  let context: BrowserContext;
  let profileDirectory: string;
  const open: Page[] = [];

  beforeAll(async () => {
    mkdirSync(OUTPUT_DIRECTORY, { recursive: true });
    profileDirectory = mkdtempSync(path.join(tmpdir(), 'runnel-report-chromium-'));
    context = await chromium.launchPersistentContext(profileDirectory, {
      executablePath: CHROMIUM_PATH,
      headless: true,
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
      viewport: { width: 1280, height: 1700 },
      offline: true,
    });
  });

  afterAll(async () => {
    await context?.close();
    if (profileDirectory) rmSync(profileDirectory, { recursive: true, force: true });
  });

  /** Writes the page to test-output/ and opens it from disk, as a reader opens an exported report. */
  async function load(fileName: string, html: string, colorScheme: 'light' | 'dark' = 'light'): Promise<LoadedPage> {
    const filePath = path.join(OUTPUT_DIRECTORY, fileName);
    writeFileSync(filePath, html, 'utf8');
    const page = await context.newPage();
    open.push(page);
    await page.emulateMedia({ colorScheme });
    const consoleErrors: string[] = [];
    const requests: string[] = [];
    page.on('console', (message) => {
      if (message.type() === 'error') consoleErrors.push(message.text());
    });
    page.on('pageerror', (error) => consoleErrors.push(`page error: ${error.message}`));
    page.on('request', (request) => requests.push(request.url()));
    const url = pathToFileURL(filePath).href;
    await page.goto(url, { waitUntil: 'load' });
    return { page, consoleErrors, requests: requests.filter((request) => request !== url) };
  }

  const exportReport = (analysis: DesignAnalysis, theme: 'auto' | 'light' | 'dark' = 'auto'): string =>
    renderReportHtml(analysis, { generatedAt: new Date('2025-05-06T09:30:00Z'), fileName: 'northfield-road.runnel', theme });

  it('renders with its stylesheet, no console error and no request, and every label inside its drawing', { timeout: 60_000 }, async () => {
    const { page, consoleErrors, requests } = await load('report.html', exportReport(siDesign()));
    expect(consoleErrors).toEqual([]);
    expect(requests).toEqual([]);
    // The stylesheet applied (so its CSP hash is right): the caution box has its 4 px rule.
    expect(await page.evaluate(`getComputedStyle(document.querySelector('.caution')).borderLeftWidth`)).toBe('4px');
    expect(await page.evaluate(`document.querySelectorAll('svg.fig').length`)).toBe(12);
    // Every drawn text lies inside its drawing's viewBox (2 px slack).
    const overflowing = await page.evaluate(`(() => {
      const out = [];
      for (const svg of document.querySelectorAll('svg.fig')) {
        const frame = svg.getBoundingClientRect();
        for (const text of svg.querySelectorAll('text')) {
          const r = text.getBoundingClientRect();
          if (r.width === 0) continue;
          if (r.left < frame.left - 2 || r.right > frame.right + 2 || r.top < frame.top - 2 || r.bottom > frame.bottom + 2) {
            out.push(svg.id + ': ' + text.textContent + ' [' + [r.left - frame.left, r.top - frame.top, r.right - frame.right, r.bottom - frame.bottom].map(Math.round).join(',') + ']');
          }
        }
      }
      return out;
    })()`);
    expect(overflowing).toEqual([]);
    await page.screenshot({ path: path.join(OUTPUT_DIRECTORY, 'report.png') });
    await page.screenshot({ path: path.join(OUTPUT_DIRECTORY, 'report-full.png'), fullPage: true });
  });

  it("keeps every text of the samples' drawings inside its drawing and clear of every other (jump labels of several flows included)", { timeout: 60_000 }, async () => {
    const workspace = await LspWorkspace.create();
    const documents = await workspace.set(sampleTexts());
    const overlaps: string[] = [];
    for (const document of documents) {
      if (!document.uri.path.endsWith('.runnel')) continue;
      const analysis = analyzeDocument(document, NO_CRITERIA_DEFAULTS);
      if (analysis.kind !== 'design') continue;
      const name = path.basename(document.uri.path, '.runnel');
      const { page } = await load(`sample-${name}.html`, renderReportHtml(analysis, { generatedAt: new Date('2025-05-06T09:30:00Z'), fileName: `${name}.runnel` }));
      const found: string[] = await page.evaluate(`(() => {
        const out = [];
        for (const svg of document.querySelectorAll('svg.fig')) {
          const frame = svg.getBoundingClientRect();
          const boxes = [...svg.querySelectorAll('text')].map((text) => ({ text: text.textContent, box: text.getBoundingClientRect() })).filter((entry) => entry.box.width > 0);
          for (const { text, box } of boxes) {
            if (box.left < frame.left - 2 || box.right > frame.right + 2 || box.top < frame.top - 2 || box.bottom > frame.bottom + 2) out.push(svg.id + ': "' + text + '" outside the drawing');
          }
          for (let i = 0; i < boxes.length; i++) {
            for (let j = i + 1; j < boxes.length; j++) {
              const a = boxes[i].box;
              const b = boxes[j].box;
              // More than a pixel of overlap both ways.
              if (a.left < b.right - 1 && b.left < a.right - 1 && a.top < b.bottom - 1 && b.top < a.bottom - 1) out.push(svg.id + ': "' + boxes[i].text + '" and "' + boxes[j].text + '"');
            }
          }
        }
        return out;
      })()`);
      overlaps.push(...found.map((overlap) => `${name}: ${overlap}`));
    }
    expect(overlaps).toEqual([]);
  });

  it('follows a dark colour scheme when standalone', async () => {
    const { page, consoleErrors } = await load('report-dark.html', exportReport(siDesign()), 'dark');
    expect(consoleErrors).toEqual([]);
    const background = await page.evaluate(`getComputedStyle(document.body).backgroundColor`);
    expect(background).toBe('rgb(27, 31, 36)');
    await page.screenshot({ path: path.join(OUTPUT_DIRECTORY, 'report-dark.png') });
  });

  it('never runs a script written into a title, name or note, and shows it as text', async () => {
    const hostile = siDesign({ title: HOSTILE_NAMES.title, channel: HOSTILE_NAMES.channel, reach: HOSTILE_NAMES.reach, flow: HOSTILE_NAMES.flow, note: HOSTILE_NAMES.note });
    const { page, consoleErrors, requests } = await load('report-hostile.html', exportReport(hostile));
    expect(consoleErrors).toEqual([]);
    expect(requests).toEqual([]);
    expect(await page.evaluate('typeof window.__reportScriptRan')).toBe('undefined');
    expect(await page.evaluate(`document.querySelectorAll('script, img, iframe').length`)).toBe(0);
    expect(await page.evaluate(`document.querySelector('h1').textContent`)).toBe(HOSTILE_NAMES.title);
  });

  it('has a Content-Security-Policy that blocks an inline script without the nonce', async () => {
    const html = exportReport(siDesign()).replace('<main class="page">', '<main class="page"><script>window.__reportScriptRan = "inline";</script>');
    const { page, consoleErrors } = await load('report-injected.html', html);
    expect(await page.evaluate('typeof window.__reportScriptRan')).toBe('undefined');
    expect(consoleErrors.some((message) => /Content Security Policy/i.test(message))).toBe(true);
  });

  it('with a nonce (the editor panel), runs only a script that carries that nonce', async () => {
    const nonce = 'dGVzdC1ub25jZS0xMjM0NTY=';
    const html = renderReportHtml(siDesign(), { generatedAt: new Date(0), fileName: 'x.runnel', nonce })
      .replace('</head>', `<script nonce="${nonce}">window.__withNonce = 1;</script><script nonce="wrong">window.__reportScriptRan = 1;</script></head>`);
    const { page, consoleErrors } = await load('report-nonce.html', html);
    expect(await page.evaluate('window.__withNonce')).toBe(1);
    expect(await page.evaluate('typeof window.__reportScriptRan')).toBe('undefined');
    expect(consoleErrors.filter((message) => !/Content Security Policy/i.test(message))).toEqual([]);
    expect(await page.evaluate(`getComputedStyle(document.querySelector('.caution')).borderLeftWidth`)).toBe('4px');
  });
});
