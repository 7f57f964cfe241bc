/**
 * "Compare with last commit": what the edits to a design file did since the last commit, as Markdown. The editor's
 * version (saved or not) is analysed with the designs the server has open or loaded; the committed version with
 * the design files of that commit, so a shared linings file is taken at the same revision as the design. Git is
 * read through server/git (the command line, read-only); the comparison and its wording are language/diff's.
 */
import { dirname, isAbsolute, join, relative, sep } from 'node:path';
import { URI, type LangiumDocuments } from 'langium';
import { analyseWorkspace, designProblemsOf, type AnalysedFile, type WorkspaceFile } from '../cli/analyse-workspace.js';
import { findRepositoryRoot, hasCommits, readDesignFilesAtCommit, resolveCommit, shortCommitId, isDesignPath } from '../git/repository.js';
import { GitError } from '../git/run-git.js';
import { renderSingleFileComparison } from '../../language/diff/single-file-comparison.js';
import type { DesignVersion } from '../../language/diff/compare-designs.js';
import type { CompareWithLastCommitResult } from '../protocol.js';
import type { CriteriaDefaults } from '../../language/analysis/criteria-settings.js';

/** Both versions are judged with `criteriaDefaults`, the editor's criteria settings. */
export async function compareWithLastCommit(documentUri: string, documents: LangiumDocuments, criteriaDefaults: CriteriaDefaults): Promise<CompareWithLastCommitResult> {
  const uri = URI.parse(documentUri);
  if (uri.scheme !== 'file') return { markdown: null, problem: 'Only a design saved as a file in a git repository can be compared with its last commit.' };
  const path = uri.fsPath;
  try {
    const root = await findRepositoryRoot(dirname(path));
    if (root === null) return { markdown: null, problem: `${path} is not in a git repository.` };
    if (!(await hasCommits(root))) return { markdown: null, problem: 'The repository has no commit yet to compare with.' };
    const commit = await resolveCommit(root, 'HEAD');
    const shortId = await shortCommitId(root, commit);
    const repositoryPath = relative(root, path).split(sep).join('/');
    if (repositoryPath.startsWith('..') || isAbsolute(repositoryPath)) return { markdown: null, problem: `${path} is outside the repository at ${root}.` };

    const committedFiles: WorkspaceFile[] = (await readDesignFilesAtCommit(root, commit)).map((file) => ({ path: join(root, file.path), text: file.text }));
    const existedBefore = committedFiles.some((file) => file.path === path);
    const currentFiles = currentDesignFiles(documents, root);
    if (!currentFiles.some((file) => file.path === path)) {
      const document = documents.getDocument(uri);
      if (document !== undefined) currentFiles.push({ path, text: document.textDocument.getText() });
    }
    const before = existedBefore ? versionOf((await analyseWorkspace(committedFiles, [path], criteriaDefaults)).get(path)) : null;
    const after = versionOf((await analyseWorkspace(currentFiles, [path], criteriaDefaults)).get(path));
    if (after === null) return { markdown: null, problem: `The server does not know ${path}; open it first.` };
    const markdown = renderSingleFileComparison({
      path: repositoryPath,
      previousPath: null,
      before,
      after,
      beforeLabel: `last commit (${shortId})`,
      afterLabel: 'editor',
    });
    return { markdown, problem: null };
  } catch (error) {
    if (error instanceof GitError) return { markdown: null, problem: error.message };
    throw error;
  }
}

/** The design files the server holds that lie in the repository, with the editor's text. */
function currentDesignFiles(documents: LangiumDocuments, root: string): WorkspaceFile[] {
  return documents.all
    .filter((document) => document.uri.scheme === 'file' && isDesignPath(document.uri.fsPath))
    .map((document) => ({ path: document.uri.fsPath, text: document.textDocument.getText() }))
    .filter((file) => !relative(root, file.path).startsWith('..'))
    .toArray();
}

function versionOf(file: AnalysedFile | undefined): DesignVersion | null {
  if (file === undefined) return null;
  return { analysis: file.analysis, problems: designProblemsOf(file) };
}
