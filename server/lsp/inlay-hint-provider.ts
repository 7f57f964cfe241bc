/**
 * Inlay hints: what the user sees at the end of each reach's first line is the compact result of every design flow
 * in that reach, e.g. `q10: yn 1.42 ft · yc 0.98 ft · 3.1 ft/s · Fr 0.52`, in the design's display units (or those
 * of the `runnel.displayUnits` setting), with a marker and the short names of the checks that did not pass. A flow
 * whose discharge the reach sets itself (`flows { q10 = 16 cfs }` inside the reach) gets its hint right after that
 * value instead. The tooltip lists the findings; the hover carries the full table. Which quantities show is the
 * `runnel.inlayHints.*` setting. Hints read the document version's one analysis.
 */
import { GrammarUtils, interruptAndCheck, isCompositeCstNode, type LangiumDocument } from 'langium';
import type { InlayHintProvider } from 'langium/lsp';
import { CancellationToken, type InlayHint, type InlayHintParams, type Position, type Range } from 'vscode-languageserver';
import { isChannel, isReach, isRunnelFile, type Reach } from '../../language/generated/ast.js';
import { reachParts } from '../../language/analysis/design-inputs.js';
import type { FlowResult, ReachResult } from '../../language/analysis/model.js';
import type { UnitSystem } from '../../language/units/units.js';
import { displaySystemFor, reachResultOf, type DocumentAnalyses } from './document-analysis.js';
import { sameLocation } from '../../language/analysis/source-locations.js';
import { findingsTooltip, flowHintText } from './result-text.js';
import type { HintQuantities, RunnelSettings } from './runnel-settings.js';

export class RunnelInlayHintProvider implements InlayHintProvider {
  constructor(
    private readonly settings: RunnelSettings,
    private readonly analyses: DocumentAnalyses,
  ) {}

  async getInlayHints(document: LangiumDocument, params: InlayHintParams, cancelToken = CancellationToken.None): Promise<InlayHint[]> {
    const settings = await this.settings.current(document.uri.toString());
    const show = settings.inlayHints;
    if (!show.normalDepth && !show.criticalDepth && !show.velocity && !show.froudeNumber && !show.maximumProfileDepth) return [];
    const root = document.parseResult.value;
    if (!isRunnelFile(root)) return [];
    await interruptAndCheck(cancelToken);
    const analysis = this.analyses.of(document);
    const system = displaySystemFor(analysis, settings);
    const hints: InlayHint[] = [];
    const choiceKey = `${document.uri.toString()}|${system}|${JSON.stringify(show)}`;
    for (const channel of (root.members ?? []).filter(isChannel)) {
      for (const reach of (channel.members ?? []).filter(isReach)) {
        const range = reach.$cstNode?.range;
        if (range === undefined || !overlaps(range, params.range)) continue;
        const result = reachResultOf(analysis, reach);
        if (result === undefined) continue;
        hints.push(...rememberedReachHints(document, reach, result, system, show, choiceKey));
      }
    }
    return hints;
  }
}

/**
 * The hints of a reach result, made once per result and display choice. A result is the same object only while
 * its reach has the same text at the same place (analysis/channel-memo.ts), so its hints, positions included,
 * are the same too: after an edit only the edited channel's hints are made again.
 */
const hintsByResult = new WeakMap<ReachResult, { readonly key: string; readonly hints: readonly InlayHint[] }>();

function rememberedReachHints(document: LangiumDocument, reach: Reach, result: ReachResult, system: UnitSystem, show: HintQuantities, key: string): readonly InlayHint[] {
  const remembered = hintsByResult.get(result);
  if (remembered !== undefined && remembered.key === key) return remembered.hints;
  const hints = reachHints(document, reach, result, system, show);
  hintsByResult.set(result, { key, hints });
  return hints;
}

/** The hints of one reach: design flows at the end of its first line, its own flows after their values. */
export function reachHints(document: LangiumDocument, reach: Reach, result: ReachResult, system: UnitSystem, show: HintQuantities): InlayHint[] {
  const flows = result.flows;
  const uri = document.uri.toString();
  const ownChanges = reachParts(reach).flowChanges.flatMap((block) => block.changes ?? []);
  const hints: InlayHint[] = [];
  const headerFlows: FlowResult[] = [];
  for (const flow of flows) {
    const change = ownChanges.find((candidate) => candidate.$cstNode !== undefined && sameLocation(flow.flowLocation, { uri, range: candidate.$cstNode.range }));
    if (change?.$cstNode === undefined) {
      headerFlows.push(flow);
      continue;
    }
    hints.push(hint(change.$cstNode.range.end, flowHintText(flow, system, show, false), flow));
  }
  const headerEnd = headerPosition(reach, result);
  if (headerEnd !== undefined) hints.unshift(...headerFlows.map((flow) => hint(headerEnd, flowHintText(flow, system, show, true), flow)));
  return hints;
}

function hint(position: Position, label: string, flow: FlowResult): InlayHint {
  return { position, label, paddingLeft: true, ...(flow.findings.length === 0 ? {} : { tooltip: findingsTooltip(flow.findings) }) };
}

/** After the reach's `{` when it is on the line of the name, else after the name (or description). */
function headerPosition(reach: Reach, result: ReachResult): Position | undefined {
  const name = result.nameLocation.range;
  const cst = reach.$cstNode;
  // The `{` is a direct child of the reach's node: a short scan instead of a search of the whole block.
  const brace = isCompositeCstNode(cst) ? cst.content.find((child) => child.text === '{' && !isCompositeCstNode(child)) : undefined;
  if (brace !== undefined && brace.range.start.line === name.start.line) return brace.range.end;
  const description = GrammarUtils.findNodeForProperty(cst, 'description');
  return description !== undefined && description.range.start.line === name.start.line ? description.range.end : name.end;
}

function overlaps(range: Range, window: Range): boolean {
  const before = (a: Position, b: Position): boolean => a.line < b.line || (a.line === b.line && a.character < b.character);
  return !before(range.end, window.start) && !before(window.end, range.start);
}
