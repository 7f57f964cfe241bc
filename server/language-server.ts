import '../language/polyfills/object-group-by.cjs'; // Object.groupBy for chevrotain 13 on Node 20: before Langium.
/**
 * Entry point of the Runnel language server (bundled to dist/runnel-server.cjs, which dist/server.cjs runs). Speaks
 * LSP over stdio, Node IPC or a socket, as the client's command line says (`--stdio`, `--node-ipc`, `--socket=`);
 * the features are composed in server/lsp/runnel-lsp-module.ts.
 */
import { NodeFileSystem } from 'langium/node';
import { createConnection, ProposedFeatures } from 'vscode-languageserver/node';
import { createRunnelLspServices, startRunnelLanguageServer } from './lsp/runnel-lsp-module.js';

const connection = createConnection(ProposedFeatures.all);
const { shared, Runnel } = createRunnelLspServices({ connection, ...NodeFileSystem });
startRunnelLanguageServer(shared, Runnel);
