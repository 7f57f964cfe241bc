/**
 * The `runnel.criteria.*` settings, driven through the bundled server as an editor drives it: the settings are
 * answered to `workspace/configuration` and changed with `workspace/didChangeConfiguration`, and the republished
 * diagnostics, the hover and the report follow. A bad value gives one window/showMessage warning and no crash.
 *
 * The design is a symmetric triangular ditch (side slopes 3:1, n = 0.03, S = 0.5 %, Q = 0.2 m3/s) whose normal depth
 * the test computes from the closed form of Manning's equation (REFERENCES.md N8, derived):
 * y = [Q n (2 sqrt(1 + z^2))^(2/3) / (z^(5/3) sqrt(S))]^(3/8), SI with k = 1.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Diagnostic, Hover } from 'vscode-languageserver-protocol';
import { RENDER_REPORT_REQUEST, type RenderReportResult } from '../../server/protocol.js';
import { delay, pathToUri, TestLanguageClient } from './lsp-client.js';

const FOOT_M = 0.3048;
const FROM_SETTING = 'from the editor or command-line setting, not from the file';
const DESIGN = `design "Settings ditch"
units SI
section vee triangle { side slopes 3:1  bank height 0.6 m }
lining grass { n 0.03 }
flows { q = 0.2 m3/s }
channel c {
  reach ditch { section vee  lining grass  slope 0.5 %  length 100 m }
  outlet normal depth
}
`;
const Z = 3;
const NORMAL_DEPTH_M = ((0.2 * 0.03 * (2 * Math.sqrt(1 + Z * Z)) ** (2 / 3)) / (Z ** (5 / 3) * Math.sqrt(0.005))) ** (3 / 8);
const FREEBOARD_M = 0.6 - NORMAL_DEPTH_M;

let folder: string;
let client: TestLanguageClient;
let uri: string;

const hasFreeboardFinding = (diagnostics: readonly Diagnostic[]): boolean => diagnostics.some((diagnostic) => diagnostic.code === 'freeboard-below-required');
const freeboardFinding = (diagnostics: readonly Diagnostic[]): Diagnostic | undefined => diagnostics.find((diagnostic) => diagnostic.code === 'freeboard-below-required');
const warnings = (): string[] =>
  client.notifications.filter((notification) => notification.method === 'window/showMessage').map((notification) => (notification.params as { type: number; message: string }).message);

beforeAll(async () => {
  folder = mkdtempSync(join(tmpdir(), 'runnel-criteria-settings-'));
  // The editor starts with a freeboard setting of 1 ft: more than the ~0.28 m the ditch leaves below its bank.
  ({ client } = await TestLanguageClient.start({ workspaceFolder: folder, settings: { criteria: { freeboard: '1 ft' } } }));
  uri = pathToUri(join(folder, 'ditch.runnel'));
  await client.open(uri, DESIGN);
}, 60_000);

afterAll(async () => {
  await client?.stop();
  if (folder !== undefined) rmSync(folder, { recursive: true, force: true });
});

describe('criteria settings through the protocol', () => {
  it('applies the setting the client answers at start-up: required 1 ft = 0.3048 m, actual from the closed form', async () => {
    const diagnostics = await client.diagnostics(uri, (params) => hasFreeboardFinding(params.diagnostics));
    const finding = freeboardFinding(diagnostics);
    const data = finding?.data as { required_m: number; actual_m: number } | undefined;
    expect(data?.required_m).toBe(FOOT_M);
    expect(Math.abs((data?.actual_m ?? Number.NaN) - FREEBOARD_M), `freeboard ${data?.actual_m} vs closed form ${FREEBOARD_M}`).toBeLessThan(1e-6);
    expect(finding?.message).toContain(`The required freeboard is ${FROM_SETTING}.`);
  });

  it('drops the finding when the setting is emptied, and brings it back when it is set large again', async () => {
    await client.changeSettings({ criteria: { freeboard: '' } });
    const cleared = await client.diagnostics(uri, (params) => !hasFreeboardFinding(params.diagnostics));
    expect(hasFreeboardFinding(cleared)).toBe(false);
    const refreshesBefore = client.serverRequests.filter((request) => request.method === 'workspace/inlayHint/refresh').length;

    await client.changeSettings({ criteria: { freeboard: '3 ft' } });
    const republished = await client.diagnostics(uri, (params) => hasFreeboardFinding(params.diagnostics));
    expect((freeboardFinding(republished)?.data as { required_m: number } | undefined)?.required_m).toBe(3 * FOOT_M);
    // Hints are asked for again once the design has been checked with the new defaults.
    for (let attempt = 0; attempt < 40 && client.serverRequests.filter((request) => request.method === 'workspace/inlayHint/refresh').length <= refreshesBefore; attempt++) await delay(50);
    expect(client.serverRequests.filter((request) => request.method === 'workspace/inlayHint/refresh').length).toBeGreaterThan(refreshesBefore);
  });

  it('hover and report say which criterion came from the setting', async () => {
    await client.diagnostics(uri, (params) => (freeboardFinding(params.diagnostics)?.data as { required_m?: number } | undefined)?.required_m === 3 * FOOT_M);
    const hover = await client.request<Hover | null>('textDocument/hover', { textDocument: { uri }, position: { line: 6, character: 10 } });
    const value = hover !== null && typeof hover.contents === 'object' && 'value' in hover.contents ? hover.contents.value : '';
    expect(value).toContain('**Reach `ditch`**');
    expect(value).toContain(`Criteria ${FROM_SETTING}: Freeboard criterion: at least 0.914 m.`);
    // The same line on the hover of the flow's name (line 4) and of the channel's name (line 5).
    for (const position of [{ line: 4, character: 8 }, { line: 5, character: 8 }]) {
      const other = await client.request<Hover | null>('textDocument/hover', { textDocument: { uri }, position });
      const text = other !== null && typeof other.contents === 'object' && 'value' in other.contents ? other.contents.value : '';
      expect(text).toMatch(/^\*\*(Flow|Channel) `(q|c)`\*\*/);
      expect(text).toContain(`Criteria ${FROM_SETTING}: Freeboard criterion: at least 0.914 m.`);
    }
    const report = await client.request<RenderReportResult>(RENDER_REPORT_REQUEST, { uri });
    expect(report.html).toContain('data-role="criteria-from-settings"');
    expect(report.html).toContain(`at least 0.914 m (${FROM_SETTING})`);
  });

  it('a design that states its own freeboard is not changed by the setting', async () => {
    const stated = pathToUri(join(folder, 'stated.runnel'));
    // 0.25 m of freeboard required, less than the ~0.28 m there is.
    await client.open(stated, DESIGN.replace('units SI', 'units SI\ncriteria { freeboard 0.25 m }'));
    const diagnostics = await client.diagnosticsOfVersion(stated, 1);
    expect(diagnostics.filter((diagnostic) => diagnostic.severity === 1)).toEqual([]);
    expect(hasFreeboardFinding(diagnostics)).toBe(false);
  });

  it('a malformed or wrong-unit value: one warning naming the setting and the reason, the value ignored, no crash', async () => {
    await client.changeSettings({ criteria: { freeboard: '3 ft', minimumVelocity: '2 ft' } });
    for (let attempt = 0; attempt < 100 && !warnings().some((message) => message.includes('runnel.criteria.minimumVelocity')); attempt++) await delay(50);
    const shown = warnings().filter((message) => message.includes('runnel.criteria.minimumVelocity'));
    expect(shown).toHaveLength(1);
    expect(shown[0]).toContain('runnel.criteria.minimumVelocity = "2 ft" is not used');
    expect(shown[0]).toContain("'ft' is a unit of length, but the minimum velocity needs a unit of velocity");
    expect(client.logMessages.some((message) => message.message.includes('runnel.criteria.minimumVelocity = "2 ft" is not used'))).toBe(true);

    // The same bad value again (another setting changed meanwhile): logged, not shown a second time.
    await client.changeSettings({ criteria: { freeboard: '2 ft', minimumVelocity: '2 ft' } });
    await client.diagnostics(uri, (params) => (freeboardFinding(params.diagnostics)?.data as { required_m?: number } | undefined)?.required_m === 2 * FOOT_M);
    expect(warnings().filter((message) => message.includes('runnel.criteria.minimumVelocity'))).toHaveLength(1);

    // A number where text with a unit is expected, and a band that runs downward: each refused with its reason.
    await client.changeSettings({ criteria: { freeboard: 0.5, nearCriticalFroude: '1.2 to 0.8' } });
    for (let attempt = 0; attempt < 100 && warnings().length < 3; attempt++) await delay(50);
    expect(warnings().some((message) => message.includes('runnel.criteria.freeboard = "0.5" is not used: Missing unit'))).toBe(true);
    expect(warnings().some((message) => message.includes('runnel.criteria.nearCriticalFroude = "1.2 to 0.8" is not used'))).toBe(true);
    // Both ignored: no freeboard is required any more (the built-in default), and the server still answers.
    const after = await client.diagnostics(uri, (params) => !hasFreeboardFinding(params.diagnostics));
    expect(hasFreeboardFinding(after)).toBe(false);
    const hover = await client.request<Hover | null>('textDocument/hover', { textDocument: { uri }, position: { line: 6, character: 10 } });
    expect(hover).not.toBeNull();
    expect(client.exited).toBe(false);
    expect(client.stderr.join('')).not.toMatch(/TypeError|ReferenceError|unhandled/i);
  });
});
