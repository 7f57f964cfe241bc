/**
 * The names the extension shares with its manifest (package.json): command ids, the language id, the report's
 * webview type and the settings section. One home for each, so the manifest test can compare both sides.
 * Plain data: no `vscode` import, so tests can load this file.
 */

/** The language id of `.runnel` design files (package.json `contributes.languages`). */
export const LANGUAGE_ID = 'runnel';

/** The settings section the language server reads through `workspace/configuration` (typed in server/protocol.ts). */
export { SETTINGS_SECTION } from '../server/protocol.js';

/** The webview type of the report panel; restoring panels after a reload needs `onWebviewPanel:<this>`. */
export const REPORT_VIEW_TYPE = 'runnel.report';

/** URI scheme of the read-only "compared with the last commit" Markdown documents. */
export const COMPARISON_SCHEME = 'runnel-comparison';

/** Every command the extension registers; each must be contributed in package.json and the other way round. */
export const COMMAND_IDS = {
  openReportToSide: 'runnel.openReportToSide',
  exportReportAsHtml: 'runnel.exportReportAsHtml',
  copyResultsTableAsMarkdown: 'runnel.copyResultsTableAsMarkdown',
  compareWithLastCommit: 'runnel.compareWithLastCommit',
  restartLanguageServer: 'runnel.restartLanguageServer',
  showOutput: 'runnel.showOutput',
} as const;

export type CommandId = (typeof COMMAND_IDS)[keyof typeof COMMAND_IDS];

/** Name of the output channel that carries the extension's and the server's status and errors. */
export const OUTPUT_CHANNEL_NAME = 'Runnel';

/** Bundled language server, relative to the extension's folder (.scripts/build.mjs writes it). */
export const SERVER_BUNDLE_PATH = 'dist/server.cjs';
