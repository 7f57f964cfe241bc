/**
 * Analyses a set of design files together, the way the editor sees a workspace: every file is parsed and linked
 * with the others (a shared library of linings serves many designs), validated, and the requested ones analysed.
 * Texts come from the caller (disk, or git at a revision), so the same code serves `check`, `report`, `diff` and
 * the editor's comparison with the last commit. Each call uses its own services: two versions of a workspace
 * never see each other's definitions. Validation and analysis judge with the same criteria defaults from settings
 * (command-line options, or the editor's settings for its comparison with the last commit).
 */
import { EmptyFileSystem, URI, type LangiumDocument } from 'langium';
import type { Diagnostic } from 'vscode-languageserver';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import type { CriteriaDefaults } from '../../language/analysis/criteria-settings.js';
import type { DesignAnalysis, Finding, Severity, SourceRange } from '../../language/analysis/model.js';
import type { DesignProblem } from '../../language/diff/comparison-model.js';
import { createRunnelServices } from '../../language/runnel-module.js';

export interface WorkspaceFile {
  /** Absolute path; it becomes the document's file URI, so findings point at the file on disk. */
  readonly path: string;
  readonly text: string;
}

/** One problem to show a person: a parse, link or validation diagnostic, or an analysis finding. */
export interface FileDiagnostic {
  readonly severity: Severity;
  readonly code: string;
  readonly message: string;
  /** Zero-based, as in LSP and the analysis model. */
  readonly range: SourceRange;
  /** `syntax` (lexing and parsing), `reference` (linking), `validation` or `analysis`. */
  readonly source: 'syntax' | 'reference' | 'validation' | 'analysis';
}

export interface AnalysedFile {
  readonly path: string;
  readonly uri: string;
  readonly text: string;
  /** Every diagnostic and finding of the file, in document order, each once. */
  readonly diagnostics: readonly FileDiagnostic[];
  /** The analysis, or null when it failed (an internal fault, reported as an `internal-error` diagnostic). */
  readonly analysis: DesignAnalysis | null;
}

/**
 * Parses, links and validates `files` together and returns the analysis of each file in `targets` (paths), judged
 * with `criteriaDefaults` where a file states no criterion of its own.
 */
export async function analyseWorkspace(files: readonly WorkspaceFile[], targets: readonly string[], criteriaDefaults: CriteriaDefaults): Promise<Map<string, AnalysedFile>> {
  const { shared, Runnel } = createRunnelServices(EmptyFileSystem);
  Runnel.analysis.CriteriaDefaults.replace(criteriaDefaults);
  const documents = new Map<string, LangiumDocument>();
  for (const file of files) {
    if (documents.has(file.path)) continue;
    const document = shared.workspace.LangiumDocumentFactory.fromString(file.text, URI.file(file.path));
    shared.workspace.LangiumDocuments.addDocument(document);
    documents.set(file.path, document);
  }
  await shared.workspace.DocumentBuilder.build([...documents.values()], { validation: true });
  const results = new Map<string, AnalysedFile>();
  for (const path of targets) {
    const document = documents.get(path);
    if (document === undefined) continue;
    results.set(path, analysedFile(path, document, criteriaDefaults));
  }
  return results;
}

function analysedFile(path: string, document: LangiumDocument, criteriaDefaults: CriteriaDefaults): AnalysedFile {
  const langiumDiagnostics = (document.diagnostics ?? []).map(fromLangium);
  let analysis: DesignAnalysis | null = null;
  let internalProblem: FileDiagnostic[] = [];
  try {
    // Parsing recovers from syntax errors, so there is always a tree to analyse; reaches the file leaves
    // incomplete are listed as such by the analysis.
    analysis = analyzeDocument(document, criteriaDefaults);
  } catch (error) {
    // The analysis must not throw on user input (DEVELOPERS.md, invariant 3); if it does, say so at the top of
    // the file instead of crashing, so the other files are still checked.
    const reason = error instanceof Error ? error.message : String(error);
    internalProblem = [
      {
        severity: 'error',
        code: 'internal-error',
        message: `Runnel could not analyse this file (${reason}). This is a fault in Runnel, not in the design: please report it with the file.`,
        range: { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } },
        source: 'analysis',
      },
    ];
  }
  const diagnostics = mergeDiagnostics([...langiumDiagnostics, ...internalProblem], analysis?.findings ?? []);
  return { path, uri: document.uri.toString(), text: document.textDocument.getText(), diagnostics, analysis };
}

const LANGIUM_SEVERITIES: Readonly<Record<number, Severity>> = { 1: 'error', 2: 'warning', 3: 'information', 4: 'information' };

/** Langium's own codes for problems found before validation (see langium's DocumentValidationDiagnosticCode). */
const SOURCE_BY_LANGIUM_CODE: Readonly<Record<string, FileDiagnostic['source']>> = {
  'lexing-error': 'syntax',
  'parsing-error': 'syntax',
  'linking-error': 'reference',
};

function fromLangium(diagnostic: Diagnostic): FileDiagnostic {
  const data: unknown = diagnostic.data;
  const dataCode = typeof data === 'object' && data !== null && 'code' in data && typeof data.code === 'string' ? data.code : undefined;
  const code = diagnostic.code === undefined ? (dataCode ?? 'problem') : String(diagnostic.code);
  return {
    severity: LANGIUM_SEVERITIES[diagnostic.severity ?? 1] ?? 'error',
    code,
    message: typeof diagnostic.message === 'string' ? diagnostic.message : diagnostic.message.value,
    range: diagnostic.range,
    source: SOURCE_BY_LANGIUM_CODE[dataCode ?? code] ?? 'validation',
  };
}

/**
 * Diagnostics and findings together, each problem once. The language's validator publishes the analysis findings
 * as diagnostics too (for the editor); a diagnostic with a finding's code, line and message is that finding, so
 * it is marked as coming from the analysis and the finding is not repeated.
 */
function mergeDiagnostics(diagnostics: readonly FileDiagnostic[], findings: readonly Finding[]): FileDiagnostic[] {
  const keyOf = (item: { code: string; message: string; range: SourceRange }): string => JSON.stringify([item.code, item.range.start.line, item.message]);
  const findingKeys = new Set(findings.map((finding) => keyOf({ ...finding, range: finding.location.range })));
  const marked = diagnostics.map((diagnostic) => (findingKeys.has(keyOf(diagnostic)) ? { ...diagnostic, source: 'analysis' as const } : diagnostic));
  const seen = new Set(marked.map(keyOf));
  const fromFindings: FileDiagnostic[] = findings
    .map((finding) => ({ severity: finding.severity, code: finding.code, message: finding.message, range: finding.location.range, source: 'analysis' as const }))
    .filter((finding) => !seen.has(keyOf(finding)));
  return [...marked, ...fromFindings].sort(
    (a, b) => a.range.start.line - b.range.start.line || a.range.start.character - b.range.start.character,
  );
}

/** The parse and validation problems of a file (not its findings), as the comparison counts them. */
export function designProblemsOf(file: AnalysedFile): DesignProblem[] {
  return file.diagnostics
    .filter((diagnostic) => diagnostic.source !== 'analysis')
    .map((diagnostic) => ({ severity: diagnostic.severity, code: diagnostic.code, message: diagnostic.message, line: diagnostic.range.start.line + 1 }));
}
