/**
 * `npm run bench`: runs every bench module in this folder (each exports `run(): Promise<void>`), engine first.
 * `npm run bench -- engine profile` runs only the named ones. Speed figures only: the tests are `npm test`.
 */
import { readdirSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { basename, dirname, join } from 'node:path';

interface BenchModule {
  readonly run?: () => Promise<void>;
}

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
  const module = (await import(pathToFileURL(join(folder, `${name}.ts`)).href)) as BenchModule;
  if (typeof module.run !== 'function') {
    console.error(`test/bench/${name}.ts exports no run() function; skipped.`);
    failed = true;
    continue;
  }
  try {
    await module.run();
  } catch (error) {
    console.error(`test/bench/${name}.ts failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
    failed = true;
  }
}
if (failed) process.exitCode = 1;
