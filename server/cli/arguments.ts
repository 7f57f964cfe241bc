/**
 * Command-line arguments: a small parser for `--name value`, `--name=value`, flags and positional arguments,
 * driven by each command's option table (which also writes its help). A mistake is a UsageError: the CLI prints
 * its message and the command's usage line and exits with status 2.
 */
import { closestName } from '../../language/validation/closest-name.js';

/** A mistake in how the command was called; the message is shown as it is, without a stack trace. */
export class UsageError extends Error {
  override readonly name = 'UsageError';
}

export interface OptionSpec {
  /** Long name without dashes, e.g. `format`. */
  readonly name: string;
  /** One-letter alias without the dash, e.g. `o`. */
  readonly short?: string;
  /** Placeholder for the value in help, e.g. `FILE`; absent for a flag. */
  readonly value?: string;
  /** Allowed values, when the option takes one of a fixed set. */
  readonly choices?: readonly string[];
  /** One line for help. */
  readonly description: string;
}

export interface ParsedArguments {
  readonly positionals: readonly string[];
  /** Option values by long name (the last one wins); flags map to "true". */
  readonly options: ReadonlyMap<string, string>;
}

/** Parses `args` against `specs`; `--` ends the options (a file may then start with a dash). */
export function parseArguments(args: readonly string[], specs: readonly OptionSpec[]): ParsedArguments {
  const byName = new Map(specs.map((spec) => [spec.name, spec]));
  const byShort = new Map(specs.flatMap((spec) => (spec.short === undefined ? [] : [[spec.short, spec] as const])));
  const positionals: string[] = [];
  const options = new Map<string, string>();
  let onlyPositionals = false;
  for (let index = 0; index < args.length; index++) {
    const argument = args[index] ?? '';
    if (onlyPositionals || !argument.startsWith('-') || argument === '-') {
      positionals.push(argument);
      continue;
    }
    if (argument === '--') {
      onlyPositionals = true;
      continue;
    }
    const long = argument.startsWith('--');
    const equals = argument.indexOf('=');
    const written = long ? argument.slice(2, equals < 0 ? undefined : equals) : argument.slice(1, 2);
    const spec = long ? byName.get(written) : byShort.get(written);
    if (spec === undefined) throw new UsageError(unknownOptionMessage(argument, written, long, specs));
    let value: string | undefined;
    if (long && equals >= 0) value = argument.slice(equals + 1);
    else if (!long && argument.length > 2) value = argument.slice(2);
    if (spec.value === undefined) {
      if (value !== undefined) throw new UsageError(`option --${spec.name} takes no value`);
      options.set(spec.name, 'true');
      continue;
    }
    if (value === undefined) {
      const next = args[index + 1];
      if (next === undefined || (next.startsWith('-') && next !== '-' && !/^-\d|^-\.\d/.test(next))) {
        throw new UsageError(`option --${spec.name} needs a value (${spec.value})`);
      }
      value = next;
      index++;
    }
    if (spec.choices !== undefined && !spec.choices.includes(value)) {
      const suggestion = closestName(value, spec.choices);
      throw new UsageError(
        `option --${spec.name} does not accept '${value}'${suggestion === undefined ? '' : ` (did you mean '${suggestion}'?)`}; ` +
          `choose one of: ${spec.choices.join(', ')}`,
      );
    }
    options.set(spec.name, value);
  }
  return { positionals, options };
}

function unknownOptionMessage(argument: string, written: string, long: boolean, specs: readonly OptionSpec[]): string {
  const suggestion = long ? closestName(written, specs.map((spec) => spec.name)) : undefined;
  return `unknown option '${argument}'${suggestion === undefined ? '' : ` (did you mean '--${suggestion}'?)`}`;
}

/** The help lines of an option table, aligned. */
export function describeOptions(specs: readonly OptionSpec[]): string {
  const heads = specs.map((spec) => {
    const short = spec.short === undefined ? '    ' : `-${spec.short}, `;
    return `  ${short}--${spec.name}${spec.value === undefined ? '' : ` ${spec.value}`}`;
  });
  const width = Math.max(...heads.map((head) => head.length)) + 2;
  return specs
    .map((spec, index) => {
      const choices = spec.choices === undefined ? '' : ` (${spec.choices.join(', ')})`;
      return `${(heads[index] ?? '').padEnd(width)}${spec.description}${choices}`;
    })
    .join('\n');
}
