/**
 * The language server as an editor sees it: the bundled server (built from the sources as `npm run build` does)
 * is spawned over stdio and driven with a JSON-RPC client. A copy of the samples is the workspace, so the shared
 * linings file is indexed and resolved across files, and disk changes can be made safely.
 *
 * Engineering numbers asserted here are computed independently in the test: normal depth of a triangular ditch
 * from the closed form of Manning's equation (REFERENCES.md N8, derived), and unit conversions from the exact
 * definition 1 ft = 0.3048 m (NIST SP 811, App. B).
 */
import { execFileSync, fork } from 'node:child_process';
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type {
  CodeAction,
  CompletionList,
  Diagnostic,
  DocumentSymbol,
  FoldingRange,
  Hover,
  InitializeResult,
  InlayHint,
  Location,
  TextEdit,
  WorkspaceEdit,
} from 'vscode-languageserver-protocol';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { createProtocolConnection, IPCMessageReader, IPCMessageWriter } from 'vscode-languageserver-protocol/node';
import { COMPARE_WITH_LAST_COMMIT_REQUEST, RENDER_REPORT_REQUEST, RESULTS_MARKDOWN_REQUEST, type CompareWithLastCommitResult, type RenderReportResult, type ResultsMarkdownResult } from '../../server/protocol.js';
import { delay, pathToUri, TestLanguageClient } from './lsp-client.js';
import { SAMPLES_FOLDER } from './lsp-workspace.js';
import { serverBundle } from './server-bundle.js';

const FOOT_M = 0.3048;
const CFS_M3S = FOOT_M ** 3;

let folder: string;
let client: TestLanguageClient;
let initializeResult: InitializeResult;
const texts: Record<string, string> = {};
const uriOf = (name: string): string => pathToUri(join(folder, name));

/** Zero-based line of the first line containing `text` (after `after`, if given). */
function lineOf(source: string, text: string, after = -1): number {
  const lines = source.split('\n');
  const index = lines.findIndex((line, number) => number > after && line.includes(text));
  if (index < 0) throw new Error(`'${text}' not found`);
  return index;
}

function positionOf(source: string, text: string, offsetInText = 0): { line: number; character: number } {
  const line = lineOf(source, text);
  return { line, character: (source.split('\n')[line] ?? '').indexOf(text) + offsetInText };
}

function applyEdits(text: string, edits: readonly TextEdit[]): string {
  return TextDocument.applyEdits(TextDocument.create('file:///x', 'runnel', 1, text), [...edits]);
}

const wholeDocument = { start: { line: 0, character: 0 }, end: { line: 10_000, character: 0 } };

beforeAll(async () => {
  folder = mkdtempSync(join(tmpdir(), 'runnel-protocol-'));
  cpSync(SAMPLES_FOLDER, folder, { recursive: true });
  for (const name of ['roadside-ditches.runnel', 'linings.runnel', 'storm-drain-outfall.runnel', 'irrigation-canal.runnel']) texts[name] = readFileSync(join(folder, name), 'utf8');
  ({ client, initializeResult } = await TestLanguageClient.start({ workspaceFolder: folder, settings: {} }));
  await client.open(uriOf('roadside-ditches.runnel'), texts['roadside-ditches.runnel'] ?? '');
}, 60_000);

afterAll(async () => {
  await client?.stop();
  if (folder !== undefined) rmSync(folder, { recursive: true, force: true });
});

describe('initialize', () => {
  it('announces the features the server provides', () => {
    const capabilities = initializeResult.capabilities;
    expect(capabilities.hoverProvider).toBe(true);
    expect(capabilities.inlayHintProvider).toBeTruthy();
    expect(capabilities.codeActionProvider).toBe(true);
    expect(capabilities.completionProvider).toBeTruthy();
    expect(capabilities.documentFormattingProvider).toBe(true);
    expect(capabilities.renameProvider).toBeTruthy();
    expect(capabilities.definitionProvider).toBe(true);
    expect(capabilities.referencesProvider).toBe(true);
    expect(capabilities.documentSymbolProvider).toBe(true);
    expect(capabilities.foldingRangeProvider).toBe(true);
  });

  it('asks the client for the `runnel` settings section', async () => {
    for (let attempt = 0; attempt < 50 && !client.serverRequests.some((request) => request.method === 'workspace/configuration'); attempt++) await delay(50);
    const asked = client.serverRequests.find((request) => request.method === 'workspace/configuration')?.params as { items: { section?: string }[] } | undefined;
    expect(asked?.items.map((item) => item.section)).toContain('runnel');
  });
});

