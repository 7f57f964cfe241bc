// The `runnel` command line (bundled to dist/runnel-cli.cjs, which dist/runnel.cjs runs). The polyfill must load
// first: Langium 4.4 needs Object.groupBy, which Node 20 lacks.
import '../language/polyfills/object-group-by.cjs';
import { runCli } from './cli/run-cli.js';

// A reader that closes the pipe early (`runnel check ... | head`) is not an error.
process.stdout.on('error', (error: NodeJS.ErrnoException) => {
  if (error.code === 'EPIPE') process.exit(process.exitCode ?? 0);
  throw error;
});

void runCli(process.argv.slice(2), { cwd: process.cwd(), env: process.env, stdout: process.stdout, stderr: process.stderr }).then((status) => {
  process.exitCode = status;
});
