/**
 * Grammar-valid Runnel designs at random, as a fast-check arbitrary, with what each one says in SI worked out here
 * (so a test can compare the analysis with the text it was given, not with the code's own reading of it).
 *
 * A design has a title, notes, an optional `units` line and criteria block, sections of every shape, linings
 * (in the design or in a separate library file), a flow table, and channels whose reaches use them, with flows
 * changed per channel or per reach, slopes or inverts, reach criteria and an outlet. Members come in any order, in
 * any unit of the right dimension, laid out on one line or many. Names are unique; a few are words the grammar
 * also uses as keywords (a reach may be called `outlet`). Values are realistic but wide; see the ranges below.
 *
 * Unit factors are the exact definitions (NIST SP 811, App. B; NIST Handbook 44, App. C), written here on purpose
 * rather than read from language/units.
 */
import fc from 'fast-check';
import type { ShapeDimensions } from '../../.scripts/engine-soak.js';

const FOOT = 0.3048;
const INCH = 0.0254;
const GALLON = 231 * INCH ** 3;
const POUND_FORCE = 0.45359237 * 9.80665;

const UNITS = {
  length: { m: 1, cm: 0.01, mm: 0.001, ft: FOOT, in: INCH },
  discharge: { 'm3/s': 1, cms: 1, 'L/s': 0.001, 'l/s': 0.001, cfs: FOOT ** 3, 'ft3/s': FOOT ** 3, gpm: GALLON / 60, 'gal/min': GALLON / 60, MGD: (1e6 * GALLON) / 86_400 },
  velocity: { 'm/s': 1, 'ft/s': FOOT, fps: FOOT },
  slope: { 'm/m': 1, 'ft/ft': 1, '%': 0.01, permille: 0.001, '‰': 0.001 },
  shear: { Pa: 1, 'N/m2': 1, kPa: 1000, psf: POUND_FORCE / FOOT ** 2, 'lb/ft2': POUND_FORCE / FOOT ** 2 },
} as const;
type Dimension = keyof typeof UNITS;

/** Words the grammar lets a name be although they are keywords elsewhere (the `Name` rule). */
const KEYWORD_NAMES = ['outlet', 'source', 'note', 'normal', 'free', 'water', 'level', 'depth', 'top', 'bottom', 'side', 'bank', 'length', 'slope', 'width', 'velocity', 'shear', 'margin', 'limit', 'minimum', 'n', 'fall', 'height', 'diameter', 'none', 'm', 'ft', 'in', 'cfs'] as const;
const NAME_STEMS = ['ditch', 'swale', 'canal', 'pipe', 'chute', 'upper', 'lower', 'q', 'storm', 'grass', 'rock', 'earth', 'v', 'culvert', 'apron', 'x_1', 'Reach', 'A'] as const;

/** What a generated reach should resolve to, SI. */
export interface ExpectedReach {
  readonly channel: string;
  readonly name: string;
  readonly dimensions: ShapeDimensions;
  readonly bankHeightM: number | null;
  readonly manningN: number;
  readonly slope: number;
  readonly lengthM: number;
  /** Flow name to discharge in this reach, m3/s, in the order of the flow table. */
  readonly flows: readonly { readonly name: string; readonly dischargeM3s: number }[];
}

export interface GeneratedDesign {
  /** The design file. */
  readonly text: string;
  /** A library file with the linings, when the design keeps them apart; else undefined. */
  readonly library: string | undefined;
  readonly reaches: readonly ExpectedReach[];
}

/** A number written with a few significant digits, in a random unit of the dimension; and its SI value. */
interface Written {
  readonly text: string;
  readonly valueSI: number;
}

const digits = fc.integer({ min: 2, max: 5 });

function writeNumber(value: number, significant: number): string {
  // Plain decimals mostly; the exponent form the grammar also accepts now and then.
  const text = Number(value.toPrecision(significant)).toString();
  return text;
}

