/**
 * What Runnel reads from a git repository, through the `git` command line: the repository root, a revision's
 * commit, the design files at a revision and their text, the design files of the working tree, and which design
 * files changed since a revision (added, removed, modified, renamed). Paths are repository-relative with `/`.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { RunnelLanguageMetaData } from '../../language/generated/module.js';
import { GitError, gitText, runGit } from './run-git.js';

/** Design files are recognised by their extension, the one the language declares (langium-config.json). */
export const DESIGN_FILE_EXTENSION: string = RunnelLanguageMetaData.fileExtensions[0];

export function isDesignPath(path: string): boolean {
  return path.endsWith(DESIGN_FILE_EXTENSION);
}

/** The top folder of the repository that holds `directory`, or null when it is not in one. */
export async function findRepositoryRoot(directory: string): Promise<string | null> {
  const output = await runGit(['rev-parse', '--show-toplevel'], directory);
  if (output.exitCode !== 0) return null;
  return output.stdout.toString('utf8').trim();
}

/** The full commit id that `revision` names (a branch, a tag, `HEAD~1`, an id); a GitError when there is none. */
export async function resolveCommit(root: string, revision: string): Promise<string> {
  if (revision.startsWith('-')) throw new GitError(`'${revision}' is not a revision`);
  const output = await runGit(['rev-parse', '--verify', '--quiet', `${revision}^{commit}`], root);
  if (output.exitCode !== 0) throw new GitError(`unknown revision '${revision}': no commit, branch or tag of that name in ${root}`);
  return output.stdout.toString('utf8').trim();
}

/** The abbreviated id git shows for a commit, e.g. `3f2a9c1`. */
export async function shortCommitId(root: string, commit: string): Promise<string> {
  return (await gitText(['rev-parse', '--short', commit], root, `cannot abbreviate commit ${commit}`)).trim();
}

/** Whether HEAD names a commit yet (a new repository has none). */
export async function hasCommits(root: string): Promise<boolean> {
  return (await runGit(['rev-parse', '--verify', '--quiet', 'HEAD^{commit}'], root)).exitCode === 0;
}

export interface FileAtRevision {
  /** Repository-relative path with `/`. */
  readonly path: string;
  readonly text: string;
}

/** Every design file of `commit` with its text, read with one `git ls-tree` and one `git cat-file --batch`. */
export async function readDesignFilesAtCommit(root: string, commit: string): Promise<FileAtRevision[]> {
  const listing = await gitText(['ls-tree', '-r', '-z', '--full-tree', commit], root, `cannot list the files of ${commit}`);
  const blobs = listing
    .split('\0')
    .filter((entry) => entry.length > 0)
    .flatMap((entry) => {
      // "<mode> <type> <object>\t<path>"
      const tab = entry.indexOf('\t');
      const [, type, object] = entry.slice(0, tab).split(' ');
      const path = entry.slice(tab + 1);
      return type === 'blob' && object !== undefined && isDesignPath(path) ? [{ path, object }] : [];
    });
  if (blobs.length === 0) return [];
  const texts = await readBlobs(root, blobs.map((blob) => blob.object));
  return blobs.map((blob) => ({ path: blob.path, text: texts.get(blob.object) ?? '' }));
}

/** The text of one file at `commit`, or null when the file does not exist there. */
export async function readFileAtCommit(root: string, commit: string, path: string): Promise<string | null> {
  const exists = await runGit(['cat-file', '-e', `${commit}:${path}`], root);
  if (exists.exitCode !== 0) return null;
  return gitText(['cat-file', 'blob', `${commit}:${path}`], root, `cannot read ${path} at ${commit}`);
}

/** Reads blobs by object id with `git cat-file --batch` (one process for all of them). */
async function readBlobs(root: string, objects: readonly string[]): Promise<Map<string, string>> {
  const unique = [...new Set(objects)];
  const output = await runGit(['cat-file', '--batch'], root, `${unique.join('\n')}\n`);
  if (output.exitCode !== 0) throw new GitError(`cannot read file contents: ${output.stderr}`);
  const texts = new Map<string, string>();
  const buffer = output.stdout;
  let offset = 0;
  for (const object of unique) {
    // Each object: "<id> <type> <size>\n<contents>\n"
    const headerEnd = buffer.indexOf(0x0a, offset);
    if (headerEnd < 0) throw new GitError(`unexpected output from git cat-file for ${object}`);
    const header = buffer.subarray(offset, headerEnd).toString('utf8').split(' ');
    const size = Number(header[2]);
    if (header[1] === 'missing' || !Number.isInteger(size)) throw new GitError(`git object ${object} is missing`);
    texts.set(object, buffer.subarray(headerEnd + 1, headerEnd + 1 + size).toString('utf8'));
    offset = headerEnd + 1 + size + 1;
  }
  return texts;
}

/**
 * The design files of the working tree: tracked ones that still exist and untracked ones that are not ignored
 * (a new design not yet added to git is part of the change under review).
 */
export async function listWorkingTreeDesignFiles(root: string): Promise<string[]> {
  const listing = await gitText(['ls-files', '-z', '--cached', '--others', '--exclude-standard'], root, 'cannot list the working tree');
  const paths = new Set(listing.split('\0').filter((path) => path.length > 0 && isDesignPath(path)));
  return [...paths].filter((path) => existsSync(join(root, path))).sort();
}

export type FileStatus = 'added' | 'removed' | 'modified' | 'renamed';

export interface ChangedFile {
  readonly status: FileStatus;
  /** Path in the working tree (the old path for a removed file). */
  readonly path: string;
  /** Path at the revision for a renamed file, otherwise null. */
  readonly previousPath: string | null;
}

/**
 * Design files that differ between `commit` and the working tree, with git's rename detection (`-M`, 50 %
 * similarity), plus untracked design files as added. A file renamed outside git (deleted and re-created
 * untracked) is seen by git as removed and added; callers that have both texts can pair identical ones.
 */
export async function listChangedDesignFiles(root: string, commit: string): Promise<ChangedFile[]> {
  const diff = await gitText(['diff', '-z', '-M', '--name-status', commit, '--'], root, `cannot compare the working tree with ${commit}`);
  const fields = diff.split('\0');
  const changes: ChangedFile[] = [];
  for (let index = 0; index < fields.length; ) {
    const status = fields[index] ?? '';
    if (status === '') break;
    if (status.startsWith('R') || status.startsWith('C')) {
      const from = fields[index + 1] ?? '';
      const to = fields[index + 2] ?? '';
      index += 3;
      if (status.startsWith('R') && (isDesignPath(from) || isDesignPath(to))) {
        if (isDesignPath(from) && isDesignPath(to)) changes.push({ status: 'renamed', path: to, previousPath: from });
        else if (isDesignPath(to)) changes.push({ status: 'added', path: to, previousPath: null });
        else changes.push({ status: 'removed', path: from, previousPath: null });
      } else if (isDesignPath(to)) {
        changes.push({ status: 'added', path: to, previousPath: null });
      }
      continue;
    }
    const path = fields[index + 1] ?? '';
    index += 2;
    if (!isDesignPath(path)) continue;
    const kind = status[0];
    changes.push({ status: kind === 'A' ? 'added' : kind === 'D' ? 'removed' : 'modified', path, previousPath: null });
  }
  const untracked = await gitText(['ls-files', '-z', '--others', '--exclude-standard'], root, 'cannot list untracked files');
  for (const path of untracked.split('\0')) {
    if (path.length > 0 && isDesignPath(path)) changes.push({ status: 'added', path, previousPath: null });
  }
  return changes.sort((a, b) => a.path.localeCompare(b.path));
}
