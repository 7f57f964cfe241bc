/**
 * Which names are visible where.
 *
 * - Linings and sections are exported to the workspace index: a design can use a lining defined in a shared
 *   library file, and go-to-definition crosses files. A definition in the same file wins over one elsewhere
 *   (local symbols shadow the global scope).
 * - Flows are defined inside a `flows { }` table, but reaches and channels refer to them by name: they are made
 *   visible to the whole document. They are not exported, since each design names its own storms.
 * - Channels and reaches are never referred to; they are not exported either, so two designs in one workspace can
 *   both have a channel called `main`.
 */
import { DefaultScopeComputation, type AstNode, type AstNodeDescription, type LangiumDocument, type MultiMap } from 'langium';
import { isFlow, isLining, isSection } from '../generated/ast.js';

export class RunnelScopeComputation extends DefaultScopeComputation {
  protected override addExportedSymbol(node: AstNode, exports: AstNodeDescription[], document: LangiumDocument): void {
    if (isLining(node) || isSection(node)) super.addExportedSymbol(node, exports, document);
  }

  protected override addLocalSymbol(node: AstNode, document: LangiumDocument, symbols: MultiMap<AstNode, AstNodeDescription>): void {
    if (isFlow(node)) {
      const root = document.parseResult.value;
      const name = this.nameProvider.getName(node);
      if (name) symbols.add(root, this.descriptions.createDescription(node, name, document));
      return;
    }
    super.addLocalSymbol(node, document, symbols);
  }
}
