/**
 * Channel results carried from one analysis of a document to the next. An edit usually touches one channel: the
 * others have the same text at the same place, link to the same sections, linings and flows, and sit under the same
 * flow tables, criteria and display units, so their results are the same objects as before. Each channel's result
 * is remembered under a key made of everything it is computed from:
 * - the design context: the display units, the criteria defaults from settings, and the text and position of every
 *   flow table and design criteria block (flows apply at the head of every channel; a finding points at the flow
 *   that sets its discharge);
 * - the channel's own text and the position of its first token: together they fix every range inside it;
 * - every node a reference inside the channel resolves to (sections, linings, flows, possibly in another file):
 *   its document, position and text, or "unresolved".
 * Equal keys mean equal inputs, so a remembered result is the result the computation would give; the incremental
 * analysis is checked against a fresh one after random edits (test/analysis/incremental-analysis.test.ts).
 * Results are never modified, so sharing them between analyses is safe; only the last analysis' channels are kept.
 *
 * Inside a channel the edit changed, most reaches are unchanged too: each reach is remembered under its own key (its
 * text and place, the nodes it refers to, its channel's name and the design context). An unchanged reach keeps its
 * resolved inputs, and keeps its result at a flow when the discharge of that flow in it and its share of the
 * channel's profile at that flow (the water surface along it, the jump and profile findings drafted for it) are
 * equal value for value to those the result was computed with: an edit in subcritical flow changes the water
 * surface only upstream to a control, in supercritical flow only downstream to a jump, and the engine takes over
 * the other reaches' marches (hydraulics/profile/reach-reuse.ts).
 */
import { DocumentState, isAstNode, isMultiReference, isReference, type AstNode, type LangiumDocument, type MultiReference, type Reference } from 'langium';
import { isChannel, isFlowTable, isReach, type Channel, type Reach, type RunnelFile } from '../generated/ast.js';
import { designCriteriaBlocks } from './design-inputs.js';
import type { ChannelResult, Finding, FlowResult, IncompleteReach, ReachResult } from './model.js';
import type { ReachDischarge, ReachProfileShare, ReachResolution } from './reach-inputs.js';
import { documentUriOf } from './source-locations.js';
import { forEachPropertyValue } from '../syntax/node-properties.js';

/** A channel's result and the reaches of it the analysis left out. */
export interface RememberedChannel {
  readonly result: ChannelResult;
  readonly incompleteReaches: readonly IncompleteReach[];
  /** Every finding of the channel, in document order. */
  readonly findings: readonly Finding[];
  /** The channel's reaches by reach key, carried to the next analysis with the channel. */
  readonly reaches: readonly (readonly [string, RememberedReach])[];
}

/** One flow's result in a reach and what it was computed from besides the reach's own inputs. */
export interface RememberedFlow {
  readonly discharge: ReachDischarge;
  readonly share: ReachProfileShare;
  readonly result: FlowResult;
}

/** A reach resolved, with its results (null for a reach that cannot be analysed). */
export interface RememberedReach {
  readonly resolution: ReachResolution;
  /** In the order of the reach's discharges. */
  readonly flows: readonly RememberedFlow[];
  readonly result: ReachResult | null;
}

export interface ChannelMemo {
  /** The channels of the document's previous analysis; undefined for its first. */
  readonly previous: ReadonlyMap<string, RememberedChannel> | undefined;
  /** The channels of this analysis, filled as they are computed or taken over. */
  readonly next: Map<string, RememberedChannel>;
  /** Keys of nodes that references resolve to, computed once per analysis. */
  readonly targetKeys: Map<AstNode, string>;
  /** The reaches of the previous analysis and of this one, by reach key (reachKey). */
  readonly reaches: { readonly previous: ReadonlyMap<string, RememberedReach> | undefined; readonly next: Map<string, RememberedReach> };
}

interface KeptChannels {
  readonly channels: ReadonlyMap<string, RememberedChannel>;
  readonly reaches: ReadonlyMap<string, RememberedReach>;
}

let memosByDocument = new WeakMap<object, KeptChannels>();
let unrememberedCount = 0;

/** Opens the memo of an analysis of `document` (any object standing for it); `keepChannelMemo` closes it. */
export function openChannelMemo(document: object): ChannelMemo {
  const kept = memosByDocument.get(document);
  return { previous: kept?.channels, next: new Map(), targetKeys: new Map(), reaches: { previous: kept?.reaches, next: new Map() } };
}

