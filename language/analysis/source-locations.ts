/** Source locations of syntax nodes, in the shape the analysis model uses (LSP-style zero-based positions). */
import { AstUtils, GrammarUtils, type AstNode } from 'langium';
import type { SourceLocation, SourceRange } from './model.js';

const EMPTY_RANGE: SourceRange = { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } };

/** The URI of the document a node belongs to ('' when it is not in one). */
export function documentUriOf(node: AstNode): string {
  const root = AstUtils.findRootNode(node);
  return root.$document?.uri.toString() ?? '';
}

/** The whole node. */
export function locationOf(node: AstNode): SourceLocation {
  return { uri: documentUriOf(node), range: node.$cstNode?.range ?? EMPTY_RANGE };
}

/** One property of the node (e.g. its name), falling back to the whole node. */
export function propertyLocationOf(node: AstNode, property: string): SourceLocation {
  const cstNode = GrammarUtils.findNodeForProperty(node.$cstNode, property);
  return { uri: documentUriOf(node), range: (cstNode ?? node.$cstNode)?.range ?? EMPTY_RANGE };
}

/** Whether two locations are the same place. */
export function sameLocation(left: SourceLocation, right: SourceLocation): boolean {
  return (
    left.uri === right.uri &&
    left.range.start.line === right.range.start.line &&
    left.range.start.character === right.range.start.character &&
    left.range.end.line === right.range.end.line &&
    left.range.end.character === right.range.end.character
  );
}
