/**
 * Unresolved names get a Runnel message with a "did you mean" (or the names that do exist) and the stable code
 * `unknown-reference`, in place of Langium's generic linking error. `data` carries the written name and the
 * suggestion, for a quick fix.
 */
import {
  Cancellation,
  DefaultDocumentValidator,
  type DocumentValidator,
  type LangiumCoreServices,
  type LangiumDocument,
  type ReferenceInfo,
  type ScopeProvider,
  type ValidationOptions,
} from 'langium';
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
