/**
 * The report panel's page: the language server renders a complete, self-contained HTML page with its own strict
 * Content-Security-Policy (CSP) carrying the nonce we pass; this module checks that policy and adds one small
 * script, with the same nonce, that swaps in later pages without losing the reader's scroll position.
 * Nothing else is added: the renderer's policy and markup are kept as they are.
 *
 * Plain string functions with no `vscode` import, so tests can run them (and the script, in Chromium).
 */
import { randomBytes } from 'node:crypto';

/**
 * A fresh CSP nonce: 18 random bytes in base64 (24 characters, no padding), inside the nonce grammar of CSP
 * Level 3 (`base64-value`).
 */
export function createNonce(): string {
  return randomBytes(18).toString('base64');
}

/** Sources that would let some script other than ours run, refused in a report page's script policy. */
const UNSAFE_SCRIPT_SOURCES = ["'unsafe-inline'", "'unsafe-eval'", "'unsafe-hashes'", "'strict-dynamic'", '*', 'http:', 'https:', 'data:', 'blob:'];

/**
 * Why a rendered page must not be shown in a script-enabled webview, or null when it may: the page must carry a
 * CSP `<meta>` whose script policy (`script-src`, else `default-src`) allows scripts only by this nonce.
 */
export function reportPageSecurityProblem(html: string, nonce: string): string | null {
  const policy = contentSecurityPolicyOf(html);
  if (policy === null) return 'the page has no Content-Security-Policy';
  const directives = parsePolicy(policy);
  const scriptSources = directives.get('script-src') ?? directives.get('default-src');
  if (scriptSources === undefined) return 'its Content-Security-Policy does not restrict scripts';
  if (!scriptSources.includes(`'nonce-${nonce}'`)) return 'its Content-Security-Policy does not carry the nonce of this panel';
  const unsafe = scriptSources.filter((source) => UNSAFE_SCRIPT_SOURCES.includes(source.toLowerCase()));
  if (unsafe.length > 0) return `its Content-Security-Policy allows other scripts (${unsafe.join(' ')})`;
  return null;
}

/**
 * The page with the panel's script added at the end of `<head>`, where it runs before the body exists and so
 * survives every later swap of the body. Throws when the page has no `<head>` (a renderer bug, reported upstream).
 */
export function withPanelScript(html: string, nonce: string, documentUri: string): string {
  const headEnd = html.search(/<\/head\s*>/i);
  if (headEnd < 0) throw new Error('the rendered report page has no </head>');
  const script = `<script nonce="${nonce}">${panelScriptSource(documentUri)}</script>`;
  return `${html.slice(0, headEnd)}${script}${html.slice(headEnd)}`;
}

/**
 * The script of the panel. It answers two host messages (see ReportHostMessage in server/protocol.ts):
 * `replacePage` parses the new page inertly (DOMParser never runs scripts), moves its body's children into the
 * live body (the body element itself stays, keeping the theme classes the editor put on it) and scrolls back;
 * `restoreScroll` scrolls. It reports `ready` once loaded and `scrolled` (at most once per frame), and keeps
 * the document URI and scroll position in the webview state, which the editor keeps while the panel is hidden and
 * hands back when a window reload restores the panel.
 */
