/**
 * Runs the `git` command line (never a shell) and turns its failures into plain-words errors for people: git not
 * installed, not a repository, an unknown revision. Read-only commands only: Runnel never changes a repository.
 */
import { execFile } from 'node:child_process';

/** A git problem the user can act on; its message is shown as it is, without a stack trace. */
export class GitError extends Error {
  override readonly name = 'GitError';
}

export interface GitOutput {
  readonly stdout: Buffer;
  readonly stderr: string;
  readonly exitCode: number;
}

/** Generous: a repository's design files at one revision are far smaller than this. */
const MAX_OUTPUT_BYTES = 256 * 1024 * 1024;

/**
 * Runs `git args...` in `cwd` and returns its output whatever its exit code; rejects only when git cannot run.
 * `input` is written to its standard input (for `git cat-file --batch`).
 */
export function runGit(args: readonly string[], cwd: string, input?: string): Promise<GitOutput> {
  return new Promise((resolve, reject) => {
    const child = execFile(
      'git',
      [...args],
      // LC_ALL=C keeps git's messages stable for the few places that read them; no pager, no prompts.
      { cwd, encoding: 'buffer', maxBuffer: MAX_OUTPUT_BYTES, env: { ...process.env, LC_ALL: 'C', GIT_PAGER: 'cat', GIT_TERMINAL_PROMPT: '0' } },
      (error, stdout, stderr) => {
        const exitCode = error === null ? 0 : typeof error.code === 'number' ? error.code : -1;
        if (error !== null && exitCode === -1) {
          const reason = (error as NodeJS.ErrnoException).code === 'ENOENT' ? 'git is not installed or not on the PATH' : error.message;
          reject(new GitError(`cannot run git: ${reason}`));
          return;
        }
        resolve({ stdout, stderr: stderr.toString('utf8').trim(), exitCode });
      },
    );
    if (input !== undefined) child.stdin?.end(input);
  });
}

/** Runs git and returns standard output as text; a non-zero exit becomes a GitError with `what` and git's message. */
export async function gitText(args: readonly string[], cwd: string, what: string): Promise<string> {
  const output = await runGit(args, cwd);
  if (output.exitCode !== 0) throw new GitError(`${what}: ${output.stderr || `git exited with status ${output.exitCode}`}`);
  return output.stdout.toString('utf8');
}
