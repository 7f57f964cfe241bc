/**
 * What `runnel check` prints, in each format:
 * - text: `path:line:col: severity code message` (1-based), a tally and the caution;
 * - json: one document with every file's diagnostics and its whole analysis (every reach with its inputs in SI and
 *   every result and finding; unit in each field name), under a schema version;
 * - sarif: SARIF 2.1.0, the open standard for analysis results, for code-scanning tools;
 * - github: workflow annotation lines (`::error file=...,line=...::message`).
 */
import type { DesignAnalysis, Severity } from '../../language/analysis/model.js';
import type { AnalysedFile, FileDiagnostic } from './analyse-workspace.js';
import type { Styles } from './terminal.js';

/** Version of the JSON document `runnel check --format json` writes; raised on any incompatible change. */
export const CHECK_JSON_SCHEMA_VERSION = 1;

export interface CheckedFile {
  /** Relative to the current folder, for people. */
  readonly displayPath: string;
  /** Relative to the repository root (or the current folder outside a repository), `/`-separated, for SARIF and CI. */
  readonly rootRelativePath: string;
  readonly result: AnalysedFile;
}

export interface ToolInfo {
  readonly name: string;
  readonly version: string;
}

export interface Tally {
  readonly errors: number;
  readonly warnings: number;
  readonly information: number;
}

export function tallyOf(diagnostics: readonly { readonly severity: Severity }[]): Tally {
  return {
    errors: diagnostics.filter((diagnostic) => diagnostic.severity === 'error').length,
    warnings: diagnostics.filter((diagnostic) => diagnostic.severity === 'warning').length,
    information: diagnostics.filter((diagnostic) => diagnostic.severity === 'information').length,
  };
}

function count(number: number, one: string, many: string): string {
  return `${number} ${number === 1 ? one : many}`;
}

export function tallyText(tally: Tally, fileCount: number): string {
  return `${count(tally.errors, 'error', 'errors')}, ${count(tally.warnings, 'warning', 'warnings')}, ${count(tally.information, 'note', 'notes')} in ${count(fileCount, 'file', 'files')}`;
}

// ---------------------------------------------------------------------------------------------------------------
// text

const SEVERITY_STYLE: Readonly<Record<Severity, keyof Styles>> = { error: 'error', warning: 'warning', information: 'information' };

export function formatDiagnosticLine(path: string, diagnostic: FileDiagnostic, styles: Styles): string {
  const line = diagnostic.range.start.line + 1;
  const column = diagnostic.range.start.character + 1;
  const severity = styles[SEVERITY_STYLE[diagnostic.severity]](diagnostic.severity);
  return `${styles.bold(`${path}:${line}:${column}:`)} ${severity} ${styles.dim(diagnostic.code)} ${diagnostic.message}`;
}

/** `criteriaLine` says which criteria came from command-line options (criteria-options.ts); null when none did. */
export function renderCheckText(files: readonly CheckedFile[], caution: string, styles: Styles, criteriaLine: string | null): string {
  const lines = files.flatMap((file) => file.result.diagnostics.map((diagnostic) => formatDiagnosticLine(file.displayPath, diagnostic, styles)));
  const tally = tallyOf(files.flatMap((file) => file.result.diagnostics));
  const summary = tallyText(tally, files.length);
  const styledSummary = tally.errors > 0 ? styles.error(summary) : tally.warnings > 0 ? styles.warning(summary) : styles.success(summary);
  return [...lines, ...(lines.length > 0 ? [''] : []), styledSummary, ...(criteriaLine === null ? [] : [criteriaLine]), styles.dim(`Caution: ${caution}`), ''].join('\n');
}

// ---------------------------------------------------------------------------------------------------------------
// json

export interface CheckJsonDiagnostic {
  readonly severity: Severity;
  readonly code: string;
  readonly message: string;
  readonly source: FileDiagnostic['source'];
  /** 1-based line and column of the start; end exclusive, as in the editor. */
  readonly line: number;
  readonly column: number;
  readonly endLine: number;
  readonly endColumn: number;
}

export interface CheckJsonFile {
  readonly path: string;
  readonly uri: string;
  readonly summary: Tally;
  readonly diagnostics: readonly CheckJsonDiagnostic[];
  readonly analysis: DesignAnalysis | null;
}

export interface CheckJsonDocument {
  readonly schemaVersion: number;
  readonly tool: ToolInfo;
  readonly caution: string;
  readonly summary: Tally & { readonly files: number };
  readonly files: readonly CheckJsonFile[];
}

export function checkJsonDocument(files: readonly CheckedFile[], caution: string, tool: ToolInfo): CheckJsonDocument {
  const all = files.flatMap((file) => file.result.diagnostics);
  return {
    schemaVersion: CHECK_JSON_SCHEMA_VERSION,
    tool,
    caution,
    summary: { files: files.length, ...tallyOf(all) },
    files: files.map((file) => ({
      path: file.displayPath,
      uri: file.result.uri,
      summary: tallyOf(file.result.diagnostics),
      diagnostics: file.result.diagnostics.map((diagnostic) => ({
        severity: diagnostic.severity,
        code: diagnostic.code,
        message: diagnostic.message,
        source: diagnostic.source,
        line: diagnostic.range.start.line + 1,
        column: diagnostic.range.start.character + 1,
        endLine: diagnostic.range.end.line + 1,
        endColumn: diagnostic.range.end.character + 1,
      })),
      analysis: file.result.analysis,
    })),
  };
}

