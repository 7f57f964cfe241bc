/** Reaches, channels, flows and criteria blocks. */
import { describe, expect, it } from 'vitest';
import { BASE, CHANNEL, buildText, expectDiagnostic, expectNoDiagnostic, marked, plainDiagnostics } from '../language-test-kit.js';

describe('reach-incomplete', () => {
  it('asks for a lining at the reach name', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c { reach <|r|> { section ditch slope 1 % length 10 ft } outlet free fall }`,
      code: 'reach-incomplete',
      severity: 'error',
      message: "Reach 'r' needs a lining: add `lining name`.",
    }));
  it('asks for a slope or inverts', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c { reach <|r|> { section ditch lining grass length 10 ft } outlet free fall }`,
      code: 'reach-incomplete',
      severity: 'error',
      message: "Reach 'r' needs a slope or inverts: add `slope 0.5 %` or `inverts 101.2 ft to 100.4 ft`.",
    }));
  it('accepts inverts in place of a slope', () =>
    expectNoDiagnostic(`${BASE}\nchannel c { reach r { section ditch lining grass inverts 101.2 ft to 100.4 ft length 100 ft } outlet free fall }`, 'reach-incomplete'));
});

describe('slope-and-inverts and property-repeated', () => {
  it('reports inverts given after a slope', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c { reach r { section ditch lining grass slope 1 % <|inverts 2 ft to 1 ft|> length 100 ft } outlet free fall }`,
      code: 'slope-and-inverts',
      severity: 'error',
      message: 'Give either a slope or inverts, not both.',
    }));
  it('reports a second length', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c { reach r { section ditch lining grass slope 1 % length 100 ft <|length 90 ft|> } outlet free fall }`,
      code: 'property-repeated',
      severity: 'error',
      message: "The length is given twice in reach 'r'; remove one.",
    }));
});

describe('slope-not-falling', () => {
  it('warns at a horizontal slope', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c { reach r { section ditch lining grass slope <|0 %|> length 100 ft } outlet free fall }`,
      code: 'slope-not-falling',
      severity: 'warning',
      message: 'A slope of 0 % is horizontal: there is no normal depth, so uniform-flow checks are skipped for this reach.',
    }));
  it('warns at inverts that rise downstream, stating the slope in display units', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c { reach r { section ditch lining grass <|inverts 100 ft to 101 ft|> length 200 ft } outlet free fall }`,
      code: 'slope-not-falling',
      severity: 'warning',
      message: 'A slope of -0.5 % rises downstream (adverse): there is no normal depth, so uniform-flow checks are skipped for this reach.',
    }));
  it('says nothing of a falling bed', () => expectNoDiagnostic(`${BASE}\n${CHANNEL}`, 'slope-not-falling'));
});

