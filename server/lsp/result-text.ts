/**
 * The words and numbers the editor features print: the compact result of a flow in an inlay hint, the short name
 * of each check, the status markers, and the rows of the hover table. Numbers go through the analysis' formatter
 * (language/analysis/format-quantity.ts), so a depth reads the same in hints, hover, messages and the report.
 */
import { formatNumber, formatQuantity, formatRatio } from '../../language/analysis/format-quantity.js';
import { FINDING_CODES, type FindingCode } from '../../language/analysis/finding-messages.js';
import type { CheckStatus, Finding, FlowResult, ReachResult, Severity } from '../../language/analysis/model.js';
import { NORMAL_DEPTH_BAND_RATIO } from '../../language/hydraulics/profile/profile-defaults.js';
import { toDisplay, type UnitSystem } from '../../language/units/units.js';
import type { HintQuantities } from './runnel-settings.js';

/** A sign before a result whose checks did not all pass. */
export const STATUS_MARKERS: Readonly<Record<CheckStatus, string>> = { pass: '', information: 'ℹ', warning: '⚠', fail: '✖' };

export const SEVERITY_MARKERS: Readonly<Record<Severity, string>> = { error: '✖', warning: '⚠', information: 'ℹ' };

/** One or two words per check, for hints and for "why no size passes". */
export const CHECK_SHORT_NAMES: Readonly<Record<FindingCode, string>> = {
  [FINDING_CODES.overtopping]: 'over-topping',
  [FINDING_CODES.freeboardBelowRequired]: 'freeboard',
  [FINDING_CODES.supercriticalFlow]: 'supercritical',
  [FINDING_CODES.nearCriticalFlow]: 'near-critical',
  [FINDING_CODES.velocityAbovePermissible]: 'velocity limit',
  [FINDING_CODES.shearAbovePermissible]: 'shear limit',
  [FINDING_CODES.velocityBelowSelfCleansing]: 'self-cleansing',
  [FINDING_CODES.conduitOverCapacity]: 'over capacity',
  [FINDING_CODES.conduitTwoDepthZone]: 'near full',
  [FINDING_CODES.noNormalDepth]: 'no normal depth',
  [FINDING_CODES.depthSolveFailed]: 'not computed',
  [FINDING_CODES.hydraulicJump]: 'hydraulic jump',
  [FINDING_CODES.hydraulicJumpSweptOut]: 'jump swept out',
  [FINDING_CODES.hydraulicJumpLiningExceeded]: 'jump on lining',
  [FINDING_CODES.conduitSurcharged]: 'surcharged',
  [FINDING_CODES.profileNotComputed]: 'no profile',
};

export function checkShortName(code: string): string {
  return (CHECK_SHORT_NAMES as Readonly<Record<string, string>>)[code] ?? code;
}

/** The distinct short names of the checks that a flow's findings report, in order. */
export function failedCheckNames(findings: readonly Finding[]): string[] {
  return [...new Set(findings.map((finding) => checkShortName(finding.code)))];
}

/**
 * The compact result of one flow, e.g. `q10: yn 1.42 ft · yc 0.98 ft · 3.1 ft/s · Fr 0.52 ⚠ freeboard`.
 * `withFlowName` is false where the hint sits right after the flow's own value.
 */
export function flowHintText(flow: FlowResult, system: UnitSystem, show: HintQuantities, withFlowName: boolean): string {
  const parts: string[] = [];
  const normal = flow.normal;
  if (normal === null) {
    if (show.normalDepth || show.velocity || show.froudeNumber) parts.push(flow.findings.some((f) => f.code === FINDING_CODES.conduitOverCapacity) ? 'no free-surface flow' : 'no normal depth');
  } else if (show.normalDepth) {
    parts.push(`yn ${formatQuantity(normal.depth_m, 'length', system)}`);
  }
  if (show.criticalDepth && flow.critical !== null) parts.push(`yc ${formatQuantity(flow.critical.depth_m, 'length', system)}`);
  if (normal !== null && show.velocity) parts.push(formatQuantity(normal.velocity_mps, 'velocity', system));
  if (normal !== null && show.froudeNumber) parts.push(`Fr ${formatRatio(normal.froudeNumber)}`);
  // The deepest water along the reach from the channel's profile, where backwater lifts it above normal depth by
  // more than the band within which the profile counts as uniform (M1, S1, ...).
  const profile = flow.profile;
  if (show.maximumProfileDepth && profile !== undefined && profile !== null && (normal === null || profile.maximumDepth_m > normal.depth_m * (1 + NORMAL_DEPTH_BAND_RATIO))) {
    const shaped = profile.profileClasses.filter((profileClass) => profileClass !== 'uniform');
    parts.push(`max ${formatQuantity(profile.maximumDepth_m, 'length', system)}${shaped.length === 0 ? '' : ` (${shaped.join(', ')})`}`);
  }
  const marker = STATUS_MARKERS[flow.status];
  const failed = failedCheckNames(flow.findings);
  const verdict = marker === '' ? '' : ` ${marker} ${failed.join(', ')}`;
  const body = parts.join(' · ');
  const prefix = withFlowName ? `${flow.flow}:` : '';
  return [prefix, body].filter((part) => part !== '').join(' ') + verdict;
}

