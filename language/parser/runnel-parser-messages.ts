/**
 * Syntax-error messages in plain words: "Expected a number here, but found '}'." instead of the parser
 * generator's token names and numbered token sequences.
 */
import { DefaultLexerErrorMessageProvider, LangiumParserErrorMessageProvider } from 'langium';
import type { IToken, TokenType } from 'chevrotain';
import { closestName } from '../validation/closest-name.js';

/** What each terminal is called in messages; keywords are quoted as written. */
const TERMINAL_WORDS: Readonly<Record<string, string>> = {
  NUMBER: 'a number',
  ID: 'a name',
  STRING: 'a quoted text',
  EOF: 'the end of the file',
};

/** What each block accepts, for the message when a line inside it is not recognised. */
const BLOCK_CONTENTS: Readonly<Record<string, { readonly block: string; readonly words: readonly string[] }>> = {
  RunnelFile: { block: 'a design', words: ['design', 'library', 'note', 'units', 'criteria', 'lining', 'section', 'flows', 'channel'] },
  Reach: { block: 'a reach', words: ['section', 'lining', 'slope', 'inverts', 'length', 'flows', 'criteria'] },
  Channel: { block: 'a channel', words: ['reach', 'flows', 'outlet'] },
  Section: { block: 'a section', words: ['bottom width', 'side slopes', 'bank height', 'diameter', 'top width'] },
  Lining: { block: 'a lining', words: ['n', 'permissible velocity', 'permissible shear', 'source'] },
  Criteria: { block: 'criteria', words: ['freeboard', 'avoid froude', 'minimum velocity', 'limit margin'] },
};

/** At most this many alternatives are listed; more than that is noise. */
const MAXIMUM_LISTED = 8;

export function describeToken(tokenType: TokenType): string {
  const name = tokenType.name.endsWith(':KW') ? tokenType.name.slice(0, -3) : tokenType.name;
  return TERMINAL_WORDS[name] ?? `'${name}'`;
}

function found(token: IToken | undefined): string {
  if (token === undefined || token.tokenType?.name === 'EOF' || token.image === '') return 'the end of the file';
  return `'${token.image}'`;
}

function listOf(descriptions: readonly string[]): string {
  const unique = [...new Set(descriptions)];
  const shown = unique.slice(0, MAXIMUM_LISTED);
  const more = unique.length > shown.length ? ', ...' : '';
  if (shown.length <= 1) return (shown[0] ?? 'something else') + more;
  return `${shown.slice(0, -1).join(', ')} or ${shown[shown.length - 1]}${more}`;
}

/** Langium marks rule names with an invisible suffix; compare on the letters only. */
function plainRuleName(ruleName: string): string {
  return ruleName.replace(/[^A-Za-z0-9_]/g, '');
}

function unrecognised(actual: IToken, contents: { readonly block: string; readonly words: readonly string[] }): string {
  const suggestion = closestName(actual.image, contents.words.map((words) => words.split(' ')[0] ?? words));
  const hint = suggestion === undefined ? '' : ` Did you mean '${suggestion}'?`;
  return `Unexpected ${found(actual)} in ${contents.block}, which takes ${listOf(contents.words.map((words) => `'${words}'`))}.${hint}`;
}

export class RunnelParserErrorMessages extends LangiumParserErrorMessageProvider {
  override buildMismatchTokenMessage({ expected, actual, ruleName }: { expected: TokenType; actual: IToken; previous: IToken; ruleName: string }): string {
    const contents = BLOCK_CONTENTS[plainRuleName(ruleName)];
    // A block's closing brace was expected: the line inside it was not recognised, so say what the block takes.
    if (contents !== undefined && describeToken(expected) === "'}'" && actual.tokenType?.name !== 'EOF') return unrecognised(actual, contents);
    return `Expected ${describeToken(expected)} here, but found ${found(actual)}.`;
  }

  override buildNotAllInputParsedMessage({ firstRedundant }: { firstRedundant: IToken; ruleName: string }): string {
    const contents = BLOCK_CONTENTS['RunnelFile'];
    return contents === undefined ? `Unexpected ${found(firstRedundant)}.` : unrecognised(firstRedundant, contents);
  }

  override buildNoViableAltMessage({ expectedPathsPerAlt, actual }: { expectedPathsPerAlt: TokenType[][][]; actual: IToken[]; previous: IToken; customUserDescription?: string; ruleName: string }): string {
    const firstTokens = expectedPathsPerAlt.flatMap((paths) => paths.map((path) => path[0])).filter((type): type is TokenType => type !== undefined);
    return `Unexpected ${found(actual[0])}: expected ${listOf(firstTokens.map(describeToken))}.`;
  }

  override buildEarlyExitMessage({ expectedIterationPaths, actual }: { expectedIterationPaths: TokenType[][]; actual: IToken[]; previous: IToken; customUserDescription?: string; ruleName: string }): string {
    const firstTokens = expectedIterationPaths.map((path) => path[0]).filter((type): type is TokenType => type !== undefined);
    return `Unexpected ${found(actual[0])}: expected ${listOf(firstTokens.map(describeToken))}.`;
  }
}

/** Characters the lexer cannot place, e.g. `#` or a stray `.`. */
export class RunnelLexerErrorMessages extends DefaultLexerErrorMessageProvider {
  override buildUnexpectedCharactersMessage(fullText: string, startOffset: number, length: number): string {
    const characters = fullText.substring(startOffset, startOffset + length);
    return `Unexpected character${length > 1 ? 's' : ''} '${characters}': Runnel does not use ${length > 1 ? 'them' : 'it'} here (a number needs digits after its decimal point, e.g. 2.0).`;
  }
}
