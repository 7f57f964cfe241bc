// The language server as the editor starts it (bundled to dist/server.cjs): runs the server bundle beside it
// (dist/runnel-server.cjs, built from server/language-server.ts) through V8's code cache (code-cache.ts). The cache
// is written when the server exits; the editor's debug launch starts the bundle itself (extension/identifiers.ts).
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { SERVER_BUNDLE_FILE } from '../.scripts/bundle-options.mjs';
import { runWithCodeCache } from './code-cache.js';

runWithCodeCache(join(dirname(fileURLToPath(import.meta.url)), SERVER_BUNDLE_FILE));
