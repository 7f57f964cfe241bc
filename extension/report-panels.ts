/**
 * The live report beside the text: one webview panel per design. What the user sees: the report opens to the side
 * without taking focus, follows every change of the design as the server re-analyses it, keeps its scroll
 * position across updates, hiding and window reloads, and says plainly when it cannot be shown.
 *
 * Updates: the server announces a new analysis (ANALYSIS_CHANGED_NOTIFICATION); the panel asks for the page again
 * and posts it to the webview as `replacePage`, whose script swaps the body in place. Requests never overlap: a
 * change that arrives while one is in flight triggers exactly one more. A hidden panel only notes that it is stale.
 */
import * as vscode from 'vscode';
import type { ReportHostMessage, ReportWebviewMessage } from '../server/protocol.js';
import { REPORT_VIEW_TYPE } from './identifiers.js';
import { describeError, type AnalysisChange, type LanguageServerConnection } from './language-server-connection.js';
import { createNonce, reportPageSecurityProblem, statusPage, withPanelScript } from './report-page.js';

/** What the webview keeps in its state (see panelScriptSource): enough to restore the panel after a reload. */
interface SavedPanelState {
  readonly uri: string;
  readonly scrollY?: number;
}

export class ReportPanels implements vscode.Disposable {
  private readonly panels = new Map<string, ReportPanel>();
  private readonly subscription: vscode.Disposable;

  constructor(
    private readonly server: LanguageServerConnection,
    private readonly output: vscode.LogOutputChannel,
  ) {
    this.subscription = server.onDidChangeAnalysis((change) => this.analysisChanged(change));
  }

  /** Opens the report of a design beside the active editor, or reveals the one already open. */
  open(document: vscode.TextDocument): void {
    const existing = this.panels.get(document.uri.toString());
    if (existing !== undefined) {
      existing.panel.reveal(vscode.ViewColumn.Beside, true);
      return;
    }
    const panel = vscode.window.createWebviewPanel(
      REPORT_VIEW_TYPE,
      panelTitle(document.uri),
      { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true },
      { enableFindWidget: true },
    );
    this.adopt(document.uri, panel);
  }

  /** Serializer that brings report panels back after a window reload. */
  serializer(): vscode.WebviewPanelSerializer<unknown> {
    return {
      deserializeWebviewPanel: async (panel: vscode.WebviewPanel, state: unknown) => {
        if (!isSavedPanelState(state)) {
          panel.dispose();
          return;
        }
        const uri = vscode.Uri.parse(state.uri, true);
        try {
          // Opening the design makes sure the server has it, even if its editor did not come back.
          await vscode.workspace.openTextDocument(uri);
        } catch (error) {
          this.output.warn(`The report of ${uri.toString(true)} was not restored: ${describeError(error)}`);
          panel.dispose();
          return;
        }
        panel.title = panelTitle(uri);
        this.adopt(uri, panel, state.scrollY ?? 0);
      },
    };
  }

  /** The design of the report panel that has focus, so commands run from the panel act on its design. */
  activeReportDocument(): vscode.Uri | undefined {
    for (const reportPanel of this.panels.values()) {
      if (reportPanel.panel.active) return reportPanel.documentUri;
    }
    return undefined;
  }

  dispose(): void {
    this.subscription.dispose();
    for (const reportPanel of [...this.panels.values()]) reportPanel.panel.dispose();
  }

  private adopt(documentUri: vscode.Uri, panel: vscode.WebviewPanel, scrollY = 0): void {
    const key = documentUri.toString();
    const reportPanel = new ReportPanel(documentUri, panel, this.server, this.output, scrollY, () => this.panels.delete(key));
    this.panels.set(key, reportPanel);
    void reportPanel.refresh();
  }

  private analysisChanged(change: AnalysisChange): void {
    this.panels.get(change.uri.toString())?.analysisChanged();
  }
}

class ReportPanel {
  /** One nonce for the panel's life: later pages only lend their body, so the first page's policy stays in force. */
  private readonly nonce = createNonce();
  private disposed = false;
  private rendering = false;
  private renderAgain = false;
  /** The analysis changed while the panel was hidden: render when it shows again. */
  private stale = false;
  /** A report page with its script has loaded and said `ready`, so updates can be posted to it. */
  private scriptReady = false;
  /** The newest report page (with the panel script) and the page last assigned to the webview. */
  private latestPage: string | undefined;
  private assignedPage: string | undefined;
  /** Document version of the page shown; an answer computed from an older version is dropped. */
  private shownVersion = Number.NEGATIVE_INFINITY;

