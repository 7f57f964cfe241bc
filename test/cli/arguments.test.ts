/**
 * The command line itself: option parsing, commands, help and version, and mistakes that must exit 2 with a
 * plain message (no stack trace).
 */
import { describe, expect, it } from 'vitest';
import { parseArguments, UsageError, type OptionSpec } from '../../server/cli/arguments.js';
import { parseQuantityOption } from '../../server/cli/quantity-option.js';
import { runRunnelInProcess } from './cli-harness.js';

const SPECS: readonly OptionSpec[] = [
  { name: 'format', short: 'f', value: 'FORMAT', choices: ['text', 'json'], description: 'format' },
  { name: 'out', short: 'o', value: 'FILE', description: 'output' },
  { name: 'help', short: 'h', description: 'help' },
];

describe('parseArguments', () => {
  it('reads --name value, --name=value, -x value, -xvalue, flags and positionals', () => {
    const parsed = parseArguments(['a.runnel', '--format', 'json', '--out=r.txt', '-h', 'b.runnel'], SPECS);
    expect(parsed.positionals).toEqual(['a.runnel', 'b.runnel']);
    expect(Object.fromEntries(parsed.options)).toEqual({ format: 'json', out: 'r.txt', help: 'true' });
    expect(Object.fromEntries(parseArguments(['-fjson', '-o', 'x'], SPECS).options)).toEqual({ format: 'json', out: 'x' });
  });

  it('treats everything after -- as files, even with a leading dash', () => {
    expect(parseArguments(['--', '--odd.runnel'], SPECS).positionals).toEqual(['--odd.runnel']);
  });

  it.each([
    [['--fromat', 'json'], "unknown option '--fromat' (did you mean '--format'?)"],
    [['--format'], 'option --format needs a value (FORMAT)'],
    [['--format', '--out'], 'option --format needs a value (FORMAT)'],
    [['--format', 'jsno'], "option --format does not accept 'jsno' (did you mean 'json'?); choose one of: text, json"],
    [['--help=yes'], 'option --help takes no value'],
    [['-z'], "unknown option '-z'"],
  ])('%j is a usage error: %s', (args, message) => {
    expect(() => parseArguments(args, SPECS)).toThrow(new UsageError(message));
  });
});

describe('quantity options', () => {
  it('converts with the unit table: 0.01ft, 3 mm', () => {
    // 1 ft = 0.3048 m exactly (NIST SP 811, App. B).
    expect(parseQuantityOption('min-depth-change', '0.01ft', 'length')).toBeCloseTo(0.003048, 12);
    expect(parseQuantityOption('min-depth-change', '3 mm', 'length')).toBeCloseTo(0.003, 12);
  });
  it('refuses a bare number, a wrong dimension and a negative value', () => {
    expect(() => parseQuantityOption('x', '0.01', 'length')).toThrow(/needs a unit after 0\.01/);
    expect(() => parseQuantityOption('x', '1cfs', 'length')).toThrow(/'cfs' is not a unit of a length/);
    expect(() => parseQuantityOption('x', '-1ft', 'length')).toThrow(UsageError);
  });
});

describe('runnel', () => {
  it('without a command prints the commands to standard error and exits 2', async () => {
    const run = await runRunnelInProcess([]);
    expect(run.status).toBe(2);
    expect(run.stderr).toContain('Commands:');
  });

  it('--help, help <command> and --version exit 0', async () => {
    expect((await runRunnelInProcess(['--help'])).stdout).toContain('Usage: runnel <command>');
    expect((await runRunnelInProcess(['help', 'diff'])).stdout).toContain('Usage: runnel diff');
    expect((await runRunnelInProcess(['--version'])).stdout).toMatch(/^runnel \d+\.\d+\.\d+\n$/);
  });

  it('an unknown command suggests the nearest one', async () => {
    const run = await runRunnelInProcess(['chekc', 'x.runnel']);
    expect(run.status).toBe(2);
    expect(run.stderr).toContain("unknown command 'chekc' (did you mean 'check'?)");
  });
});
