/**
 * Code actions, looked up by the stable code a diagnostic carries in `data.code`:
 * - `unit-missing`: add a unit of the expected dimension (the design's display unit first, marked preferred);
 * - `unit-unknown` with a suggestion: change to the suggested unit;
 * - `unknown-reference`: change to the suggested name, or create the missing lining, section (one action per
 *   shape) or flow as a stub that validation then asks to complete (no invented numbers);
 * - on a reach ("size this section"): the smallest standard bottom width or nominal pipe diameter that passes
 *   every check for every flow. Sizes are searched with the analysis' uniform-flow rules (section-sizing.ts) and
 *   the one offered is confirmed by re-analysing the edited design, profile and all (sizing-verification.ts). A
 *   section other reaches or files also use is not changed under them: the reach gets its own copy. When no size
 *   passes, the action is shown disabled with why.
 */
import { AstUtils, CstUtils, GrammarUtils, type AstNode, type IndexManager, type LangiumDocument, type References } from 'langium';
import type { CodeActionProvider, LangiumServices } from 'langium/lsp';
import {
  CodeActionKind,
  type CodeAction,
  type CodeActionParams,
  type Command,
  type Diagnostic,
  type Position,
  type TextEdit,
  type WorkspaceEdit,
} from 'vscode-languageserver';
import {
  isBottomWidth,
  isChannel,
  isDiameter,
  isFlowTable,
  isLining,
  isReach,
  isRunnelFile,
  isSection,
  type Reach,
  type RunnelFile,
  type Section,
} from '../../language/generated/ast.js';
import { reachParts, SHAPE_PROPERTIES } from '../../language/analysis/design-inputs.js';
import { DIAGNOSTICS } from '../../language/validation/diagnostic-messages.js';
import type { DesignAnalysis, Finding, ReachResult } from '../../language/analysis/model.js';
import { findUnit, unitsOfDimension, DISPLAY_UNITS, type Dimension, type UnitSystem } from '../../language/units/units.js';
import { reachResultOf, type DocumentAnalyses } from './document-analysis.js';
import { checkShortName } from './result-text.js';
import { sizesPassingUniformChecks, sizingInputsOf, type SizingResult } from './section-sizing.js';
import { SizingVerifier } from './sizing-verification.js';

/** Diagnostic codes the actions answer, from validation's catalogue. */
const CODES = { unitMissing: DIAGNOSTICS.unitMissing.code, unitUnknown: DIAGNOSTICS.unitUnknown.code, unknownReference: DIAGNOSTICS.unknownReference.code } as const;

/** The shapes a section stub can take, from the one table of what each shape needs. */
const SECTION_SHAPES = Object.keys(SHAPE_PROPERTIES);

export class RunnelCodeActionProvider implements CodeActionProvider {
  private readonly references: References;
  private readonly indexManager: IndexManager;
  private readonly verifier = new SizingVerifier();
  private readonly sizings = new WeakMap<DesignAnalysis, Map<string, Promise<SizingOutcome>>>();
  private disabledSupport = false;

  constructor(
    services: LangiumServices,
    private readonly analyses: DocumentAnalyses,
  ) {
    this.references = services.references.References;
    this.indexManager = services.shared.workspace.IndexManager;
    services.shared.lsp.LanguageServer.onInitialize((params) => {
      this.disabledSupport = params.capabilities.textDocument?.codeAction?.disabledSupport === true;
    });
  }

