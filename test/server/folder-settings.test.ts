/**
 * Settings per workspace folder (a multi-root workspace): the same design opened in two folders is judged and shown
 * with each folder's own settings, as VS Code scopes them by resource, and a change to one folder's settings reaches
 * only the designs in it. Driven through the bundled server over stdio.
 *
 * The design is a symmetric triangular ditch (side slopes 3:1, n = 0.03, S = 0.5 %, Q = 0.2 m3/s, bank 0.6 m) whose
 * normal depth follows from the closed form of Manning's equation (REFERENCES.md N8, derived), about 0.32 m: a
 * freeboard of 1 ft (0.3048 m, exact) is more than the ~0.28 m left, 0.5 ft is less.
 */
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Diagnostic, InlayHint } from 'vscode-languageserver-protocol';
import { pathToUri, TestLanguageClient } from './lsp-client.js';

const DESIGN = `design "Folder ditch"
units US
section vee triangle { side slopes 3:1  bank height 0.6 m }
lining grass { n 0.03 }
flows { q = 0.2 m3/s }
channel c {
  reach ditch { section vee  lining grass  slope 0.5 %  length 100 m }
  outlet normal depth
}
`;

let root: string;
let client: TestLanguageClient;
let plainUri: string;
let strictUri: string;

const freeboardFinding = (diagnostics: readonly Diagnostic[]): Diagnostic | undefined => diagnostics.find((diagnostic) => diagnostic.code === 'freeboard-below-required');

async function hintLabels(uri: string): Promise<string[]> {
  const hints = await client.request<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: 0, character: 0 }, end: { line: 20, character: 0 } } });
  return hints.map((hint) => (typeof hint.label === 'string' ? hint.label : hint.label.map((part) => part.value).join('')));
}

beforeAll(async () => {
  root = mkdtempSync(join(tmpdir(), 'runnel-folder-settings-'));
  const plain = join(root, 'plain');
  const strict = join(root, 'strict');
  mkdirSync(plain);
  mkdirSync(strict);
  ({ client } = await TestLanguageClient.start({
    workspaceFolders: [plain, strict],
    settings: { displayUnits: 'auto' },
    folderSettings: { [strict]: { displayUnits: 'SI', criteria: { freeboard: '1 ft' } } },
  }));
  plainUri = pathToUri(join(plain, 'ditch.runnel'));
  strictUri = pathToUri(join(strict, 'ditch.runnel'));
  await client.open(plainUri, DESIGN);
  await client.open(strictUri, DESIGN);
}, 60_000);

afterAll(async () => {
  await client?.stop();
  if (root !== undefined) rmSync(root, { recursive: true, force: true });
});

describe('settings of a workspace folder', () => {
  it("judge the designs in that folder by the folder's criteria, and only those", async () => {
    const strict = await client.diagnostics(strictUri, (params) => freeboardFinding(params.diagnostics) !== undefined);
    const data = freeboardFinding(strict)?.data as { required_m: number } | undefined;
    expect(data?.required_m).toBeCloseTo(0.3048, 12);
    const plain = await client.diagnostics(plainUri, () => true);
    expect(freeboardFinding(plain)).toBeUndefined();
  });

  it("show the designs in that folder in the folder's units", async () => {
    const strict = await hintLabels(strictUri);
    const plain = await hintLabels(plainUri);
    expect(strict.join(' ')).toMatch(/ m\b/);
    expect(strict.join(' ')).not.toMatch(/ ft\b/);
    expect(plain.join(' ')).toMatch(/ ft\b/);
  });

  it("a change to one folder's settings reaches the designs in it", async () => {
    expect(freeboardFinding(await client.diagnostics(strictUri, (params) => freeboardFinding(params.diagnostics) !== undefined))).toBeDefined();
    client.folderSettings = { [pathToUri(join(root, 'strict'))]: { displayUnits: 'SI', criteria: { freeboard: '0.5 ft' } } };
    await client.changeSettings({ displayUnits: 'auto' });
    const strict = await client.diagnostics(strictUri, (params) => freeboardFinding(params.diagnostics) === undefined);
    expect(freeboardFinding(strict)).toBeUndefined();
  });
});
