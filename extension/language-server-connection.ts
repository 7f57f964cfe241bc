/**
 * Starts the bundled Runnel language server (dist/server.cjs, Node IPC; the bundle itself when debugging) and
 * carries Runnel's own requests to it.
 * What the user sees: diagnostics, hints, hover and the rest come from the server through the language client;
 * the language status item says whether the server runs; every start, stop and failure is logged to the "Runnel"
 * output channel, which never steals focus. Starting never blocks activation: commands wait for the server.
 */
import { existsSync } from 'node:fs';
import * as vscode from 'vscode';
import {
  LanguageClient,
  NotificationType,
  RequestType,
  RevealOutputChannelOn,
  State,
  TransportKind,
  type LanguageClientOptions,
  type ServerOptions,
} from 'vscode-languageclient/node';
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
} from '../server/protocol.js';
import { COMMAND_IDS, LANGUAGE_ID, SERVER_BUNDLE_PATH, SERVER_DEBUG_BUNDLE_PATH } from './identifiers.js';

const RENDER_REPORT = new RequestType<RenderReportParams, RenderReportResult, void>(RENDER_REPORT_REQUEST);
const RESULTS_MARKDOWN = new RequestType<ResultsMarkdownParams, ResultsMarkdownResult, void>(RESULTS_MARKDOWN_REQUEST);
const COMPARE_WITH_LAST_COMMIT = new RequestType<CompareWithLastCommitParams, CompareWithLastCommitResult, void>(
  COMPARE_WITH_LAST_COMMIT_REQUEST,
);
const ANALYSIS_CHANGED = new NotificationType<AnalysisChangedParams>(ANALYSIS_CHANGED_NOTIFICATION);

/**
 * How long a command waits for one of Runnel's requests before giving up, ms. A report of a large design renders
 * well under a second; a git comparison reads two revisions. Past this the request is cancelled and logged.
 */
const REQUEST_TIMEOUT_MS = 30_000;

/** Port of the Node inspector when the extension itself runs under a debugger (extension development host). */
const SERVER_INSPECTOR_PORT = 6019;

/** A document's new analysis, with the URI converted back to the editor's form. */
export interface AnalysisChange {
  readonly uri: vscode.Uri;
  readonly version: number;
}

export class LanguageServerConnection implements vscode.Disposable {
  private client: LanguageClient | undefined;
  private starting: Promise<LanguageClient> | undefined;
  private readonly analysisChanged = new vscode.EventEmitter<AnalysisChange>();
  private readonly statusItem: vscode.LanguageStatusItem;
  private readonly disposables: vscode.Disposable[] = [];

  /** Fires when the server has a new analysis of a document (the report panel re-renders). */
  readonly onDidChangeAnalysis = this.analysisChanged.event;

  constructor(
    private readonly context: vscode.ExtensionContext,
    private readonly output: vscode.LogOutputChannel,
  ) {
    this.statusItem = vscode.languages.createLanguageStatusItem('runnel.languageServer', { language: LANGUAGE_ID });
    this.statusItem.name = 'Runnel language server';
    this.statusItem.command = { title: 'Show Output', command: COMMAND_IDS.showOutput };
    this.showStatus('starting');
    this.disposables.push(this.analysisChanged, this.statusItem);
  }

  /** Starts the server in the background; failures are logged and shown in the language status item. */
  start(): void {
    this.ensureStarted().catch(() => {
      // Already logged by ensureStarted; commands report their own failure when they need the server.
    });
  }

  /** Stops and starts the server again (command "Restart Language Server"). */
  async restart(): Promise<void> {
    this.output.info('Restarting the language server.');
    const previous = this.client;
    this.client = undefined;
    this.starting = undefined;
    if (previous !== undefined) await stopQuietly(previous, this.output);
    await this.ensureStarted();
  }

  /** Renders the report page of a document; pass a nonce and the webview's CSP source for a panel, none to export. */
  async renderReport(documentUri: vscode.Uri, webview?: { nonce: string; cspSource: string }): Promise<RenderReportResult> {
    const client = await this.ensureStarted();
    const params: RenderReportParams = {
      uri: client.code2ProtocolConverter.asUri(documentUri),
      ...(webview === undefined ? {} : { nonce: webview.nonce, cspSource: webview.cspSource }),
    };
    return this.sendWithTimeout(client, 'render the report', (token) => client.sendRequest(RENDER_REPORT, params, token));
  }

  async resultsMarkdown(documentUri: vscode.Uri): Promise<ResultsMarkdownResult> {
    const client = await this.ensureStarted();
    const params: ResultsMarkdownParams = { uri: client.code2ProtocolConverter.asUri(documentUri) };
    return this.sendWithTimeout(client, 'produce the results table', (token) => client.sendRequest(RESULTS_MARKDOWN, params, token));
  }

  async compareWithLastCommit(documentUri: vscode.Uri): Promise<CompareWithLastCommitResult> {
    const client = await this.ensureStarted();
    const params: CompareWithLastCommitParams = { uri: client.code2ProtocolConverter.asUri(documentUri) };
    return this.sendWithTimeout(client, 'compare with the last commit', (token) =>
      client.sendRequest(COMPARE_WITH_LAST_COMMIT, params, token),
    );
  }

