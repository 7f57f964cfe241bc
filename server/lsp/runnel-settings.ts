/**
 * The editor settings the server reads, through LSP `workspace/configuration` (section `runnel`, the names the
 * extension contributes in package.json): which quantities the inlay hints show and the units of hints, hover and
 * the report. Any editor may send them; missing or malformed values fall back to the defaults below, so a client
 * that sends no settings gets the documented behaviour.
 *
 * Read here and nowhere else. Design criteria are not editor settings: they are written in the design files
 * (`criteria { }`), so the editor, the command line and CI always judge a design alike.
 */
import type { LangiumSharedServices } from 'langium/lsp';
import { Emitter, type Event } from 'vscode-languageserver';
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

export interface RunnelEditorSettings {
  readonly inlayHints: HintQuantities;
  readonly displayUnits: DisplayUnitsSetting;
}

/** The defaults of package.json `contributes.configuration`. */
export const DEFAULT_SETTINGS: RunnelEditorSettings = {
  inlayHints: { normalDepth: true, criticalDepth: true, velocity: true, froudeNumber: true, maximumProfileDepth: true },
  displayUnits: 'auto',
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
  return {
    inlayHints: {
      normalDepth: flag('normalDepth'),
      criticalDepth: flag('criticalDepth'),
      velocity: flag('velocity'),
      froudeNumber: flag('froudeNumber'),
      maximumProfileDepth: flag('maximumProfileDepth'),
    },
    displayUnits: units === 'SI' || units === 'US' || units === 'auto' ? units : DEFAULT_SETTINGS.displayUnits,
  };
}

/** The current settings, kept up to date from the client's configuration notifications. */
export class RunnelSettings {
  private latest: RunnelEditorSettings = DEFAULT_SETTINGS;
  private readonly ready: Promise<void>;
  private readonly changed = new Emitter<RunnelEditorSettings>();

  constructor(shared: LangiumSharedServices) {
    const configuration = shared.workspace.ConfigurationProvider;
    configuration.onConfigurationSectionUpdate((update) => {
      if (update.section !== SETTINGS_SECTION) return;
      this.latest = parseSettings(update.configuration);
      this.changed.fire(this.latest);
    });
    // Langium fetches the section once after `initialized`; read it from there. A client that never answers must
    // not stall hints and hover, hence the time limit.
    this.ready = Promise.race([
      configuration.ready.then(async () => {
        const inlayHints: unknown = await configuration.getConfiguration(SETTINGS_SECTION, 'inlayHints');
        const displayUnits: unknown = await configuration.getConfiguration(SETTINGS_SECTION, 'displayUnits');
        this.latest = parseSettings({ inlayHints, displayUnits });
      }),
      new Promise<void>((resolve) => setTimeout(resolve, FIRST_CONFIGURATION_WAIT_MS).unref()),
    ]).catch(() => undefined);
  }

  /** The settings in force (the defaults until the client has answered). */
  async current(): Promise<RunnelEditorSettings> {
    await this.ready;
    return this.latest;
  }

  /** Fires when the client reports changed settings. */
  get onDidChange(): Event<RunnelEditorSettings> {
    return this.changed.event;
  }
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}
