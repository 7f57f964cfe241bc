/**
 * The `runnel.criteria.*` settings as defaults for every design the server analyses. What the user sees: a design
 * that states no freeboard (say) is checked against the freeboard setting, and its diagnostics, hints, hover and
 * report change as soon as the setting does; a criterion from a setting is marked as such wherever it shows. A
 * value written in the design file always wins.
 *
 * Each value is read by the language's own parser and checks (language/analysis/criteria-settings.ts), exactly as
 * the command line reads its options. A value that does not read is not applied: the server logs why and shows
 * one warning per bad value, naming the setting and what is wrong, and that criterion falls back to the built-in
 * default. When the defaults in force change, every open design is validated again (its diagnostics republished)
 * and the client is asked for new inlay hints.
 */
import type { LangiumCoreServices, LangiumDocument } from 'langium';
import type { LangiumSharedServices } from 'langium/lsp';
import { MessageType, ShowMessageNotification, type Connection } from 'vscode-languageserver';
import { readCriteriaSettings, type CriteriaDefaults, type CriterionSettingNote } from '../../language/analysis/criteria-settings.js';
import type { RunnelAddedServices } from '../../language/runnel-module.js';
import { SETTINGS_SECTION } from '../protocol.js';
import { describeFault, type ServerLog } from './error-containment.js';
import type { CriteriaSettingValues, RunnelSettings, SettingsSnapshot } from './runnel-settings.js';

export interface CriteriaFromSettingsOptions {
  readonly connection: Connection;
  readonly shared: LangiumSharedServices;
  readonly services: LangiumCoreServices & RunnelAddedServices;
  readonly settings: RunnelSettings;
  readonly log: ServerLog;
  /** Called once the open designs have been checked again with new defaults (to refresh inlay hints). */
  readonly onApplied: () => void;
}

/** Applies the criteria settings now and on every change, one change at a time and in order. */
export function followCriteriaSettings(options: CriteriaFromSettingsOptions): void {
  const { settings, log } = options;
  const warned = new Set<string>();
  let lastApplied: string | undefined;
  let queue: Promise<void> = Promise.resolve();
  const enqueue = (snapshot: SettingsSnapshot): void => {
    const values: CriteriaValuesInForce = { window: snapshot.window.criteria, folders: new Map([...snapshot.folders].map(([folder, folderSettings]) => [folder, folderSettings.criteria])) };
    const written = JSON.stringify([values.window, [...values.folders]]);
    queue = queue
      .then(async () => {
        if (written === lastApplied) return;
        lastApplied = written;
        await apply(options, values, warned);
      })
      .catch((error: unknown) => log.error(`Runnel: applying the criteria settings failed. ${describeFault(error)}`));
  };
  void settings.fetchedFromClient().then(enqueue);
  settings.onDidChange(enqueue);
}

/** The criteria settings as written: the window's, and each workspace folder's where the editor scopes them. */
interface CriteriaValuesInForce {
  readonly window: CriteriaSettingValues;
  readonly folders: ReadonlyMap<string, CriteriaSettingValues>;
}

async function apply(options: CriteriaFromSettingsOptions, values: CriteriaValuesInForce, warned: Set<string>): Promise<void> {
  const { connection, shared, services, log } = options;
  const read = async (written: CriteriaSettingValues, where: string): Promise<CriteriaDefaults> => {
    const reading = await readCriteriaSettings(services, written);
    for (const problem of reading.problems) {
      const text = refusedText(problem);
      log.warn(text);
      // Once per bad value: the log keeps every occurrence, the user is told once.
      const key = `${problem.setting.name}\u0000${problem.written}`;
      if (!warned.has(key)) {
        warned.add(key);
        // A notification (window/showMessage), not a request: nothing waits on the user's answer.
        void connection.sendNotification(ShowMessageNotification.type, { type: MessageType.Warning, message: text });
      }
    }
    for (const warning of reading.warnings) log.warn(`Runnel: setting ${settingName(warning)} = "${warning.written}" applies, with a caution: ${warning.message}`);
    const applied = Object.entries(written)
      .filter(([name, value]) => value !== '' && !reading.problems.some((problem) => problem.setting.name === name))
      .map(([name, value]) => `${SETTINGS_SECTION}.criteria.${name} = "${value}"`);
    log.info(`Runnel: criteria defaults from settings${where}: ${applied.length === 0 ? 'none (built-in defaults)' : applied.join(', ')}; a value written in a design file wins.`);
    return reading.defaults;
  };
  const windowDefaults = await read(values.window, '');
  const folderDefaults = new Map<string, CriteriaDefaults>();
  for (const [folder, written] of values.folders) folderDefaults.set(folder, await read(written, ` for the folder ${folder}`));
  if (!services.analysis.CriteriaDefaults.replace(windowDefaults, folderDefaults)) return;
  await revalidateOpenDesigns(shared);
  options.onApplied();
}

/** Validates every open document again; the diagnostics publisher and the report panels see the new results. */
async function revalidateOpenDesigns(shared: LangiumSharedServices): Promise<void> {
  const textDocuments = shared.workspace.TextDocuments;
  // As Langium's own updates: taking the lock before the workspace is first built would cancel that build.
  await shared.workspace.WorkspaceManager.ready;
  await shared.workspace.WorkspaceLock.write(async (token) => {
    // Taking the lock cancels a build in progress; its open documents are built here, through validation, too.
    const open: LangiumDocument[] = shared.workspace.LangiumDocuments.all.filter((document) => textDocuments?.get(document.uri.toString()) !== undefined).toArray();
    if (open.length > 0) await shared.workspace.DocumentBuilder.build(open, { validation: true }, token);
  });
}

function settingName(note: CriterionSettingNote): string {
  return `${SETTINGS_SECTION}.criteria.${note.setting.name}`;
}

/** The warning for a refused value: which setting, what is wrong, what to write, and what applies instead. */
export function refusedText(problem: CriterionSettingNote): string {
  const examples = problem.setting.examples.map((example) => `"${example}"`).join(', ');
  return (
    `Runnel: the setting ${settingName(problem)} = "${problem.written}" is not used: ${problem.message} ` +
    `Write it as in a design file's criteria block after '${problem.setting.keywords}', e.g. ${examples}, or leave it empty. ` +
    `Until then ${problem.setting.what} is the built-in default wherever a design file does not state it.`
  );
}
