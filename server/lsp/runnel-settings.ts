/**
 * The editor settings the server reads, through LSP `workspace/configuration` (section `runnel`, the names the
 * extension contributes in package.json): which quantities the inlay hints show, the units of hints, hover and
 * the report, and defaults for design criteria (`runnel.criteria.*`). Any editor may send them; missing or
 * malformed values fall back to the defaults below, so a client that sends no settings gets the documented
 * behaviour.
 *
 * Read here and nowhere else. Criteria settings are only defaults for what a design file leaves unsaid: a value
 * written in the file (`criteria { }`) always wins, because the file is the record. The command line takes the
 * same values as options (`--freeboard`, ...), so CI can judge a design exactly as the editor does, and wherever a
 * criterion came from a setting the hover, the report and the finding say so. Here they are kept as written;
 * criteria-settings.ts (server/lsp) reads them with the language's own parser and applies them.
 */
import type { LangiumSharedServices } from 'langium/lsp';
import { Emitter, type Event } from 'vscode-languageserver';
import { containingFolder, CRITERION_SETTINGS, type CriterionSettingName } from '../../language/analysis/criteria-settings.js';
import { SETTINGS_SECTION } from '../protocol.js';

/** The settings section, typed once in server/protocol.ts for the server and the extension. */
export { SETTINGS_SECTION };

/** Which results an inlay hint shows (`runnel.inlayHints.*`). */
export interface HintQuantities {
  readonly normalDepth: boolean;
  readonly criticalDepth: boolean;
  readonly velocity: boolean;
  readonly froudeNumber: boolean;
  /** The deepest water along the reach from its channel's water-surface profile, where that is not normal depth. */
  readonly maximumProfileDepth: boolean;
}

/** `runnel.displayUnits`: as the design says (`auto`), or always SI or US customary. */
export type DisplayUnitsSetting = 'auto' | 'SI' | 'US';

/** `runnel.criteria.*` as written (trimmed); '' is not set. */
export type CriteriaSettingValues = Readonly<Record<CriterionSettingName, string>>;

export interface RunnelEditorSettings {
  readonly inlayHints: HintQuantities;
  readonly displayUnits: DisplayUnitsSetting;
  readonly criteria: CriteriaSettingValues;
}

/** The defaults of package.json `contributes.configuration`. */
export const DEFAULT_SETTINGS: RunnelEditorSettings = {
  inlayHints: { normalDepth: true, criticalDepth: true, velocity: true, froudeNumber: true, maximumProfileDepth: true },
  displayUnits: 'auto',
  criteria: { freeboard: '', nearCriticalFroude: '', minimumVelocity: '', limitMargin: '' },
};

/** How long a request waits for the client's first answer to `workspace/configuration` before using defaults, ms. */
const FIRST_CONFIGURATION_WAIT_MS = 2_000;

/**
 * Reads the `runnel` section as VS Code sends it (dotted keys nested: `{ inlayHints: { velocity: false } }`) or
 * flat (`{ 'inlayHints.velocity': false }`, as some clients send it). Never throws.
 */
export function parseSettings(section: unknown): RunnelEditorSettings {
  const record = isRecord(section) ? section : {};
  const nested = isRecord(record['inlayHints']) ? record['inlayHints'] : {};
  const flag = (key: keyof HintQuantities): boolean => {
    const value = nested[key] ?? record[`inlayHints.${key}`];
    return typeof value === 'boolean' ? value : DEFAULT_SETTINGS.inlayHints[key];
  };
  const units = record['displayUnits'];
  const criteriaNested = isRecord(record['criteria']) ? record['criteria'] : {};
  const criterion = (name: CriterionSettingName): string => {
    const value = criteriaNested[name] ?? record[`criteria.${name}`];
    // A number is kept as text so that it is refused with a reason (it lacks its unit) rather than ignored.
    return typeof value === 'string' ? value.trim() : typeof value === 'number' ? String(value) : '';
  };
  return {
    inlayHints: {
      normalDepth: flag('normalDepth'),
      criticalDepth: flag('criticalDepth'),
      velocity: flag('velocity'),
      froudeNumber: flag('froudeNumber'),
      maximumProfileDepth: flag('maximumProfileDepth'),
    },
    displayUnits: units === 'SI' || units === 'US' || units === 'auto' ? units : DEFAULT_SETTINGS.displayUnits,
    criteria: Object.fromEntries(CRITERION_SETTINGS.map((setting) => [setting.name, criterion(setting.name)])) as Record<CriterionSettingName, string>,
  };
}

