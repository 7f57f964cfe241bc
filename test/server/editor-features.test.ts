/**
 * Editor features in process (the server's services without a connection): hint and hover content checked
 * against independent computations, code-action stubs, settings parsing, the profile-depth hint and error
 * containment.
 *
 * Sources: Manning's equation in SI (Chow (1959) Open-Channel Hydraulics, Ch. 5-6); rectangular critical depth
 * yc = (q^2 / g)^(1/3) (REFERENCES.md C5, derived); Froude number V / sqrt(g y) for a rectangle (Chow (1959),
 * Ch. 3); 1 ft = 0.3048 m exactly and 1 ft3 = 0.028316846592 m3 exactly (NIST SP 811, App. B); g = 9.80665 m/s2
 * (standard gravity, exact).
 */
import { describe, expect, it, vi } from 'vitest';
import { OperationCancelled, type LangiumDocument } from 'langium';
import type { CodeAction, Hover, InlayHint } from 'vscode-languageserver';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import { containProvider, type ServerLog } from '../../server/lsp/error-containment.js';
import { DEFAULT_SETTINGS, parseSettings } from '../../server/lsp/runnel-settings.js';
import { LspWorkspace } from './lsp-workspace.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';

const FOOT_M = 0.3048;
const CFS_M3S = 0.028316846592;
const GRAVITY = 9.80665;

const RECTANGLE_DESIGN = [
  'design "rectangle check"',
  'units US',
  'section box rectangle {',
  '  bottom width 10 ft',
  '  bank height 4 ft',
  '}',
  'lining smooth {',
  '  n 0.015',
  '}',
  'flows {',
  '  q = 100 cfs',
  '  low = 900 L/s',
  '}',
  'channel c {',
  '  reach upper {',
  '    section box',
  '    lining smooth',
  '    slope 0.25 permille',
  '    length 100 ft',
  '  }',
  '  reach lower {',
  '    section box',
  '    lining smooth',
  '    slope 0.1 %',
  '    length 100 ft',
  '    flows { q = 120 cfs }',
  '  }',
  '  outlet normal depth',
  '}',
  '',
].join('\n');

async function open(text: string, name = 'design.runnel'): Promise<{ workspace: LspWorkspace; document: LangiumDocument }> {
  const workspace = await LspWorkspace.create();
  const [document] = await workspace.set({ [name]: text });
  if (document === undefined) throw new Error('no document');
  return { workspace, document };
}

async function hoverAt(workspace: LspWorkspace, document: LangiumDocument, line: number, character: number): Promise<string> {
  const hover = (await workspace.services.Runnel.lsp.HoverProvider?.getHoverContent(document, { textDocument: { uri: document.uri.toString() }, position: { line, character } })) as Hover | undefined;
  const contents = hover?.contents;
  return contents !== undefined && typeof contents === 'object' && 'value' in contents ? contents.value : '';
}

/** Normal depth of a rectangle by bisection on Manning's equation (SI). */
function rectangleNormalDepthM(widthM: number, dischargeM3s: number, n: number, slope: number): number {
  let low = 0;
  let high = 20;
  for (let step = 0; step < 200; step++) {
    const depth = (low + high) / 2;
    const area = widthM * depth;
    const q = (area * Math.cbrt((area / (widthM + 2 * depth)) ** 2) * Math.sqrt(slope)) / n;
    if (q < dischargeM3s) low = depth;
    else high = depth;
  }
  return (low + high) / 2;
}

/** Relative difference between a value shown with three significant figures and the exact one. */
const shownWithin = (shown: number, exact: number): boolean => Math.abs(shown - exact) <= 0.005 * Math.abs(exact) + 1e-12;

describe('one analysis per document version', () => {
  it('is the object validation computed, shared by every feature, and replaced after an edit or a linings change', async () => {
    const library = 'library "shared"\nlining smooth {\n  n 0.015\n}\n';
    const design = RECTANGLE_DESIGN.replace('lining smooth {\n  n 0.015\n}\n', '');
    const workspace = await LspWorkspace.create();
    const [document] = await workspace.set({ 'design.runnel': design, 'library.runnel': library });
    if (document === undefined) throw new Error('no document');
    const analyses = workspace.services.Runnel.runnel.Analyses;
    const first = analyses.of(document);
    expect(analyzeDocument(document, NO_CRITERIA_DEFAULTS)).toBe(first);
    expect(analyses.of(document)).toBe(first);
    expect(first.channels[0]?.reaches).toHaveLength(2);

    await workspace.set({ 'design.runnel': design.replace('bottom width 10 ft', 'bottom width 12 ft') });
    const edited = analyses.of(document);
    expect(edited).not.toBe(first);
    expect(edited.channels[0]?.reaches[0]?.section.dimensions['bottomWidth_m']).toBeCloseTo(12 * FOOT_M, 12);

    await workspace.set({ 'library.runnel': library.replace('n 0.015', 'n 0.02') });
    const relinked = analyses.of(document);
    expect(relinked).not.toBe(edited);
    expect(relinked.channels[0]?.reaches[0]?.lining.manningN).toBe(0.02);
  });
});

