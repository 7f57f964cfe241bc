/**
 * The criteria options of `check`, `report` and `diff` (--freeboard, --near-critical-froude, --minimum-velocity,
 * --limit-margin): the same values as the editor's runnel.criteria.* settings, a default only where a design file
 * states none, and a usage mistake (status 2) for a value that does not read.
 *
 * The design is the trapezoid of Chow (1959) Ch. 6 (REFERENCES.md N1: b = 20 ft, z = 2, S = 0.0016, Q = 400 cfs)
 * with a turf lining (n = 0.035) and 5 ft banks, and no criteria block of its own.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import type { CheckJsonDocument } from '../../server/cli/check-output.js';
import { CRITERION_SETTINGS } from '../../language/analysis/criteria-settings.js';
import { ditchDesign, LINING_LIBRARY, PROCESS_TEST_TIMEOUT_MS, runRunnelInProcess, runRunnelProcess, temporaryFolder, writeFiles } from './cli-harness.js';

const FOOT_M = 0.3048;
const STACK_FRAME = /^\s+at .+\(.+:\d+:\d+\)$/m;
const FROM_SETTING = 'from the editor or command-line setting, not from the file';

/** The test ditch without its criteria block: every criterion is left to the defaults. */
function silentDitch(options: { readonly bottomFt?: number } = {}): string {
  const text = ditchDesign(options);
  const silent = text.replace('criteria {\n  freeboard 0.5 ft\n}\n', '');
  if (silent === text) throw new Error('the test ditch no longer has the criteria block this test removes');
  return silent;
}

let folder = '';
beforeAll(() => {
  folder = temporaryFolder('criteria-options');
  writeFiles(folder, {
    'linings.runnel': LINING_LIBRARY,
    'silent.runnel': silentDitch(),
    // 30 ft of bottom instead of 20: less depth, more freeboard.
    'wider.runnel': silentDitch({ bottomFt: 30 }),
    // States its own freeboard of 0.5 ft: an option must not replace it.
    'stated.runnel': ditchDesign().replace('design "Test ditch"', 'design "Stated ditch"').replace('reach upper', 'reach stated'),
  });
});

interface ReachJson {
  readonly criteria: { readonly freeboard: { readonly kind: string; readonly height_m?: number } | null; readonly origin: Record<string, string> };
  readonly flows: readonly { readonly freeboard_m: number; readonly requiredFreeboard_m: number | null; readonly findings: readonly { readonly code: string; readonly data: Record<string, unknown> }[] }[];
}

async function checkJson(args: readonly string[]): Promise<{ status: number; document: CheckJsonDocument }> {
  const run = await runRunnelInProcess(['check', '--format', 'json', ...args], { cwd: folder });
  return { status: run.status, document: JSON.parse(run.stdout) as CheckJsonDocument };
}

function firstReach(document: CheckJsonDocument, fileEnd: string): ReachJson {
  const file = document.files.find((candidate) => candidate.path.endsWith(fileEnd));
  const reach = file?.analysis?.channels[0]?.reaches[0];
  expect(reach, fileEnd).toBeDefined();
  return reach as unknown as ReachJson;
}

describe('criteria options as a child process', () => {
  it(
    '--freeboard applies where the file is silent: the finding appears and the output says the option was used',
    async () => {
      const plain = await runRunnelProcess(['check', 'silent.runnel'], { cwd: folder, env: { NO_COLOR: '1' } });
      expect(plain.status).toBe(0);
      expect(plain.stdout).not.toContain('freeboard-below-required');
      const run = await runRunnelProcess(['check', '--freeboard', '1.2 ft', 'silent.runnel'], { cwd: folder, env: { NO_COLOR: '1' } });
      // A freeboard finding is a warning: the exit status stays 0.
      expect(run.status).toBe(0);
      expect(run.stdout).toMatch(/^silent\.runnel:\d+:\d+: warning freeboard-below-required .*the criteria require 1\.2 ft\. The required freeboard is from the editor or command-line setting, not from the file\.$/m);
      expect(run.stdout).toContain('Criteria from command-line options where a design file states none: --freeboard 1.2 ft.');
      expect(run.stdout).toMatch(/^Caution: .*licensed engineer/m);
      expect(run.stderr).toBe('');
    },
    PROCESS_TEST_TIMEOUT_MS,
  );

  it(
    'a value of the wrong dimension is a usage mistake: status 2, the option, what is wrong and what to write',
    async () => {
      const run = await runRunnelProcess(['check', '--minimum-velocity', '2 ft', 'silent.runnel'], { cwd: folder, env: { NO_COLOR: '1' } });
      expect(run.status).toBe(2);
      expect(run.stdout).toBe('');
      expect(run.stderr).toContain(
        "runnel: option --minimum-velocity does not accept '2 ft': 'ft' is a unit of length, but the minimum velocity needs a unit of velocity (m/s or ft/s). " +
          "Write it as in a criteria block after 'minimum velocity', e.g. '2 ft/s', '0.6 m/s'.",
      );
      expect(run.stderr).toMatch(/^Usage: runnel check/m);
      expect(run.stderr).not.toMatch(STACK_FRAME);
    },
    PROCESS_TEST_TIMEOUT_MS,
  );
});

