/**
 * The report as one self-contained HTML document: title block with file name and date, the caution, a summary of
 * every reach and flow, the findings, then per channel a longitudinal view and per reach its data, results by
 * flow, a cross-section and a rating curve, and finally the basis of the results (method, assumptions,
 * references). Used by the editor's report panel (with the webview's nonce and CSP source) and by the CLI's
 * export (no nonce: the stylesheet is allowed by its hash). The page itself contains no script and loads nothing:
 * the Content-Security-Policy is default-src 'none' with only the one stylesheet allowed and, when a nonce is given,
 * scripts carrying that nonce (the editor panel adds one to keep the scroll position across updates); without a
 * nonce, script-src is 'none'.
 */
import type { CheckStatus, DesignAnalysis, Finding } from '../analysis/model.js';
import { renderCrossSectionSvg } from './cross-section-svg.js';
import { escapeHtml } from './escape.js';
import { designFlowOrder, flowColourClass } from './flow-colours.js';
import { formatTimestampUtc } from './format.js';
import { renderLongitudinalSvg } from './longitudinal-svg.js';
import { renderRatingCurveSvg } from './rating-curve-svg.js';
import { buildProfileSummary, buildReachFacts, buildReachFlowTable, buildSummaryTable, criteriaFromSettingsText, findingLineText, findingPlaceText, lineText, tallyText, type ProfileSummary, type ReachFlowTable, type TextTable } from './results-table.js';
import { REPORT_STYLESHEET } from './report-styles.js';
import { DRAWING_WORDS, REPORT_WORDS, SEVERITY_WORDS, STATUS_WORDS } from './report-wording.js';
import { sha256Base64 } from './sha256.js';

export interface ReportHtmlOptions {
  /** The webview's nonce for the stylesheet; without one the stylesheet is allowed by its SHA-256 hash. */
  readonly nonce?: string;
  /** When the report was made (shown in UTC). */
  readonly generatedAt: Date;
  /** The design file's name as the reader knows it. */
  readonly fileName: string;
  /** 'auto' (default) follows the editor or the reader's colour scheme; 'light' or 'dark' forces one. */
  readonly theme?: 'auto' | 'light' | 'dark';
  /** The webview's resource origin (VS Code's `webview.cspSource`), allowed for images and styles only. */
  readonly cspSource?: string;
}

/** Reaches beyond this many are listed in the tables but not drawn, so very large designs stay responsive. */
export const MAX_DRAWN_REACHES = 150;

/** A nonce must be base64 or base64url text; anything else is ignored (the hash is used instead). */
const NONCE_PATTERN = /^[A-Za-z0-9+/_=-]{8,200}$/;
/** A CSP source expression such as `https://*.vscode-cdn.net` or `vscode-webview://abc`: no spaces, quotes or semicolons. */
const CSP_SOURCE_PATTERN = /^[A-Za-z][A-Za-z0-9+.-]*:(\/\/)?[A-Za-z0-9*._~:/@%-]*$/;

