/**
 * The `runnel` command line: picks the command, runs it, and turns every mistake into a short message. Exit
 * status: 0 success, 1 the designs have errors (check, report) or the comparison fails its policy (diff), 2 a
 * usage mistake (unknown option, missing file, not a git repository, unknown revision), 3 a fault in Runnel.
 * No stack trace is printed unless RUNNEL_DEBUG is set.
 */
import { closestName } from '../../language/validation/closest-name.js';
import { UsageError } from './arguments.js';
import { CHECK_USAGE, checkHelp, runCheck } from './commands/check.js';
import { DIFF_USAGE, diffHelp, runDiff } from './commands/diff.js';
import { REPORT_USAGE, reportHelp, runReport } from './commands/report.js';
import type { CliContext } from './terminal.js';
import { TOOL } from './tool-info.js';

export const EXIT_SUCCESS = 0;
export const EXIT_USAGE = 2;
export const EXIT_INTERNAL_FAULT = 3;

interface Command {
  readonly usage: string;
  readonly summary: string;
  readonly help: () => string;
  readonly run: (args: readonly string[], context: CliContext) => Promise<number>;
}

const COMMANDS: Readonly<Record<string, Command>> = {
  check: { usage: CHECK_USAGE, summary: 'check design files and list every problem and finding', help: checkHelp, run: runCheck },
  report: { usage: REPORT_USAGE, summary: 'write the report of a design (Markdown, or HTML)', help: reportHelp, run: runReport },
  diff: { usage: DIFF_USAGE, summary: 'show what a change did to the designs (for pull-request review)', help: diffHelp, run: runDiff },
};

export function generalHelp(): string {
  const commands = Object.entries(COMMANDS)
    .map(([name, command]) => `  ${name.padEnd(8)} ${command.summary}`)
    .join('\n');
  return `Usage: runnel <command> [options]

Runnel checks open-channel designs written as .runnel text files: normal and critical depth by Manning's
equation, freeboard, Froude number, velocity and shear against the lining, conduit capacity.

Commands:
${commands}

Run 'runnel <command> --help' for a command's options. 'runnel --version' prints the version.
Output is coloured on a terminal unless NO_COLOR is set.
`;
}

export async function runCli(argv: readonly string[], context: CliContext): Promise<number> {
  const [name, ...rest] = argv;
  let command: Command | undefined;
  try {
    if (name === undefined) {
      context.stderr.write(generalHelp());
      return EXIT_USAGE;
    }
    if (name === '--help' || name === '-h' || name === 'help') {
      const topic = rest[0] === undefined ? undefined : COMMANDS[rest[0]];
      context.stdout.write(topic === undefined ? generalHelp() : topic.help());
      return EXIT_SUCCESS;
    }
    if (name === '--version' || name === '-V' || name === 'version') {
      context.stdout.write(`${TOOL.name} ${TOOL.version}\n`);
      return EXIT_SUCCESS;
    }
    command = Object.hasOwn(COMMANDS, name) ? COMMANDS[name] : undefined;
    if (command === undefined) {
      const suggestion = closestName(name, Object.keys(COMMANDS));
      throw new UsageError(`unknown command '${name}'${suggestion === undefined ? '' : ` (did you mean '${suggestion}'?)`}`);
    }
    return await command.run(rest, context);
  } catch (error) {
    if (error instanceof UsageError) {
      const usage = command === undefined ? 'Usage: runnel <command> [options]' : `Usage: ${command.usage}`;
      const more = command === undefined ? "Run 'runnel --help' for the commands." : `Run 'runnel ${name ?? ''} --help' for its options.`;
      context.stderr.write(`runnel: ${error.message}\n${usage}\n${more}\n`);
      return EXIT_USAGE;
    }
    const message = error instanceof Error ? error.message : String(error);
    context.stderr.write(`runnel: internal error: ${message}\nThis is a fault in Runnel, not in your design; please report it.\n`);
    if (context.env['RUNNEL_DEBUG'] !== undefined && error instanceof Error && error.stack !== undefined) context.stderr.write(`${error.stack}\n`);
    return EXIT_INTERNAL_FAULT;
  }
}
