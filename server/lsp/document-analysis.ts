/**
 * The one analysis of a document version, as every LSP feature reads it. `analyzeDocument` (language/analysis)
 * computes it once per version and per set of linings and sections the design uses; validation reads it for the
 * diagnostics, and hints, hover, code actions and the report read the same object through `DocumentAnalyses`.
 * That service also remembers the object per linked document, so a hover or hint request finds it in constant time
 * instead of re-checking every reach's links; it forgets it whenever the document is linked again (an edit, or a
 * change to a linings file it uses) and whenever the criteria defaults from settings change (criteria-settings.ts).
 * The lookups below (reach by position) are built once per analysis object.
 */
import { AstUtils, DocumentState, type AstNode, type LangiumDocument } from 'langium';
import type { LangiumSharedServices } from 'langium/lsp';
import { isReach, type Reach } from '../../language/generated/ast.js';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import { criteriaDefaultsKey, type CriteriaDefaults, type CriteriaDefaultsSource } from '../../language/analysis/criteria-settings.js';
import type { DesignAnalysis, FlowResult, ReachResult, SourcePosition } from '../../language/analysis/model.js';
import type { UnitSystem } from '../../language/units/units.js';
import type { RunnelEditorSettings } from './runnel-settings.js';

/** The analysis of the document's current version with the given criteria defaults (cached by the analysis itself). */
export function analysisOf(document: LangiumDocument, criteriaDefaults: CriteriaDefaults): DesignAnalysis {
  return analyzeDocument(document, criteriaDefaults);
}

/** The analyses of the server's documents, one per linked document version and criteria defaults. */
export class DocumentAnalyses {
  private readonly linked = new WeakMap<LangiumDocument, { readonly criteriaKey: string; readonly analysis: DesignAnalysis }>();

  constructor(
    shared: LangiumSharedServices,
    private readonly criteria: CriteriaDefaultsSource,
  ) {
    // Linking again means new text or new linings and sections: the remembered analysis is no longer the one.
    shared.workspace.DocumentBuilder.onDocumentPhase(DocumentState.Linked, (document) => {
      this.linked.delete(document);
    });
  }

  /** The criteria defaults from settings that the server's analyses of a document (by URI) use now. */
  criteriaDefaultsFor(documentUri: string): CriteriaDefaults {
    return this.criteria.forDocument(documentUri);
  }

  /** The analysis of the document as it stands (computed if needed, never twice for one linked version). */
  of(document: LangiumDocument): DesignAnalysis {
    const criteriaDefaults = this.criteria.forDocument(document.uri.toString());
    // Before linking (mid-edit, or relinking after a linings file changed) nothing is remembered.
    if (document.state < DocumentState.Linked) return analyzeDocument(document, criteriaDefaults);
    const criteriaKey = criteriaDefaultsKey(criteriaDefaults);
    const remembered = this.linked.get(document);
    if (remembered !== undefined && remembered.criteriaKey === criteriaKey) return remembered.analysis;
    const analysis = analyzeDocument(document, criteriaDefaults);
    this.linked.set(document, { criteriaKey, analysis });
    return analysis;
  }
}

/** The units results are shown in: the setting when it names a system, else the design's own. */
export function displaySystemFor(analysis: DesignAnalysis, settings: RunnelEditorSettings): UnitSystem {
  return settings.displayUnits === 'auto' ? analysis.displayUnits : settings.displayUnits;
}

interface AnalysisIndex {
  readonly reachByStart: ReadonlyMap<string, ReachResult>;
}

const indexes = new WeakMap<DesignAnalysis, AnalysisIndex>();

function positionKey(position: SourcePosition): string {
  return `${position.line}:${position.character}`;
}

function indexOf(analysis: DesignAnalysis): AnalysisIndex {
  let index = indexes.get(analysis);
  if (index === undefined) {
    const reachByStart = new Map<string, ReachResult>();
    for (const channel of analysis.channels) {
      for (const reach of channel.reaches) reachByStart.set(positionKey(reach.location.range.start), reach);
    }
    index = { reachByStart };
    indexes.set(analysis, index);
  }
  return index;
}

/** The results of a reach of the analysed document, or undefined when the analysis left it out (incomplete). */
export function reachResultOf(analysis: DesignAnalysis, reach: Reach): ReachResult | undefined {
  // ReachResult.location is the whole reach block, as reach.$cstNode.
  const start = reach.$cstNode?.range.start;
  return start === undefined ? undefined : indexOf(analysis).reachByStart.get(positionKey(start));
}

/** The reach a node lies in, if any. */
export function enclosingReach(node: AstNode | undefined): Reach | undefined {
  return node === undefined ? undefined : AstUtils.getContainerOfType(node, isReach);
}

/** Every reach of the analysis with its result for one flow, in document order. */
export function reachesWithFlow(analysis: DesignAnalysis, flowName: string): { reach: ReachResult; flow: FlowResult }[] {
  return analysis.channels.flatMap((channel) =>
    channel.reaches.flatMap((reach) => {
      const flow = reach.flows.find((candidate) => candidate.flow === flowName);
      return flow === undefined ? [] : [{ reach, flow }];
    }),
  );
}
