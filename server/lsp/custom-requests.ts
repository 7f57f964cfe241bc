/**
 * Runnel's own messages (server/protocol.ts): the live report as HTML, the results table as Markdown, the
 * comparison with the last commit, and the notification that a document's analysis changed (the report panel
 * re-renders on it). Each handler reads the document version's one analysis, is contained (an internal error is
 * logged and answered with an empty result) and honours cancellation.
 */
import { DocumentState, URI, type LangiumDocument } from 'langium';
import type { LangiumSharedServices } from 'langium/lsp';
import { CancellationToken, type Connection } from 'vscode-languageserver';
import type { DesignAnalysis } from '../../language/analysis/model.js';
import { renderReportHtml } from '../../language/report/report-html.js';
import { renderResultsTableMarkdown } from '../../language/report/report-markdown.js';
import {
  ANALYSIS_CHANGED_NOTIFICATION,
  COMPARE_WITH_LAST_COMMIT_REQUEST,
  RENDER_REPORT_REQUEST,
  RESULTS_MARKDOWN_REQUEST,
  type AnalysisChangedParams,
  type CompareWithLastCommitParams,
  type CompareWithLastCommitResult,
  type RenderReportParams,
  type RenderReportResult,
  type ResultsMarkdownParams,
  type ResultsMarkdownResult,
} from '../protocol.js';
import { compareWithLastCommit } from './compare-with-last-commit.js';
import { displaySystemFor, type DocumentAnalyses } from './document-analysis.js';
import { contained, type ServerLog } from './error-containment.js';
import type { RunnelSettings } from './runnel-settings.js';

export function registerCustomRequests(connection: Connection, shared: LangiumSharedServices, analyses: DocumentAnalyses, settings: RunnelSettings, log: ServerLog): void {
  const documents = shared.workspace.LangiumDocuments;
  const textDocuments = shared.workspace.TextDocuments;
  const builder = shared.workspace.DocumentBuilder;
  const lock = shared.workspace.WorkspaceLock;

  /** The document, linked (and validated when open), or undefined when the server does not know it. */
  const builtDocument = async (uriText: string, token: CancellationToken): Promise<LangiumDocument | undefined> => {
    const uri = URI.parse(uriText);
    await shared.workspace.WorkspaceManager.ready;
    if (!documents.hasDocument(uri)) {
      if (textDocuments.get(uriText) === undefined) return undefined;
      // Just opened: its first build is on its way.
      await builder.waitUntil(DocumentState.Linked, token);
      if (!documents.hasDocument(uri)) return undefined;
    }
    const open = textDocuments.get(uriText) !== undefined;
    await builder.waitUntil(open ? DocumentState.Validated : DocumentState.Linked, uri, token);
    return documents.getDocument(uri);
  };

  /** The analysis as the report shows it: in the units the setting asks for. */
  const reportAnalysis = async (document: LangiumDocument): Promise<DesignAnalysis> => {
    const analysis = analyses.of(document);
    const system = displaySystemFor(analysis, await settings.current(document.uri.toString()));
    return system === analysis.displayUnits ? analysis : { ...analysis, displayUnits: system };
  };

  connection.onRequest(RENDER_REPORT_REQUEST, (params: RenderReportParams, token: CancellationToken) =>
    contained<RenderReportResult>(log, 'rendering the report', { html: null, version: null }, async () => {
      const document = await builtDocument(params.uri, token);
      if (document === undefined) return { html: null, version: null };
      const analysis = await lock.read(() => reportAnalysis(document));
      const html = renderReportHtml(analysis, {
        generatedAt: new Date(),
        fileName: fileNameOf(params.uri),
        ...(params.nonce === undefined ? {} : { nonce: params.nonce }),
        ...(params.cspSource === undefined ? {} : { cspSource: params.cspSource }),
      });
      return { html, version: analysis.version };
    }),
  );

  connection.onRequest(RESULTS_MARKDOWN_REQUEST, (params: ResultsMarkdownParams, token: CancellationToken) =>
    contained<ResultsMarkdownResult>(log, 'writing the results table', { markdown: null }, async () => {
      const document = await builtDocument(params.uri, token);
      if (document === undefined) return { markdown: null };
      const analysis = await lock.read(() => reportAnalysis(document));
      return { markdown: renderResultsTableMarkdown(analysis) };
    }),
  );

  connection.onRequest(COMPARE_WITH_LAST_COMMIT_REQUEST, (params: CompareWithLastCommitParams, token: CancellationToken) =>
    contained<CompareWithLastCommitResult>(
      log,
      'comparing with the last commit',
      { markdown: null, problem: 'Runnel could not compare this file (an internal error; see the Runnel output).' },
      async () => {
        await builtDocument(params.uri, token);
        return compareWithLastCommit(params.uri, documents, analyses.criteriaDefaultsFor(params.uri));
      },
    ),
  );

  // A new analysis for every validated document version (open documents, and designs rebuilt because a shared
  // linings file changed).
  builder.onDocumentPhase(DocumentState.Validated, (document) => {
    const notification: AnalysisChangedParams = { uri: document.uri.toString(), version: document.textDocument.version };
    void connection.sendNotification(ANALYSIS_CHANGED_NOTIFICATION, notification);
  });

  // Changed display units change what the report shows: tell the report panels of open documents.
  let lastUnits: string | undefined;
  settings.onDidChange((snapshot) => {
    const units = JSON.stringify([snapshot.window.displayUnits, [...snapshot.folders].map(([folder, folderSettings]) => [folder, folderSettings.displayUnits])]);
    if (lastUnits !== undefined && lastUnits === units) return;
    lastUnits = units;
    for (const textDocument of textDocuments.all()) {
      void connection.sendNotification(ANALYSIS_CHANGED_NOTIFICATION, { uri: textDocument.uri, version: textDocument.version } satisfies AnalysisChangedParams);
    }
  });
}

function fileNameOf(uri: string): string {
  const path = URI.parse(uri).path;
  return decodeURIComponent(path.split('/').pop() ?? uri);
}
