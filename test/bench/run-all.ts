/**
 * `npm run bench`: runs every bench module in this folder, engine first; `npm run bench -- engine profile` runs
 * only the named ones. Speed figures only: the tests are `npm test`.
 *
 * Each module is bundled with esbuild first and the bundle run in its own Node process, so the figures time the
 * code as it ships (dist/ is an esbuild bundle) and one module's heap and compiled code do not carry into the
 * next. Run under tsx instead, our code is slower than it ships and Langium's is not: tsx keeps function names by
 * wrapping every function made inside another in a call (esbuild's keepNames), which `npm run build` does not do;
 * it cost a fifth to a quarter of the analysis time of an edit in a 50-reach design, and Langium's parsing, which
 * tsx does not transform, would have looked relatively cheaper. The bundle takes the shipped build options
 * (.scripts/bundle-options.mjs) as ESM, is written next to the modules (so paths taken from its own location hold)
 * and deleted afterwards; esbuild itself stays external (the cold-start and protocol figures build the shipped
 * bundles with it). `npx tsx test/bench/<name>.ts` still runs one module from the sources.
 */
import { spawnSync } from 'node:child_process';
import { readdirSync, rmSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { basename, dirname, join } from 'node:path';
import { build } from 'esbuild';
import { NODE_BUNDLE_OPTIONS } from '../../.scripts/bundle-options.mjs';

const folder = dirname(fileURLToPath(import.meta.url));
const requested = process.argv.slice(2);
const names = readdirSync(folder)
  .filter((file) => file.endsWith('.ts') && file !== 'run-all.ts')
  .map((file) => basename(file, '.ts'))
  .sort((a, b) => (a === 'engine' ? -1 : b === 'engine' ? 1 : a.localeCompare(b)))
  .filter((name) => requested.length === 0 || requested.includes(name));

for (const unknown of requested.filter((name) => !names.includes(name))) console.error(`No bench module named '${unknown}' in test/bench/.`);
let failed = false;
for (const name of names) {
  console.log(`\n=== test/bench/${name}.ts ===\n`);
  const outfile = join(folder, `.bundled-${name}-${process.pid}.mjs`);
  try {
    // The shipped options, as ESM: import.meta keeps its own meaning (no CommonJS mapping), and bundled CommonJS
    // dependencies that call require get one.
    await build({
      ...NODE_BUNDLE_OPTIONS,
      format: 'esm',
      define: {},
      banner: { js: "import { createRequire as createRequireForBundle } from 'node:module'; const require = createRequireForBundle(import.meta.url);" },
      sourcemap: false,
      external: ['esbuild'],
      entryPoints: [join(folder, `${name}.ts`)],
      outfile,
    });
    // Each module runs itself when it is the process's main module.
    const { status, signal } = spawnSync(process.execPath, [outfile], { stdio: 'inherit' });
    if (status !== 0) {
      console.error(`test/bench/${name}.ts failed (${signal ?? `exit status ${status}`}).`);
      failed = true;
    }
  } catch (error) {
    console.error(`test/bench/${name}.ts could not be bundled: ${error instanceof Error ? error.message : String(error)}`);
    failed = true;
  } finally {
    rmSync(outfile, { force: true });
  }
}
if (failed) process.exitCode = 1;
