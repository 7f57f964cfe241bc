/**
 * `runnel check`: as a child process for exit codes, colour and the absence of stack traces; in-process for the
 * formats. The JSON output is validated against its documented schema, the SARIF output against the published
 * SARIF 2.1.0 JSON schema, with Ajv (a general-purpose JSON-schema validator).
 */
import { Ajv } from 'ajv';
import * as ajvFormats from 'ajv-formats';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { CHECK_JSON_SCHEMA } from '../../server/cli/check-json-schema.js';
import {
  ditchDesign,
  LINING_LIBRARY,
  PROCESS_TEST_TIMEOUT_MS,
  REPOSITORY_ROOT,
  runRunnelInProcess,
  runRunnelProcess,
  temporaryFolder,
  writeFiles,
} from './cli-harness.js';

// ajv-formats is CommonJS with a default export: reach the plugin whichever way the loader wraps it.
type FormatsPlugin = (ajv: Ajv) => Ajv;
const formatsModule = ajvFormats as unknown as { default: FormatsPlugin | { default: FormatsPlugin } };
const addFormats: FormatsPlugin = typeof formatsModule.default === 'function' ? formatsModule.default : formatsModule.default.default;
const ANSI_ESCAPE = /\u001b\[/;
const STACK_FRAME = /^\s+at .+\(.+:\d+:\d+\)$/m;
const DIAGNOSTIC_LINE = /^(?<path>[^:\s]+\.runnel):(?<line>\d+):(?<column>\d+): (?<severity>error|warning|information) (?<code>[a-z0-9-]+) (?<message>.+)$/;

let folder = '';
beforeAll(() => {
  folder = temporaryFolder('check');
  writeFiles(folder, {
    'linings.runnel': LINING_LIBRARY,
    'ditch.runnel': ditchDesign(),
    // 3 ft instead of 20 ft of bottom: 400 cfs over-tops the 5 ft banks (an error).
    'narrow.runnel': ditchDesign({ bottomFt: 3 }),
    'broken.runnel': `${ditchDesign().replace('slope 0.16 %', 'slope 0.16 furlongs')}\nchannel {`,
  });
});

describe('runnel check as a child process', () => {
  it(
    'prints path:line:col: severity code message and exits 1 when a design has an error',
    async () => {
      const run = await runRunnelProcess(['check', 'ditch.runnel', 'narrow.runnel'], { cwd: folder, env: { NO_COLOR: '1', FORCE_COLOR: '1' } });
      expect(run.status).toBe(1);
      const lines = run.stdout.split('\n').filter((line) => line.endsWith('.runnel') === false && DIAGNOSTIC_LINE.test(line));
      expect(lines.length).toBeGreaterThan(0);
      const overtopping = lines.map((line) => DIAGNOSTIC_LINE.exec(line)?.groups).find((groups) => groups?.['code'] === 'overtopping');
      expect(overtopping).toMatchObject({ path: 'narrow.runnel', severity: 'error' });
      // The finding points at the reach's name on line 15 of the design text (1-based), column 9.
      expect(overtopping).toMatchObject({ line: '15', column: '9' });
      expect(run.stdout).toMatch(/^Caution: .*licensed engineer/m);
      // NO_COLOR wins over FORCE_COLOR.
      expect(run.stdout).not.toMatch(ANSI_ESCAPE);
      expect(run.stderr).toBe('');
    },
    PROCESS_TEST_TIMEOUT_MS,
  );

  it(
    'exits 0 for a design without errors, loading the lining library from the same folder',
    async () => {
      const run = await runRunnelProcess(['check', 'ditch.runnel'], { cwd: folder });
      expect(run.stdout).toMatch(/^0 errors, 0 warnings, 0 notes in 1 file$/m);
      expect(run.status).toBe(0);
    },
    PROCESS_TEST_TIMEOUT_MS,
  );

  it(
    'exits 2 on bad usage, with the usage line and no stack trace',
    async () => {
      const [noFiles, badOption, missing] = await Promise.all([
        runRunnelProcess(['check'], { cwd: folder }),
        runRunnelProcess(['check', '--fromat', 'json', 'ditch.runnel'], { cwd: folder }),
        runRunnelProcess(['check', 'nowhere.runnel'], { cwd: folder }),
      ]);
      expect(noFiles.status).toBe(2);
      expect(noFiles.stderr).toContain('runnel: no design files given');
      expect(badOption.status).toBe(2);
      expect(badOption.stderr).toContain("unknown option '--fromat' (did you mean '--format'?)");
      expect(missing.status).toBe(2);
      expect(missing.stderr).toContain("cannot read 'nowhere.runnel': no such file or folder");
      for (const run of [noFiles, badOption, missing]) {
        expect(run.stderr).toContain('Usage: runnel check');
        expect(run.stderr).not.toMatch(STACK_FRAME);
        expect(run.stdout).toBe('');
      }
    },
    PROCESS_TEST_TIMEOUT_MS,
  );

  it(
    'colours a terminal only: FORCE_COLOR stands in for a terminal, NO_COLOR turns it off',
    async () => {
      const [forced, piped] = await Promise.all([
        runRunnelProcess(['check', 'narrow.runnel'], { cwd: folder, env: { FORCE_COLOR: '1' } }),
        runRunnelProcess(['check', 'narrow.runnel'], { cwd: folder }),
      ]);
      expect(forced.stdout).toMatch(ANSI_ESCAPE);
      expect(piped.stdout).not.toMatch(ANSI_ESCAPE);
    },
    PROCESS_TEST_TIMEOUT_MS,
  );

  it(
    'writes JSON that matches the documented schema, every number SI with its unit in the field name',
    async () => {
      const run = await runRunnelProcess(['check', '--format', 'json', 'ditch.runnel', 'narrow.runnel'], { cwd: folder });
      expect(run.status).toBe(1);
      const document = JSON.parse(run.stdout) as {
        files: { path: string; analysis: { channels: { reaches: { section: { dimensions: Record<string, number> }; slope: number; flows: { discharge_m3s: number; normal: { depth_m: number } }[] }[] }[] } }[];
      };
      const ajv = new Ajv({ allErrors: true, strict: false });
      const validate = ajv.compile(CHECK_JSON_SCHEMA);
      expect(validate(document), JSON.stringify(validate.errors?.slice(0, 5))).toBe(true);

      const ditch = document.files.find((file) => file.path === 'ditch.runnel');
      const reach = ditch?.analysis.channels[0]?.reaches[0];
      // Inputs resolved to SI: 20 ft = 6.096 m exactly; 0.16 % = 0.0016; 400 cfs = 11.3267 m3/s (1 ft = 0.3048 m exactly).
      expect(reach?.section.dimensions['bottomWidth_m']).toBeCloseTo(6.096, 9);
      expect(reach?.slope).toBeCloseTo(0.0016, 12);
      expect(reach?.flows[0]?.discharge_m3s).toBeCloseTo(400 * 0.3048 ** 3, 9);
      // Normal depth of the Chow (1959) Ch. 6 channel with n = 0.035 instead of 0.025: Manning's equation solved
      // in the test fixtures gives 4.046 ft (test/diff/fixtures.ts, independent bisection); 0.1 % tolerance.
      expect(Math.abs((reach?.flows[0]?.normal.depth_m ?? 0) / 0.3048 - 4.046)).toBeLessThan(0.004);
    },
    PROCESS_TEST_TIMEOUT_MS,
  );
});

describe('runnel check formats (in-process)', () => {
  it('reports syntax, unit and reference problems of a broken file at their lines, and still exits 1', async () => {
    const run = await runRunnelInProcess(['check', 'broken.runnel'], { cwd: folder });
    expect(run.status).toBe(1);
    const lines = run.stdout.split('\n').filter((line) => DIAGNOSTIC_LINE.test(line));
    // The unknown unit, on the slope line (18) at the unit's column (16).
    expect(lines.some((line) => /^broken\.runnel:18:16: error unit-unknown .*'furlongs'/.test(line))).toBe(true);
    expect(lines.some((line) => /: error (parsing-error|lexing-error) /.test(line))).toBe(true);
  });

  it('writes SARIF 2.1.0 that validates against the published schema', async () => {
    const run = await runRunnelInProcess(['check', '--format', 'sarif', 'ditch.runnel', 'narrow.runnel', 'broken.runnel'], { cwd: folder });
    expect(run.status).toBe(1);
    const log = JSON.parse(run.stdout) as { version: string; runs: { results: { ruleId: string; level: string; locations: { physicalLocation: { artifactLocation: { uri: string }; region: { startLine: number } } }[] }[] }[] };
    // The SARIF 2.1.0 schema as published on SchemaStore (rtm.5), shipped in the npm package @microsoft/jest-sarif.
    // It is a draft-04 schema: its `id` is Ajv's `$id`, and none of draft-04's other differences (boolean
    // exclusiveMinimum/Maximum) occur in it. One pattern in it is not valid as a Unicode regular expression, so
    // patterns are compiled without the `u` flag, as draft-04 validators did.
    const schemaPath = join(REPOSITORY_ROOT, 'node_modules', '@microsoft', 'jest-sarif', 'lib', 'schemas', 'sarif-2.1.0-rtm.5.json');
    const { $schema: _draft, id, ...schema } = JSON.parse(readFileSync(schemaPath, 'utf8')) as Record<string, unknown>;
    const ajv = new Ajv({ allErrors: true, strict: false, unicodeRegExp: false });
    addFormats(ajv);
    const validate = ajv.compile({ ...schema, $id: String(id) });
    expect(validate(log), JSON.stringify(validate.errors?.slice(0, 5))).toBe(true);
    // The validator rejects what it should: a wrong version.
    expect(validate({ ...log, version: '2.0.0' })).toBe(false);

    // Every rule the results use is described, in words from its code, for code-scanning views.
    const rules = (log as unknown as { runs: { tool: { driver: { rules: { id: string; shortDescription?: { text: string } }[] } } }[] }).runs[0]?.tool.driver.rules ?? [];
    expect(rules.find((rule) => rule.id === 'unit-unknown')?.shortDescription?.text).toBe('Unit unknown');
    expect(rules.every((rule) => (rule.shortDescription?.text.length ?? 0) > 0)).toBe(true);

    const overtopping = log.runs[0]?.results.find((result) => result.ruleId === 'overtopping');
    expect(overtopping?.level).toBe('error');
    expect(overtopping?.locations[0]?.physicalLocation.artifactLocation.uri).toMatch(/narrow\.runnel$/);
    expect(overtopping?.locations[0]?.physicalLocation.region.startLine).toBe(15);
  });

  it('writes workflow annotations with escaped values', async () => {
    const run = await runRunnelInProcess(['check', '--format', 'github', 'narrow.runnel'], { cwd: folder });
    expect(run.status).toBe(1);
    const line = run.stdout.split('\n').find((text) => text.startsWith('::error '));
    expect(line).toMatch(/^::error file=[^,]*narrow\.runnel,line=15,col=9,endLine=\d+,endColumn=\d+,title=runnel overtopping::Over-topping at q100/);
  });

  it('expands a folder to its design files and writes --out without colour', async () => {
    const out = join(temporaryFolder('out'), 'results.txt');
    const run = await runRunnelInProcess(['check', '--out', out, '.'], { cwd: folder, tty: true });
    expect(run.stderr).toContain(`runnel: wrote ${out}`);
    const text = readFileSync(out, 'utf8');
    expect(text).toMatch(/in 4 files/);
    expect(text).not.toMatch(ANSI_ESCAPE);
  });

  it('colours a terminal and honours NO_COLOR (in-process twin of the child-process check)', async () => {
    expect((await runRunnelInProcess(['check', 'narrow.runnel'], { cwd: folder, tty: true })).stdout).toMatch(ANSI_ESCAPE);
    expect((await runRunnelInProcess(['check', 'narrow.runnel'], { cwd: folder, tty: true, env: { NO_COLOR: '1' } })).stdout).not.toMatch(ANSI_ESCAPE);
    expect((await runRunnelInProcess(['check', 'narrow.runnel'], { cwd: folder, tty: true, env: { TERM: 'dumb' } })).stdout).not.toMatch(ANSI_ESCAPE);
  });

  it('resolves names from the library only within the workspace', async () => {
    const alone = temporaryFolder('alone');
    writeFiles(alone, { 'ditch.runnel': ditchDesign() });
    const run = await runRunnelInProcess(['check', 'ditch.runnel'], { cwd: alone });
    expect(run.status).toBe(1);
    expect(run.stdout).toMatch(/^ditch\.runnel:17:\d+: error \S+ .*turf/m); // the `lining turf` line
    // --workspace brings the library in.
    const withLibrary = await runRunnelInProcess(['check', '--workspace', folder, 'ditch.runnel'], { cwd: alone });
    expect(withLibrary.status).toBe(0);
  });

  it('prints help for the command', async () => {
    const run = await runRunnelInProcess(['check', '--help']);
    expect(run.status).toBe(0);
    expect(run.stdout).toContain('Usage: runnel check');
    expect(run.stdout).toContain('--format FORMAT');
  });
});
