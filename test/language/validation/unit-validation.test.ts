/**
 * Numbers and units: a missing, unknown or wrong-dimension unit is an error at the number (or its unit), naming
 * what is expected and the units accepted; impossible values are errors at the value.
 */
import { describe, it } from 'vitest';
import { BASE, CHANNEL, expectDiagnostic, expectNoDiagnostic } from '../language-test-kit.js';

const LENGTH_UNITS = 'm, km, cm, mm, ft, in or mi';
const DISCHARGE_UNITS = 'm3/s, L/s, cfs, gpm or MGD';

describe('unit-missing', () => {
  it('reports a bottom width without a unit at the number', () =>
    expectDiagnostic({
      source: `design "T"\nsection s rectangle { bottom width <|4|>  bank height 2 ft }`,
      code: 'unit-missing',
      severity: 'error',
      message: `Missing unit: the bottom width needs a unit of length (${LENGTH_UNITS}).`,
    }));
  it('accepts the same width with a unit', () => expectNoDiagnostic(`design "T"\nsection s rectangle { bottom width 4 ft  bank height 2 ft }`, 'unit-missing'));
  it('names the flow whose discharge lacks a unit', () =>
    expectDiagnostic({
      source: `design "T"\nflows { q10 = <|120|> "10-year"  q100 = 260 cfs }`,
      code: 'unit-missing',
      severity: 'error',
      message: `Missing unit: the discharge of flow 'q10' needs a unit of discharge (${DISCHARGE_UNITS}).`,
    }));
  it('reports a reach length without a unit', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c { reach r { section ditch lining grass slope 1 % length <|300|> } outlet free fall }`,
      code: 'unit-missing',
      severity: 'error',
      message: `Missing unit: the length needs a unit of length (${LENGTH_UNITS}).`,
    }));
});

describe('unit-unknown', () => {
  it('reports an unknown unit at the unit and suggests the nearest of the right dimension', () =>
    expectDiagnostic({
      source: `design "T"\nsection s rectangle { bottom width 4 <|fts|>  bank height 2 ft }`,
      code: 'unit-unknown',
      severity: 'error',
      message: `Unknown unit 'fts': the bottom width needs a unit of length (${LENGTH_UNITS}). Did you mean 'ft'?`,
    }));
  it('suggests a unit that differs only in letter case', () =>
    expectDiagnostic({
      source: `design "T"\nflows { q10 = 120 <|CFS|> }`,
      code: 'unit-unknown',
      severity: 'error',
      message: `Unknown unit 'CFS': the discharge of flow 'q10' needs a unit of discharge (${DISCHARGE_UNITS}). Did you mean 'cfs'?`,
    }));
  it('gives no suggestion when nothing is close', () =>
    expectDiagnostic({
      source: `design "T"\nflows { q10 = 120 <|furlongs|> }`,
      code: 'unit-unknown',
      severity: 'error',
      message: `Unknown unit 'furlongs': the discharge of flow 'q10' needs a unit of discharge (${DISCHARGE_UNITS}).`,
    }));
  it('covers both parts of a compound unit', () =>
    expectDiagnostic({
      source: `design "T"\nlining l { n 0.03  permissible velocity 5 <|ft/sec|> }`,
      code: 'unit-unknown',
      severity: 'error',
      message: "Unknown unit 'ft/sec': the permissible velocity needs a unit of velocity (m/s or ft/s). Did you mean 'ft/s'?",
    }));
  it('accepts every spelling in the unit table, e.g. ft3/s, gal/min and lb/ft2', () =>
    expectNoDiagnostic(`design "T"\nflows { a = 1 ft3/s  b = 400 gal/min }\nlining l { n 0.03  permissible shear 1 lb/ft2 }`, 'unit-unknown'));
});

describe('unit-wrong-dimension', () => {
  it('reports a discharge unit on a length', () =>
    expectDiagnostic({
      source: `design "T"\nsection s circle { diameter 36 <|cfs|> }`,
      code: 'unit-wrong-dimension',
      severity: 'error',
      message: `'cfs' is a unit of discharge, but the diameter needs a unit of length (${LENGTH_UNITS}).`,
    }));
  it('reports a length unit on a slope', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c { reach r { section ditch lining grass slope 0.5 <|ft|> length 100 ft } outlet free fall }`,
      code: 'unit-wrong-dimension',
      severity: 'error',
      message: "'ft' is a unit of length, but the slope needs a unit of slope (m/m, ft/ft, % or permille).",
    }));
  it('accepts a slope in per mille, percent or a ratio', () =>
    expectNoDiagnostic(
      `${BASE}\nchannel c { reach a { section ditch lining grass slope 5 permille length 100 ft } reach b { section ditch lining grass slope 0.005 ft/ft length 100 ft } outlet free fall }`,
      'unit-wrong-dimension',
    ));
});

describe('value-not-positive and value-negative', () => {
  it('reports a zero bottom width at the whole quantity', () =>
    expectDiagnostic({
      source: `design "T"\nsection s rectangle { bottom width <|0 ft|>  bank height 2 ft }`,
      code: 'value-not-positive',
      severity: 'error',
      message: 'The bottom width must be greater than zero.',
    }));
  it('reports a negative discharge', () =>
    expectDiagnostic({
      source: `design "T"\nflows { q10 = <|-5 cfs|> }`,
      code: 'value-not-positive',
      severity: 'error',
      message: "The discharge of flow 'q10' must be greater than zero.",
    }));
  it("reports a Manning's n of zero", () =>
    expectDiagnostic({
      source: `design "T"\nlining l { n <|0|> }`,
      code: 'value-not-positive',
      severity: 'error',
      message: "Manning's n must be greater than zero.",
    }));
  it('allows a freeboard of zero but not below', async () => {
    await expectNoDiagnostic(`design "T"\ncriteria { freeboard 0 ft }`, 'value-negative');
    await expectDiagnostic({
      source: `design "T"\ncriteria { freeboard <|-0.5 ft|> }`,
      code: 'value-negative',
      severity: 'error',
      message: 'The freeboard cannot be negative.',
    });
  });
  it('allows negative elevations (below datum)', () =>
    expectNoDiagnostic(`${BASE}\nchannel c { reach r { section ditch lining grass inverts -1.5 m to -2.0 m length 100 m } outlet water level -3 m }`, 'value-not-positive'));
  it('reports a number too large to compute with', () =>
    expectDiagnostic({
      source: `design "T"\nflows { q10 = <|1e999|> cfs }`,
      code: 'number-too-large',
      severity: 'error',
      message: 'This number is too large to compute with.',
    }));
});

describe('a valid design', () => {
  it('has no unit diagnostics', async () => {
    for (const code of ['unit-missing', 'unit-unknown', 'unit-wrong-dimension', 'value-not-positive']) await expectNoDiagnostic(`${BASE}\n${CHANNEL}`, code);
  });
});
