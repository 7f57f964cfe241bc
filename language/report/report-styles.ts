/**
 * The report's one stylesheet. Colours are CSS variables with a light and a dark set of our own; inside a VS Code
 * webview the page follows the editor (body classes vscode-light / vscode-dark / vscode-high-contrast and the
 * --vscode-* variables, with our values as fallbacks); as a standalone file it follows the reader's
 * prefers-color-scheme unless a theme is forced; printed it is always black on white.
 */

type Palette = Readonly<Record<string, string>>;

const LIGHT: Palette = {
  '--rn-paper': '#ffffff',
  '--rn-ink': '#1d232b',
  '--rn-muted': '#5b6571',
  '--rn-rule': '#d3d8de',
  '--rn-rule-strong': '#8e98a4',
  '--rn-panel': '#f4f6f8',
  '--rn-grid': '#eceff2',
  '--rn-section': '#2a2f36',
  '--rn-ground-hatch': '#b6a47f',
  '--rn-ground-fill': '#efe8da',
  '--rn-water-fill': 'rgba(52, 122, 196, 0.17)',
  '--rn-bank': '#7c5d2c',
  '--rn-limit': '#c0392b',
  '--rn-critical': '#8a4f9e',
  '--rn-pass': '#1f6f3b',
  '--rn-pass-bg': '#e4f2e8',
  '--rn-note': '#2d5c8c',
  '--rn-note-bg': '#e6eef7',
  '--rn-warn': '#875400',
  '--rn-warn-bg': '#fbf0d6',
  '--rn-fail': '#b42318',
  '--rn-fail-bg': '#fbe5e2',
  '--rn-caution-bg': '#fff7e5',
  '--rn-caution-rule': '#cf8a00',
  '--rn-flow-0': '#1f5fae',
  '--rn-flow-1': '#c2561a',
  '--rn-flow-2': '#23806a',
  '--rn-flow-3': '#7345ab',
  '--rn-flow-4': '#a8326b',
  '--rn-flow-5': '#5a6a1c',
};

const DARK: Palette = {
  '--rn-paper': '#1b1f24',
  '--rn-ink': '#e3e7eb',
  '--rn-muted': '#9ba5b0',
  '--rn-rule': '#39414a',
  '--rn-rule-strong': '#6c7783',
  '--rn-panel': '#242a31',
  '--rn-grid': '#2a3037',
  '--rn-section': '#d3d8de',
  '--rn-ground-hatch': '#6f6247',
  '--rn-ground-fill': '#2f2b24',
  '--rn-water-fill': 'rgba(96, 165, 235, 0.22)',
  '--rn-bank': '#c9a46a',
  '--rn-limit': '#ff7b6b',
  '--rn-critical': '#c79be0',
  '--rn-pass': '#7fd39b',
  '--rn-pass-bg': 'rgba(64, 160, 96, 0.18)',
  '--rn-note': '#93bfea',
  '--rn-note-bg': 'rgba(84, 140, 210, 0.18)',
  '--rn-warn': '#f1bd5e',
  '--rn-warn-bg': 'rgba(220, 160, 40, 0.18)',
  '--rn-fail': '#ff8f80',
  '--rn-fail-bg': 'rgba(220, 70, 60, 0.2)',
  '--rn-caution-bg': 'rgba(207, 138, 0, 0.12)',
  '--rn-caution-rule': '#d9a441',
  '--rn-flow-0': '#6eaaf2',
  '--rn-flow-1': '#f0975c',
  '--rn-flow-2': '#5fcaa8',
  '--rn-flow-3': '#b692f2',
  '--rn-flow-4': '#ef82b6',
  '--rn-flow-5': '#b9c75e',
};

/** Print: black ink on white paper whatever the screen theme (declarations marked important to win). */
const PRINT: Palette = { ...LIGHT, '--c-paper': '#ffffff', '--c-ink': '#000000', '--c-muted': '#454c55', '--c-rule': '#b9c0c8', '--c-rule-strong': '#59616b' };

