// Bundles Runnel's three Node entry points with esbuild into CommonJS files under dist/:
// the language server, the `runnel` CLI and the VS Code extension client (vscode stays external).
// Each entry imports language/polyfills/object-group-by.cjs first (Langium 4.4 on Node 20).
import { build } from 'esbuild';
import { spawnSync } from 'node:child_process';
import { chmodSync } from 'node:fs';
import { CLI_BANNER, CLI_BUNDLE_FILE, NODE_BUNDLE_OPTIONS, SERVER_BUNDLE_FILE } from './bundle-options.mjs';

const common = { ...NODE_BUNDLE_OPTIONS, minify: process.argv.includes('--minify') };

await Promise.all([
  // The language server and the `runnel` command: each a small launcher that runs its bundle through V8's code cache
  // (server/code-cache.ts).
  build({ ...common, entryPoints: ['server/language-server.ts'], outfile: `dist/${SERVER_BUNDLE_FILE}` }),
  build({ ...common, entryPoints: ['server/server-launcher.ts'], outfile: 'dist/server.cjs' }),
  build({ ...common, entryPoints: ['server/cli.ts'], outfile: `dist/${CLI_BUNDLE_FILE}` }),
  build({ ...common, entryPoints: ['server/cli-launcher.ts'], outfile: 'dist/runnel.cjs', banner: CLI_BANNER }),
  build({ ...common, entryPoints: ['extension/extension.ts'], outfile: 'dist/extension.cjs', external: ['vscode'] }),
]);
chmodSync('dist/runnel.cjs', 0o755);

// Write the CLI's code cache now (server/code-cache.ts) by checking one sample, so that the first `runnel` start
// after a build is as quick as the next: a run with no cache writes one covering only the functions it ran (the
// cache of an earlier build is for another bundle and is replaced).
const warmUp = spawnSync(process.execPath, ['dist/runnel.cjs', 'check', 'samples/roadside-ditches.runnel', 'samples/linings.runnel'], { encoding: 'utf8' });
if (warmUp.status !== 0 && warmUp.status !== 1) throw new Error(`runnel check of a sample failed after the build (status ${warmUp.status}):\n${warmUp.stderr}`);
