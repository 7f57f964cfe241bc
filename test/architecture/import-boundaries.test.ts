/**
 * The layer invariants of DEVELOPERS.md, checked mechanically by scanning every import in the source tree:
 * 1. language/hydraulics imports nothing from langium, vscode, the language server or Node's file system.
 * 2. Only server/ speaks LSP (vscode-languageserver); only extension/ imports vscode or the language client.
 *    The report renderer (language/report) is pure: no file system, no parser, no editor.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = join(import.meta.dirname, '..', '..');

interface Rule {
  readonly folder: string;
  readonly forbidden: readonly RegExp[];
  readonly why: string;
}

const EDITOR = /^vscode$/;
const LANGUAGE_CLIENT = /^vscode-languageclient(\/.*)?$/;
const LANGUAGE_SERVER = /^vscode-languageserver(\/node|\/browser)?$/;
const LANGIUM = /^langium(\/.*)?$/;
const FILE_SYSTEM = /^(node:)?fs(\/promises)?$/;

const RULES: readonly Rule[] = [
  { folder: 'language/hydraulics', forbidden: [EDITOR, LANGUAGE_CLIENT, LANGUAGE_SERVER, LANGIUM, FILE_SYSTEM], why: 'the engine is plain functions over numbers' },
  { folder: 'language/units', forbidden: [EDITOR, LANGUAGE_CLIENT, LANGUAGE_SERVER, LANGIUM, FILE_SYSTEM], why: 'units are plain data' },
  { folder: 'language/report', forbidden: [EDITOR, LANGUAGE_CLIENT, LANGUAGE_SERVER, LANGIUM, FILE_SYSTEM], why: 'the renderer is data in, string out' },
  { folder: 'language', forbidden: [EDITOR, LANGUAGE_CLIENT, LANGUAGE_SERVER], why: 'only server/ speaks LSP and only extension/ imports vscode' },
  { folder: 'server', forbidden: [EDITOR, LANGUAGE_CLIENT], why: 'only extension/ imports vscode' },
];

/** Every import or re-export specifier in a TypeScript file, including dynamic import() and require(). */
export function importSpecifiers(sourceText: string): string[] {
  const pattern = /(?:\bimport\s+(?:type\s+)?(?:[^'"]*?\sfrom\s+)?|\bexport\s+[^'"]*?\sfrom\s+|\bimport\s*\(\s*|\brequire\s*\(\s*)['"]([^'"]+)['"]/g;
  return [...sourceText.matchAll(pattern)].map((match) => match[1] ?? '');
}

function typeScriptFilesUnder(folder: string): string[] {
  const absolute = join(ROOT, folder);
  let entries: string[];
  try {
    entries = readdirSync(absolute);
  } catch {
    return [];
  }
  return entries.flatMap((entry) => {
    const path = join(absolute, entry);
    if (entry === 'node_modules' || entry === 'generated') return [];
    if (statSync(path).isDirectory()) return typeScriptFilesUnder(relative(ROOT, path));
    return /\.(ts|mts|cts)$/.test(entry) ? [relative(ROOT, path)] : [];
  });
}

describe('import boundaries (DEVELOPERS.md, invariants 1 and 2)', () => {
  it('finds imports the way the rules need (the scanner itself)', () => {
    const sample = [
      "import { a } from 'langium';",
      "import type { B } from 'vscode-languageserver/node';",
      "export * from 'node:fs';",
      "const c = await import('vscode');",
      "import 'side-effect';",
    ].join('\n');
    expect(importSpecifiers(sample)).toEqual(['langium', 'vscode-languageserver/node', 'node:fs', 'vscode', 'side-effect']);
  });

  for (const rule of RULES) {
    it(`${rule.folder}: ${rule.why}`, () => {
      const files = typeScriptFilesUnder(rule.folder);
      expect(files.length, `no TypeScript files found under ${rule.folder}`).toBeGreaterThan(0);
      const violations = files.flatMap((file) =>
        importSpecifiers(readFileSync(join(ROOT, file), 'utf8'))
          .filter((specifier) => rule.forbidden.some((pattern) => pattern.test(specifier)))
          .map((specifier) => `${file} imports '${specifier}'`),
      );
      expect(violations).toEqual([]);
    });
  }
});
