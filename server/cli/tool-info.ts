/** The CLI's name and version, from package.json (the one home of the version number). */
import packageJson from '../../package.json' with { type: 'json' };
import type { ToolInfo } from './check-output.js';

export const TOOL: ToolInfo = { name: 'runnel', version: packageJson.version };
