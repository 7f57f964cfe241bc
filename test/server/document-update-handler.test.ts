/**
 * Edits in a burst are built once (server/lsp/document-update-handler.ts): fifty changes sent back to back are
 * parsed once, for the last text, and the document counts as changed from the first of them, so that no request
 * is answered from the text before the burst.
 */
import { DocumentState, URI } from 'langium';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { describe, expect, it } from 'vitest';
import { COALESCE_MS } from '../../server/lsp/document-update-handler.js';
import { LspWorkspace, memoryUri } from './lsp-workspace.js';

const design = (slopePercent: number): string =>
  `design "Burst"\nunits SI\nflows {\n  q = 1 m3/s\n}\nsection box rectangle {\n  bottom width 2 m\n  bank height 1.5 m\n}\nlining concrete {\n  n 0.014\n}\nchannel c {\n  reach r {\n    section box\n    lining concrete\n    slope ${slopePercent} %\n    length 100 m\n  }\n  outlet free fall\n}\n`;

/** What the server does when the editor sends a change (Langium wires the handler to the text documents). */
function changeContent(workspace: LspWorkspace, document: TextDocument): void {
  const handler = workspace.services.shared.lsp.DocumentUpdateHandler;
  if (handler.didChangeContent === undefined) throw new Error('the update handler takes no content changes');
  handler.didChangeContent({ document });
}

describe('a burst of edits', () => {
  it('is parsed once, for its last text, and the document waits as changed from the first edit', async () => {
    const workspace = await LspWorkspace.create();
    const name = 'burst.runnel';
    const uri = memoryUri(name);
    await workspace.set({ [name]: design(0.5) });
    const { shared } = workspace.services;
    const builder = shared.workspace.DocumentBuilder;
    const texts = shared.workspace.TextDocuments as unknown as { set(document: TextDocument): boolean };
    const parsedTexts: string[] = [];
    builder.onDocumentPhase(DocumentState.Parsed, (document) => {
      if (document.uri.toString() === uri) parsedTexts.push(document.textDocument.getText());
    });

    let version = 10;
    for (let edit = 1; edit <= 50; edit++) {
      const document = TextDocument.create(uri, 'runnel', ++version, design(0.5 + edit / 100));
      texts.set(document);
      changeContent(workspace, document);
      if (edit === 1) {
        // Once the first change holds the workspace lock the document is no longer the validated old version.
        await new Promise((resolve) => setTimeout(resolve, 1));
        expect(workspace.document(uri).state).toBeLessThan(DocumentState.Validated);
      }
    }
    await builder.waitUntil(DocumentState.Validated, URI.parse(uri));
    expect(parsedTexts).toEqual([design(1)]);
    expect(workspace.document(uri).textDocument.version).toBe(version);
  });

  it('builds a lone edit after the short wait, not before', async () => {
    const workspace = await LspWorkspace.create();
    const name = 'lone.runnel';
    const uri = memoryUri(name);
    await workspace.set({ [name]: design(0.5) });
    const { shared } = workspace.services;
    const document = TextDocument.create(uri, 'runnel', 5, design(0.7));
    (shared.workspace.TextDocuments as unknown as { set(document: TextDocument): boolean }).set(document);
    const sent = performance.now();
    let parsedAfterMs = Number.NaN;
    shared.workspace.DocumentBuilder.onDocumentPhase(DocumentState.Parsed, (built) => {
      if (built.uri.toString() === uri) parsedAfterMs = performance.now() - sent;
    });
    changeContent(workspace, document);
    // The change takes the workspace lock on the next turn of the event loop, as in Langium.
    await new Promise((resolve) => setTimeout(resolve, 1));
    expect(workspace.document(uri).state).toBeLessThan(DocumentState.Validated);
    await shared.workspace.DocumentBuilder.waitUntil(DocumentState.Validated, URI.parse(uri));
    // Timers may fire up to a millisecond early.
    expect(parsedAfterMs).toBeGreaterThanOrEqual(COALESCE_MS - 1);
  });
});
