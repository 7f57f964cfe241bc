/**
 * Formatting. What the user sees: one definition or property per line, two-space indentation per block, single
 * spaces between words, `3:1` and `4:1, 3:1` side slopes and `ft/s` units written tight, at most one blank line
 * kept where the author left one, comments kept where they were (trailing or on their own line), blocks written on
 * one line (`flows { q10 = 16 cfs  q25 = 21 cfs }`) kept on one line with two spaces between items, and the
 * columns of a multi-line `flows { }` table aligned (name, `= discharge`, description).
 *
 * How it stays safe: only the whitespace between tokens changes, never a token, so the meaning cannot change; and
 * every choice depends only on the tokens and on facts the output preserves (which blocks are on one line, which
 * comments trail a line, where blank lines are), so formatting twice gives the same text as formatting once.
 * A document with syntax errors is not formatted.
 */
import { CstUtils, type AstNode, type LangiumDocument, type Lexer } from 'langium';
import type { Formatter, LangiumServices } from 'langium/lsp';
import type { DocumentFormattingParams, DocumentOnTypeFormattingOptions, DocumentRangeFormattingParams, Range, TextEdit } from 'vscode-languageserver';
import { isFlowTable, isRunnelFile, type Flow, type RunnelFile } from '../../language/generated/ast.js';

const INDENT = '  ';

/** AST list properties whose elements each start a line (or an item of a one-line block). */
const ITEM_LISTS: Readonly<Record<string, readonly string[]>> = {
  RunnelFile: ['header', 'members'],
  Criteria: ['items'],
  Lining: ['properties'],
  Section: ['properties'],
  FlowTable: ['flows'],
  FlowChanges: ['changes'],
  Channel: ['members'],
  Reach: ['properties'],
};

export class RunnelFormatter implements Formatter {
  private readonly lexer: Lexer;

  constructor(services: LangiumServices) {
    this.lexer = services.parser.Lexer;
  }

  formatDocument(document: LangiumDocument, _params: DocumentFormattingParams): TextEdit[] {
    return formattingEdits(document, this.lexer) ?? [];
  }

  formatDocumentRange(document: LangiumDocument, params: DocumentRangeFormattingParams): TextEdit[] {
    return (formattingEdits(document, this.lexer) ?? []).filter((edit) => within(edit.range, params.range));
  }

  formatDocumentOnType(): TextEdit[] {
    return [];
  }

  get formatOnTypeOptions(): DocumentOnTypeFormattingOptions | undefined {
    return undefined;
  }
}

interface Token {
  readonly text: string;
  readonly type: string;
  readonly start: number;
  readonly end: number;
}

/** The whitespace edits that format a document, or undefined when it must not be formatted (syntax errors). */
export function formattingEdits(document: LangiumDocument, lexer: Lexer): TextEdit[] | undefined {
  const text = document.textDocument.getText();
  const layout = formatLayout(document, lexer);
  if (layout === undefined) return undefined;
  const edits: TextEdit[] = [];
  let previousEnd = 0;
  layout.tokens.forEach((token, index) => {
    const wanted = layout.gaps[index] ?? '';
    if (text.slice(previousEnd, token.start) !== wanted) edits.push(replace(document, previousEnd, token.start, wanted));
    previousEnd = token.end;
  });
  if (layout.tokens.length > 0 && text.slice(previousEnd) !== layout.eol) edits.push(replace(document, previousEnd, text.length, layout.eol));
  return edits;
}

/** The formatted text (for tests and the CLI's future `format`); undefined when the document has syntax errors. */
export function formattedText(document: LangiumDocument, lexer: Lexer): string | undefined {
  const layout = formatLayout(document, lexer);
  if (layout === undefined) return undefined;
  if (layout.tokens.length === 0) return document.textDocument.getText();
  return layout.tokens.map((token, index) => (layout.gaps[index] ?? '') + token.text).join('') + layout.eol;
}

function replace(document: LangiumDocument, startOffset: number, endOffset: number, newText: string): TextEdit {
  return { range: { start: document.textDocument.positionAt(startOffset), end: document.textDocument.positionAt(endOffset) }, newText };
}

function within(inner: Range, outer: Range): boolean {
  const notBefore = (a: Range['start'], b: Range['start']): boolean => a.line > b.line || (a.line === b.line && a.character >= b.character);
  return notBefore(inner.start, outer.start) && notBefore(outer.end, inner.end);
}

interface Layout {
  readonly tokens: readonly Token[];
  /** gaps[i]: the whitespace before tokens[i]. */
  readonly gaps: readonly string[];
  readonly eol: string;
}

