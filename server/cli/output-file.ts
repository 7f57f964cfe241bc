/**
 * Writes a command's output to standard output, or to the file named with `--out` (then a one-line note goes to
 * standard error, so a pipeline's standard output stays clean).
 */
import { writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { UsageError } from './arguments.js';
import type { CliContext } from './terminal.js';

export function writeOutput(text: string, out: string | undefined, context: CliContext): void {
  if (out === undefined || out === '-') {
    context.stdout.write(text);
    return;
  }
  try {
    writeFileSync(resolve(context.cwd, out), text, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const reason = code === 'ENOENT' ? 'its folder does not exist' : code === 'EACCES' ? 'permission denied' : code === 'EISDIR' ? 'it is a folder' : 'it cannot be written';
    throw new UsageError(`cannot write '${out}': ${reason}`);
  }
  context.stderr.write(`runnel: wrote ${out}\n`);
}
