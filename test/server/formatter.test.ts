/**
 * Formatting: idempotent on every sample, changes only whitespace (the token sequence is identical), keeps the
 * meaning (the analysis of the formatted design equals the original's, number for number), and lays out a messy
 * design the documented way. A document with a syntax error is left alone.
 */
import { describe, expect, it } from 'vitest';
import type { LangiumDocument } from 'langium';
import { formattedText, formattingEdits } from '../../server/lsp/formatter.js';
import { analysisOf } from '../../server/lsp/document-analysis.js';
import type { DesignAnalysis } from '../../language/analysis/model.js';
import { LspWorkspace, sampleTexts } from './lsp-workspace.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';

async function format(text: string, name = 'design.runnel', others: Record<string, string> = {}): Promise<{ workspace: LspWorkspace; document: LangiumDocument; formatted: string | undefined }> {
  const workspace = await LspWorkspace.create();
  const [document] = await workspace.set({ [name]: text, ...others });
  if (document === undefined) throw new Error('no document');
  return { workspace, document, formatted: formattedText(document, workspace.services.Runnel.parser.Lexer) };
}

function tokens(workspace: LspWorkspace, text: string): string[] {
  const lexed = workspace.services.Runnel.parser.Lexer.tokenize(text);
  return [...lexed.tokens, ...(lexed.hidden ?? [])].sort((a, b) => a.startOffset - b.startOffset).map((token) => `${token.tokenType.name}:${token.image}`);
}

/** What the analysis says, without source positions (formatting moves text, not meaning). */
function meaning(analysis: DesignAnalysis): unknown {
  return analysis.channels.map((channel) => ({
    channel: channel.name,
    outlet: channel.outlet,
    reaches: channel.reaches.map((reach) => ({
      name: reach.name,
      section: [reach.section.shape, reach.section.dimensions, reach.section.bankDepth_m],
      lining: [reach.lining.manningN, reach.lining.maxVelocity_mps, reach.lining.maxShear_Pa],
      slope: reach.slope,
      length: reach.length_m,
      flows: reach.flows.map((flow) => ({
        flow: flow.flow,
        discharge: flow.discharge_m3s,
        normal: flow.normal,
        critical: flow.critical,
        findings: flow.findings.map((finding) => [finding.code, finding.severity, finding.message]),
      })),
    })),
  }));
}

describe('formatting every sample', () => {
  const samples = sampleTexts();
  /** Designs are formatted with the shared linings beside them, so their references resolve. */
  const sharedLinings = (name: string): Record<string, string> => (name === 'linings.runnel' ? {} : { 'linings.runnel': samples['linings.runnel'] ?? '' });
  it('has samples to format', () => {
    expect(Object.keys(samples).length).toBeGreaterThanOrEqual(3);
  });
  for (const [name, text] of Object.entries(samples)) {
    it(`${name}: formatting twice equals formatting once`, async () => {
      const once = await format(text, name, sharedLinings(name));
      expect(once.formatted).toBeDefined();
      const twice = await format(once.formatted ?? '', name);
      expect(twice.formatted).toBe(once.formatted);
    });

    it(`${name}: only whitespace changes and the analysis is the same`, async () => {
      const others = sharedLinings(name);
      const original = await format(text, name, others);
      const reformatted = await format(original.formatted ?? '', name, others);
      expect(tokens(reformatted.workspace, original.formatted ?? '')).toEqual(tokens(original.workspace, text));
      expect(meaning(analysisOf(reformatted.document, NO_CRITERIA_DEFAULTS))).toEqual(meaning(analysisOf(original.document, NO_CRITERIA_DEFAULTS)));
      expect(reformatted.document.diagnostics?.map((diagnostic) => diagnostic.code)).toEqual(original.document.diagnostics?.map((diagnostic) => diagnostic.code));
    });
  }
});

describe('formatting layout', () => {
  it('puts one property per line, indents blocks, writes units and side slopes tight and aligns flow tables', async () => {
    const messy = [
      '  design   "Messy"',
      'units US',
      '',
      '',
      '',
      'section  s trapezoid {bottom width 2ft',
      '     side slopes 3 : 1 ,  2:1   bank height 2 ft }',
      'flows { q10 = 9 cfs "ten"',
      '  q100=  20 ft3 / s',
      '     q2 "two-year, set per channel"   }',
      'channel c { reach r {section s  lining l',
      'slope 0.5 %  length 100 ft',
      'flows { q10 = 10 cfs    q100 = 22 cfs } }',
      '  outlet free fall }',
    ].join('\n');
    const expected = [
      'design "Messy"',
      'units US',
      '',
      'section s trapezoid {',
      '  bottom width 2 ft',
      '  side slopes 3:1, 2:1',
      '  bank height 2 ft',
      '}',
      'flows {',
      '  q10  = 9 cfs "ten"',
      '  q100 = 20 ft3/s',
      '  q2           "two-year, set per channel"',
      '}',
      'channel c {',
      '  reach r {',
      '    section s',
      '    lining l',
      '    slope 0.5 %',
      '    length 100 ft',
      '    flows { q10 = 10 cfs  q100 = 22 cfs }',
      '  }',
      '  outlet free fall',
      '}',
      '',
    ].join('\n');
    const { formatted } = await format(messy);
    expect(formatted).toBe(expected);
  });

  it('keeps comments where they were: trailing stays trailing, own line stays own line', async () => {
    const text = ['design "c" // title', '// about the section', 'section s rectangle { // inline', '  bottom width 2 ft /* why */', '  // last', '}', ''].join('\n');
    const { formatted } = await format(text);
    expect(formatted).toBe(text);
  });

  it('leaves a document with a syntax error alone', async () => {
    const { document, workspace, formatted } = await format('design "x"\nsection s trapezoid {\n  bottom width 2 ft\n');
    expect(formatted).toBeUndefined();
    expect(formattingEdits(document, workspace.services.Runnel.parser.Lexer)).toBeUndefined();
  });

  it('edits only the range asked for when formatting a range', async () => {
    const text = 'design   "x"\nsection s rectangle {\n     bottom width 2 ft\n}\n';
    const { workspace, document } = await format(text);
    const formatter = workspace.services.Runnel.lsp.Formatter;
    if (formatter === undefined) throw new Error('no formatter');
    const edits = await formatter.formatDocumentRange(document, {
      textDocument: { uri: document.uri.toString() },
      range: { start: { line: 1, character: 0 }, end: { line: 2, character: 30 } },
      options: { tabSize: 2, insertSpaces: true },
    });
    expect(edits).toEqual([{ range: { start: { line: 1, character: 21 }, end: { line: 2, character: 5 } }, newText: '\n  ' }]);
    const all = await formatter.formatDocument(document, { textDocument: { uri: document.uri.toString() }, options: { tabSize: 2, insertSpaces: true } });
    expect(all.length).toBe(2);
  });
});
