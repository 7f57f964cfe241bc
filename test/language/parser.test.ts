/** The syntax: numbers, side slopes, units, names, comments, strings, and recovery from errors. */
import { describe, expect, it } from 'vitest';
import { isChannel, isFlowTable, isFroudeBandCriterion, isCriteria, isReach, isSection, isSideSlopes, type RunnelFile } from '../../language/generated/ast.js';
import { BASE, buildText, plainDiagnostics } from './language-test-kit.js';

async function parse(text: string): Promise<RunnelFile> {
  const document = await buildText(text);
  expect(document.parseResult.lexerErrors).toEqual([]);
  expect(document.parseResult.parserErrors).toEqual([]);
  return document.parseResult.value;
}

describe('numbers', () => {
  it('reads a band written `0.89 to 1.13` and a leading-dot number', async () => {
    const file = await parse('design "T"\ncriteria { avoid froude .89 to 1.13 }');
    const band = file.members.filter(isCriteria)[0]?.items.find(isFroudeBandCriterion);
    expect(band?.low).toBe(0.89);
    expect(band?.high).toBe(1.13);
  });
  it('reads signed and exponent numbers', async () => {
    const file = await parse('design "T"\nflows { a = 1.5e2 cfs  b = +2 cfs }');
    const flows = file.members.filter(isFlowTable)[0]?.flows ?? [];
    expect(flows.map((flow) => flow.discharge?.value)).toEqual([150, 2]);
  });
  it('reads side slopes H:V, one or two', async () => {
    const file = await parse('design "T"\nsection a trapezoid { bottom width 2 ft  side slopes 3:1, 2.5:1 }\nsection b triangle { side slopes 4:1 }');
    const slopes = file.members.filter(isSection).map((section) => section.properties.find(isSideSlopes));
    expect(slopes[0]?.left).toMatchObject({ horizontal: 3, vertical: 1 });
    expect(slopes[0]?.right).toMatchObject({ horizontal: 2.5, vertical: 1 });
    expect(slopes[1]?.right).toBeUndefined();
  });
});

describe('units and names', () => {
  it('reads compound units and percent signs as written', async () => {
    const file = await parse('design "T"\nflows { a = 1 m3/s  b = 2 L/s  c = 3 ft3/s }');
    expect(file.members.filter(isFlowTable)[0]?.flows.map((flow) => flow.discharge?.unit)).toEqual(['m3/s', 'L/s', 'ft3/s']);
  });
  it('lets reaches and flows be named like units (m, in) or like keywords (outlet, top, n)', async () => {
    const file = await parse(`${BASE}\nflows { in = 3 cfs  top = 4 cfs  n = 5 cfs }\nchannel m { reach in { section ditch lining grass slope 1 % length 10 ft } reach outlet { section ditch lining grass slope 1 % length 10 ft } outlet free fall }`);
    const channel = file.members.find(isChannel);
    expect(channel?.name).toBe('m');
    expect(channel?.members.filter(isReach).map((reach) => reach.name)).toEqual(['in', 'outlet']);
  });
  it('tells a unit from the next flow name by the `=` that follows a name', async () => {
    const file = await parse('design "T"\nflows { q10 = 120 cfs q100 = 260 cfs }');
    expect(file.members.filter(isFlowTable)[0]?.flows.map((flow) => [flow.name, flow.discharge?.value, flow.discharge?.unit])).toEqual([
      ['q10', 120, 'cfs'],
      ['q100', 260, 'cfs'],
    ]);
  });
  it('accepts hyphenated names', async () => {
    const file = await parse('library "L"\nlining riprap-6in { n 0.033 }');
    expect(file.members[0]).toMatchObject({ name: 'riprap-6in' });
  });
});

describe('comments and strings', () => {
  it('ignores line and block comments', async () => {
    const file = await parse('// heading\ndesign "T" /* inline */\nnote "a // not a comment"');
    expect(file.header?.title).toBe('T');
    expect(file.members[0]).toMatchObject({ text: 'a // not a comment' });
  });
  it('keeps the text of a string with no closing quote', async () => {
    const document = await buildText('design "Open title\nunits US');
    expect(document.parseResult.value.header?.title).toBe('Open title');
    expect(plainDiagnostics(document).map((diagnostic) => diagnostic.code)).toEqual(['string-not-closed']);
  });
});

describe('recovery', () => {
  it('keeps the reaches after a broken one', async () => {
    const document = await buildText(`${BASE}\nchannel c {\n reach a { section ditch lining grass slop 1 % length 10 ft }\n reach b { section ditch lining grass slope 1 % length 10 ft }\n outlet free fall\n}`);
    const channel = document.parseResult.value.members.find(isChannel);
    expect(channel?.members.filter(isReach).map((reach) => reach.name)).toEqual(['a', 'b']);
  });
});
