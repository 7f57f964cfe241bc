/**
 * Runnel's custom messages between the language server and its clients, typed once and imported by both sides
 * (server/ and extension/). Plain data only: no imports, so either bundle can include it.
 */

/** The configuration section the server reads through workspace/configuration (`runnel.*` settings). */
export const SETTINGS_SECTION = 'runnel';

/** Request: render the live report of a document as one self-contained HTML page. */
export const RENDER_REPORT_REQUEST = 'runnel/renderReport';
export interface RenderReportParams {
  /** Document URI as the client knows it. */
  readonly uri: string;
  /** Nonce for the Content-Security-Policy of a webview; omitted for a standalone export. */
  readonly nonce?: string;
  /** The webview's CSP source (e.g. `vscode-webview://...`), when rendered for a webview. */
  readonly cspSource?: string;
}
export interface RenderReportResult {
  /** The HTML page, or null when the document is unknown to the server. */
  readonly html: string | null;
  /** The document version the report was computed from. */
  readonly version: number | null;
}

/** Request: the results table of a document as Markdown (for "copy results table"). */
export const RESULTS_MARKDOWN_REQUEST = 'runnel/resultsMarkdown';
export interface ResultsMarkdownParams {
  readonly uri: string;
}
export interface ResultsMarkdownResult {
  readonly markdown: string | null;
}

/** Request: compare a design file with its last committed version (git through the command line). */
export const COMPARE_WITH_LAST_COMMIT_REQUEST = 'runnel/compareWithLastCommit';
export interface CompareWithLastCommitParams {
  readonly uri: string;
}
export interface CompareWithLastCommitResult {
  /** The comparison as Markdown, or null with `problem` saying why (e.g. the file is not in a git repository). */
  readonly markdown: string | null;
  readonly problem: string | null;
}

/** Notification from the server: the analysis of a document changed (the report panel re-renders). */
export const ANALYSIS_CHANGED_NOTIFICATION = 'runnel/analysisChanged';
export interface AnalysisChangedParams {
  readonly uri: string;
  readonly version: number;
}

/** Messages from the report webview to the extension. */
export type ReportWebviewMessage =
  | { readonly type: 'ready' }
  | { readonly type: 'scrolled'; readonly scrollY: number };

/**
 * Messages from the extension to the report webview. A live update sends the whole new page; the webview's own
 * nonce-bearing script swaps the body in place so the reader keeps their scroll position.
 */
export type ReportHostMessage =
  | { readonly type: 'replacePage'; readonly html: string }
  | { readonly type: 'restoreScroll'; readonly scrollY: number };
