/**
 * Confirms a size before "size this section" offers it: the proposed edit is applied to the texts of the design
 * and of the files it takes linings and sections from, and the result is analysed as the server would, in a
 * private workspace of Runnel's core services (created on first use and reused). The size is offered only if the
 * reach then has no finding at any flow, so the water-surface profile, jumps and every other check of the analysis
 * are judged by the analysis itself. Runs one verification at a time.
 */
import { EmptyFileSystem, TextDocument, URI, type LangiumDocument } from 'langium';
import type { TextEdit } from 'vscode-languageserver';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import type { CriteriaDefaults } from '../../language/analysis/criteria-settings.js';
import type { Finding } from '../../language/analysis/model.js';
import { createRunnelServices } from '../../language/runnel-module.js';

export interface VerificationTarget {
  /** The design document's URI. */
  readonly uri: string;
  readonly channel: string;
  readonly reach: string;
  /** The criteria defaults from settings the server analyses the design with (the same checks must pass). */
  readonly criteriaDefaults: CriteriaDefaults;
}

export class SizingVerifier {
  private services: ReturnType<typeof createRunnelServices> | undefined;
  private queue: Promise<unknown> = Promise.resolve();

  /**
   * The findings of the target reach, over all flows, once `edits` are applied to `texts` (URI -> text); undefined
   * when the edited design no longer has that reach analysed (then the size cannot be offered either).
   */
  findingsAfter(texts: ReadonlyMap<string, string>, edits: Readonly<Record<string, readonly TextEdit[]>>, target: VerificationTarget): Promise<readonly Finding[] | undefined> {
    const run = this.queue.then(() => this.verify(texts, edits, target));
    this.queue = run.catch(() => undefined);
    return run;
  }

  private async verify(texts: ReadonlyMap<string, string>, edits: Readonly<Record<string, readonly TextEdit[]>>, target: VerificationTarget): Promise<readonly Finding[] | undefined> {
    this.services ??= createRunnelServices(EmptyFileSystem);
    const { shared } = this.services;
    const documents: LangiumDocument[] = [];
    try {
      for (const [uri, text] of texts) {
        const editsHere = edits[uri] ?? [];
        const edited = editsHere.length === 0 ? text : TextDocument.applyEdits(TextDocument.create(uri, 'runnel', 0, text), [...editsHere]);
        const document = shared.workspace.LangiumDocumentFactory.fromString(edited, URI.parse(uri));
        shared.workspace.LangiumDocuments.addDocument(document);
        documents.push(document);
      }
      await shared.workspace.DocumentBuilder.build(documents, { validation: false });
      const design = documents.find((document) => document.uri.toString() === URI.parse(target.uri).toString());
      if (design === undefined) return undefined;
      const reach = analyzeDocument(design, target.criteriaDefaults)
        .channels.find((channel) => channel.name === target.channel)
        ?.reaches.find((candidate) => candidate.name === target.reach);
      return reach?.flows.flatMap((flow) => flow.findings);
    } finally {
      for (const document of documents) {
        shared.workspace.LangiumDocuments.deleteDocument(document.uri);
        shared.workspace.IndexManager.remove(document.uri);
      }
    }
  }
}