function formatLayout(document: LangiumDocument, lexer: Lexer): Layout | undefined {
  const parseResult = document.parseResult;
  const root = parseResult.value;
  if (parseResult.lexerErrors.length > 0 || parseResult.parserErrors.length > 0 || !isRunnelFile(root)) return undefined;
  const text = document.textDocument.getText();
  const lexed = lexer.tokenize(text);
  if (lexed.errors.length > 0) return undefined;
  const tokens: Token[] = [...lexed.tokens, ...(lexed.hidden ?? [])]
    .map((token) => ({ text: token.image, type: token.tokenType.name, start: token.startOffset, end: token.startOffset + token.image.length }))
    .sort((a, b) => a.start - b.start);
  // Only whitespace may lie between tokens; anything else means the lexer skipped text we do not understand.
  for (let index = 0, previousEnd = 0; index <= tokens.length; index++) {
    const start = tokens[index]?.start ?? text.length;
    if (!/^\s*$/.test(text.slice(previousEnd, start))) return undefined;
    previousEnd = tokens[index]?.end ?? previousEnd;
  }
  const eol = text.includes('\r\n') ? '\r\n' : '\n';
  const lineOf = lineCounter(text);
  const itemStarts = itemStartOffsets(root);
  const alignedGaps = flowTableAlignment(root, tokens, lineOf);

  // Blocks: a `{ }` pair written on one line stays on one line.
  const inlineBlockAt = new Map<number, boolean>();
  const openStack: number[] = [];
  tokens.forEach((token, index) => {
    if (token.type === '{') openStack.push(index);
    else if (token.type === '}') {
      const openIndex = openStack.pop();
      const open = openIndex === undefined ? undefined : tokens[openIndex];
      if (open === undefined || openIndex === undefined) return;
      const inline = lineOf(open.start) === lineOf(token.start);
      inlineBlockAt.set(openIndex, inline);
      inlineBlockAt.set(index, inline);
    }
  });
  if (openStack.length > 0) return undefined;

  const gaps: string[] = [];
  const blocks: boolean[] = []; // stack of open blocks: true when inline
  let depth = 0; // open multi-line blocks
  tokens.forEach((token, index) => {
    const previous = tokens[index - 1];
    if (previous === undefined) {
      gaps.push('');
    } else {
      const originalGap = text.slice(previous.end, token.start);
      const newlines = originalGap.split('\n').length - 1;
      const lineBreak = (indentDepth: number, keepBlank: boolean): string => (keepBlank && newlines >= 2 ? eol : '') + eol + INDENT.repeat(indentDepth);
      const insideInline = blocks.length > 0 && blocks[blocks.length - 1] === true;
      const isComment = token.type === 'SL_COMMENT' || token.type === 'ML_COMMENT';
      let gap: string;
      if (isComment) {
        gap = newlines === 0 ? ' ' : lineBreak(depth, previous.type !== '{');
      } else if (token.type === '}') {
        gap = inlineBlockAt.get(index) === true ? ' ' : lineBreak(depth - 1, false);
      } else if (itemStarts.has(token.start)) {
        if (insideInline) gap = previous.type === '{' ? ' ' : '  ';
        else gap = lineBreak(depth, previous.type !== '{');
      } else if (previous.type === 'SL_COMMENT') {
        gap = lineBreak(depth + 1, false);
      } else {
        gap = alignedGaps.get(index) ?? wordGap(previous, token);
      }
      gaps.push(gap);
    }
    if (token.type === '{') {
      const inline = inlineBlockAt.get(index) === true;
      blocks.push(inline);
      if (!inline) depth++;
    } else if (token.type === '}') {
      const inline = blocks.pop();
      if (inline === false) depth--;
    }
  });
  return { tokens, gaps, eol };
}

/** Space between two tokens on one line. */
function wordGap(previous: Token, token: Token): string {
  if (token.type === ',' || token.type === ':' || previous.type === ':') return '';
  if (token.type === '/' || previous.type === '/') return '';
  return ' ';
}

/** Offsets of the first token of every item of a block (and of every top-level definition). */
function itemStartOffsets(root: RunnelFile): Set<number> {
  const starts = new Set<number>();
  const visit = (node: AstNode): void => {
    const lists = ITEM_LISTS[node.$type] ?? [];
    const record = node as unknown as Record<string, unknown>;
    for (const property of lists) {
      const value = record[property];
      const items = Array.isArray(value) ? value : value === undefined ? [] : [value];
      for (const item of items) {
        const start = firstTokenOffset(item as AstNode);
        if (start !== undefined) starts.add(start);
      }
    }
    for (const child of childNodes(node)) visit(child);
  };
  visit(root);
  return starts;
}

function childNodes(node: AstNode): AstNode[] {
  const children: AstNode[] = [];
  for (const [key, value] of Object.entries(node)) {
    if (key.startsWith('$')) continue;
    const values: unknown[] = Array.isArray(value) ? value : [value];
    for (const candidate of values) if (isAstNodeLike(candidate)) children.push(candidate);
  }
  return children;
}

