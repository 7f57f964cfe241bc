/**
 * CLI cold start beside bare Node, in the same run: `node -e 0`, `node dist/runnel.cjs --help`, and
 * `node dist/runnel.cjs check` of one small sample (the roadside ditches with the shared linings), each started as a
 * fresh process RUNS times in interleaved order (so drift in machine load falls on all three alike), after one
 * untimed start of each to warm the file cache. Reports the median and fastest wall-clock time and each median's
 * ratio to bare Node's. Target (issue 8): the CLI within 4x of bare Node. `runnel check` is timed twice: as it
 * starts after a build or any earlier run (with the code cache the launcher keeps, server/cli-launcher.ts), and as the
 * very first start with no cache (which compiles the whole bundle and writes the cache). Then the language server
 * the same way, from its start to the diagnostics of a sample.
 *
 * The bundle is dist/runnel.cjs (`npm run build`) when it exists, else one built now from the sources with the
 * options of .scripts/build.mjs into a temporary folder; RUNNEL_CLI_BUNDLE=path picks another. RUNNEL_BENCH_RUNS=n
 * changes the number of timed starts (default 21).
 * Run with `npm run bench` (all bench modules) or `npm run bench -- cold-start`.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { CLI_BUNDLE_FILE, CODE_CACHE_SUFFIX, SERVER_BUNDLE_FILE } from '../../.scripts/bundle-options.mjs';
import { placeLauncherPair } from '../server/launcher-pair.js';
import { TestLanguageClient, pathToUri } from '../server/lsp-client.js';

const ROOT = join(fileURLToPath(import.meta.url), '..', '..', '..');
const DEFAULT_RUNS = 21;
const TARGET_RATIO = 4;
/** Server sessions timed with and without the code cache (each takes about half a second and a stop). */
const SERVER_RUNS = 11;

interface Subject {
  readonly name: string;
  readonly args: readonly string[];
  /** Exit statuses that count as a normal run (check exits 1 when the sample has error findings). */
  readonly okStatuses: readonly number[];
  /** Run before each start, untimed. */
  readonly prepare?: () => void;
}

export interface ColdStartRow {
  readonly name: string;
  readonly medianMs: number;
  readonly fastestMs: number;
  readonly ratioToNode: number;
}

export async function run(): Promise<void> {
  const runs = Math.max(3, Number(process.env['RUNNEL_BENCH_RUNS'] ?? DEFAULT_RUNS) || DEFAULT_RUNS);
  const { bundle, cleanUp, origin } = await cliBundle();
  try {
    const sample = join(ROOT, 'samples', 'roadside-ditches.runnel');
    const linings = join(ROOT, 'samples', 'linings.runnel');
    // The launcher keeps the bundle's compiled code beside it (server/code-cache.ts); the first start after it is
    // removed compiles everything and writes it again, as the first run after an installation without a build would.
    const codeCache = join(dirname(bundle), `${CLI_BUNDLE_FILE}${CODE_CACHE_SUFFIX}`);
    const subjects: Subject[] = [
      { name: 'node -e 0', args: ['-e', '0'], okStatuses: [0] },
      { name: 'runnel --help', args: [bundle, '--help'], okStatuses: [0] },
      { name: 'runnel check (one sample + linings)', args: [bundle, 'check', sample, linings], okStatuses: [0, 1] },
      {
        name: 'runnel check, first start (no code cache)',
        args: [bundle, 'check', sample, linings],
        okStatuses: [0, 1],
        prepare: () => rmSync(codeCache, { force: true }),
      },
    ];
    for (const subject of subjects) startOnce(subject); // warm the file cache, untimed
    const times = new Map<string, number[]>(subjects.map((subject) => [subject.name, []]));
    for (let index = 0; index < runs; index++) {
      for (const subject of subjects) times.get(subject.name)?.push(startOnce(subject));
    }
    const nodeMedian = median(times.get('node -e 0') ?? []);
    const rows: ColdStartRow[] = subjects.map((subject) => {
      const samples = times.get(subject.name) ?? [];
      const medianMs = median(samples);
      return { name: subject.name, medianMs, fastestMs: Math.min(...samples), ratioToNode: medianMs / nodeMedian };
    });
    console.log(`CLI cold start: ${runs} starts each, interleaved; ${cpus().length} CPUs, load average ${loadavg()[0]?.toFixed(1)} at the end; bundle: ${origin}`);
    console.log('');
    console.log('| command | median, ms | fastest, ms | median / node -e 0 |');
    console.log('| --- | ---: | ---: | ---: |');
    for (const row of rows) console.log(`| ${row.name} | ${row.medianMs.toFixed(0)} | ${row.fastestMs.toFixed(0)} | ${row.ratioToNode.toFixed(2)} |`);
    console.log('');
    for (const row of rows.slice(1)) {
      console.log(`${row.name}: ${row.ratioToNode.toFixed(2)}x bare Node start (target within ${TARGET_RATIO}x): ${row.ratioToNode <= TARGET_RATIO ? 'met' : 'NOT met'}`);
    }
  } finally {
    cleanUp();
  }
  await timeServerStarts(Math.min(runs, SERVER_RUNS));
}