export function panelScriptSource(documentUri: string): string {
  // JSON is valid JavaScript; escaping '<' keeps any '</script' in a URI from ending the element early.
  const uriLiteral = JSON.stringify(documentUri).replace(/</g, '\\u003c');
  return `(function () {
  'use strict';
  var host = acquireVsCodeApi();
  var documentUri = ${uriLiteral};
  var saved = host.getState();
  var savedScrollY = saved && typeof saved.scrollY === 'number' ? saved.scrollY : 0;
  function remember(scrollY) {
    host.setState({ uri: documentUri, scrollY: scrollY });
  }
  function scrollBackTo(scrollY) {
    window.scrollTo(window.scrollX, scrollY);
  }
  function replacePage(html) {
    var scrollY = window.scrollY;
    var next = new DOMParser().parseFromString(html, 'text/html');
    var children = Array.prototype.slice.call(next.body.childNodes).map(function (node) {
      return document.importNode(node, true);
    });
    document.body.replaceChildren.apply(document.body, children);
    if (next.title) document.title = next.title;
    scrollBackTo(scrollY);
  }
  window.addEventListener('message', function (event) {
    var message = event.data;
    if (!message || typeof message !== 'object') return;
    if (message.type === 'replacePage' && typeof message.html === 'string') replacePage(message.html);
    else if (message.type === 'restoreScroll' && typeof message.scrollY === 'number') scrollBackTo(message.scrollY);
  });
  var scrollReportPending = false;
  window.addEventListener('scroll', function () {
    if (scrollReportPending) return;
    scrollReportPending = true;
    window.requestAnimationFrame(function () {
      scrollReportPending = false;
      remember(window.scrollY);
      host.postMessage({ type: 'scrolled', scrollY: window.scrollY });
    });
  }, { passive: true });
  function whenLoaded() {
    remember(savedScrollY);
    if (savedScrollY > 0) scrollBackTo(savedScrollY);
    host.postMessage({ type: 'ready' });
  }
  if (document.readyState === 'loading') document.addEventListener('DOMContentLoaded', whenLoaded);
  else whenLoaded();
})();`;
}

/**
 * A plain page for the panel while the first report is computed, or when it cannot be shown. It runs no script
 * and loads nothing; its one style element is allowed by nonce.
 */
export function statusPage(title: string, message: string, nonce: string): string {
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'nonce-${nonce}'">
<title>${escapeText(title)}</title>
<style nonce="${nonce}">body { font-family: var(--vscode-font-family); color: var(--vscode-foreground); padding: 1.5em; }</style>
</head>
<body><p>${escapeText(message)}</p></body>
</html>`;
}

/** The CSP of a page: the content of its first `<meta http-equiv="Content-Security-Policy">`, or null. */
export function contentSecurityPolicyOf(html: string): string | null {
  for (const tag of html.match(/<meta\b[^>]*>/gi) ?? []) {
    const attributes = attributesOf(tag);
    if (attributes.get('http-equiv')?.toLowerCase() === 'content-security-policy') return attributes.get('content') ?? '';
  }
  return null;
}

/** CSP directives by lower-case name, each with its list of sources (CSP Level 3, "parse a serialized CSP"). */
export function parsePolicy(policy: string): Map<string, string[]> {
  const directives = new Map<string, string[]>();
  for (const part of policy.split(';')) {
    const [name, ...sources] = part.trim().split(/\s+/);
    if (name === undefined || name === '') continue;
    // The first occurrence of a directive wins; later duplicates are ignored by browsers.
    if (!directives.has(name.toLowerCase())) directives.set(name.toLowerCase(), sources);
  }
  return directives;
}

function attributesOf(tag: string): Map<string, string> {
  const attributes = new Map<string, string>();
  for (const match of tag.matchAll(/([^\s"'<>/=]+)\s*=\s*(?:"([^"]*)"|'([^']*)'|([^\s"'=<>`]+))/g)) {
    const name = match[1];
    if (name === undefined) continue;
    attributes.set(name.toLowerCase(), decodeEntities(match[2] ?? match[3] ?? match[4] ?? ''));
  }
  return attributes;
}

/** Decodes the few character references an attribute value of a policy can need. */
function decodeEntities(text: string): string {
  return text.replace(/&(#39|#x27|apos|quot|#34|amp);/gi, (_entity, name: string) => {
    switch (name.toLowerCase()) {
      case 'quot':
      case '#34':
        return '"';
      case 'amp':
        return '&';
      default:
        return "'";
    }
  });
}

function escapeText(text: string): string {
  return text.replace(/[&<>"']/g, (character) => `&#${character.charCodeAt(0)};`);
}
