/**
 * `runnel diff --base REV` and the editor's comparison with the last commit, in temporary git repositories the
 * tests create: files modified, added, removed and renamed; a library change seen in the design that uses it;
 * unknown revisions and folders outside a repository.
 */
import { execFileSync } from 'node:child_process';
import { renameSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { compareWithLastCommit } from '../../server/git/compare-with-last-commit.js';
import { listChangedDesignFiles, readFileAtCommit, resolveCommit } from '../../server/git/repository.js';
import { ditchDesign, LINING_LIBRARY, PROCESS_TEST_TIMEOUT_MS, runRunnelInProcess, runRunnelProcess, temporaryFolder, writeFiles } from './cli-harness.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';

function git(cwd: string, ...args: string[]): string {
  return execFileSync('git', ['-c', 'user.name=Runnel test', '-c', 'user.email=test@example.invalid', '-c', 'commit.gpgsign=false', ...args], {
    cwd,
    encoding: 'utf8',
  });
}

function repositoryWith(files: Readonly<Record<string, string>>): string {
  const folder = temporaryFolder('repo');
  git(folder, 'init', '-q', '-b', 'main');
  writeFiles(folder, files);
  git(folder, 'add', '-A');
  git(folder, 'commit', '-q', '-m', 'base designs');
  return folder;
}

interface DiffDocument {
  readonly beforeLabel: string;
  readonly afterLabel: string;
  readonly unchangedDesignCount: number;
  readonly counts: { readonly newErrors: number };
  readonly policy: { readonly fails: boolean };
  readonly designs: readonly {
    readonly path: string;
    readonly previousPath: string | null;
    readonly fileChange: string;
    readonly reaches: readonly { readonly change: string; readonly inputChanges: readonly { field: string; before: unknown; after: unknown }[] }[];
  }[];
}

describe('runnel diff --base in a repository', () => {
  let folder = '';
  beforeAll(() => {
    folder = repositoryWith({
      'linings.runnel': LINING_LIBRARY,
      'designs/ditch.runnel': ditchDesign(),
      'designs/old-name.runnel': ditchDesign({ reach: 'lower' }),
      'designs/gone.runnel': ditchDesign({ reach: 'gone' }),
      'designs/steady.runnel': ditchDesign({ reach: 'steady' }),
    });
    // The change under review: a narrower ditch (over-topping), a file renamed with git mv, one deleted, one new
    // and not yet added to git.
    writeFileSync(join(folder, 'designs/ditch.runnel'), ditchDesign({ bottomFt: 3 }));
    git(folder, 'mv', 'designs/old-name.runnel', 'designs/new-name.runnel');
    rmSync(join(folder, 'designs/gone.runnel'));
    writeFileSync(join(folder, 'designs/added.runnel'), ditchDesign({ reach: 'added' }));
  });

  it('lists modified, renamed, removed and added files and counts the unchanged one', async () => {
    const run = await runRunnelInProcess(['diff', '--base', 'main', '--format', 'json'], { cwd: folder });
    expect(run.stderr).toBe('');
    const document = JSON.parse(run.stdout) as DiffDocument;
    const files = Object.fromEntries(document.designs.map((design) => [design.path, [design.fileChange, design.previousPath]]));
    expect(files).toEqual({
      'designs/added.runnel': ['added', null],
      'designs/ditch.runnel': ['modified', null],
      'designs/gone.runnel': ['removed', null],
      'designs/new-name.runnel': ['renamed', 'designs/old-name.runnel'],
    });
    expect(document.unchangedDesignCount).toBe(1); // steady.runnel; the unchanged library is not a design
    expect(document.beforeLabel).toMatch(/^main \([0-9a-f]{7,}\)$/);
    expect(document.afterLabel).toBe('working tree');
    const ditch = document.designs.find((design) => design.path === 'designs/ditch.runnel');
    expect(ditch?.reaches[0]?.inputChanges).toContainEqual(expect.objectContaining({ field: 'section.dimensions.bottomWidth_m' }));
    expect(document.counts.newErrors).toBeGreaterThan(0);
    expect(run.status).toBe(1);
  });

  it('limits the comparison to the PATHS given, relative to the current folder', async () => {
    const run = await runRunnelInProcess(['diff', '--base', 'HEAD', '--format', 'json', 'new-name.runnel'], { cwd: join(folder, 'designs') });
    const document = JSON.parse(run.stdout) as DiffDocument;
    expect(document.designs.map((design) => design.path)).toEqual(['new-name.runnel']);
    expect(run.status).toBe(0);
  });

  it(
    'runs as a child process with Markdown output',
    async () => {
      const run = await runRunnelProcess(['diff', '--base', 'main', '--fail-on', 'never'], { cwd: folder });
      expect(run.status).toBe(0);
      expect(run.stdout.split('\n')[0]).toMatch(/^\*\*Runnel design review: worse\*\*/);
      expect(run.stdout).toContain('<summary><b>designs/new-name.runnel</b>');
      expect(run.stdout).toContain('renamed from designs/old-name.runnel');
    },
    PROCESS_TEST_TIMEOUT_MS,
  );

  it('says which revision is unknown, and that a folder outside a repository has none (status 2)', async () => {
    const unknown = await runRunnelInProcess(['diff', '--base', 'no-such-branch'], { cwd: folder });
    expect(unknown.status).toBe(2);
    expect(unknown.stderr).toContain("unknown revision 'no-such-branch'");
    const outside = await runRunnelInProcess(['diff', '--base', 'main'], { cwd: temporaryFolder('no-repo') });
    expect(outside.status).toBe(2);
    expect(outside.stderr).toContain('not in one');
  });

  it('reads files at a revision and lists the changes git sees (the server/git layer)', async () => {
    const commit = await resolveCommit(folder, 'main');
    expect(await readFileAtCommit(folder, commit, 'designs/ditch.runnel')).toBe(ditchDesign());
    expect(await readFileAtCommit(folder, commit, 'designs/added.runnel')).toBeNull();
    const changes = await listChangedDesignFiles(folder, commit);
    expect(changes.map((change) => [change.status, change.path])).toEqual([
      ['added', 'designs/added.runnel'],
      ['modified', 'designs/ditch.runnel'],
      ['removed', 'designs/gone.runnel'],
      ['renamed', 'designs/new-name.runnel'],
    ]);
  });
});

describe('a library change shows in the designs that use it', () => {
  it('lists the lining input change in the design, not the library file', async () => {
    const folder = repositoryWith({ 'linings.runnel': LINING_LIBRARY, 'ditch.runnel': ditchDesign() });
    // Rougher turf: Manning's n 0.035 -> 0.045 (Chow 1959 Table 5-6 range for grass; from memory).
    writeFileSync(join(folder, 'linings.runnel'), LINING_LIBRARY.replace('n 0.035', 'n 0.045'));
    const run = await runRunnelInProcess(['diff', '--base', 'HEAD', '--format', 'json', '--fail-on', 'never'], { cwd: folder });
    const document = JSON.parse(run.stdout) as DiffDocument;
    expect(document.designs.map((design) => design.path)).toEqual(['ditch.runnel']);
    expect(document.designs[0]?.reaches[0]?.inputChanges).toContainEqual({ field: 'lining.manningN', label: "lining turf: Manning's n", kind: 'number', before: 0.035, after: 0.045 });
  });

  it('pairs a file renamed outside git (deleted, re-created untracked) when its text is unchanged', async () => {
    const folder = repositoryWith({ 'linings.runnel': LINING_LIBRARY, 'ditch.runnel': ditchDesign() });
    renameSync(join(folder, 'ditch.runnel'), join(folder, 'east-ditch.runnel'));
    const run = await runRunnelInProcess(['diff', '--base', 'HEAD', '--format', 'json'], { cwd: folder });
    const document = JSON.parse(run.stdout) as DiffDocument;
    expect(document.designs.map((design) => [design.path, design.fileChange, design.previousPath])).toEqual([['east-ditch.runnel', 'renamed', 'ditch.runnel']]);
  });
});

describe('compare with the last commit (the editor command)', () => {
  it('compares the editor text with HEAD', async () => {
    const folder = repositoryWith({ 'linings.runnel': LINING_LIBRARY, 'ditch.runnel': ditchDesign() });
    const result = await compareWithLastCommit({ filePath: join(folder, 'ditch.runnel'), currentText: ditchDesign({ bottomFt: 3 }), criteriaDefaults: NO_CRITERIA_DEFAULTS });
    expect(result.problem).toBeNull();
    expect(result.markdown).toMatch(/^\*\*Runnel design review: worse\*\*/);
    expect(result.markdown).toMatch(/Compared `last commit \([0-9a-f]{7,}\)` → `editor`/);
    expect(result.markdown).toContain('overtopping');
  });

  it('says so when the file is new since the last commit', async () => {
    const folder = repositoryWith({ 'linings.runnel': LINING_LIBRARY });
    writeFiles(folder, { 'new.runnel': ditchDesign() });
    const result = await compareWithLastCommit({ filePath: join(folder, 'new.runnel'), currentText: null, criteriaDefaults: NO_CRITERIA_DEFAULTS });
    expect(result.markdown).toContain('new file');
  });

  it('explains when the file is not in a repository, or the repository has no commit', async () => {
    const outside = temporaryFolder('outside');
    writeFiles(outside, { 'ditch.runnel': ditchDesign() });
    expect(await compareWithLastCommit({ filePath: join(outside, 'ditch.runnel'), currentText: null, criteriaDefaults: NO_CRITERIA_DEFAULTS })).toEqual({
      markdown: null,
      problem: 'This file is not in a git repository, so there is no last commit to compare it with.',
    });
    const empty = temporaryFolder('empty-repo');
    git(empty, 'init', '-q');
    writeFiles(empty, { 'ditch.runnel': ditchDesign() });
    const result = await compareWithLastCommit({ filePath: join(empty, 'ditch.runnel'), currentText: null, criteriaDefaults: NO_CRITERIA_DEFAULTS });
    expect(result.problem).toMatch(/no commits yet/);
  });
});
