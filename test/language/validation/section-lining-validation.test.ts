/** Sections get the dimensions their shape needs; linings give Manning's n in a plausible range. */
import { describe, it } from 'vitest';
import { expectDiagnostic, expectNoDiagnostic } from '../language-test-kit.js';

describe('section-dimension-missing', () => {
  it('asks a trapezoid for its side slopes, at the section name', () =>
    expectDiagnostic({
      source: `design "T"\nsection <|ditch|> trapezoid { bottom width 2 ft  bank height 2 ft }`,
      code: 'section-dimension-missing',
      severity: 'error',
      message: 'A trapezoid needs side slopes: add `side slopes 3:1`.',
    }));
  it('asks a circle for its diameter', () =>
    expectDiagnostic({
      source: `design "T"\nsection <|pipe|> circle { }`,
      code: 'section-dimension-missing',
      severity: 'error',
      message: 'A circle needs a diameter: add `diameter 24 in`.',
    }));
  it('asks a parabola for a top width at a depth', () =>
    expectDiagnostic({
      source: `design "T"\nsection <|swale|> parabola { bank height 1 ft }`,
      code: 'section-dimension-missing',
      severity: 'error',
      message: 'A parabola needs a top width at a depth: add `top width 12 ft at depth 2 ft`.',
    }));
  it('accepts a complete section of each shape', () =>
    expectNoDiagnostic(
      [
        'design "T"',
        'section a rectangle { bottom width 2 ft  bank height 1 ft }',
        'section b trapezoid { bottom width 2 ft  side slopes 3:1, 2:1  bank height 1 ft }',
        'section c triangle { side slopes 4:1  bank height 1 ft }',
        'section d parabola { top width 12 ft at depth 2 ft  bank height 2 ft }',
        'section e circle { diameter 24 in }',
      ].join('\n'),
      'section-dimension-missing',
    ));
});

describe('section-dimension-not-applicable', () => {
  it('reports side slopes on a circle, saying what a circle takes', () =>
    expectDiagnostic({
      source: `design "T"\nsection pipe circle { diameter 24 in  <|side slopes 3:1|> }`,
      code: 'section-dimension-not-applicable',
      severity: 'error',
      message: 'A circle has no side slopes; a circle takes a diameter.',
    }));
  it('reports a bottom width on a triangle', () =>
    expectDiagnostic({
      source: `design "T"\nsection v triangle { side slopes 4:1  <|bottom width 2 ft|>  bank height 1 ft }`,
      code: 'section-dimension-not-applicable',
      severity: 'error',
      message: 'A triangle has no bottom width; a triangle takes side slopes and a bank height.',
    }));
});

describe('property-repeated in a section', () => {
  it('reports the second bottom width', () =>
    expectDiagnostic({
      source: `design "T"\nsection a rectangle { bottom width 2 ft  <|bottom width 3 ft|>  bank height 1 ft }`,
      code: 'property-repeated',
      severity: 'error',
      message: "The bottom width is given twice in section 'a'; remove one.",
    }));
});

describe('side-slope-invalid', () => {
  it('reports a side slope with no vertical part', () =>
    expectDiagnostic({
      source: `design "T"\nsection a trapezoid { bottom width 2 ft  side slopes 3:1, <|3:0|>  bank height 1 ft }`,
      code: 'side-slope-invalid',
      severity: 'error',
      message: 'A side slope is horizontal:vertical with a vertical part above zero and a horizontal part of zero or more, e.g. 3:1.',
    }));
  it('reports a triangle with both sides vertical', () =>
    expectDiagnostic({
      source: `design "T"\nsection v triangle { <|side slopes 0:1|>  bank height 1 ft }`,
      code: 'side-slope-invalid',
      severity: 'error',
      message: 'A triangle with both sides vertical (0:1) has no width.',
    }));
  it('accepts a vertical wall on one side of a trapezoid', () =>
    expectNoDiagnostic(`design "T"\nsection a trapezoid { bottom width 2 ft  side slopes 0:1, 2:1  bank height 1 ft }`, 'side-slope-invalid'));
});

describe('bank-height-missing', () => {
  it('warns that over-topping cannot be checked', () =>
    expectDiagnostic({
      source: `design "T"\nsection <|a|> rectangle { bottom width 2 ft }`,
      code: 'bank-height-missing',
      severity: 'warning',
      message: "Section 'a' has no bank height, so over-topping and freeboard are not checked: add `bank height ...`.",
    }));
  it('does not ask a pipe for a bank height', () => expectNoDiagnostic(`design "T"\nsection p circle { diameter 24 in }`, 'bank-height-missing'));
});

describe('linings', () => {
  it("asks for Manning's n at the lining name", () =>
    expectDiagnostic({
      source: `design "T"\nlining <|turf|> { permissible shear 1 psf }`,
      code: 'manning-n-missing',
      severity: 'error',
      message: "Lining 'turf' needs Manning's n, e.g. `n 0.035`.",
    }));
  it("warns of an n outside the usual range (common practice)", () =>
    expectDiagnostic({
      source: `design "T"\nlining turf { n <|0.35|> }`,
      code: 'manning-n-unusual',
      severity: 'warning',
      message: "Manning's n 0.35 is outside the usual range 0.009 to 0.2 (Chow (1959) Open-Channel Hydraulics, Table 5-6; range from memory): check for a misplaced decimal point.",
    }));
  it('accepts a typical n', () => expectNoDiagnostic(`design "T"\nlining turf { n 0.035 }`, 'manning-n-unusual'));
  it('reports a repeated property', () =>
    expectDiagnostic({
      source: `design "T"\nlining turf { n 0.035  <|n 0.04|> }`,
      code: 'property-repeated',
      severity: 'error',
      message: "Manning's n is given twice in lining 'turf'; remove one.",
    }));
});
