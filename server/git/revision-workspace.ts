/**
 * Two versions of a repository's designs for a comparison: every design file at a commit (read from git) and
 * every design file of the working tree (read from disk), paired by path with renames followed. Each version is
 * a whole workspace, so a design is analysed with the library files of its own version.
 */
import { readFileSync } from 'node:fs';
import { join, sep } from 'node:path';
import type { WorkspaceFile } from '../cli/analyse-workspace.js';
import { listChangedDesignFiles, listWorkingTreeDesignFiles, readDesignFilesAtCommit } from './repository.js';

/** One design file across the two versions; a side is null where the file does not exist. */
export interface DesignFilePair {
  /** Repository-relative path in the working tree (the old path for a removed file). */
  readonly path: string;
  /** The old path when the file was renamed, otherwise null. */
  readonly previousPath: string | null;
  /** Absolute path of the file in the commit's workspace, or null when it is new. */
  readonly basePath: string | null;
  /** Absolute path in the working tree, or null when it was removed. */
  readonly workingPath: string | null;
}

export interface RevisionComparisonFiles {
  readonly baseFiles: readonly WorkspaceFile[];
  readonly workingFiles: readonly WorkspaceFile[];
  readonly pairs: readonly DesignFilePair[];
}

function absolute(root: string, repositoryPath: string): string {
  return join(root, ...repositoryPath.split('/'));
}

/**
 * Every design file at `commit` and in the working tree, and their pairing. `overrides` replaces working-tree
 * texts (an editor's unsaved text), by absolute path; a path given there is part of the working tree even when
 * git does not list it. The commit's files get the absolute paths they would have in the working tree, so that
 * findings of both versions name the same file.
 */
export async function revisionComparisonFiles(
  root: string,
  commit: string,
  overrides: ReadonlyMap<string, string> = new Map(),
): Promise<RevisionComparisonFiles> {
  const base = await readDesignFilesAtCommit(root, commit);
  const workingPaths = await listWorkingTreeDesignFiles(root);
  const changes = await listChangedDesignFiles(root, commit);

  const baseFiles = base.map((file) => ({ path: absolute(root, file.path), text: file.text }));
  const workingFiles: WorkspaceFile[] = [];
  const workingTexts = new Map<string, string>();
  for (const path of workingPaths) {
    const full = absolute(root, path);
    let text = overrides.get(full);
    if (text === undefined) {
      try {
        text = readFileSync(full, 'utf8');
      } catch {
        continue; // Vanished or unreadable since git listed it: treated as removed.
      }
    }
    workingFiles.push({ path: full, text });
    workingTexts.set(path, text);
  }
  for (const [full, text] of overrides) {
    const path = full.startsWith(root + sep) ? full.slice(root.length + 1).split(sep).join('/') : null;
    if (path !== null && !workingTexts.has(path)) {
      workingFiles.push({ path: full, text });
      workingTexts.set(path, text);
    }
  }

  const baseTexts = new Map(base.map((file) => [file.path, file.text]));
  const renamedFrom = new Map<string, string>();
  for (const change of changes) {
    if (change.status === 'renamed' && change.previousPath !== null) renamedFrom.set(change.path, change.previousPath);
  }
  // A file renamed outside git (removed, then re-created untracked) is paired when its text is unchanged.
  const renamedTo = new Set(renamedFrom.values());
  const removed = [...baseTexts.keys()].filter((path) => !workingTexts.has(path) && !renamedTo.has(path));
  for (const path of [...workingTexts.keys()].filter((path) => !baseTexts.has(path) && !renamedFrom.has(path))) {
    const text = workingTexts.get(path);
    const twins = removed.filter((old) => baseTexts.get(old) === text && !renamedTo.has(old));
    const twin = twins.length === 1 ? twins[0] : undefined;
    if (twin !== undefined) {
      renamedFrom.set(path, twin);
      renamedTo.add(twin);
    }
  }

  const pairs: DesignFilePair[] = [];
  for (const path of [...workingTexts.keys()].sort()) {
    const previous = renamedFrom.get(path) ?? null;
    const basePath = previous ?? (baseTexts.has(path) ? path : null);
    pairs.push({ path, previousPath: previous, basePath: basePath === null ? null : absolute(root, basePath), workingPath: absolute(root, path) });
  }
  for (const path of [...baseTexts.keys()].sort()) {
    if (workingTexts.has(path) || renamedTo.has(path)) continue;
    pairs.push({ path, previousPath: null, basePath: absolute(root, path), workingPath: null });
  }
  return { baseFiles, workingFiles, pairs };
}
