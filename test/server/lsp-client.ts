/**
 * A small LSP client for protocol-level tests: spawns the bundled server over stdio and talks JSON-RPC to it with
 * vscode-languageserver-protocol's client-side connection. It answers what a real editor answers
 * (`client/registerCapability`, `workspace/configuration`, refresh requests), records published diagnostics and
 * notifications, and lets a test wait for the diagnostics of a document version.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import {
  createProtocolConnection,
  StreamMessageReader,
  StreamMessageWriter,
  type ProtocolConnection,
} from 'vscode-languageserver-protocol/node';
import type { ClientCapabilities, Diagnostic, InitializeResult, PublishDiagnosticsParams } from 'vscode-languageserver-protocol';
import { serverBundle } from './server-bundle.js';

export interface ClientOptions {
  /** Folder the server treats as the workspace (its `.runnel` files are indexed). */
  readonly workspaceFolder?: string;
  /** Several workspace folders (a multi-root workspace), instead of `workspaceFolder`. */
  readonly workspaceFolders?: readonly string[];
  /** The `runnel` settings section the client answers `workspace/configuration` with. */
  readonly settings?: Record<string, unknown>;
  /**
   * Settings a workspace folder (by path) sets for itself: a request scoped to that folder is answered with the
   * window's section overridden by these, as VS Code merges folder settings over the others.
   */
  readonly folderSettings?: Readonly<Record<string, Record<string, unknown>>>;
  readonly capabilities?: ClientCapabilities;
  /** The server entry to start; the bundle of server-bundle.ts when not given. */
  readonly serverPath?: string;
}

interface Waiter {
  readonly uri: string;
  readonly accept: (params: PublishDiagnosticsParams) => boolean;
  readonly resolve: (params: PublishDiagnosticsParams) => void;
}

export class TestLanguageClient {
  readonly notifications: { method: string; params: unknown }[] = [];
  readonly serverRequests: { method: string; params: unknown }[] = [];
  readonly logMessages: { type: number; message: string }[] = [];
  private readonly latestDiagnostics = new Map<string, PublishDiagnosticsParams>();
  private waiters: Waiter[] = [];
  private exitCode: number | null = null;
  settings: Record<string, unknown>;
  folderSettings: Readonly<Record<string, Record<string, unknown>>>;

  private constructor(
    readonly process: ChildProcess,
    readonly connection: ProtocolConnection,
    readonly stderr: string[],
    options: ClientOptions,
  ) {
    this.settings = options.settings ?? {};
    this.folderSettings = Object.fromEntries(Object.entries(options.folderSettings ?? {}).map(([folder, settings]) => [pathToUri(folder), settings]));
    process.on('exit', (code) => {
      this.exitCode = code ?? -1;
    });
    connection.onNotification('textDocument/publishDiagnostics', (params: PublishDiagnosticsParams) => {
      this.latestDiagnostics.set(params.uri, params);
      const ready = this.waiters.filter((waiter) => {
        try {
          return waiter.uri === params.uri && waiter.accept(params);
        } catch {
          return false;
        }
      });
      this.waiters = this.waiters.filter((waiter) => !ready.includes(waiter));
      for (const waiter of ready) waiter.resolve(params);
    });
    connection.onNotification('window/logMessage', (params: { type: number; message: string }) => {
      this.logMessages.push(params);
    });
    connection.onUnhandledNotification((message) => {
      this.notifications.push({ method: message.method, params: message.params });
    });
    connection.onRequest('workspace/configuration', (params: { items: { section?: string; scopeUri?: string }[] }) => {
      this.serverRequests.push({ method: 'workspace/configuration', params });
      return params.items.map((item) => {
        if (item.section !== 'runnel') return null;
        const own = item.scopeUri === undefined ? undefined : this.folderSettings[item.scopeUri];
        return own === undefined ? this.settings : mergeSettings(this.settings, own);
      });
    });
    connection.onRequest('client/registerCapability', (params: unknown) => {
      this.serverRequests.push({ method: 'client/registerCapability', params });
      return null;
    });
    connection.onRequest('workspace/inlayHint/refresh', () => {
      this.serverRequests.push({ method: 'workspace/inlayHint/refresh', params: null });
      return null;
    });
    connection.onRequest('window/workDoneProgress/create', () => null);
  }