describe('channels and flows', () => {
  it('reports a flow with no discharge in a channel, at the channel name', () =>
    expectDiagnostic({
      source: `${BASE.replace('q10 = 10 cfs "10-year"', 'q10 = 10 cfs  q100 "100-year"')}\nchannel <|c|> { reach r { section ditch lining grass slope 1 % length 10 ft } outlet free fall }`,
      code: 'flow-discharge-missing',
      severity: 'error',
      message: "Flow 'q100' has no discharge in channel 'c': give one in the flow table (`q100 = ...`) or in the channel's `flows { }`.",
    }));
  it('names the reaches above the first that gives a discharge', () =>
    expectDiagnostic({
      source: `${BASE.replace('q10 = 10 cfs "10-year"', 'q10 = 10 cfs  q100 "100-year"')}\nchannel <|c|> {\n reach a { section ditch lining grass slope 1 % length 10 ft }\n reach b { section ditch lining grass slope 1 % length 10 ft flows { q100 = 30 cfs } }\n outlet free fall }`,
      code: 'flow-discharge-missing',
      severity: 'error',
      message: "Flow 'q100' has no discharge in reach 'a' of channel 'c': give one in the flow table (`q100 = ...`) or in the channel's `flows { }`.",
    }));
  it("accepts a discharge given in the channel's flows", () =>
    expectNoDiagnostic(
      `${BASE.replace('q10 = 10 cfs "10-year"', 'q10 = 10 cfs  q100 "100-year"')}\nchannel c { flows { q100 = 30 cfs } reach a { section ditch lining grass slope 1 % length 10 ft } outlet free fall }`,
      'flow-discharge-missing',
    ));
  it('warns when a design has no flows', () =>
    expectDiagnostic({
      source: `design "T"\nsection ditch rectangle { bottom width 2 ft bank height 1 ft }\nlining grass { n 0.03 }\nchannel <|c|> { reach r { section ditch lining grass slope 1 % length 10 ft } outlet free fall }`,
      code: 'no-flows',
      severity: 'warning',
      message: "No flows are defined, so channel 'c' is not checked: add `flows { q10 = ... }`.",
    }));
  it('reports a flow given twice in one flows block', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c { flows { q10 = 5 cfs  <|q10 = 6 cfs|> } reach r { section ditch lining grass slope 1 % length 10 ft } outlet free fall }`,
      code: 'property-repeated',
      severity: 'error',
      message: "Flow 'q10' is given twice in this flows block; remove one.",
    }));
  it('warns of a channel without reaches', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel <|empty|> { outlet free fall }`,
      code: 'channel-has-no-reaches',
      severity: 'warning',
      message: "Channel 'empty' has no reaches: add `reach name { ... }`.",
    }));
  it('notes a channel without an outlet condition', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel <|c|> { reach r { section ditch lining grass slope 1 % length 10 ft } }`,
      code: 'outlet-missing',
      severity: 'info',
      message: "Channel 'c' has no outlet condition: add `outlet free fall`, `outlet normal depth` or `outlet water level ...`.",
    }));
  it('reports a second outlet', () =>
    expectDiagnostic({
      source: `${BASE}\nchannel c { reach r { section ditch lining grass slope 1 % length 10 ft } outlet free fall <|outlet normal depth|> }`,
      code: 'property-repeated',
      severity: 'error',
      message: "The outlet condition is given twice in channel 'c'; remove one.",
    }));
});

describe('criteria', () => {
  it('reports a Froude band that runs downward', () =>
    expectDiagnostic({
      source: `design "T"\ncriteria { <|avoid froude 1.13 to 0.89|> }`,
      code: 'froude-band-invalid',
      severity: 'error',
      message: 'The Froude band runs from a lower to a higher number, both zero or more, e.g. `avoid froude 0.89 to 1.13`.',
    }));
  it('accepts the HEC-11 band written with a leading-dot number', () => expectNoDiagnostic(`design "T"\ncriteria { avoid froude .89 to 1.13 }`, 'froude-band-invalid'));
  it("warns of a USBR coefficient outside the published 1.5-2.5 ft (Chow 1959, Ch. 7; confirmed)", () =>
    expectDiagnostic({
      source: `design "T"\ncriteria { freeboard usbr coefficient <|4 ft|> }`,
      code: 'usbr-coefficient-unusual',
      severity: 'warning',
      message:
        "The USBR rule's C runs from 1.5 ft (0.457 m) at 20 cfs to 2.5 ft (0.762 m) at 3,000 cfs (USBR freeboard rule F = sqrt(C y), quoted in Chow (1959) Open-Channel Hydraulics, Ch. 7); 4 ft is outside that range.",
    }));
  it('accepts the published SI end values 0.46 m and 0.76 m', async () => {
    await expectNoDiagnostic(`design "T"\ncriteria { freeboard usbr coefficient 0.46 m }`, 'usbr-coefficient-unusual');
    await expectNoDiagnostic(`design "T"\ncriteria { freeboard usbr coefficient 0.76 m }`, 'usbr-coefficient-unusual');
  });
  it('reports a negative limit margin at the number', () =>
    expectDiagnostic({
      source: `design "T"\ncriteria { limit margin <|-5|> % }`,
      code: 'value-negative',
      severity: 'error',
      message: 'The limit margin cannot be negative.',
    }));
  it('reports a criterion given twice in a block', () =>
    expectDiagnostic({
      source: `design "T"\ncriteria { freeboard 1 ft  <|freeboard usbr|> }`,
      code: 'property-repeated',
      severity: 'error',
      message: 'The freeboard is given twice in this criteria block; remove one.',
    }));
});

describe('a flow a closed conduit can never carry (reported from the analysis)', () => {
  // Circle D = 0.6 m, n = 0.013, S = 0.01: Qfull = (1/n)(pi D^2/4)(D/4)^(2/3) S^(1/2) (closed form, derived) and
  // Qmax = 1.07571 Qfull (REFERENCES.md P2, Chow 1959 Ch. 6; from memory, high).
  const fullCapacity = (1 / 0.013) * ((Math.PI * 0.6 ** 2) / 4) * (0.6 / 4) ** (2 / 3) * Math.sqrt(0.01);
  const source = (dischargeM3s: number): string =>
    `design "T"\nunits SI\nflows { q = ${dischargeM3s} m3/s }\nsection pipe circle { diameter 0.6 m }\nlining concrete { n 0.013 }\nchannel c { reach <|r|> { section pipe lining concrete slope 1 % length 50 m } outlet free fall }`;

  it('is an error at the reach name, stating the capacities', async () => {
    const { text, ranges } = marked(source(1.0));
    const diagnostics = plainDiagnostics(await buildText(text)).filter((diagnostic) => diagnostic.code === 'conduit-over-capacity');
    expect(diagnostics).toHaveLength(1);
    expect(diagnostics[0]?.severity).toBe('error');
    expect(diagnostics[0]?.range).toEqual(ranges[0]);
    const match = /^q \(1 m3\/s\) is more than conduit 'pipe' can carry in open-channel flow: its largest uniform-flow capacity is ([\d.]+) m3\/s \(([\d.]+) m3\/s flowing full\)\. It would flow under pressure\.$/.exec(diagnostics[0]?.message ?? '');
    expect(match, diagnostics[0]?.message).not.toBeNull();
    expect(Math.abs(Number(match?.[1]) / (1.07571 * fullCapacity) - 1)).toBeLessThan(0.005);
    expect(Math.abs(Number(match?.[2]) / fullCapacity - 1)).toBeLessThan(0.005);
  });
  it('is not reported for a flow the pipe carries partly full', async () => {
    const document = await buildText(marked(source(0.5 * fullCapacity)).text);
    expect(plainDiagnostics(document).map((diagnostic) => diagnostic.code)).not.toContain('conduit-over-capacity');
  });
});
