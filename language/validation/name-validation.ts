/**
 * Names: unique where they are defined, and unambiguous where a design uses a lining or section defined in more
 * than one file of the workspace.
 */
import { AstUtils, type AstNode, type LangiumCoreServices, type ValidationAcceptor, type ValidationChecks } from 'langium';
import { isChannel, isFlowTable, isLining, isReach, isSection, type Channel, type LiningUse, type RunnelAstType, type RunnelFile, type SectionUse } from '../generated/ast.js';
import { DIAGNOSTICS, KIND_WORDS, report } from './diagnostic-messages.js';

interface NamedNode extends AstNode {
  readonly name?: string;
}

/** Two linings (or sections, flows, channels) of one file with the same name: the later one is reported. */
export function namesMustBeUniqueInFile(file: RunnelFile, accept: ValidationAcceptor): void {
  const members = file.members ?? [];
  reportDuplicates(members.filter(isLining), 'file', accept);
  reportDuplicates(members.filter(isSection), 'file', accept);
  reportDuplicates(members.filter(isFlowTable).flatMap((table) => table.flows ?? []), 'file', accept);
  reportDuplicates(members.filter(isChannel), 'file', accept);
}

/** Two reaches of one channel with the same name. */
export function reachNamesMustBeUniqueInChannel(channel: Channel, accept: ValidationAcceptor): void {
  reportDuplicates((channel.members ?? []).filter(isReach), 'channel', accept);
}

function reportDuplicates(nodes: readonly NamedNode[], scope: 'file' | 'channel', accept: ValidationAcceptor): void {
  const firstByName = new Map<string, NamedNode>();
  for (const node of nodes) {
    const name = node.name;
    if (!name) continue;
    const first = firstByName.get(name);
    if (first === undefined) {
      firstByName.set(name, node);
      continue;
    }
    const line = (first.$cstNode?.range.start.line ?? 0) + 1;
    report(accept, DIAGNOSTICS.duplicateName, { kind: KIND_WORDS[node.$type] ?? 'item', scope, name, line }, { node, property: 'name' }, { name });
  }
}

/** Checks that need the workspace index. */
export function createNameReferenceChecks(services: LangiumCoreServices): ValidationChecks<RunnelAstType> {
  const indexManager = services.shared.workspace.IndexManager;

  /**
   * A design uses lining 'turf' and two library files define one: the reference resolves to the first indexed,
   * which may not be the one meant. A definition in the design's own file always wins and is not reported.
   */
  const referenceShouldBeUnambiguous = (use: LiningUse | SectionUse, accept: ValidationAcceptor, property: 'lining' | 'section', type: 'Lining' | 'Section'): void => {
    const reference = property === 'lining' ? (use as LiningUse).lining : (use as SectionUse).section;
    const target = reference?.ref;
    if (target === undefined || reference === undefined) return;
    const ownDocument = AstUtils.getDocument(use);
    const targetDocument = AstUtils.getDocument(target);
    if (targetDocument.uri.toString() === ownDocument.uri.toString()) return;
    const files = indexManager
      .allElements(type)
      .filter((description) => description.name === reference.$refText)
      .map((description) => description.documentUri.toString())
      .distinct()
      .toArray();
    if (files.length < 2) return;
    const shortName = (uri: string): string => decodeURIComponent(uri.split('/').pop() ?? uri);
    report(
      accept,
      DIAGNOSTICS.ambiguousReference,
      { kind: KIND_WORDS[type] ?? type, name: reference.$refText, files: files.map(shortName), used: shortName(targetDocument.uri.toString()) },
      { node: use, property },
    );
  };

  return {
    LiningUse: (use, accept) => referenceShouldBeUnambiguous(use, accept, 'lining', 'Lining'),
    SectionUse: (use, accept) => referenceShouldBeUnambiguous(use, accept, 'section', 'Section'),
  };
}

export const nameChecks: ValidationChecks<RunnelAstType> = {
  RunnelFile: namesMustBeUniqueInFile,
  Channel: reachNamesMustBeUniqueInChannel,
};
