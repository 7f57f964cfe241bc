/**
 * "Compare with Last Commit" results as read-only Markdown documents (scheme `runnel-comparison`), shown as a
 * rendered preview beside the design. Read-only, so closing one never asks to save; running the command again
 * updates the open preview in place.
 */
import * as vscode from 'vscode';
import { COMPARISON_SCHEME } from './identifiers.js';

export class ComparisonDocuments implements vscode.TextDocumentContentProvider, vscode.Disposable {
  private readonly contents = new Map<string, string>();
  private readonly changed = new vscode.EventEmitter<vscode.Uri>();
  readonly onDidChange = this.changed.event;

  /** Stores the comparison of a design and returns the URI of its document. */
  set(designUri: vscode.Uri, markdown: string): vscode.Uri {
    const fileName = designUri.path.split('/').pop() ?? 'design';
    // The design's URI rides in the query so two designs with the same file name get two documents.
    const uri = vscode.Uri.from({
      scheme: COMPARISON_SCHEME,
      path: `/${fileName} compared with the last commit.md`,
      query: designUri.toString(),
    });
    const key = uri.toString();
    const isUpdate = this.contents.has(key);
    this.contents.set(key, markdown);
    if (isUpdate) this.changed.fire(uri);
    return uri;
  }

  provideTextDocumentContent(uri: vscode.Uri): string {
    return this.contents.get(uri.toString()) ?? 'This comparison is no longer available: run "Runnel: Compare with Last Commit" again.';
  }

  dispose(): void {
    this.changed.dispose();
    this.contents.clear();
  }
}
