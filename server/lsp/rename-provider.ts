/**
 * Rename, in every file that uses the name (Langium's rename over the workspace index). What Runnel adds: a new name
 * must be one the language accepts (letters, digits, `_`, single hyphens between them, not starting with a digit),
 * otherwise the editor shows why and nothing changes, so a rename can never break a design.
 */
import type { LangiumDocument } from 'langium';
import { DefaultRenameProvider } from 'langium/lsp';
import { ErrorCodes, ResponseError, type RenameParams, type WorkspaceEdit } from 'vscode-languageserver';

/** The grammar's ID terminal (language/runnel.langium), anchored. */
const NAME_PATTERN = /^[A-Za-z_][A-Za-z0-9_]*(?:-[A-Za-z0-9_]+)*$/;

export class RunnelRenameProvider extends DefaultRenameProvider {
  override async rename(document: LangiumDocument, params: RenameParams): Promise<WorkspaceEdit | undefined> {
    if (!NAME_PATTERN.test(params.newName)) {
      throw new ResponseError(
        ErrorCodes.InvalidParams,
        `'${params.newName}' is not a valid name: use letters, digits and _ with single hyphens between them, starting with a letter or _.`,
      );
    }
    return super.rename(document, params);
  }
}
