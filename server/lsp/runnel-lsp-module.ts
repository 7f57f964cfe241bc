/**
 * The language server's services: Langium's default LSP services, Runnel's core services (language/runnel-module.ts)
 * and Runnel's editor features, composed once. Every provider is wrapped by `containProvider`, so an internal error
 * is logged and answered with an empty result instead of failing the request. `startRunnelLanguageServer` starts
 * the protocol on a connection and adds Runnel's own requests; the entry point (server/language-server.ts) is a few
 * lines around it.
 */
import { DocumentState, inject, type Module } from 'langium';
import type { Connection } from 'vscode-languageserver';
import {
  addCallHierarchyHandler,
  addCodeActionHandler,
  addCodeLensHandler,
  addCompletionHandler,
  addConfigurationChangeHandler,
  addDocumentHighlightHandler,
  addDocumentLinkHandler,
  addDocumentSymbolHandler,
  addDocumentUpdateHandler,
  addExecuteCommandHandler,
  addFileOperationHandler,
  addFindReferencesHandler,
  addFoldingRangeHandler,
  addFormattingHandler,
  addGoToDeclarationHandler,
  addGoToImplementationHandler,
  addGoToTypeDefinitionHandler,
  addGotoDefinitionHandler,
  addHoverHandler,
  addInlayHintHandler,
  addRenameHandler,
  addSemanticTokenHandler,
  addSignatureHelpHandler,
  addTextDocumentContentRequestHandler,
  addTypeHierarchyHandler,
  addWorkspaceSymbolHandler,
  createDefaultModule,
  createDefaultSharedModule,
  DefaultDefinitionProvider,
  DefaultDocumentHighlightProvider,
  DefaultFoldingRangeProvider,
  DefaultReferencesProvider,
  type DefaultSharedModuleContext,
  type LangiumServices,
  type LangiumSharedServices,
  type PartialLangiumServices,
  type PartialLangiumSharedServices,
} from 'langium/lsp';
import { RunnelGeneratedModule, RunnelGeneratedSharedModule } from '../../language/generated/module.js';
import { RunnelModule, type RunnelAddedServices } from '../../language/runnel-module.js';
import { RunnelCodeActionProvider } from './code-actions.js';
import { RunnelCompletionProvider } from './completion-provider.js';
import { followWorkspaceFolders } from './workspace-folders.js';
import { followCriteriaSettings } from './criteria-from-settings.js';
import { registerCustomRequests } from './custom-requests.js';
import { addVersionedDiagnosticsHandler } from './diagnostics-publisher.js';
import { DocumentAnalyses } from './document-analysis.js';
import { RunnelDocumentBuilder } from './document-builder.js';
import { RunnelDocumentUpdateHandler } from './document-update-handler.js';
import { RunnelDocumentSymbolProvider, RunnelNodeKindProvider } from './document-symbols.js';
import { containProvider, createServerLog, guardProcess, type ServerLog } from './error-containment.js';
import { RunnelFormatter } from './formatter.js';
import { RunnelHoverProvider } from './hover-provider.js';
import { RunnelInlayHintProvider } from './inlay-hint-provider.js';
import { RunnelRenameProvider } from './rename-provider.js';
import { RunnelSettings } from './runnel-settings.js';

/** Services the server adds to Langium's. */
export interface RunnelLspAddedServices {
  readonly runnel: {
    readonly Settings: RunnelSettings;
    readonly Analyses: DocumentAnalyses;
    readonly Log: ServerLog;
  };
}

export type RunnelLspServices = LangiumServices & RunnelAddedServices & RunnelLspAddedServices;

/** The empty answer of each provider method when it fails internally. */
const EMPTY = {
  completion: { getCompletion: undefined },
  hover: { getHoverContent: undefined },
  inlayHints: { getInlayHints: [] },
  codeActions: { getCodeActions: [] },
  formatter: { formatDocument: [], formatDocumentRange: [], formatDocumentOnType: [] },
  symbols: { getSymbols: [] },
  folding: { getFoldingRanges: [] },
  definition: { getDefinition: undefined },
  references: { findReferences: [] },
  highlight: { getDocumentHighlight: [] },
  rename: { rename: undefined, prepareRename: undefined },
} as const;

