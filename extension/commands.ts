/**
 * The Runnel commands. Each acts on the design in the active editor, on the design of the focused report panel,
 * or on the file it was invoked on (editor title, explorer). Each runs in the background: a failure is logged to
 * the "Runnel" output and shown as a message that offers the output, never as a modal dialog.
 */
import * as vscode from 'vscode';
import { COMMAND_IDS, LANGUAGE_ID } from './identifiers.js';
import type { ComparisonDocuments } from './comparison-documents.js';
import { describeError, type LanguageServerConnection } from './language-server-connection.js';
import type { ReportPanels } from './report-panels.js';

export interface CommandServices {
  readonly server: LanguageServerConnection;
  readonly panels: ReportPanels;
  readonly comparisons: ComparisonDocuments;
  readonly output: vscode.LogOutputChannel;
}

export function registerCommands(services: CommandServices): vscode.Disposable[] {
  const { output } = services;
  const command = (id: string, title: string, run: (target: unknown) => Promise<void>): vscode.Disposable =>
    vscode.commands.registerCommand(id, (target: unknown) => {
      run(target).catch((error: unknown) => reportFailure(output, title, error));
    });
  return [
    command(COMMAND_IDS.openReportToSide, 'Open Report to the Side', (target) => openReportToSide(services, target)),
    command(COMMAND_IDS.exportReportAsHtml, 'Export Report as HTML File', (target) => exportReportAsHtml(services, target)),
    command(COMMAND_IDS.copyResultsTableAsMarkdown, 'Copy Results Table as Markdown', (target) => copyResultsTable(services, target)),
    command(COMMAND_IDS.compareWithLastCommit, 'Compare with Last Commit', (target) => compareWithLastCommit(services, target)),
    command(COMMAND_IDS.restartLanguageServer, 'Restart Language Server', () => services.server.restart()),
    command(COMMAND_IDS.showOutput, 'Show Output', async () => output.show(true)),
  ];
}

async function openReportToSide(services: CommandServices, target: unknown): Promise<void> {
  const document = await designFor(services, target);
  if (document !== undefined) services.panels.open(document);
}

async function exportReportAsHtml(services: CommandServices, target: unknown): Promise<void> {
  const document = await designFor(services, target);
  if (document === undefined) return;
  if (document.isDirty) {
    // A printed report names its file: make it plain when it shows text that is not saved in that file.
    const saveFirst = 'Save and Export';
    const asShown = 'Export As Shown';
    const choice = await vscode.window.showWarningMessage(
      `${fileNameOf(document.uri)} has unsaved changes. The report will show the text as it is in the editor.`,
      saveFirst,
      asShown,
    );
    if (choice === undefined) return;
    if (choice === saveFirst && !(await document.save())) return;
  }
  const destination = await vscode.window.showSaveDialog({
    title: 'Export Runnel Report',
    defaultUri: defaultExportUri(document.uri),
    filters: { 'HTML page': ['html', 'htm'] },
    saveLabel: 'Export',
  });
  if (destination === undefined) return;
  const result = await services.server.renderReport(document.uri);
  if (result.html === null) throw new Error('the language server does not have this design open');
  await vscode.workspace.fs.writeFile(destination, new TextEncoder().encode(result.html));
  services.output.info(`Exported the report of ${document.uri.toString(true)} to ${destination.toString(true)}.`);
  const open = 'Open';
  const answer = await vscode.window.showInformationMessage(`Report saved as ${fileNameOf(destination)}.`, open);
  if (answer === open) await vscode.env.openExternal(destination);
}

async function copyResultsTable(services: CommandServices, target: unknown): Promise<void> {
  const document = await designFor(services, target);
  if (document === undefined) return;
  const { markdown } = await services.server.resultsMarkdown(document.uri);
  if (markdown === null || markdown.trim() === '') {
    void vscode.window.showInformationMessage(`${fileNameOf(document.uri)} has no results to copy yet.`);
    return;
  }
  await vscode.env.clipboard.writeText(markdown);
  vscode.window.setStatusBarMessage(`$(check) Runnel: results table of ${fileNameOf(document.uri)} copied`, 4_000);
}

async function compareWithLastCommit(services: CommandServices, target: unknown): Promise<void> {
  const document = await designFor(services, target);
  if (document === undefined) return;
  if (document.uri.scheme !== 'file') {
    void vscode.window.showInformationMessage(
      `${fileNameOf(document.uri)} is not a file on disk, so it has no commit to compare with. Save it in a git repository first.`,
    );
    return;
  }
  if (!vscode.workspace.isTrusted) {
    // git reads the repository's own configuration, which an untrusted folder controls.
    void vscode.window.showInformationMessage(
      'Comparing with the last commit runs git in this folder. Trust the folder (Manage Workspace Trust) to use it.',
    );
    return;
  }
  const result = await services.server.compareWithLastCommit(document.uri);
  if (result.markdown === null) {
    void vscode.window.showInformationMessage(result.problem ?? `${fileNameOf(document.uri)} could not be compared with its last commit.`);
    return;
  }
  const comparisonUri = services.comparisons.set(document.uri, result.markdown);
  try {
    await vscode.commands.executeCommand('markdown.showPreviewToSide', comparisonUri);
  } catch (error) {
    // Without the built-in Markdown preview, show the Markdown text itself.
    services.output.info(`Markdown preview unavailable (${describeError(error)}); showing the comparison as text.`);
    const comparison = await vscode.workspace.openTextDocument(comparisonUri);
    await vscode.window.showTextDocument(comparison, { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true, preview: true });
  }
}

/**
 * The design a command acts on: the file it was invoked on, else the design of the focused report panel, else the
 * active editor's. Opening it (without showing it) makes sure the language server has it. Undefined, after telling
 * the user, when there is none.
 */
async function designFor(services: CommandServices, target: unknown): Promise<vscode.TextDocument | undefined> {
  const uri =
    target instanceof vscode.Uri
      ? target
      : (services.panels.activeReportDocument() ?? vscode.window.activeTextEditor?.document.uri);
  if (uri === undefined) {
    void vscode.window.showInformationMessage('Open a Runnel design (.runnel file) first.');
    return undefined;
  }
  const document = await vscode.workspace.openTextDocument(uri);
  if (document.languageId !== LANGUAGE_ID) {
    void vscode.window.showInformationMessage(`${fileNameOf(uri)} is not a Runnel design (.runnel file).`);
    return undefined;
  }
  return document;
}

function defaultExportUri(designUri: vscode.Uri): vscode.Uri | undefined {
  const fileName = `${fileNameOf(designUri).replace(/\.runnel$/i, '')}-report.html`;
  if (designUri.scheme === 'untitled') {
    const folder = vscode.workspace.workspaceFolders?.[0]?.uri;
    return folder === undefined ? undefined : vscode.Uri.joinPath(folder, fileName);
  }
  return vscode.Uri.joinPath(designUri, '..', fileName);
}

function fileNameOf(uri: vscode.Uri): string {
  return uri.path.split('/').pop() ?? uri.path;
}

function reportFailure(output: vscode.LogOutputChannel, title: string, error: unknown): void {
  output.error(`${title} failed: ${describeError(error)}`);
  const showOutput = 'Show Output';
  void vscode.window.showErrorMessage(`Runnel: ${title} failed: ${describeError(error)}`, showOutput).then((answer) => {
    if (answer === showOutput) output.show(true);
  });
}
