/**
 * Entry point of the Runnel extension for VS Code (bundled to dist/extension.cjs). On the first `.runnel` file it
 * starts the bundled language server in the background, registers the report panel, its restoring after a
 * window reload, the comparison documents and the commands. Status and errors go to the "Runnel" output channel.
 */
import * as vscode from 'vscode';
import { registerCommands } from './commands.js';
import { ComparisonDocuments } from './comparison-documents.js';
import { COMPARISON_SCHEME, OUTPUT_CHANNEL_NAME, REPORT_VIEW_TYPE } from './identifiers.js';
import { LanguageServerConnection } from './language-server-connection.js';
import { ReportPanels } from './report-panels.js';

let server: LanguageServerConnection | undefined;

export function activate(context: vscode.ExtensionContext): void {
  const output = vscode.window.createOutputChannel(OUTPUT_CHANNEL_NAME, { log: true });
  server = new LanguageServerConnection(context, output);
  const panels = new ReportPanels(server, output);
  const comparisons = new ComparisonDocuments();
  context.subscriptions.push(
    output,
    server,
    panels,
    comparisons,
    vscode.workspace.registerTextDocumentContentProvider(COMPARISON_SCHEME, comparisons),
    vscode.window.registerWebviewPanelSerializer(REPORT_VIEW_TYPE, panels.serializer()),
    ...registerCommands({ server, panels, comparisons, output }),
  );
  output.info(`Runnel ${versionOf(context.extension)} activated.`);
  server.start();
}

/** Waits for the language server to stop, so its process never outlives the extension host's session. */
export async function deactivate(): Promise<void> {
  const running = server;
  server = undefined;
  await running?.stop();
}

function versionOf(extension: vscode.Extension<unknown>): string {
  const manifest: unknown = extension.packageJSON;
  if (typeof manifest === 'object' && manifest !== null && 'version' in manifest && typeof manifest.version === 'string') {
    return manifest.version;
  }
  return '(unknown version)';
}
