/**
 * Small helpers for language tests: build a workspace of Runnel texts in memory, and mark expected places in a
 * text with inline markers: `<|` and `|>` around a range (several ranges allowed, in order), `<|>` for a position.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { EmptyFileSystem, URI, type LangiumDocument } from 'langium';
import { expect } from 'vitest';
import type { RunnelFile } from '../../language/generated/ast.js';
import { createRunnelServices } from '../../language/runnel-module.js';

export interface TextRange {
  readonly start: { readonly line: number; readonly character: number };
  readonly end: { readonly line: number; readonly character: number };
}

/** A source text with its markers removed and the marked ranges (zero-based, as in LSP). */
export function marked(textWithMarkers: string): { text: string; ranges: TextRange[] } {
  let text = '';
  const ranges: TextRange[] = [];
  let openAt: number | undefined;
  let index = 0;
  while (index < textWithMarkers.length) {
    if (textWithMarkers.startsWith('<|>', index)) {
      ranges.push({ start: positionAt(text, text.length), end: positionAt(text, text.length) });
      index += 3;
    } else if (textWithMarkers.startsWith('<|', index)) {
      openAt = text.length;
      index += 2;
    } else if (textWithMarkers.startsWith('|>', index) && openAt !== undefined) {
      ranges.push({ start: positionAt(text, openAt), end: positionAt(text, text.length) });
      openAt = undefined;
      index += 2;
    } else {
      text += textWithMarkers[index];
      index++;
    }
  }
  return { text, ranges };
}

function positionAt(text: string, offset: number): { line: number; character: number } {
  const before = text.slice(0, offset).split('\n');
  return { line: before.length - 1, character: before[before.length - 1]?.length ?? 0 };
}

export interface BuiltWorkspace {
  readonly documents: LangiumDocument<RunnelFile>[];
  readonly services: ReturnType<typeof createRunnelServices>;
}

/** Parses, links and validates the texts together, as one workspace. Keys are file names. */
export async function buildWorkspace(files: Readonly<Record<string, string>>): Promise<BuiltWorkspace> {
  const services = createRunnelServices(EmptyFileSystem);
  const { shared } = services;
  const documents = Object.entries(files).map(([name, text]) => {
    const document = shared.workspace.LangiumDocumentFactory.fromString<RunnelFile>(text, URI.parse(`memory:///workspace/${name}`));
    shared.workspace.LangiumDocuments.addDocument(document);
    return document;
  });
  await shared.workspace.DocumentBuilder.build(documents, { validation: true });
  return { documents, services };
}

/** Builds one text (plus optional other files) and returns its document. */
export async function buildText(text: string, otherFiles: Readonly<Record<string, string>> = {}): Promise<LangiumDocument<RunnelFile>> {
  const { documents } = await buildWorkspace({ 'design.runnel': text, ...otherFiles });
  const document = documents[0];
  if (document === undefined) throw new Error('internal: no document built');
  return document;
}

export interface PlainDiagnostic {
  readonly code: string;
  readonly severity: 'error' | 'warning' | 'info' | 'hint';
  readonly message: string;
  readonly range: TextRange;
}

const SEVERITY_NAMES = { 1: 'error', 2: 'warning', 3: 'info', 4: 'hint' } as const;

export function plainDiagnostics(document: LangiumDocument): PlainDiagnostic[] {
  return (document.diagnostics ?? []).map((diagnostic) => ({
    code: String(diagnostic.code ?? ''),
    severity: SEVERITY_NAMES[(diagnostic.severity ?? 1) as 1 | 2 | 3 | 4],
    message: typeof diagnostic.message === 'string' ? diagnostic.message : diagnostic.message.value,
    range: { start: diagnostic.range.start, end: diagnostic.range.end },
  }));
}

export interface ExpectedDiagnostic {
  /** Source with the expected range marked `<|...|>`. */
  readonly source: string;
  readonly code: string;
  readonly severity: PlainDiagnostic['severity'];
  /** The exact message. */
  readonly message: string;
  readonly otherFiles?: Readonly<Record<string, string>>;
}

/** Exactly one diagnostic with this code, at the marked range, with this message and severity. */
export async function expectDiagnostic(expected: ExpectedDiagnostic): Promise<void> {
  const { text, ranges } = marked(expected.source);
  expect(ranges, 'the source must mark one range').toHaveLength(1);
  const document = await buildText(text, expected.otherFiles);
  const withCode = plainDiagnostics(document).filter((diagnostic) => diagnostic.code === expected.code);
  expect(withCode, `diagnostics with code ${expected.code} in:\n${text}\nall: ${JSON.stringify(plainDiagnostics(document), null, 1)}`).toHaveLength(1);
  expect(withCode[0]).toEqual({ code: expected.code, severity: expected.severity, message: expected.message, range: ranges[0] });
}

/** No diagnostic with this code (the negative twin of a case). */
export async function expectNoDiagnostic(source: string, code: string, otherFiles: Readonly<Record<string, string>> = {}): Promise<void> {
  const document = await buildText(marked(source).text, otherFiles);
  const withCode = plainDiagnostics(document).filter((diagnostic) => diagnostic.code === code);
  expect(withCode, `unexpected ${code} in:\n${source}`).toEqual([]);
}

/** Pieces to compose small designs in tests: a header, one section, one lining, one flow. */
export const BASE = [
  'design "Test"',
  'units US',
  'flows { q10 = 10 cfs "10-year" }',
  'section ditch trapezoid { bottom width 2 ft  side slopes 3:1  bank height 2 ft }',
  'lining grass { n 0.035 }',
].join('\n');

/** A complete, valid channel of one reach. */
export const CHANNEL = 'channel c {\n  reach r { section ditch  lining grass  slope 1 %  length 100 ft }\n  outlet free fall\n}';

const SAMPLES = join(import.meta.dirname, '..', '..', 'samples');

/** Every `.runnel` file of samples/, by file name. */
export function sampleFiles(): Record<string, string> {
  const names = readdirSync(SAMPLES).filter((name) => name.endsWith('.runnel'));
  return Object.fromEntries(names.map((name) => [name, readFileSync(join(SAMPLES, name), 'utf8')]));
}
