/**
 * Runs the `runnel` CLI for tests: as a child process (the real entry point through tsx, or the bundle named by
 * RUNNEL_CLI_BUNDLE, e.g. dist/runnel.cjs after `npm run build`), or in-process through runCli for the many
 * small cases. Also the small design files the tests write into temporary folders.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve as resolvePath } from 'node:path';
import { afterAll } from 'vitest';
import { runCli } from '../../server/cli/run-cli.js';

export const REPOSITORY_ROOT = join(import.meta.dirname, '..', '..');
const CLI_ENTRY = join(REPOSITORY_ROOT, 'server', 'cli.ts');
const TSX_LOADER = join(REPOSITORY_ROOT, 'node_modules', 'tsx', 'dist', 'loader.mjs');

/** Child processes start slowly on a loaded machine (tsx compiles the sources): allow for it. */
export const PROCESS_TEST_TIMEOUT_MS = 120_000;

export interface RunResult {
  readonly status: number;
  readonly stdout: string;
  readonly stderr: string;
}

export interface RunOptions {
  readonly cwd?: string;
  /** Added to a clean environment (the colour variables of the test runner removed). */
  readonly env?: Readonly<Record<string, string>>;
}

function cleanEnvironment(extra: Readonly<Record<string, string>>): Record<string, string> {
  const env: Record<string, string> = {};
  for (const [key, value] of Object.entries(process.env)) {
    if (value !== undefined && key !== 'NO_COLOR' && key !== 'FORCE_COLOR' && key !== 'RUNNEL_DEBUG') env[key] = value;
  }
  return { ...env, ...extra };
}

export function runRunnelProcess(args: readonly string[], options: RunOptions = {}): Promise<RunResult> {
  const given = process.env['RUNNEL_CLI_BUNDLE'];
  // A relative bundle path is relative to the repository (npm test passes dist/runnel.cjs); tests run in temp folders.
  const bundle = given === undefined || given === '' ? undefined : resolvePath(REPOSITORY_ROOT, given);
  const nodeArgs = bundle === undefined ? ['--import', TSX_LOADER, CLI_ENTRY, ...args] : [bundle, ...args];
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, nodeArgs, { cwd: options.cwd ?? REPOSITORY_ROOT, env: cleanEnvironment(options.env ?? {}), stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (chunk: string) => (stdout += chunk));
    child.stderr.setEncoding('utf8').on('data', (chunk: string) => (stderr += chunk));
    child.on('error', reject);
    child.on('close', (status) => resolve({ status: status ?? -1, stdout, stderr }));
  });
}

export async function runRunnelInProcess(args: readonly string[], options: RunOptions & { readonly tty?: boolean } = {}): Promise<RunResult> {
  let stdout = '';
  let stderr = '';
  const status = await runCli(args, {
    cwd: options.cwd ?? REPOSITORY_ROOT,
    env: options.env ?? {},
    stdout: { write: (text: string) => (stdout += text), isTTY: options.tty ?? false },
    stderr: { write: (text: string) => (stderr += text), isTTY: options.tty ?? false },
  });
  return { status, stdout, stderr };
}

const temporaryFolders: string[] = [];

/** A new empty folder, removed when the test file's suites are done. */
export function temporaryFolder(prefix: string): string {
  const folder = mkdtempSync(join(tmpdir(), `runnel-${prefix}-`));
  temporaryFolders.push(folder);
  return folder;
}

afterAll(() => {
  for (const folder of temporaryFolders.splice(0)) rmSync(folder, { recursive: true, force: true });
});

export function writeFiles(folder: string, files: Readonly<Record<string, string>>): void {
  for (const [path, text] of Object.entries(files)) {
    const full = join(folder, path);
    mkdirSync(dirname(full), { recursive: true });
    writeFileSync(full, text, 'utf8');
  }
}

/** A shared library of linings, as a workspace would keep it (values as in samples/linings.runnel). */
export const LINING_LIBRARY = `library "Test linings"
lining turf "Turf, medium height" {
  n 0.035
  permissible shear 1.00 psf
}
lining riprap "Dumped riprap, D50 = 6 in" {
  n 0.033
  permissible shear 2.0 psf
}
`;

/**
 * A design that uses the library: the trapezoid of Chow (1959) Ch. 6 (REFERENCES.md N1: b = 20 ft, z = 2,
 * S = 0.0016, Q = 400 cfs) with a turf lining, 5 ft banks and 0.5 ft freeboard required.
 */
export function ditchDesign(options: { readonly bottomFt?: number; readonly slopePercent?: number; readonly lining?: string; readonly reach?: string } = {}): string {
  return `design "Test ditch"
units US
criteria {
  freeboard 0.5 ft
}
section wide trapezoid {
  bottom width ${options.bottomFt ?? 20} ft
  side slopes 2:1
  bank height 5 ft
}
flows {
  q100 = 400 cfs "100-year storm"
}
channel east {
  reach ${options.reach ?? 'upper'} {
    section wide
    lining ${options.lining ?? 'turf'}
    slope ${options.slopePercent ?? 0.16} %
    length 900 ft
  }
  outlet free fall
}
`;
}
