/**
 * The report panel's page: the policy check that decides whether a rendered page may be shown in a webview with
 * scripts enabled, the script added to it, and (in headless Chromium) that the script runs under the page's own
 * Content-Security-Policy, swaps in a new page without running anything from it and keeps the scroll position.
 */
import { existsSync } from 'node:fs';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  contentSecurityPolicyOf,
  createNonce,
  panelScriptSource,
  parsePolicy,
  reportPageSecurityProblem,
  statusPage,
  withPanelScript,
} from '../../extension/report-page.js';
import type { DesignAnalysis } from '../../language/analysis/model.js';
import { renderReportHtml } from '../../language/report/index.js';

const NONCE = 'dGVzdC1ub25jZS0xMjM0NTY3';

/** A page shaped like the renderer's: its own policy with the nonce, a nonce'd style, a tall body. */
function renderedPage(heading: string, { policy, body = '' }: { policy?: string; body?: string } = {}): string {
  const csp = policy ?? `default-src 'none'; img-src data:; style-src 'nonce-${NONCE}'; script-src 'nonce-${NONCE}'`;
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${csp}">
<title>${heading}</title>
<style nonce="${NONCE}">body { margin: 0; } .tall { height: 4000px; }</style>
</head>
<body class="report"><h1 id="heading">${heading}</h1>${body}<div class="tall"></div></body>
</html>`;
}

/** A design with no channels: enough for the renderer to write a whole page, whatever the report holds. */
const EMPTY_ANALYSIS: DesignAnalysis = {
  uri: 'file:///designs/empty.runnel',
  title: 'Empty design',
  notes: [],
  displayUnits: 'SI',
  channels: [],
  findings: [],
  caution: 'For design checking only.',
  assumptions: [],
  provenance: { method: 'none', assumptions: [], references: [] },
  version: 1,
  kind: 'design',
  displayUnitsOrigin: 'setting',
  flows: [],
  criteria: { freeboard: null, avoidFroude: { low: 0.89, high: 1.13 }, minVelocity_mps: null, limitMargin: 0.2, origin: {} },
  incompleteReaches: [],
};

/** The page the language server sends for the panel: the real renderer, given the panel's nonce and CSP source. */
function rendererPage(): string {
  return renderReportHtml(EMPTY_ANALYSIS, {
    nonce: NONCE,
    cspSource: 'https://webview.invalid',
    generatedAt: new Date(Date.UTC(2026, 0, 1)),
    fileName: 'empty.runnel',
  });
}

describe('report page policy check', () => {
  it('accepts the page of the report renderer, given the panel nonce (the contract between the two)', () => {
    expect(reportPageSecurityProblem(rendererPage(), NONCE)).toBeNull();
  });

  it('refuses the standalone export of the renderer in a panel: it allows no script at all', () => {
    const exported = renderReportHtml(EMPTY_ANALYSIS, { generatedAt: new Date(Date.UTC(2026, 0, 1)), fileName: 'empty.runnel' });
    expect(reportPageSecurityProblem(exported, NONCE)).toMatch(/nonce/);
  });

  it('accepts a page whose scripts are allowed only by the panel nonce', () => {
    expect(reportPageSecurityProblem(renderedPage('ok'), NONCE)).toBeNull();
  });

  it('falls back to default-src when the page has no script-src', () => {
    expect(reportPageSecurityProblem(renderedPage('ok', { policy: `default-src 'nonce-${NONCE}'` }), NONCE)).toBeNull();
    expect(reportPageSecurityProblem(renderedPage('x', { policy: `default-src 'none'` }), NONCE)).toMatch(/nonce/);
  });

  it('refuses a page with no policy, a policy without scripts restricted, or another nonce', () => {
    expect(reportPageSecurityProblem('<html><head></head><body></body></html>', NONCE)).toMatch(/no Content-Security-Policy/);
    expect(reportPageSecurityProblem(renderedPage('x', { policy: "img-src data:" }), NONCE)).toMatch(/does not restrict scripts/);
    expect(reportPageSecurityProblem(renderedPage('x'), 'b3RoZXItbm9uY2U=')).toMatch(/nonce/);
  });

  it('refuses a policy that would let other scripts run beside the nonce', () => {
    for (const extra of ["'unsafe-inline'", "'unsafe-eval'", '*', 'https:', 'data:']) {
      const policy = `default-src 'none'; script-src 'nonce-${NONCE}' ${extra}`;
      expect(reportPageSecurityProblem(renderedPage('x', { policy }), NONCE), extra).toMatch(/allows other scripts/);
    }
  });

  it('reads the policy whatever the attribute order, quoting or character references', () => {
    const html = `<head><META content="script-src &#39;nonce-${NONCE}&#39;" HTTP-EQUIV='content-security-policy'></head>`;
    expect(contentSecurityPolicyOf(html)).toBe(`script-src 'nonce-${NONCE}'`);
    expect(reportPageSecurityProblem(html, NONCE)).toBeNull();
  });

  it('keeps the first of two directives of the same name, as browsers do', () => {
    expect(parsePolicy(`script-src 'none'; script-src *`).get('script-src')).toEqual(["'none'"]);
  });
});

describe('report page script', () => {
  it('is added once, at the end of the head, with the nonce', () => {
    const page = withPanelScript(renderedPage('ok'), NONCE, 'file:///designs/east.runnel');
    expect(page.match(/<script/g)).toHaveLength(1);
    expect(page).toMatch(new RegExp(`<script nonce="${NONCE}">[\\s\\S]*</script></head>`));
  });

  it('refuses a page without a head rather than guess where the script goes', () => {
    expect(() => withPanelScript('<body>no head</body>', NONCE, 'file:///x.runnel')).toThrow(/no <\/head>/);
  });

  it('cannot be ended early by a hostile document URI', () => {
    const source = panelScriptSource('file:///a/</script><script>alert(1)</script>.runnel');
    expect(source).not.toMatch(/<\/script/i);
    expect(source).toContain('\\u003c/script>');
  });

  it('nonces are fresh and in the CSP nonce alphabet', () => {
    const nonces = new Set(Array.from({ length: 50 }, () => createNonce()));
    expect(nonces.size).toBe(50);
    for (const nonce of nonces) expect(nonce).toMatch(/^[A-Za-z0-9+/]{24}$/);
  });

  it('the status page escapes its text and runs nothing', () => {
    const page = statusPage('Report: <b>x</b>', 'Failed: <img src=x onerror=alert(1)>', NONCE);
    expect(page).not.toMatch(/<img|<b>|<script/);
    expect(reportPageSecurityProblem(page, NONCE)).toMatch(/nonce/); // default-src 'none': no script may run at all
  });
});

const CHROMIUM = '/usr/bin/chromium';

// Browser globals used inside page.evaluate callbacks, which run in Chromium; the project's type-check has no DOM
// library, so these declarations (local to this module) describe just what the callbacks touch.
declare const window: {
  scrollY: number;
  scrollTo(x: number, y: number): void;
  postMessage(message: unknown, targetOrigin: string): void;
};
declare const document: { body: { className: string; classList: { add(name: string): void } } };
declare const sessionStorage: { getItem(key: string): string | null; setItem(key: string, value: string): void };

describe.skipIf(!existsSync(CHROMIUM))('report page script in headless Chromium', () => {
  let browser: Browser;
  let context: BrowserContext;

  beforeAll(async () => {
    browser = await chromium.launch({
      executablePath: CHROMIUM,
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run'],
    });
    context = await browser.newContext({ viewport: { width: 800, height: 600 } });
  });

  afterAll(async () => {
    await browser?.close();
  });

  /** Where the test serves its pages; requests to it never leave the browser (page.route answers them). */
  const PANEL_URL = 'http://report.invalid/panel.html';

  /**
   * A page with a stand-in for the webview host API that records what the script posts. Like the editor, the
   * stand-in keeps the saved state across reloads of the page (in session storage).
   */
  async function openPanelPage(html: string): Promise<{ page: Page; violations: string[] }> {
    const page = await context.newPage();
    const violations: string[] = [];
    page.on('console', (message) => {
      if (message.type() === 'error') violations.push(message.text());
    });
    page.on('pageerror', (error) => violations.push(error.message));
    await page.addInitScript(() => {
      const recorder = window as unknown as { posted: unknown[]; acquireVsCodeApi: () => unknown };
      recorder.posted = [];
      recorder.acquireVsCodeApi = () => ({
        postMessage: (message: unknown) => recorder.posted.push(message),
        getState: (): unknown => JSON.parse(sessionStorage.getItem('webview-state') ?? 'null'),
        setState: (state: unknown) => sessionStorage.setItem('webview-state', JSON.stringify(state)),
      });
    });
    await servePanelPage(page, html);
    return { page, violations };
  }

  async function servePanelPage(page: Page, html: string): Promise<void> {
    await page.unroute(PANEL_URL);
    await page.route(PANEL_URL, (route) => route.fulfill({ contentType: 'text/html; charset=utf-8', body: html }));
    await page.goto(PANEL_URL);
  }

  function savedState(page: Page): Promise<unknown> {
    return page.evaluate(() => JSON.parse(sessionStorage.getItem('webview-state') ?? 'null') as unknown);
  }

  function posted(page: Page): Promise<{ type: string; scrollY?: number }[]> {
    return page.evaluate(() => (window as unknown as { posted: { type: string; scrollY?: number }[] }).posted);
  }

  it('runs under the page policy, says ready, and keeps the document URI in the webview state', async () => {
    const uri = 'file:///designs/a</script><b>.runnel';
    const { page, violations } = await openPanelPage(withPanelScript(renderedPage('Version 1'), NONCE, uri));
    await expect.poll(() => posted(page)).toContainEqual({ type: 'ready' });
    expect(await savedState(page)).toEqual({ uri, scrollY: 0 });
    expect(violations).toEqual([]);
    await page.close();
  });

  it('runs in the real renderer page with no policy violation (its stylesheet and our script both allowed)', async () => {
    const { page, violations } = await openPanelPage(withPanelScript(rendererPage(), NONCE, EMPTY_ANALYSIS.uri));
    await expect.poll(() => posted(page)).toContainEqual({ type: 'ready' });
    expect(violations).toEqual([]);
    await page.close();
  });

  it('its negative twin: a page whose policy lacks the nonce never runs the script', async () => {
    const policy = `default-src 'none'; style-src 'nonce-${NONCE}'`;
    const { page, violations } = await openPanelPage(withPanelScript(renderedPage('Version 1', { policy }), NONCE, 'file:///x.runnel'));
    await page.waitForTimeout(200);
    expect(await posted(page)).toEqual([]);
    expect(violations.join('\n')).toMatch(/Content Security Policy/);
    await page.close();
  });

  it('swaps in a new page in place: same scroll, theme classes kept, nothing from the new page runs', async () => {
    const { page } = await openPanelPage(withPanelScript(renderedPage('Version 1'), NONCE, 'file:///x.runnel'));
    await expect.poll(() => posted(page)).toContainEqual({ type: 'ready' });
    // The editor marks the theme on the body; the swap must keep it.
    await page.evaluate(() => document.body.classList.add('vscode-dark'));
    await page.evaluate(() => window.scrollTo(0, 1200));
    await expect.poll(() => posted(page)).toContainEqual({ type: 'scrolled', scrollY: 1200 });
    expect(await savedState(page)).toEqual({ uri: 'file:///x.runnel', scrollY: 1200 });

    const hostile = '<script>window.ran = "script"</script><img src="x" onerror="window.ran = \'handler\'"><svg onload="window.ran = \'svg\'"></svg>';
    const next = renderedPage('Version 2', { body: hostile });
    await page.evaluate((html) => window.postMessage({ type: 'replacePage', html }, '*'), next);
    await expect.poll(() => page.textContent('#heading')).toBe('Version 2');
    expect(await page.evaluate(() => window.scrollY)).toBe(1200);
    expect(await page.evaluate(() => document.body.className)).toBe('report vscode-dark');
    expect(await page.title()).toBe('Version 2');
    await page.waitForTimeout(200);
    expect(await page.evaluate(() => (window as unknown as { ran?: string }).ran)).toBeUndefined();

    await page.evaluate(() => window.postMessage({ type: 'restoreScroll', scrollY: 300 }, '*'));
    await expect.poll(() => page.evaluate(() => window.scrollY)).toBe(300);
    await page.close();
  });

  it('scrolls back to the saved position when the webview is rebuilt (panel hidden and shown, window reloaded)', async () => {
    const { page } = await openPanelPage(withPanelScript(renderedPage('Version 1'), NONCE, 'file:///x.runnel'));
    await expect.poll(() => posted(page)).toContainEqual({ type: 'ready' });
    await page.evaluate(() => window.scrollTo(0, 900));
    await expect.poll(() => savedState(page)).toEqual({ uri: 'file:///x.runnel', scrollY: 900 });
    // The editor rebuilds a hidden webview from its page; the stand-in host keeps the saved state, as the editor does.
    await servePanelPage(page, withPanelScript(renderedPage('Version 1 again'), NONCE, 'file:///x.runnel'));
    expect(await page.textContent('#heading')).toBe('Version 1 again');
    await expect.poll(() => page.evaluate(() => window.scrollY)).toBe(900);
    await page.close();
  });
});
