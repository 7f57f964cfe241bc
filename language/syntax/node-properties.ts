/**
 * The values a syntax node holds in its own properties (not Langium's `$` bookkeeping), arrays flattened, in
 * property order: child nodes, references and plain values. What Langium's streamContents walks, without its
 * iterator objects: the validator and the channel memo walk every node of a design on every edit.
 */
import type { AstNode } from 'langium';

export function forEachPropertyValue(node: AstNode, visit: (value: unknown) => void): void {
  for (const property of Object.keys(node)) {
    if (property.startsWith('$')) continue;
    const value: unknown = (node as unknown as Record<string, unknown>)[property];
    if (Array.isArray(value)) {
      for (const item of value) visit(item);
    } else {
      visit(value);
    }
  }
}
