/**
 * The Runnel language services: one factory used by the language server, the CLI and the tests.
 *
 * `createRunnelServices` builds Langium's core services (parser, linker, scopes, validation, workspace) with
 * Runnel's own parts plugged in. It has no LSP dependency: the server composes its LSP services from the same
 * `RunnelModule` (see the example in the doc comment of `RunnelModule`).
 */
import {
  createDefaultCoreModule,
  createDefaultSharedCoreModule,
  inject,
  type DefaultSharedCoreModuleContext,
  type LangiumCoreServices,
  type LangiumSharedCoreServices,
  type Module,
  type PartialLangiumCoreServices,
} from 'langium';
import { CriteriaDefaultsSource } from './analysis/criteria-settings.js';
import { RunnelGeneratedModule, RunnelGeneratedSharedModule } from './generated/module.js';
import { RunnelLexerErrorMessages, RunnelParserErrorMessages } from './parser/runnel-parser-messages.js';
import { RunnelValueConverter } from './parser/runnel-value-converter.js';
import { RunnelScopeComputation } from './references/runnel-scope-computation.js';
import { RunnelDocumentValidator } from './validation/runnel-document-validator.js';
import { RunnelValidationRegistry } from './validation/runnel-validation-registry.js';

/** Services Runnel adds to Langium's. */
export interface RunnelAddedServices {
  readonly analysis: {
    /**
     * The design-criteria defaults from settings that every analysis and validation of these services uses: set by
     * the language server from the editor's settings and by the command line from its options.
     */
    readonly CriteriaDefaults: CriteriaDefaultsSource;
  };
}

/** Everything a Runnel language instance offers. */
export type RunnelServices = LangiumCoreServices & RunnelAddedServices;

/**
 * Runnel's replacements of Langium's default services. Compose it after the default and generated modules:
 *
 * ```ts
 * // In the language server (server/), with LSP services:
 * const shared = inject(createDefaultSharedModule(context), RunnelGeneratedSharedModule);
 * const Runnel = inject(createDefaultModule({ shared }), RunnelGeneratedModule, RunnelModule, RunnelLspModule);
 * shared.ServiceRegistry.register(Runnel);
 * ```
 * Validation checks register themselves when the validation registry is created, so nothing else is needed.
 */
export const RunnelModule: Module<RunnelServices, PartialLangiumCoreServices & RunnelAddedServices> = {
  parser: {
    ValueConverter: () => new RunnelValueConverter(),
    ParserErrorMessageProvider: () => new RunnelParserErrorMessages(),
    LexerErrorMessageProvider: () => new RunnelLexerErrorMessages(),
  },
  references: {
    ScopeComputation: (services) => new RunnelScopeComputation(services),
  },
  analysis: {
    CriteriaDefaults: () => new CriteriaDefaultsSource(),
  },
  validation: {
    ValidationRegistry: (services) => new RunnelValidationRegistry(services),
    DocumentValidator: (services) => new RunnelDocumentValidator(services),
  },
};

/**
 * Creates the shared and Runnel-specific core services. `context.fileSystemProvider` is `EmptyFileSystem` (from
 * 'langium') for in-memory use and tests, or `NodeFileSystem` (from 'langium/node') for the CLI.
 */
export function createRunnelServices(context: DefaultSharedCoreModuleContext): {
  shared: LangiumSharedCoreServices;
  Runnel: RunnelServices;
} {
  const shared = inject(createDefaultSharedCoreModule(context), RunnelGeneratedSharedModule);
  const Runnel = inject(createDefaultCoreModule({ shared }), RunnelGeneratedModule, RunnelModule);
  shared.ServiceRegistry.register(Runnel);
  return { shared, Runnel };
}