describe('inlay hints', () => {
  it('show normal depth, critical depth, velocity and Froude number matching independent closed forms', async () => {
    const { workspace, document } = await open(RECTANGLE_DESIGN);
    const hints = (await workspace.services.Runnel.lsp.InlayHintProvider?.getInlayHints(document, {
      textDocument: { uri: document.uri.toString() },
      range: { start: { line: 0, character: 0 }, end: { line: 100, character: 0 } },
    })) as InlayHint[];
    const upper = hints.filter((hint) => hint.position.line === 14).map((hint) => String(hint.label));
    expect(upper).toHaveLength(2);
    const match = /^q: yn ([\d.]+) ft · yc ([\d.]+) ft · ([\d.]+) ft\/s · Fr ([\d.]+)/.exec(upper[0] ?? '');
    expect(match, upper[0]).not.toBeNull();
    const widthM = 10 * FOOT_M;
    const dischargeM3s = 100 * CFS_M3S;
    const normalM = rectangleNormalDepthM(widthM, dischargeM3s, 0.015, 0.00025);
    const criticalM = Math.cbrt((dischargeM3s / widthM) ** 2 / GRAVITY);
    const velocity = dischargeM3s / (widthM * normalM);
    expect(shownWithin(Number(match?.[1]) * FOOT_M, normalM)).toBe(true);
    expect(shownWithin(Number(match?.[2]) * FOOT_M, criticalM)).toBe(true);
    expect(shownWithin(Number(match?.[3]) * FOOT_M, velocity)).toBe(true);
    expect(Math.abs(Number(match?.[4]) - velocity / Math.sqrt(GRAVITY * normalM))).toBeLessThanOrEqual(0.005);
    // The reach's own flow gets its hint after its value, without the flow name; the design flow on its first line.
    const lowerOwn = hints.filter((hint) => hint.position.line === 25);
    expect(lowerOwn.map((hint) => String(hint.label))).toEqual([expect.stringMatching(/^yn [\d.]+ ft/)]);
    expect(lowerOwn[0]?.position.character).toBe('    flows { q = 120 cfs'.length);
    expect(hints.filter((hint) => hint.position.line === 20).map((hint) => String(hint.label))).toEqual([expect.stringMatching(/^low: yn/)]);
  });

  it('show the deepest water of a backwater profile, above normal depth, where the profile is not uniform', async () => {
    // A narrow reach downstream of a wide one on a mild slope backs the water up (M1 curve, Chow (1959), Table 9-1).
    const text = [
      'design "backwater"',
      'units US',
      'section wide rectangle {\n  bottom width 20 ft\n  bank height 6 ft\n}',
      'section narrow rectangle {\n  bottom width 4 ft\n  bank height 6 ft\n}',
      'lining l {\n  n 0.02\n}',
      'flows {\n  q = 100 cfs\n}',
      'channel c {',
      '  reach upper {\n    section wide\n    lining l\n    slope 0.1 %\n    length 2000 ft\n  }',
      '  reach lower {\n    section narrow\n    lining l\n    slope 0.1 %\n    length 2000 ft\n  }',
      '  outlet normal depth',
      '}',
      '',
    ].join('\n');
    const { workspace, document } = await open(text);
    const hints = (await workspace.services.Runnel.lsp.InlayHintProvider?.getInlayHints(document, {
      textDocument: { uri: document.uri.toString() },
      range: { start: { line: 0, character: 0 }, end: { line: 100, character: 0 } },
    })) as InlayHint[];
    const upperLine = text.split('\n').findIndex((line) => line.startsWith('  reach upper'));
    const upper = String(hints.find((hint) => hint.position.line === upperLine)?.label ?? '');
    const match = /yn ([\d.]+) ft .* max ([\d.]+) ft \((M1[^)]*)\)/.exec(upper);
    expect(match, upper).not.toBeNull();
    expect(Number(match?.[2])).toBeGreaterThan(Number(match?.[1]));
  });

  it('show only the hints of the requested lines', async () => {
    const { workspace, document } = await open(RECTANGLE_DESIGN);
    const hints = (await workspace.services.Runnel.lsp.InlayHintProvider?.getInlayHints(document, {
      textDocument: { uri: document.uri.toString() },
      range: { start: { line: 21, character: 0 }, end: { line: 26, character: 0 } },
    })) as InlayHint[];
    expect(hints.every((hint) => hint.position.line >= 20)).toBe(true);
    expect(hints.length).toBe(2);
  });
});

