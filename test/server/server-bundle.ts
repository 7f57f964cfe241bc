/**
 * The server bundle the protocol tests and the benchmark run: built from the current sources with the options of
 * .scripts/build.mjs (esbuild, CommonJS, node20, the import.meta.url mapping) into a temporary folder, so the tests
 * always drive what `npm run build` would ship. RUNNEL_SERVER_BUNDLE=path uses an existing bundle instead
 * (e.g. dist/server.cjs in CI after `npm run build`).
 */
import { mkdirSync, readdirSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve as resolvePath } from 'node:path';
import { build } from 'esbuild';
import { NODE_BUNDLE_OPTIONS } from '../../.scripts/bundle-options.mjs';

export const REPOSITORY_ROOT = join(import.meta.dirname, '..', '..');

let bundlePath: Promise<string> | undefined;

export function serverBundle(): Promise<string> {
  bundlePath ??= buildBundle();
  return bundlePath;
}

async function buildBundle(): Promise<string> {
  const given = process.env['RUNNEL_SERVER_BUNDLE'];
  // A relative path is relative to the repository (npm test passes dist/server.cjs).
  if (given !== undefined && given !== '') return resolvePath(REPOSITORY_ROOT, given);
  // One folder for every test process's bundle; bundles older than an hour are left-overs of earlier runs.
  const folder = join(tmpdir(), 'runnel-server-bundles');
  mkdirSync(folder, { recursive: true });
  for (const file of readdirSync(folder)) {
    const path = join(folder, file);
    if (Date.now() - statSync(path).mtimeMs > 3_600_000) rmSync(path, { force: true });
  }
  const outfile = join(folder, `server-${process.pid}.cjs`);
  process.once('exit', () => {
    rmSync(outfile, { force: true });
    rmSync(`${outfile}.map`, { force: true });
  });
  await build({ ...NODE_BUNDLE_OPTIONS, entryPoints: [join(REPOSITORY_ROOT, 'server', 'language-server.ts')], outfile });
  return outfile;
}