  /** Stops the server; awaited by `deactivate` so the child process ends with the extension. */
  async stop(): Promise<void> {
    const client = this.client;
    this.client = undefined;
    this.starting = undefined;
    if (client !== undefined) await stopQuietly(client, this.output);
  }

  dispose(): void {
    void this.stop();
    for (const disposable of this.disposables) disposable.dispose();
  }

  private ensureStarted(): Promise<LanguageClient> {
    this.starting ??= this.startClient().catch((error: unknown) => {
      this.starting = undefined;
      this.showStatus('failed');
      this.output.error(`The language server did not start: ${describeError(error)}`);
      throw new Error('The Runnel language server is not running (see the "Runnel" output for why).');
    });
    return this.starting;
  }

  private async startClient(): Promise<LanguageClient> {
    const serverModule = this.context.asAbsolutePath(SERVER_BUNDLE_PATH);
    if (!existsSync(serverModule)) {
      throw new Error(`${serverModule} is missing; this installation of the extension is incomplete (build it with "npm run build").`);
    }
    const serverOptions: ServerOptions = {
      run: { module: serverModule, transport: TransportKind.ipc },
      debug: {
        module: this.context.asAbsolutePath(SERVER_DEBUG_BUNDLE_PATH),
        transport: TransportKind.ipc,
        options: { execArgv: ['--nolazy', `--inspect=${SERVER_INSPECTOR_PORT}`] },
      },
    };
    const clientOptions: LanguageClientOptions = {
      // Every scheme: files on disk, unsaved (untitled) designs and files of virtual workspaces.
      documentSelector: [{ language: LANGUAGE_ID }],
      // A shared file of linings that changes on disk re-analyses the designs that use it.
      synchronize: { fileEvents: vscode.workspace.createFileSystemWatcher('**/*.runnel') },
      outputChannel: this.output,
      revealOutputChannelOn: RevealOutputChannelOn.Never,
      // Hovers and messages from the server are plain Markdown: no command links, no raw HTML.
      markdown: { isTrusted: false, supportHtml: false },
      initializationFailedHandler: (error) => {
        this.output.error(`The language server failed to initialise: ${describeError(error)}`);
        return false;
      },
    };
    const client = new LanguageClient(LANGUAGE_ID, 'Runnel language server', serverOptions, clientOptions);
    this.client = client;
    client.onDidChangeState((event) => {
      if (this.client !== client) return;
      if (event.newState === State.Running) this.showStatus('running');
      else if (event.newState === State.Starting) this.showStatus('starting');
      else this.showStatus('stopped');
    });
    client.onNotification(ANALYSIS_CHANGED, (params) => {
      this.analysisChanged.fire({ uri: client.protocol2CodeConverter.asUri(params.uri), version: params.version });
    });
    this.output.info(`Starting the language server ${serverModule}.`);
    this.showStatus('starting');
    try {
      await client.start();
    } catch (error) {
      if (this.client === client) this.client = undefined;
      await stopQuietly(client, this.output);
      throw error;
    }
    this.output.info('The language server is running.');
    return client;
  }

  private async sendWithTimeout<T>(
    client: LanguageClient,
    what: string,
    send: (token: vscode.CancellationToken) => Promise<T>,
  ): Promise<T> {
    const cancellation = new vscode.CancellationTokenSource();
    let timer: NodeJS.Timeout | undefined;
    const timeout = new Promise<never>((_resolve, reject) => {
      timer = setTimeout(() => {
        cancellation.cancel();
        reject(new Error(`The language server took longer than ${REQUEST_TIMEOUT_MS / 1000} s to ${what}.`));
      }, REQUEST_TIMEOUT_MS);
    });
    try {
      return await Promise.race([send(cancellation.token), timeout]);
    } finally {
      clearTimeout(timer);
      cancellation.dispose();
      if (!client.isRunning()) this.output.warn(`The language server stopped while asked to ${what}.`);
    }
  }

  private showStatus(status: 'starting' | 'running' | 'stopped' | 'failed'): void {
    const texts = {
      starting: ['$(loading~spin) Starting', 'The Runnel language server is starting.'],
      running: ['$(check) Ready', 'The Runnel language server is running.'],
      stopped: ['$(debug-stop) Stopped', 'The Runnel language server has stopped; run "Runnel: Restart Language Server".'],
      failed: ['$(error) Not running', 'The Runnel language server could not start; see the "Runnel" output.'],
    } as const;
    const [text, detail] = texts[status];
    this.statusItem.text = text;
    this.statusItem.detail = detail;
    this.statusItem.busy = status === 'starting';
    this.statusItem.severity =
      status === 'failed' || status === 'stopped' ? vscode.LanguageStatusSeverity.Error : vscode.LanguageStatusSeverity.Information;
  }
}

async function stopQuietly(client: LanguageClient, output: vscode.LogOutputChannel): Promise<void> {
  try {
    if (client.state !== State.Stopped) await client.stop(2_000);
  } catch (error) {
    output.warn(`The language server did not stop cleanly: ${describeError(error)}`);
  }
}

export function describeError(error: unknown): string {
  if (error instanceof Error) return error.message;
  if (typeof error === 'object' && error !== null && 'message' in error && typeof error.message === 'string') return error.message;
  return String(error);
}
