// The `runnel` command as installed (bundled to dist/runnel.cjs): runs the CLI bundle beside it (dist/runnel-cli.cjs,
// built from server/cli.ts) through V8's code cache (code-cache.ts).
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { CLI_BUNDLE_FILE } from '../.scripts/bundle-options.mjs';
import { runWithCodeCache } from './code-cache.js';

runWithCodeCache(join(dirname(fileURLToPath(import.meta.url)), CLI_BUNDLE_FILE));
