// Bundles Runnel's three Node entry points with esbuild into CommonJS files under dist/:
// the language server, the `runnel` CLI and the VS Code extension client (vscode stays external).
// Each entry imports language/polyfills/object-group-by.cjs first (Langium 4.4 on Node 20).
import { build } from 'esbuild';
import { chmodSync } from 'node:fs';
import { CLI_BANNER, NODE_BUNDLE_OPTIONS } from './bundle-options.mjs';

const common = { ...NODE_BUNDLE_OPTIONS, minify: process.argv.includes('--minify') };

await Promise.all([
  build({ ...common, entryPoints: ['server/language-server.ts'], outfile: 'dist/server.cjs' }),
  build({
    ...common,
    entryPoints: ['server/cli.ts'],
    outfile: 'dist/runnel.cjs',
    banner: CLI_BANNER,
  }),
  build({ ...common, entryPoints: ['extension/extension.ts'], outfile: 'dist/extension.cjs', external: ['vscode'] }),
]);
chmodSync('dist/runnel.cjs', 0o755);