/** The window's settings and, where the editor scopes settings by workspace folder, each folder's. */
export interface SettingsSnapshot {
  readonly window: RunnelEditorSettings;
  /** By folder URI, for the workspace folders the editor opened (empty when it does not scope settings). */
  readonly folders: ReadonlyMap<string, RunnelEditorSettings>;
}

/**
 * The current settings, kept up to date from the client's configuration notifications. VS Code scopes these
 * settings by resource: in a workspace of several folders each folder may set its own, and a document takes its
 * folder's. The window's settings (asked without a scope) serve documents outside every folder, and clients that
 * cannot scope.
 */
export class RunnelSettings {
  private latest: RunnelEditorSettings = DEFAULT_SETTINGS;
  private folders: ReadonlyMap<string, RunnelEditorSettings> = new Map();
  private folderUris: readonly string[] = [];
  private readonly ready: Promise<void>;
  private readonly fetched: Promise<void>;
  private readonly changed = new Emitter<SettingsSnapshot>();
  private readonly fetchFolders: () => Promise<void>;

  constructor(shared: LangiumSharedServices) {
    const configuration = shared.workspace.ConfigurationProvider;
    const connection = shared.lsp.Connection;
    shared.lsp.LanguageServer.onInitialize((params) => {
      if (params.capabilities.workspace?.configuration !== true) return;
      const folders = params.workspaceFolders?.map((folder) => folder.uri) ?? (params.rootUri === null || params.rootUri === undefined ? [] : [params.rootUri]);
      this.folderUris = folders;
    });
    /** Each folder's section, asked with the folder as scope; a failed or empty answer leaves it to the window's. */
    this.fetchFolders = async (): Promise<void> => {
      const folderUris = this.folderUris;
      if (connection === undefined || folderUris.length === 0) {
        this.folders = new Map();
        return;
      }
      const answers: unknown[] = await connection.workspace.getConfiguration(folderUris.map((scopeUri) => ({ scopeUri, section: SETTINGS_SECTION })));
      // A folder the client answers nothing for (null, as for an unknown section) keeps the window's settings.
      this.folders = new Map(folderUris.flatMap((folder, index) => (isRecord(answers[index]) ? [[folder, parseSettings(answers[index])] as const] : [])));
    };
    const fetchFolders = this.fetchFolders;
    configuration.onConfigurationSectionUpdate((update) => {
      if (update.section !== SETTINGS_SECTION) return;
      this.latest = parseSettings(update.configuration);
      void fetchFolders()
        .catch(() => undefined)
        .then(() => this.changed.fire(this.snapshot()));
    });
    // Langium fetches the section once after `initialized`; read it from there. A client that never answers must
    // not stall hints and hover, hence the time limit.
    this.fetched = configuration.ready
      .then(async () => {
        const section: Record<string, unknown> = {};
        const keys = ['inlayHints', 'displayUnits', 'criteria', ...CRITERION_SETTINGS.map((setting) => `criteria.${setting.name}`)];
        for (const key of keys) section[key] = await configuration.getConfiguration(SETTINGS_SECTION, key);
        this.latest = parseSettings(section);
        await fetchFolders();
      })
      .catch(() => undefined);
    this.ready = Promise.race([this.fetched, new Promise<void>((resolve) => setTimeout(resolve, FIRST_CONFIGURATION_WAIT_MS).unref())]);
  }

  /**
   * The workspace folders changed while the server runs (workspace-folders.ts): each folder's settings are read
   * again, the folders gone forgotten, and the change announced as a change of settings.
   */
  async setWorkspaceFolders(folderUris: readonly string[]): Promise<void> {
    this.folderUris = [...folderUris];
    await this.fetchFolders().catch(() => undefined);
    this.changed.fire(this.snapshot());
  }

  /** The settings as the client first sent them, however long that takes (the defaults if the fetch failed). */
  async fetchedFromClient(): Promise<SettingsSnapshot> {
    await this.fetched;
    return this.snapshot();
  }

  /**
   * The settings in force for a document (its workspace folder's, else the window's), or the window's when no
   * document is named; the defaults until the client has answered.
   */
  async current(documentUri?: string): Promise<RunnelEditorSettings> {
    await this.ready;
    const folder = documentUri === undefined ? undefined : containingFolder(documentUri, this.folders.keys());
    return folder === undefined ? this.latest : (this.folders.get(folder) ?? this.latest);
  }

  /** The window's settings and each folder's, as they stand. */
  snapshot(): SettingsSnapshot {
    return { window: this.latest, folders: this.folders };
  }

  /** Fires when the client reports changed settings (after each folder's have been read again). */
  get onDidChange(): Event<SettingsSnapshot> {
    return this.changed.event;
  }
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}
