/**
 * Unresolved names get a Runnel message with a "did you mean" (or the names that do exist) and the stable code
 * `unknown-reference`, in place of Langium's generic linking error. `data` carries the written name and the
 * suggestion, for a quick fix.
 */
import {
  Cancellation,
  DefaultDocumentValidator,
  interruptAndCheck,
  isAstNode,
  type AstNode,
  type ValidationAcceptor,
  type ValidationCategory,
  type ValidationCheck,
  type DocumentValidator,
  type LangiumCoreServices,
  type LangiumDocument,
  type ReferenceInfo,
  type ScopeProvider,
  type ValidationOptions,
} from 'langium';
import { forEachPropertyValue } from '../syntax/node-properties.js';
import { closestName } from './closest-name.js';
import { DIAGNOSTICS, KIND_WORDS } from './diagnostic-messages.js';

/** Langium's diagnostic type, named without importing the LSP types package into language/. */
type Diagnostic = Awaited<ReturnType<DocumentValidator['validateDocument']>>[number];

export class RunnelDocumentValidator extends DefaultDocumentValidator {
  private readonly scopeProvider: ScopeProvider;
  private readonly referenceTypeOf: (info: ReferenceInfo) => string;

  constructor(services: LangiumCoreServices) {
    super(services);
    this.scopeProvider = services.references.ScopeProvider;
    const reflection = services.shared.AstReflection;
    this.referenceTypeOf = (info) => reflection.getReferenceType(info);
  }

  /**
   * Langium's walk over every node, without its per-node streams: the same nodes in the same order, the same checks
   * (taken from the registry once per node type instead of once per node), the same cancellation points. A
   * 500-reach design has some 10,000 nodes and is validated after every edit; the streams cost more than the checks.
   * With a profiler attached, Langium's own walk runs (it times each node type).
   */
  protected override async validateAstNodes(rootNode: AstNode, options: ValidationOptions, acceptor: ValidationAcceptor, cancelToken: Cancellation.CancellationToken = Cancellation.CancellationToken.None): Promise<void> {
    if (this.profiler?.isActive('validating') === true) return super.validateAstNodes(rootNode, options, acceptor, cancelToken);
    const checksByType = new Map<string, readonly ValidationCheck[]>();
    const checksOf = (type: string): readonly ValidationCheck[] => {
      let checks = checksByType.get(type);
      if (checks === undefined) {
        checks = this.validationRegistry.getChecks(type, options.categories as ValidationCategory[] | undefined).toArray();
        checksByType.set(type, checks);
      }
      return checks;
    };
    const visit = async (node: AstNode): Promise<void> => {
      await interruptAndCheck(cancelToken);
      const nodeOptions = this.validateSingleNodeOptions(node, options);
      if (nodeOptions.validateNode) {
        for (const check of checksOf(node.$type)) await check(node, acceptor, cancelToken);
      }
      if (!nodeOptions.validateChildren) return;
      for (const child of childNodes(node)) await visit(child);
    };
    await visit(rootNode);
  }

  /** Syntax errors get their code (`lexing-error`, `parsing-error`) in `code` as well as in `data.code`, like every other diagnostic. */
  override async validateDocument(document: LangiumDocument, options?: ValidationOptions, cancelToken?: Cancellation.CancellationToken): Promise<Diagnostic[]> {
    const diagnostics = await super.validateDocument(document, options, cancelToken);
    for (const diagnostic of diagnostics) {
      const data: unknown = diagnostic.data;
      if (diagnostic.code === undefined && typeof data === 'object' && data !== null && 'code' in data && typeof data.code === 'string') diagnostic.code = data.code;
    }
    return diagnostics;
  }

  protected override processLinkingErrors(document: LangiumDocument, diagnostics: Diagnostic[], _options: ValidationOptions): void {
    for (const reference of document.references) {
      const linkingError = reference.error;
      if (!linkingError) continue;
      const info = linkingError.info;
      const written = info.reference.$refText;
      const type = this.referenceTypeOf(info);
      let known: string[] = [];
      try {
        known = this.scopeProvider
          .getScope(info)
          .getAllElements()
          .map((description) => description.name)
          .distinct()
          .toArray();
      } catch {
        known = []; // A broken scope must not hide the diagnostic itself.
      }
      const suggestion = closestName(written, known);
      const diagnostic = DIAGNOSTICS.unknownReference;
      diagnostics.push(
        this.toDiagnostic(diagnostic.severity, diagnostic.message({ kind: KIND_WORDS[type] ?? type.toLowerCase(), name: written, suggestion, known }), {
          node: info.container,
          range: reference.$refNode?.range,
          property: info.property,
          index: info.index,
          code: diagnostic.code,
          data: { code: diagnostic.code, referenceType: type, refText: written, ...(suggestion === undefined ? {} : { suggestion }) },
        }),
      );
    }
  }
}

/** The nodes a node contains directly, in property order (as Langium's streamContents yields them). */
function childNodes(node: AstNode): AstNode[] {
  const children: AstNode[] = [];
  forEachPropertyValue(node, (value) => {
    if (isAstNode(value)) children.push(value);
  });
  return children;
}