// ---------------------------------------------------------------------------------------------------------------
// sarif

const SARIF_LEVELS: Readonly<Record<Severity, 'error' | 'warning' | 'note'>> = { error: 'error', warning: 'warning', information: 'note' };

/** The SARIF 2.1.0 schema location that consumers recognise. */
export const SARIF_SCHEMA_URI = 'https://json.schemastore.org/sarif-2.1.0.json';
/** The base every result's file path is relative to (the repository root, or the current folder). */
const SOURCE_ROOT_ID = 'SRCROOT';

/**
 * A rule's title for code-scanning views, in words from its stable code: `freeboard-below-required` becomes
 * "Freeboard below required" (the code stays the one home of the rule's name).
 */
export function ruleTitle(code: string): string {
  const words = code.split('-').join(' ');
  return words.length === 0 ? code : `${words.charAt(0).toUpperCase()}${words.slice(1)}`;
}

function encodePath(path: string): string {
  return path.split('/').map(encodeURIComponent).join('/');
}

/**
 * A SARIF 2.1.0 log with one run. Columns count UTF-16 code units, as the editor's do; regions are 1-based with an
 * exclusive end column, as SARIF defines them.
 */
export function checkSarifLog(files: readonly CheckedFile[], caution: string, tool: ToolInfo, rootUri: string): object {
  const ruleIds = [...new Set(files.flatMap((file) => file.result.diagnostics.map((diagnostic) => diagnostic.code)))].sort();
  const ruleIndex = new Map(ruleIds.map((id, index) => [id, index]));
  const sources = new Map<string, FileDiagnostic['source']>();
  for (const diagnostic of files.flatMap((file) => file.result.diagnostics)) if (!sources.has(diagnostic.code)) sources.set(diagnostic.code, diagnostic.source);
  const artifacts = files.map((file) => ({ location: { uri: encodePath(file.rootRelativePath), uriBaseId: SOURCE_ROOT_ID } }));
  const results = files.flatMap((file, artifactIndex) =>
    file.result.diagnostics.map((diagnostic) => ({
      ruleId: diagnostic.code,
      ruleIndex: ruleIndex.get(diagnostic.code) ?? 0,
      level: SARIF_LEVELS[diagnostic.severity],
      message: { text: diagnostic.message },
      locations: [
        {
          physicalLocation: {
            artifactLocation: { uri: encodePath(file.rootRelativePath), uriBaseId: SOURCE_ROOT_ID, index: artifactIndex },
            region: {
              startLine: diagnostic.range.start.line + 1,
              startColumn: diagnostic.range.start.character + 1,
              endLine: diagnostic.range.end.line + 1,
              endColumn: diagnostic.range.end.character + 1,
            },
          },
        },
      ],
    })),
  );
  return {
    $schema: SARIF_SCHEMA_URI,
    version: '2.1.0',
    runs: [
      {
        tool: {
          driver: {
            name: tool.name,
            semanticVersion: tool.version,
            version: tool.version,
            rules: ruleIds.map((id) => ({ id, shortDescription: { text: ruleTitle(id) }, properties: { category: sources.get(id) ?? 'validation' } })),
          },
        },
        originalUriBaseIds: { [SOURCE_ROOT_ID]: { uri: rootUri.endsWith('/') ? rootUri : `${rootUri}/` } },
        artifacts,
        columnKind: 'utf16CodeUnits',
        results,
        invocations: [{ executionSuccessful: true }],
        properties: { caution },
      },
    ],
  };
}

// ---------------------------------------------------------------------------------------------------------------
// github

const GITHUB_COMMANDS: Readonly<Record<Severity, string>> = { error: 'error', warning: 'warning', information: 'notice' };

/** Workflow-command escaping: the message escapes %, CR and LF; property values also `:` and `,`. */
function escapeData(text: string): string {
  return text.replace(/%/g, '%25').replace(/\r/g, '%0D').replace(/\n/g, '%0A');
}
function escapeProperty(text: string): string {
  return escapeData(text).replace(/:/g, '%3A').replace(/,/g, '%2C');
}

export function renderGithubAnnotations(files: readonly CheckedFile[]): string {
  const lines = files.flatMap((file) =>
    file.result.diagnostics.map((diagnostic) => {
      const properties = [
        `file=${escapeProperty(file.rootRelativePath)}`,
        `line=${diagnostic.range.start.line + 1}`,
        `col=${diagnostic.range.start.character + 1}`,
        `endLine=${diagnostic.range.end.line + 1}`,
        `endColumn=${diagnostic.range.end.character + 1}`,
        `title=${escapeProperty(`runnel ${diagnostic.code}`)}`,
      ];
      return `::${GITHUB_COMMANDS[diagnostic.severity]} ${properties.join(',')}::${escapeData(diagnostic.message)}`;
    }),
  );
  return lines.length === 0 ? '' : `${lines.join('\n')}\n`;
}
