/** The file as a whole: header, display units, library contents, unclosed strings, syntax errors. */
import { describe, it } from 'vitest';
import { BASE, CHANNEL, expectDiagnostic, expectNoDiagnostic } from '../language-test-kit.js';

describe('string-not-closed', () => {
  it('reports a title missing its closing quote, to the end of the line', () =>
    expectDiagnostic({
      source: `design <|"East ditch|>\nunits US`,
      code: 'string-not-closed',
      severity: 'error',
      message: 'This text has no closing quote: add " before the end of the line.',
    }));
  it('keeps parsing the next line after an unclosed string', () => expectNoDiagnostic(`design "East ditch\nunits US`, 'parsing-error'));
  it('accepts closed strings', () => expectNoDiagnostic(`design "East ditch"\nnote "Invented"`, 'string-not-closed'));
});

describe('header-missing', () => {
  it('warns at the first word of a file without a header', () =>
    expectDiagnostic({
      source: `<|units|> US\nlining l { n 0.03 }`,
      code: 'header-missing',
      severity: 'warning',
      message: 'A Runnel file starts with `design "title"` (a design) or `library "title"` (shared linings and sections).',
    }));
  it('says nothing about an empty file', () => expectNoDiagnostic('', 'header-missing'));
  it('accepts a library header', () => expectNoDiagnostic('library "Shared"\nlining l { n 0.03 }', 'header-missing'));
});

describe('units-setting-unknown', () => {
  it('suggests US for Us', () =>
    expectDiagnostic({
      source: `design "T"\nunits <|Us|>`,
      code: 'units-setting-unknown',
      severity: 'error',
      message: "Unknown display units 'Us': write `units SI` or `units US`. Did you mean 'US'?",
    }));
  it('accepts SI', () => expectNoDiagnostic(`design "T"\nunits SI`, 'units-setting-unknown'));
  it('reports a second setting', () =>
    expectDiagnostic({
      source: `design "T"\nunits SI\n<|units US|>`,
      code: 'property-repeated',
      severity: 'error',
      message: 'The units setting is given twice in this file; remove one.',
    }));
});

describe('library-holds-definitions-only', () => {
  it('reports a channel in a library at its keyword', () =>
    expectDiagnostic({
      source: `library "Shared"\nlining grass { n 0.035 }\nsection ditch rectangle { bottom width 2 ft bank height 1 ft }\n<|channel|> c { reach r { section ditch lining grass slope 1 % length 10 ft } }`,
      code: 'library-holds-definitions-only',
      severity: 'error',
      message: 'A library holds linings and sections only; move this channel to a design file.',
    }));
  it('allows the same channel in a design', () => expectNoDiagnostic(`${BASE}\n${CHANNEL}`, 'library-holds-definitions-only'));
});

describe('syntax errors', () => {
  it('says what a reach takes when a line is not recognised, with a suggestion', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c { reach r { section ditch lining grass <|slop|> 1 % length 10 ft } }`,
      code: 'parsing-error',
      severity: 'error',
      message: "Unexpected 'slop' in a reach, which takes 'section', 'lining', 'slope', 'inverts', 'length', 'flows' or 'criteria'. Did you mean 'slope'?",
    }));
  it('names the expected token in words', () =>
    expectDiagnostic({
      source: `design "T"\nsection s circle { diameter <|}|>`,
      code: 'parsing-error',
      severity: 'error',
      message: "Expected a number here, but found '}'.",
    }));
  it('reports a number with a trailing decimal point as a lexing error at the point', () =>
    expectDiagnostic({
      source: `design "T"\nsection s circle { diameter 3<|.|> ft }`,
      code: 'lexing-error',
      severity: 'error',
      message: "Unexpected character '.': Runnel does not use it here (a number needs digits after its decimal point, e.g. 2.0).",
    }));
});
