/**
 * The names the extension shares with its manifest (package.json): command ids, the language id, the report's
 * webview type and the settings section. One home for each, so the manifest test can compare both sides.
 * Plain data: no `vscode` import, so tests can load this file.
 */
import { SERVER_BUNDLE_FILE } from '../.scripts/bundle-options.mjs';

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

/**
 * The language server as the client starts it, relative to the extension's folder (.scripts/build.mjs writes it): a
 * launcher that runs the server's bundle through V8's code cache (server/code-cache.ts).
 */
export const SERVER_BUNDLE_PATH = 'dist/server.cjs';

/**
 * The server's bundle itself, which the debug launch starts: the inspector then sees an ordinary file, and the
 * debug flags (--nolazy) would not match the cache's anyway.
 */
export const SERVER_DEBUG_BUNDLE_PATH = `dist/${SERVER_BUNDLE_FILE}`;
