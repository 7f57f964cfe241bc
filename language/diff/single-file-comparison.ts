/**
 * One design file against an earlier version of itself, as Markdown: what the editor's "compare with the last
 * commit" shows beside the text. Pure; server/git reads the earlier version and the server analyses both.
 */
import { compareDesignVersions, type DesignVersion } from './compare-designs.js';
import { renderComparisonMarkdown } from './render-comparison-markdown.js';

export interface SingleFileComparisonInput {
  /** Workspace-relative path of the file (the heading of the details). */
  readonly path: string;
  /** Its path in the earlier version when git saw a rename, otherwise null. */
  readonly previousPath: string | null;
  /** The earlier version, or null when the file is new since then. */
  readonly before: DesignVersion | null;
  readonly after: DesignVersion;
  /** e.g. "last commit (3f2a9c1)". */
  readonly beforeLabel: string;
  /** e.g. "editor" or "working tree". */
  readonly afterLabel: string;
}

export function renderSingleFileComparison(input: SingleFileComparisonInput): string {
  const report = compareDesignVersions([{ path: input.path, previousPath: input.previousPath, before: input.before, after: input.after }], {
    beforeLabel: input.beforeLabel,
    afterLabel: input.afterLabel,
  });
  return renderComparisonMarkdown(report);
}
