/**
 * The samples, analysed together, show every finding the analysis can make, except failures to compute (a depth
 * solve, a profile) and a jump swept out of the channel, which no plausible sample design shows without being
 * built for it: test/analysis/channel-profiles.test.ts shows those two.
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import { FINDING_CODES } from '../../language/analysis/finding-messages.js';
import { buildWorkspace, sampleFiles } from '../language/language-test-kit.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';

describe('samples', () => {
  it('show every finding between them', async () => {
    const { documents } = await buildWorkspace(sampleFiles());
    const shown = new Set(documents.flatMap((document) => analyzeDocument(document, NO_CRITERIA_DEFAULTS).findings.map((finding) => finding.code)));
    const notShown: readonly string[] = [FINDING_CODES.depthSolveFailed, FINDING_CODES.profileNotComputed, FINDING_CODES.hydraulicJumpSweptOut];
    const expected = Object.values(FINDING_CODES).filter((code) => !notShown.includes(code));
    expect([...expected].filter((code) => !shown.has(code))).toEqual([]);
  });

  it('analyse every reach of every design (none incomplete), with the caution and assumptions attached', async () => {
    const { documents } = await buildWorkspace(sampleFiles());
    for (const document of documents) {
      const analysis = analyzeDocument(document, NO_CRITERIA_DEFAULTS);
      expect(analysis.incompleteReaches, analysis.uri).toEqual([]);
      expect(analysis.caution).toMatch(/licensed engineer/);
      expect(analysis.assumptions.length).toBeGreaterThan(3);
      if (analysis.kind === 'design') expect(analysis.channels.length, analysis.uri).toBeGreaterThan(0);
    }
  });

  it('use SI in the canal and US units in the ditches and the outfall', async () => {
    const { documents } = await buildWorkspace(sampleFiles());
    const units = Object.fromEntries(documents.map((document) => [document.uri.path.split('/').pop(), analyzeDocument(document, NO_CRITERIA_DEFAULTS).displayUnits]));
    expect(units).toMatchObject({ 'irrigation-canal.runnel': 'SI', 'roadside-ditches.runnel': 'US', 'storm-drain-outfall.runnel': 'US' });
  });
});
