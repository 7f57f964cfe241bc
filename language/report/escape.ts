/**
 * The one escaping helper for every name, title, note and message that reaches HTML or SVG output, plus the
 * Markdown cell escaper built on it. Text from a design file is never trusted: it may contain markup, quotes,
 * ampersands or `</style>`, and the report must show it as text, never run it.
 */

const HTML_ENTITIES: Readonly<Record<string, string>> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};

/**
 * Control characters other than tab, line feed and carriage return are not allowed in XML (inline SVG) and are
 * rewritten by HTML parsers; they are shown as the replacement character instead.
 */
// eslint-disable-next-line no-control-regex
const DISALLOWED_CONTROL_CHARACTERS = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/g;

/** Quick checks: most names and numbers need no escaping, and a report holds hundreds of thousands of them. */
// eslint-disable-next-line no-control-regex
const NEEDS_HTML_ESCAPE = /[&<>"'\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/;
// eslint-disable-next-line no-control-regex
const NEEDS_MARKDOWN_ESCAPE = /[\\`*[\]|~<>_&\r\n\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/;

/** Escapes text for HTML and SVG element content and for double- or single-quoted attribute values. */
export function escapeHtml(text: string): string {
  const value = String(text);
  if (!NEEDS_HTML_ESCAPE.test(value)) return value;
  return value
    .replace(DISALLOWED_CONTROL_CHARACTERS, '\uFFFD')
    .replace(/[&<>"']/g, (character) => HTML_ENTITIES[character] ?? character);
}

/**
 * Markdown characters that could open markup inside a line: code, emphasis, links, table cells, strike-through
 * and HTML or autolinks; an underscore only where it can start or end emphasis (not inside a word, so `q_100`
 * stays readable on a terminal); an ampersand only where it would start a character reference.
 */
const MARKDOWN_SPECIAL = /[\\`*[\]|~<>]|_(?![A-Za-z0-9])|(?<![A-Za-z0-9])_|&(?=#?[A-Za-z0-9]+;)/g;

/**
 * Escapes text for one line of Markdown (a table cell, a list item, a heading) so that it renders as the same
 * text and nothing else, even in a renderer that passes HTML through: markup characters are backslash-escaped
 * (CommonMark allows it for any ASCII punctuation), an ampersand that would start an entity becomes `&amp;`, and
 * line breaks become spaces so a table row stays one row. Plain words stay plain for terminal readers.
 */
export function escapeMarkdownInline(text: string): string {
  const value = String(text);
  if (!NEEDS_MARKDOWN_ESCAPE.test(value)) return value;
  return value
    .replace(/\r\n|\r|\n/g, ' ')
    .replace(DISALLOWED_CONTROL_CHARACTERS, '\uFFFD')
    .replace(MARKDOWN_SPECIAL, (match) => (match === '&' ? '&amp;' : `\\${match}`));
}

/**
 * Shortens a label for a drawing to at most `maxCharacters` characters (whole code points, so a surrogate pair is
 * never split), ending with an ellipsis when cut. Escape the result afterwards, never before.
 */
export function truncateLabel(text: string, maxCharacters: number): string {
  const codePoints = Array.from(String(text));
  if (codePoints.length <= maxCharacters) return codePoints.join('');
  return `${codePoints.slice(0, Math.max(1, maxCharacters - 1)).join('')}…`;
}
