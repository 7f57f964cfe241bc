/**
 * Turns token text into AST values. Runnel strings are single-line and have no escapes; a string missing its
 * closing quote runs to the end of its line (the lexer accepts it so that one missing quote does not derail the
 * rest of the file) and validation reports it at the string.
 */
import { DefaultValueConverter, type CstNode, type GrammarAST, type ValueType } from 'langium';

export class RunnelValueConverter extends DefaultValueConverter {
  protected override runConverter(rule: GrammarAST.AbstractRule, input: string, cstNode: CstNode): ValueType {
    if (rule.name === 'STRING') return stringContent(input);
    return super.runConverter(rule, input, cstNode);
  }
}

/** The text between the quotes; tolerates a missing closing quote. */
export function stringContent(tokenText: string): string {
  const withoutOpening = tokenText.startsWith('"') ? tokenText.slice(1) : tokenText;
  return isClosedString(tokenText) ? withoutOpening.slice(0, -1) : withoutOpening;
}

/** True when the token text has both its quotes. */
export function isClosedString(tokenText: string): boolean {
  return tokenText.length >= 2 && tokenText.startsWith('"') && tokenText.endsWith('"');
}
