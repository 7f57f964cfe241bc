/**
 * The robustness harness: one in-process workspace, composed as the language server composes it, through which
 * every fuzzed or generated document goes: parse, link, validate, analyse, report (HTML and Markdown), and, when
 * the server's providers import, inlay hints, hover and formatting. `check` runs all of them on one text and
 * returns what went wrong as plain sentences (an empty list when the text passed), so a property prints them with
 * the text and fast-check's seed.
 *
 * What "went wrong" means (issue 8): an exception anywhere (the providers are called unwrapped, not through the
 * server's error containment, so a fault shows instead of becoming an empty answer); a validation fault that
 * Langium turned into a logged error or an "An error occurred" diagnostic; a diagnostic, related location, hint,
 * hover range or formatting edit outside the document; NaN, Infinity or `undefined` in any text a user reads
 * (diagnostic messages, hint labels and tooltips, hover text, report text); a number in the analysis model that
 * is not finite (the model promises null, never NaN); the whole pipeline slower than a bound; formatting that is
 * not idempotent or changes the analysis.
 */
import { EmptyFileSystem, URI, type LangiumDocument } from 'langium';
import { TextDocument } from 'vscode-languageserver-textdocument';
import type { Diagnostic, Hover, InlayHint, Position, Range, TextEdit } from 'vscode-languageserver';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import type { DesignAnalysis } from '../../language/analysis/model.js';
import { renderReportHtml } from '../../language/report/report-html.js';
import { renderReportMarkdown } from '../../language/report/report-markdown.js';
import { createRunnelServices } from '../../language/runnel-module.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';

/** Generous for a loaded 2-core machine: a sample builds, analyses and reports in tens of milliseconds. */
export const PIPELINE_BOUND_MS = 4_000;

/** Words that must never reach a reader unless the author wrote them. */
const NON_NUMBERS = ['NaN', 'Infinity', 'undefined', '[object Object]'] as const;

export interface CheckOptions {
  /** Also format the document and check idempotence and meaning (default true). */
  readonly format?: boolean;
  /** Hover positions to try (default: up to 40 spread over the tokens of the text). */
  readonly hoverPositions?: number;
}

export interface CheckOutcome {
  readonly problems: string[];
  readonly document: LangiumDocument;
  readonly analysis: DesignAnalysis;
  readonly diagnostics: readonly Diagnostic[];
  /** The formatted text, when the document was formatted (no syntax errors). */
  readonly formatted: string | undefined;
  readonly elapsedMs: number;
}

interface EditorFeatures {
  hints(document: LangiumDocument): Promise<InlayHint[]>;
  hover(document: LangiumDocument, position: Position): Promise<Hover | undefined>;
  format(document: LangiumDocument): Promise<TextEdit[] | undefined>;
}

interface Workspace {
  set(name: string, text: string): Promise<LangiumDocument>;
  readonly editor: EditorFeatures | undefined;
}

/** Faults the server's error containment caught and logged since the last check. */
const containedFaults: string[] = [];

/** Which pipeline ran: the full one with the server's providers, or the language core alone. */
export let editorFeaturesNote = '';

export class DocumentHarness {
  private constructor(
    private readonly workspace: Workspace,
    private readonly originals: Readonly<Record<string, string>>,
  ) {}

  /** A workspace holding `files` (e.g. every sample), each built once. */
  static async create(files: Readonly<Record<string, string>>): Promise<DocumentHarness> {
    const workspace = await createWorkspace();
    for (const [name, text] of Object.entries(files)) await workspace.set(name, text);
    return new DocumentHarness(workspace, files);
  }

  get hasEditorFeatures(): boolean {
    return this.workspace.editor !== undefined;
  }

  /** Puts a file back as it was when the harness was created (after a case replaced it). */
  async restore(name: string): Promise<void> {
    const original = this.originals[name];
    if (original !== undefined) await this.workspace.set(name, original);
  }

  /** Replaces (or adds) a file without checking it (a library a checked design uses). */
  async put(name: string, text: string): Promise<void> {
    await this.workspace.set(name, text);
  }

