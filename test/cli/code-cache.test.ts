/**
 * The `runnel` launcher (server/cli-launcher.ts) runs the CLI bundle through V8's code cache. A cache must never
 * change what the CLI does: whatever the cache file holds (nothing, another bundle's data, junk, a folder in its
 * place), `runnel check` prints the same as without it, and only data made from the bundle as it is now is used.
 * The launcher and bundle are those of `npm run build` (RUNNEL_CLI_BUNDLE=dist/runnel.cjs, copied to a temporary
 * folder so the tests can change them), else built from the sources with the shipped options.
 */
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve as resolvePath } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CODE_CACHE_SUFFIX } from '../../.scripts/bundle-options.mjs';
import { CAUTION } from '../../language/analysis/provenance.js';
import { cacheMadeFrom, placeLauncherPair } from '../server/launcher-pair.js';
import { PROCESS_TEST_TIMEOUT_MS, REPOSITORY_ROOT } from './cli-harness.js';

const SAMPLE = join(REPOSITORY_ROOT, 'samples', 'roadside-ditches.runnel');
const LININGS = join(REPOSITORY_ROOT, 'samples', 'linings.runnel');

let folder: string;
let launcher: string;
let bundle: string;
let cache: string;

beforeAll(async () => {
  folder = mkdtempSync(join(tmpdir(), 'runnel-code-cache-'));
  const given = process.env['RUNNEL_CLI_BUNDLE'];
  ({ launcher, bundle } = await placeLauncherPair(folder, 'cli', 'runnel.cjs', given === undefined || given === '' ? undefined : resolvePath(REPOSITORY_ROOT, given)));
  cache = `${bundle}${CODE_CACHE_SUFFIX}`;
}, PROCESS_TEST_TIMEOUT_MS);

afterAll(() => rmSync(folder, { recursive: true, force: true }));

function check(): { readonly status: number | null; readonly stdout: string; readonly stderr: string } {
  const result = spawnSync(process.execPath, [launcher, 'check', SAMPLE, LININGS], { cwd: REPOSITORY_ROOT, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
  return { status: result.status, stdout: result.stdout, stderr: result.stderr };
}

const sha256 = (bytes: Buffer): Buffer => createHash('sha256').update(bytes).digest();

describe('the runnel launcher and its code cache', () => {
  it(
    'writes the cache on the first start, headed by the digest of its bundle, and a second start uses it unchanged with the same output',
    () => {
      rmSync(cache, { force: true });
      const first = check();
      expect(first.stderr).toBe('');
      expect(first.stdout).toContain('Caution:');
      const written = readFileSync(cache);
      expect(cacheMadeFrom(cache, bundle)).toBe(true);
      expect(written.length).toBeGreaterThan(100_000); // the compiled functions, not only the top level
      const inode = statSync(cache).ino;
      const second = check();
      expect(second).toEqual(first);
      // Accepted data is not written again (a write goes through a new file, which gets a new inode).
      expect(statSync(cache).ino).toBe(inode);
    },
    PROCESS_TEST_TIMEOUT_MS,
  );

  it(
    'does not run the code of an earlier bundle of the same length (V8 alone would: it compares lengths only)',
    () => {
      rmSync(cache, { force: true });
      check(); // cache of the bundle as built
      const original = readFileSync(bundle, 'utf8');
      const sentence = CAUTION.slice(0, 40);
      expect(original).toContain(sentence);
      const changed = sentence.toUpperCase();
      expect(changed.length).toBe(sentence.length);
      writeFileSync(bundle, original.replace(sentence, changed));
      try {
        expect(readFileSync(bundle).length).toBe(Buffer.byteLength(original));
        const run = check();
        expect(run.stdout).toContain(changed);
        expect(run.stdout).not.toContain(sentence);
        expect(cacheMadeFrom(cache, bundle)).toBe(true);
      } finally {
        writeFileSync(bundle, original);
      }
    },
    PROCESS_TEST_TIMEOUT_MS,
  );

  it(
    'runs as without a cache when the file holds junk under the right digest, and replaces it',
    () => {
      rmSync(cache, { force: true });
      const reference = check();
      writeFileSync(cache, Buffer.concat([sha256(readFileSync(bundle)), Buffer.alloc(50_000, 0x5a)]));
      const inode = statSync(cache).ino;
      expect(check()).toEqual(reference);
      expect(statSync(cache).ino).not.toBe(inode);
      expect(readFileSync(cache).length).toBeGreaterThan(100_000);
      expect(check()).toEqual(reference);
    },
    PROCESS_TEST_TIMEOUT_MS,
  );

  it(
    'runs as without a cache when it cannot read or write one (a folder in its place)',
    () => {
      rmSync(cache, { force: true });
      const reference = check();
      rmSync(cache, { force: true });
      mkdirSync(cache);
      try {
        expect(check()).toEqual(reference);
        expect(statSync(cache).isDirectory()).toBe(true);
        expect(readdirSync(folder).filter((file) => file.endsWith('.tmp'))).toEqual([]);
      } finally {
        rmSync(cache, { recursive: true, force: true });
      }
    },
    PROCESS_TEST_TIMEOUT_MS,
  );
});
