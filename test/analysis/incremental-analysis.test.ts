/**
 * After an edit the analysis takes over the results of the channels the edit did not touch
 * (language/analysis/channel-memo.ts). Whatever the edits, that must give exactly the analysis a fresh computation
 * gives: for random sequences of edits to the samples and to a multi-channel design (numbers changed, lines
 * deleted, duplicated or inserted, columns shifted, the shared linings file changed), the editor's analysis after
 * each edit equals, field for field, the analysis of the same files in a workspace that has never seen them.
 * fast-check prints the seed and the shrunk edit sequence of a failure.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AstUtils } from 'langium';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import { referencesByChannel } from '../../language/analysis/channel-memo.js';
import { isChannel, isReach } from '../../language/generated/ast.js';
import { NO_CRITERIA_DEFAULTS, type CriteriaDefaults } from '../../language/analysis/criteria-settings.js';
import type { DesignAnalysis } from '../../language/analysis/model.js';
import { LspWorkspace, memoryUri, sampleTexts } from '../server/lsp-workspace.js';

/** Three channels sharing sections and linings: an edit to one leaves two to be taken over. */
const THREE_CHANNELS = [
  'design "Three ditches"',
  'units US',
  'criteria {\n  freeboard 0.5 ft\n}',
  'flows {\n  q10 = 12 cfs "10-year"\n  q100 = 30 cfs "100-year"\n}',
  'section ditch trapezoid {\n  bottom width 2 ft\n  side slopes 3:1\n  bank height 2 ft\n}',
  'section culvert circle {\n  diameter 24 in\n}',
  'lining grass {\n  n 0.035\n  permissible shear 1.0 psf\n}',
  'lining concrete {\n  n 0.013\n  permissible velocity 12 ft/s\n}',
  ...['north', 'middle', 'south'].map(
    (name, index) =>
      `channel ${name} {\n` +
      `  reach ${name}1 {\n    section ditch\n    lining grass\n    slope ${0.4 + index} %\n    length 200 ft\n  }\n` +
      `  reach ${name}2 {\n    section culvert\n    lining concrete\n    slope ${2 - index * 0.5} %\n    length 80 ft\n  }\n` +
      `  reach ${name}3 {\n    section ditch\n    lining grass\n    slope 0.3 %\n    length 150 ft\n  }\n` +
      '  outlet free fall\n}',
  ),
].join('\n');

/**
 * One channel of 14 reaches: mild and steep slopes in turn (so jumps form and critical depth controls the reaches
 * above each break), a discharge change part way down, a reach with its own criteria and one given by inverts. An
 * edit to one reach leaves the others to be taken over where their share of the profile is unchanged.
 */
const LONG_CHANNEL = [
  'design "One long ditch"',
  'units US',
  'criteria {\n  freeboard 0.5 ft\n}',
  'flows {\n  q10 = 14 cfs "10-year"\n  q100 = 32 cfs "100-year"\n}',
  'section ditch trapezoid {\n  bottom width 2 ft\n  side slopes 3:1\n  bank height 2 ft\n}',
  'section culvert circle {\n  diameter 30 in\n}',
  'lining grass {\n  n 0.035\n  permissible shear 1.0 psf\n}',
  'lining concrete {\n  n 0.013\n  permissible velocity 12 ft/s\n}',
  'channel long {',
  ...Array.from({ length: 14 }, (_, index) => {
    const culvert = index % 5 === 3;
    const extra = index === 6 ? '\n    flows { q10 = 18 cfs  q100 = 40 cfs }' : index === 9 ? '\n    criteria { freeboard 0.25 ft }' : '';
    const bed = index === 11 ? 'inverts 30.2 ft to 29.6 ft' : `slope ${[0.3, 2.8, 0.6, 4.1, 0.2, 1.6, 0.4][index % 7]} %`;
    return `  reach r${index} {\n    section ${culvert ? 'culvert' : 'ditch'}\n    lining ${culvert ? 'concrete' : 'grass'}\n    ${bed}\n    length ${120 + ((index * 37) % 160)} ft${extra}\n  }`;
  }),
  '  outlet free fall',
  '}',
].join('\n');

