/**
 * Mutations of design texts for fuzzing, as fast-check arbitraries: what a half-finished edit, a bad paste or a
 * corrupted file does to a design. Tokens are found with a small regular expression that follows the grammar's
 * terminals (strings, words, numbers, comments, single characters), so "delete the fifth token" means what an
 * engineer would call a word.
 */
import fc from 'fast-check';

export interface Token {
  readonly text: string;
  readonly start: number;
  readonly end: number;
  readonly kind: 'string' | 'word' | 'number' | 'comment' | 'other';
}

const TOKEN_PATTERN = /("[^"\r\n]*"?)|(\/\/[^\r\n]*|\/\*[\s\S]*?\*\/)|([+-]?(?:\d+(?:\.\d+)?|\.\d+)(?:[eE][+-]?\d+)?)|([A-Za-z_][A-Za-z0-9_]*(?:-[A-Za-z0-9_]+)*)|(\S)/gu;

export function tokensOf(text: string): Token[] {
  const tokens: Token[] = [];
  for (const match of text.matchAll(TOKEN_PATTERN)) {
    const kind = match[1] !== undefined ? 'string' : match[2] !== undefined ? 'comment' : match[3] !== undefined ? 'number' : match[4] !== undefined ? 'word' : 'other';
    tokens.push({ text: match[0], start: match.index, end: match.index + match[0].length, kind });
  }
  return tokens;
}

/** Numbers at the edges of what a double holds, and the ones a careless edit leaves behind. */
export const EXTREME_NUMBERS = ['0', '-0', '-1', '0.0', '1e-300', '-1e-300', '1e300', '1e309', '-1e309', '4.9e-324', '1e-320', '1.7976931348623157e308', '99999999999999999999999', '.0000001', '+5'] as const;

/** Pieces of the language and of other text that confuse a parser when they land in the wrong place. */
const FRAGMENTS = [
  '{', '}', '"', ':', '=', ',', '%', '‰', '/', '//', '/*', '*/', 'to', 'at', 'reach', 'section', 'lining', 'flows', 'channel', 'outlet',
  'criteria', 'design', 'library', 'units', 'note', 'circle', 'trapezoid', 'ft', 'm', 'in', 'cfs', 'm3/s', 'L/s', 'psf', 'Pa', 'n', 'slope',
  'inverts', 'length', 'bank height', 'side slopes', 'diameter', 'free fall', 'water level', 'normal depth', '\n', '\r\n', '\r', '\t', ' ',
] as const;

export type Mutation =
  | { readonly kind: 'delete'; readonly token: number }
  | { readonly kind: 'duplicate'; readonly token: number }
  | { readonly kind: 'swap'; readonly first: number; readonly second: number }
  | { readonly kind: 'truncate'; readonly at: number }
  | { readonly kind: 'insert'; readonly at: number; readonly text: string }
  | { readonly kind: 'replace-number'; readonly token: number; readonly text: string }
  | { readonly kind: 'replace-name'; readonly token: number; readonly text: string };

/** A very long name (a legal identifier) or line. */
const longName = fc.integer({ min: 200, max: 6_000 }).map((length) => `x${'y'.repeat(length)}`);
const longLine = fc.oneof(
  fc.integer({ min: 1_000, max: 30_000 }).map((length) => `note "${'wide '.repeat(Math.ceil(length / 5))}"`),
  fc.integer({ min: 1_000, max: 30_000 }).map((length) => `// ${'-'.repeat(length)}`),
  fc.integer({ min: 50, max: 400 }).map((count) => ` reach r${count} { slope 1 %  length 10 ft }`.repeat(count)),
  fc.integer({ min: 50, max: 800 }).map((count) => '{'.repeat(count)),
);

const insertedText = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom(...FRAGMENTS) },
  { weight: 2, arbitrary: fc.constantFrom(...EXTREME_NUMBERS) },
  { weight: 2, arbitrary: fc.string({ unit: 'binary', maxLength: 12 }) },
  { weight: 2, arbitrary: fc.string({ unit: 'grapheme', maxLength: 8 }) },
  { weight: 1, arbitrary: fc.constantFrom('\u0000', '\uFEFF', '\u200B', '\u202E', '\uD800', '\uDC00', '😀', 'é', 'ﬁ', '\u2028', '\u0085') },
  { weight: 1, arbitrary: longName },
  { weight: 1, arbitrary: longLine },
);

export const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  { weight: 3, arbitrary: fc.nat().map((token): Mutation => ({ kind: 'delete', token })) },
  { weight: 2, arbitrary: fc.nat().map((token): Mutation => ({ kind: 'duplicate', token })) },
  { weight: 2, arbitrary: fc.tuple(fc.nat(), fc.nat()).map(([first, second]): Mutation => ({ kind: 'swap', first, second })) },
  { weight: 1, arbitrary: fc.double({ min: 0, max: 1, noNaN: true }).map((at): Mutation => ({ kind: 'truncate', at })) },
  { weight: 4, arbitrary: fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), insertedText).map(([at, text]): Mutation => ({ kind: 'insert', at, text })) },
  { weight: 3, arbitrary: fc.tuple(fc.nat(), fc.constantFrom(...EXTREME_NUMBERS)).map(([token, text]): Mutation => ({ kind: 'replace-number', token, text })) },
  { weight: 1, arbitrary: fc.tuple(fc.nat(), longName).map(([token, text]): Mutation => ({ kind: 'replace-name', token, text })) },
);

export const mutations: fc.Arbitrary<Mutation[]> = fc.array(mutation, { minLength: 1, maxLength: 5 });

/** Applies the mutations in order; token indexes wrap around the tokens of the text at that point. */
export function applyMutations(original: string, list: readonly Mutation[]): string {
  let text = original;
  for (const change of list) text = applyMutation(text, change);
  return text;
}

function applyMutation(text: string, change: Mutation): string {
  const tokens = tokensOf(text);
  const pick = (index: number, of: readonly Token[] = tokens): Token | undefined => (of.length === 0 ? undefined : of[index % of.length]);
  const splice = (start: number, end: number, insert: string): string => text.slice(0, start) + insert + text.slice(end);
  switch (change.kind) {
    case 'delete': {
      const token = pick(change.token);
      return token === undefined ? text : splice(token.start, token.end, '');
    }
    case 'duplicate': {
      const token = pick(change.token);
      return token === undefined ? text : splice(token.end, token.end, ` ${token.text}`);
    }
    case 'swap': {
      const first = pick(change.first);
      const second = pick(change.second);
      if (first === undefined || second === undefined || first === second) return text;
      const [a, b] = first.start < second.start ? [first, second] : [second, first];
      return text.slice(0, a.start) + b.text + text.slice(a.end, b.start) + a.text + text.slice(b.end);
    }
    case 'truncate':
      return text.slice(0, Math.floor(change.at * text.length));
    case 'insert': {
      const at = Math.floor(change.at * text.length);
      return splice(at, at, change.text);
    }
    case 'replace-number': {
      const token = pick(change.token, tokens.filter((candidate) => candidate.kind === 'number'));
      return token === undefined ? text : splice(token.start, token.end, change.text);
    }
    case 'replace-name': {
      const token = pick(change.token, tokens.filter((candidate) => candidate.kind === 'word'));
      return token === undefined ? text : splice(token.start, token.end, change.text);
    }
  }
}

/** A text for a failure message: whole when short, else its start and end. */
export function clip(text: string, keep = 2_500): string {
  return text.length <= keep ? text : `${text.slice(0, keep / 2)}\n… (${text.length - keep} characters left out) …\n${text.slice(-keep / 2)}`;
}
