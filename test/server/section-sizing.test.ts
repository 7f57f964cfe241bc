/**
 * "Size this section" checked against an independent computation: normal depth by bisection on Manning's equation
 * with the closed-form geometry of each shape (written here, not the engine's), Froude number V / sqrt(g A / T), and
 * the checks the design's criteria ask for. The action must propose the first standard size that this independent
 * judge passes, and say why when none passes. A second group keeps the sizing rules in step with the analysis on
 * every sample, and a third applies the action's edit and re-analyses.
 *
 * Sources: Manning's equation in SI, Q = (1/n) A R^(2/3) S^(1/2) (Chow (1959) Open-Channel Hydraulics, Ch. 5-6);
 * Froude number and critical flow (Chow (1959), Ch. 3-4); the circular-segment geometry A = D^2 (theta - sin theta) / 8,
 * P = D theta / 2, T = D sin(theta / 2) (derived, closed form); 1 ft = 0.3048 m exactly (NIST SP 811, App. B);
 * standard gravity 9.80665 m/s2 (NIST SP 811, exact by definition). Step sizes and nominal pipe sizes are the
 * module's stated candidate lists (common practice), not computed results.
 */
import { describe, expect, it } from 'vitest';
import { TextDocument } from 'vscode-languageserver-textdocument';
import type { CodeAction, TextEdit } from 'vscode-languageserver';
import { analysisOf } from '../../server/lsp/document-analysis.js';
import { BOTTOM_WIDTH_STEPS, failedChecks, NOMINAL_PIPE_DIAMETERS, sizingInputsOf } from '../../server/lsp/section-sizing.js';
import { sectionGeometryFromResult } from '../../language/report/section-from-result.js';
import { FINDING_CODES } from '../../language/analysis/finding-messages.js';
import { LspWorkspace, memoryUri, sampleTexts } from './lsp-workspace.js';
import { NO_CRITERIA_DEFAULTS, type CriteriaDefaults } from '../../language/analysis/criteria-settings.js';

const FOOT_M = 0.3048;
const GRAVITY = 9.80665;
const CFS = FOOT_M ** 3;

// ------------------------------------------------------------------------------------------------ the independent judge

type Shape = { kind: 'rectangle'; bottomWidthM: number } | { kind: 'trapezoid'; bottomWidthM: number; sideSlope: number } | { kind: 'circle'; diameterM: number };

interface Judged {
  readonly dischargeM3s: number;
  readonly manningN: number;
  readonly slope: number;
  /** Open sections: bank height, m. */
  readonly bankM?: number;
  readonly freeboardM?: number;
  readonly minVelocityMps: number;
  readonly nearCriticalBand: readonly [number, number];
}

function geometry(shape: Shape, depthM: number): { area: number; perimeter: number; topWidth: number } {
  switch (shape.kind) {
    case 'rectangle':
      return { area: shape.bottomWidthM * depthM, perimeter: shape.bottomWidthM + 2 * depthM, topWidth: shape.bottomWidthM };
    case 'trapezoid': {
      const z = shape.sideSlope;
      return { area: (shape.bottomWidthM + z * depthM) * depthM, perimeter: shape.bottomWidthM + 2 * depthM * Math.sqrt(1 + z * z), topWidth: shape.bottomWidthM + 2 * z * depthM };
    }
    case 'circle': {
      const d = shape.diameterM;
      const theta = 2 * Math.acos(1 - (2 * depthM) / d);
      return { area: (d * d * (theta - Math.sin(theta))) / 8, perimeter: (d * theta) / 2, topWidth: d * Math.sin(theta / 2) };
    }
  }
}

function manningQ(shape: Shape, depthM: number, n: number, slope: number): number {
  const { area, perimeter } = geometry(shape, depthM);
  return (area * Math.cbrt((area / perimeter) ** 2) * Math.sqrt(slope)) / n;
}

