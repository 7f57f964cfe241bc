/**
 * One computation per document version (DEVELOPERS.md invariant 4), recomputed when a lining in another file
 * changes; and no input, however broken, makes parsing, validation or analysis throw (invariant 3).
 */
import fc from 'fast-check';
import { EmptyFileSystemProvider, URI, type FileSystemProvider } from 'langium';
import { describe, expect, it } from 'vitest';
import { analyzeDocument, forgetAnalysis } from '../../language/analysis/analyze-design.js';
import { createRunnelServices } from '../../language/runnel-module.js';
import { buildWorkspace, plainDiagnostics, sampleFiles } from '../language/language-test-kit.js';
import { flowOf, reachOf } from './analysis-test-kit.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';

/** Files held in memory, readable by Langium's workspace the way the Node file system is. */
function memoryFileSystem(files: Map<string, string>): FileSystemProvider {
  const empty = new EmptyFileSystemProvider();
  const readFileSync = (uri: URI): string => files.get(uri.toString()) ?? '';
  return {
    stat: (uri) => empty.stat(uri),
    statSync: (uri) => empty.statSync(uri),
    exists: () => empty.exists(),
    existsSync: () => empty.existsSync(),
    readBinary: () => empty.readBinary(),
    readBinarySync: () => empty.readBinarySync(),
    readFile: (uri) => Promise.resolve(readFileSync(uri)),
    readFileSync,
    readDirectory: () => empty.readDirectory(),
    readDirectorySync: () => empty.readDirectorySync(),
  };
}

const DESIGN = `design "D"\nunits US\nflows { q = 10 cfs }\nsection ditch trapezoid { bottom width 2 ft side slopes 3:1 bank height 2 ft }\nchannel c { reach r { section ditch lining turf slope 1 % length 100 ft } outlet free fall }`;
const LIBRARY = (manningN: number): string => `library "L"\nlining turf { n ${manningN} }`;

describe('the analysis cache', () => {
  it('returns the same result for the same document version', async () => {
    const { documents } = await buildWorkspace({ 'design.runnel': DESIGN, 'library.runnel': LIBRARY(0.03) });
    const first = analyzeDocument(documents[0]!, NO_CRITERIA_DEFAULTS);
    expect(analyzeDocument(documents[0]!, NO_CRITERIA_DEFAULTS)).toBe(first);
    forgetAnalysis(documents[0]!);
    expect(analyzeDocument(documents[0]!, NO_CRITERIA_DEFAULTS)).not.toBe(first);
  });

  it('recomputes when a lining the design uses changes in another file', async () => {
    const files = new Map([
      ['memory:/design.runnel', DESIGN],
      ['memory:/library.runnel', LIBRARY(0.03)],
    ]);
    const { shared } = createRunnelServices({ fileSystemProvider: () => memoryFileSystem(files) });
    const design = await shared.workspace.LangiumDocuments.getOrCreateDocument(URI.parse('memory:/design.runnel'));
    const library = await shared.workspace.LangiumDocuments.getOrCreateDocument(URI.parse('memory:/library.runnel'));
    await shared.workspace.DocumentBuilder.build([design, library], { validation: true });
    const before = analyzeDocument(design, NO_CRITERIA_DEFAULTS);
    expect(reachOf(before, 'c', 'r').lining.manningN).toBe(0.03);

    files.set('memory:/library.runnel', LIBRARY(0.05));
    await shared.workspace.DocumentBuilder.update([URI.parse('memory:/library.runnel')], []);
    const after = analyzeDocument(design, NO_CRITERIA_DEFAULTS);
    expect(after).not.toBe(before);
    expect(reachOf(after, 'c', 'r').lining.manningN).toBe(0.05);
    // Rougher lining, deeper flow (Manning: y grows with n).
    expect(flowOf(reachOf(after, 'c', 'r'), 'q').normal?.depth_m ?? 0).toBeGreaterThan(flowOf(reachOf(before, 'c', 'r'), 'q').normal?.depth_m ?? 0);
  });
});

describe('broken input never throws', () => {
  const samples = Object.entries(sampleFiles());
  // Pieces that are likely to confuse: keywords, units, numbers, braces, quotes, comments.
  const fragments = ['{', '}', '"', '//', '/*', 'reach', 'section', 'lining', 'flows', '=', ':', '%', 'ft', 'cfs', '0', '-1', '.5', '1e999', 'n', 'circle', ' ', '\n'];

  it('parses, validates and analyses any edit of a sample without an exception or an internal-error diagnostic', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.integer({ min: 0, max: samples.length - 1 }),
        fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.nat({ max: 40 }), fc.constantFrom(...fragments)), { minLength: 1, maxLength: 6 }),
        async (sampleIndex, edits) => {
          const [name, original] = samples[sampleIndex]!;
          let text = original;
          for (const [where, deleteCount, insert] of edits) {
            const at = Math.floor(where * text.length);
            text = text.slice(0, at) + insert + text.slice(at + deleteCount);
          }
          const otherFiles = Object.fromEntries(samples.filter(([other]) => other !== name));
          const { documents } = await buildWorkspace({ [name]: text, ...otherFiles });
          const document = documents[0]!;
          const internal = plainDiagnostics(document).filter((diagnostic) => diagnostic.message.startsWith('An error occurred'));
          expect(internal, text).toEqual([]);
          const analysis = analyzeDocument(document, NO_CRITERIA_DEFAULTS);
          for (const finding of analysis.findings) expect(finding.message, text).not.toMatch(/NaN|undefined/);
        },
      ),
      { numRuns: 60 },
    );
  }, 120_000);

  it('handles an empty file and a file of only comments', async () => {
    for (const text of ['', '// nothing here\n/* at all */']) {
      const { documents } = await buildWorkspace({ 'empty.runnel': text });
      expect(analyzeDocument(documents[0]!, NO_CRITERIA_DEFAULTS).channels).toEqual([]);
    }
  });
});
