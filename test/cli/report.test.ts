/**
 * `runnel report`: Markdown on standard output, HTML for an .html --out file, problems on standard error.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import MarkdownIt from 'markdown-it';
import { beforeAll, describe, expect, it } from 'vitest';
import { ditchDesign, LINING_LIBRARY, PROCESS_TEST_TIMEOUT_MS, runRunnelInProcess, runRunnelProcess, temporaryFolder, writeFiles } from './cli-harness.js';

let folder = '';
beforeAll(() => {
  folder = temporaryFolder('report');
  writeFiles(folder, {
    'linings.runnel': LINING_LIBRARY,
    'ditch.runnel': ditchDesign(),
    'broken.runnel': ditchDesign().replace('length 900 ft', 'length 900 furlongs'),
  });
});

describe('runnel report', () => {
  it(
    'writes Markdown with the caution to standard output and exits 0 (child process)',
    async () => {
      const run = await runRunnelProcess(['report', 'ditch.runnel'], { cwd: folder });
      expect(run.status).toBe(0);
      expect(run.stdout).toMatch(/^# Test ditch/m);
      expect(run.stdout).toMatch(/licensed engineer/);
      expect(() => new MarkdownIt().render(run.stdout)).not.toThrow();
    },
    PROCESS_TEST_TIMEOUT_MS,
  );

  it('writes one HTML page when --out ends in .html', async () => {
    const out = join(temporaryFolder('report-out'), 'ditch.html');
    const run = await runRunnelInProcess(['report', 'ditch.runnel', '--out', out], { cwd: folder });
    expect(run.status).toBe(0);
    expect(run.stdout).toBe('');
    const html = readFileSync(out, 'utf8');
    expect(html).toMatch(/^<!DOCTYPE html>/i);
    expect(html).toContain('licensed engineer');
  });

  it('--format html writes HTML to standard output, and Markdown to an .md file by default', async () => {
    expect((await runRunnelInProcess(['report', '--format', 'html', 'ditch.runnel'], { cwd: folder })).stdout).toMatch(/^<!DOCTYPE html>/i);
    const out = join(temporaryFolder('report-md'), 'ditch.md');
    await runRunnelInProcess(['report', 'ditch.runnel', '-o', out], { cwd: folder });
    expect(readFileSync(out, 'utf8')).toMatch(/^# Test ditch/);
  });

  it('lists the problems of a broken file on standard error and exits 1, still writing the report', async () => {
    const run = await runRunnelInProcess(['report', 'broken.runnel'], { cwd: folder });
    expect(run.status).toBe(1);
    expect(run.stderr).toMatch(/^broken\.runnel:19:\d+: error unit-unknown /m);
    expect(run.stdout).toMatch(/^# Test ditch/m);
  });

  it('refuses two files, a folder, or none, with status 2', async () => {
    for (const args of [['report'], ['report', 'ditch.runnel', 'broken.runnel'], ['report', '.']]) {
      const run = await runRunnelInProcess(args, { cwd: folder });
      expect(run.status, args.join(' ')).toBe(2);
      expect(run.stderr).toContain('Usage: runnel report');
    }
  });

  it('prints help', async () => {
    const run = await runRunnelInProcess(['report', '-h']);
    expect(run.status).toBe(0);
    expect(run.stdout).toContain('Usage: runnel report');
  });
});