/** Normal depth by bisection (Q(y) increases with y on the bracket), to 1e-12 relative. */
function normalDepth(shape: Shape, case_: Judged): number {
  let low = 0;
  let high = shape.kind === 'circle' ? 0.9 * shape.diameterM : 1;
  while (shape.kind !== 'circle' && manningQ(shape, high, case_.manningN, case_.slope) < case_.dischargeM3s) high *= 2;
  for (let step = 0; step < 200; step++) {
    const middle = (low + high) / 2;
    if (manningQ(shape, middle, case_.manningN, case_.slope) < case_.dischargeM3s) low = middle;
    else high = middle;
  }
  return (low + high) / 2;
}

/** The checks this size fails (empty when it passes), and the Froude number at normal depth. */
function judge(shape: Shape, case_: Judged): { passes: boolean; failed: string[]; froude: number | null } {
  if (shape.kind === 'circle') {
    // Flowing full: A = pi D^2 / 4, R = D / 4. Above that the conduit runs near full (two depths) or surcharges.
    const diameter = shape.diameterM;
    const fullFlow = (((Math.PI * diameter * diameter) / 4) * Math.cbrt((diameter / 4) ** 2) * Math.sqrt(case_.slope)) / case_.manningN;
    if (case_.dischargeM3s > fullFlow) return { passes: false, failed: ['capacity'], froude: null };
  }
  const depth = normalDepth(shape, case_);
  const { area, topWidth } = geometry(shape, depth);
  const velocity = case_.dischargeM3s / area;
  const froude = velocity / Math.sqrt((GRAVITY * area) / topWidth);
  const failed: string[] = [];
  if (case_.bankM !== undefined && depth > case_.bankM) failed.push('over-topping');
  else if (case_.bankM !== undefined && case_.freeboardM !== undefined && case_.bankM - depth < case_.freeboardM) failed.push('freeboard');
  if (froude >= case_.nearCriticalBand[0] && froude <= case_.nearCriticalBand[1]) failed.push('near-critical');
  else if (froude > 1) failed.push('supercritical');
  if (velocity < case_.minVelocityMps) failed.push('self-cleansing');
  return { passes: failed.length === 0, failed, froude };
}

// ------------------------------------------------------------------------------------------------ designs

interface SizingCase extends Judged {
  readonly id: string;
  readonly system: 'US' | 'SI';
  readonly sectionLine: string;
  readonly shapeAt: (size: number) => Shape;
  readonly designText: string;
}

function designText(c: { system: 'US' | 'SI'; section: string; lining: string; slope: string; flow: string; criteria: string }): string {
  return [
    'design "sizing check"',
    `units ${c.system}`,
    `criteria {\n  ${c.criteria}\n}`,
    c.section,
    c.lining,
    `flows {\n  q = ${c.flow}\n}`,
    `channel c {\n  reach r {\n    section s\n    lining l\n    slope ${c.slope}\n    length 100 ${c.system === 'US' ? 'ft' : 'm'}\n  }\n  outlet normal depth\n}`,
    '',
  ].join('\n');
}