  /** Replaces (or adds) `name` with `text` and runs every check on it; see the module comment. */
  async check(name: string, text: string, options: CheckOptions = {}): Promise<CheckOutcome> {
    const problems: string[] = [];
    const loggedErrors: string[] = [];
    containedFaults.length = 0;
    const originalConsoleError = console.error;
    console.error = (...parts: unknown[]) => loggedErrors.push(parts.map(describe).join(' '));
    const started = performance.now();
    let document: LangiumDocument | undefined;
    let analysis: DesignAnalysis | undefined;
    let formatted: string | undefined;
    let diagnostics: readonly Diagnostic[] = [];
    const allowedWords = NON_NUMBERS.filter((word) => text.includes(word));
    const readable = (what: string, shown: string): void => {
      for (const word of NON_NUMBERS) {
        if (allowedWords.includes(word) || !shown.includes(word)) continue;
        const at = shown.indexOf(word);
        problems.push(`${what} shows '${word}': …${shown.slice(Math.max(0, at - 120), at + 40)}…`);
      }
    };
    try {
      document = await this.workspace.set(name, text);
      const lines = TextDocument.create('inmemory://check', 'runnel', 0, text);
      const inside = (what: string, range: Range | undefined): void => {
        if (range === undefined) return;
        const problem = rangeProblem(lines, range);
        if (problem !== undefined) problems.push(`${what}: ${problem} (${JSON.stringify(range)})`);
      };
      const uri = document.uri.toString();

      diagnostics = [...(document.diagnostics ?? [])];
      for (const diagnostic of diagnostics) {
        const message = typeof diagnostic.message === 'string' ? diagnostic.message : String(diagnostic.message);
        inside(`diagnostic '${message}'`, diagnostic.range);
        readable(`diagnostic ${String(diagnostic.code ?? '')}`, message);
        if (/An error occurred/i.test(message)) problems.push(`internal error diagnostic: ${message}`);
        for (const related of diagnostic.relatedInformation ?? []) {
          readable('related information', related.message);
          if (related.location.uri === uri) inside(`related location of '${message}'`, related.location.range);
        }
      }

      analysis = analyzeDocument(document, NO_CRITERIA_DEFAULTS);
      for (const path of nonFiniteNumbers(analysis)) problems.push(`analysis holds a non-finite number at ${path}`);
      for (const finding of analysis.findings) {
        readable(`finding ${finding.code}`, finding.message);
        if (finding.location.uri === uri) inside(`finding ${finding.code}`, finding.location.range);
      }
      for (const channel of analysis.channels) {
        for (const reach of channel.reaches) {
          for (const flow of reach.flows) {
            if (flow.normal === null && !(typeof flow.normalDepthNote === 'string' && flow.normalDepthNote.length > 0)) {
              problems.push(`reach ${reach.name}, flow ${flow.flow}: no normal depth and no reason given`);
            }
            if (flow.normalDepthNote !== null) readable('normal-depth note', flow.normalDepthNote);
          }
        }
      }

      const html = renderReportHtml(analysis, { generatedAt: new Date('2025-01-02T03:04:05Z'), fileName: name });
      // Data attributes carry raw values for scripts and tests, not for readers; everything else is read or drawn.
      readable('HTML report', html.replace(/<style[\s\S]*?<\/style>/g, '').replace(/\sdata-[\w-]+="[^"]*"/g, ''));
      readable('Markdown report', renderReportMarkdown(analysis, { fileName: name }));

      const editor = this.workspace.editor;
      if (editor !== undefined) {
        for (const hint of await editor.hints(document)) {
          inside('inlay hint', { start: hint.position, end: hint.position });
          readable('inlay hint', typeof hint.label === 'string' ? hint.label : hint.label.map((part) => part.value).join(''));
          if (hint.tooltip !== undefined) readable('inlay hint tooltip', typeof hint.tooltip === 'string' ? hint.tooltip : hint.tooltip.value);
        }
        for (const position of hoverPositions(text, lines, options.hoverPositions ?? 40)) {
          const hover = await editor.hover(document, position);
          if (hover === undefined) continue;
          inside(`hover at ${position.line}:${position.character}`, hover.range);
          const contents = hover.contents;
          readable(`hover at ${position.line}:${position.character}`, typeof contents === 'string' ? contents : 'value' in contents ? contents.value : JSON.stringify(contents));
        }
        if (options.format !== false) {
          const edits = await editor.format(document);
          if (edits !== undefined && edits.length > 0) {
            for (const edit of edits) inside('formatting edit', edit.range);
            formatted = TextDocument.applyEdits(lines, edits);
            problems.push(...(await this.checkFormatted(name, text, formatted, analysis, diagnostics)));
          } else if (edits !== undefined) {
            formatted = text;
          }
        }
      }
    } catch (error) {
      problems.push(`threw: ${describe(error)}`);
    } finally {
      console.error = originalConsoleError;
    }
    for (const logged of loggedErrors) problems.push(`logged an error: ${logged.slice(0, 600)}`);
    for (const fault of containedFaults.splice(0)) problems.push(`a provider failed (the server would answer empty): ${fault.slice(0, 800)}`);
    const elapsedMs = performance.now() - started;
    if (elapsedMs > PIPELINE_BOUND_MS) problems.push(`took ${elapsedMs.toFixed(0)} ms (bound ${PIPELINE_BOUND_MS} ms); largest number written: ${largestNumberWritten(text)}`);
    if (document === undefined || analysis === undefined) {
      // Fill the outcome with something inspectable; problems already says what failed.
      const fallback = await this.workspace.set(name, '');
      return { problems, document: fallback, analysis: analyzeDocument(fallback, NO_CRITERIA_DEFAULTS), diagnostics: [], formatted, elapsedMs };
    }
    return { problems, document, analysis, diagnostics, formatted, elapsedMs };
  }

  /** Formatting twice gives the same text; the formatted document means the same (analysis and diagnostics). */
  private async checkFormatted(name: string, original: string, formatted: string, before: DesignAnalysis, beforeDiagnostics: readonly Diagnostic[]): Promise<string[]> {
    const problems: string[] = [];
    const beforeMeaning = JSON.stringify(meaningOf(before));
    const beforeCodes = diagnosticCodes(beforeDiagnostics);
    const reformatted = await this.workspace.set(name, formatted);
    const editor = this.workspace.editor;
    const again = await editor?.format(reformatted);
    if (again === undefined) problems.push('formatting produced a text with syntax errors');
    else if (again.length > 0) {
      const twice = TextDocument.applyEdits(TextDocument.create('inmemory://twice', 'runnel', 0, formatted), again);
      if (twice !== formatted) problems.push(`formatting is not idempotent:\n--- once\n${formatted}\n--- twice\n${twice}`);
    }
    const afterMeaning = JSON.stringify(meaningOf(analyzeDocument(reformatted, NO_CRITERIA_DEFAULTS)));
    if (afterMeaning !== beforeMeaning) problems.push(`formatting changed the analysis:\n--- before\n${beforeMeaning}\n--- after\n${afterMeaning}`);
    const afterCodes = diagnosticCodes(reformatted.diagnostics ?? []);
    if (afterCodes !== beforeCodes) problems.push(`formatting changed the diagnostics: ${beforeCodes} -> ${afterCodes}`);
    if (nonWhitespace(formatted) !== nonWhitespace(original)) problems.push('formatting changed more than whitespace');
    return problems;
  }
}

/** What the analysis says, without source positions (formatting moves text, not meaning). */
export function meaningOf(analysis: DesignAnalysis): unknown {
  return {
    title: analysis.title,
    notes: analysis.notes,
    units: analysis.displayUnits,
    criteria: analysis.criteria,
    incomplete: analysis.incompleteReaches.map((reach) => [reach.channel, reach.reach, reach.reason]),
    channels: analysis.channels.map((channel) => ({
      name: channel.name,
      outlet: channel.outlet,
      reaches: channel.reaches.map((reach) => ({
        name: reach.name,
        section: [reach.section.shape, reach.section.dimensions, reach.section.bankDepth_m, reach.section.fullDepth_m],
        lining: [reach.lining.manningN, reach.lining.maxVelocity_mps, reach.lining.maxShear_Pa],
        slope: reach.slope,
        length: reach.length_m,
        criteria: reach.criteria,
        flows: reach.flows.map((flow) => ({
          flow: flow.flow,
          discharge: flow.discharge_m3s,
          normal: flow.normal,
          critical: flow.critical,
          note: flow.normalDepthNote,
          status: flow.status,
          findings: flow.findings.map((finding) => [finding.code, finding.severity, finding.message]),
        })),
      })),
    })),
  };
}

function diagnosticCodes(diagnostics: readonly Diagnostic[]): string {
  return diagnostics
    .map((diagnostic) => `${String(diagnostic.code ?? '')}/${String(diagnostic.severity ?? '')}`)
    .sort()
    .join(',');
}

function nonWhitespace(text: string): string {
  return text.replace(/\s+/g, '');
}

/** Why a range is not inside the document, or undefined when it is. */
export function rangeProblem(lines: TextDocument, range: Range): string | undefined {
  for (const [end, position] of [['start', range.start], ['end', range.end]] as const) {
    if (!Number.isInteger(position.line) || !Number.isInteger(position.character) || position.line < 0 || position.character < 0) return `${end} is not a position`;
    if (position.line >= lines.lineCount) return `${end} line ${position.line} is past the last line ${lines.lineCount - 1}`;
    // offsetAt clamps a character past the end of its line; a round trip that changes it means it was outside.
    const roundTrip = lines.positionAt(lines.offsetAt(position));
    if (roundTrip.line !== position.line || roundTrip.character !== position.character) return `${end} ${position.line}:${position.character} is past the end of its line`;
  }
  if (lines.offsetAt(range.start) > lines.offsetAt(range.end)) return 'start after end';
  return undefined;
}

/** The largest magnitude among the number literals of a text (0 when it has none). */
export function largestNumberWritten(text: string): number {
  let largest = 0;
  for (const match of text.matchAll(/[+-]?(?:\d+(?:\.\d+)?|\.\d+)(?:[eE][+-]?\d+)?/g)) {
    const value = Math.abs(Number(match[0]));
    if (value > largest) largest = value;
  }
  return largest;
}

/** Dotted paths of numbers in the analysis that are NaN or infinite. */
export function nonFiniteNumbers(value: unknown, path = 'analysis', found: string[] = []): string[] {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) found.push(`${path} = ${String(value)}`);
  } else if (Array.isArray(value)) {
    value.forEach((item, index) => nonFiniteNumbers(item, `${path}[${index}]`, found));
  } else if (value !== null && typeof value === 'object') {
    for (const [key, item] of Object.entries(value)) nonFiniteNumbers(item, `${path}.${key}`, found);
  }
  return found;
}