  constructor(
    readonly documentUri: vscode.Uri,
    readonly panel: vscode.WebviewPanel,
    private readonly server: LanguageServerConnection,
    private readonly output: vscode.LogOutputChannel,
    private scrollY: number,
    onDisposed: () => void,
  ) {
    // Scripts only for the panel's own nonce'd script; no local files, no command links.
    panel.webview.options = { enableScripts: true, enableCommandUris: false, localResourceRoots: [] };
    this.assign(statusPage(panel.title, 'Computing the report…', this.nonce), false);
    panel.onDidDispose(() => {
      this.disposed = true;
      onDisposed();
    });
    let wasVisible = panel.visible;
    panel.onDidChangeViewState(() => {
      const becameVisible = panel.visible && !wasVisible;
      wasVisible = panel.visible;
      if (!becameVisible) return;
      // A webview that was hidden is rebuilt from the page last assigned: give it the newest one.
      if (this.latestPage !== undefined && this.latestPage !== this.assignedPage) this.assign(this.latestPage, true);
      if (this.stale) void this.refresh();
    });
    panel.webview.onDidReceiveMessage((message: unknown) => {
      if (isReportWebviewMessage(message)) this.received(message);
    });
  }

  /**
   * Every announcement re-renders, even for a version already shown: a changed setting or a changed shared file of
   * linings gives a new analysis of the same text.
   */
  analysisChanged(): void {
    void this.refresh();
  }

  /** Asks the server for the page; coalesces overlapping calls into one more render. Never throws. */
  async refresh(): Promise<void> {
    if (this.disposed) return;
    if (!this.panel.visible) {
      this.stale = true;
      return;
    }
    if (this.rendering) {
      this.renderAgain = true;
      return;
    }
    this.rendering = true;
    this.stale = false;
    try {
      do {
        this.renderAgain = false;
        await this.renderOnce();
      } while (this.renderAgain && !this.disposed);
    } finally {
      this.rendering = false;
    }
  }

  private async renderOnce(): Promise<void> {
    let result;
    try {
      result = await this.server.renderReport(this.documentUri, { nonce: this.nonce, cspSource: this.panel.webview.cspSource });
    } catch (error) {
      this.output.error(`The report of ${this.documentUri.toString(true)} was not updated: ${describeError(error)}`);
      if (this.latestPage === undefined) this.showProblem(`The report could not be computed: ${describeError(error)}`);
      return;
    }
    if (this.disposed) return;
    if (result.html === null) {
      this.output.warn(`The language server does not know ${this.documentUri.toString(true)}; the report keeps its last state.`);
      if (this.latestPage === undefined) this.showProblem('The language server does not have this design open. Open the design and try again.');
      return;
    }
    if (result.version !== null) {
      if (result.version < this.shownVersion) return;
      this.shownVersion = result.version;
    }
    const problem = reportPageSecurityProblem(result.html, this.nonce);
    if (problem !== null) {
      this.output.error(`The report page was not shown because ${problem}.`);
      this.showProblem(`The report could not be shown safely: ${problem}. See the "Runnel" output.`);
      return;
    }
    const page = withPanelScript(result.html, this.nonce, this.documentUri.toString());
    this.latestPage = page;
    if (this.scriptReady && this.panel.visible) {
      const update: ReportHostMessage = { type: 'replacePage', html: result.html };
      if (await this.panel.webview.postMessage(update)) {
        this.output.trace(`Report of ${this.documentUri.toString(true)} updated to version ${result.version ?? 'unknown'}.`);
        return;
      }
    }
    if (!this.disposed) this.assign(page, true);
  }

  private received(message: ReportWebviewMessage): void {
    if (message.type === 'scrolled') {
      this.scrollY = message.scrollY;
    } else if (message.type === 'ready') {
      this.scriptReady = true;
      // The webview keeps its own scroll state; this covers a panel restored from an older saved state.
      if (this.scrollY > 0) void this.panel.webview.postMessage({ type: 'restoreScroll', scrollY: this.scrollY } satisfies ReportHostMessage);
    }
  }

  private showProblem(message: string): void {
    this.latestPage = undefined;
    this.assign(statusPage(this.panel.title, message, this.nonce), false);
  }

  private assign(page: string, hasScript: boolean): void {
    // Until the new page's script says `ready`, updates are assigned as whole pages instead of posted.
    this.scriptReady = false;
    this.assignedPage = hasScript ? page : undefined;
    this.panel.webview.html = page;
  }
}

function panelTitle(documentUri: vscode.Uri): string {
  const fileName = documentUri.path.split('/').pop() ?? documentUri.path;
  return `Report: ${fileName}`;
}

function isSavedPanelState(state: unknown): state is SavedPanelState {
  if (typeof state !== 'object' || state === null) return false;
  const record = state as Record<string, unknown>;
  return typeof record['uri'] === 'string' && (record['scrollY'] === undefined || typeof record['scrollY'] === 'number');
}

function isReportWebviewMessage(message: unknown): message is ReportWebviewMessage {
  if (typeof message !== 'object' || message === null) return false;
  const record = message as Record<string, unknown>;
  return record['type'] === 'ready' || (record['type'] === 'scrolled' && typeof record['scrollY'] === 'number');
}
