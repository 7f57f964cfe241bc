/**
 * Every fixed word the report prints, in one place, so the HTML report, the Markdown report and the drawings
 * say the same thing. Plain words of our own; no codes or headings from other programs.
 */
import { CRITERION_FROM_SETTING } from '../analysis/criteria-defaults.js';
import type { CheckStatus, Severity } from '../analysis/model.js';

/** How a check outcome reads in tables and lists. */
export const STATUS_WORDS: Readonly<Record<CheckStatus, string>> = {
  pass: 'pass',
  information: 'pass, with note',
  warning: 'warning',
  fail: 'fail',
};

/** A finding's severity in the same vocabulary as the outcomes. */
export const SEVERITY_WORDS: Readonly<Record<Severity, string>> = {
  error: 'fail',
  warning: 'warning',
  information: 'note',
};

/** Worst first: used to pick the governing finding and to sort. */
export const SEVERITY_RANK: Readonly<Record<Severity, number>> = { error: 0, warning: 1, information: 2 };

export const STATUS_RANK: Readonly<Record<CheckStatus, number>> = { fail: 0, warning: 1, information: 2, pass: 3 };

export const REPORT_WORDS = {
  kicker: 'Open-channel design check',
  cautionLead: 'Caution.',
  fileLabel: 'File',
  generatedLabel: 'Generated',
  unitsLabel: 'Display units',
  unitSystemNames: { SI: 'SI (metres, seconds)', US: 'US customary (feet, seconds)' },
  notesHeading: 'Design notes',
  summaryHeading: 'Summary of results',
  findingsHeading: 'Findings',
  noFindings: 'No findings: every reach and flow meets the criteria in force.',
  channelHeading: 'Channel',
  reachHeading: 'Reach',
  longitudinalCaption: 'Longitudinal view',
  crossSectionCaption: 'Cross-section',
  ratingCaption: 'Rating curve',
  reachFactsHeading: 'Reach data',
  reachFlowsHeading: 'Results by flow',
  basisHeading: 'Basis of the results',
  methodLabel: 'Method',
  assumptionsLabel: 'Assumptions',
  referencesLabel: 'References',
  noGoverningFinding: 'meets all criteria',
  drawingsLimited: (shown: number, total: number): string =>
    `Drawings are shown for the first ${shown} of ${total} reaches to keep the report responsive; the tables list every reach.`,
  markdownDrawingsNote: 'Drawings (cross-sections, rating curves, longitudinal views) are in the HTML report.',
  footer: (fileName: string, when: string): string => `Prepared with Runnel from ${fileName} on ${when}.`,
  libraryNote: 'This file is a library of shared linings and sections: it has no channels to check.',
  noChannels: 'This design has no channels to check yet.',
  incompleteHeading: 'Reaches not analysed',
  profileHeading: 'Water-surface profile',
  profileIntro: 'The computed water surface along the channel at each design flow; stations are distances from the head of the channel.',
  notAnalysedWord: 'not analysed',
  criteriaFromSettingsLead: 'Criteria from settings.',
  criteriaFromSettings: (criteria: string): string =>
    `Where the design file states no criterion of its own, these come ${CRITERION_FROM_SETTING}: ${criteria}. A value written in the design file takes precedence.`,
} as const;

/** Quantity names for the per-reach results table (rows) and the summary (columns). */
export const QUANTITY_WORDS = {
  channel: 'Channel',
  reach: 'Reach',
  flow: 'Flow',
  discharge: 'Discharge',
  normalDepth: 'Normal depth',
  criticalDepth: 'Critical depth',
  velocity: 'Velocity',
  froude: 'Froude number',
  freeboard: 'Freeboard',
  requiredFreeboard: 'Required freeboard',
  maxShear: 'Maximum bed shear',
  averageShear: 'Boundary shear (average)',
  result: 'Result',
  governingFinding: 'Governing finding',
  topWidth: 'Top width',
  area: 'Flow area',
  wettedPerimeter: 'Wetted perimeter',
  hydraulicRadius: 'Hydraulic radius',
  specificEnergy: 'Specific energy',
  criticalSlope: 'Critical slope',
  regime: 'Flow regime',
  slopeClass: 'Bed slope class for this flow',
  section: 'Section',
  lining: 'Lining',
  manningN: "Manning's n",
  liningSource: 'Source of lining values',
  permissibleVelocity: 'Permissible velocity',
  permissibleShear: 'Permissible shear',
  bedSlope: 'Bed slope',
  length: 'Length',
  upstreamInvert: 'Upstream invert',
  downstreamInvert: 'Downstream invert',
  bankHeight: 'Bank height',
  fullDepth: 'Inside height',
  bankfullCapacity: 'Capacity at bank-full (uniform flow)',
  fullCapacity: 'Capacity flowing full (uniform flow)',
  freeboardCriterion: 'Freeboard criterion',
  froudeBand: 'Froude numbers to avoid',
  minVelocity: 'Self-cleansing velocity (minimum)',
  limitMargin: 'Margin past a lining limit before a fail',
  note: 'Note',
  profileClasses: 'Profile',
  deepestWater: 'Deepest water',
  atStation: 'At station',
  leastFreeboard: 'Least freeboard',
  aboveBank: 'Above the bank, from–to',
  noneWord: 'none',
} as const;

/** The sentences under the profile table: jumps and profiles not (fully) computed. */
export const PROFILE_WORDS = {
  jump: (flow: string, where: string, from: string, froude: string, to: string, kind: string, swept: boolean): string =>
    `${flow}: hydraulic jump ${where}, from ${from} (Froude number ${froude}) to ${to}; ${kind}${swept ? '; swept out of the reach that should hold it' : ''}.`,
  surcharged: (flow: string, reach: string, station: string): string =>
    `${flow}: the water fills the conduit of reach ${reach} near station ${station}; the profile covers only the reaches below it.`,
  notComputed: (flow: string, why: string): string => `${flow}: no water-surface profile (${why}).`,
} as const;

/** Drawing legends and labels. */
export const DRAWING_WORDS = {
  offsetAxis: 'offset from bed centre',
  heightAxis: 'height above invert',
  dischargeAxis: 'discharge',
  depthAxis: 'depth',
  stationAxis: 'distance from upstream end',
  elevationAxis: 'elevation',
  relativeElevationAxis: 'elevation relative to outlet invert',
  bankTop: 'bank top',
  crown: 'crown (inside top)',
  bankTopOrCrown: 'bank top or conduit crown',
  freeboardLimit: 'required freeboard limit',
  normalDepthCurve: 'normal depth (uniform flow)',
  criticalDepthCurve: 'critical depth',
  bed: 'bed',
  normalDepthLine: 'normal depth',
  criticalDepthLine: 'critical depth',
  computedWaterSurface: 'computed water surface',
  hydraulicJump: 'hydraulic jump',
  noNormalDepth: 'no normal depth',
  noUniformFlow: 'No uniform-flow curve: the bed is horizontal or adverse.',
  equalScales: 'horizontal and vertical scales equal',
  verticalExaggeration: (factor: string): string => `vertical scale exaggerated ${factor}×`,
  outletFreeFall: 'outlet: free fall',
  outletNormalDepth: 'outlet: normal depth',
  outletWaterLevel: (level: string): string => `outlet: water level ${level}`,
  bankHeightNotGiven: 'bank height not given',
} as const;
