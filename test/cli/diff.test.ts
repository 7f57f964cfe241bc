/**
 * `runnel diff OLD NEW`: the exit status under each --fail-on policy, the threshold options and the outputs.
 * Designs: the Chow (1959) Ch. 6 trapezoid (REFERENCES.md N1) with a turf lining (n 0.035) and 5 ft banks,
 * 0.5 ft freeboard required. Bottom 20 ft passes; 15 ft leaves less than 0.5 ft of freeboard (a warning);
 * 3 ft over-tops the banks (an error). Which of them fails follows from Manning's equation (see
 * test/diff/fixtures.ts: normal depth 4.05 ft at 20 ft of bottom), not from Runnel's output.
 */
import MarkdownIt from 'markdown-it';
import { beforeAll, describe, expect, it } from 'vitest';
import { ditchDesign, LINING_LIBRARY, PROCESS_TEST_TIMEOUT_MS, runRunnelInProcess, runRunnelProcess, temporaryFolder, writeFiles } from './cli-harness.js';

let folder = '';
beforeAll(() => {
  folder = temporaryFolder('diff');
  writeFiles(folder, {
    'linings.runnel': LINING_LIBRARY,
    'ditch.runnel': ditchDesign(),
    'tight.runnel': ditchDesign({ bottomFt: 15 }),
    'narrow.runnel': ditchDesign({ bottomFt: 3 }),
  });
});

async function diffStatus(oldFile: string, newFile: string, policy: string): Promise<number> {
  return (await runRunnelInProcess(['diff', oldFile, newFile, '--fail-on', policy], { cwd: folder })).status;
}

describe('exit status by policy', () => {
  it.each([
    // old, new, policy, status
    ['ditch.runnel', 'narrow.runnel', 'new-errors', 1], // over-topping is new
    ['ditch.runnel', 'narrow.runnel', 'errors', 1],
    ['ditch.runnel', 'narrow.runnel', 'warnings', 1],
    ['ditch.runnel', 'narrow.runnel', 'never', 0],
    ['narrow.runnel', 'ditch.runnel', 'new-errors', 0], // the error is fixed
    ['narrow.runnel', 'ditch.runnel', 'errors', 0],
    ['narrow.runnel', 'ditch.runnel', 'warnings', 0],
    ['tight.runnel', 'tight.runnel', 'new-errors', 0], // a warning, unchanged
    ['tight.runnel', 'tight.runnel', 'errors', 0],
    ['tight.runnel', 'tight.runnel', 'warnings', 1],
    ['narrow.runnel', 'narrow.runnel', 'new-errors', 0], // an error, but not new
    ['narrow.runnel', 'narrow.runnel', 'errors', 1],
  ])('%s -> %s with --fail-on %s exits %i', async (oldFile, newFile, policy, status) => {
    expect(await diffStatus(oldFile, newFile, policy)).toBe(status);
  });

  it(
    'as a child process: default policy new-errors, status 1 for a new error, Markdown verdict first',
    async () => {
      const run = await runRunnelProcess(['diff', 'ditch.runnel', 'narrow.runnel'], { cwd: folder, env: { NO_COLOR: '1' } });
      expect(run.status).toBe(1);
      expect(run.stdout.split('\n')[0]).toMatch(/^\*\*Runnel design review: worse\*\*: \*\*1 new error\*\*/);
      expect(run.stdout).toContain('CI policy: fails, 1 new error');
      expect(() => new MarkdownIt({ html: true }).render(run.stdout)).not.toThrow();
    },
    PROCESS_TEST_TIMEOUT_MS,
  );
});

describe('outputs and options', () => {
  it('JSON: the width change with before -> after in SI, and the over-topping check newly failing', async () => {
    const run = await runRunnelInProcess(['diff', 'ditch.runnel', 'narrow.runnel', '--format', 'json'], { cwd: folder });
    const document = JSON.parse(run.stdout) as {
      schemaVersion: number;
      policy: { failOn: string; fails: boolean };
      designs: { reaches: { inputChanges: { field: string; before: number; after: number }[]; checkChanges: { change: string; code: string }[] }[] }[];
    };
    expect(document.schemaVersion).toBe(1);
    expect(document.policy).toMatchObject({ failOn: 'new-errors', fails: true });
    const reach = document.designs[0]?.reaches[0];
    const width = reach?.inputChanges.find((change) => change.field === 'section.dimensions.bottomWidth_m');
    expect(width?.before).toBeCloseTo(20 * 0.3048, 9);
    expect(width?.after).toBeCloseTo(3 * 0.3048, 9);
    expect(reach?.checkChanges).toContainEqual(expect.objectContaining({ change: 'newly-failing', code: 'overtopping' }));
  });

  it('thresholds: a depth change below --min-depth-change is not listed', async () => {
    // 20 ft -> 15 ft of bottom raises normal depth by about half a foot (4.05 ft -> 4.57 ft by Manning).
    const listed = await runRunnelInProcess(['diff', 'ditch.runnel', 'tight.runnel', '--format', 'json', '--fail-on', 'never'], { cwd: folder });
    const hidden = await runRunnelInProcess(['diff', 'ditch.runnel', 'tight.runnel', '--format', 'json', '--fail-on', 'never', '--min-depth-change', '1ft'], {
      cwd: folder,
    });
    const quantities = (text: string): string[] =>
      (JSON.parse(text) as { designs: { reaches: { flows: { resultChanges: { quantity: string }[] }[] }[] }[] }).designs.flatMap((design) =>
        design.reaches.flatMap((reach) => reach.flows.flatMap((flow) => flow.resultChanges.map((change) => change.quantity))),
      );
    expect(quantities(listed.stdout)).toContain('normalDepth_m');
    expect(quantities(hidden.stdout)).not.toContain('normalDepth_m');
    expect(quantities(hidden.stdout)).not.toContain('freeboard_m');
  });

  it('thresholds need units of the right kind', async () => {
    const noUnit = await runRunnelInProcess(['diff', 'ditch.runnel', 'tight.runnel', '--min-depth-change', '0.1'], { cwd: folder });
    expect(noUnit.status).toBe(2);
    expect(noUnit.stderr).toContain('option --min-depth-change needs a unit after 0.1');
    const wrongUnit = await runRunnelInProcess(['diff', 'ditch.runnel', 'tight.runnel', '--min-velocity-change', '2cfs'], { cwd: folder });
    expect(wrongUnit.status).toBe(2);
    expect(wrongUnit.stderr).toContain("'cfs' is not a unit of a velocity");
    const percent = await runRunnelInProcess(['diff', 'ditch.runnel', 'tight.runnel', '--min-change', '5%', '--fail-on', 'never'], { cwd: folder });
    expect(percent.status).toBe(0);
  });

  it('usage mistakes exit 2', async () => {
    for (const args of [['diff'], ['diff', 'ditch.runnel'], ['diff', 'a', 'b', 'c'], ['diff', 'ditch.runnel', 'tight.runnel', '--fail-on', 'sometimes']]) {
      const run = await runRunnelInProcess(args, { cwd: folder });
      expect(run.status, args.join(' ')).toBe(2);
      expect(run.stderr).toMatch(/^runnel: /);
    }
  });

  it('--help lists the policies', async () => {
    const run = await runRunnelInProcess(['diff', '--help']);
    expect(run.status).toBe(0);
    for (const policy of ['new-errors', 'errors', 'warnings', 'never']) expect(run.stdout).toContain(`  ${policy}`);
  });
});