describe('criteria options in process', () => {
  it('a freeboard option of 0.5 ft requires 0.1524 m (1 ft = 0.3048 m exactly) and is marked as a setting', async () => {
    const { document } = await checkJson(['--freeboard', '0.5 ft', 'silent.runnel']);
    const reach = firstReach(document, 'silent.runnel');
    expect(reach.criteria.freeboard).toEqual({ kind: 'fixed', height_m: 0.1524 });
    expect(reach.criteria.origin['freeboard']).toBe('setting');
    expect(reach.flows[0]?.requiredFreeboard_m).toBe(0.1524);
  });

  it("a design's own criterion wins over the option", async () => {
    const { document } = await checkJson(['--freeboard', '4 ft', 'stated.runnel', 'silent.runnel']);
    const stated = firstReach(document, 'stated.runnel');
    expect(stated.criteria.origin['freeboard']).toBe('design');
    expect(stated.flows[0]?.requiredFreeboard_m).toBe(0.1524);
    const silent = firstReach(document, 'silent.runnel');
    expect(silent.criteria.origin['freeboard']).toBe('setting');
    const finding = silent.flows[0]?.findings.find((candidate) => candidate.code === 'freeboard-below-required');
    expect(finding?.data['required_m']).toBe(4 * FOOT_M);
  });

  it('every criterion option reads the values the editor setting takes, as the same criterion', async () => {
    const { document } = await checkJson(['--freeboard', 'usbr', '--near-critical-froude', '0.8 to 1.2', '--minimum-velocity', '0.6 m/s', '--limit-margin', '10%', 'silent.runnel']);
    const reach = firstReach(document, 'silent.runnel') as unknown as { criteria: Record<string, unknown> & { origin: Record<string, string> } };
    expect(reach.criteria['freeboard']).toEqual({ kind: 'usbr-rule', coefficientC_SI: null });
    expect(reach.criteria['avoidFroude']).toEqual({ low: 0.8, high: 1.2 });
    expect(reach.criteria['minVelocity_mps']).toBe(0.6);
    expect(reach.criteria['limitMargin']).toBe(0.1);
    expect(reach.criteria.origin).toEqual({ freeboard: 'setting', avoidFroude: 'setting', minVelocity: 'setting', limitMargin: 'setting' });
  });

  it('refuses a malformed or wrong-unit value of each option with status 2', async () => {
    const bad: Readonly<Record<string, string>> = { freeboard: '0.5', 'near-critical-froude': '1.2 to 0.8', 'minimum-velocity': '2 ft', 'limit-margin': '20 ft' };
    for (const setting of CRITERION_SETTINGS) {
      const value = bad[setting.option] ?? '';
      for (const command of ['check', 'report']) {
        const run = await runRunnelInProcess([command, `--${setting.option}`, value, 'silent.runnel'], { cwd: folder });
        expect(run.status, `${command} --${setting.option} ${value}`).toBe(2);
        expect(run.stderr, `${command} --${setting.option} ${value}`).toContain(`option --${setting.option} does not accept '${value}'`);
      }
    }
    const empty = await runRunnelInProcess(['check', '--freeboard=', 'silent.runnel'], { cwd: folder });
    expect(empty.status).toBe(2);
    expect(empty.stderr).toContain("option --freeboard needs a value, e.g. '0.5 ft'");
  });

  it('report marks the criteria that came from an option, in plain words', async () => {
    const run = await runRunnelInProcess(['report', '--freeboard', '1.2 ft', 'silent.runnel'], { cwd: folder });
    expect(run.status).toBe(0);
    expect(run.stdout).toContain(`**Criteria from settings.** Where the design file states no criterion of its own, these come ${FROM_SETTING}: Freeboard criterion: at least 1.2 ft.`);
    expect(run.stdout).toContain(`| Freeboard criterion | at least 1.2 ft (${FROM_SETTING}) |`);
    const plain = await runRunnelInProcess(['report', 'silent.runnel'], { cwd: folder });
    expect(plain.stdout).not.toContain('Criteria from settings');
    expect(plain.stdout).toContain('| Freeboard criterion | none required (default) |');
  });

  it('diff judges both versions with the options: widening the ditch newly passes the freeboard they require', async () => {
    // At 400 cfs the 20 ft ditch runs 4.05 ft deep (0.95 ft below its 5 ft bank) and the 30 ft ditch 3.31 ft deep
    // (1.69 ft below): a 1.2 ft freeboard fails the first and passes the second.
    const run = await runRunnelInProcess(['diff', '--freeboard', '1.2 ft', 'silent.runnel', 'wider.runnel'], { cwd: folder });
    expect(run.status).toBe(0);
    expect(run.stdout).toMatch(/newly passing: `freeboard-below-required`/);
    expect(run.stdout).toContain('Criteria from command-line options where a design file states none: --freeboard 1.2 ft.');
    const plain = await runRunnelInProcess(['diff', 'silent.runnel', 'wider.runnel'], { cwd: folder });
    expect(plain.stdout).not.toContain('freeboard-below-required');
  });

  it('--help of check, report and diff lists the four options and says the file wins', async () => {
    for (const command of ['check', 'report', 'diff']) {
      const help = await runRunnelInProcess([command, '--help']);
      expect(help.status).toBe(0);
      for (const setting of CRITERION_SETTINGS) expect(help.stdout, `${command} --${setting.option}`).toMatch(new RegExp(`^\\s+--${setting.option} VALUE\\s+default for`, 'm'));
      expect(help.stdout).toMatch(/always wins/);
    }
  });
});
