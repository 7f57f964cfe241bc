/**
 * Where the CLI writes and whether it may colour: colour only on a terminal, never when NO_COLOR is set to
 * anything (https://no-color.org), never for TERM=dumb; FORCE_COLOR (not "0") turns it on for tools that show
 * colours from a pipe. Files written with `--out` are never coloured.
 */

export interface OutputStream {
  write(text: string): unknown;
  readonly isTTY?: boolean;
}

/** Everything a command touches outside itself, so tests can run it in-process too. */
export interface CliContext {
  readonly cwd: string;
  readonly env: Readonly<Record<string, string | undefined>>;
  readonly stdout: OutputStream;
  readonly stderr: OutputStream;
}

export interface Styles {
  readonly bold: (text: string) => string;
  readonly dim: (text: string) => string;
  readonly error: (text: string) => string;
  readonly warning: (text: string) => string;
  readonly information: (text: string) => string;
  readonly success: (text: string) => string;
}

export function colourWanted(stream: OutputStream, env: CliContext['env']): boolean {
  if (env['NO_COLOR'] !== undefined && env['NO_COLOR'] !== '') return false;
  const force = env['FORCE_COLOR'];
  if (force !== undefined && force !== '' && force !== '0') return true;
  return stream.isTTY === true && env['TERM'] !== 'dumb';
}

const sgr =
  (open: number, close: number) =>
  (text: string): string =>
    `\u001b[${open}m${text}\u001b[${close}m`;

const PLAIN: Styles = {
  bold: (text) => text,
  dim: (text) => text,
  error: (text) => text,
  warning: (text) => text,
  information: (text) => text,
  success: (text) => text,
};

const COLOURED: Styles = {
  bold: sgr(1, 22),
  dim: sgr(2, 22),
  error: sgr(31, 39),
  warning: sgr(33, 39),
  information: sgr(36, 39),
  success: sgr(32, 39),
};

export function stylesFor(stream: OutputStream, env: CliContext['env']): Styles {
  return colourWanted(stream, env) ? COLOURED : PLAIN;
}

export const PLAIN_STYLES = PLAIN;