  async getCodeActions(document: LangiumDocument, params: CodeActionParams): Promise<Array<CodeAction | Command>> {
    const root = document.parseResult.value;
    if (!isRunnelFile(root)) return [];
    const actions: CodeAction[] = [];
    const findingDiagnostics: Diagnostic[] = [];
    for (const diagnostic of params.context.diagnostics) {
      const code = diagnosticCode(diagnostic);
      if (code === CODES.unitMissing) actions.push(...addUnitActions(document, diagnostic, this.analyses.of(document).displayUnits));
      else if (code === CODES.unitUnknown) actions.push(...replaceWithSuggestion(document, diagnostic, 'unit'));
      else if (code === CODES.unknownReference) actions.push(...replaceWithSuggestion(document, diagnostic, 'name'), ...createStubActions(document, root, diagnostic));
      else if (dataOf(diagnostic)['source'] === 'analysis') findingDiagnostics.push(diagnostic);
    }
    const sizing = await this.sizingAction(document, params.range.start, findingDiagnostics);
    if (sizing !== undefined) actions.push(sizing);
    const only = params.context.only;
    return only === undefined || only.length === 0 ? actions : actions.filter((action) => only.some((kind) => action.kind === kind || (action.kind ?? '').startsWith(`${kind}.`)));
  }

  // ---------------------------------------------------------------------------------------------- sizing

  private async sizingAction(document: LangiumDocument, position: Position, findingDiagnostics: readonly Diagnostic[]): Promise<CodeAction | undefined> {
    const rootCst = document.parseResult.value.$cstNode;
    if (rootCst === undefined) return undefined;
    const leaf = CstUtils.findLeafNodeAtOffset(rootCst, document.textDocument.offsetAt(position));
    const reach = leaf === undefined ? undefined : AstUtils.getContainerOfType(leaf.astNode, isReach);
    if (reach === undefined) return undefined;
    const analysis = this.analyses.of(document);
    const result = reachResultOf(analysis, reach);
    const section = reachParts(reach).sectionUse?.section?.ref;
    if (result === undefined || section === undefined) return undefined;
    const system = writtenSystemOf(section) ?? analysis.displayUnits;
    const related = findingDiagnostics.filter((diagnostic) => dataOf(diagnostic)['reach'] === result.name && dataOf(diagnostic)['channel'] === result.channel);
    const kind = related.length > 0 ? CodeActionKind.QuickFix : CodeActionKind.RefactorRewrite;
    const title = `Size section '${section.name ?? ''}' for reach '${result.name}'`;
    const outcome = await this.cachedSizing(analysis, result, system, () => this.confirmedSize(document, reach, result, section, system));
    if (outcome.kind === 'none') return this.disabled(title, kind, `No standard size passes: ${outcome.reason}.`);
    if (outcome.kind === 'already') return this.disabled(title, kind, `The ${outcome.sizing.property} ${outcome.sizing.text} is already the smallest standard size that passes every check.`);
    return { title: `${outcome.edit.title} (smallest standard size passing every check)`, kind, edit: outcome.edit.edit, ...(related.length > 0 ? { diagnostics: related } : {}) };
  }

  /** Sizing is hundreds of engine solves and a re-analysis or two: once per analysis, reach and unit system. */
  private cachedSizing(analysis: DesignAnalysis, reach: ReachResult, system: UnitSystem, compute: () => Promise<SizingOutcome>): Promise<SizingOutcome> {
    let byReach = this.sizings.get(analysis);
    if (byReach === undefined) {
      byReach = new Map();
      this.sizings.set(analysis, byReach);
    }
    const key = `${reach.location.range.start.line}:${reach.location.range.start.character}:${system}`;
    let outcome = byReach.get(key);
    if (outcome === undefined) {
      outcome = compute();
      byReach.set(key, outcome);
      // A failure is not remembered: the next request tries again.
      outcome.catch(() => byReach?.delete(key));
    }
    return outcome;
  }

