/**
 * A generated design of 500 reaches and 3 flows: it builds (parse, link, validate including the analysis) with no
 * errors other than findings, every reach is analysed, and the time is reported. The budget is loose on purpose
 * (shared CI machines); the measured figure is printed for the record.
 */
import { EmptyFileSystem, URI } from 'langium';
import { describe, expect, it } from 'vitest';
import { analyzeDocument, forgetAnalysis } from '../../language/analysis/analyze-design.js';
import { forgetChannelProfiles } from '../../language/analysis/channel-profiles.js';
import { FINDING_CODES } from '../../language/analysis/finding-messages.js';
import { createRunnelServices } from '../../language/runnel-module.js';
import { plainDiagnostics } from '../language/language-test-kit.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';

export function generatedDesign(reachCount: number): string {
  const lines = [
    'design "Generated: long drainage system"',
    'units US',
    'criteria { freeboard 0.5 ft }',
    'flows { q2 = 20 cfs "2-year"  q10 = 35 cfs "10-year"  q100 = 60 cfs "100-year" }',
    'section ditch trapezoid { bottom width 4 ft  side slopes 3:1  bank height 3 ft }',
    'section pipe circle { diameter 36 in }',
    'lining grass { n 0.035  permissible shear 1.0 psf }',
    'lining concrete { n 0.013  permissible velocity 15 ft/s }',
    'channel main {',
  ];
  for (let index = 0; index < reachCount; index++) {
    const isPipe = index % 5 === 4;
    const slopePercent = (0.2 + (index % 17) * 0.15).toFixed(2);
    lines.push(`  reach r${index} { section ${isPipe ? 'pipe' : 'ditch'}  lining ${isPipe ? 'concrete' : 'grass'}  slope ${slopePercent} %  length ${100 + (index % 7) * 25} ft }`);
  }
  lines.push('  outlet free fall', '}');
  return lines.join('\n');
}

describe('a 500-reach, 3-flow design', () => {
  it('builds and analyses every reach within a loose time budget', async () => {
    const text = generatedDesign(500);
    const { shared } = createRunnelServices(EmptyFileSystem);
    const started = performance.now();
    const document = shared.workspace.LangiumDocumentFactory.fromString(text, URI.parse('memory:/generated.runnel'));
    shared.workspace.LangiumDocuments.addDocument(document);
    await shared.workspace.DocumentBuilder.build([document], { validation: true });
    const builtMs = performance.now() - started;
    // Afresh, water-surface profiles included; then again with the channel's profiles remembered, as after an
    // edit that leaves the channel's inputs as they were.
    forgetAnalysis(document);
    forgetChannelProfiles();
    const analysisStarted = performance.now();
    const analysis = analyzeDocument(document, NO_CRITERIA_DEFAULTS);
    const analysisMs = performance.now() - analysisStarted;
    forgetAnalysis(document);
    const rememberedStarted = performance.now();
    analyzeDocument(document, NO_CRITERIA_DEFAULTS);
    const rememberedMs = performance.now() - rememberedStarted;

    const findingCodes = new Set<string>(Object.values(FINDING_CODES));
    expect(plainDiagnostics(document).filter((diagnostic) => diagnostic.severity === 'error' && !findingCodes.has(diagnostic.code))).toEqual([]);
    expect(analysis.channels[0]?.reaches).toHaveLength(500);
    expect(analysis.channels[0]?.reaches.every((reach) => reach.flows.length === 3)).toBe(true);
    expect(analysis.channels[0]?.profiles).toHaveLength(3);
    console.info(
      `500 reaches x 3 flows: parse + link + validate (with analysis) ${builtMs.toFixed(0)} ms; analysis alone ${analysisMs.toFixed(0)} ms, ` +
        `${rememberedMs.toFixed(0)} ms with the channel profiles remembered`,
    );
    expect(builtMs).toBeLessThan(20_000);
  });
});
