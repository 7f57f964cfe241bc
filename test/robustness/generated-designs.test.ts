/**
 * Grammar-valid designs generated at random (design-arbitrary.ts): every one parses and links with no error but
 * the analysis findings, every reach is analysed, the analysis reads the numbers the text gives (compared with SI
 * values worked out from the text with exact unit definitions, NIST SP 811), and every result satisfies its
 * defining equation, checked with closed-form geometry (Chow 1959, Table 2-1) rather than the engine's:
 * Manning's equation at normal depth (Chow 1959, Sec. 5-6) and Q^2 T = g A^3 at critical depth (Chow 1959, Ch. 3),
 * both to 1e-8 relative (derived: exact consequences of those formulas, REFERENCES.md N8 and C5). The whole
 * pipeline (hints, hover, formatting, reports) must also pass the harness checks, including formatting that is
 * idempotent and keeps the analysis. Failures print the seed and the shrunk design.
 */
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DesignAnalysis, FlowResult, ReachResult } from '../../language/analysis/model.js';
import { FINDING_CODES } from '../../language/analysis/finding-messages.js';
import { closedForm } from '../../.scripts/engine-soak.js';
import { generatedDesign, type ExpectedReach, type GeneratedDesign } from './design-arbitrary.js';
import { BoundedHarness } from './bounded-harness.js';
import { fuzzParameters, reportSetAside } from './fuzz-settings.js';
import { setAsideKnownDefects } from './known-defects.js';
import { clip } from './text-mutations.js';

/** Standard gravity, m/s2 (CGPM 1901; NIST SP 330). */
const GRAVITY = 9.80665;
const LIBRARY = 'generated-linings.runnel';
const DESIGN = 'generated.runnel';
const FINDINGS = new Set<string>(Object.values(FINDING_CODES));

let harness: BoundedHarness;
const setAside = new Map<string, number>();

const relative = (actual: number, expected: number): number => Math.abs(actual - expected) / Math.max(Math.abs(expected), 1e-300);

/** Differences between what the text says and what the analysis read, and equations the results do not satisfy. */
function disagreements(design: GeneratedDesign, analysis: DesignAnalysis): string[] {
  const problems: string[] = [];
  const results = analysis.channels.flatMap((channel) => channel.reaches);
  if (analysis.incompleteReaches.length > 0) problems.push(`reaches left out: ${JSON.stringify(analysis.incompleteReaches.map((reach) => [reach.reach, reach.reason]))}`);
  if (results.length !== design.reaches.length) problems.push(`${results.length} reaches analysed, the text has ${design.reaches.length}`);
  // Channels may come in any order in the text; reaches keep their order within a channel.
  for (const expected of design.reaches) {
    const result = results.find((candidate) => candidate.channel === expected.channel && candidate.name === expected.name);
    if (result === undefined) problems.push(`${expected.channel} › ${expected.name} was not analysed`);
    else problems.push(...reachDisagreements(expected, result));
  }
  for (const channel of analysis.channels) {
    const order = channel.reaches.map((reach) => reach.name).join(', ');
    const wanted = design.reaches.filter((reach) => reach.channel === channel.name).map((reach) => reach.name).join(', ');
    if (order !== wanted) problems.push(`channel ${channel.name}: reaches ${order}, the text has ${wanted}`);
  }
  return problems;
}

function reachDisagreements(expected: ExpectedReach, result: ReachResult): string[] {
  const problems: string[] = [];
  const where = `${expected.channel} › ${expected.name}`;
  const compare = (what: string, actual: number | null | undefined, wanted: number, tolerance: number): void => {
    if (actual === null || actual === undefined || !(relative(actual, wanted) <= tolerance)) problems.push(`${where}: ${what} ${String(actual)}, the text says ${wanted}`);
  };
  compare("Manning's n", result.lining.manningN, expected.manningN, 1e-15);
  compare('slope', result.slope, expected.slope, 1e-8);
  compare('length', result.length_m, expected.lengthM, 1e-12);
  if (expected.bankHeightM !== null) compare('bank height', result.section.bankDepth_m, expected.bankHeightM, 1e-12);
  if (result.section.shape !== expected.dimensions.shape) problems.push(`${where}: shape ${result.section.shape}, the text says ${expected.dimensions.shape}`);
  const flowNames = result.flows.map((flow) => flow.flow);
  const wantedNames = expected.flows.map((flow) => flow.name);
  if (JSON.stringify(flowNames) !== JSON.stringify(wantedNames)) problems.push(`${where}: flows ${flowNames.join(', ')}, the text has ${wantedNames.join(', ')}`);
  for (const wanted of expected.flows) {
    const flow = result.flows.find((candidate) => candidate.flow === wanted.name);
    if (flow === undefined) continue;
    compare(`discharge of ${wanted.name}`, flow.discharge_m3s, wanted.dischargeM3s, 1e-12);
    problems.push(...equationProblems(expected, flow, `${where}, ${wanted.name}`));
  }
  return problems;
}