  /**
   * The smallest size the uniform-flow search proposes that the analysis of the edited design confirms: the
   * reach has no finding left at any flow. At most MAX_CONFIRMED_SIZES re-analyses, then why not.
   */
  private async confirmedSize(document: LangiumDocument, reach: Reach, result: ReachResult, section: Section, system: UnitSystem): Promise<SizingOutcome> {
    const candidates = sizesPassingUniformChecks(sizingInputsOf(result), system);
    let remaining: readonly Finding[] = [];
    let firstTried: string | undefined;
    let lastTried: string | undefined;
    for (let tried = 0; tried < MAX_CONFIRMED_SIZES; tried++) {
      const next = candidates.next();
      if (next.done === true) {
        if (firstTried === undefined) return { kind: 'none', reason: next.value.reason };
        break;
      }
      const sizing = next.value;
      firstTried ??= sizing.text;
      lastTried = sizing.text;
      const current = result.section.dimensions[sizing.dimensionKey];
      if (current !== undefined && Math.abs(current - sizing.valueM) <= 1e-9 * Math.max(current, 1e-9)) {
        const findings = result.flows.flatMap((flow) => flow.findings);
        if (findings.length === 0) return { kind: 'already', sizing };
        remaining = findings;
        continue;
      }
      const edit = this.sizingEdit(document, reach, section, sizing);
      if (edit === undefined) return { kind: 'none', reason: 'the section cannot be edited from here' };
      const findings = await this.verifier.findingsAfter(this.textsFor(document, section), edit.edit.changes ?? {}, {
        uri: document.uri.toString(),
        channel: result.channel,
        reach: result.name,
        criteriaDefaults: this.analyses.criteriaDefaultsFor(document.uri.toString()),
      });
      if (findings !== undefined && findings.length === 0) return { kind: 'sized', sizing, edit };
      remaining = findings ?? [];
    }
    const names = [...new Set(remaining.map((finding) => checkShortName(finding.code)))].join(', ');
    const range = firstTried === lastTried ? `at ${firstTried ?? ''}` : `from ${firstTried ?? ''} to ${lastTried ?? ''}`;
    return {
      kind: 'none',
      reason: `the sizes that pass the uniform-flow checks ${range} still fail the analysis of the whole channel (${names || 'the reach is no longer analysed'}): check the water-surface profile and the reaches around it`,
    };
  }

  /** The texts the analysis of this design reads: its own and those of the files its names resolve to. */
  private textsFor(document: LangiumDocument, section: Section): Map<string, string> {
    const texts = new Map<string, string>([[document.uri.toString(), document.textDocument.getText()]]);
    const add = (other: LangiumDocument): void => {
      const uri = other.uri.toString();
      if (!texts.has(uri)) texts.set(uri, other.textDocument.getText());
    };
    add(AstUtils.getDocument(section));
    for (const reference of document.references) {
      const targets = 'items' in reference ? reference.items.map((item) => item.ref) : [reference.ref];
      for (const target of targets) if (target !== undefined) add(AstUtils.getDocument(target));
    }
    return texts;
  }

  private disabled(title: string, kind: string, reason: string): CodeAction {
    // Without client support for disabled actions the reason goes into the title, and the action does nothing.
    return this.disabledSupport ? { title, kind, disabled: { reason } } : { title: `${title}: ${reason}`, kind };
  }

  private sizingEdit(document: LangiumDocument, reach: Reach, section: Section, sizing: Extract<SizingResult, { ok: true }>): { title: string; edit: WorkspaceEdit } | undefined {
    const properties = section.properties ?? [];
    const property = sizing.property === 'diameter' ? properties.find(isDiameter) : properties.find(isBottomWidth);
    const valueCst = property?.value?.$cstNode;
    const sectionCst = section.$cstNode;
    if (valueCst === undefined || sectionCst === undefined) return undefined;
    const sectionDocument = AstUtils.getDocument(section);
    const sameDocument = sectionDocument.uri.toString() === document.uri.toString();
    const users = this.references.findReferences(section, { includeDeclaration: false }).count();
    if (sameDocument && users <= 1) {
      return {
        title: `Set ${sizing.property} of section '${section.name ?? ''}' to ${sizing.text}`,
        edit: { changes: { [document.uri.toString()]: [{ range: valueCst.range, newText: sizing.text }] } },
      };
    }
    // Shared (or in a library): give this reach its own copy with the new size.
    const copyName = this.uniqueSectionName(document, `${section.name ?? 'section'}-${reach.name ?? 'reach'}`);
    const nameCst = GrammarUtils.findNodeForProperty(sectionCst, 'name');
    const sectionText = sectionDocument.textDocument.getText();
    if (nameCst === undefined) return undefined;
    const pieces = [
      sectionText.slice(sectionCst.offset, nameCst.offset),
      copyName,
      sectionText.slice(nameCst.end, valueCst.offset),
      sizing.text,
      sectionText.slice(valueCst.end, sectionCst.end),
    ];
    const copyText = pieces.join('');
    const referenceCst = reachParts(reach).sectionUse?.section?.$refNode;
    if (referenceCst === undefined) return undefined;
    const root = document.parseResult.value as RunnelFile;
    const insertion: TextEdit = sameDocument
      ? { range: { start: sectionCst.range.end, end: sectionCst.range.end }, newText: `\n\n${copyText}` }
      : insertTopLevel(document, root, copyText, (member) => isSection(member) || isLining(member));
    return {
      title: `Give reach '${reach.name ?? ''}' its own section '${copyName}' with ${sizing.property} ${sizing.text} ('${section.name ?? ''}' is ${sameDocument ? `used by ${users} reaches` : 'shared from another file'})`,
      edit: { changes: { [document.uri.toString()]: [insertion, { range: referenceCst.range, newText: copyName }] } },
    };
  }

