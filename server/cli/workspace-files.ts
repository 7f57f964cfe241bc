/**
 * Which files the CLI loads with a design, so names defined in other files (a shared library of linings) resolve
 * exactly as in the editor. The workspace of a design file is:
 * 1. the folder given with `--workspace`, if any; otherwise
 * 2. the root of the git repository that holds the file (the nearest parent folder with a `.git` entry);
 *    otherwise
 * 3. the current folder, when the file is inside it; otherwise
 * 4. the file's own folder.
 * Every `.runnel` file under that folder is loaded, as the editor loads a workspace folder, except inside
 * `node_modules` and folders whose name starts with a dot.
 */
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { UsageError } from './arguments.js';
import type { WorkspaceFile } from './analyse-workspace.js';

import { DESIGN_FILE_EXTENSION } from '../git/repository.js';

/** Stops a walk of a huge folder (a home directory by mistake) from running for minutes. */
const MAX_FOLDERS_VISITED = 20_000;

export function isInside(folder: string, path: string): boolean {
  const fromFolder = relative(folder, path);
  return fromFolder === '' || (!fromFolder.startsWith('..') && !fromFolder.startsWith(sep) && !/^[A-Za-z]:/.test(fromFolder));
}

/** The nearest folder at or above `folder` that holds a `.git` entry (folder or file), or null. */
export function gitRootAbove(folder: string): string | null {
  let current = resolve(folder);
  for (;;) {
    if (existsSync(join(current, '.git'))) return current;
    const parent = dirname(current);
    if (parent === current) return null;
    current = parent;
  }
}

/** The workspace folder of a design file (see the module comment). */
export function workspaceRootOf(filePath: string, cwd: string, override: string | undefined): string {
  if (override !== undefined) return resolve(cwd, override);
  const gitRoot = gitRootAbove(dirname(filePath));
  if (gitRoot !== null) return gitRoot;
  if (isInside(cwd, filePath)) return cwd;
  return dirname(filePath);
}

/** Every design file under `folder` (see the module comment for what is skipped), sorted. */
export function designFilesUnder(folder: string): string[] {
  const found: string[] = [];
  const pending = [folder];
  let visited = 0;
  while (pending.length > 0 && visited < MAX_FOLDERS_VISITED) {
    const current = pending.pop() ?? folder;
    visited++;
    let entries;
    try {
      entries = readdirSync(current, { withFileTypes: true });
    } catch {
      continue; // An unreadable folder holds nothing we can load; the files asked for are checked separately.
    }
    for (const entry of entries) {
      if (entry.name.startsWith('.') || entry.name === 'node_modules') continue;
      const path = join(current, entry.name);
      if (entry.isDirectory()) pending.push(path);
      else if (entry.isFile() && entry.name.endsWith(DESIGN_FILE_EXTENSION)) found.push(path);
    }
  }
  return found.sort();
}

/**
 * The design files named on the command line, with folders expanded to the design files under them. A missing
 * or unreadable path is a UsageError naming it.
 */
export function expandTargets(paths: readonly string[], cwd: string): string[] {
  const targets: string[] = [];
  for (const written of paths) {
    const path = resolve(cwd, written);
    let stats;
    try {
      stats = statSync(path);
    } catch {
      throw new UsageError(`cannot read '${written}': no such file or folder`);
    }
    if (stats.isDirectory()) {
      const inside = designFilesUnder(path);
      if (inside.length === 0) throw new UsageError(`no ${DESIGN_FILE_EXTENSION} files in folder '${written}'`);
      targets.push(...inside);
    } else {
      targets.push(path);
    }
  }
  return [...new Set(targets)];
}

function readText(path: string, written: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (error) {
    const reason = (error as NodeJS.ErrnoException).code === 'EACCES' ? 'permission denied' : 'it cannot be read';
    throw new UsageError(`cannot read '${written}': ${reason}`);
  }
}

/**
 * The targets and every other design file of their workspaces, read from disk. `exclude` leaves files out of the
 * workspace (`runnel diff OLD NEW` loads each version without the other, which defines the same names).
 */
export function readWorkspaceFiles(
  targets: readonly string[],
  cwd: string,
  options: { readonly workspace?: string; readonly exclude?: readonly string[] } = {},
): WorkspaceFile[] {
  const excluded = new Set(options.exclude ?? []);
  const files: WorkspaceFile[] = targets.map((path) => ({ path, text: readText(path, displayPath(path, cwd)) }));
  const loaded = new Set<string>(targets);
  for (const target of targets) {
    for (const path of designFilesUnder(workspaceRootOf(target, cwd, options.workspace))) {
      if (excluded.has(path) || loaded.has(path)) continue;
      loaded.add(path);
      try {
        files.push({ path, text: readFileSync(path, 'utf8') });
      } catch {
        // Another file of the workspace that cannot be read only takes its definitions away; the files asked
        // for are still checked, and a reference into it is reported as unresolved.
      }
    }
  }
  return files;
}

/** A path as the user should see it: relative to the current folder when inside it, with `/`. */
export function displayPath(path: string, cwd: string): string {
  const shown = isInside(cwd, path) ? relative(cwd, path) : path;
  return shown.split(sep).join('/');
}
