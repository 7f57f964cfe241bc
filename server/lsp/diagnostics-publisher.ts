/**
 * Publishing diagnostics. Syntax errors, validation and every analysis finding reach the editor as one list per
 * document: findings become diagnostics in validation (language/validation/finding-validation.ts), each on the
 * reach it concerns with its stable code, the data a quick fix needs and related information pointing at the
 * flow, section or lining involved. Here they are sent with the document version they were computed from, and
 * only while that version is still the editor's: a result overtaken by a newer edit is dropped, since the build of
 * the newer version publishes its own. Deleted documents get an empty list.
 */
import { DocumentState, type LangiumDocument } from 'langium';
import type { LangiumSharedServices } from 'langium/lsp';
import type { Connection } from 'vscode-languageserver';

export function addVersionedDiagnosticsHandler(connection: Connection, shared: LangiumSharedServices): void {
  const builder = shared.workspace.DocumentBuilder;
  const textDocuments = shared.workspace.TextDocuments;
  builder.onUpdate((_changed, deleted) => {
    for (const uri of deleted) void connection.sendDiagnostics({ uri: uri.toString(), diagnostics: [] });
  });
  builder.onDocumentPhase(DocumentState.Validated, (document) => {
    if (document.diagnostics === undefined) return;
    const uri = document.uri.toString();
    const open = textDocuments.get(uri);
    if (open !== undefined && !isParsedFrom(document, open.getText())) return;
    void connection.sendDiagnostics({ uri, diagnostics: document.diagnostics, ...(open === undefined ? {} : { version: open.version }) });
  });
}

/** Whether the document's syntax tree was parsed from this text (false when an edit has arrived since). */
function isParsedFrom(document: LangiumDocument, text: string): boolean {
  const parsedText = document.parseResult.value.$cstNode?.root.fullText;
  return parsedText === undefined || parsedText === text;
}