  private uniqueSectionName(document: LangiumDocument, base: string): string {
    const taken = new Set(this.indexManager.allElements('Section').map((description) => description.name));
    const root = document.parseResult.value;
    if (isRunnelFile(root)) for (const member of root.members ?? []) if (isSection(member) && member.name) taken.add(member.name);
    if (!taken.has(base)) return base;
    for (let suffix = 2; ; suffix++) if (!taken.has(`${base}-${suffix}`)) return `${base}-${suffix}`;
  }
}

// ------------------------------------------------------------------------------------------------ helpers

/** Re-analyses of the edited design one sizing may make before it says why no size is offered. */
const MAX_CONFIRMED_SIZES = 6;

type ProposedSize = Extract<SizingResult, { ok: true }>;

type SizingOutcome =
  | { readonly kind: 'sized'; readonly sizing: ProposedSize; readonly edit: { readonly title: string; readonly edit: WorkspaceEdit } }
  | { readonly kind: 'already'; readonly sizing: ProposedSize }
  | { readonly kind: 'none'; readonly reason: string };

/** The unit system the sized dimension is written in, when its unit says. */
function writtenSystemOf(section: Section): UnitSystem | undefined {
  const property = (section.properties ?? []).find((candidate) => isBottomWidth(candidate) || isDiameter(candidate));
  const unit = property?.value?.unit === undefined ? undefined : findUnit(property.value.unit);
  return unit?.system === 'US' || unit?.system === 'SI' ? unit.system : undefined;
}

function dataOf(diagnostic: Diagnostic): Record<string, unknown> {
  const data: unknown = diagnostic.data;
  return typeof data === 'object' && data !== null ? (data as Record<string, unknown>) : {};
}

function diagnosticCode(diagnostic: Diagnostic): string | undefined {
  const code = dataOf(diagnostic)['code'] ?? diagnostic.code;
  return typeof code === 'string' ? code : undefined;
}

function isDimension(value: unknown): value is Dimension {
  return typeof value === 'string' && ['length', 'area', 'discharge', 'velocity', 'slope', 'shear'].includes(value);
}

/** `bottom width 4` -> `bottom width 4 ft`, one action per unit of the expected dimension. */
function addUnitActions(document: LangiumDocument, diagnostic: Diagnostic, system: UnitSystem): CodeAction[] {
  const dimension = dataOf(diagnostic)['expectedDimension'];
  if (!isDimension(dimension)) return [];
  const preferred = DISPLAY_UNITS[system][dimension];
  const units = [...unitsOfDimension(dimension)].sort((a, b) => rank(a) - rank(b));
  function rank(unit: { symbol: string; system: string }): number {
    if (unit.symbol === preferred) return 0;
    return unit.system === system || unit.system === 'both' ? 1 : 2;
  }
  return units.map((unit) => ({
    title: `Add unit '${unit.symbol}' (${unit.name})`,
    kind: CodeActionKind.QuickFix,
    diagnostics: [diagnostic],
    isPreferred: unit.symbol === preferred,
    edit: { changes: { [document.uri.toString()]: [{ range: { start: diagnostic.range.end, end: diagnostic.range.end }, newText: ` ${unit.symbol}` }] } },
  }));
}

