/**
 * Criteria defaults from settings (editor settings, command-line options): how a value is read, and where it
 * applies. Order: built-in default < setting < the design's criteria block < the reach's own.
 */
import { EmptyFileSystem, URI } from 'langium';
import { beforeAll, describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import { CRITERION_FROM_SETTING } from '../../language/analysis/criteria-defaults.js';
import {
  CRITERION_SETTINGS,
  CriteriaDefaultsSource,
  NO_CRITERIA_DEFAULTS,
  criteriaDefaultsKey,
  readCriteriaSettings,
  readCriterionSetting,
  type CriteriaDefaults,
  type CriterionSettingName,
  type CriterionSettingReading,
} from '../../language/analysis/criteria-settings.js';
import { createRunnelServices } from '../../language/runnel-module.js';
import { renderReportMarkdown } from '../../language/report/report-markdown.js';
import { FOOT_M, analyse, codesOf, expectClose, flowOf, reachOf } from './analysis-test-kit.js';
import { buildText } from '../language/language-test-kit.js';

const { Runnel } = createRunnelServices(EmptyFileSystem);

function settingNamed(name: CriterionSettingName) {
  const setting = CRITERION_SETTINGS.find((candidate) => candidate.name === name);
  if (setting === undefined) throw new Error(`no setting ${name}`);
  return setting;
}

function read(name: CriterionSettingName, written: string): Promise<CriterionSettingReading> {
  return readCriterionSetting(Runnel, settingNamed(name), written);
}

async function accepted(name: CriterionSettingName, written: string): Promise<CriteriaDefaults> {
  const reading = await read(name, written);
  expect(reading.ok, `${name} = '${written}': ${reading.ok ? '' : reading.problem}`).toBe(true);
  return reading.ok ? reading.defaults : NO_CRITERIA_DEFAULTS;
}

async function refused(name: CriterionSettingName, written: string): Promise<string> {
  const reading = await read(name, written);
  expect(reading.ok, `${name} = '${written}' should be refused`).toBe(false);
  return reading.ok ? '' : reading.problem;
}

describe('reading a criteria setting (the line of a criteria block without its keywords)', () => {
  beforeAll(async () => {
    // The first parse builds the parser's tables; keep that out of the first case's time.
    await read('freeboard', '1 ft');
  });

  it('freeboard: a height in US or SI units (1 ft = 0.3048 m exactly, NIST SP 811), usbr, usbr with C, none', async () => {
    expect(await accepted('freeboard', '0.5 ft')).toEqual({ freeboard: { kind: 'fixed', height_m: 0.1524 } });
    expect(await accepted('freeboard', '0.15 m')).toEqual({ freeboard: { kind: 'fixed', height_m: 0.15 } });
    const inches = (await accepted('freeboard', '6 in')).freeboard;
    expectClose(inches?.kind === 'fixed' ? inches.height_m : null, 0.1524, 1e-15, '6 in, m (1 in = 0.0254 m exactly)');
    expect(await accepted('freeboard', '  usbr ')).toEqual({ freeboard: { kind: 'usbr-rule', coefficientC_SI: null } });
    const withC = await accepted('freeboard', 'usbr coefficient 2 ft');
    expect(withC.freeboard).toEqual({ kind: 'usbr-rule', coefficientC_SI: 2 * FOOT_M });
    expect(await accepted('freeboard', 'none')).toEqual({ freeboard: null });
  });

  it('near-critical band: two plain numbers, low to high', async () => {
    expect(await accepted('nearCriticalFroude', '0.89 to 1.13')).toEqual({ avoidFroude: { low: 0.89, high: 1.13 } });
    expect(await accepted('nearCriticalFroude', '0.8 to 1.2')).toEqual({ avoidFroude: { low: 0.8, high: 1.2 } });
  });

  it('minimum velocity: a velocity in US or SI units (2 ft/s = 0.6096 m/s)', async () => {
    expect(await accepted('minimumVelocity', '2 ft/s')).toEqual({ minVelocity_mps: 0.6096 });
    expect(await accepted('minimumVelocity', '2ft/s')).toEqual({ minVelocity_mps: 0.6096 });
    expect(await accepted('minimumVelocity', '0.6 m/s')).toEqual({ minVelocity_mps: 0.6 });
  });

  it('limit margin: a percentage, as a fraction', async () => {
    expect(await accepted('limitMargin', '20 %')).toEqual({ limitMargin: 0.2 });
    expect(await accepted('limitMargin', '5%')).toEqual({ limitMargin: 0.05 });
  });

  it('empty or blank means not set', async () => {
    for (const setting of CRITERION_SETTINGS) {
      expect(await accepted(setting.name, '')).toEqual({});
      expect(await accepted(setting.name, '   ')).toEqual({});
    }
  });

  it('refuses a value of the wrong dimension, naming what it is and what is needed', async () => {
    expect(await refused('minimumVelocity', '2 ft')).toBe("'ft' is a unit of length, but the minimum velocity needs a unit of velocity (m/s or ft/s).");
    expect(await refused('freeboard', '0.5 ft/s')).toMatch(/^'ft\/s' is a unit of velocity, but the freeboard needs a unit of length/);
    expect(await refused('freeboard', 'usbr coefficient 2 cfs')).toMatch(/'cfs' is a unit of discharge/);
    expect(await refused('limitMargin', '20 ft')).toMatch(/Expected '%'/);
  });

  it('refuses a missing or unknown unit, with a suggestion where one is close', async () => {
    expect(await refused('freeboard', '0.5')).toMatch(/^Missing unit: the freeboard needs a unit of length/);
    expect(await refused('minimumVelocity', '2')).toMatch(/^Missing unit: the minimum velocity/);
    expect(await refused('freeboard', '0.5 fts')).toMatch(/Unknown unit 'fts'.*Did you mean 'ft'\?/);
  });

  it('refuses malformed values, negative values and a band that runs downward', async () => {
    expect(await refused('freeboard', 'abc')).toMatch(/Unexpected 'abc'/);
    expect(await refused('freeboard', '-1 ft')).toBe('The freeboard cannot be negative.');
    expect(await refused('nearCriticalFroude', '1.2 to 0.8')).toMatch(/runs from a lower to a higher number/);
    expect(await refused('nearCriticalFroude', '0.8')).toBe("Expected 'to' here, but the value ends there.");
    expect(await refused('limitMargin', '20')).toBe("Expected '%' here, but the value ends there.");
    expect(await refused('limitMargin', '-5 %')).toBe('The limit margin cannot be negative.');
  });

  it('refuses more than one value, so a setting cannot smuggle in other criteria or parts of a design', async () => {
    expect(await refused('freeboard', '0.5 ft avoid froude 0.5 to 2')).toBe('It is not one value of the freeboard required.');
    expect(await refused('freeboard', '0.5 ft\n}\ncriteria {\n  minimum velocity 9 ft/s')).toBe('It is not one value of the freeboard required.');
    expect(await refused('freeboard', '0.5 ft\n}\nchannel x {')).not.toBe('');
  });

  it('applies a USBR coefficient outside the published range with a caution, as a file does', async () => {
    const reading = await read('freeboard', 'usbr coefficient 3 ft');
    expect(reading.ok).toBe(true);
    if (reading.ok) expect(reading.warnings.join(' ')).toMatch(/3 ft is outside that range/);
  });

  it('reads several settings at once, leaving out the refused ones and saying why', async () => {
    const reading = await readCriteriaSettings(Runnel, { freeboard: '0.5 ft', minimumVelocity: '2 ft', limitMargin: '' });
    expect(reading.defaults).toEqual({ freeboard: { kind: 'fixed', height_m: 0.1524 } });
    expect(reading.problems.map((problem) => [problem.setting.name, problem.written])).toEqual([['minimumVelocity', '2 ft']]);
  });

  it('keys equal defaults alike and different ones apart', () => {
    expect(criteriaDefaultsKey({ limitMargin: 0.2 })).toBe(criteriaDefaultsKey({ limitMargin: 0.2 }));
    expect(criteriaDefaultsKey({ freeboard: null })).not.toBe(criteriaDefaultsKey({}));
    expect(criteriaDefaultsKey({ minVelocity_mps: 0.6 })).not.toBe(criteriaDefaultsKey({ minVelocity_mps: 0.6096 }));
    const source = new CriteriaDefaultsSource();
    expect(source.replace({})).toBe(false);
    expect(source.replace({ limitMargin: 0.1 })).toBe(true);
    expect(source.replace({ limitMargin: 0.1 })).toBe(false);
  });
});

// A grassed trapezoidal ditch: bottom 2 ft, sides 3:1, bank 3 ft, n 0.035, slope 1 %, 100 ft long.
const PARTS = `
section ditch trapezoid { bottom width 2 ft  side slopes 3:1  bank height 3 ft }
lining grass { n 0.035 }`;
const REACH = (name: string, extra = ''): string => `reach ${name} { section ditch  lining grass  slope 1 %  length 100 ft ${extra} }`;
const design = (criteria: string, reachExtra = ''): string =>
  `design "Settings"\nunits US\n${criteria}\nflows { q = 20 cfs }\n${PARTS}\nchannel c { ${REACH('a')} ${REACH('b', reachExtra)} outlet normal depth }`;

describe('criteria settings in the analysis: below the file, above the built-in defaults', () => {
  it('a freeboard setting of 0.5 ft applies where the file states none: required 0.1524 m, origin "setting"', async () => {
    const analysis = await analyse(design(''), {}, await accepted('freeboard', '0.5 ft'));
    const reach = reachOf(analysis, 'c', 'a');
    expect(reach.criteria.origin['freeboard']).toBe('setting');
    expect(analysis.criteria.origin['freeboard']).toBe('setting');
    expect(flowOf(reach, 'q').requiredFreeboard_m).toBe(0.1524);
    // Without it, no freeboard is required (the built-in default).
    const plain = await analyse(design(''));
    expect(flowOf(reachOf(plain, 'c', 'a'), 'q').requiredFreeboard_m).toBeNull();
    expect(reachOf(plain, 'c', 'a').criteria.origin['freeboard']).toBe('default');
  });

  it('a freeboard setting larger than the freeboard there is gives a finding that says the criterion came from a setting', async () => {
    const analysis = await analyse(design(''), {}, await accepted('freeboard', '2.5 ft'));
    const flow = flowOf(reachOf(analysis, 'c', 'a'), 'q');
    // Freeboard = bank height - normal depth (3 ft bank), below the 2.5 ft required.
    expectClose(flow.freeboard_m, 3 * FOOT_M - (flow.normal?.depth_m ?? Number.NaN), 1e-12, 'freeboard, m');
    expect(flow.freeboard_m ?? Number.POSITIVE_INFINITY).toBeLessThan(2.5 * FOOT_M);
    const finding = flow.findings.find((candidate) => candidate.code === 'freeboard-below-required');
    expect(finding?.data['required_m']).toBe(2.5 * FOOT_M);
    expect(finding?.message).toContain(`The required freeboard is ${CRITERION_FROM_SETTING}.`);
  });

  it("the design's criteria block wins over the setting, and a reach's block over both", async () => {
    const defaults = { ...(await accepted('freeboard', '2.5 ft')), ...(await accepted('nearCriticalFroude', '0.5 to 3')) };
    const analysis = await analyse(design('criteria { freeboard 0.5 ft }', 'criteria { freeboard 0.25 ft  avoid froude 0.89 to 1.13 }'), {}, defaults);
    const a = reachOf(analysis, 'c', 'a');
    const b = reachOf(analysis, 'c', 'b');
    expect(a.criteria.freeboard).toEqual({ kind: 'fixed', height_m: 0.1524 });
    expect(a.criteria.origin).toEqual({ freeboard: 'design', avoidFroude: 'setting', minVelocity: 'default', limitMargin: 'default' });
    expect(b.criteria.freeboard).toEqual({ kind: 'fixed', height_m: 0.25 * FOOT_M });
    expect(b.criteria.avoidFroude).toEqual({ low: 0.89, high: 1.13 });
    expect(b.criteria.origin).toEqual({ freeboard: 'reach', avoidFroude: 'reach', minVelocity: 'default', limitMargin: 'default' });
    // The file's 0.5 ft is met (the setting's 2.5 ft would not be), so reach a has no freeboard finding.
    expect(codesOf(flowOf(a, 'q'))).not.toContain('freeboard-below-required');
  });

  it('a near-critical band from a setting flags the flow and says where the band came from', async () => {
    const plain = flowOf(reachOf(await analyse(design('')), 'c', 'a'), 'q');
    const froude = plain.normal?.froudeNumber ?? Number.NaN;
    // The default band 0.89-1.13 (FHWA HEC-11) does not hold this flow; a band around its Froude number does.
    expect(froude < 0.89 || froude > 1.13).toBe(true);
    expect(codesOf(plain)).not.toContain('near-critical-flow');
    const band = `${(froude - 0.05).toFixed(3)} to ${(froude + 0.05).toFixed(3)}`;
    const flow = flowOf(reachOf(await analyse(design(''), {}, await accepted('nearCriticalFroude', band)), 'c', 'a'), 'q');
    const finding = flow.findings.find((candidate) => candidate.code === 'near-critical-flow');
    expect(finding?.message).toContain(`(band ${CRITERION_FROM_SETTING}).`);
  });

  it('a minimum velocity setting replaces the built-in 2 ft/s of a US design; the file still wins', async () => {
    const plain = flowOf(reachOf(await analyse(design('')), 'c', 'a'), 'q');
    const velocity = plain.normal?.velocity_mps ?? Number.NaN;
    expect(codesOf(plain)).not.toContain('velocity-below-self-cleansing');
    const above = `${((velocity * 1.5) / FOOT_M).toFixed(3)} ft/s`;
    const fromSetting = await analyse(design(''), {}, await accepted('minimumVelocity', above));
    const flow = flowOf(reachOf(fromSetting, 'c', 'a'), 'q');
    expect(codesOf(flow)).toContain('velocity-below-self-cleansing');
    expect(flow.findings.find((finding) => finding.code === 'velocity-below-self-cleansing')?.message).toContain(CRITERION_FROM_SETTING);
    const fileWins = await analyse(design('criteria { minimum velocity 1 ft/s }'), {}, await accepted('minimumVelocity', above));
    expect(codesOf(flowOf(reachOf(fileWins, 'c', 'a'), 'q'))).not.toContain('velocity-below-self-cleansing');
    expect(reachOf(fileWins, 'c', 'a').criteria.minVelocity_mps).toBeCloseTo(FOOT_M, 15);
  });

  it('a limit margin setting decides when a velocity over the permissible value is a failure', async () => {
    const plain = flowOf(reachOf(await analyse(design('')), 'c', 'a'), 'q');
    const velocity = plain.normal?.velocity_mps ?? Number.NaN;
    // A lining that permits 10 % less than the velocity there: over by 11 %, a warning with the default 20 % margin.
    const lined = (criteria: string): string =>
      design(criteria).replace('lining grass { n 0.035 }', `lining grass { n 0.035  permissible velocity ${(velocity / 1.11).toFixed(6)} m/s }`);
    const severity = async (criteria: string, defaults: CriteriaDefaults): Promise<string | undefined> =>
      flowOf(reachOf(await analyse(lined(criteria), {}, defaults), 'c', 'a'), 'q').findings.find((finding) => finding.code === 'velocity-above-permissible')?.severity;
    expect(await severity('', NO_CRITERIA_DEFAULTS)).toBe('warning');
    expect(await severity('', await accepted('limitMargin', '5 %'))).toBe('error');
    expect(await severity('criteria { limit margin 25 % }', await accepted('limitMargin', '5 %'))).toBe('warning');
  });

  it('the report names the criteria that came from a setting, in plain words', async () => {
    const analysis = await analyse(design(''), {}, await accepted('freeboard', '0.5 ft'));
    const markdown = renderReportMarkdown(analysis);
    expect(markdown).toContain('**Criteria from settings.**');
    expect(markdown).toContain(`these come ${CRITERION_FROM_SETTING}: Freeboard criterion: at least 0.5 ft`);
    expect(markdown).toContain(`| Freeboard criterion | at least 0.5 ft (${CRITERION_FROM_SETTING}) |`);
    expect(renderReportMarkdown(await analyse(design('')))).not.toContain('Criteria from settings');
  });

  it('caches one analysis per document version and criteria defaults', async () => {
    const document = await buildText(design(''));
    const withSetting: CriteriaDefaults = { freeboard: { kind: 'fixed', height_m: 0.1524 } };
    const plain = analyzeDocument(document, NO_CRITERIA_DEFAULTS);
    const set = analyzeDocument(document, withSetting);
    expect(set).not.toBe(plain);
    expect(analyzeDocument(document, { freeboard: { kind: 'fixed', height_m: 0.1524 } })).toBe(set);
    expect(analyzeDocument(document, NO_CRITERIA_DEFAULTS)).not.toBe(set);
  });

  it('validation judges with the defaults of its services, so diagnostics and analysis agree', async () => {
    const services = createRunnelServices(EmptyFileSystem);
    services.Runnel.analysis.CriteriaDefaults.replace(await accepted('freeboard', '2.5 ft'));
    const document = services.shared.workspace.LangiumDocumentFactory.fromString(design(''), URI.parse('memory:///settings/design.runnel'));
    services.shared.workspace.LangiumDocuments.addDocument(document);
    await services.shared.workspace.DocumentBuilder.build([document], { validation: true });
    const codes = (document.diagnostics ?? []).map((diagnostic) => diagnostic.code);
    expect(codes).toContain('freeboard-below-required');
  });
});
