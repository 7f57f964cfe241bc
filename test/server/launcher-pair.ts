/**
 * A launcher of server/code-cache.ts and the bundle it runs, placed together in a folder for the tests and the
 * cold-start bench: copies of the pair `npm run build` made when its launcher is given (e.g. dist/runnel.cjs), else
 * both built from the sources with the shipped options (.scripts/bundle-options.mjs), so the folder can be changed
 * without touching dist/.
 */
import { createHash } from 'node:crypto';
import { copyFileSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { build } from 'esbuild';
import { CLI_BANNER, CLI_BUNDLE_FILE, NODE_BUNDLE_OPTIONS, SERVER_BUNDLE_FILE } from '../../.scripts/bundle-options.mjs';
import { REPOSITORY_ROOT } from './server-bundle.js';

const PROGRAMS = {
  cli: { entry: 'cli.ts', launcherEntry: 'cli-launcher.ts', bundleFile: CLI_BUNDLE_FILE, banner: CLI_BANNER },
  server: { entry: 'language-server.ts', launcherEntry: 'server-launcher.ts', bundleFile: SERVER_BUNDLE_FILE, banner: NODE_BUNDLE_OPTIONS.banner },
} as const;

export interface LauncherPair {
  readonly launcher: string;
  readonly bundle: string;
}

/** Places the launcher (named `launcherFile`) and the bundle of `program` in `folder`. */
export async function placeLauncherPair(folder: string, program: keyof typeof PROGRAMS, launcherFile: string, shippedLauncher?: string): Promise<LauncherPair> {
  const { entry, launcherEntry, bundleFile, banner } = PROGRAMS[program];
  const launcher = join(folder, launcherFile);
  const bundle = join(folder, bundleFile);
  if (shippedLauncher !== undefined) {
    copyFileSync(shippedLauncher, launcher);
    copyFileSync(join(dirname(shippedLauncher), bundleFile), bundle);
  } else {
    await build({ ...NODE_BUNDLE_OPTIONS, entryPoints: [join(REPOSITORY_ROOT, 'server', entry)], outfile: bundle });
    await build({ ...NODE_BUNDLE_OPTIONS, entryPoints: [join(REPOSITORY_ROOT, 'server', launcherEntry)], outfile: launcher, ...(banner === undefined ? {} : { banner }) });
  }
  return { launcher, bundle };
}

/** Whether the code-cache file `cachePath` is headed by the SHA-256 of the bundle now at `bundlePath`. */
export function cacheMadeFrom(cachePath: string, bundlePath: string): boolean {
  const digest = createHash('sha256').update(readFileSync(bundlePath)).digest();
  return readFileSync(cachePath).subarray(0, digest.length).equals(digest);
}
