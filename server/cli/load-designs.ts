/**
 * Design files from disk, analysed with the rest of their workspace (see workspace-files.ts for which files).
 */
import type { CriteriaDefaults } from '../../language/analysis/criteria-settings.js';
import type { AnalysedFile } from './analyse-workspace.js';
import { analyseWorkspace } from './analyse-workspace.js';
import { readWorkspaceFiles } from './workspace-files.js';

export interface LoadOptions {
  /** `--workspace`: the folder whose design files are loaded with the targets. */
  readonly workspace?: string;
  /** Files to leave out of the workspace (absolute paths). */
  readonly exclude?: readonly string[];
  /** Criteria defaults from the command-line options (a design file's own criteria win). */
  readonly criteriaDefaults: CriteriaDefaults;
}

/** Analyses `targets` (absolute paths) with their workspaces; results in the order of `targets`. */
export async function loadDesigns(targets: readonly string[], cwd: string, options: LoadOptions): Promise<AnalysedFile[]> {
  const files = readWorkspaceFiles(targets, cwd, options);
  const analysed = await analyseWorkspace(files, targets, options.criteriaDefaults);
  return targets.flatMap((target) => {
    const result = analysed.get(target);
    return result === undefined ? [] : [result];
  });
}
