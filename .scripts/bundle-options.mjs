// The one home of Runnel's esbuild options for Node bundles, shared by .scripts/build.mjs, the protocol tests'
// server bundle (test/server/server-bundle.ts) and the cold-start benchmark (test/bench/cold-start.ts), so that
// tests and benchmarks always run what ships.

/** The JavaScript line that maps import.meta.url for CommonJS output. */
export const IMPORT_META_URL_SHIM = "const importMetaUrl = require('url').pathToFileURL(__filename).href;";

/** esbuild options common to every Node bundle (CommonJS, node20). */
export const NODE_BUNDLE_OPTIONS = Object.freeze({
  bundle: true,
  format: 'cjs',
  platform: 'node',
  target: 'node20',
  sourcemap: true,
  logLevel: 'warning',
  // Langium and its dependencies ship ESM that reads import.meta.url in a few places; map it for CJS output.
  define: { 'import.meta.url': 'importMetaUrl' },
  banner: { js: IMPORT_META_URL_SHIM },
});

/** The banner of the `runnel` CLI bundle: a shebang, then the shim. */
export const CLI_BANNER = Object.freeze({ js: `#!/usr/bin/env node\n${IMPORT_META_URL_SHIM}` });

/** The CLI bundle's file, beside the `runnel` launcher (dist/runnel.cjs, server/cli-launcher.ts) that runs it. */
export const CLI_BUNDLE_FILE = 'runnel-cli.cjs';

/** Suffix of a bundle's code-cache file, which its launcher keeps beside it (server/code-cache.ts). */
export const CODE_CACHE_SUFFIX = '.code-cache';

/** The language server's bundle, beside its launcher (dist/server.cjs, server/server-launcher.ts) that runs it. */
export const SERVER_BUNDLE_FILE = 'runnel-server.cjs';