/** Keeps this analysis' channels for the document's next analysis. */
export function keepChannelMemo(document: object, memo: ChannelMemo): void {
  memosByDocument.set(document, { channels: memo.next, reaches: memo.reaches.next });
}

/** Forgets every remembered channel (benchmarks and tests use it to time or check a fresh computation). */
export function forgetChannelMemos(): void {
  memosByDocument = new WeakMap();
}

/**
 * The part of every channel's key that the design as a whole contributes (see the module comment); `criteriaKey` is
 * the canonical text of the criteria defaults from settings (criteria-settings.ts).
 */
export function designContextKey(file: RunnelFile, displayUnits: string, criteriaKey: string): string {
  const parts = [displayUnits, criteriaKey];
  for (const member of file.members ?? []) {
    if (isFlowTable(member)) parts.push(placedText(member));
  }
  for (const block of designCriteriaBlocks(file)) parts.push(placedText(block));
  return parts.join('\u0000');
}

/**
 * The references inside each channel and inside each reach, in document order, from the linked document's list of
 * references (a walk of the channels' trees costs more: it lists every node's properties); undefined when the list
 * cannot say (the document is not linked, or a reference has no syntax node), and the keys then walk the channel.
 */
export function referencesByChannel(document: LangiumDocument): Map<AstNode, (Reference | MultiReference)[]> | undefined {
  if (document.state < DocumentState.Linked) return undefined;
  const byContainer = new Map<AstNode, (Reference | MultiReference)[]>();
  const add = (container: AstNode, reference: Reference | MultiReference): void => {
    const list = byContainer.get(container);
    if (list === undefined) byContainer.set(container, [reference]);
    else list.push(reference);
  };
  for (const reference of document.references) {
    let node: AstNode | undefined = reference.$refNode?.astNode;
    if (node === undefined) return undefined;
    while (node !== undefined && !isChannel(node)) {
      if (isReach(node)) add(node, reference);
      node = node.$container;
    }
    if (node !== undefined) add(node, reference);
  }
  return byContainer;
}

/**
 * The key of a channel in a design context (see the module comment); `references` are the channel's references from
 * referencesByChannel, when it could list them.
 */
export function channelKey(channel: Channel, contextKey: string, memo: ChannelMemo, references?: readonly (Reference | MultiReference)[]): string {
  return keyOf([contextKey, placedText(channel)], memo, references ?? channel);
}

/**
 * The key of a reach: the design context, its channel's name, its own text and the position of its first token, and
 * the nodes its references resolve to (`references` from referencesByChannel). What else its results read, the
 * discharges of the flows in it (set above it in the channel) and its share of the channel's profiles, is compared
 * value for value with the remembered reach's (analyze-design.ts).
 */
export function reachKey(reach: Reach, contextKey: string, channelName: string, memo: ChannelMemo, references: readonly (Reference | MultiReference)[]): string {
  return keyOf([contextKey, channelName, placedText(reach)], memo, references);
}

/** `parts` then the key of each reference's target, joined: the references listed, or those found in a node's tree. */
function keyOf(parts: string[], memo: ChannelMemo, references: readonly (Reference | MultiReference)[] | AstNode): string {
  const visit = (reference: Reference | MultiReference): void => {
    if (!isReference(reference)) {
      // Runnel's grammar has single references only; should another kind appear, the channel is never reused.
      parts.push(`not-remembered-${unrememberedCount++}`);
      return;
    }
    const target = reference.ref;
    if (target === undefined) {
      parts.push('unresolved');
      return;
    }
    let key = memo.targetKeys.get(target);
    if (key === undefined) {
      key = `${documentUriOf(target)}\u0001${placedText(target)}`;
      memo.targetKeys.set(target, key);
    }
    parts.push(key);
  };
  if (isAstNode(references)) visitReferences(references, visit);
  else for (const reference of references) visit(reference);
  return parts.join('\u0000');
}

/** Every reference in a node and the nodes it contains, in document order. */
function visitReferences(node: AstNode, visit: (reference: Reference | MultiReference) => void): void {
  forEachPropertyValue(node, (value) => {
    if (isReference(value) || isMultiReference(value)) visit(value);
    else if (isAstNode(value)) visitReferences(value, visit);
  });
}

/** A node's first-token position and text: equal for two nodes means equal content at the same place. */
function placedText(node: AstNode): string {
  const cst = node.$cstNode;
  if (cst === undefined) return 'no-text';
  const start = cst.range.start;
  return `${start.line}:${start.character}\u0001${cst.text}`;
}
