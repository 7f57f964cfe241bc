/**
 * The outline: channels with their reaches beneath, and the design's sections, linings and flows, each with its
 * description as detail (a reach also shows its check status). Symbol and completion kinds name what each thing is.
 */
import type { AstNode, AstNodeDescription, LangiumDocument, CstNode } from 'langium';
import { DefaultDocumentSymbolProvider, type LangiumServices, type NodeKindProvider } from 'langium/lsp';
import { CompletionItemKind, SymbolKind, type DocumentSymbol } from 'vscode-languageserver';
import { isReach, isRunnelFile } from '../../language/generated/ast.js';
import { reachResultOf, type DocumentAnalyses } from './document-analysis.js';
import { failedCheckNames, STATUS_MARKERS } from './result-text.js';

const SYMBOL_KINDS: Readonly<Record<string, SymbolKind>> = {
  Channel: SymbolKind.Module,
  Reach: SymbolKind.Class,
  Section: SymbolKind.Struct,
  Lining: SymbolKind.Property,
  Flow: SymbolKind.Event,
};

const COMPLETION_KINDS: Readonly<Record<string, CompletionItemKind>> = {
  Channel: CompletionItemKind.Module,
  Reach: CompletionItemKind.Class,
  Section: CompletionItemKind.Struct,
  Lining: CompletionItemKind.Property,
  Flow: CompletionItemKind.Event,
};

export class RunnelNodeKindProvider implements NodeKindProvider {
  getSymbolKind(node: AstNode | AstNodeDescription): SymbolKind {
    return SYMBOL_KINDS[typeOf(node)] ?? SymbolKind.Field;
  }

  getCompletionItemKind(node: AstNode | AstNodeDescription): CompletionItemKind {
    return COMPLETION_KINDS[typeOf(node)] ?? CompletionItemKind.Reference;
  }
}

function typeOf(node: AstNode | AstNodeDescription): string {
  return '$type' in node ? node.$type : node.type;
}

export class RunnelDocumentSymbolProvider extends DefaultDocumentSymbolProvider {
  constructor(
    services: LangiumServices,
    private readonly analyses: DocumentAnalyses,
  ) {
    super(services);
  }

  protected override createSymbol(document: LangiumDocument, astNode: AstNode, cstNode: CstNode, nameNode: CstNode, computedName?: string): DocumentSymbol {
    const symbol = super.createSymbol(document, astNode, cstNode, nameNode, computedName);
    const detail = this.detailOf(document, astNode);
    return detail === undefined ? symbol : { ...symbol, detail };
  }

  private detailOf(document: LangiumDocument, node: AstNode): string | undefined {
    const description = (node as { description?: unknown }).description;
    const text = typeof description === 'string' && description !== '' ? description : undefined;
    if (!isReach(node) || !isRunnelFile(document.parseResult.value)) return text;
    const result = reachResultOf(this.analyses.of(document), node);
    if (result === undefined || result.status === 'pass') return text;
    const status = `${STATUS_MARKERS[result.status]} ${failedCheckNames(result.flows.flatMap((flow) => flow.findings)).join(', ')}`;
    return text === undefined ? status : `${status} — ${text}`;
  }
}