describe('transport', () => {
  it('also speaks over Node IPC, as the VS Code extension starts it', async () => {
    const child = fork(await serverBundle(), ['--node-ipc'], { stdio: ['ignore', 'ignore', 'pipe', 'ipc'] });
    const connection = createProtocolConnection(new IPCMessageReader(child), new IPCMessageWriter(child));
    connection.listen();
    try {
      const result = (await connection.sendRequest('initialize', { processId: process.pid, rootUri: null, capabilities: {} })) as InitializeResult;
      expect(result.capabilities.hoverProvider).toBe(true);
      await connection.sendRequest('shutdown');
      await connection.sendNotification('exit');
    } finally {
      connection.dispose();
      if (child.exitCode === null) child.kill();
    }
  });
});

describe('diagnostics of an opened sample', () => {
  it('reports over-topping at the reach it concerns, with related information at the section', async () => {
    const text = texts['roadside-ditches.runnel'] ?? '';
    const diagnostics = await client.diagnostics(uriOf('roadside-ditches.runnel'), (params) => params.diagnostics.length > 0);
    const overtopping = diagnostics.filter((diagnostic) => diagnostic.code === 'overtopping');
    expect(overtopping).toHaveLength(1);
    const diagnostic = overtopping[0] as Diagnostic;
    const reachName = positionOf(text, 'reach shoulder', 'reach '.length);
    expect(diagnostic.range.start).toEqual(reachName);
    expect(diagnostic.range.end).toEqual({ line: reachName.line, character: reachName.character + 'shoulder'.length });
    expect(diagnostic.severity).toBe(1);
    const related = diagnostic.relatedInformation ?? [];
    expect(related.some((info) => info.location.uri === uriOf('roadside-ditches.runnel') && info.location.range.start.line === lineOf(text, 'section shallow-v triangle'))).toBe(true);
    expect(related.some((info) => info.location.range.start.line === lineOf(text, 'flows { q10 = 6 cfs  q25 = 10 cfs }'))).toBe(true);
  });

  it('resolves linings from the shared linings file (no unknown-reference)', async () => {
    const diagnostics = await client.diagnostics(uriOf('roadside-ditches.runnel'));
    expect(diagnostics.filter((diagnostic) => diagnostic.code === 'unknown-reference')).toEqual([]);
  });

  it('carries the data a quick fix needs and the finding code in both places', async () => {
    const diagnostics = await client.diagnostics(uriOf('roadside-ditches.runnel'));
    const shear = diagnostics.find((diagnostic) => diagnostic.code === 'shear-above-permissible');
    expect(shear?.data).toMatchObject({ code: 'shear-above-permissible', source: 'analysis', channel: expect.any(String), reach: expect.any(String), flow: expect.any(String) });
  });
});