describe('hover', () => {
  it('converts a discharge to the other system and to SI base units', async () => {
    const { workspace, document } = await open(RECTANGLE_DESIGN);
    const text = await hoverAt(workspace, document, 11, 10);
    // 900 L/s = 0.9 m3/s = 0.9 / 0.028316846592 cfs = 31.78 cfs.
    expect(text).toContain('31.78 cfs');
    expect(text).toContain('0.9 m3/s');
  });

  it('shows a slope as m/m and percent', async () => {
    const { workspace, document } = await open(RECTANGLE_DESIGN);
    const text = await hoverAt(workspace, document, 17, 11);
    expect(text).toContain('0.00025 m/m');
    expect(text).toContain('0.025 %');
  });

  it('on a flow in the flow table lists every reach it reaches; on a reach flow only those it sets', async () => {
    const { workspace, document } = await open(RECTANGLE_DESIGN);
    const table = await hoverAt(workspace, document, 10, 2);
    expect(table).toContain('**Flow `q`**');
    expect(table).toContain('`c` › `upper`');
    expect(table).toContain('`c` › `lower`');
    const own = await hoverAt(workspace, document, 25, 12);
    expect(own).toContain('`c` › `lower`');
    expect(own).not.toContain('`c` › `upper`');
    expect(own).toContain('120 cfs');
  });

  it('on a section definition names the reaches that use it', async () => {
    const { workspace, document } = await open(RECTANGLE_DESIGN);
    const text = await hoverAt(workspace, document, 2, 9);
    expect(text).toContain('**Section `box`**');
    expect(text).toContain('rectangle, width 10 ft');
    expect(text).toContain('**Used by 2 reaches**');
  });

  it('says why a reach is not analysed', async () => {
    const { workspace, document } = await open(RECTANGLE_DESIGN.replace('    lining smooth\n    slope 0.1 %', '    slope 0.1 %'));
    const text = await hoverAt(workspace, document, 20, 9);
    expect(text).toMatch(/is not analysed: it has no lining/);
  });
});

describe('code actions that create what a reference names', () => {
  async function actionsFor(text: string, code: string): Promise<{ actions: CodeAction[]; text: string }> {
    const { workspace, document } = await open(text);
    const diagnostics = (document.diagnostics ?? []).filter((diagnostic) => diagnostic.code === code);
    expect(diagnostics.length).toBeGreaterThan(0);
    const actions = (await workspace.services.Runnel.lsp.CodeActionProvider?.getCodeActions(document, {
      textDocument: { uri: document.uri.toString() },
      range: diagnostics[0]?.range ?? { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } },
      context: { diagnostics },
    })) as CodeAction[];
    return { actions, text };
  }

  it('offers a section of each shape, with no invented dimensions', async () => {
    const { actions } = await actionsFor(RECTANGLE_DESIGN.replace('    section box\n    lining smooth\n    slope 0.25', '    section boxx\n    lining smooth\n    slope 0.25'), 'unknown-reference');
    const titles = actions.map((action) => action.title);
    expect(titles).toEqual(expect.arrayContaining(["Change name to 'box'", "Create trapezoid section 'boxx'", "Create circle section 'boxx'"]));
    const circle = actions.find((action) => action.title === "Create circle section 'boxx'");
    const newText = Object.values(circle?.edit?.changes ?? {})[0]?.[0]?.newText ?? '';
    expect(newText).toBe('\n\nsection boxx circle {\n}');
  });

  it('adds a missing flow to the flow table', async () => {
    const { actions } = await actionsFor(RECTANGLE_DESIGN.replace('flows { q = 120 cfs }', 'flows { q50 = 120 cfs }'), 'unknown-reference');
    const create = actions.find((action) => action.title === "Create flow 'q50'");
    const edit = Object.values(create?.edit?.changes ?? {})[0]?.[0];
    expect(edit?.newText).toBe('  q50\n');
    expect(edit?.range.start).toEqual({ line: 12, character: 0 });
  });
});

