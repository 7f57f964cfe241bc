/**
 * A workspace folder added while the server runs (a folder added to a multi-root workspace) counts as one opened
 * at start-up: the shared linings on disk in it are found, and its designs take the folder's settings; a folder
 * removed is forgotten again. Driven through the bundled server over stdio.
 *
 * The design is the symmetric triangular ditch of folder-settings.test.ts (side slopes 3:1, n = 0.03, S = 0.5 %,
 * Q = 0.2 m3/s, bank 0.6 m): normal depth about 0.32 m by the closed form of Manning's equation (REFERENCES.md N8,
 * derived), so a freeboard of 1 ft (0.3048 m, exact) is more than the ~0.28 m left. Its lining is in a library file
 * beside it on disk, which the editor has not opened.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Diagnostic } from 'vscode-languageserver-protocol';
import { pathToUri, TestLanguageClient } from './lsp-client.js';

const DESIGN = `design "Ditch in a later folder"
units US
section vee triangle { side slopes 3:1  bank height 0.6 m }
flows { q = 0.2 m3/s }
channel c {
  reach ditch { section vee  lining meadow  slope 0.5 %  length 100 m }
  outlet normal depth
}
`;
const LIBRARY = `library "Linings of the later folder"
lining meadow { n 0.03  source "invented for the test" }
`;

let root: string;
let later: string;
let client: TestLanguageClient;
let designUri: string;

const unknownLining = (diagnostics: readonly Diagnostic[]): boolean => diagnostics.some((diagnostic) => diagnostic.code === 'unknown-reference' && JSON.stringify(diagnostic.message).includes('meadow'));
const freeboardFinding = (diagnostics: readonly Diagnostic[]): Diagnostic | undefined => diagnostics.find((diagnostic) => diagnostic.code === 'freeboard-below-required');

beforeAll(async () => {
  root = mkdtempSync(join(tmpdir(), 'runnel-workspace-folders-'));
  const first = join(root, 'first');
  later = join(root, 'later');
  mkdirSync(first);
  mkdirSync(later);
  writeFileSync(join(later, 'linings.runnel'), LIBRARY);
  writeFileSync(join(later, 'ditch.runnel'), DESIGN);
  ({ client } = await TestLanguageClient.start({ workspaceFolders: [first], settings: {}, folderSettings: { [later]: { criteria: { freeboard: '1 ft' } } } }));
  designUri = pathToUri(join(later, 'ditch.runnel'));
  await client.open(designUri, DESIGN);
}, 60_000);

afterAll(async () => {
  await client?.stop();
  if (root !== undefined) rmSync(root, { recursive: true, force: true });
});

describe('a workspace folder added after start-up', () => {
  it('before it is added, its library is not known and the window settings apply', async () => {
    const diagnostics = await client.diagnostics(designUri, (params) => unknownLining(params.diagnostics));
    expect(freeboardFinding(diagnostics)).toBeUndefined();
  });

  it("once added, the design finds the library beside it on disk and is judged by the folder's criteria", async () => {
    await client.changeWorkspaceFolders([later], []);
    const diagnostics = await client.diagnostics(designUri, (params) => !unknownLining(params.diagnostics) && freeboardFinding(params.diagnostics) !== undefined);
    expect((freeboardFinding(diagnostics)?.data as { required_m: number } | undefined)?.required_m).toBeCloseTo(0.3048, 12);
  });

  it('once removed again, its closed library is dropped and the window settings apply; the open design stays', async () => {
    await client.changeWorkspaceFolders([], [later]);
    const diagnostics = await client.diagnostics(designUri, (params) => unknownLining(params.diagnostics));
    expect(freeboardFinding(diagnostics)).toBeUndefined();
    expect(client.exited).toBe(false);
  });
});