describe('inlay hints', () => {
  it('shows each flow after the reach, with normal depth matching the closed form and a marker where a check fails', async () => {
    const text = texts['roadside-ditches.runnel'] ?? '';
    const hints = await client.request<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri: uriOf('roadside-ditches.runnel') }, range: wholeDocument });
    const shoulderLine = lineOf(text, 'reach shoulder');
    const shoulder = hints.filter((hint) => hint.position.line === shoulderLine).map((hint) => String(hint.label));
    expect(shoulder).toHaveLength(2);
    expect(shoulder[1]).toMatch(/^q25: yn [\d.]+ ft · yc [\d.]+ ft · [\d.]+ ft\/s · Fr [\d.]+ ✖ over-topping/);
    // Closed form for a symmetric triangle (REFERENCES.md N8, derived), SI with k = 1:
    // y = [Q n (2 sqrt(1 + z^2))^(2/3) / (z^(5/3) S^(1/2))]^(3/8); shallow-v: z = 4, jute-net n = 0.027, S = 0.8 %, q25 = 10 cfs.
    const z = 4;
    const expectedDepthM = ((10 * CFS_M3S * 0.027 * (2 * Math.sqrt(1 + z * z)) ** (2 / 3)) / (z ** (5 / 3) * Math.sqrt(0.008))) ** (3 / 8);
    const shownFeet = Number(/yn ([\d.]+) ft/.exec(shoulder[1] ?? '')?.[1]);
    // The hint shows three significant figures: within 0.1 % plus rounding.
    expect(Math.abs(shownFeet * FOOT_M - expectedDepthM) / expectedDepthM).toBeLessThan(0.002);
    // And the closed-form depth is above the 0.9 ft bank: over-topping is right.
    expect(expectedDepthM).toBeGreaterThan(0.9 * FOOT_M);
  });

  it('puts the hint of a flow the reach sets itself right after that value', async () => {
    const text = texts['roadside-ditches.runnel'] ?? '';
    const hints = await client.request<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri: uriOf('roadside-ditches.runnel') }, range: wholeDocument });
    const changeLine = lineOf(text, 'flows { q10 = 16 cfs  q25 = 21 cfs }');
    const own = hints.filter((hint) => hint.position.line === changeLine);
    expect(own).toHaveLength(2);
    expect(own[0]?.position.character).toBe((text.split('\n')[changeLine] ?? '').indexOf('16 cfs') + '16 cfs'.length);
    expect(String(own[0]?.label)).toMatch(/^yn [\d.]+ ft/);
    expect(hints.filter((hint) => hint.position.line === lineOf(text, 'reach cut'))).toEqual([]);
  });

  it('follows the settings: quantities and display units', async () => {
    await client.changeSettings({ inlayHints: { velocity: false, froudeNumber: false }, displayUnits: 'SI' });
    await delay(200);
    const hints = await client.request<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri: uriOf('roadside-ditches.runnel') }, range: wholeDocument });
    const labels = hints.map((hint) => String(hint.label));
    expect(labels.every((label) => !label.includes('/s') && !label.includes('Fr '))).toBe(true);
    expect(labels.some((label) => / yn [\d.]+ m · yc [\d.]+ m/.test(label))).toBe(true);
    expect(client.serverRequests.some((request) => request.method === 'workspace/inlayHint/refresh')).toBe(true);
    await client.changeSettings({});
    await delay(200);
    const restored = await client.request<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri: uriOf('roadside-ditches.runnel') }, range: wholeDocument });
    expect(restored.some((hint) => String(hint.label).includes('ft/s · Fr'))).toBe(true);
  });
});

describe('hover', () => {
  it('on a reach name: the table per flow, the findings and the method line', async () => {
    const text = texts['roadside-ditches.runnel'] ?? '';
    const hover = await client.request<Hover | null>('textDocument/hover', { textDocument: { uri: uriOf('roadside-ditches.runnel') }, position: positionOf(text, 'reach shoulder', 8) });
    const value = hover !== null && typeof hover.contents === 'object' && 'value' in hover.contents ? hover.contents.value : '';
    expect(value).toContain('**Reach `shoulder`**');
    for (const row of ['Normal depth', 'Critical depth', 'Flow area', 'Wetted perimeter', 'Hydraulic radius', 'Top width', 'Velocity', 'Froude number', 'Specific energy', 'Freeboard']) expect(value).toContain(`| ${row} |`);
    expect(value).toContain('Bank-full capacity');
    expect(value).toMatch(/Over-topping at q25/);
    expect(value).toMatch(/_Method: .*Manning.*Assumes: Steady flow/);
  });

  it('on a quantity: its value in the other unit system (1 ft = 0.3048 m exactly)', async () => {
    const text = texts['roadside-ditches.runnel'] ?? '';
    const position = positionOf(text, 'bank height 0.9 ft', 'bank height '.length + 1);
    const hover = await client.request<Hover | null>('textDocument/hover', { textDocument: { uri: uriOf('roadside-ditches.runnel') }, position });
    const value = hover !== null && typeof hover.contents === 'object' && 'value' in hover.contents ? hover.contents.value : '';
    // 0.9 ft = 0.27432 m, shown with four significant figures.
    expect(value).toContain('0.2743 m');
  });

  it('on a lining used from the shared file: what it is, and the reach results', async () => {
    const text = texts['roadside-ditches.runnel'] ?? '';
    const hover = await client.request<Hover | null>('textDocument/hover', { textDocument: { uri: uriOf('roadside-ditches.runnel') }, position: positionOf(text, 'lining jute-net', 'lining '.length + 2) });
    const value = hover !== null && typeof hover.contents === 'object' && 'value' in hover.contents ? hover.contents.value : '';
    expect(value).toContain('**Lining `jute-net`**');
    expect(value).toContain('permissible shear 0.45 psf');
    expect(value).toContain('**Reach `shoulder`**');
  });
});