export const RunnelLspModule: Module<RunnelLspServices, PartialLangiumServices & RunnelLspAddedServices> = {
  runnel: {
    Settings: (services) => new RunnelSettings(services.shared),
    Analyses: (services) => new DocumentAnalyses(services.shared, services.analysis.CriteriaDefaults),
    Log: (services) => createServerLog(services.shared.lsp.Connection),
  },
  lsp: {
    CompletionProvider: (services) => containProvider(new RunnelCompletionProvider(services), services.runnel.Log, 'completion', EMPTY.completion),
    HoverProvider: (services) => containProvider(new RunnelHoverProvider(services, services.runnel.Settings, services.runnel.Analyses), services.runnel.Log, 'hover', EMPTY.hover),
    InlayHintProvider: (services) => containProvider(new RunnelInlayHintProvider(services.runnel.Settings, services.runnel.Analyses), services.runnel.Log, 'inlay hints', EMPTY.inlayHints),
    CodeActionProvider: (services) => containProvider(new RunnelCodeActionProvider(services, services.runnel.Analyses), services.runnel.Log, 'code actions', EMPTY.codeActions),
    Formatter: (services) => containProvider(new RunnelFormatter(services), services.runnel.Log, 'formatting', EMPTY.formatter),
    DocumentSymbolProvider: (services) => containProvider(new RunnelDocumentSymbolProvider(services, services.runnel.Analyses), services.runnel.Log, 'document symbols', EMPTY.symbols),
    FoldingRangeProvider: (services) => containProvider(new DefaultFoldingRangeProvider(services), services.runnel.Log, 'folding', EMPTY.folding),
    DefinitionProvider: (services) => containProvider(new DefaultDefinitionProvider(services), services.runnel.Log, 'go to definition', EMPTY.definition),
    ReferencesProvider: (services) => containProvider(new DefaultReferencesProvider(services), services.runnel.Log, 'find references', EMPTY.references),
    DocumentHighlightProvider: (services) => containProvider(new DefaultDocumentHighlightProvider(services), services.runnel.Log, 'highlight', EMPTY.highlight),
    RenameProvider: (services) => containProvider(new RunnelRenameProvider(services), services.runnel.Log, 'rename', EMPTY.rename),
  },
};

export const RunnelSharedLspModule: Module<LangiumSharedServices, PartialLangiumSharedServices> = {
  lsp: {
    NodeKindProvider: () => new RunnelNodeKindProvider(),
    DocumentUpdateHandler: (shared) => new RunnelDocumentUpdateHandler(shared),
  },
  workspace: {
    DocumentBuilder: (shared) => new RunnelDocumentBuilder(shared),
  },
};

/** Builds the shared and Runnel services of a language server (or of an in-process test or benchmark). */
export function createRunnelLspServices(context: DefaultSharedModuleContext): { shared: LangiumSharedServices; Runnel: RunnelLspServices } {
  const shared = inject(createDefaultSharedModule(context), RunnelGeneratedSharedModule, RunnelSharedLspModule);
  const Runnel = inject(createDefaultModule({ shared }), RunnelGeneratedModule, RunnelModule, RunnelLspModule);
  shared.ServiceRegistry.register(Runnel);
  return { shared, Runnel };
}

/**
 * Starts the protocol on the services' connection: Langium's handlers (documents, diagnostics, the providers
 * above), Runnel's custom requests, the criteria settings (criteria-from-settings.ts), and the refreshes a client
 * needs when results change without its text changing (a shared linings file edited, a setting changed).
 */
