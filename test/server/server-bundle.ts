/**
 * The server bundle the protocol tests and the benchmark run: built from the current sources with the options of
 * scripts/build.mjs (esbuild, CommonJS, node20, the import.meta.url mapping) into a temporary folder, so the tests
 * always drive what `npm run build` would ship. RUNNEL_SERVER_BUNDLE=path uses an existing bundle instead
 * (e.g. dist/server.cjs in CI after `npm run build`).
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'esbuild';

export const REPOSITORY_ROOT = join(import.meta.dirname, '..', '..');

let bundlePath: Promise<string> | undefined;

export function serverBundle(): Promise<string> {
  bundlePath ??= buildBundle();
  return bundlePath;
}

async function buildBundle(): Promise<string> {
  const given = process.env['RUNNEL_SERVER_BUNDLE'];
  if (given !== undefined && given !== '') return given;
  const outfile = join(mkdtempSync(join(tmpdir(), 'runnel-server-')), 'server.cjs');
  await build({
    entryPoints: [join(REPOSITORY_ROOT, 'server', 'language-server.ts')],
    outfile,
    bundle: true,
    format: 'cjs',
    platform: 'node',
    target: 'node20',
    sourcemap: true,
    logLevel: 'warning',
    define: { 'import.meta.url': 'importMetaUrl' },
    banner: { js: "const importMetaUrl = require('url').pathToFileURL(__filename).href;" },
  });
  return outfile;
}