function quantityArbitrary(dimension: Dimension, lowSI: number, highSI: number): fc.Arbitrary<Written> {
  const spellings = Object.keys(UNITS[dimension]) as (keyof (typeof UNITS)[typeof dimension])[];
  return fc
    .tuple(fc.double({ min: Math.log(lowSI), max: Math.log(highSI), noNaN: true }), fc.constantFrom(...spellings), digits, fc.boolean())
    .map(([logValue, spelling, significant, tight]) => {
      const factor = (UNITS[dimension] as Record<string, number>)[spelling as string] ?? 1;
      const number = writeNumber(Math.exp(logValue) / factor, significant);
      // Units may follow the number directly (`3ft`) or after a space; `%` and `‰` usually tight.
      return { text: tight ? `${number}${String(spelling)}` : `${number} ${String(spelling)}`, valueSI: Number(number) * factor };
    })
    .filter((written) => written.valueSI > 0);
}

const ratio = (low: number, high: number): fc.Arbitrary<Written> =>
  fc.tuple(fc.double({ min: low, max: high, noNaN: true }), digits).map(([value, significant]) => {
    const text = writeNumber(value, significant);
    return { text, valueSI: Number(text) };
  });

/** Text for a description: printable, single-line, no quote; markup and odd characters welcome. */
const description = fc
  .oneof(
    fc.string({ unit: 'grapheme', maxLength: 30 }),
    fc.constantFrom('10-year storm', '<b>bold</b> & "x"', '<script>window.__ran = 1</script>', 'naïve café – 5 ft³/s', '| pipe | table |', '`code` *em* [link](javascript:alert(1))', 'ﬁ 😀 \u202E'),
  )
  .map((text) => text.replace(/["\r\n\u2028\u2029\u0085]/g, ' ').replace(/NaN|Infinity|undefined/g, 'x'));

const optionalDescription = fc.option(description, { freq: 2 }).map((text) => (text === null ? '' : ` "${text}"`));

interface SectionSpec {
  readonly dimensions: ShapeDimensions;
  readonly bankHeightM: number | null;
  readonly body: string[];
}

const sideSlope = fc.tuple(fc.double({ min: 0, max: 6, noNaN: true }), fc.constantFrom(1, 1, 1, 2), fc.integer({ min: 1, max: 3 })).map(([horizontal, vertical, significant]) => {
  const h = writeNumber(horizontal * vertical, significant);
  return { text: `${h}:${vertical}`, ratio: Number(h) / vertical };
});

const bankHeight = fc.option(quantityArbitrary('length', 0.2, 10), { freq: 6 });

const sectionSpec: fc.Arbitrary<SectionSpec> = fc.oneof(
  fc.tuple(quantityArbitrary('length', 0.1, 50), bankHeight).map(([width, bank]): SectionSpec => ({
    dimensions: { shape: 'rectangle', bottomWidthM: width.valueSI },
    bankHeightM: bank?.valueSI ?? null,
    body: [`bottom width ${width.text}`, ...(bank ? [`bank height ${bank.text}`] : [])],
  })),
  fc.tuple(quantityArbitrary('length', 0.1, 50), sideSlope, fc.option(sideSlope), bankHeight).map(([width, left, right, bank]): SectionSpec => ({
    dimensions: { shape: 'trapezoid', bottomWidthM: width.valueSI, leftHV: left.ratio, rightHV: right?.ratio ?? left.ratio },
    bankHeightM: bank?.valueSI ?? null,
    body: [`bottom width ${width.text}`, `side slopes ${left.text}${right ? `, ${right.text}` : ''}`, ...(bank ? [`bank height ${bank.text}`] : [])],
  })),
  fc
    .tuple(sideSlope, fc.option(sideSlope), bankHeight)
    .filter(([left, right]) => left.ratio > 0.05 && (right?.ratio ?? left.ratio) > 0.05)
    .map(([left, right, bank]): SectionSpec => ({
      dimensions: { shape: 'triangle', leftHV: left.ratio, rightHV: right?.ratio ?? left.ratio },
      bankHeightM: bank?.valueSI ?? null,
      body: [`side slopes ${left.text}${right ? `, ${right.text}` : ''}`, ...(bank ? [`bank height ${bank.text}`] : [])],
    })),
  fc.tuple(quantityArbitrary('length', 0.5, 30), quantityArbitrary('length', 0.2, 5), bankHeight).map(([width, depth, bank]): SectionSpec => ({
    dimensions: { shape: 'parabola', topWidthM: width.valueSI, atDepthM: depth.valueSI },
    bankHeightM: bank?.valueSI ?? null,
    body: [`top width ${width.text} at depth ${depth.text}`, ...(bank ? [`bank height ${bank.text}`] : [])],
  })),
  quantityArbitrary('length', 0.15, 5).map((diameter): SectionSpec => ({
    dimensions: { shape: 'circle', diameterM: diameter.valueSI },
    bankHeightM: null,
    body: [`diameter ${diameter.text}`],
  })),
);

interface LiningSpec {
  readonly manningN: number;
  readonly body: string[];
}

const liningSpec: fc.Arbitrary<LiningSpec> = fc
  .tuple(ratio(0.01, 0.08), fc.option(quantityArbitrary('velocity', 0.5, 8)), fc.option(quantityArbitrary('shear', 5, 400)), fc.option(description))
  .map(([n, velocity, shear, source]) => ({
    manningN: n.valueSI,
    body: [`n ${n.text}`, ...(velocity ? [`permissible velocity ${velocity.text}`] : []), ...(shear ? [`permissible shear ${shear.text}`] : []), ...(source !== null ? [`source "${source}"`] : [])],
  }));

const criterionLines = fc
  .tuple(
    fc.option(fc.oneof(quantityArbitrary('length', 0.05, 1).map((h) => `freeboard ${h.text}`), fc.constant('freeboard usbr'), fc.constant('freeboard none'), ratio(0.47, 0.75).map((c) => `freeboard usbr coefficient ${c.text} m`))),
    fc.option(fc.tuple(ratio(0.7, 0.95), ratio(1.05, 1.3)).map(([low, high]) => `avoid froude ${low.text} to ${high.text}`)),
    fc.option(quantityArbitrary('velocity', 0.2, 1.2).map((v) => `minimum velocity ${v.text}`)),
    fc.option(ratio(0, 60).map((p) => `limit margin ${p.text} %`)),
  )
  .map((items) => items.filter((item): item is string => item !== null));

/** How a block is laid out: all on one line, or one item per line. */
const layout = fc.constantFrom('one-line', 'lines', 'lines', 'ragged');

function block(head: string, items: readonly string[], style: string, indent: string): string {
  if (items.length === 0) return `${head} {}`;
  if (style === 'one-line') return `${head} { ${items.join('  ')} }`;
  if (style === 'ragged') return `${head}{${items.map((item, index) => (index % 2 === 0 ? `\n${indent}\t${item}` : ` ${item}`)).join('')}\n${indent}}`;
  return `${head} {\n${items.map((item) => `${indent}  ${item}`).join('\n')}\n${indent}}`;
}

interface ReachPlan {
  readonly section: number;
  readonly lining: number;
  readonly slope: Written;
  readonly useInverts: boolean;
  readonly upstreamInvertM: number;
  readonly length: Written;
  readonly changes: readonly (Written | null)[];
  readonly criteria: readonly string[];
  readonly description: string;
  readonly layout: string;
}

const reachPlan = (sections: number, linings: number, flows: number): fc.Arbitrary<ReachPlan> =>
  fc.record({
    section: fc.nat(sections - 1),
    lining: fc.nat(linings - 1),
    slope: quantityArbitrary('slope', 1e-5, 0.15),
    useInverts: fc.boolean(),
    upstreamInvertM: fc.double({ min: 0, max: 3000, noNaN: true }),
    length: quantityArbitrary('length', 2, 3000),
    changes: fc.array(fc.option(quantityArbitrary('discharge', 0.001, 300), { freq: 4 }), { minLength: flows, maxLength: flows }),
    criteria: fc.option(criterionLines, { freq: 4 }).map((lines) => lines ?? []),
    description: optionalDescription,
    layout,
  });

const outlet = fc.oneof(fc.constant('outlet free fall'), fc.constant('outlet normal depth'), quantityArbitrary('length', 1, 3000).map((level) => `outlet water level ${level.text}`));

export const generatedDesign: fc.Arbitrary<GeneratedDesign> = fc
  .record({
    sectionCount: fc.integer({ min: 1, max: 4 }),
    liningCount: fc.integer({ min: 1, max: 3 }),
    flowCount: fc.integer({ min: 1, max: 3 }),
    channelCount: fc.integer({ min: 1, max: 3 }),
    seedNames: fc.array(fc.tuple(fc.constantFrom(...NAME_STEMS), fc.boolean(), fc.constantFrom(...KEYWORD_NAMES)), { minLength: 40, maxLength: 40 }),
  })
  .chain((sizes) =>
    fc.record({
      sizes: fc.constant(sizes),
      title: description,
      notes: fc.array(description, { maxLength: 2 }),
      units: fc.constantFrom('', 'units SI', 'units US'),
      criteria: criterionLines,
      sections: fc.array(fc.tuple(sectionSpec, optionalDescription, layout), { minLength: sizes.sectionCount, maxLength: sizes.sectionCount }),
      linings: fc.array(fc.tuple(liningSpec, optionalDescription, layout), { minLength: sizes.liningCount, maxLength: sizes.liningCount }),
      liningsInLibrary: fc.boolean(),
      flows: fc.array(fc.tuple(quantityArbitrary('discharge', 0.001, 300), optionalDescription), { minLength: sizes.flowCount, maxLength: sizes.flowCount }),
      flowLayout: layout,
      channels: fc.array(
        fc.record({
          description: optionalDescription,
          changes: fc.option(fc.array(fc.option(quantityArbitrary('discharge', 0.001, 300)), { minLength: sizes.flowCount, maxLength: sizes.flowCount })),
          reaches: fc.array(reachPlan(sizes.sectionCount, sizes.liningCount, sizes.flowCount), { minLength: 1, maxLength: 4 }),
          outlet,
        }),
        { minLength: sizes.channelCount, maxLength: sizes.channelCount },
      ),
      order: fc.array(fc.nat(), { minLength: 20, maxLength: 20 }),
    }),
  )
  .map((plan) => {
    // Unique names: a stem and a number, or now and then a keyword the grammar allows as a name.
    const used = new Set<string>();
    let nameIndex = 0;
    const nextName = (): string => {
      const [stem, keyword, word] = plan.sizes.seedNames[nameIndex % plan.sizes.seedNames.length] ?? ['x', false, 'x'];
      nameIndex++;
      let name = keyword && !used.has(word) ? word : `${stem}${nameIndex}`;
      while (used.has(name)) name = `${name}_${nameIndex}`;
      used.add(name);
      return name;
    };
    const sectionNames = plan.sections.map(() => nextName());
    const liningNames = plan.linings.map(() => nextName());
    const flowNames = plan.flows.map(() => nextName());

    const members: string[] = [];
    plan.notes.forEach((note) => members.push(`note "${note}"`));
    if (plan.units !== '') members.push(plan.units);
    if (plan.criteria.length > 0) members.push(block('criteria', plan.criteria, 'lines', ''));
    plan.sections.forEach(([spec, text, style], index) => members.push(block(`section ${sectionNames[index]} ${spec.dimensions.shape}${text}`, spec.body, style, '')));
    const liningBlocks = plan.linings.map(([spec, text, style], index) => block(`lining ${liningNames[index]}${text}`, spec.body, style, ''));
    if (!plan.liningsInLibrary) members.push(...liningBlocks);
    const flowTableItems = plan.flows.map(([discharge, text], index) => `${flowNames[index]} = ${discharge.text}${text}`);
    members.push(block('flows', flowTableItems, plan.flowLayout, ''));

    const reaches: ExpectedReach[] = [];
    const channelBlocks = plan.channels.map((channel) => {
      const channelName = nextName();
      const current = plan.flows.map(([discharge]) => discharge.valueSI);
      const items: string[] = [];
      if (channel.changes !== null) {
        const changes = channel.changes.flatMap((change, index) => (change === null ? [] : [`${flowNames[index]} = ${change.text}`]));
        channel.changes.forEach((change, index) => {
          if (change !== null) current[index] = change.valueSI;
        });
        if (changes.length > 0) items.push(block('flows', changes, 'one-line', '  '));
      }
      for (const reach of channel.reaches) {
        const reachName = nextName();
        const [section] = plan.sections[reach.section] ?? [];
        const [lining] = plan.linings[reach.lining] ?? [];
        if (section === undefined || lining === undefined) throw new Error('internal: plan index');
        const properties = [`section ${sectionNames[reach.section]}`, `lining ${liningNames[reach.lining]}`];
        let slope = reach.slope.valueSI;
        if (reach.useInverts) {
          // Inverts in metres or feet, two decimals' worth of digits more than the fall so the slope stays positive.
          const useFeet = reach.slope.text.includes('ft');
          const factor = useFeet ? FOOT : 1;
          const upstream = Number((reach.upstreamInvertM / factor + 1000).toFixed(3));
          const fall = Math.max((reach.slope.valueSI * reach.length.valueSI) / factor, 0.001);
          const downstream = Number((upstream - Number(fall.toPrecision(4))).toFixed(6));
          const unit = useFeet ? 'ft' : 'm';
          properties.push(`inverts ${upstream} ${unit} to ${downstream} ${unit}`);
          slope = ((upstream - downstream) * factor) / reach.length.valueSI;
        } else {
          properties.push(`slope ${reach.slope.text}`);
        }
        properties.push(`length ${reach.length.text}`);
        const changes = reach.changes.flatMap((change, index) => (change === null ? [] : [`${flowNames[index]} = ${change.text}`]));
        reach.changes.forEach((change, index) => {
          if (change !== null) current[index] = change.valueSI;
        });
        if (changes.length > 0) properties.push(block('flows', changes, 'one-line', '    '));
        if (reach.criteria.length > 0) properties.push(block('criteria', reach.criteria, 'one-line', '    '));
        items.push(block(`reach ${reachName}${reach.description}`, properties, reach.layout, '  '));
        reaches.push({
          channel: channelName,
          name: reachName,
          dimensions: section.dimensions,
          bankHeightM: section.bankHeightM,
          manningN: lining.manningN,
          slope,
          lengthM: reach.length.valueSI,
          flows: flowNames.map((name, index) => ({ name, dischargeM3s: current[index] ?? 0 })),
        });
      }
      items.push(channel.outlet);
      return block(`channel ${channelName}${channel.description}`, items, 'lines', '');
    });
    members.push(...channelBlocks);

    // Any order of members: definitions may follow the channels that use them.
    const shuffled = [...members];
    plan.order.forEach((swapWith, index) => {
      const a = index % shuffled.length;
      const b = swapWith % shuffled.length;
      [shuffled[a], shuffled[b]] = [shuffled[b] as string, shuffled[a] as string];
    });
    const text = [`design "${plan.title}"`, ...shuffled].join('\n\n') + '\n';
    const library = plan.liningsInLibrary ? ['library "Generated linings"', ...liningBlocks].join('\n\n') + '\n' : undefined;
    return { text, library, reaches };
  });