export function startRunnelLanguageServer(shared: LangiumSharedServices, Runnel: RunnelLspServices): void {
  const connection = shared.lsp.Connection;
  if (connection === undefined) throw new Error('internal: the language server needs a connection');
  const log = Runnel.runnel.Log;
  guardProcess(log);
  startProtocol(connection, shared);
  registerCustomRequests(connection, shared, Runnel.runnel.Analyses, Runnel.runnel.Settings, log);

  let canRefreshHints = false;
  shared.lsp.LanguageServer.onInitialize((params) => {
    canRefreshHints = params.capabilities.workspace?.inlayHint?.refreshSupport === true;
  });
  const refreshHints = (): void => {
    if (canRefreshHints) connection.languages.inlayHint.refresh().catch((error: unknown) => log.warn(`Runnel: inlay hint refresh failed: ${String(error)}`));
  };
  // Designs rebuilt because a file they use changed get new results but no text change: ask for hints again.
  let changedByUpdate = new Set<string>();
  shared.workspace.DocumentBuilder.onUpdate((changed) => {
    changedByUpdate = new Set(changed.map((uri) => uri.toString()));
  });
  shared.workspace.DocumentBuilder.onBuildPhase(DocumentState.Validated, (built) => {
    if (built.some((document) => !changedByUpdate.has(document.uri.toString()))) refreshHints();
  });
  Runnel.runnel.Settings.onDidChange(() => refreshHints());
  followCriteriaSettings({ connection, shared, services: Runnel, settings: Runnel.runnel.Settings, log, onApplied: refreshHints });
  followWorkspaceFolders(connection, shared, Runnel.runnel.Settings, log);
}

/**
 * Langium's `startLanguageServer`, handler by handler, with one difference: diagnostics are published with their
 * document version and only while current (diagnostics-publisher.ts). Keep in step with langium/lsp when upgrading.
 */
function startProtocol(connection: Connection, shared: LangiumSharedServices): void {
  addDocumentUpdateHandler(connection, shared);
  addFileOperationHandler(connection, shared);
  addVersionedDiagnosticsHandler(connection, shared);
  addCompletionHandler(connection, shared);
  addFindReferencesHandler(connection, shared);
  // The outline shows each reach's status, which needs its references linked.
  addDocumentSymbolHandler(connection, shared, DocumentState.Linked);
  addGotoDefinitionHandler(connection, shared);
  addGoToTypeDefinitionHandler(connection, shared);
  addGoToImplementationHandler(connection, shared);
  addDocumentHighlightHandler(connection, shared);
  addFoldingRangeHandler(connection, shared);
  addFormattingHandler(connection, shared);
  addCodeActionHandler(connection, shared);
  addRenameHandler(connection, shared);
  addHoverHandler(connection, shared);
  addInlayHintHandler(connection, shared);
  addSemanticTokenHandler(connection, shared);
  addExecuteCommandHandler(connection, shared);
  addSignatureHelpHandler(connection, shared);
  addCallHierarchyHandler(connection, shared);
  addTypeHierarchyHandler(connection, shared);
  addCodeLensHandler(connection, shared);
  addTextDocumentContentRequestHandler(connection, shared);
  addDocumentLinkHandler(connection, shared);
  addConfigurationChangeHandler(connection, shared);
  addGoToDeclarationHandler(connection, shared);
  addWorkspaceSymbolHandler(connection, shared);
  connection.onInitialize(async (params) => {
    const result = await shared.lsp.LanguageServer.initialize(params);
    // Langium reads the workspace folders once; Runnel follows later changes too (workspace-folders.ts).
    const workspace = result.capabilities.workspace;
    return { ...result, capabilities: { ...result.capabilities, workspace: { ...workspace, workspaceFolders: { ...workspace?.workspaceFolders, supported: true, changeNotifications: true } } } };
  });
  connection.onInitialized((params) => shared.lsp.LanguageServer.initialized(params));
  shared.workspace.TextDocuments.listen(connection);
  connection.listen();
}
