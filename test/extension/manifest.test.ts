/**
 * The extension manifest (package.json) against the files and sources it names: every command, setting, language,
 * grammar, snippet file and bundle it points at exists and matches the extension's code, and the other way round.
 * The sources are read as text; nothing here loads `vscode`.
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { COMMAND_IDS, LANGUAGE_ID, OUTPUT_CHANNEL_NAME, REPORT_VIEW_TYPE, SERVER_BUNDLE_PATH, SERVER_DEBUG_BUNDLE_PATH, SETTINGS_SECTION } from '../../extension/identifiers.js';
import { CLI_BUNDLE_FILE, SERVER_BUNDLE_FILE } from '../../.scripts/bundle-options.mjs';
import { EmptyFileSystem } from 'langium';
import { CRITERION_SETTINGS, readCriterionSetting } from '../../language/analysis/criteria-settings.js';
import { createRunnelServices } from '../../language/runnel-module.js';
import { UNIT_TABLE } from '../../language/units/units.js';
import { DEFAULT_SETTINGS, parseSettings } from '../../server/lsp/runnel-settings.js';

const ROOT = join(import.meta.dirname, '..', '..');

interface CommandContribution {
  readonly command: string;
  readonly title: string;
  readonly category?: string;
  readonly icon?: string;
}
interface MenuItem {
  readonly command: string;
  readonly when?: string;
  readonly group?: string;
}
interface SettingSchema {
  readonly type: string;
  readonly default: unknown;
  readonly enum?: readonly unknown[];
  readonly examples?: readonly unknown[];
  readonly pattern?: string;
  readonly description?: string;
  readonly markdownDescription?: string;
  readonly scope?: string;
}
interface Manifest {
  readonly name: string;
  readonly version: string;
  readonly main: string;
  readonly icon?: string;
  readonly engines: { readonly vscode: string };
  readonly devDependencies: Readonly<Record<string, string>>;
  readonly scripts: Readonly<Record<string, string>>;
  readonly activationEvents: readonly string[];
  readonly capabilities: {
    readonly untrustedWorkspaces: { readonly supported: boolean | 'limited'; readonly description?: string; readonly restrictedConfigurations?: readonly string[] };
    readonly virtualWorkspaces: boolean | { readonly supported: boolean | 'limited'; readonly description?: string };
  };
  readonly contributes: {
    readonly languages: readonly { readonly id: string; readonly extensions: readonly string[]; readonly configuration: string }[];
    readonly grammars: readonly { readonly language: string; readonly scopeName: string; readonly path: string }[];
    readonly snippets: readonly { readonly language: string; readonly path: string }[];
    readonly commands: readonly CommandContribution[];
    readonly menus: Readonly<Record<string, readonly MenuItem[]>>;
    readonly configuration: readonly { readonly title: string; readonly properties: Readonly<Record<string, SettingSchema>> }[];
    readonly configurationDefaults?: Readonly<Record<string, Readonly<Record<string, unknown>>>>;
  };
}

interface TextMateRule {
  readonly include?: string;
  readonly match?: string;
  readonly begin?: string;
  readonly end?: string;
  readonly patterns?: readonly TextMateRule[];
}
interface TextMateGrammar extends TextMateRule {
  readonly scopeName: string;
  readonly repository: Readonly<Record<string, TextMateRule>>;
}

type SnippetFile = Readonly<Record<string, { readonly prefix: string | readonly string[]; readonly body: string | readonly string[]; readonly description: string }>>;

const manifest = readJson<Manifest>('package.json');
const extensionSources = typeScriptFilesUnder('extension').map((file) => ({ file, text: readText(file) }));
const allExtensionSource = extensionSources.map((source) => source.text).join('\n');
const settings = Object.assign({}, ...manifest.contributes.configuration.map((category) => category.properties)) as Readonly<
  Record<string, SettingSchema>
>;

describe('manifest: entry points and bundles', () => {
  it('main is the bundle .scripts/build.mjs makes from extension/extension.ts', () => {
    expect(manifest.main.replace(/^\.\//, '')).toBe('dist/extension.cjs');
    expect(buildOutputs().get('extension/extension.ts')).toBe('dist/extension.cjs');
    expect(existsSync(join(ROOT, 'extension/extension.ts'))).toBe(true);
    expect(allExtensionSource).toMatch(/export function activate\(/);
    expect(allExtensionSource).toMatch(/export (async )?function deactivate\(/);
  });

  it('the client starts the launcher the build makes from server/server-launcher.ts, or when debugging the bundle of server/language-server.ts that it runs', () => {
    expect(buildOutputs().get('server/server-launcher.ts')).toBe(SERVER_BUNDLE_PATH);
    expect(buildOutputs().get('server/language-server.ts')).toBe(SERVER_DEBUG_BUNDLE_PATH);
    expect(readText('server/server-launcher.ts')).toMatch(/runWithCodeCache\(join\(dirname\(fileURLToPath\(import\.meta\.url\)\), SERVER_BUNDLE_FILE\)\)/);
  });

  it('"npm run package" builds and packages without node_modules (everything is bundled)', () => {
    expect(manifest.scripts['package']).toMatch(/npm run build/);
    expect(manifest.scripts['package']).toMatch(/vsce package\b.*--no-dependencies/);
    expect(manifest.devDependencies['@vscode/vsce']).toBeDefined();
  });

  it('declares an editor version no newer than the API types it is compiled against (vsce refuses otherwise)', () => {
    const engine = /^\^(\d+)\.(\d+)\.(\d+)$/.exec(manifest.engines.vscode);
    const types = /^(\d+)\.(\d+)\.(\d+)$/.exec(manifest.devDependencies['@types/vscode'] ?? '');
    expect(engine).not.toBeNull();
    expect(types).not.toBeNull();
    const [, engineMajor, engineMinor] = engine ?? [];
    const [, typesMajor, typesMinor] = types ?? [];
    expect(Number(typesMajor)).toBe(Number(engineMajor));
    expect(Number(typesMinor)).toBeLessThanOrEqual(Number(engineMinor));
  });

  it('the icon, when there is one, is a PNG that exists (vsce rejects SVG icons)', () => {
    if (manifest.icon === undefined) return;
    expect(manifest.icon).toMatch(/\.png$/);
    expect(existsSync(join(ROOT, manifest.icon))).toBe(true);
  });

  it('.vscodeignore keeps exactly the bundles, README, LICENSE, the icon and the files the manifest contributes', () => {
    const kept = readText('.vscodeignore')
      .split(/\r?\n/)
      .map((line) => line.trim())
      .filter((line) => line.startsWith('!'))
      .map((line) => line.slice(1));
    const needed = [
      manifest.main,
      SERVER_BUNDLE_PATH,
      SERVER_DEBUG_BUNDLE_PATH,
      'README.md',
      'LICENSE',
      ...(manifest.icon === undefined ? [] : [manifest.icon]),
      ...manifest.contributes.languages.map((language) => language.configuration),
      ...manifest.contributes.grammars.map((grammar) => grammar.path),
      ...manifest.contributes.snippets.map((snippet) => snippet.path),
    ].map((path) => path.replace(/^\.\//, ''));
    expect(readText('.vscodeignore')).toMatch(/^\*\*$/m);
    expect(new Set(kept)).toEqual(new Set(needed));
  });
});

describe('manifest: language, grammar and snippets', () => {
  it('contributes the language the extension and its client use, for .runnel files', () => {
    expect(manifest.contributes.languages.map((language) => language.id)).toEqual([LANGUAGE_ID]);
    expect(manifest.contributes.languages[0]?.extensions).toEqual(['.runnel']);
    expect(manifest.activationEvents).toContain(`onLanguage:${LANGUAGE_ID}`);
    expect(allExtensionSource).toMatch(/new LanguageClient\(LANGUAGE_ID,/);
    expect(allExtensionSource).toMatch(/documentSelector: \[\{ language: LANGUAGE_ID \}\]/);
  });

  it('every activation event names something the extension contributes or registers', () => {
    const languages = new Set(manifest.contributes.languages.map((language) => language.id));
    for (const event of manifest.activationEvents) {
      const [kind, subject] = event.split(':');
      if (kind === 'onLanguage') expect(languages.has(subject ?? '')).toBe(true);
      else if (kind === 'onWebviewPanel') expect(subject).toBe(REPORT_VIEW_TYPE);
      else expect.unreachable(`unexpected activation event ${event}`);
    }
    expect(manifest.activationEvents).toContain(`onWebviewPanel:${REPORT_VIEW_TYPE}`);
    expect(allExtensionSource).toMatch(/createWebviewPanel\(\s*REPORT_VIEW_TYPE,/);
    expect(allExtensionSource).toMatch(/registerWebviewPanelSerializer\(REPORT_VIEW_TYPE,/);
  });

  it('the language configuration exists and sets comments and brackets as the grammar has them', () => {
    for (const language of manifest.contributes.languages) {
      const configuration = readJson<{
        comments: { lineComment: string; blockComment: [string, string] };
        brackets: [string, string][];
        wordPattern: string;
        indentationRules: { increaseIndentPattern: string; decreaseIndentPattern: string };
      }>(language.configuration);
      expect(configuration.comments).toEqual({ lineComment: '//', blockComment: ['/*', '*/'] });
      expect(configuration.brackets).toEqual([['{', '}']]);
      const langium = readText('language/runnel.langium');
      expect(langium).toContain('terminal SL_COMMENT: /\\/\\/');
      expect(langium).toContain('terminal ML_COMMENT: /\\/\\*');
      // A double-click selects a whole name (hyphens included) and a whole number.
      const word = new RegExp(`^(?:${configuration.wordPattern})$`);
      for (const text of ['east-ditch', 'q100', '0.035', '.5', '1e-3']) expect(word.test(text), text).toBe(true);
      expect(new RegExp(configuration.indentationRules.increaseIndentPattern).test('reach upper {')).toBe(true);
      expect(new RegExp(configuration.indentationRules.increaseIndentPattern).test('criteria { freeboard 0.5 ft }')).toBe(false);
      expect(new RegExp(configuration.indentationRules.decreaseIndentPattern).test('  }')).toBe(true);
    }
  });

  it('the grammar file exists, is named as contributed, and every include and pattern resolves', () => {
    expect(manifest.contributes.grammars).toHaveLength(1);
    for (const contribution of manifest.contributes.grammars) {
      expect(contribution.language).toBe(LANGUAGE_ID);
      const grammar = readJson<TextMateGrammar>(contribution.path);
      expect(grammar.scopeName).toBe(contribution.scopeName);
      for (const rule of rulesOf(grammar)) {
        if (rule.include !== undefined) {
          expect(rule.include.startsWith('#'), rule.include).toBe(true);
          expect(grammar.repository[rule.include.slice(1)], rule.include).toBeDefined();
        }
        // The editor's regex engine (Oniguruma) accepts more than JavaScript; staying inside JavaScript's syntax
        // keeps the grammar portable and lets this test compile every pattern.
        for (const source of [rule.match, rule.begin, rule.end]) if (source !== undefined) expect(() => new RegExp(source), source).not.toThrow();
      }
    }
  });

  it('the grammar colours every keyword of language/runnel.langium', () => {
    const sources = grammarSources().join('\n');
    const missing = langiumKeywords().filter((keyword) => !new RegExp(`(?<![A-Za-z])${escapeRegExp(keyword)}(?![A-Za-z])`).test(sources));
    expect(missing).toEqual([]);
  });

  it('the grammar colours exactly the unit spellings of the unit table (a misspelt unit stays plain)', () => {
    const grammar = readJson<TextMateGrammar>(manifest.contributes.grammars[0]?.path ?? '');
    const quantities = grammar.repository['quantities']?.match ?? '';
    const alternation = /\(\?:\\s\*\(([^()]*)\)/.exec(quantities)?.[1];
    expect(alternation).toBeDefined();
    const coloured = (alternation ?? '').split('|').map((spelling) => spelling.replace(/\\(.)/g, '$1'));
    expect(new Set(coloured)).toEqual(new Set(UNIT_TABLE.flatMap((unit) => unit.spellings)));
    // Longest first, so the first alternative that fits is the whole unit.
    const quantity = new RegExp(quantities);
    expect(quantity.exec('12 ft3/s')?.[2]).toBe('ft3/s');
    expect(quantity.exec('2 fps')?.[2]).toBe('fps');
    expect(quantity.exec('0.035 permissible')?.[2]).toBeUndefined();
    expect(quantity.exec('1.13 minimum')?.[2]).toBeUndefined();
  });

  it('every snippet file exists, is well formed, and uses only words of the language and its units', () => {
    const known = new Set([...langiumKeywords(), ...UNIT_TABLE.flatMap((unit) => unit.spellings), 'SI', 'US']);
    for (const contribution of manifest.contributes.snippets) {
      expect(contribution.language).toBe(LANGUAGE_ID);
      const snippets = readJson<SnippetFile>(contribution.path);
      expect(Object.keys(snippets).length).toBeGreaterThan(0);
      for (const [name, snippet] of Object.entries(snippets)) {
        expect([snippet.prefix].flat().length, name).toBeGreaterThan(0);
        expect(snippet.description.length, name).toBeGreaterThan(0);
        const body = [snippet.body].flat().join('\n');
        const literalWords = snippetLiteralWords(body);
        const unknown = literalWords.filter((word) => !known.has(word));
        expect(unknown, `snippet "${name}"`).toEqual([]);
      }
    }
  });

  it('there is a snippet for a new design, a reach, and a section of each shape', () => {
    const snippets = readJson<SnippetFile>(manifest.contributes.snippets[0]?.path ?? '');
    const bodies = Object.values(snippets).map((snippet) => [snippet.body].flat().join('\n'));
    expect(bodies.some((body) => /^design "/m.test(body) && /\bchannel\b/.test(body))).toBe(true);
    expect(bodies.some((body) => /^reach /.test(body))).toBe(true);
    const shapes = /SectionShape returns string:([^;]*);/.exec(readText('language/runnel.langium'))?.[1]?.match(/'([a-z]+)'/g) ?? [];
    expect(shapes.length).toBeGreaterThan(0);
    for (const quoted of shapes) {
      const shape = quoted.replace(/'/g, '');
      expect(bodies.some((body) => new RegExp(`^section \\$\\{1:[^}]*\\} ${shape} \\{`).test(body)), shape).toBe(true);
    }
  });
});

describe('manifest: commands and menus', () => {
  const contributed = manifest.contributes.commands.map((command) => command.command);

  it('contributes every command the extension registers, and registers every command it contributes', () => {
    expect(new Set(contributed)).toEqual(new Set(Object.values(COMMAND_IDS)));
    expect(new Set(registeredCommandIds())).toEqual(new Set(Object.values(COMMAND_IDS)));
    expect(contributed.length).toBe(new Set(contributed).size);
  });

  it('every command id is under runnel. and has a plain title in the Runnel category', () => {
    for (const command of manifest.contributes.commands) {
      expect(command.command).toMatch(/^runnel\.[a-z][A-Za-z]+$/);
      expect(command.category).toBe('Runnel');
      expect(command.title).toMatch(/^[A-Z][A-Za-z ]+(…)?$/);
      if (command.icon !== undefined) expect(command.icon).toMatch(/^\$\([a-z-]+\)$/);
    }
  });

  it('every menu item names a contributed command, and its conditions name our language and panel', () => {
    for (const [menu, items] of Object.entries(manifest.contributes.menus)) {
      for (const item of items) {
        expect(contributed, `${menu}: ${item.command}`).toContain(item.command);
        const when = item.when ?? '';
        for (const match of when.matchAll(/(?:editorLangId|resourceLangId) == ([\w.'-]+)/g)) expect(match[1]).toBe(LANGUAGE_ID);
        for (const match of when.matchAll(/activeWebviewPanelId == '([^']+)'/g)) expect(match[1]).toBe(REPORT_VIEW_TYPE);
        for (const match of when.matchAll(/resourceExtname == (\S+)/g)) expect(manifest.contributes.languages[0]?.extensions).toContain(match[1]);
      }
    }
  });

  it('the output channel the status item points at is the one the extension creates', () => {
    expect(allExtensionSource).toMatch(/createOutputChannel\(OUTPUT_CHANNEL_NAME, \{ log: true \}\)/);
    expect(OUTPUT_CHANNEL_NAME).toBe('Runnel');
  });
});

describe('manifest: settings', () => {
  const keys = Object.keys(settings);

  it('every setting is in the runnel section, typed, documented and defaulted to a value of its type', () => {
    expect(keys.length).toBeGreaterThan(0);
    for (const key of keys) {
      const schema = settings[key];
      expect(key.startsWith(`${SETTINGS_SECTION}.`), key).toBe(true);
      expect(schema?.markdownDescription ?? schema?.description, key).toBeTruthy();
      expect(typeof schema?.default, key).toBe(schema?.type);
      if (schema?.enum !== undefined) expect(schema.enum, key).toContain(schema.default);
      if (schema?.pattern !== undefined) expect(new RegExp(schema.pattern).test(String(schema.default)), key).toBe(true);
    }
  });

  it('offers the hint quantities and the display units the server reads', () => {
    expect(keys).toEqual(
      expect.arrayContaining([
        'runnel.inlayHints.normalDepth',
        'runnel.inlayHints.criticalDepth',
        'runnel.inlayHints.velocity',
        'runnel.inlayHints.froudeNumber',
        'runnel.inlayHints.maximumProfileDepth',
        'runnel.displayUnits',
        'runnel.trace.server',
      ]),
    );
    expect(settings['runnel.displayUnits']?.enum).toEqual(['auto', 'SI', 'US']);
    expect(settings['runnel.trace.server']?.enum).toEqual(['off', 'messages', 'verbose']);
  });

  it('every setting is read: the language client reads trace.server, the server parses every other one', () => {
    // The language client (vscode-languageclient) reads `<client id>.trace.server` itself.
    expect(LANGUAGE_ID).toBe(SETTINGS_SECTION);
    expect(allExtensionSource).toMatch(/new LanguageClient\(LANGUAGE_ID,/);
    const unread = keys.filter((key) => {
      if (key === `${SETTINGS_SECTION}.trace.server`) return false;
      const value = nonDefaultValue(key, settings[key]);
      const name = key.slice(SETTINGS_SECTION.length + 1);
      const flat = parseSettings({ [name]: value });
      const nested = parseSettings(nestedRecord(name, value));
      return JSON.stringify(flat) === JSON.stringify(DEFAULT_SETTINGS) || JSON.stringify(nested) !== JSON.stringify(flat);
    });
    expect(unread, 'contributed settings the server does not parse (or parses differently nested and flat)').toEqual([]);
  });

  it('offers one criteria setting per criterion the server and the command line read, nothing more', () => {
    const contributed = keys.filter((key) => key.startsWith(`${SETTINGS_SECTION}.criteria.`));
    expect(contributed.sort()).toEqual(CRITERION_SETTINGS.map((setting) => `${SETTINGS_SECTION}.criteria.${setting.name}`).sort());
  });

  it('each criteria setting is text, empty by default, says that the file wins and names its command-line option', () => {
    for (const setting of CRITERION_SETTINGS) {
      const schema = settings[`${SETTINGS_SECTION}.criteria.${setting.name}`];
      expect(schema?.type, setting.name).toBe('string');
      expect(schema?.default, setting.name).toBe('');
      expect(schema?.markdownDescription, setting.name).toMatch(/always wins/);
      expect(schema?.markdownDescription, setting.name).toContain(`\`--${setting.option}\``);
      expect(schema?.markdownDescription, setting.name).toContain(`\`${setting.keywords}\``);
      // The examples offered in the settings editor are the ones the command line's help gives.
      expect(schema?.examples, setting.name).toEqual(setting.examples);
    }
  });

  it('every example of a criteria setting reads with the language parser, and the default (empty) sets nothing', async () => {
    const { Runnel } = createRunnelServices(EmptyFileSystem);
    for (const setting of CRITERION_SETTINGS) {
      for (const example of settings[`${SETTINGS_SECTION}.criteria.${setting.name}`]?.examples ?? []) {
        const reading = await readCriterionSetting(Runnel, setting, String(example));
        expect(reading.ok, `${setting.name} = ${String(example)}`).toBe(true);
        if (reading.ok) expect(Object.keys(reading.defaults), `${setting.name} = ${String(example)}`).toEqual([setting.criterion]);
      }
      const empty = await readCriterionSetting(Runnel, setting, '');
      expect(empty.ok && Object.keys(empty.defaults).length === 0, setting.name).toBe(true);
    }
  });

  it('changes editor defaults only for Runnel files', () => {
    for (const key of Object.keys(manifest.contributes.configurationDefaults ?? {})) expect(key).toBe(`[${LANGUAGE_ID}]`);
  });

  it('declares how it behaves in untrusted and virtual workspaces, with a reason where limited', () => {
    const { untrustedWorkspaces, virtualWorkspaces } = manifest.capabilities;
    expect(untrustedWorkspaces.supported === true || untrustedWorkspaces.supported === 'limited').toBe(true);
    if (untrustedWorkspaces.supported === 'limited') {
      expect(untrustedWorkspaces.description).toBeTruthy();
      // The one thing withheld is git; the command says so when the folder is not trusted.
      expect(allExtensionSource).toMatch(/workspace\.isTrusted/);
    }
    expect(typeof virtualWorkspaces === 'object' && virtualWorkspaces.description).toBeTruthy();
  });

  it('an untrusted folder cannot set the criteria defaults through its workspace settings', () => {
    const restricted = manifest.capabilities.untrustedWorkspaces.restrictedConfigurations ?? [];
    const criteriaSettings = Object.keys(settings).filter((key) => key.startsWith(`${SETTINGS_SECTION}.criteria.`));
    expect(criteriaSettings.length).toBeGreaterThan(0);
    expect([...restricted].sort()).toEqual([...criteriaSettings].sort());
  });
});

// ---------------------------------------------------------------------------------------------- helpers

function readText(path: string): string {
  return readFileSync(join(ROOT, path.replace(/^\.\//, '')), 'utf8');
}

function readJson<T>(path: string): T {
  expect(existsSync(join(ROOT, path.replace(/^\.\//, ''))), `${path} exists`).toBe(true);
  return JSON.parse(readText(path)) as T;
}

function typeScriptFilesUnder(folder: string): string[] {
  return readdirSync(join(ROOT, folder), { withFileTypes: true }).flatMap((entry) => {
    const path = `${folder}/${entry.name}`;
    if (entry.isDirectory()) return typeScriptFilesUnder(path);
    return entry.name.endsWith('.ts') ? [path] : [];
  });
}

/** Entry point -> output file of every esbuild call in .scripts/build.mjs. */
function buildOutputs(): Map<string, string> {
  const script = readText('.scripts/build.mjs');
  const outputs = new Map<string, string>();
  // An outfile is a literal or a template naming a bundle file of .scripts/bundle-options.mjs.
  const names: Readonly<Record<string, string>> = { CLI_BUNDLE_FILE, SERVER_BUNDLE_FILE };
  for (const match of script.matchAll(/entryPoints: \['([^']+)'\][^}]*?outfile: ['`]([^'`]+)['`]/gs)) {
    if (match[1] !== undefined && match[2] !== undefined) outputs.set(match[1], match[2].replace(/\$\{(\w+)\}/g, (_, name: string) => names[name] ?? `<${name}?>`));
  }
  return outputs;
}

/**
 * Ids of the commands the extension registers: the first argument of every `registerCommand(...)` call, or of the
 * local `command(...)` helper that wraps it, written as `COMMAND_IDS.name` or a literal.
 */
function registeredCommandIds(): string[] {
  const ids: string[] = [];
  for (const { file, text } of extensionSources) {
    for (const match of text.matchAll(/\b(?:registerCommand|command)\(\s*(COMMAND_IDS\.(\w+)|'([^']+)'|([A-Za-z_]\w*))/g)) {
      const [, , key, literal, variable] = match;
      if (key !== undefined) {
        const id = (COMMAND_IDS as Readonly<Record<string, string>>)[key];
        expect(id, `${file}: COMMAND_IDS.${key}`).toBeDefined();
        ids.push(id ?? '');
      } else if (literal !== undefined) {
        ids.push(literal);
      } else if (variable !== 'id') {
        expect.unreachable(`${file}: a command is registered under '${variable}', which this test cannot read`);
      }
    }
  }
  return ids;
}

function* rulesOf(rule: TextMateRule | TextMateGrammar): Generator<TextMateRule> {
  yield rule;
  for (const child of rule.patterns ?? []) yield* rulesOf(child);
  if ('repository' in rule) for (const child of Object.values(rule.repository)) yield* rulesOf(child);
}

function grammarSources(): string[] {
  const grammar = readJson<TextMateGrammar>(manifest.contributes.grammars[0]?.path ?? '');
  return [...rulesOf(grammar)].flatMap((rule) => [rule.match, rule.begin, rule.end]).filter((source): source is string => source !== undefined);
}

/** Alphabetic keywords of the Langium grammar ('design', 'reach', ...), from its quoted literals. */
function langiumKeywords(): string[] {
  const grammar = readText('language/runnel.langium').replace(/\/\/[^\n]*/g, '');
  return [...new Set([...grammar.matchAll(/'([A-Za-z]+)'/g)].map((match) => match[1] ?? ''))];
}

/**
 * Words a snippet writes itself (not the text of its placeholders, which the user replaces): the options of its
 * choices count, since any of them ends up in the design.
 */
function snippetLiteralWords(body: string): string[] {
  const choices = [...body.matchAll(/\$\{\d+\|([^|]*)\|\}/g)].flatMap((match) => (match[1] ?? '').split(','));
  const literal = body
    .replace(/\$\{\d+\|[^|]*\|\}/g, ' ')
    .replace(/\$\{\d+:[^}]*\}/g, ' ')
    .replace(/\$\{\d+\}|\$\d+/g, ' ')
    .replace(/"[^"\n]*"/g, ' ')
    .replace(/\/\/[^\n]*/g, ' ');
  const words = [literal, ...choices].join(' ').match(/[A-Za-z_%‰][\w/%-]*/g) ?? [];
  return words;
}


function escapeRegExp(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

/** A value of a setting's type other than its default: the flipped flag, another choice, or its first example. */
function nonDefaultValue(key: string, schema: SettingSchema | undefined): unknown {
  if (schema === undefined) throw new Error(`no schema for ${key}`);
  if (schema.type === 'boolean') return !(schema.default as boolean);
  if (schema.enum !== undefined) return schema.enum.find((choice) => choice !== schema.default);
  const example = schema.examples?.[0];
  if (example === undefined) throw new Error(`${key}: a text setting needs examples, for the settings editor and for this test`);
  return example;
}

/** `inlayHints.velocity` = v as VS Code sends it: `{ inlayHints: { velocity: v } }`. */
function nestedRecord(dottedName: string, value: unknown): Record<string, unknown> {
  return dottedName
    .split('.')
    .reverse()
    .reduce<unknown>((inner, part) => ({ [part]: inner }), value) as Record<string, unknown>;
}
