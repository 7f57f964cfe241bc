/**
 * The editor's "compare with the last commit": one design file as the editor holds it against its version at
 * HEAD, as the Markdown `runnel diff` writes. Both versions are analysed with the other design files of their
 * own version (the repository at HEAD, the working tree with the editor's text), so a library change since the
 * commit shows too. Answers the server request COMPARE_WITH_LAST_COMMIT_REQUEST (server/protocol.ts); never
 * throws for a user's situation (not a repository, no commits, git missing): it says so in `problem`.
 */
import { dirname, relative, sep } from 'node:path';
import { renderSingleFileComparison } from '../../language/diff/single-file-comparison.js';
import type { CompareWithLastCommitResult } from '../protocol.js';
import { analyseWorkspace, designProblemsOf } from '../cli/analyse-workspace.js';
import type { CriteriaDefaults } from '../../language/analysis/criteria-settings.js';
import { findRepositoryRoot, hasCommits, resolveCommit, shortCommitId } from './repository.js';
import { revisionComparisonFiles } from './revision-workspace.js';
import { GitError } from './run-git.js';

export interface CompareWithLastCommitInput {
  /** Absolute path of the design file on disk. */
  readonly filePath: string;
  /** The editor's text of the file (it may be unsaved); null to read the file from disk. */
  readonly currentText: string | null;
  /** Criteria defaults from settings; both versions are judged with them. */
  readonly criteriaDefaults: CriteriaDefaults;
}

export async function compareWithLastCommit(input: CompareWithLastCommitInput): Promise<CompareWithLastCommitResult> {
  try {
    const root = await findRepositoryRoot(dirname(input.filePath));
    if (root === null) return problem('This file is not in a git repository, so there is no last commit to compare it with.');
    if (!(await hasCommits(root))) return problem('The repository has no commits yet, so there is no last commit to compare this file with.');
    const commit = await resolveCommit(root, 'HEAD');
    const overrides = new Map(input.currentText === null ? [] : [[input.filePath, input.currentText] as const]);
    const files = await revisionComparisonFiles(root, commit, overrides);
    const repositoryPath = relative(root, input.filePath).split(sep).join('/');
    const pair = files.pairs.find((candidate) => candidate.path === repositoryPath);
    if (pair === undefined || pair.workingPath === null) return problem(`git does not see ${repositoryPath} in the working tree (is it ignored?).`);
    const [before, after] = await Promise.all([
      pair.basePath === null ? Promise.resolve(undefined) : analyseWorkspace(files.baseFiles, [pair.basePath], input.criteriaDefaults).then((results) => results.get(pair.basePath ?? '')),
      analyseWorkspace(files.workingFiles, [pair.workingPath], input.criteriaDefaults).then((results) => results.get(pair.workingPath ?? '')),
    ]);
    if (after === undefined) return problem(`Runnel could not read ${repositoryPath}.`);
    const markdown = renderSingleFileComparison({
      path: repositoryPath,
      previousPath: pair.previousPath,
      before: before === undefined ? null : { analysis: before.analysis, problems: designProblemsOf(before) },
      after: { analysis: after.analysis, problems: designProblemsOf(after) },
      beforeLabel: `last commit (${await shortCommitId(root, commit)})`,
      afterLabel: input.currentText === null ? 'working tree' : 'editor',
    });
    return { markdown, problem: null };
  } catch (error) {
    if (error instanceof GitError) return problem(`The comparison needs git: ${error.message}.`);
    throw error;
  }
}

function problem(text: string): CompareWithLastCommitResult {
  return { markdown: null, problem: text };
}
