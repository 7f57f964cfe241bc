/** Names: unique where defined; references resolve across files, with a "did you mean" when they do not. */
import { AstUtils, type MultiReference, type Reference } from 'langium';
import { describe, expect, it } from 'vitest';
import { BASE, CHANNEL, buildWorkspace, expectDiagnostic, expectNoDiagnostic, plainDiagnostics } from '../language-test-kit.js';

const LIBRARY = 'library "Shared"\nlining turf { n 0.035 }\nlining rock { n 0.04 }\nsection wide trapezoid { bottom width 6 ft side slopes 3:1 bank height 3 ft }';

describe('duplicate-name', () => {
  it('reports the second lining of the same name, pointing at the first', () =>
    expectDiagnostic({
      source: `design "T"\nlining grass { n 0.035 }\nlining <|grass|> { n 0.03 }`,
      code: 'duplicate-name',
      severity: 'error',
      message: "Another lining in this file is already named 'grass' (line 2); names must be unique.",
    }));
  it('reports two flows of the same name in different flow tables', () =>
    expectDiagnostic({
      source: `design "T"\nflows { q10 = 1 cfs }\nflows { <|q10|> = 2 cfs }`,
      code: 'duplicate-name',
      severity: 'error',
      message: "Another flow in this file is already named 'q10' (line 2); names must be unique.",
    }));
  it('reports two reaches of one channel', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c {\n  reach r { section ditch lining grass slope 1 % length 10 ft }\n  reach <|r|> { section ditch lining grass slope 1 % length 10 ft }\n}`,
      code: 'duplicate-name',
      severity: 'error',
      message: "Another reach in this channel is already named 'r' (line 7); names must be unique.",
    }));
  it('allows reaches of the same name in different channels', () =>
    expectNoDiagnostic(`${BASE}\n${CHANNEL}\n${CHANNEL.replace('channel c', 'channel d')}`, 'duplicate-name'));
  it('allows a lining and a section to share a name', () => expectNoDiagnostic(`design "T"\nlining a { n 0.03 }\nsection a circle { diameter 1 m }`, 'duplicate-name'));
});

describe('unknown-reference', () => {
  it('suggests the nearest lining name, from this file or the workspace', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c { reach r { section ditch lining <|trf|> slope 1 % length 10 ft } outlet free fall }`,
      code: 'unknown-reference',
      severity: 'error',
      message: "No lining named 'trf' is defined in this file or the workspace. Did you mean 'turf'?",
      otherFiles: { 'shared.runnel': LIBRARY },
    }));
  it('lists the known names when none is close', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c { reach r { section <|culvert|> lining grass slope 1 % length 10 ft } outlet free fall }`,
      code: 'unknown-reference',
      severity: 'error',
      message: "No section named 'culvert' is defined in this file or the workspace. Known: ditch.",
    }));
  it('suggests a flow name in a reach', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c { reach r { section ditch lining grass slope 1 % length 10 ft flows { <|q01|> = 12 cfs } } outlet free fall }`,
      code: 'unknown-reference',
      severity: 'error',
      message: "No flow named 'q01' is defined in this file or the workspace. Did you mean 'q10'?",
    }));
  it('resolves a lining and a section defined in another file', () =>
    expectNoDiagnostic(`${BASE}\nchannel c { reach r { section wide lining turf slope 1 % length 10 ft } outlet free fall }`, 'unknown-reference', { 'shared.runnel': LIBRARY }));
  it('does not see flows of another design', async () => {
    const other = 'design "Other"\nflows { q500 = 1 cfs }';
    const { documents } = await buildWorkspace({
      'a.runnel': `${BASE}\nchannel c { reach r { section ditch lining grass slope 1 % length 10 ft flows { q500 = 2 cfs } } outlet free fall }`,
      'b.runnel': other,
    });
    expect(plainDiagnostics(documents[0]!).map((diagnostic) => diagnostic.code)).toContain('unknown-reference');
  });
});

/** The URI of the document a reference resolves into. */
function documentOf(reference: Reference | MultiReference): string | undefined {
  const target = 'ref' in reference ? reference.ref : undefined;
  return target === undefined ? undefined : AstUtils.getDocument(target).uri.toString();
}

describe('cross-file references', () => {
  it('goes to the definition in the library file', async () => {
    const { documents } = await buildWorkspace({
      'design.runnel': `${BASE}\nchannel c { reach r { section wide lining turf slope 1 % length 10 ft } outlet free fall }`,
      'shared.runnel': LIBRARY,
    });
    const design = documents[0]!;
    const turfReferences = design.references.filter((reference) => reference.$refText === 'turf');
    expect(turfReferences).toHaveLength(1);
    const target = turfReferences[0]!;
    expect(documentOf(target)).toBe('memory:/workspace/shared.runnel');
  });
  it('prefers a lining of the same name in the design itself', async () => {
    const { documents } = await buildWorkspace({
      'design.runnel': `${BASE}\nlining turf { n 0.05 }\nchannel c { reach r { section wide lining turf slope 1 % length 10 ft } outlet free fall }`,
      'shared.runnel': LIBRARY,
    });
    const reference = documents[0]!.references.find((candidate) => candidate.$refText === 'turf');
    expect(reference === undefined ? undefined : documentOf(reference)).toBe('memory:/workspace/design.runnel');
    expect(plainDiagnostics(documents[0]!).map((diagnostic) => diagnostic.code)).not.toContain('ambiguous-reference');
  });
});

describe('ambiguous-reference', () => {
  it('warns when two library files define the lining a design uses', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c { reach r { section ditch lining <|turf|> slope 1 % length 10 ft } outlet free fall }`,
      code: 'ambiguous-reference',
      severity: 'warning',
      message: "2 linings named 'turf' are defined in the workspace (a-shared.runnel, b-shared.runnel); this uses the one in a-shared.runnel. Rename one to make the choice explicit.",
      otherFiles: { 'a-shared.runnel': 'library "A"\nlining turf { n 0.03 }', 'b-shared.runnel': 'library "B"\nlining turf { n 0.04 }' },
    }));
  it('says nothing when one file defines it', () =>
    expectNoDiagnostic(`${BASE}\nchannel c { reach r { section ditch lining turf slope 1 % length 10 ft } outlet free fall }`, 'ambiguous-reference', { 'a-shared.runnel': 'library "A"\nlining turf { n 0.03 }' }));
});