describe('settings', () => {
  it('reads the nested form VS Code sends and the flat form, falling back to defaults', () => {
    expect(parseSettings(undefined)).toEqual(DEFAULT_SETTINGS);
    expect(parseSettings({ inlayHints: { velocity: false }, displayUnits: 'SI' })).toEqual({
      inlayHints: { ...DEFAULT_SETTINGS.inlayHints, velocity: false },
      displayUnits: 'SI',
      criteria: DEFAULT_SETTINGS.criteria,
    });
    expect(parseSettings({ 'inlayHints.froudeNumber': false, displayUnits: 'metric' }).inlayHints.froudeNumber).toBe(false);
    expect(parseSettings({ 'inlayHints.froudeNumber': false, displayUnits: 'metric' }).displayUnits).toBe('auto');
    expect(parseSettings({ inlayHints: { normalDepth: 'no' } }).inlayHints.normalDepth).toBe(true);
  });

  it('keeps the criteria settings as written (trimmed), nested or flat; a number is kept so it can be refused with a reason', () => {
    expect(parseSettings({ criteria: { freeboard: ' 0.5 ft ', limitMargin: '20 %' } }).criteria).toEqual({ ...DEFAULT_SETTINGS.criteria, freeboard: '0.5 ft', limitMargin: '20 %' });
    expect(parseSettings({ 'criteria.minimumVelocity': '2 ft/s' }).criteria.minimumVelocity).toBe('2 ft/s');
    expect(parseSettings({ criteria: { freeboard: 0.5 } }).criteria.freeboard).toBe('0.5');
    expect(parseSettings({ criteria: { freeboard: true, nearCriticalFroude: null } }).criteria).toEqual(DEFAULT_SETTINGS.criteria);
  });
});

describe('error containment', () => {
  const silentLog = (): ServerLog & { errors: string[] } => {
    const errors: string[] = [];
    return { errors, error: (message) => errors.push(message), warn: () => undefined, info: () => undefined };
  };

  it('answers an internal error with the empty result and logs it, for plain and async providers', async () => {
    const log = silentLog();
    const provider = containProvider(
      {
        plain: (): string[] => {
          throw new Error('boom');
        },
        later: async (): Promise<string[]> => Promise.reject(new Error('later boom')),
        fine: (): string[] => ['ok'],
      },
      log,
      'test',
      { plain: [], later: [], fine: [] },
    );
    expect(provider.plain()).toEqual([]);
    await expect(provider.later()).resolves.toEqual([]);
    expect(provider.fine()).toEqual(['ok']);
    expect(log.errors).toHaveLength(2);
    expect(log.errors[0]).toMatch(/test\.plain failed.*boom/s);
  });

  it('lets cancellation through, so the request is answered as cancelled', () => {
    const log = silentLog();
    const provider = containProvider(
      {
        cancelled: (): string[] => {
          throw OperationCancelled;
        },
      },
      log,
      'test',
      { cancelled: [] },
    );
    expect(() => provider.cancelled()).toThrow();
    expect(log.errors).toEqual([]);
  });

  it('keeps the real providers answering when one of their parts throws, and logs why', async () => {
    const { workspace, document } = await open(RECTANGLE_DESIGN);
    const spy = vi.spyOn(workspace.services.Runnel.runnel.Analyses, 'of').mockImplementation(() => {
      throw new Error('analysis broke');
    });
    // Without a connection the server logs to stderr (never stdout, which may carry the protocol).
    const stderr = vi.spyOn(process.stderr, 'write').mockImplementation(() => true);
    const hints = await workspace.services.Runnel.lsp.InlayHintProvider?.getInlayHints(document, {
      textDocument: { uri: document.uri.toString() },
      range: { start: { line: 0, character: 0 }, end: { line: 100, character: 0 } },
    });
    expect(hints).toEqual([]);
    const hover = await workspace.services.Runnel.lsp.HoverProvider?.getHoverContent(document, { textDocument: { uri: document.uri.toString() }, position: { line: 14, character: 9 } });
    expect(hover).toBeUndefined();
    const logged = stderr.mock.calls.map((call) => String(call[0]));
    stderr.mockRestore();
    spy.mockRestore();
    expect(logged.some((line) => /inlay hints\.getInlayHints failed.*analysis broke/s.test(line))).toBe(true);
    expect(logged.some((line) => /hover\.getHoverContent failed.*analysis broke/s.test(line))).toBe(true);
  });
});