function declarations(palette: Palette, important = false): string {
  return Object.entries(palette)
    .map(([name, value]) => `${name}: ${value}${important ? ' !important' : ''};`)
    .join(' ');
}

const FLOW_CLASSES = [0, 1, 2, 3, 4, 5].map((index) => `.flow-${index} { --flow: var(--rn-flow-${index}); }`).join('\n');

/** The stylesheet text (identical for every report, so its hash can stand in the Content-Security-Policy). */
export const REPORT_STYLESHEET = `
body { ${declarations(LIGHT)} }
@media (prefers-color-scheme: dark) {
  html:not(.theme-light) body:not(.vscode-light):not(.vscode-high-contrast-light) { ${declarations(DARK)} }
}
html.theme-dark body, body.vscode-dark, body.vscode-high-contrast:not(.vscode-high-contrast-light) { ${declarations(DARK)} }
body {
  --c-paper: var(--vscode-editor-background, var(--rn-paper));
  --c-ink: var(--vscode-editor-foreground, var(--rn-ink));
  --c-muted: var(--vscode-descriptionForeground, var(--rn-muted));
  --c-rule: var(--vscode-panel-border, var(--rn-rule));
  --c-rule-strong: var(--vscode-contrastBorder, var(--rn-rule-strong));
  --c-panel: var(--vscode-textBlockQuote-background, var(--rn-panel));
  --c-link: var(--vscode-textLink-foreground, var(--rn-flow-0));
  margin: 0; background: var(--c-paper); color: var(--c-ink);
  font-family: var(--vscode-font-family, system-ui, -apple-system, "Segoe UI", "Helvetica Neue", Arial, sans-serif);
  font-size: 13.5px; line-height: 1.45;
}
${FLOW_CLASSES}
.page { max-width: 1540px; margin: 0 auto; padding: 26px 30px 48px; }
a { color: var(--c-link); text-decoration: none; }
a:hover { text-decoration: underline; }
.report-head { border-bottom: 3px double var(--c-rule-strong); padding-bottom: 14px; margin-bottom: 16px; }
.kicker { margin: 0 0 4px; font-size: 11.5px; letter-spacing: 0.12em; text-transform: uppercase; color: var(--c-muted); }
h1 { margin: 0 0 12px; font-size: 25px; font-weight: 650; line-height: 1.2; overflow-wrap: anywhere; }
.meta { display: grid; grid-template-columns: max-content 1fr; gap: 2px 16px; margin: 0; font-size: 12.5px; }
.meta dt { color: var(--c-muted); }
.meta dd { margin: 0; overflow-wrap: anywhere; }
.caution { margin: 14px 0 6px; padding: 10px 14px; border-left: 4px solid var(--rn-caution-rule); background: var(--rn-caution-bg); }
.caution strong { margin-right: 4px; }
.notes { margin: 12px 0 0; padding-left: 20px; }
h2 { margin: 34px 0 12px; padding-top: 8px; border-top: 2px solid var(--c-ink); font-size: 18px; font-weight: 650; }
h2 .number, h3 .number { color: var(--c-muted); font-weight: 500; margin-right: 8px; font-variant-numeric: tabular-nums; }
h3 { margin: 0 0 10px; font-size: 15.5px; font-weight: 650; overflow-wrap: anywhere; }
h4 { margin: 14px 0 6px; font-size: 12.5px; font-weight: 650; text-transform: uppercase; letter-spacing: 0.06em; color: var(--c-muted); }
.tally { margin: 0 0 10px; color: var(--c-muted); }
.table-wrap { overflow-x: auto; }
table { border-collapse: collapse; width: 100%; font-size: 12.5px; font-variant-numeric: tabular-nums; }
th { text-align: left; vertical-align: bottom; font-weight: 600; padding: 5px 8px; border-bottom: 1.5px solid var(--c-rule-strong); }
td { vertical-align: top; padding: 4px 8px; border-bottom: 1px solid var(--c-rule); overflow-wrap: break-word; }
tbody th { vertical-align: top; font-weight: 500; border-bottom: 1px solid var(--c-rule); }
th.num { text-align: right; }
td.num { text-align: right; white-space: nowrap; }
td.name { white-space: nowrap; }
td.finding { min-width: 14em; width: 34%; }
table.results { font-size: 12px; }
table.results td, table.results th { padding: 4px 6px; }
tbody tr:nth-child(even) td, tbody tr:nth-child(even) th { background: color-mix(in srgb, var(--c-panel) 55%, transparent); }
tr.row-fail td:first-child { box-shadow: inset 3px 0 var(--rn-fail); }
tr.row-warning td:first-child { box-shadow: inset 3px 0 var(--rn-warn); }
table.facts { width: auto; min-width: 60%; }
table.facts th[scope="row"] { color: var(--c-muted); white-space: nowrap; }
.flow-notes { margin: 6px 0 0; padding-left: 18px; font-size: 12px; color: var(--c-muted); }
.status { display: inline-block; padding: 0 7px; border: 1px solid currentColor; border-radius: 3px; font-size: 11.5px; font-weight: 650; white-space: nowrap; }
.status-pass { color: var(--rn-pass); background: var(--rn-pass-bg); }
.status-information { color: var(--rn-note); background: var(--rn-note-bg); }
.status-warning { color: var(--rn-warn); background: var(--rn-warn-bg); }
.status-fail { color: var(--rn-fail); background: var(--rn-fail-bg); }
.swatch { display: inline-block; width: 10px; height: 10px; margin-right: 6px; border-radius: 2px; background: var(--flow); vertical-align: baseline; }
.findings { list-style: none; margin: 0; padding: 0; }
.findings li { display: grid; grid-template-columns: 118px 1fr; gap: 2px 12px; padding: 7px 0; border-bottom: 1px solid var(--c-rule); }
.findings .where { color: var(--c-muted); font-size: 12px; overflow-wrap: anywhere; }
.findings .message { grid-column: 2; margin: 0; overflow-wrap: anywhere; }
.findings .related { grid-column: 2; margin: 0; color: var(--c-muted); font-size: 12px; }
.empty { color: var(--c-muted); font-style: italic; }
.channel-figure { margin: 6px 0 18px; }
.channel-description { margin: -4px 0 10px; color: var(--c-muted); }
.reach { margin-top: 24px; padding-top: 14px; border-top: 1px solid var(--c-rule); }
.reach-data { display: grid; grid-template-columns: minmax(0, 1fr); gap: 4px 28px; }
.reach-figures { display: grid; grid-template-columns: repeat(auto-fit, minmax(min(100%, 620px), 1fr)); gap: 16px; margin-top: 14px; }
@media (min-width: 1000px) {
  .reach-data { grid-template-columns: minmax(0, 5fr) minmax(0, 7fr); }
}
.method-line { margin: 8px 0 0; color: var(--c-muted); font-size: 12px; }
figure { margin: 0; padding: 10px 10px 6px; border: 1px solid var(--c-rule); border-radius: 2px; break-inside: avoid; }
figcaption { margin-top: 4px; font-size: 12px; color: var(--c-muted); }
figcaption .fig-number { color: var(--c-ink); font-weight: 600; margin-right: 4px; }
svg.fig { display: block; width: 100%; max-width: 780px; height: auto; margin: 0 auto; overflow: visible; }
svg.fig-longitudinal { max-width: 1100px; }
.fig text { fill: var(--c-ink); font-size: 11px; font-family: inherit; }
.fig .fig-tick-label { fill: var(--c-muted); font-size: 10.5px; }
.fig .fig-note { fill: var(--c-muted); font-size: 10.5px; font-style: italic; }
.fig .fig-label { font-size: 11px; }
.fig .label-flow { fill: var(--flow); font-weight: 600; }
.fig .label-flow tspan[data-role] { font-weight: 500; }
.fig .label-limit { fill: var(--rn-limit); }
.fig .label-bank { fill: var(--rn-bank); }
.fig .label-note { fill: var(--c-muted); font-style: italic; }
.fig-grid { stroke: var(--rn-grid); stroke-width: 1; }
.fig-tick, .fig-axis-line { stroke: var(--c-muted); stroke-width: 1; fill: none; }
.fig-frame { fill: none; stroke: var(--c-rule); }
.ground { stroke: none; }
.ground-hatch { stroke: var(--rn-ground-hatch); stroke-width: 1.3; }
.section-line { fill: none; stroke: var(--rn-section); stroke-width: 2.4; stroke-linejoin: round; stroke-linecap: round; }
.conduit-wall { stroke-width: 3.2; }
.section-extension { fill: none; stroke: var(--rn-section); stroke-width: 1.2; stroke-dasharray: 3 3; }
.water-fill { fill: var(--rn-water-fill); stroke: none; }
.water-line { stroke: var(--flow); stroke-width: 2; }
.water-mark { fill: var(--flow); }
.bank-top, .bank-top-line { stroke: var(--rn-bank); stroke-width: 1.3; stroke-dasharray: 6 4; fill: none; }
.freeboard-limit { stroke: var(--rn-limit); stroke-width: 1.5; stroke-dasharray: 10 3 2 3; }
.leader { fill: none; stroke: var(--c-muted); stroke-width: 0.8; }
.dimension line { stroke: var(--c-ink); stroke-width: 0.9; }
.curve { fill: none; stroke-width: 2.2; stroke-linejoin: round; }
.normal-curve { stroke: var(--c-ink); }
.critical-curve { stroke: var(--rn-critical); stroke-dasharray: 7 4; }
.design-guide { stroke: var(--flow); stroke-width: 1; stroke-dasharray: 2 3; }
.design-point { fill: var(--flow); stroke: var(--c-paper); stroke-width: 1.5; }
.critical-point { fill: var(--c-paper); stroke: var(--flow); stroke-width: 1.6; }
.fig .design-flow-label, .fig [data-role="design-flow-label"] { fill: var(--flow); font-weight: 600; }
.bed-line { fill: none; stroke: var(--rn-section); stroke-width: 2.4; stroke-linejoin: round; }
.bed-fill { fill: var(--rn-ground-fill); stroke: none; }
.normal-line { fill: none; stroke: var(--flow); stroke-width: 1.9; }
.critical-line { fill: none; stroke: var(--flow); stroke-width: 1.2; stroke-dasharray: 5 4; }
.profile-line { fill: none; stroke: var(--flow, var(--c-ink)); stroke-width: 2.8; stroke-linejoin: round; }
.jump-mark path, .jump-legend { fill: none; stroke: var(--flow, var(--c-ink)); stroke-width: 2; }
.jump-mark text { fill: var(--flow); font-weight: 600; }
.reach-boundary { stroke: var(--c-rule-strong); stroke-width: 1; stroke-dasharray: 2 3; }
.fig .reach-name { fill: var(--c-muted); }
.outlet-mark, .outlet-level { fill: none; stroke: var(--c-ink); stroke-width: 1.5; }
.basis dd { margin: 0 0 10px; }
.basis dt { font-weight: 650; }
.basis ul { margin: 4px 0 0; padding-left: 20px; }
.report-foot { margin-top: 36px; padding-top: 10px; border-top: 1px solid var(--c-rule); color: var(--c-muted); font-size: 12px; }
@media print {
  html body, html body[class] { ${declarations(PRINT, true)} }
  body { font-size: 10pt; background: #ffffff; color: #000000; }
  .page { max-width: none; padding: 0; }
  h2 { break-after: avoid; }
  h3, h4 { break-after: avoid; }
  .reach { break-inside: auto; }
  figure, table.facts, .caution, .findings li { break-inside: avoid; }
  tr { break-inside: avoid; }
  thead { display: table-header-group; }
  .table-wrap { overflow: visible; }
  .reach-figures { grid-template-columns: minmax(0, 1fr); }
  svg.fig { max-width: 165mm; }
  a { color: inherit; }
  .status, .caution, .swatch { print-color-adjust: exact; -webkit-print-color-adjust: exact; }
}
@page { margin: 14mm 12mm; }
`.trim();