const CASES: readonly SizingCase[] = [
  {
    id: 'rectangle, US, bank only',
    system: 'US',
    sectionLine: 'bottom width',
    dischargeM3s: 50 * CFS,
    manningN: 0.015,
    slope: 0.001,
    bankM: 2 * FOOT_M,
    minVelocityMps: 0,
    nearCriticalBand: [0.89, 1.13],
    shapeAt: (bottomWidthM) => ({ kind: 'rectangle', bottomWidthM }),
    designText: designText({
      system: 'US',
      section: 'section s rectangle {\n  bottom width 20 ft\n  bank height 2 ft\n}',
      lining: 'lining l {\n  n 0.015\n}',
      slope: '0.1 %',
      flow: '50 cfs',
      criteria: 'minimum velocity 0 ft/s',
    }),
  },
  {
    id: 'trapezoid 2:1, US, freeboard 0.5 ft and self-cleansing 1.5 ft/s',
    system: 'US',
    sectionLine: 'bottom width',
    dischargeM3s: 100 * CFS,
    manningN: 0.025,
    slope: 0.002,
    bankM: 3 * FOOT_M,
    freeboardM: 0.5 * FOOT_M,
    minVelocityMps: 1.5 * FOOT_M,
    nearCriticalBand: [0.89, 1.13],
    shapeAt: (bottomWidthM) => ({ kind: 'trapezoid', bottomWidthM, sideSlope: 2 }),
    designText: designText({
      system: 'US',
      section: 'section s trapezoid {\n  bottom width 1 ft\n  side slopes 2:1\n  bank height 3 ft\n}',
      lining: 'lining l {\n  n 0.025\n}',
      slope: '0.2 %',
      flow: '100 cfs',
      criteria: 'freeboard 0.5 ft\n  minimum velocity 1.5 ft/s',
    }),
  },
  {
    id: 'trapezoid 1.5:1, SI, freeboard 0.3 m',
    system: 'SI',
    sectionLine: 'bottom width',
    dischargeM3s: 2,
    manningN: 0.018,
    slope: 0.0005,
    bankM: 1.2,
    freeboardM: 0.3,
    minVelocityMps: 0.3,
    nearCriticalBand: [0.89, 1.13],
    shapeAt: (bottomWidthM) => ({ kind: 'trapezoid', bottomWidthM, sideSlope: 1.5 }),
    designText: designText({
      system: 'SI',
      section: 'section s trapezoid {\n  bottom width 0.5 m\n  side slopes 1.5:1\n  bank height 1.2 m\n}',
      lining: 'lining l {\n  n 0.018\n}',
      slope: '0.5 permille',
      flow: '2 m3/s',
      criteria: 'freeboard 0.3 m\n  minimum velocity 0.3 m/s',
    }),
  },
  {
    id: 'circle, US, 20 cfs at 0.5 %',
    system: 'US',
    sectionLine: 'diameter',
    dischargeM3s: 20 * CFS,
    manningN: 0.013,
    slope: 0.005,
    minVelocityMps: 2 * FOOT_M,
    nearCriticalBand: [0.89, 1.13],
    shapeAt: (diameterM) => ({ kind: 'circle', diameterM }),
    designText: designText({
      system: 'US',
      section: 'section s circle {\n  diameter 12 in\n}',
      lining: 'lining l {\n  n 0.013\n}',
      slope: '0.5 %',
      flow: '20 cfs',
      criteria: 'minimum velocity 2 ft/s',
    }),
  },
  {
    id: 'circle, SI, 0.5 m3/s at 0.3 %',
    system: 'SI',
    sectionLine: 'diameter',
    dischargeM3s: 0.5,
    manningN: 0.013,
    slope: 0.003,
    minVelocityMps: 0.6,
    nearCriticalBand: [0.89, 1.13],
    shapeAt: (diameterM) => ({ kind: 'circle', diameterM }),
    designText: designText({
      system: 'SI',
      section: 'section s circle {\n  diameter 300 mm\n}',
      lining: 'lining l {\n  n 0.013\n}',
      slope: '0.3 %',
      flow: '0.5 m3/s',
      criteria: 'minimum velocity 0.6 m/s',
    }),
  },
];

function candidatesOf(c: SizingCase): { text: string; valueM: number }[] {
  if (c.sectionLine === 'diameter') {
    const list = NOMINAL_PIPE_DIAMETERS[c.system];
    return list.sizes.map((size) => ({ text: `${size} ${list.unit}`, valueM: size * (list.unit === 'in' ? 0.0254 : 0.001) }));
  }
  const grid = BOTTOM_WIDTH_STEPS[c.system];
  return Array.from({ length: grid.count }, (_, index) => {
    const value = Math.round((index + 1) * grid.step * 10) / 10;
    return { text: `${value} ${grid.unit}`, valueM: value * (grid.unit === 'ft' ? FOOT_M : 1) };
  });
}