describe('completion', () => {
  it('offers only units of the expected dimension after a number', async () => {
    const uri = uriOf('scratch-completion.runnel');
    const text = 'design "scratch"\nunits US\nsection s rectangle {\n  bottom width 4 \n}\n';
    await client.open(uri, text);
    const list = await client.request<CompletionList>('textDocument/completion', { textDocument: { uri }, position: { line: 3, character: 17 } });
    const labels = list.items.map((item) => item.label);
    expect(labels).toEqual(expect.arrayContaining(['ft', 'in', 'm', 'cm', 'mm']));
    expect(labels).not.toContain('cfs');
    expect(labels).not.toContain('ft/s');
  });

  it('offers the linings of the workspace after `lining`', async () => {
    const uri = uriOf('scratch-completion-2.runnel');
    const text = 'design "scratch"\nchannel c {\n  reach r {\n    lining \n  }\n}\n';
    await client.open(uri, text);
    const list = await client.request<CompletionList>('textDocument/completion', { textDocument: { uri }, position: { line: 3, character: 11 } });
    expect(list.items.map((item) => item.label)).toEqual(expect.arrayContaining(['grass-short', 'riprap-6in', 'concrete-trowel']));
  });
});

describe('code actions', () => {
  it('adds a missing unit, preferring the design display unit', async () => {
    const uri = uriOf('scratch-units.runnel');
    const text = 'design "scratch"\nunits US\nsection s rectangle {\n  bottom width 4\n}\n';
    await client.open(uri, text);
    const diagnostics = await client.diagnostics(uri, (params) => params.diagnostics.some((diagnostic) => diagnostic.code === 'unit-missing'));
    const missing = diagnostics.filter((diagnostic) => diagnostic.code === 'unit-missing');
    const actions = await client.request<CodeAction[]>('textDocument/codeAction', { textDocument: { uri }, range: missing[0]?.range, context: { diagnostics: missing } });
    const preferred = actions.find((action) => action.isPreferred === true);
    expect(preferred?.title).toBe("Add unit 'ft' (feet)");
    expect(actions.map((action) => action.title)).toContain("Add unit 'm' (metres)");
    const fixed = applyEdits(text, preferred?.edit?.changes?.[uri] ?? []);
    expect(fixed).toContain('bottom width 4 ft');
    await client.replaceText(uri, 2, fixed);
    const after = await client.diagnosticsOfVersion(uri, 2);
    expect(after.filter((diagnostic) => diagnostic.code === 'unit-missing')).toEqual([]);
  });

  it('corrects a misspelt lining, or creates it as a stub', async () => {
    const uri = uriOf('scratch-reference.runnel');
    const text = 'design "scratch"\nchannel c {\n  reach r {\n    lining grass-shrot\n  }\n}\n';
    await client.open(uri, text);
    const diagnostics = await client.diagnostics(uri, (params) => params.diagnostics.some((diagnostic) => diagnostic.code === 'unknown-reference'));
    const unknown = diagnostics.filter((diagnostic) => diagnostic.code === 'unknown-reference');
    const actions = await client.request<CodeAction[]>('textDocument/codeAction', { textDocument: { uri }, range: unknown[0]?.range, context: { diagnostics: unknown } });
    const titles = actions.map((action) => action.title);
    expect(titles).toContain("Change name to 'grass-short'");
    expect(titles).toContain("Create lining 'grass-shrot'");
    const created = applyEdits(text, actions.find((action) => action.title === "Create lining 'grass-shrot'")?.edit?.changes?.[uri] ?? []);
    await client.replaceText(uri, 2, created);
    const after = await client.diagnosticsOfVersion(uri, 2);
    expect(after.filter((diagnostic) => diagnostic.code === 'unknown-reference')).toEqual([]);
    // The stub has no invented numbers: validation asks for Manning's n.
    expect(after.some((diagnostic) => diagnostic.code === 'manning-n-missing')).toBe(true);
  });

  it('offers to size the section of the reach under the cursor, and says why when no size passes', async () => {
    const text = texts['roadside-ditches.runnel'] ?? '';
    const uri = uriOf('roadside-ditches.runnel');
    const at = (reach: string) => positionOf(text, `reach ${reach}`, 2);
    const toe = await client.request<CodeAction[]>('textDocument/codeAction', { textDocument: { uri }, range: { start: at('toe'), end: at('toe') }, context: { diagnostics: [] } });
    const toeSizing = toe.find((action) => action.title.includes("reach 'toe'"));
    // flat-bottom is shared with reach hillside: the action gives toe its own section.
    expect(toeSizing?.title).toMatch(/^Give reach 'toe' its own section 'flat-bottom-toe' with bottom width [\d.]+ ft/);
    const cut = await client.request<CodeAction[]>('textDocument/codeAction', { textDocument: { uri }, range: { start: at('cut'), end: at('cut') }, context: { diagnostics: [] } });
    const cutSizing = cut.find((action) => action.title.includes("reach 'cut'"));
    expect(cutSizing?.disabled?.reason).toMatch(/supercritical \(q10, q25\) fails at every size/);
  });
});