type Edit =
  | { readonly kind: 'number'; readonly file: number; readonly at: number; readonly value: string }
  | { readonly kind: 'delete-line' | 'duplicate-line' | 'insert-blank-line' | 'indent-line'; readonly file: number; readonly at: number };

const NUMBERS = ['0', '0.013', '0.05', '0.5', '1', '1.35', '3', '24', '250', '-1'];

const editArbitrary: fc.Arbitrary<Edit> = fc.oneof(
  fc.record({ kind: fc.constant('number' as const), file: fc.nat(), at: fc.nat(), value: fc.constantFrom(...NUMBERS) }),
  fc.record({ kind: fc.constantFrom('delete-line' as const, 'duplicate-line' as const, 'insert-blank-line' as const, 'indent-line' as const), file: fc.nat(), at: fc.nat() }),
);

function applyEdit(text: string, edit: Edit): string {
  if (edit.kind === 'number') {
    const numbers = [...text.matchAll(/\d+(\.\d+)?/g)];
    const match = numbers[edit.at % Math.max(1, numbers.length)];
    if (match?.index === undefined) return text;
    return `${text.slice(0, match.index)}${edit.value}${text.slice(match.index + match[0].length)}`;
  }
  const lines = text.split('\n');
  const index = edit.at % lines.length;
  switch (edit.kind) {
    case 'delete-line':
      lines.splice(index, 1);
      break;
    case 'duplicate-line':
      lines.splice(index, 0, lines[index] ?? '');
      break;
    case 'insert-blank-line':
      lines.splice(index, 0, '');
      break;
    case 'indent-line':
      lines[index] = `  ${lines[index] ?? ''}`;
      break;
  }
  return lines.join('\n');
}

/** The analysis of `design` among `files` in a workspace that has never seen them. */
async function freshAnalysis(files: Readonly<Record<string, string>>, design: string): Promise<DesignAnalysis> {
  const workspace = await LspWorkspace.create();
  await workspace.set(files);
  return analyzeDocument(workspace.document(memoryUri(design)), NO_CRITERIA_DEFAULTS);
}

/** The analysis without its document version (the fresh workspace counts versions from 1). */
function withoutVersion(analysis: DesignAnalysis): Omit<DesignAnalysis, 'version'> {
  const { version: _version, ...rest } = analysis;
  return rest;
}

const samples = sampleTexts();
const designs: Record<string, string> = {
  ...Object.fromEntries(Object.entries(samples).filter(([name]) => name !== 'linings.runnel')),
  'three-channels.runnel': THREE_CHANNELS,
  'long-channel.runnel': LONG_CHANNEL,
};