async function codeActionsAtReach(
  text: string,
  files: Record<string, string> = {},
  name = 'design.runnel',
  reachName = 'r',
  criteriaDefaults: CriteriaDefaults = NO_CRITERIA_DEFAULTS,
): Promise<{ workspace: LspWorkspace; actions: CodeAction[] }> {
  const workspace = await LspWorkspace.create();
  // As the server does from the editor's runnel.criteria.* settings.
  workspace.services.Runnel.analysis.CriteriaDefaults.replace(criteriaDefaults);
  const [document] = await workspace.set({ [name]: text, ...files });
  if (document === undefined) throw new Error('no document');
  const line = text.split('\n').findIndex((candidate) => candidate.trim().startsWith(`reach ${reachName} `));
  const provider = workspace.services.Runnel.lsp.CodeActionProvider;
  if (provider === undefined || line < 0) throw new Error('no code actions');
  const actions = (await provider.getCodeActions(document, {
    textDocument: { uri: document.uri.toString() },
    range: { start: { line, character: 10 }, end: { line, character: 10 } },
    context: { diagnostics: [] },
  })) as CodeAction[];
  return { workspace, actions: actions.filter((action) => action.title.startsWith('Size') || action.title.startsWith('Set') || action.title.startsWith('Give')) };
}

function applyEdits(text: string, edits: readonly TextEdit[]): string {
  return TextDocument.applyEdits(TextDocument.create('memory:///x', 'runnel', 1, text), [...edits]);
}

describe('size this section: the smallest standard size an independent computation passes', () => {
  for (const c of CASES) {
    it(c.id, async () => {
      const candidates = candidatesOf(c);
      const firstPassing = candidates.findIndex((candidate) => judge(c.shapeAt(candidate.valueM), c).passes);
      // The case must exercise the search: some size passes, and not the very first one.
      expect(firstPassing, 'no standard size passes in the independent computation').toBeGreaterThan(0);
      const expected = candidates[firstPassing];
      const previous = candidates[firstPassing - 1];
      if (expected === undefined || previous === undefined) throw new Error('unreachable');
      expect(judge(c.shapeAt(previous.valueM), c).passes).toBe(false);

      const { actions } = await codeActionsAtReach(c.designText);
      expect(actions).toHaveLength(1);
      const action = actions[0];
      const edits = Object.values(action?.edit?.changes ?? {}).flat();
      expect(edits, `action: ${action?.title} ${action?.disabled?.reason ?? ''}`).toHaveLength(1);
      expect(edits[0]?.newText).toBe(expected.text);
    });
  }

  it('says why when no width passes: a steep chute over-tops when narrow and runs supercritical when wide', async () => {
    const c: SizingCase = {
      ...(CASES[0] as SizingCase),
      id: 'steep chute',
      dischargeM3s: 500 * CFS,
      slope: 0.05,
      designText: designText({
        system: 'US',
        section: 'section s rectangle {\n  bottom width 4 ft\n  bank height 2 ft\n}',
        lining: 'lining l {\n  n 0.015\n}',
        slope: '5 %',
        flow: '500 cfs',
        criteria: 'minimum velocity 0 ft/s',
      }),
    };
    const verdicts = candidatesOf(c).map((candidate) => judge(c.shapeAt(candidate.valueM), c));
    expect(verdicts.every((verdict) => !verdict.passes)).toBe(true);
    const narrowest = verdicts[0]?.failed ?? [];
    const widest = verdicts[verdicts.length - 1]?.failed ?? [];
    expect(narrowest).toEqual(['over-topping']);
    expect(widest).toEqual(['supercritical']);
    const { actions } = await codeActionsAtReach(c.designText);
    expect(actions).toHaveLength(1);
    expect(actions[0]?.edit).toBeUndefined();
    expect(actions[0]?.disabled?.reason).toBe(
      'No standard size passes: no bottom width from 0.5 ft to 200 ft passes every check: the narrower widths fail over-topping (q); the wider ones fail supercritical (q).',
    );
  });

  it('sizes for a freeboard that comes from the editor setting where the file states none (0.5 ft = 0.1524 m)', async () => {
    const c = CASES[1] as SizingCase;
    const silentText = c.designText.replace('freeboard 0.5 ft\n  ', '');
    expect(silentText).not.toContain('freeboard');
    const candidates = candidatesOf(c);
    const withFreeboard = candidates.find((candidate) => judge(c.shapeAt(candidate.valueM), c).passes);
    const withoutFreeboard = candidates.find((candidate) => judge(c.shapeAt(candidate.valueM), { ...c, freeboardM: undefined }).passes);
    // The case must tell the two apart: the freeboard asks for a wider ditch.
    expect(withFreeboard?.valueM ?? 0).toBeGreaterThan(withoutFreeboard?.valueM ?? Infinity);
    const fromSetting = await codeActionsAtReach(silentText, {}, 'design.runnel', 'r', { freeboard: { kind: 'fixed', height_m: 0.1524 } });
    expect(Object.values(fromSetting.actions[0]?.edit?.changes ?? {}).flat()[0]?.newText).toBe(withFreeboard?.text);
    const plain = await codeActionsAtReach(silentText);
    expect(Object.values(plain.actions[0]?.edit?.changes ?? {}).flat()[0]?.newText).toBe(withoutFreeboard?.text);
  });

  it('says why for a V-shaped section, which has no bottom width', async () => {
    const text = designText({
      system: 'US',
      section: 'section s triangle {\n  side slopes 3:1\n  bank height 2 ft\n}',
      lining: 'lining l {\n  n 0.03\n}',
      slope: '0.5 %',
      flow: '5 cfs',
      criteria: 'minimum velocity 0 ft/s',
    });
    const { actions } = await codeActionsAtReach(text);
    expect(actions[0]?.disabled?.reason).toMatch(/V-shaped \(triangle\) section has no bottom width/);
  });
});

