/**
 * Edits that arrive in a burst (a paste split into many changes, multi-cursor typing, undo of many steps, a fast
 * typist) are built once, not once each. Langium starts an update for every change; the next change cancels it,
 * but only at its next interruption point, after the parse at least, so a burst of a hundred changes parsed the
 * design a hundred times (about a second on a small design in the load test).
 *
 * Here each change still takes the workspace lock at once, as in Langium (cancelling the build in progress), and
 * at once marks its document as changed, so that hover, hints and every other request wait for the new version
 * instead of answering from the old one. The build itself starts only when no further change has arrived for
 * COALESCE_MS; a change inside that window cancels the wait and carries the documents changed so far into its own
 * update. A lone edit is built COALESCE_MS later than it would have been; a document just opened is built at once.
 */
import { URI, type LangiumDocuments } from 'langium';
import { DefaultDocumentUpdateHandler, type LangiumSharedServices } from 'langium/lsp';
import type { CancellationToken, TextDocumentChangeEvent } from 'vscode-languageserver';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { RunnelDocumentBuilder } from './document-builder.js';

/** How long a change waits for the next one before its build starts, ms: shorter than a keystroke interval. */
export const COALESCE_MS = 15;

export class RunnelDocumentUpdateHandler extends DefaultDocumentUpdateHandler {
  private readonly documents: LangiumDocuments;
  private readonly builder: RunnelDocumentBuilder;
  /** Documents changed since the last update started. */
  private readonly pending = new Map<string, URI>();

  constructor(services: LangiumSharedServices) {
    super(services);
    this.documents = services.workspace.LangiumDocuments;
    // Marking documents changed ahead of their update needs the builder's own state (RunnelSharedLspModule).
    const builder = services.workspace.DocumentBuilder;
    if (!(builder instanceof RunnelDocumentBuilder)) throw new Error('internal: the burst-coalescing update handler needs RunnelDocumentBuilder');
    this.builder = builder;
  }

  override didChangeContent(change: TextDocumentChangeEvent<TextDocument>): void {
    const uri = URI.parse(change.document.uri);
    this.pending.set(uri.toString(), uri);
    this.workspaceManager.ready
      .then(() =>
        this.workspaceLock.write(async (token) => {
          // Inside the lock no build runs: marking the documents changed is what Langium's update does first. A
          // document opened just now is not known yet; Langium's update creates it, so it is not kept waiting.
          const known = [...this.pending.values()].map((pendingUri) => this.documents.getDocument(pendingUri));
          const allKnown = known.every((document) => document !== undefined);
          this.builder.markChanged(known.filter((document) => document !== undefined));
          if (allKnown) {
            // A newer change cancels the wait (its update includes these documents); queued changes find it cancelled.
            await quietFor(COALESCE_MS, token);
            if (token.isCancellationRequested) return;
          }
          const changed = [...this.pending.values()];
          this.pending.clear();
          await this.builder.update(changed, [], token);
        }),
      )
      .catch((error: unknown) => {
        // As Langium's handler: this should never happen, but if it does it must be seen.
        console.error('Runnel: a document update failed.', error);
      });
  }
}

/** Resolves after `ms`, or as soon as the token is cancelled. */
function quietFor(ms: number, token: CancellationToken): Promise<void> {
  if (token.isCancellationRequested) return Promise.resolve();
  return new Promise((resolve) => {
    const timer = setTimeout(done, ms);
    const subscription = token.onCancellationRequested(done);
    function done(): void {
      clearTimeout(timer);
      subscription.dispose();
      resolve();
    }
  });
}
