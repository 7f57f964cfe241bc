// Bundles Runnel's three Node entry points with esbuild into CommonJS files under dist/:
// the language server, the `runnel` CLI and the VS Code extension client (vscode stays external).
// Each entry imports language/polyfills/object-group-by.cjs first (Langium 4.4 on Node 20).
import { build } from 'esbuild';
import { chmodSync } from 'node:fs';

const common = {
  bundle: true,
  format: 'cjs',
  platform: 'node',
  target: 'node20',
  sourcemap: true,
  minify: process.argv.includes('--minify'),
  logLevel: 'warning',
  // Langium and its dependencies ship ESM that reads import.meta.url in a few places; map it for CJS output.
  define: { 'import.meta.url': 'importMetaUrl' },
  banner: { js: "const importMetaUrl = require('url').pathToFileURL(__filename).href;" },
};

await Promise.all([
  build({ ...common, entryPoints: ['server/language-server.ts'], outfile: 'dist/server.cjs' }),
  build({
    ...common,
    entryPoints: ['server/cli.ts'],
    outfile: 'dist/runnel.cjs',
    banner: { js: `#!/usr/bin/env node\n${common.banner.js}` },
  }),
  build({ ...common, entryPoints: ['extension/extension.ts'], outfile: 'dist/extension.cjs', external: ['vscode'] }),
]);
chmodSync('dist/runnel.cjs', 0o755);