/** "Did you mean 'ft'?" as an edit. */
function replaceWithSuggestion(document: LangiumDocument, diagnostic: Diagnostic, what: 'unit' | 'name'): CodeAction[] {
  const suggestion = dataOf(diagnostic)['suggestion'];
  if (typeof suggestion !== 'string' || suggestion === '') return [];
  return [
    {
      title: `Change ${what} to '${suggestion}'`,
      kind: CodeActionKind.QuickFix,
      diagnostics: [diagnostic],
      isPreferred: true,
      edit: { changes: { [document.uri.toString()]: [{ range: diagnostic.range, newText: suggestion }] } },
    },
  ];
}

/** Creates the lining, section or flow a reference names, as a stub for the user to complete. */
function createStubActions(document: LangiumDocument, root: RunnelFile, diagnostic: Diagnostic): CodeAction[] {
  const data = dataOf(diagnostic);
  const type = data['referenceType'];
  const name = data['refText'];
  if (typeof name !== 'string' || !/^[A-Za-z_][A-Za-z0-9_]*(?:-[A-Za-z0-9_]+)*$/.test(name)) return [];
  const action = (title: string, edit: TextEdit): CodeAction => ({ title, kind: CodeActionKind.QuickFix, diagnostics: [diagnostic], edit: { changes: { [document.uri.toString()]: [edit] } } });
  if (type === 'Lining') {
    return [action(`Create lining '${name}'`, insertTopLevel(document, root, `lining ${name} {\n}`, isLining))];
  }
  if (type === 'Section') {
    return SECTION_SHAPES.map((shape) => action(`Create ${shape} section '${name}'`, insertTopLevel(document, root, `section ${name} ${shape} {\n}`, isSection)));
  }
  if (type === 'Flow') return [action(`Create flow '${name}'`, insertFlow(document, root, name))];
  return [];
}

/**
 * Inserts a top-level definition after the last member of its kind, else before the first flow table or channel,
 * else at the end of the file.
 */
function insertTopLevel(document: LangiumDocument, root: RunnelFile, text: string, sameKind: (member: AstNode) => boolean): TextEdit {
  const members = root.members ?? [];
  const lastOfKind = [...members].reverse().find(sameKind)?.$cstNode;
  if (lastOfKind !== undefined) return { range: { start: lastOfKind.range.end, end: lastOfKind.range.end }, newText: `\n\n${text}` };
  const firstUser = members.find((member) => isFlowTable(member) || isChannel(member))?.$cstNode;
  if (firstUser !== undefined) {
    const start = { line: firstUser.range.start.line, character: 0 };
    return { range: { start, end: start }, newText: `${text}\n\n` };
  }
  const end = document.textDocument.positionAt(document.textDocument.getText().length);
  return { range: { start: end, end }, newText: `\n\n${text}\n` };
}

/** Adds a flow (no discharge: each channel gives its own) to the last flow table, or a new table. */
function insertFlow(document: LangiumDocument, root: RunnelFile, name: string): TextEdit {
  const table = [...(root.members ?? [])].reverse().find(isFlowTable);
  const closing = table === undefined ? undefined : GrammarUtils.findNodeForKeyword(table.$cstNode, '}');
  const opening = table === undefined ? undefined : GrammarUtils.findNodeForKeyword(table.$cstNode, '{');
  if (closing !== undefined && opening !== undefined) {
    if (closing.range.start.line === opening.range.start.line) return { range: { start: closing.range.start, end: closing.range.start }, newText: `${(table?.flows ?? []).length > 0 ? ' ' : ''}${name} ` };
    const start = { line: closing.range.start.line, character: 0 };
    return { range: { start, end: start }, newText: `  ${name}\n` };
  }
  return insertTopLevel(document, root, `flows {\n  ${name}\n}`, isFlowTable);
}
