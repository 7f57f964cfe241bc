// The main job on the samples, end to end: build the bundles, check every sample design, write each design's
// report (Markdown and HTML) to out/, and package the VS Code extension (.vsix).
// The samples are invented demo designs that deliberately fail some checks, so `runnel check` exiting 1
// ("the designs have errors") is expected here; any other non-zero exit stops the demo.
import { spawnSync } from 'node:child_process';
import { mkdirSync, readdirSync, readFileSync } from 'node:fs';
import { basename, join } from 'node:path';

const run = (command, args, acceptedExitCodes = [0]) => {
  console.log(`\n$ ${[command, ...args].join(' ')}`);
  const result = spawnSync(command, args, { stdio: 'inherit' });
  if (!acceptedExitCodes.includes(result.status ?? -1)) {
    console.error(`demo: '${command} ${args.join(' ')}' exited with ${result.status ?? result.signal}`);
    process.exit(1);
  }
};

run('npm', ['run', 'build', '--silent']);
run('node', ['dist/runnel.cjs', 'check', 'samples'], [0, 1]);

mkdirSync('out', { recursive: true });
const designs = readdirSync('samples')
  .filter((name) => name.endsWith('.runnel'))
  .filter((name) => /^\s*design\b/m.test(readFileSync(join('samples', name), 'utf8')));
for (const name of designs) {
  const stem = basename(name, '.runnel');
  run('node', ['dist/runnel.cjs', 'report', join('samples', name), '--out', join('out', `${stem}.md`)], [0, 1]);
  run('node', ['dist/runnel.cjs', 'report', join('samples', name), '--out', join('out', `${stem}.html`)], [0, 1]);
}
run('npm', ['run', 'package', '--silent']);
console.log('\nReports are in out/; the extension package is runnel-*.vsix in this folder.');
