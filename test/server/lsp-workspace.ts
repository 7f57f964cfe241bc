/**
 * In-process language-server services for unit tests and the benchmark: the same composition as the server
 * (server/lsp/runnel-lsp-module.ts) without a connection, over an in-memory file system. Documents are opened the
 * way the editor opens them (a text document in TextDocuments, then a build), so edits follow the server's path.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { EmptyFileSystem, URI, type LangiumDocument } from 'langium';
import { TextDocument } from 'vscode-languageserver-textdocument';
import type { ClientCapabilities } from 'vscode-languageserver';
import { createRunnelLspServices } from '../../server/lsp/runnel-lsp-module.js';
import { REPOSITORY_ROOT } from './server-bundle.js';

export type LspServices = ReturnType<typeof createRunnelLspServices>;

export const SAMPLES_FOLDER = join(REPOSITORY_ROOT, 'samples');

/** Every sample design, by file name. */
export function sampleTexts(): Record<string, string> {
  const texts: Record<string, string> = {};
  for (const name of readdirSync(SAMPLES_FOLDER).filter((file) => file.endsWith('.runnel')).sort()) texts[name] = readFileSync(join(SAMPLES_FOLDER, name), 'utf8');
  return texts;
}

/** The URI of a test document, in the normalised form the server uses as a key. */
export function memoryUri(name: string): string {
  return URI.file(`/workspace/${name}`).toString();
}

/** What the tests' editor supports: disabled code actions with a reason, inlay hint refresh, related information. */
export const EDITOR_CAPABILITIES: ClientCapabilities = {
  workspace: { inlayHint: { refreshSupport: true } },
  textDocument: { codeAction: { disabledSupport: true }, publishDiagnostics: { relatedInformation: true } },
};

export class LspWorkspace {
  private readonly versions = new Map<string, number>();

  private constructor(readonly services: LspServices) {}

  /** Services with settings answered as an editor that sends none would (the documented defaults). */
  static async create(): Promise<LspWorkspace> {
    const services = createRunnelLspServices(EmptyFileSystem);
    const languageServer = services.shared.lsp.LanguageServer;
    await languageServer.initialize({ processId: null, rootUri: null, workspaceFolders: null, capabilities: EDITOR_CAPABILITIES });
    languageServer.initialized({});
    await services.shared.workspace.WorkspaceManager.ready;
    return new LspWorkspace(services);
  }

  /** Opens (or replaces) documents and builds them together with validation, as the server does on edits. */
  async set(files: Readonly<Record<string, string>>): Promise<LangiumDocument[]> {
    const { shared } = this.services;
    const uris = Object.entries(files).map(([name, text]) => {
      const uri = memoryUri(name);
      const version = (this.versions.get(uri) ?? 0) + 1;
      this.versions.set(uri, version);
      (shared.workspace.TextDocuments as unknown as { set(document: TextDocument): boolean }).set(TextDocument.create(uri, 'runnel', version, text));
      if (!shared.workspace.LangiumDocuments.hasDocument(URI.parse(uri))) {
        const document = shared.workspace.LangiumDocumentFactory.fromTextDocument(shared.workspace.TextDocuments.get(uri) as TextDocument, URI.parse(uri));
        shared.workspace.LangiumDocuments.addDocument(document);
      }
      return URI.parse(uri);
    });
    await shared.workspace.DocumentBuilder.update(uris, []);
    return uris.map((uri) => this.document(uri.toString()));
  }

  document(uri: string): LangiumDocument {
    const document = this.services.shared.workspace.LangiumDocuments.getDocument(URI.parse(uri));
    if (document === undefined) throw new Error(`no document ${uri}`);
    return document;
  }
}