describe('the analysis after an edit', () => {
  for (const [design, designText] of Object.entries(designs)) {
    it(`equals a fresh analysis after random edits to ${design} and the shared linings`, async () => {
      await fc.assert(
        fc.asyncProperty(fc.array(editArbitrary, { minLength: 1, maxLength: 6 }), async (edits) => {
          const editor = await LspWorkspace.create();
          const files: Record<string, string> = { [design]: designText, 'linings.runnel': samples['linings.runnel'] ?? '' };
          await editor.set(files);
          analyzeDocument(editor.document(memoryUri(design)), NO_CRITERIA_DEFAULTS);
          for (const edit of edits) {
            // One edit in three goes to the linings file the design uses.
            const name = edit.file % 3 === 2 ? 'linings.runnel' : design;
            files[name] = applyEdit(files[name] ?? '', edit);
            await editor.set({ [name]: files[name] ?? '' });
            const incremental = analyzeDocument(editor.document(memoryUri(design)), NO_CRITERIA_DEFAULTS);
            const fresh = await freshAnalysis(files, design);
            expect(withoutVersion(incremental)).toEqual(withoutVersion(fresh));
          }
        }),
        { numRuns: 12 },
      );
    }, 120_000);
  }

  it('takes over the channels an edit did not touch, and only those', async () => {
    const editor = await LspWorkspace.create();
    const [document] = await editor.set({ 'three.runnel': THREE_CHANNELS });
    const before = analyzeDocument(document!, NO_CRITERIA_DEFAULTS);
    const [edited] = await editor.set({ 'three.runnel': THREE_CHANNELS.replace('slope 1.4 %', 'slope 1.2 %') });
    const after = analyzeDocument(edited!, NO_CRITERIA_DEFAULTS);
    expect(after.channels.map((channel) => channel.name)).toEqual(['north', 'middle', 'south']);
    expect(after.channels[0]).toBe(before.channels[0]);
    expect(after.channels[1]).not.toBe(before.channels[1]);
    expect(after.channels[2]).toBe(before.channels[2]);
    // A line inserted above every channel moves them all: none is taken over.
    const [shifted] = await editor.set({ 'three.runnel': `\n${THREE_CHANNELS}` });
    const moved = analyzeDocument(shifted!, NO_CRITERIA_DEFAULTS);
    expect(moved.channels.some((channel, index) => channel === after.channels[index])).toBe(false);
  });

  it('takes over the reaches of an edited channel whose inputs and share of the profile did not change, and only those', async () => {
    const editor = await LspWorkspace.create();
    const [document] = await editor.set({ 'long.runnel': LONG_CHANNEL });
    const before = analyzeDocument(document!, NO_CRITERIA_DEFAULTS).channels[0]!;
    // The concrete culvert r8 from 2.8 % to 0.5 %, still steep at both flows: critical depth still stands at its head
    // (the break from the mild r7), so nothing above it changes; its supercritical flow leaves it at a new depth, so
    // the jump in the mild r9 below moves; critical depth at the break into the steep r10 holds everything below.
    const editedText = LONG_CHANNEL.replace(/(reach r8 \{[^}]*?slope )2\.8 %/, '$10.5 %');
    expect(editedText).not.toBe(LONG_CHANNEL);
    const [edited] = await editor.set({ 'long.runnel': editedText });
    const analysis = analyzeDocument(edited!, NO_CRITERIA_DEFAULTS);
    const after = analysis.channels[0]!;
    expect(after).not.toBe(before);
    const takenOver = after.reaches.map((reach, index) => reach === before.reaches[index]);
    // r9's own text is unchanged: it is computed again because its share of the profile changed.
    expect(takenOver).toEqual([true, true, true, true, true, true, true, true, false, false, true, true, true, true]);
    // A reach is taken over only where its profile at every flow is unchanged, value for value.
    after.reaches.forEach((reach, index) => {
      if (takenOver[index]) expect(reach.flows.map((flow) => flow.profile)).toEqual(before.reaches[index]!.flows.map((flow) => flow.profile));
    });
    const fresh = await LspWorkspace.create();
    const [same] = await fresh.set({ 'long.runnel': editedText });
    expect(withoutVersion(analysis)).toEqual(withoutVersion(analyzeDocument(same!, NO_CRITERIA_DEFAULTS)));
  });

  it("writes a taken-over reach's jump finding again when a reach it names is renamed, although its numbers are unchanged", async () => {
    // A steep concrete chute onto a short mild apron with a free fall: the supercritical flow from the chute runs
    // through the apron, which could hold a jump, and leaves the channel. The finding stands on the apron (whose text
    // is unchanged) and names the chute; renaming the chute changes no number of the apron's profile.
    const design = (chute: string): string =>
      [
        'design "Chute and apron"',
        'units US',
        'flows {\n  q = 30 cfs "design"\n}',
        'section ditch trapezoid {\n  bottom width 3 ft\n  side slopes 3:1\n  bank height 3 ft\n}',
        'lining concrete {\n  n 0.013\n  permissible velocity 20 ft/s\n}',
        'channel c {',
        '  reach upper {\n    section ditch\n    lining concrete\n    slope 0.2 %\n    length 200 ft\n  }',
        `  reach ${chute} {\n    section ditch\n    lining concrete\n    slope 6 %\n    length 150 ft\n  }`,
        '  reach apron {\n    section ditch\n    lining concrete\n    slope 0.1 %\n    length 60 ft\n  }',
        '  outlet free fall',
        '}',
      ].join('\n');
    const sweptOut = (analysis: DesignAnalysis) => analysis.findings.find((finding) => finding.reach === 'apron' && finding.code === 'hydraulic-jump-swept-out');
    const editor = await LspWorkspace.create();
    const [document] = await editor.set({ 'chute.runnel': design('chute') });
    expect(sweptOut(analyzeDocument(document!, NO_CRITERIA_DEFAULTS))?.message).toContain("reach 'chute'");
    const [renamed] = await editor.set({ 'chute.runnel': design('steep') });
    const analysis = analyzeDocument(renamed!, NO_CRITERIA_DEFAULTS);
    expect(sweptOut(analysis)?.message).toContain("reach 'steep'");
    const fresh = await LspWorkspace.create();
    const [same] = await fresh.set({ 'chute.runnel': design('steep') });
    expect(withoutVersion(analysis)).toEqual(withoutVersion(analyzeDocument(same!, NO_CRITERIA_DEFAULTS)));
  });

  it('computes every channel again when the criteria defaults from settings change', async () => {
    // Only the reaches of a design silent on a criterion take the setting: strip the design's criteria block.
    const silent = THREE_CHANNELS.replace('criteria {\n  freeboard 0.5 ft\n}\n', '');
    const editor = await LspWorkspace.create();
    const [document] = await editor.set({ 'three.runnel': silent });
    const before = analyzeDocument(document!, NO_CRITERIA_DEFAULTS);
    const twoFeet: CriteriaDefaults = { freeboard: { kind: 'fixed', height_m: 0.6096 } };
    const after = analyzeDocument(document!, twoFeet);
    expect(after.channels.some((channel, index) => channel === before.channels[index])).toBe(false);
    const fresh = await LspWorkspace.create();
    const [same] = await fresh.set({ 'three.runnel': silent });
    expect(withoutVersion(after)).toEqual(withoutVersion(analyzeDocument(same!, twoFeet)));
    expect(after.findings.some((finding) => finding.code === 'freeboard-below-required')).toBe(true);
  });

  it("lists each channel's and each reach's references from the linked document as a walk of its tree finds them", async () => {
    const editor = await LspWorkspace.create();
    const documents = await editor.set({ ...sampleTexts(), 'three.runnel': THREE_CHANNELS });
    let channels = 0;
    for (const document of documents) {
      const listed = referencesByChannel(document);
      expect(listed).toBeDefined();
      for (const channel of AstUtils.streamAllContents(document.parseResult.value).filter(isChannel)) {
        channels++;
        const walked = AstUtils.streamAst(channel).flatMap((node) => AstUtils.streamReferences(node)).toArray();
        expect(walked.length).toBeGreaterThan(0);
        expect((listed?.get(channel) ?? []).map((reference) => reference.$refText)).toEqual(walked.map((info) => info.reference.$refText));
        for (const reach of (channel.members ?? []).filter(isReach)) {
          const inReach = AstUtils.streamAst(reach).flatMap((node) => AstUtils.streamReferences(node)).toArray();
          expect((listed?.get(reach) ?? []).map((reference) => reference.$refText)).toEqual(inReach.map((info) => info.reference.$refText));
        }
      }
    }
    expect(channels).toBeGreaterThanOrEqual(5);
  });
});