/** Normal depth satisfies Manning's equation and critical depth Q^2 T = g A^3, with closed-form geometry. */
function equationProblems(expected: ExpectedReach, flow: FlowResult, where: string): string[] {
  const problems: string[] = [];
  const q = flow.discharge_m3s;
  if (flow.normal !== null) {
    const y = flow.normal.depth_m;
    const geometry = closedForm(expected.dimensions, y);
    const manning = (geometry.areaM2 * Math.cbrt((geometry.areaM2 / geometry.perimeterM) ** 2) * Math.sqrt(expected.slope)) / expected.manningN;
    if (!(relative(manning, q) <= 1e-8)) problems.push(`${where}: Manning's discharge at the normal depth ${y} m is ${manning}, not ${q}`);
    if (!(relative(flow.normal.area_m2, geometry.areaM2) <= 1e-9)) problems.push(`${where}: area at normal depth ${flow.normal.area_m2}, closed form ${geometry.areaM2}`);
    const froude = q / geometry.areaM2 / Math.sqrt((GRAVITY * geometry.areaM2) / geometry.topWidthM);
    if (!(relative(flow.normal.froudeNumber, froude) <= 1e-9)) problems.push(`${where}: Froude number ${flow.normal.froudeNumber}, closed form ${froude}`);
  } else if (!(typeof flow.normalDepthNote === 'string' && flow.normalDepthNote.length > 0)) {
    problems.push(`${where}: no normal depth and no reason`);
  } else if (expected.dimensions.shape !== 'circle') {
    problems.push(`${where}: no normal depth in an open channel on a falling bed: ${flow.normalDepthNote}`);
  }
  if (flow.critical !== null) {
    const criticalResidual = (depthM: number): number => {
      const geometry = closedForm(expected.dimensions, depthM);
      return (q * q * geometry.topWidthM) / (GRAVITY * geometry.areaM2 ** 3) - 1;
    };
    const y = flow.critical.depth_m;
    const residual = criticalResidual(y);
    // Just under a crown T = 2 sqrt(y (D - y)) changes faster than any tolerance on the equation can follow: there
    // the root must lie within one part in 10^9 of the depth given (the equation changes sign across that interval).
    const crownM = expected.dimensions.shape === 'circle' ? expected.dimensions.diameterM : undefined;
    const bracketed = crownM !== undefined && y > crownM * (1 - 1e-6) && criticalResidual(y * (1 - 1e-9)) * criticalResidual(Math.min(y * (1 + 1e-9), crownM)) <= 0;
    if (!(Math.abs(residual) <= 1e-8) && !bracketed) problems.push(`${where}: Q^2 T / (g A^3) - 1 = ${residual} at the critical depth ${flow.critical.depth_m} m`);
  } else if (expected.dimensions.shape !== 'circle') {
    problems.push(`${where}: no critical depth in an open channel`);
  }
  return problems;
}

describe('generated designs', () => {
  beforeAll(async () => {
    harness = await BoundedHarness.create({ [LIBRARY]: 'library "empty"\n' });
  }, 90_000);
  afterAll(async () => {
    reportSetAside('generated designs', setAside);
    await harness?.close();
  });

  it('parse, link and analyse to the numbers they state, with every result on its defining equation', { timeout: 120_000 }, async () => {
    await fc.assert(
      fc.asyncProperty(generatedDesign, async (design) => {
        await harness.put(LIBRARY, design.library ?? 'library "empty"\n');
        const outcome = await harness.check(DESIGN, design.text, { hoverPositions: 25 });
        const { unknown, known } = setAsideKnownDefects(outcome.problems);
        for (const [id, count] of known) setAside.set(id, (setAside.get(id) ?? 0) + count);
        const errors = outcome.diagnostics
          .filter((diagnostic) => diagnostic.severity === 1 && !FINDINGS.has(String(diagnostic.code)))
          .map((diagnostic) => `${String(diagnostic.code)} at ${diagnostic.range.start.line + 1}:${diagnostic.range.start.character + 1}: ${String(diagnostic.message)}`);
        const context = `design:\n${clip(design.text, 6_000)}${design.library ? `\nlibrary:\n${clip(design.library)}` : ''}`;
        expect(errors, `errors other than findings in a valid design; ${context}`).toEqual([]);
        expect(unknown, context).toEqual([]);
        if (known.size === 0) expect(disagreements(design, outcome.analysis), context).toEqual([]);
      }),
      fuzzParameters(40),
    );
  });

  it('the checks above catch a design read wrongly (negative twin)', async () => {
    const [design] = fc.sample(generatedDesign.filter((candidate) => candidate.reaches.some((reach) => reach.flows.length > 0)), { numRuns: 1, seed: 7 });
    if (design === undefined) throw new Error('no sample');
    await harness.put(LIBRARY, design.library ?? 'library "empty"\n');
    const outcome = await harness.check(DESIGN, design.text, { format: false, hoverPositions: 0 });
    expect(disagreements(design, outcome.analysis)).toEqual([]);
    const misread = { ...design, reaches: design.reaches.map((reach) => ({ ...reach, manningN: reach.manningN * 1.01, flows: reach.flows.map((flow) => ({ ...flow, dischargeM3s: flow.dischargeM3s * 1.001 })) })) };
    expect(disagreements(misread, outcome.analysis).length).toBeGreaterThan(0);
  });
});
