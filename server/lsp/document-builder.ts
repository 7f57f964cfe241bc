/**
 * Workspace rebuilds: when a shared linings file changes, every design that uses it is relinked, revalidated and
 * re-analysed (Langium's DocumentBuilder finds them through its reference index). The analysis cache notices the
 * new lining and section objects (language/analysis/analyze-design.ts), so no stale result survives.
 *
 * One gap is closed here. When an edit cancels a build after a design was relinked but before its references were
 * indexed, Langium's index no longer says which files the design uses, so the next change to the linings file
 * would not relink it and the design would keep pointing at the replaced linings (stale results, seen when a
 * library is opened and edited at once). A design in that state is relinked whenever anything changes.
 */
import { DefaultDocumentBuilder, DocumentState, type LangiumDocument } from 'langium';

export class RunnelDocumentBuilder extends DefaultDocumentBuilder {
  /**
   * Marks documents as changed ahead of their update, as Langium's update does first (document-update-handler.ts
   * waits a moment before updating, to build a burst of edits once): requests for them wait for the new version.
   * Call it only inside a workspace-lock write, which an update then follows.
   */
  markChanged(documents: readonly LangiumDocument[]): void {
    this.currentState = DocumentState.Changed;
    for (const document of documents) this.resetToState(document, DocumentState.Changed);
  }

  protected override shouldRelink(document: LangiumDocument, changedUris: Set<string>): boolean {
    if (document.state >= DocumentState.Linked && document.state < DocumentState.IndexedReferences) return true;
    return super.shouldRelink(document, changedUris);
  }
}
