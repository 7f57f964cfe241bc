/**
 * Completion: Langium proposes keywords and the names a reference may take (sections, linings, flows, across the
 * workspace). Runnel adds units after a number, only those of the dimension the number measures (a slope offers
 * %, permille, m/m, ft/ft; a discharge cfs, m3/s, L/s, ...), the design's display system first; and `SI`/`US`
 * after `units`.
 */
import { AstUtils, GrammarAST, type AstNode, type MaybePromise } from 'langium';
import { DefaultCompletionProvider, type CompletionAcceptor, type CompletionContext, type NextFeature } from 'langium/lsp';
import { CompletionItemKind } from 'vscode-languageserver';
import { isRunnelFile } from '../../language/generated/ast.js';
import { displayUnitsOf } from '../../language/analysis/analyze-design.js';
import { isQuantityNode, QUANTITY_DIMENSIONS } from '../../language/analysis/quantities.js';
import { unitsOfDimension, type Dimension } from '../../language/units/units.js';

/** Grammar rule names whose `unit` is a quantity's unit, by the dimension they measure. */
const QUANTITY_RULES: Readonly<Record<string, Dimension>> = QUANTITY_DIMENSIONS;

export class RunnelCompletionProvider extends DefaultCompletionProvider {
  protected override completionFor(context: CompletionContext, next: NextFeature, acceptor: CompletionAcceptor): MaybePromise<void> {
    const dimension = this.expectedUnitDimension(context, next);
    if (dimension !== undefined) {
      this.completeUnits(context, dimension, acceptor);
      return;
    }
    if (this.isUnitsSystem(next)) {
      for (const [system, words] of [
        ['SI', 'metres, m3/s, m/s, pascals'],
        ['US', 'feet, cfs, ft/s, psf'],
      ] as const) {
        acceptor(context, { label: system, kind: CompletionItemKind.EnumMember, detail: `Show results in ${words}`, sortText: '0' });
      }
      return;
    }
    // Words like `outlet` or `top` may name a flow or reach (grammar rule Name); as names they are not proposals.
    if (GrammarAST.isKeyword(next.feature) && AstUtils.getContainerOfType(next.feature, GrammarAST.isParserRule)?.name === 'Name') return;
    return super.completionFor(context, next, acceptor);
  }

  /** The dimension of the quantity whose unit comes next, if the next feature is a unit. */
  private expectedUnitDimension(context: CompletionContext, next: NextFeature): Dimension | undefined {
    const rule = AstUtils.getContainerOfType(next.feature, GrammarAST.isParserRule);
    const calledRule = GrammarAST.isRuleCall(next.feature) ? next.feature.rule.ref?.name : undefined;
    const inUnitRule = rule?.name === 'Unit' || calledRule === 'Unit';
    if (!inUnitRule) return undefined;
    if (calledRule === 'Unit' && rule !== undefined && QUANTITY_RULES[rule.name] !== undefined) return QUANTITY_RULES[rule.name];
    const node: AstNode | undefined = context.node;
    const quantity = node === undefined ? undefined : AstUtils.getContainerOfType(node, isQuantityNode);
    return quantity === undefined ? undefined : QUANTITY_DIMENSIONS[quantity.$type];
  }

  private isUnitsSystem(next: NextFeature): boolean {
    const assignment = AstUtils.getContainerOfType(next.feature, GrammarAST.isAssignment);
    const rule = AstUtils.getContainerOfType(next.feature, GrammarAST.isParserRule);
    return assignment?.feature === 'system' && rule?.name === 'UnitsSetting';
  }

  private completeUnits(context: CompletionContext, dimension: Dimension, acceptor: CompletionAcceptor): void {
    const root = context.document.parseResult.value;
    const system = isRunnelFile(root) ? displayUnitsOf(root).system : 'SI';
    for (const unit of unitsOfDimension(dimension)) {
      const rank = unit.system === system || unit.system === 'both' ? '0' : '1';
      for (const spelling of unit.spellings) {
        acceptor(context, {
          label: spelling,
          kind: CompletionItemKind.Unit,
          detail: unit.name,
          sortText: `${rank}${spelling === unit.symbol ? '0' : '1'}${spelling}`,
        });
      }
    }
  }
}