describe('sizing rules agree with the analysis', () => {
  /** The checks the sizing search judges: the analysis' uniform-flow checks (profile and jump checks are confirmed by re-analysis). */
  const UNIFORM_FLOW_CODES: ReadonlySet<string> = new Set([
    FINDING_CODES.overtopping,
    FINDING_CODES.freeboardBelowRequired,
    FINDING_CODES.supercriticalFlow,
    FINDING_CODES.nearCriticalFlow,
    FINDING_CODES.velocityAbovePermissible,
    FINDING_CODES.shearAbovePermissible,
    FINDING_CODES.velocityBelowSelfCleansing,
    FINDING_CODES.conduitOverCapacity,
    FINDING_CODES.conduitTwoDepthZone,
    FINDING_CODES.noNormalDepth,
    FINDING_CODES.depthSolveFailed,
  ]);

  it('on every reach of every sample: what the sizing rules fail, the analysis fails; what the analysis fails on normal depth, the sizing rules fail', async () => {
    const workspace = await LspWorkspace.create();
    const documents = await workspace.set(sampleTexts());
    let reaches = 0;
    for (const document of documents) {
      for (const channel of analysisOf(document, NO_CRITERIA_DEFAULTS).channels) {
        for (const reach of channel.reaches) {
          const rebuilt = sectionGeometryFromResult(reach.section);
          if (!rebuilt.ok) throw new Error(rebuilt.reason);
          const fromSizing = new Set(failedChecks(rebuilt.geometry, sizingInputsOf(reach)).map((failure) => `${failure.flow}:${failure.code}`));
          const findings = reach.flows.flatMap((flow) => flow.findings.map((finding) => ({ key: `${flow.flow}:${finding.code}`, finding })));
          const fromAnalysis = new Set(findings.map(({ key }) => key));
          const judgedOnNormalDepth = findings.filter(({ finding }) => UNIFORM_FLOW_CODES.has(finding.code) && finding.data['judgedOn'] !== 'profile').map(({ key }) => key);
          // Over-topping and freeboard judged on a deeper profile replace the normal-depth finding of the same code.
          const overProfile = (key: string): boolean => fromAnalysis.has(key);
          expect([...fromSizing].filter((key) => !overProfile(key)), `${channel.name}/${reach.name}: sizing fails what the analysis passes`).toEqual([]);
          expect(judgedOnNormalDepth.filter((key) => !fromSizing.has(key)), `${channel.name}/${reach.name}: analysis fails what sizing passes`).toEqual([]);
          reaches++;
        }
      }
    }
    expect(reaches).toBeGreaterThanOrEqual(10);
  });
});