describe('formatting, symbols, folding, definition, references, rename', () => {
  it('formats a messy document and formatting the result changes nothing', async () => {
    const uri = uriOf('scratch-format.runnel');
    const messy = 'design   "x"\nsection s rectangle {   bottom width 2 ft\n bank height 1 ft }\n';
    await client.open(uri, messy);
    const edits = await client.request<TextEdit[]>('textDocument/formatting', { textDocument: { uri }, options: { tabSize: 2, insertSpaces: true } });
    const formatted = applyEdits(messy, edits);
    expect(formatted).toBe('design "x"\nsection s rectangle {\n  bottom width 2 ft\n  bank height 1 ft\n}\n');
    await client.replaceText(uri, 2, formatted);
    await client.diagnosticsOfVersion(uri, 2);
    const again = await client.request<TextEdit[]>('textDocument/formatting', { textDocument: { uri }, options: { tabSize: 2, insertSpaces: true } });
    expect(again).toEqual([]);
  });

  it('outlines channels with their reaches', async () => {
    const symbols = await client.request<DocumentSymbol[]>('textDocument/documentSymbol', { textDocument: { uri: uriOf('roadside-ditches.runnel') } });
    const north = symbols.find((symbol) => symbol.name === 'north-ditch');
    expect(north?.children?.map((child) => child.name)).toEqual(['crest', 'hillside', 'cut', 'toe']);
    expect(symbols.map((symbol) => symbol.name)).toEqual(expect.arrayContaining(['v-ditch', 'q10', 'south-ditch']));
  });

  it('folds blocks', async () => {
    const ranges = await client.request<FoldingRange[]>('textDocument/foldingRange', { textDocument: { uri: uriOf('roadside-ditches.runnel') } });
    const text = texts['roadside-ditches.runnel'] ?? '';
    expect(ranges.some((range) => range.startLine === lineOf(text, 'channel north-ditch'))).toBe(true);
  });

  it('goes to a lining defined in the shared file', async () => {
    const text = texts['roadside-ditches.runnel'] ?? '';
    const result = await client.request<Location[] | Location | null>('textDocument/definition', { textDocument: { uri: uriOf('roadside-ditches.runnel') }, position: positionOf(text, 'lining riprap-6in', 9) });
    const locations = Array.isArray(result) ? result : result === null ? [] : [result];
    const target = locations[0] as unknown as { uri?: string; targetUri?: string; range?: { start: { line: number } }; targetSelectionRange?: { start: { line: number } } };
    expect(target.targetUri ?? target.uri).toBe(uriOf('linings.runnel'));
    expect((target.targetSelectionRange ?? target.range)?.start.line).toBe(lineOf(texts['linings.runnel'] ?? '', 'lining riprap-6in'));
  });

  it('finds the references of a section and renames a lining in every file that uses it', async () => {
    const text = texts['roadside-ditches.runnel'] ?? '';
    const uri = uriOf('roadside-ditches.runnel');
    const references = await client.request<Location[]>('textDocument/references', { textDocument: { uri }, position: positionOf(text, 'section flat-bottom trapezoid', 9), context: { includeDeclaration: false } });
    expect(references.map((reference) => reference.range.start.line).sort((a, b) => a - b)).toEqual([lineOf(text, 'section flat-bottom', lineOf(text, 'reach hillside')), lineOf(text, 'section flat-bottom', lineOf(text, 'reach toe'))]);

    const edit = await client.request<WorkspaceEdit | null>('textDocument/rename', { textDocument: { uri }, position: positionOf(text, 'lining grass-medium', 9), newName: 'grass-tall' });
    const changes = edit?.changes ?? {};
    expect(Object.keys(changes).sort()).toEqual(expect.arrayContaining([uri, uriOf('linings.runnel')]));
    expect(changes[uriOf('linings.runnel')]?.map((change) => change.newText)).toEqual(['grass-tall']);
    expect(changes[uri]).toHaveLength(2);

    const invalid = await client
      .request('textDocument/rename', { textDocument: { uri }, position: positionOf(text, 'lining grass-medium', 9), newName: 'grass medium' })
      .then(
        () => 'answered',
        (error: Error) => error.message,
      );
    expect(invalid).toMatch(/'grass medium' is not a valid name/);
  });
});

