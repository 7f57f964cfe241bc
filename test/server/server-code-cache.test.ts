/**
 * The language server as the editor starts it (dist/server.cjs) is a launcher that runs the server's bundle through
 * V8's code cache (server/code-cache.ts; the cache's safety cases are in test/cli/code-cache.test.ts). Over stdio: a
 * first start writes the cache when the server exits, a second start uses it and publishes the same diagnostics.
 * The launcher and bundle are those of `npm run build` (RUNNEL_SERVER_BUNDLE=dist/server.cjs, copied to a temporary
 * folder), else built from the sources with the shipped options.
 */
import { existsSync, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve as resolvePath } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CODE_CACHE_SUFFIX, SERVER_BUNDLE_FILE } from '../../.scripts/bundle-options.mjs';
import { cacheMadeFrom, placeLauncherPair } from './launcher-pair.js';
import { REPOSITORY_ROOT } from './server-bundle.js';
import { TestLanguageClient, pathToUri } from './lsp-client.js';

const SAMPLE = join(REPOSITORY_ROOT, 'samples', 'roadside-ditches.runnel');
const TIMEOUT_MS = 120_000;

let folder: string;
let launcher: string;
let bundle: string;

beforeAll(async () => {
  folder = mkdtempSync(join(tmpdir(), 'runnel-server-cache-'));
  const given = process.env['RUNNEL_SERVER_BUNDLE'];
  // A given server that is not a launcher (no bundle beside it) is ignored: the pair is built from the sources.
  const shipped = given === undefined || given === '' ? undefined : resolvePath(REPOSITORY_ROOT, given);
  const isLauncher = shipped !== undefined && existsSync(join(dirname(shipped), SERVER_BUNDLE_FILE));
  ({ launcher, bundle } = await placeLauncherPair(folder, 'server', 'server.cjs', isLauncher ? shipped : undefined));
}, TIMEOUT_MS);

afterAll(() => rmSync(folder, { recursive: true, force: true }));

/** Starts the launcher, opens the sample, returns its diagnostics (message and range) and stops the server. */
async function diagnosticsOfOneSession(): Promise<unknown[]> {
  const { client } = await TestLanguageClient.start({ serverPath: launcher });
  try {
    const uri = pathToUri(SAMPLE);
    await client.open(uri, readFileSync(SAMPLE, 'utf8'));
    const diagnostics = await client.diagnostics(uri);
    return diagnostics.map(({ message, range, severity }) => ({ message, range, severity }));
  } finally {
    await client.stop();
  }
}

describe('the language server launcher', () => {
  it(
    'writes the code cache when the server exits, and the next start uses it and publishes the same diagnostics',
    async () => {
      const cache = `${bundle}${CODE_CACHE_SUFFIX}`;
      rmSync(cache, { force: true });
      const first = await diagnosticsOfOneSession();
      expect(first.length).toBeGreaterThan(0);
      expect(cacheMadeFrom(cache, bundle)).toBe(true);
      const inode = statSync(cache).ino;
      expect(await diagnosticsOfOneSession()).toEqual(first);
      expect(statSync(cache).ino).toBe(inode); // accepted, not written again
    },
    TIMEOUT_MS,
  );
});