describe('applying the sizing edit', () => {
  it('resizes a section only this reach uses in place, and the reach then passes', async () => {
    const text = CASES[1]?.designText ?? '';
    const { workspace, actions } = await codeActionsAtReach(text);
    const edits = actions[0]?.edit?.changes?.[memoryUri('design.runnel')] ?? [];
    expect(actions[0]?.title).toMatch(/^Set bottom width of section 's'/);
    const [resized] = await workspace.set({ 'design.runnel': applyEdits(text, edits) });
    const reach = resized === undefined ? undefined : analysisOf(resized, NO_CRITERIA_DEFAULTS).channels[0]?.reaches[0];
    expect(reach?.status).toBe('pass');
  });

  it('gives the reach its own copy when another reach shares the section, leaving the other reach as it was', async () => {
    // The other reach is in another channel: its water neither backs up into reach r nor comes from it.
    const text = `${CASES[1]?.designText ?? ''}channel d {\n  reach other {\n    section s\n    lining l\n    slope 0.2 %\n    length 100 ft\n  }\n  outlet normal depth\n}\n`;
    const workspace0 = await LspWorkspace.create();
    const [before] = await workspace0.set({ 'design.runnel': text });
    const otherBefore = before === undefined ? undefined : analysisOf(before, NO_CRITERIA_DEFAULTS).channels[1]?.reaches[0];
    const { workspace, actions } = await codeActionsAtReach(text);
    expect(actions[0]?.title).toMatch(/^Give reach 'r' its own section 's-r'/);
    const edits = actions[0]?.edit?.changes?.[memoryUri('design.runnel')] ?? [];
    expect(edits).toHaveLength(2);
    const [resized] = await workspace.set({ 'design.runnel': applyEdits(text, edits) });
    if (resized === undefined) throw new Error('no document');
    const analysis = analysisOf(resized, NO_CRITERIA_DEFAULTS);
    // The edit leaves a well-formed design: nothing unparsable, unresolved or named twice.
    const structural = new Set(['lexing-error', 'parsing-error', 'unknown-reference', 'duplicate-name']);
    expect(resized.diagnostics?.filter((diagnostic) => structural.has(String(diagnostic.code)))).toEqual([]);
    const sized = analysis.channels[0]?.reaches[0];
    const other = analysis.channels[1]?.reaches[0];
    expect(sized?.section.name).toBe('s-r');
    expect(sized?.status).toBe('pass');
    expect(other?.section.name).toBe('s');
    expect(other?.flows[0]?.normal?.depth_m).toBe(otherBefore?.flows[0]?.normal?.depth_m);
  });

  it('offers no size when the profile, not the size, fails: backwater from a narrower reach downstream over-tops this one', async () => {
    const c = CASES[1] as SizingCase;
    const text = c.designText.replace('  outlet normal depth', '  reach other {\n    section s\n    lining l\n    slope 0.2 %\n    length 100 ft\n  }\n  outlet normal depth');
    // Independently: the 1 ft wide reach downstream runs deeper than the 3 ft bank in uniform flow, and the water
    // surface is continuous at the junction, so reach r over-tops at its downstream end whatever its own width.
    const otherDepth = normalDepth(c.shapeAt(1 * FOOT_M), c);
    expect(otherDepth).toBeGreaterThan(c.bankM ?? Infinity);
    const { actions } = await codeActionsAtReach(text);
    expect(actions[0]?.edit).toBeUndefined();
    expect(actions[0]?.disabled?.reason).toMatch(/pass the uniform-flow checks from [\d.]+ ft to [\d.]+ ft still fail the analysis of the whole channel \(over-topping\)/);
  });
});