describe('the results follow edits', () => {
  it('updates diagnostics when the document changes, version by version', async () => {
    const uri = uriOf('roadside-ditches.runnel');
    const text = texts['roadside-ditches.runnel'] ?? '';
    const bank = positionOf(text, 'bank height 0.9 ft', 'bank height '.length);
    await client.edit(uri, 2, { start: bank, end: { line: bank.line, character: bank.character + 3 } }, '1.5');
    const higherBank = await client.diagnosticsOfVersion(uri, 2);
    expect(higherBank.filter((diagnostic) => diagnostic.code === 'overtopping')).toEqual([]);
    await client.edit(uri, 3, { start: bank, end: { line: bank.line, character: bank.character + 3 } }, '0.9');
    const restored = await client.diagnosticsOfVersion(uri, 3);
    expect(restored.filter((diagnostic) => diagnostic.code === 'overtopping')).toHaveLength(1);
  });

  it('re-analyses a design when the shared linings file it uses changes', async () => {
    const designUri = uriOf('roadside-ditches.runnel');
    const liningsUri = uriOf('linings.runnel');
    const before = await client.diagnostics(designUri);
    const isHillsideShear = (diagnostic: Diagnostic): boolean => diagnostic.code === 'shear-above-permissible' && (diagnostic.data as { reach?: string } | undefined)?.reach === 'hillside';
    expect(before.some(isHillsideShear)).toBe(true);
    const liningsText = texts['linings.runnel'] ?? '';
    await client.open(liningsUri, liningsText);
    const refreshesBefore = client.serverRequests.filter((request) => request.method === 'workspace/inlayHint/refresh').length;
    const limit = positionOf(liningsText, 'permissible shear 1.00 psf', 'permissible shear '.length);
    await client.edit(liningsUri, 2, { start: limit, end: { line: limit.line, character: limit.character + 4 } }, '3.00');
    const after = await client.diagnostics(designUri, (params) => !params.diagnostics.some(isHillsideShear));
    expect(after.some((diagnostic) => diagnostic.code === 'overtopping')).toBe(true);
    // The design's text did not change, so the server asks the editor to fetch its hints again.
    const refreshes = (): number => client.serverRequests.filter((request) => request.method === 'workspace/inlayHint/refresh').length;
    for (let attempt = 0; attempt < 40 && refreshes() <= refreshesBefore; attempt++) await delay(50);
    expect(refreshes()).toBeGreaterThan(refreshesBefore);
    await client.edit(liningsUri, 3, { start: limit, end: { line: limit.line, character: limit.character + 4 } }, '1.00');
    await client.diagnostics(designUri, (params) => params.diagnostics.some(isHillsideShear));
  });

  it('re-analyses when a linings file that is not open changes on disk', async () => {
    // The 36 in pipe-upper (slope 1.6 ft / 320 ft = 0.005) uses a lining from a new library file written to disk.
    // Flowing full, Q = (1/n) (pi D^2 / 4) (D / 4)^(2/3) S^(1/2) (Chow (1959), Ch. 5-6; D = 0.9144 m); the peak
    // uniform-flow capacity is 1.0757 times that (REFERENCES.md P2, from memory, high). With n = 0.013 that is
    // 47.2 cfs full and 50.8 cfs at the peak: only q100 = 62 cfs is over capacity. With n = 0.2 it is 3.1 and 3.3
    // cfs: all three flows are.
    const fullCfs = (n: number): number => ((Math.PI * 0.9144 ** 2) / 4) * Math.cbrt((0.9144 / 4) ** 2) * Math.sqrt(0.005) / n / CFS_M3S;
    expect(1.0757 * fullCfs(0.013)).toBeGreaterThan(48);
    expect(1.0757 * fullCfs(0.013)).toBeLessThan(62);
    expect(1.0757 * fullCfs(0.2)).toBeLessThan(38);

    const path = join(folder, 'library-extra.runnel');
    writeFileSync(path, 'library "extra"\nlining concrete-extra {\n  n 0.013\n}\n');
    await client.connection.sendNotification('workspace/didChangeWatchedFiles', { changes: [{ uri: pathToUri(path), type: 1 }] });
    const designUri = uriOf('storm-drain-outfall.runnel');
    const designText = (texts['storm-drain-outfall.runnel'] ?? '').replace(/(reach pipe-upper[^{]*\{\s*section rcp-36\s*lining )concrete-trowel/, '$1concrete-extra');
    expect(designText).toContain('lining concrete-extra');
    await client.open(designUri, designText);
    const overCapacityAtPipeUpper = (diagnostics: Diagnostic[]): number =>
      diagnostics.filter((diagnostic) => diagnostic.code === 'conduit-over-capacity' && (diagnostic.data as { reach?: string } | undefined)?.reach === 'pipe-upper').length;
    const smooth = await client.diagnostics(designUri, (params) => params.diagnostics.length > 0);
    expect(smooth.filter((diagnostic) => diagnostic.code === 'unknown-reference')).toEqual([]);
    expect(overCapacityAtPipeUpper(smooth)).toBe(1);

    writeFileSync(path, 'library "extra"\nlining concrete-extra {\n  n 0.2\n}\n');
    await client.connection.sendNotification('workspace/didChangeWatchedFiles', { changes: [{ uri: pathToUri(path), type: 2 }] });
    const rough = await client.diagnostics(designUri, (params) => overCapacityAtPipeUpper(params.diagnostics) === 3);
    expect(overCapacityAtPipeUpper(rough)).toBe(3);
  });
});

describe('custom requests', () => {
  it('renders the report of a document as one HTML page of its current version', async () => {
    const result = await client.request<RenderReportResult>(RENDER_REPORT_REQUEST, { uri: uriOf('irrigation-canal.runnel') });
    // Not open in the editor, but part of the workspace: reported from the file on disk.
    expect(result.html?.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(result.html?.includes('Coldwater Bench lateral')).toBe(true);
    const open = await client.request<RenderReportResult>(RENDER_REPORT_REQUEST, { uri: uriOf('roadside-ditches.runnel'), nonce: 'abcdefgh12345678' });
    expect(open.version).toBe(3);
    expect(open.html?.includes('nonce-abcdefgh12345678')).toBe(true);
  });

  it('answers an unknown document with an empty report', async () => {
    const result = await client.request<RenderReportResult>(RENDER_REPORT_REQUEST, { uri: uriOf('no-such-design.runnel') });
    expect(result).toEqual({ html: null, version: null });
  });

  it('gives the results table as Markdown', async () => {
    const result = await client.request<ResultsMarkdownResult>(RESULTS_MARKDOWN_REQUEST, { uri: uriOf('roadside-ditches.runnel') });
    expect(result.markdown).toMatch(/\|.*shoulder.*\|/);
  });

  it('notifies the client when the analysis of a document changes', () => {
    const changes = client.notifications.filter((notification) => notification.method === 'runnel/analysisChanged').map((notification) => notification.params as { uri: string; version: number });
    expect(changes.some((change) => change.uri === uriOf('roadside-ditches.runnel') && change.version === 3)).toBe(true);
  });

  it('compares an edited design with its last commit', async () => {
    const repository = mkdtempSync(join(tmpdir(), 'runnel-git-'));
    try {
      const git = (...args: string[]): void => {
        execFileSync('git', args, { cwd: repository, env: { ...process.env, GIT_AUTHOR_NAME: 't', GIT_AUTHOR_EMAIL: 't@example.invalid', GIT_COMMITTER_NAME: 't', GIT_COMMITTER_EMAIL: 't@example.invalid' } });
      };
      git('init', '--quiet');
      writeFileSync(join(repository, 'linings.runnel'), texts['linings.runnel'] ?? '');
      writeFileSync(join(repository, 'ditches.runnel'), texts['roadside-ditches.runnel'] ?? '');
      git('add', '.');
      git('commit', '--quiet', '-m', 'first');
      const uri = pathToUri(join(repository, 'ditches.runnel'));
      const edited = (texts['roadside-ditches.runnel'] ?? '').replace('bank height 0.9 ft', 'bank height 1.5 ft');
      await client.open(uri, edited);
      const result = await client.request<CompareWithLastCommitResult>(COMPARE_WITH_LAST_COMMIT_REQUEST, { uri });
      expect(result.problem).toBeNull();
      expect(result.markdown).toContain('shoulder');
      expect(result.markdown).toMatch(/last commit/);
      const outside = await client.request<CompareWithLastCommitResult>(COMPARE_WITH_LAST_COMMIT_REQUEST, { uri: 'untitled:Untitled-1' });
      expect(outside.markdown).toBeNull();
      expect(outside.problem).toMatch(/saved as a file/);
    } finally {
      rmSync(repository, { recursive: true, force: true });
    }
  });
});

describe('robustness', () => {
  it('survives nonsense: a garbage document, requests on unknown documents and malformed parameters', async () => {
    const uri = uriOf('scratch-garbage.runnel');
    await client.open(uri, '\u0000{{{ reach } 1e309 ft/ft/ft "unterminated\n channel { reach r { section } } } %%%');
    const diagnostics = await client.diagnostics(uri, (params) => params.diagnostics.length > 0);
    expect(diagnostics.length).toBeGreaterThan(0);
    for (const request of ['textDocument/hover', 'textDocument/inlayHint', 'textDocument/completion', 'textDocument/codeAction', 'textDocument/formatting']) {
      await client.request(request, { textDocument: { uri }, position: { line: 0, character: 3 }, range: wholeDocument, context: { diagnostics: [] }, options: { tabSize: 2, insertSpaces: true } }).catch(() => undefined);
    }
    await client.request('textDocument/hover', { textDocument: { uri: uriOf('never-opened.runnel') }, position: { line: 0, character: 0 } }).catch(() => undefined);
    await client.request('textDocument/hover', { nonsense: true }).catch(() => undefined);
    await client.request(RENDER_REPORT_REQUEST, null).catch(() => undefined);
    // Still alive and answering.
    const hints = await client.request<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri: uriOf('roadside-ditches.runnel') }, range: wholeDocument });
    expect(hints.length).toBeGreaterThan(0);
    expect(client.exited).toBe(false);
  });
});