function isAstNodeLike(value: unknown): value is AstNode {
  return typeof value === 'object' && value !== null && typeof (value as { $type?: unknown }).$type === 'string' && '$container' in value;
}

function firstTokenOffset(node: AstNode): number | undefined {
  const cst = node.$cstNode;
  if (cst === undefined) return undefined;
  return CstUtils.flattenCst(cst).find((leaf) => !leaf.hidden)?.offset;
}

/**
 * Column alignment of multi-line flow tables: names padded to one width, `= discharge` to another, so the
 * discharges and descriptions line up. Tables with comments inside a flow are left unaligned.
 */
function flowTableAlignment(root: RunnelFile, tokens: readonly Token[], lineOf: (offset: number) => number): Map<number, string> {
  const gaps = new Map<number, string>();
  const indexByStart = new Map(tokens.map((token, index) => [token.start, index]));
  for (const table of (root.members ?? []).filter(isFlowTable)) {
    const cst = table.$cstNode;
    if (cst === undefined || lineOf(cst.offset) === lineOf(cst.end)) continue;
    const rows = (table.flows ?? []).map((flow) => flowRow(flow, tokens, indexByStart));
    if (rows.some((row) => row === undefined)) continue;
    const complete = rows as FlowRow[];
    if (complete.some((row) => row.hasComment || row.tokenCount === 0)) continue;
    // Names of flows followed by something are padded; a lone name needs no padding.
    const nameWidth = Math.max(0, ...complete.filter((row) => row.equalsIndex !== undefined || row.descriptionIndex !== undefined).map((row) => row.name.length));
    const dischargeWidth = Math.max(0, ...complete.filter((row) => row.equalsIndex !== undefined && row.descriptionIndex !== undefined).map((row) => row.dischargeText.length));
    for (const row of complete) {
      const namePad = ' '.repeat(Math.max(0, nameWidth - row.name.length));
      if (row.equalsIndex !== undefined) gaps.set(row.equalsIndex, ` ${namePad}`);
      if (row.descriptionIndex !== undefined) {
        if (row.equalsIndex !== undefined) gaps.set(row.descriptionIndex, ` ${' '.repeat(Math.max(0, dischargeWidth - row.dischargeText.length))}`);
        else gaps.set(row.descriptionIndex, ` ${namePad}${dischargeWidth > 0 ? ' '.repeat(dischargeWidth + 1) : ''}`);
      }
    }
  }
  return gaps;
}

interface FlowRow {
  readonly name: string;
  readonly equalsIndex: number | undefined;
  readonly descriptionIndex: number | undefined;
  /** `= 4.2 m3/s` as formatted. */
  readonly dischargeText: string;
  readonly hasComment: boolean;
  readonly tokenCount: number;
}

function flowRow(flow: Flow, tokens: readonly Token[], indexByStart: ReadonlyMap<number, number>): FlowRow | undefined {
  const cst = flow.$cstNode;
  if (cst === undefined) return undefined;
  const firstIndex = indexByStart.get(firstTokenOffset(flow) ?? -1);
  if (firstIndex === undefined) return undefined;
  const own: { token: Token; index: number }[] = [];
  for (let index = firstIndex; index < tokens.length; index++) {
    const token = tokens[index];
    if (token === undefined || token.start >= cst.end) break;
    own.push({ token, index });
  }
  const hasComment = own.some(({ token }) => token.type === 'SL_COMMENT' || token.type === 'ML_COMMENT');
  const equals = own.find(({ token }) => token.type === '=');
  const description = own.find(({ token }) => token.type === 'STRING');
  let dischargeText = '';
  if (equals !== undefined) {
    const dischargeTokens = own.filter(({ index }) => index >= equals.index && (description === undefined || index < description.index)).map(({ token }) => token);
    dischargeText = dischargeTokens.map((token, position) => (position === 0 ? '' : wordGap(dischargeTokens[position - 1] as Token, token)) + token.text).join('');
  }
  return {
    name: own[0]?.token.text ?? '',
    equalsIndex: equals?.index,
    descriptionIndex: description?.index,
    dischargeText,
    hasComment,
    tokenCount: own.length,
  };
}

/** Line number of an offset (binary search over line starts). */
function lineCounter(text: string): (offset: number) => number {
  const lineStarts = [0];
  for (let index = 0; index < text.length; index++) if (text.charCodeAt(index) === 10) lineStarts.push(index + 1);
  return (offset) => {
    let low = 0;
    let high = lineStarts.length - 1;
    while (low < high) {
      const middle = (low + high + 1) >> 1;
      if ((lineStarts[middle] ?? 0) <= offset) low = middle;
      else high = middle - 1;
    }
    return low;
  };
}
