/**
 * The plain walk over a node's own properties (language/syntax/node-properties.ts) stands in for Langium's
 * streamAst and streamReferences on the validator's and the channel memo's hot paths: on every sample, and on
 * every sample cut short at random (half-written files have partial trees), it must reach the same nodes and the
 * same references in the same order.
 */
import fc from 'fast-check';
import { AstUtils, isAstNode, isMultiReference, isReference, type AstNode } from 'langium';
import { describe, expect, it } from 'vitest';
import { forEachPropertyValue } from '../../language/syntax/node-properties.js';
import { buildWorkspace, sampleFiles } from './language-test-kit.js';

function walkNodes(node: AstNode, out: AstNode[] = []): AstNode[] {
  out.push(node);
  forEachPropertyValue(node, (value) => {
    if (isAstNode(value)) walkNodes(value, out);
  });
  return out;
}

function walkReferences(node: AstNode, out: unknown[] = []): unknown[] {
  forEachPropertyValue(node, (value) => {
    if (isReference(value) || isMultiReference(value)) out.push(value);
    else if (isAstNode(value)) walkReferences(value, out);
  });
  return out;
}

async function expectSameWalk(text: string): Promise<void> {
  const { documents } = await buildWorkspace({ 'design.runnel': text });
  const root = documents[0]!.parseResult.value;
  const streamed = AstUtils.streamAst(root).toArray();
  expect(walkNodes(root)).toEqual(streamed);
  expect(walkReferences(root)).toEqual(streamed.flatMap((node) => AstUtils.streamReferences(node).map((info) => info.reference).toArray()));
}

describe('the plain walk over node properties', () => {
  const samples = Object.entries(sampleFiles());
  for (const [name, text] of samples) {
    it(`reaches the nodes and references Langium's streams reach, in order: ${name}`, () => expectSameWalk(text));
  }
  it('does so on samples cut short anywhere', async () => {
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...samples.map(([, text]) => text)), fc.double({ min: 0, max: 1, noNaN: true }), async (text, fraction) => {
        await expectSameWalk(text.slice(0, Math.floor(text.length * fraction)));
      }),
      { numRuns: 30 },
    );
  });
});