/** The whole report as an HTML document string; see the module comment. */
export function renderReportHtml(analysis: DesignAnalysis, options: ReportHtmlOptions): string {
  const system = analysis.displayUnits;
  const flowOrder = designFlowOrder(analysis);
  const nonce = options.nonce !== undefined && NONCE_PATTERN.test(options.nonce) ? options.nonce : undefined;
  const cspSource = options.cspSource !== undefined && CSP_SOURCE_PATTERN.test(options.cspSource) ? options.cspSource : undefined;
  const styleSource = nonce !== undefined ? `'nonce-${nonce}'` : `'sha256-${stylesheetHash()}'`;
  const extraSource = cspSource !== undefined ? ` ${cspSource}` : '';
  const contentSecurityPolicy = [
    "default-src 'none'",
    `style-src ${styleSource}${extraSource}`,
    `img-src data:${extraSource}`,
    nonce !== undefined ? `script-src 'nonce-${nonce}'` : "script-src 'none'",
    "base-uri 'none'",
    "form-action 'none'",
  ].join('; ');
  const theme = options.theme ?? 'auto';
  const htmlClass = theme === 'auto' ? '' : ` class="theme-${theme}"`;
  const colorScheme = theme === 'auto' ? 'light dark' : theme;

  let sectionNumber = 0;
  let figureNumber = 0;
  const nextSection = (): number => ++sectionNumber;
  const figure = (svg: string, caption: string, className = ''): string => {
    figureNumber++;
    return `<figure${className ? ` class="${className}"` : ''}>${svg}<figcaption><span class="fig-number">Figure ${figureNumber}.</span>${escapeHtml(caption)}</figcaption></figure>`;
  };

  const body: string[] = [];
  // Title block.
  const reachCount = analysis.channels.reduce((sum, channel) => sum + channel.reaches.length, 0);
  body.push(
    `<header class="report-head"><p class="kicker">${escapeHtml(REPORT_WORDS.kicker)}</p><h1>${escapeHtml(analysis.title || options.fileName)}</h1>` +
      `<dl class="meta"><dt>${escapeHtml(REPORT_WORDS.fileLabel)}</dt><dd data-role="file-name">${escapeHtml(options.fileName)}</dd>` +
      `<dt>${escapeHtml(REPORT_WORDS.generatedLabel)}</dt><dd data-role="generated-at">${escapeHtml(formatTimestampUtc(options.generatedAt))}</dd>` +
      `<dt>${escapeHtml(REPORT_WORDS.unitsLabel)}</dt><dd>${escapeHtml(REPORT_WORDS.unitSystemNames[system] ?? String(system))}</dd></dl>`,
  );
  if (analysis.notes.length > 0) {
    body.push(`<ul class="notes" aria-label="${escapeHtml(REPORT_WORDS.notesHeading)}">${analysis.notes.map((note) => `<li>${escapeHtml(note)}</li>`).join('')}</ul>`);
  }
  body.push(`</header>`);
  body.push(`<aside class="caution" role="note" data-role="caution"><strong>${escapeHtml(REPORT_WORDS.cautionLead)}</strong> ${escapeHtml(analysis.caution)}</aside>`);
  const fromSettings = criteriaFromSettingsText(analysis);
  if (fromSettings !== null) {
    body.push(`<aside class="caution" role="note" data-role="criteria-from-settings"><strong>${escapeHtml(REPORT_WORDS.criteriaFromSettingsLead)}</strong> ${escapeHtml(fromSettings)}</aside>`);
  }

  // Summary.
  const summary = buildSummaryTable(analysis);
  body.push(`<section id="summary"><h2><span class="number">${nextSection()}</span>${escapeHtml(REPORT_WORDS.summaryHeading)}</h2>`);
  body.push(`<p class="tally">${escapeHtml(tallyText(analysis))}</p>`);
  body.push(`<div class="table-wrap"><table class="results" data-role="summary-table"><thead><tr>`);
  body.push(summary.headings.map((heading, index) => `<th scope="col"${summary.numeric[index] ? ' class="num"' : ''}>${escapeHtml(heading)}</th>`).join(''));
  body.push(`</tr></thead><tbody>`);
  for (const row of summary.rows) {
    const cells = row.cells.map((cell, index) => {
      if (index === summary.statusColumn) return `<td>${statusChip(row.status)}</td>`;
      if (index === summary.flowColumn) {
        return `<td class="name"><span class="swatch ${flowColourClass(row.flowName, flowOrder, 0)}" aria-hidden="true"></span>${escapeHtml(cell)}</td>`;
      }
      if (index === 1) return `<td class="name"><a href="#reach-${row.channelIndex}-${row.reachIndex}">${escapeHtml(cell)}</a></td>`;
      if (index === 0) return `<td class="name">${escapeHtml(cell)}</td>`;
      if (index === summary.headings.length - 1) return `<td class="finding">${escapeHtml(cell)}</td>`;
      return `<td${summary.numeric[index] ? ' class="num"' : ''}>${escapeHtml(cell)}</td>`;
    });
    body.push(`<tr class="row-${row.status}" data-status="${row.status}">${cells.join('')}</tr>`);
  }
  body.push(`</tbody></table></div></section>`);

  // Findings.
  body.push(`<section id="findings"><h2><span class="number">${nextSection()}</span>${escapeHtml(REPORT_WORDS.findingsHeading)}</h2>`);
  body.push(analysis.findings.length === 0 ? `<p class="empty">${escapeHtml(REPORT_WORDS.noFindings)}</p>` : `<ul class="findings">${analysis.findings.map(renderFinding).join('')}</ul>`);
  body.push(`</section>`);

  // Reaches the analysis had to leave out, and files with nothing to check.
  if (analysis.kind === 'library') body.push(`<p class="empty" data-role="library-note">${escapeHtml(REPORT_WORDS.libraryNote)}</p>`);
  else if (analysis.channels.length === 0) body.push(`<p class="empty">${escapeHtml(REPORT_WORDS.noChannels)}</p>`);
  const incomplete = analysis.incompleteReaches ?? [];
  if (incomplete.length > 0) {
    body.push(`<section id="incomplete"><h2><span class="number">${nextSection()}</span>${escapeHtml(REPORT_WORDS.incompleteHeading)}</h2><ul class="findings">`);
    for (const item of incomplete) {
      const line = lineText(item.location);
      body.push(
        `<li data-role="incomplete-reach"><span><span class="status status-warning">${escapeHtml(REPORT_WORDS.notAnalysedWord)}</span></span>` +
          `<span class="where">${escapeHtml([`${item.channel} › ${item.reach}`, line].filter((part) => part !== '').join(' · '))}</span>` +
          `<p class="message">${escapeHtml(item.reason)}</p></li>`,
      );
    }
    body.push(`</ul></section>`);
  }

  // Channels and reaches.
  let drawnReaches = 0;
  analysis.channels.forEach((channel, channelIndex) => {
    const number = nextSection();
    body.push(`<section class="channel" id="channel-${channelIndex}"><h2><span class="number">${number}</span>${escapeHtml(`${REPORT_WORDS.channelHeading} ${channel.name}`)}</h2>`);
    if (channel.description) body.push(`<p class="channel-description">${escapeHtml(channel.description)}</p>`);
    if (drawnReaches < MAX_DRAWN_REACHES) {
      const svg = renderLongitudinalSvg(channel, system, { id: `fig-channel-${channelIndex}-longitudinal`, flowOrder });
      const exaggeration = /data-vertical-exaggeration="([^"]*)"/.exec(svg)?.[1];
      const scaleText = exaggeration !== undefined ? `; ${DRAWING_WORDS.verticalExaggeration(exaggeration)}` : '';
      body.push(figure(svg, `${REPORT_WORDS.longitudinalCaption} of channel ${channel.name}${scaleText}.`, 'channel-figure'));
    }
    const profileSummary = buildProfileSummary(channel, system);
    if (profileSummary !== null) body.push(profileTable(profileSummary, flowOrder));
    channel.reaches.forEach((reach, reachIndex) => {
      body.push(`<article class="reach" id="reach-${channelIndex}-${reachIndex}" data-status="${reach.status}">`);
      body.push(`<h3><span class="number">${number}.${reachIndex + 1}</span>${escapeHtml(`${REPORT_WORDS.reachHeading} ${reach.name}`)} ${statusChip(reach.status)}</h3>`);
      body.push(`<div class="reach-data"><div><h4>${escapeHtml(REPORT_WORDS.reachFactsHeading)}</h4>${factsTable(buildReachFacts(reach, system))}</div>`);
      body.push(`<div><h4>${escapeHtml(REPORT_WORDS.reachFlowsHeading)}</h4>${flowTable(buildReachFlowTable(reach, system), reach.flows.map((flow, index) => flowColourClass(flow.flow, flowOrder, index)))}</div></div>`);
      if (reach.provenance.method && reach.provenance.method !== analysis.provenance.method) {
        body.push(`<p class="method-line">${escapeHtml(`${REPORT_WORDS.methodLabel}: ${reach.provenance.method}`)}</p>`);
      }
      if (drawnReaches < MAX_DRAWN_REACHES) {
        drawnReaches++;
        const idBase = `fig-reach-${channelIndex}-${reachIndex}`;
        const sectionSvg = renderCrossSectionSvg(reach, system, { id: `${idBase}-section`, flowOrder });
        const exaggeration = /data-vertical-exaggeration="([^"]*)"/.exec(sectionSvg)?.[1];
        const scaleText = exaggeration === undefined ? '' : exaggeration === '1' ? `; ${DRAWING_WORDS.equalScales}` : `; ${DRAWING_WORDS.verticalExaggeration(exaggeration)}`;
        body.push(`<div class="reach-figures">`);
        body.push(figure(sectionSvg, `${REPORT_WORDS.crossSectionCaption} of reach ${reach.name}, water surfaces at normal depth${scaleText}.`));
        body.push(figure(renderRatingCurveSvg(reach, system, { id: `${idBase}-rating`, flowOrder }), `${REPORT_WORDS.ratingCaption} of reach ${reach.name}: normal and critical depth against discharge, design flows marked.`));
        body.push(`</div>`);
      }
      body.push(`</article>`);
    });
    body.push(`</section>`);
  });
  if (reachCount > MAX_DRAWN_REACHES) body.push(`<p class="empty">${escapeHtml(REPORT_WORDS.drawingsLimited(MAX_DRAWN_REACHES, reachCount))}</p>`);

  // Basis of the results.
  const provenance = analysis.provenance;
  body.push(`<section id="basis" class="basis"><h2><span class="number">${nextSection()}</span>${escapeHtml(REPORT_WORDS.basisHeading)}</h2><dl>`);
  body.push(`<dt>${escapeHtml(REPORT_WORDS.methodLabel)}</dt><dd>${escapeHtml(provenance.method)}</dd>`);
  const assumptions = [...analysis.assumptions, ...provenance.assumptions.filter((item) => !analysis.assumptions.includes(item))];
  body.push(`<dt>${escapeHtml(REPORT_WORDS.assumptionsLabel)}</dt><dd><ul data-role="assumptions">${assumptions.map((item) => `<li>${escapeHtml(item)}</li>`).join('')}</ul></dd>`);
  if (provenance.references.length > 0) {
    body.push(`<dt>${escapeHtml(REPORT_WORDS.referencesLabel)}</dt><dd><ul>${provenance.references.map((item) => `<li>${escapeHtml(item)}</li>`).join('')}</ul></dd>`);
  }
  body.push(`</dl></section>`);
  body.push(
    `<footer class="report-foot"><p>${escapeHtml(REPORT_WORDS.footer(options.fileName, formatTimestampUtc(options.generatedAt)))}</p>` +
      `<p>${escapeHtml(analysis.caution)}</p></footer>`,
  );

  const styleNonce = nonce !== undefined ? ` nonce="${nonce}"` : '';
  return [
    '<!DOCTYPE html>',
    `<html lang="en"${htmlClass}>`,
    '<head>',
    '<meta charset="utf-8">',
    `<meta http-equiv="Content-Security-Policy" content="${escapeHtml(contentSecurityPolicy)}">`,
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<meta name="color-scheme" content="${colorScheme}">`,
    `<title>${escapeHtml(`${analysis.title || options.fileName} — design check`)}</title>`,
    `<style${styleNonce}>${REPORT_STYLESHEET}</style>`,
    '</head>',
    `<body><main class="page">${body.join('\n')}</main></body>`,
    '</html>',
    '',
  ].join('\n');
}

let cachedStylesheetHash: string | undefined;

/** The stylesheet's SHA-256 in base64, computed once (the stylesheet is a constant). */
function stylesheetHash(): string {
  cachedStylesheetHash ??= sha256Base64(REPORT_STYLESHEET);
  return cachedStylesheetHash;
}

function statusChip(status: CheckStatus): string {
  const word = STATUS_WORDS[status] ?? String(status);
  return `<span class="status status-${escapeHtml(status)}" data-role="status">${escapeHtml(word)}</span>`;
}

function renderFinding(finding: Finding): string {
  const status: CheckStatus = finding.severity === 'error' ? 'fail' : finding.severity === 'warning' ? 'warning' : 'information';
  const place = [findingPlaceText(finding), findingLineText(finding)].filter((part) => part !== '').join(' · ');
  const related = (finding.related ?? []).map((item) => `<p class="related">${escapeHtml(item.message)}</p>`).join('');
  return (
    `<li data-code="${escapeHtml(finding.code)}" data-severity="${escapeHtml(finding.severity)}">` +
    `<span><span class="status status-${status}">${escapeHtml(SEVERITY_WORDS[finding.severity] ?? String(finding.severity))}</span></span>` +
    `<span class="where">${escapeHtml(place)}</span><p class="message">${escapeHtml(finding.message)}</p>${related}</li>`
  );
}

function factsTable(table: TextTable): string {
  const rows = table.rows.map(([label, value]) => `<tr><th scope="row">${escapeHtml(label ?? '')}</th><td>${escapeHtml(value ?? '')}</td></tr>`).join('');
  return `<table class="facts"><tbody>${rows}</tbody></table>`;
}

function profileTable(summary: ProfileSummary, flowOrder: readonly string[]): string {
  const head = summary.headings.map((heading, index) => `<th scope="col"${summary.numeric[index] ? ' class="num"' : ''}>${escapeHtml(heading)}</th>`).join('');
  const rows = summary.rows
    .map((row, rowIndex) => {
      const flowName = summary.rowFlows[rowIndex] ?? '';
      const cells = row.map((cell, index) =>
        index === 0
          ? `<td class="name"><span class="swatch ${flowColourClass(flowName, flowOrder, 0)}" aria-hidden="true"></span>${escapeHtml(cell)}</td>`
          : `<td${summary.numeric[index] ? ' class="num"' : index === 1 ? ' class="name"' : ''}>${escapeHtml(cell)}</td>`,
      );
      return `<tr>${cells.join('')}</tr>`;
    })
    .join('');
  const notes = summary.notes.length === 0 ? '' : `<ul class="flow-notes" data-role="profile-notes">${summary.notes.map((note) => `<li>${escapeHtml(note)}</li>`).join('')}</ul>`;
  return (
    `<div class="profile-summary"><h3>${escapeHtml(REPORT_WORDS.profileHeading)}</h3><p class="channel-description">${escapeHtml(REPORT_WORDS.profileIntro)}</p>` +
    `<div class="table-wrap"><table class="results" data-role="profile-table"><thead><tr>${head}</tr></thead><tbody>${rows}</tbody></table></div>${notes}</div>`
  );
}

function flowTable(table: ReachFlowTable, flowClasses: readonly string[]): string {
  const head = table.headings
    .map((heading, index) => {
      const swatch = index >= 2 ? `<span class="swatch ${flowClasses[index - 2] ?? ''}" aria-hidden="true"></span>` : '';
      return `<th scope="col"${table.numeric[index] ? ' class="num"' : ''}>${swatch}${escapeHtml(heading)}</th>`;
    })
    .join('');
  const rows = table.rows
    .map((row) => `<tr>${row.map((cell, index) => (index === 0 ? `<th scope="row">${escapeHtml(cell)}</th>` : `<td${table.numeric[index] ? ' class="num"' : ''}>${escapeHtml(cell)}</td>`)).join('')}</tr>`)
    .join('');
  const notes = table.notes.length === 0 ? '' : `<ul class="flow-notes">${table.notes.map((note) => `<li>${escapeHtml(`${note.flow}: ${note.note}`)}</li>`).join('')}</ul>`;
  return `<div class="table-wrap"><table class="flow-results"><thead><tr>${head}</tr></thead><tbody>${rows}</tbody></table></div>${notes}`;
}