/** The findings of a flow as a plain-text tooltip. */
export function findingsTooltip(findings: readonly Finding[]): string {
  return findings.map((finding) => `${SEVERITY_MARKERS[finding.severity]} ${finding.message}`).join('\n');
}

// ------------------------------------------------------------------------------------------------ hover table

type Cell = (flow: FlowResult, reach: ReachResult, system: UnitSystem) => string;

const NOT_AVAILABLE = '—';
const length = (valueM: number | null | undefined, system: UnitSystem): string => (valueM === null || valueM === undefined ? NOT_AVAILABLE : formatQuantity(valueM, 'length', system));

/** Area in the display system's area unit. */
function area(valueM2: number | null | undefined, system: UnitSystem): string {
  return valueM2 === null || valueM2 === undefined ? NOT_AVAILABLE : formatQuantity(valueM2, 'area', system);
}

/** The rows of the hover's table: one row per quantity, one column per flow. */
export const HOVER_ROWS: readonly { readonly label: string; readonly cell: Cell }[] = [
  { label: 'Discharge', cell: (flow, _reach, system) => formatQuantity(flow.discharge_m3s, 'discharge', system) },
  { label: 'Normal depth', cell: (flow, _reach, system) => length(flow.normal?.depth_m, system) },
  { label: 'Critical depth', cell: (flow, _reach, system) => length(flow.critical?.depth_m, system) },
  { label: 'Flow area', cell: (flow, _reach, system) => area(flow.normal?.area_m2, system) },
  { label: 'Wetted perimeter', cell: (flow, _reach, system) => length(flow.normal?.wettedPerimeter_m, system) },
  { label: 'Hydraulic radius', cell: (flow, _reach, system) => length(flow.normal?.hydraulicRadius_m, system) },
  { label: 'Top width', cell: (flow, _reach, system) => length(flow.normal?.topWidth_m, system) },
  { label: 'Velocity', cell: (flow, _reach, system) => (flow.normal === null ? NOT_AVAILABLE : formatQuantity(flow.normal.velocity_mps, 'velocity', system)) },
  { label: 'Froude number', cell: (flow) => (flow.normal === null ? NOT_AVAILABLE : formatRatio(flow.normal.froudeNumber)) },
  { label: 'Regime, slope', cell: (flow) => `${flow.regime ?? NOT_AVAILABLE}, ${flow.slopeClass}` },
  { label: 'Critical slope', cell: (flow, _reach, system) => (flow.criticalSlope === null ? NOT_AVAILABLE : formatQuantity(flow.criticalSlope, 'slope', system)) },
  {
    label: 'Deepest water (profile)',
    cell: (flow, _reach, system) => (flow.profile === undefined || flow.profile === null ? NOT_AVAILABLE : length(flow.profile.maximumDepth_m, system)),
  },
  { label: 'Profile', cell: (flow) => (flow.profile === undefined || flow.profile === null ? NOT_AVAILABLE : flow.profile.profileClasses.join(' → ')) },
  { label: 'Specific energy', cell: (flow, _reach, system) => length(flow.normal?.specificEnergy_m, system) },
  { label: 'Max. shear (γyS)', cell: (flow, _reach, system) => (flow.maxShear_Pa === null ? NOT_AVAILABLE : formatQuantity(flow.maxShear_Pa, 'shear', system)) },
  { label: 'Avg. shear (γRS)', cell: (flow, _reach, system) => (flow.averageShear_Pa === null ? NOT_AVAILABLE : formatQuantity(flow.averageShear_Pa, 'shear', system)) },
  {
    label: 'Freeboard',
    cell: (flow, _reach, system) =>
      flow.freeboard_m === null ? NOT_AVAILABLE : `${length(flow.freeboard_m, system)}${flow.requiredFreeboard_m === null ? '' : ` (needs ${length(flow.requiredFreeboard_m, system)})`}`,
  },
  { label: 'Checks', cell: (flow) => (flow.status === 'pass' ? 'pass' : `${STATUS_MARKERS[flow.status]} ${failedCheckNames(flow.findings).join(', ')}`) },
];

/** A value in the display unit of its dimension, with the number alone and the unit, for "4 ft = 1.22 m". */
export function displayValue(valueSI: number, dimension: Parameters<typeof toDisplay>[1], system: UnitSystem, significantDigits = 4): string {
  const { value, unit } = toDisplay(valueSI, dimension, system);
  return `${formatNumber(value, significantDigits)} ${unit}`;
}
