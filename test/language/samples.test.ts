/**
 * Every design in samples/ parses, links and validates with no errors when the folder is one workspace (the
 * designs use the shared linings file by name).
 */
import { describe, expect, it } from 'vitest';
import { FINDING_CODES } from '../../language/analysis/finding-messages.js';
import { buildWorkspace, plainDiagnostics, sampleFiles } from './language-test-kit.js';

describe('samples', () => {
  it('has at least three designs and a shared linings library', () => {
    const names = Object.keys(sampleFiles());
    expect(names).toContain('linings.runnel');
    expect(names.length).toBeGreaterThanOrEqual(4);
  });

  it('parses, links and validates every sample without errors', async () => {
    const { documents } = await buildWorkspace(sampleFiles());
    for (const document of documents) {
      const errors = plainDiagnostics(document).filter((diagnostic) => diagnostic.severity === 'error' && !isAnalysisFinding(diagnostic.code));
      expect(errors, document.uri.toString()).toEqual([]);
      expect(document.parseResult.lexerErrors, document.uri.toString()).toEqual([]);
      expect(document.parseResult.parserErrors, document.uri.toString()).toEqual([]);
    }
  });

  it('resolves every lining and section reference of the samples', async () => {
    const { documents } = await buildWorkspace(sampleFiles());
    for (const document of documents) {
      expect(document.references.filter((reference) => reference.error !== undefined).map((reference) => reference.$refText)).toEqual([]);
    }
  });
});

/** Findings are reported through validation too; a sample may show an error finding (that is its purpose). */
function isAnalysisFinding(code: string): boolean {
  return (Object.values(FINDING_CODES) as string[]).includes(code);
}