/** Up to `count` positions inside tokens, spread evenly over the text (the middle of every k-th word). */
function hoverPositions(text: string, lines: TextDocument, count: number): Position[] {
  if (count <= 0) return [];
  const starts: number[] = [];
  for (const match of text.matchAll(/[A-Za-z0-9_.%‰-]+/g)) starts.push(match.index + Math.floor(match[0].length / 2));
  const step = Math.max(1, Math.ceil(starts.length / count));
  return starts.filter((_, index) => index % step === 0).map((offset) => lines.positionAt(offset));
}

function describe(value: unknown): string {
  if (value instanceof Error) return value.stack ?? `${value.name}: ${value.message}`;
  return typeof value === 'string' ? value : JSON.stringify(value) ?? String(value);
}

// ------------------------------------------------------------------------------------------------ workspaces

/**
 * The server's composition (server/lsp/runnel-lsp-module.ts) when it imports, with its providers called directly;
 * else the language core alone (the editor checks are then skipped and the suite says so).
 */
async function createWorkspace(): Promise<Workspace> {
  try {
    return await createServerWorkspace();
  } catch (error) {
    editorFeaturesNote = `The server's providers did not import, so hints, hover and formatting were not fuzzed: ${describe(error).split('\n')[0] ?? ''}`;
    console.warn(editorFeaturesNote);
    return createCoreWorkspace();
  }
}

