/**
 * The one HTML escaper, the Markdown escaper, and the stylesheet hash used by the exported report's
 * Content-Security-Policy (SHA-256 of FIPS 180-4, checked against Node's crypto as an independent implementation).
 */
import { createHash } from 'node:crypto';
import fc from 'fast-check';
import MarkdownIt from 'markdown-it';
import { describe, expect, it } from 'vitest';
import { escapeHtml, escapeMarkdownInline, truncateLabel } from '../../language/report/escape.js';
import { sha256Base64 } from '../../language/report/sha256.js';
import { decodeEntities } from './svg-query.js';

describe('escapeHtml', () => {
  it('escapes the five characters that matter in text and attributes', () => {
    expect(escapeHtml(`<a href="x">'&'</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;');
  });

  it('leaves no markup character and round-trips through entity decoding for any text', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary' }), (text) => {
        const escaped = escapeHtml(text);
        expect(escaped).not.toMatch(/[<>"']/);
        // Control characters are replaced; everything else comes back unchanged.
        // eslint-disable-next-line no-control-regex
        expect(decodeEntities(escaped)).toBe(text.replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/g, '\uFFFD'));
      }),
    );
  });
});

describe('escapeMarkdownInline', () => {
  const markdown = new MarkdownIt({ html: true });

  it('renders any text back as itself, inside a table cell, with no element other than the table', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'grapheme-ascii', maxLength: 40 }), (text) => {
        const rendered = markdown.render(`| a |\n| --- |\n| ${escapeMarkdownInline(text) || ' '} |\n`);
        const cell = /<td>([\s\S]*?)<\/td>/.exec(rendered)?.[1] ?? '';
        expect(cell).not.toMatch(/<[a-z]/i);
        expect(decodeEntities(cell).trim()).toBe(text.replace(/[\r\n]/g, ' ').trim());
      }),
      { numRuns: 400 },
    );
  });
});

describe('truncateLabel', () => {
  it('keeps whole code points and marks the cut', () => {
    expect(truncateLabel('abcdef', 4)).toBe('abc…');
    expect(truncateLabel('ab😀😀😀', 4)).toBe('ab😀…');
    expect(truncateLabel('abc', 4)).toBe('abc');
  });
});

describe('sha256Base64', () => {
  it('matches FIPS 180-4 test vectors and Node crypto for any text', () => {
    // FIPS 180-4 / NIST example "abc": ba7816bf 8f01cfea ... f20015ad.
    expect(Buffer.from(sha256Base64('abc'), 'base64').toString('hex')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    fc.assert(
      fc.property(fc.string({ unit: 'binary', maxLength: 300 }), (text) => {
        expect(sha256Base64(text)).toBe(createHash('sha256').update(text, 'utf8').digest('base64'));
      }),
      { numRuns: 300 },
    );
  });
});