  /** Spawns the bundled server and sends `initialize` and `initialized`. */
  static async start(options: ClientOptions = {}): Promise<{ client: TestLanguageClient; initializeResult: InitializeResult }> {
    const bundle = options.serverPath ?? (await serverBundle());
    const child = spawn(process.execPath, [bundle, '--stdio'], { stdio: ['pipe', 'pipe', 'pipe'] });
    const stderr: string[] = [];
    child.stderr?.on('data', (chunk: Buffer) => stderr.push(chunk.toString('utf8')));
    if (child.stdout === null || child.stdin === null) throw new Error('no stdio on the server process');
    const connection = createProtocolConnection(new StreamMessageReader(child.stdout), new StreamMessageWriter(child.stdin));
    const client = new TestLanguageClient(child, connection, stderr, options);
    connection.listen();
    const folder = options.workspaceFolder;
    const capabilities: ClientCapabilities = options.capabilities ?? {
      workspace: { configuration: true, didChangeConfiguration: { dynamicRegistration: true }, inlayHint: { refreshSupport: true }, workspaceFolders: true },
      textDocument: {
        publishDiagnostics: { relatedInformation: true },
        codeAction: { disabledSupport: true, codeActionLiteralSupport: { codeActionKind: { valueSet: ['quickfix', 'refactor', 'refactor.rewrite'] } } },
        hover: { contentFormat: ['markdown', 'plaintext'] },
        completion: { completionItem: { snippetSupport: false } },
        inlayHint: {},
        rename: { prepareSupport: true },
      },
    };
    const folders = options.workspaceFolders ?? (folder === undefined ? [] : [folder]);
    const initializeResult = (await connection.sendRequest('initialize', {
      processId: process.pid,
      rootUri: folders[0] === undefined ? null : pathToUri(folders[0]),
      workspaceFolders: folders.length === 0 ? null : folders.map((path, index) => ({ uri: pathToUri(path), name: `folder ${index + 1}` })),
      capabilities,
    })) as InitializeResult;
    await connection.sendNotification('initialized', {});
    return { client, initializeResult };
  }

  get exited(): boolean {
    return this.exitCode !== null;
  }

  request<R>(method: string, params: unknown): Promise<R> {
    return this.connection.sendRequest(method, params) as Promise<R>;
  }

  async open(uri: string, text: string, version = 1): Promise<void> {
    await this.connection.sendNotification('textDocument/didOpen', { textDocument: { uri, languageId: 'runnel', version, text } });
  }

  /** Replaces the whole text (a full-document change). */
  async replaceText(uri: string, version: number, text: string): Promise<void> {
    await this.connection.sendNotification('textDocument/didChange', { textDocument: { uri, version }, contentChanges: [{ text }] });
  }

  /** An incremental change, as editors send while typing. */
  async edit(uri: string, version: number, range: { start: { line: number; character: number }; end: { line: number; character: number } }, text: string): Promise<void> {
    await this.connection.sendNotification('textDocument/didChange', { textDocument: { uri, version }, contentChanges: [{ range, text }] });
  }

  /** Folders added to and removed from the workspace, by path (`workspace/didChangeWorkspaceFolders`). */
  async changeWorkspaceFolders(added: readonly string[], removed: readonly string[]): Promise<void> {
    const folder = (path: string): { uri: string; name: string } => ({ uri: pathToUri(path), name: path.split('/').pop() ?? path });
    await this.connection.sendNotification('workspace/didChangeWorkspaceFolders', { event: { added: added.map(folder), removed: removed.map(folder) } });
  }

  async changeSettings(settings: Record<string, unknown>): Promise<void> {
    this.settings = settings;
    await this.connection.sendNotification('workspace/didChangeConfiguration', { settings: { runnel: settings } });
  }

  /** The next diagnostics published for `uri` that satisfy `accept` (already published ones count). */
  diagnostics(uri: string, accept: (params: PublishDiagnosticsParams) => boolean = () => true, timeoutMs = 15_000): Promise<Diagnostic[]> {
    const latest = this.latestDiagnostics.get(uri);
    if (latest !== undefined && accept(latest)) return Promise.resolve(latest.diagnostics);
    return new Promise<Diagnostic[]>((resolve, reject) => {
      const timer = setTimeout(() => {
        const last = this.latestDiagnostics.get(uri);
        const seen = last === undefined ? 'none' : `version ${String(last.version)}: ${last.diagnostics.map((diagnostic) => String(diagnostic.code)).join(', ')}`;
        reject(new Error(`no matching diagnostics for ${uri} within ${timeoutMs} ms (last published: ${seen}); stderr: ${this.stderr.join('')}`));
      }, timeoutMs);
      this.waiters.push({
        uri,
        accept,
        resolve: (params) => {
          clearTimeout(timer);
          resolve(params.diagnostics);
        },
      });
    });
  }

  /** Diagnostics of a given document version (the server publishes the version it validated). */
  diagnosticsOfVersion(uri: string, version: number): Promise<Diagnostic[]> {
    return this.diagnostics(uri, (params) => params.version === version);
  }

  forgetDiagnostics(uri: string): void {
    this.latestDiagnostics.delete(uri);
  }

  async stop(): Promise<void> {
    if (!this.exited) {
      try {
        await Promise.race([this.connection.sendRequest('shutdown'), delay(2_000)]);
        await this.connection.sendNotification('exit');
      } catch {
        // The process may already be gone.
      }
      await Promise.race([new Promise((resolve) => this.process.once('exit', resolve)), delay(2_000)]);
    }
    if (!this.exited) this.process.kill();
    this.connection.dispose();
  }
}

export function pathToUri(path: string): string {
  return `file://${path.split('/').map(encodeURIComponent).join('/')}`;
}

export function delay(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms));
}

/** A settings section with another laid over it, nested objects merged key by key. */
function mergeSettings(base: Record<string, unknown>, over: Record<string, unknown>): Record<string, unknown> {
  const merged: Record<string, unknown> = { ...base };
  for (const [key, value] of Object.entries(over)) {
    const below = merged[key];
    merged[key] =
      typeof value === 'object' && value !== null && !Array.isArray(value) && typeof below === 'object' && below !== null && !Array.isArray(below)
        ? mergeSettings(below as Record<string, unknown>, value as Record<string, unknown>)
        : value;
  }
  return merged;
}