async function createServerWorkspace(): Promise<Workspace> {
  const { LspWorkspace, memoryUri } = await import('../server/lsp-workspace.js');
  const workspace = await LspWorkspace.create();
  const services = workspace.services.Runnel;
  // The providers the server registers are wrapped so that a fault is logged and answered with an empty result
  // (server/lsp/error-containment.ts). Here every such log line is a failure: catch them from the server's log.
  const log = services.runnel.Log as { error: (message: string) => void };
  log.error = (message: string) => {
    containedFaults.push(message);
  };
  const hover = services.lsp.HoverProvider;
  const hints = services.lsp.InlayHintProvider;
  const formatter = services.lsp.Formatter;
  if (hover === undefined || hints === undefined || formatter === undefined) throw new Error('the server registers no hover, inlay hint or formatting provider');
  const whole = (document: LangiumDocument): Range => ({ start: { line: 0, character: 0 }, end: document.textDocument.positionAt(document.textDocument.getText().length) });
  const textDocument = (document: LangiumDocument): { uri: string } => ({ uri: document.uri.toString() });
  return {
    async set(name, text) {
      await workspace.set({ [name]: text });
      return workspace.document(memoryUri(name));
    },
    editor: {
      hints: async (document) => (await hints.getInlayHints(document, { textDocument: textDocument(document), range: whole(document) })) ?? [],
      hover: async (document, position) => hover.getHoverContent(document, { textDocument: textDocument(document), position }),
      format: async (document) => {
        // formatDocument answers [] both for "nothing to change" and for "syntax errors, not formatted".
        if (document.parseResult.lexerErrors.length > 0 || document.parseResult.parserErrors.length > 0) return undefined;
        return formatter.formatDocument(document, { textDocument: textDocument(document), options: { tabSize: 2, insertSpaces: true } });
      },
    },
  };
}

function createCoreWorkspace(): Workspace {
  const { shared } = createRunnelServices(EmptyFileSystem);
  return {
    async set(name, text) {
      const uri = URI.parse(`memory:///workspace/${name}`);
      if (shared.workspace.LangiumDocuments.hasDocument(uri)) shared.workspace.LangiumDocuments.deleteDocument(uri);
      const document = shared.workspace.LangiumDocumentFactory.fromString(text, uri);
      shared.workspace.LangiumDocuments.addDocument(document);
      await shared.workspace.DocumentBuilder.build([document], { validation: true });
      return document;
    },
    editor: undefined,
  };
}