/**
 * The language server as the editor starts it (dist/server.cjs, the launcher of server/code-cache.ts): from spawning
 * it to the diagnostics of one sample over stdio (initialize, initialized, didOpen), with the code cache the server
 * writes when it exits and without it, interleaved; then the session is closed, untimed.
 */
async function timeServerStarts(runs: number): Promise<void> {
  const { launcher, cleanUp, origin } = await serverLauncher();
  try {
    const cache = join(dirname(launcher), `${SERVER_BUNDLE_FILE}${CODE_CACHE_SUFFIX}`);
    const sample = join(ROOT, 'samples', 'roadside-ditches.runnel');
    const uri = pathToUri(sample);
    const text = readFileSync(sample, 'utf8');
    const session = async (): Promise<number> => {
      const started = performance.now();
      const { client } = await TestLanguageClient.start({ serverPath: launcher });
      try {
        await client.open(uri, text);
        await client.diagnostics(uri);
        return performance.now() - started;
      } finally {
        await client.stop();
      }
    };
    await session(); // warms the file cache and writes the code cache, untimed
    const withCache: number[] = [];
    const withoutCache: number[] = [];
    for (let index = 0; index < runs; index++) {
      withCache.push(await session());
      rmSync(cache, { force: true });
      withoutCache.push(await session()); // writes the cache again when it exits
    }
    console.log('');
    console.log(`Language server, start to the first diagnostics of one sample over stdio: ${runs} starts each, interleaved; server: ${origin}`);
    console.log('');
    console.log('| server start | median, ms | fastest, ms |');
    console.log('| --- | ---: | ---: |');
    console.log(`| with the code cache | ${median(withCache).toFixed(0)} | ${Math.min(...withCache).toFixed(0)} |`);
    console.log(`| first start (no code cache) | ${median(withoutCache).toFixed(0)} | ${Math.min(...withoutCache).toFixed(0)} |`);
  } finally {
    cleanUp();
  }
}

async function serverLauncher(): Promise<{ launcher: string; cleanUp: () => void; origin: string }> {
  const shipped = join(ROOT, 'dist', 'server.cjs');
  if (existsSync(shipped) && existsSync(join(ROOT, 'dist', SERVER_BUNDLE_FILE))) {
    return { launcher: shipped, cleanUp: () => undefined, origin: 'dist/server.cjs' };
  }
  const folder = mkdtempSync(join(tmpdir(), 'runnel-server-start-'));
  const { launcher } = await placeLauncherPair(folder, 'server', 'server.cjs');
  return { launcher, cleanUp: () => rmSync(folder, { recursive: true, force: true }), origin: 'built now from the sources (no dist/server.cjs)' };
}

/** One start of the subject, wall-clock milliseconds; throws if it fails. */
function startOnce(subject: Subject): number {
  subject.prepare?.();
  const started = performance.now();
  const result = spawnSync(process.execPath, subject.args, { cwd: ROOT, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
  const elapsedMs = performance.now() - started;
  if (result.error !== undefined || !subject.okStatuses.includes(result.status ?? -1)) {
    throw new Error(`${subject.name} failed (status ${String(result.status)}): ${result.error?.message ?? ''}${result.stderr.slice(0, 600)}`);
  }
  return elapsedMs;
}

function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? (sorted[middle] ?? Number.NaN) : ((sorted[middle - 1] ?? 0) + (sorted[middle] ?? 0)) / 2;
}

async function cliBundle(): Promise<{ bundle: string; cleanUp: () => void; origin: string }> {
  const given = process.env['RUNNEL_CLI_BUNDLE'];
  if (given !== undefined && given !== '') return { bundle: given, cleanUp: () => undefined, origin: given };
  const shipped = join(ROOT, 'dist', 'runnel.cjs');
  if (existsSync(shipped)) {
    const ageMinutes = (Date.now() - statSync(shipped).mtimeMs) / 60_000;
    return { bundle: shipped, cleanUp: () => undefined, origin: `dist/runnel.cjs (built ${ageMinutes.toFixed(0)} min ago; run npm run build first for current figures)` };
  }
  const folder = mkdtempSync(join(tmpdir(), 'runnel-cold-start-'));
  const { launcher } = await placeLauncherPair(folder, 'cli', 'runnel.cjs');
  return { bundle: launcher, cleanUp: () => rmSync(folder, { recursive: true, force: true }), origin: 'built now from the sources (no dist/runnel.cjs)' };
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) await run();
