/**
 * Workspace folders added or removed while the server runs (a folder added to a multi-root workspace). Langium
 * reads the folders once, at start-up; without this, a design in a folder added later would find none of the shared
 * linings and sections on disk beside it, and would take the window's settings instead of its folder's.
 *
 * An added folder's design files are loaded and built as at start-up, and designs already open that use them are
 * linked again (the builder's update does both); its settings are read. A removed folder's files are dropped unless
 * they are open (an open design stays until it is closed) or another folder still holds them.
 */
import { URI } from 'langium';
import type { LangiumSharedServices } from 'langium/lsp';
import type { Connection, WorkspaceFolder } from 'vscode-languageserver';
import { containingFolder } from '../../language/analysis/criteria-settings.js';
import type { RunnelSettings } from './runnel-settings.js';

interface Log {
  warn(message: string): void;
}

/** Follows the client's workspace folder changes (when it sends them: see the server's initialize result). */
export function followWorkspaceFolders(connection: Connection, shared: LangiumSharedServices, settings: RunnelSettings, log: Log): void {
  let folders: WorkspaceFolder[] = [];
  let clientSendsChanges = false;
  shared.lsp.LanguageServer.onInitialize((params) => {
    folders = [...(params.workspaceFolders ?? [])];
    clientSendsChanges = params.capabilities.workspace?.workspaceFolders === true;
  });
  shared.lsp.LanguageServer.onInitialized(() => {
    if (!clientSendsChanges) return;
    connection.workspace.onDidChangeWorkspaceFolders((event) => {
      const removed = new Set(event.removed.map((folder) => folder.uri));
      folders = [...folders.filter((folder) => !removed.has(folder.uri)), ...event.added.filter((folder) => !folders.some((known) => known.uri === folder.uri))];
      void applyFolderChange(shared, settings, folders, event.added, event.removed).catch((error: unknown) => log.warn(`Runnel: could not follow the change of workspace folders: ${String(error)}`));
    });
  });
}

async function applyFolderChange(
  shared: LangiumSharedServices,
  settings: RunnelSettings,
  folders: readonly WorkspaceFolder[],
  added: readonly WorkspaceFolder[],
  removed: readonly WorkspaceFolder[],
): Promise<void> {
  // The settings first, so that the designs built below are judged by their folder's criteria.
  await settings.setWorkspaceFolders(folders.map((folder) => folder.uri));
  const workspace = shared.workspace;
  const addedFiles = (await Promise.all(added.map((folder) => workspace.WorkspaceManager.searchFolder(URI.parse(folder.uri))))).flat();
  const inRemaining = (uri: string): boolean => containingFolder(uri, folders.map((folder) => folder.uri)) !== undefined;
  const open = new Set(workspace.TextDocuments.keys());
  const droppedFiles = workspace.LangiumDocuments.all
    .map((document) => document.uri)
    .filter((uri) => {
      const text = uri.toString();
      return containingFolder(text, removed.map((folder) => folder.uri)) !== undefined && !inRemaining(text) && !open.has(text);
    })
    .toArray();
  if (addedFiles.length === 0 && droppedFiles.length === 0) return;
  await workspace.WorkspaceLock.write((token) => workspace.DocumentBuilder.update(addedFiles, droppedFiles, token));
}
