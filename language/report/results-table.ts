/**
 * The report's tables as plain text cells, built once from the analysis and rendered by both the HTML and the
 * Markdown report, so the two always show the same rows, headings, rounding and wording. Cells are unescaped
 * text: each renderer escapes them for its own format.
 */
import { CRITERION_FROM_SETTING } from '../analysis/criteria-defaults.js';
import type { ChannelResult, CheckStatus, CriterionOrigin, DesignAnalysis, Finding, FlowResult, ReachResult, ResolvedCriteria, SourceLocation } from '../analysis/model.js';
import { describeJumpType } from '../hydraulics/index.js';
import type { UnitSystem } from '../units/units.js';
import {
  displayUnit,
  formatDisplayNumber,
  formatElevation,
  formatFroude,
  formatManningN,
  formatQuantity,
  formatSignificant,
  MISSING_VALUE,
} from './format.js';
import { PROFILE_WORDS, QUANTITY_WORDS, REPORT_WORDS, SEVERITY_RANK, STATUS_WORDS } from './report-wording.js';
import { describeSection } from './section-from-result.js';

export interface TextTable {
  readonly headings: readonly string[];
  /** Per column: true when the column holds numbers (right-aligned). */
  readonly numeric: readonly boolean[];
  readonly rows: readonly (readonly string[])[];
}

export interface SummaryRow {
  readonly channelIndex: number;
  readonly reachIndex: number;
  readonly flowName: string;
  readonly status: CheckStatus;
  readonly cells: readonly string[];
}

export interface SummaryTable {
  readonly headings: readonly string[];
  readonly numeric: readonly boolean[];
  readonly rows: readonly SummaryRow[];
  /** Column index of the result (status) column. */
  readonly statusColumn: number;
  /** Column index of the flow column (for a colour key in HTML). */
  readonly flowColumn: number;
}

/** The finding that governs a flow's result: the most severe, the first in document order among equals. */
export function governingFinding(flow: FlowResult): Finding | undefined {
  let governing: Finding | undefined;
  for (const finding of flow.findings) {
    if (governing === undefined || SEVERITY_RANK[finding.severity] < SEVERITY_RANK[governing.severity]) governing = finding;
  }
  return governing;
}

/** Heading with its display unit, e.g. "Normal depth (m)". */
function withUnit(word: string, unit: string): string {
  return `${word} (${unit})`;
}

/** One row per reach and flow: the summary of results. */
export function buildSummaryTable(analysis: DesignAnalysis): SummaryTable {
  const system = analysis.displayUnits;
  const length = displayUnit('length', system);
  const headings = [
    QUANTITY_WORDS.channel,
    QUANTITY_WORDS.reach,
    QUANTITY_WORDS.flow,
    withUnit(QUANTITY_WORDS.discharge, displayUnit('discharge', system)),
    withUnit(QUANTITY_WORDS.normalDepth, length),
    withUnit(QUANTITY_WORDS.criticalDepth, length),
    withUnit(QUANTITY_WORDS.velocity, displayUnit('velocity', system)),
    QUANTITY_WORDS.froude,
    withUnit(QUANTITY_WORDS.freeboard, length),
    withUnit(QUANTITY_WORDS.requiredFreeboard, length),
    withUnit(QUANTITY_WORDS.maxShear, displayUnit('shear', system)),
    QUANTITY_WORDS.result,
    QUANTITY_WORDS.governingFinding,
  ];
  const numeric = headings.map((_, index) => index >= 3 && index <= 10);
  const rows: SummaryRow[] = [];
  analysis.channels.forEach((channel, channelIndex) => {
    channel.reaches.forEach((reach, reachIndex) => {
      for (const flow of reach.flows) {
        const governing = governingFinding(flow);
        rows.push({
          channelIndex,
          reachIndex,
          flowName: flow.flow,
          status: flow.status,
          cells: [
            channel.name,
            reach.name,
            flow.flow,
            formatDisplayNumber(flow.discharge_m3s, 'discharge', system),
            formatDisplayNumber(flow.normal?.depth_m, 'length', system),
            formatDisplayNumber(flow.critical?.depth_m, 'length', system),
            formatDisplayNumber(flow.normal?.velocity_mps, 'velocity', system),
            formatFroude(flow.normal?.froudeNumber),
            formatDisplayNumber(flow.freeboard_m, 'length', system),
            formatDisplayNumber(flow.requiredFreeboard_m, 'length', system),
            formatDisplayNumber(flow.maxShear_Pa, 'shear', system),
            STATUS_WORDS[flow.status] ?? String(flow.status),
            governing?.message ?? (flow.normal === null && flow.normalDepthNote ? flow.normalDepthNote : REPORT_WORDS.noGoverningFinding),
          ],
        });
      }
    });
  });
  return { headings, numeric, rows, statusColumn: 11, flowColumn: 2 };
}

/** The properties of one reach as label/value rows. */
export function buildReachFacts(reach: ReachResult, system: UnitSystem): TextTable {
  const isConduit = reach.section.shape === 'circle';
  const lining = reach.lining;
  const rows: string[][] = [
    [QUANTITY_WORDS.section, `${reach.section.name}${reach.section.description ? ` (${reach.section.description})` : ''}: ${describeSection(reach.section, system)}`],
    [QUANTITY_WORDS.lining, lining.description ? `${lining.name}: ${lining.description}` : lining.name],
    [QUANTITY_WORDS.manningN, formatManningN(lining.manningN)],
  ];
  if (lining.source) rows.push([QUANTITY_WORDS.liningSource, lining.source]);
  if (lining.maxVelocity_mps !== null) rows.push([QUANTITY_WORDS.permissibleVelocity, formatQuantity(lining.maxVelocity_mps, 'velocity', system)]);
  if (lining.maxShear_Pa !== null) rows.push([QUANTITY_WORDS.permissibleShear, formatQuantity(lining.maxShear_Pa, 'shear', system)]);
  rows.push(
    [QUANTITY_WORDS.bedSlope, formatQuantity(reach.slope, 'slope', system)],
    [QUANTITY_WORDS.length, formatQuantity(reach.length_m, 'length', system)],
  );
  if (reach.upstreamInvert_m !== null || reach.downstreamInvert_m !== null) {
    rows.push([QUANTITY_WORDS.upstreamInvert, formatElevation(reach.upstreamInvert_m, system)], [QUANTITY_WORDS.downstreamInvert, formatElevation(reach.downstreamInvert_m, system)]);
  }
  if (isConduit) rows.push([QUANTITY_WORDS.fullDepth, formatQuantity(reach.section.fullDepth_m ?? reach.section.dimensions['diameter_m'] ?? null, 'length', system)]);
  else rows.push([QUANTITY_WORDS.bankHeight, reach.section.bankDepth_m === null ? 'not given' : formatQuantity(reach.section.bankDepth_m, 'length', system)]);
  rows.push([isConduit ? QUANTITY_WORDS.fullCapacity : QUANTITY_WORDS.bankfullCapacity, formatQuantity(reach.bankfullCapacity_m3s, 'discharge', system)]);
  rows.push(...criteriaRows(reach.criteria, system, lining.maxVelocity_mps !== null || lining.maxShear_Pa !== null));
  return { headings: [QUANTITY_WORDS.reach, reach.name], numeric: [false, false], rows };
}

/** The words after a criterion that say where it came from; nothing for the design's own criteria block. */
const ORIGIN_WORDS: Readonly<Record<CriterionOrigin, string>> = {
  default: ' (default)',
  setting: ` (${CRITERION_FROM_SETTING})`,
  design: '',
  reach: ' (set for this reach)',
};

function criteriaRows(criteria: ResolvedCriteria, system: UnitSystem, withLimitMargin: boolean): string[][] {
  return criterionValues(criteria, system)
    .filter((criterion) => withLimitMargin || criterion.key !== 'limitMargin')
    .map((criterion) => [criterion.label, `${criterion.value}${ORIGIN_WORDS[criteria.origin[criterion.key] ?? 'default']}`]);
}

/** Each criterion in force as a label and a value in display units, keyed as in ResolvedCriteria.origin. */
function criterionValues(criteria: ResolvedCriteria, system: UnitSystem): { key: string; label: string; value: string }[] {
  const freeboard = criteria.freeboard;
  let freeboardText: string;
  if (freeboard === null) freeboardText = 'none required';
  else if (freeboard.kind === 'fixed') freeboardText = `at least ${formatQuantity(freeboard.height_m, 'length', system)}`;
  else {
    freeboardText =
      freeboard.coefficientC_SI === null
        ? 'USBR rule F = sqrt(C y), C from the design discharge'
        : `USBR rule F = sqrt(C y), C = ${formatSignificant(freeboard.coefficientC_SI)} (metres)`;
  }
  const values: { key: string; label: string; value: string }[] = [
    { key: 'freeboard', label: QUANTITY_WORDS.freeboardCriterion, value: freeboardText },
    { key: 'avoidFroude', label: QUANTITY_WORDS.froudeBand, value: `${formatFroude(criteria.avoidFroude.low)} to ${formatFroude(criteria.avoidFroude.high)}` },
  ];
  if (criteria.minVelocity_mps !== null) values.push({ key: 'minVelocity', label: QUANTITY_WORDS.minVelocity, value: formatQuantity(criteria.minVelocity_mps, 'velocity', system) });
  values.push({ key: 'limitMargin', label: QUANTITY_WORDS.limitMargin, value: `${formatSignificant(criteria.limitMargin * 100)} %` });
  return values;
}

/**
 * The sentence the report puts under its caution when criteria came from an editor setting or a command-line
 * option rather than the file, so a reviewer reading the report knows the file alone does not explain the checks;
 * null when none did. Names each such criterion with its value.
 */
export function criteriaFromSettingsText(analysis: DesignAnalysis): string | null {
  const seen = new Map<string, string>();
  const reachCriteria = analysis.channels.flatMap((channel) => channel.reaches.map((reach) => reach.criteria));
  for (const criteria of [analysis.criteria, ...reachCriteria]) {
    for (const criterion of criteriaFromSettings(criteria, analysis.displayUnits)) if (!seen.has(criterion.key)) seen.set(criterion.key, criterion.text);
  }
  if (seen.size === 0) return null;
  return REPORT_WORDS.criteriaFromSettings([...seen.values()].join('; '));
}

/** The criteria in force that came from a setting, each as "label: value" (hover lists them per reach). */
export function criteriaFromSettings(criteria: ResolvedCriteria, system: UnitSystem): { key: string; text: string }[] {
  return criterionValues(criteria, system)
    .filter((criterion) => criteria.origin[criterion.key] === 'setting')
    .map((criterion) => ({ key: criterion.key, text: `${criterion.label}: ${criterion.value}` }));
}

/** The per-reach results table and the notes on individual flows that go under it. */
export interface ReachFlowTable extends TextTable {
  readonly notes: readonly { readonly flow: string; readonly note: string }[];
}

/** Every computed quantity of a reach, one row per quantity and one column per flow. */
export function buildReachFlowTable(reach: ReachResult, system: UnitSystem): ReachFlowTable {
  const flows = reach.flows;
  const quantity = (word: string, unit: string, value: (flow: FlowResult) => string): string[] => [word, unit, ...flows.map(value)];
  const length = displayUnit('length', system);
  const rows: string[][] = [
    quantity(QUANTITY_WORDS.discharge, displayUnit('discharge', system), (flow) => formatDisplayNumber(flow.discharge_m3s, 'discharge', system)),
    quantity(QUANTITY_WORDS.normalDepth, length, (flow) => formatDisplayNumber(flow.normal?.depth_m, 'length', system)),
    quantity(QUANTITY_WORDS.topWidth, length, (flow) => formatDisplayNumber(flow.normal?.topWidth_m, 'length', system)),
    quantity(QUANTITY_WORDS.area, displayUnit('area', system), (flow) => formatDisplayNumber(flow.normal?.area_m2, 'area', system)),
    quantity(QUANTITY_WORDS.wettedPerimeter, length, (flow) => formatDisplayNumber(flow.normal?.wettedPerimeter_m, 'length', system)),
    quantity(QUANTITY_WORDS.hydraulicRadius, length, (flow) => formatDisplayNumber(flow.normal?.hydraulicRadius_m, 'length', system)),
    quantity(QUANTITY_WORDS.velocity, displayUnit('velocity', system), (flow) => formatDisplayNumber(flow.normal?.velocity_mps, 'velocity', system)),
    quantity(QUANTITY_WORDS.froude, '', (flow) => formatFroude(flow.normal?.froudeNumber)),
    quantity(QUANTITY_WORDS.regime, '', (flow) => flow.regime ?? MISSING_VALUE),
    quantity(QUANTITY_WORDS.specificEnergy, length, (flow) => formatDisplayNumber(flow.normal?.specificEnergy_m, 'length', system)),
    quantity(QUANTITY_WORDS.criticalDepth, length, (flow) => formatDisplayNumber(flow.critical?.depth_m, 'length', system)),
    quantity(QUANTITY_WORDS.criticalSlope, displayUnit('slope', system), (flow) => formatDisplayNumber(flow.criticalSlope, 'slope', system)),
    quantity(QUANTITY_WORDS.slopeClass, '', (flow) => flow.slopeClass),
    quantity(QUANTITY_WORDS.freeboard, length, (flow) => formatDisplayNumber(flow.freeboard_m, 'length', system)),
    quantity(QUANTITY_WORDS.requiredFreeboard, length, (flow) => formatDisplayNumber(flow.requiredFreeboard_m, 'length', system)),
    quantity(QUANTITY_WORDS.maxShear, displayUnit('shear', system), (flow) => formatDisplayNumber(flow.maxShear_Pa, 'shear', system)),
    quantity(QUANTITY_WORDS.averageShear, displayUnit('shear', system), (flow) => formatDisplayNumber(flow.averageShear_Pa, 'shear', system)),
    quantity(QUANTITY_WORDS.result, '', (flow) => STATUS_WORDS[flow.status] ?? String(flow.status)),
  ];
  const headings = ['Quantity', 'Unit', ...flows.map((flow) => (flow.description ? `${flow.flow} (${flow.description})` : flow.flow))];
  const numeric = headings.map((_, index) => index >= 2);
  const notes = flows.filter((flow) => flow.normalDepthNote).map((flow) => ({ flow: flow.flow, note: flow.normalDepthNote ?? '' }));
  return { headings, numeric, rows, notes };
}

/** The profile table of a channel with the sentences that go under it. */
export interface ProfileSummary extends TextTable {
  /** Flow name of each row, for a colour key in HTML. */
  readonly rowFlows: readonly string[];
  readonly notes: readonly string[];
}

/**
 * One row per flow and reach of the channel's computed water-surface profiles: the profile classes, the deepest
 * water and where, normal depth beside it, the least freeboard and where, and where the water stands above the
 * bank; under it the jumps and the flows whose profile is missing or partial. Null when the channel carries no
 * profiles.
 */
export function buildProfileSummary(channel: ChannelResult, system: UnitSystem): ProfileSummary | null {
  const profiles = channel.profiles ?? [];
  if (profiles.length === 0) return null;
  const length = displayUnit('length', system);
  const headings = [
    QUANTITY_WORDS.flow,
    QUANTITY_WORDS.reach,
    QUANTITY_WORDS.profileClasses,
    withUnit(QUANTITY_WORDS.deepestWater, length),
    withUnit(QUANTITY_WORDS.atStation, length),
    withUnit(QUANTITY_WORDS.normalDepth, length),
    withUnit(QUANTITY_WORDS.leastFreeboard, length),
    withUnit(QUANTITY_WORDS.atStation, length),
    withUnit(QUANTITY_WORDS.aboveBank, length),
  ];
  const numeric = headings.map((_, index) => index >= 3 && index <= 7);
  const rows: string[][] = [];
  const rowFlows: string[] = [];
  const notes: string[] = [];
  const station = (valueM: number | null | undefined): string => formatDisplayNumber(valueM, 'length', system);
  for (const profile of profiles) {
    for (const reach of channel.reaches) {
      const flow = reach.flows.find((candidate) => candidate.flow === profile.flow);
      const share = flow?.profile;
      if (flow === undefined || share === undefined || share === null) continue;
      const isOpen = reach.section.fullDepth_m === null && reach.section.bankDepth_m !== null;
      const ranges = share.overtoppedRanges.map((range) => `${station(range.fromStation_m)}–${station(range.toStation_m)}`).join(', ');
      rows.push([
        profile.flow,
        reach.name,
        share.profileClasses.join(' → '),
        formatDisplayNumber(share.maximumDepth_m, 'length', system),
        station(share.maximumDepthStation_m),
        formatDisplayNumber(flow.normal?.depth_m, 'length', system),
        formatDisplayNumber(share.minimumFreeboard_m, 'length', system),
        station(share.minimumFreeboardStation_m),
        isOpen ? ranges || QUANTITY_WORDS.noneWord : MISSING_VALUE,
      ]);
      rowFlows.push(profile.flow);
    }
    const failure = profile.failure;
    if (failure !== null) {
      notes.push(
        failure.reason === 'conduit-surcharged' && profile.computed
          ? PROFILE_WORDS.surcharged(profile.flow, failure.reach ?? '', `${station(failure.station_m)} ${length}`)
          : PROFILE_WORDS.notComputed(profile.flow, failure.message.replace(/\.$/, '')),
      );
    }
    for (const jump of profile.jumps) {
      if (jump.jumpType === 'not-a-jump' || jump.nearCritical) continue;
      const share = channel.reaches.find((reach) => reach.name === jump.reach)?.flows.find((flow) => flow.flow === profile.flow)?.profile;
      const atStart = share !== undefined && share !== null && Math.abs(share.startStation_m - jump.station_m) <= 1e-6;
      const where =
        jump.placement === 'beyond-outlet'
          ? `beyond the outlet (station ${station(jump.station_m)} ${length})`
          : jump.placement === 'at-junction'
            ? `at the ${atStart ? 'upstream' : 'downstream'} end of reach ${jump.reach} (station ${station(jump.station_m)} ${length})`
            : `in reach ${jump.reach} at station ${station(jump.station_m)} ${length}`;
      notes.push(
        PROFILE_WORDS.jump(
          profile.flow,
          where,
          formatQuantity(jump.upstreamDepth_m, 'length', system),
          formatFroude(jump.upstreamFroudeNumber),
          formatQuantity(jump.downstreamDepth_m, 'length', system),
          describeJumpType(jump.jumpType),
          jump.sweptOut,
        ),
      );
    }
  }
  return { headings, numeric, rows, rowFlows, notes };
}

/** "line 12" for a place in the file (lines are zero-based in the model); empty when unknown. */
export function lineText(location: SourceLocation | undefined): string {
  const line = location?.range?.start?.line;
  return typeof line === 'number' && Number.isFinite(line) && line >= 0 ? `line ${line + 1}` : '';
}

/** "line 12" for a finding. */
export function findingLineText(finding: Finding): string {
  return lineText(finding.location);
}

/** "channel › reach › flow" for a finding, leaving out what it does not name. */
export function findingPlaceText(finding: Finding): string {
  return [finding.channel, finding.reach, finding.flow].filter((part): part is string => typeof part === 'string' && part !== '').join(' › ');
}

/** Counts of reach-flow results by status. */
export function statusCounts(analysis: DesignAnalysis): Readonly<Record<CheckStatus, number>> {
  const counts: Record<CheckStatus, number> = { pass: 0, information: 0, warning: 0, fail: 0 };
  for (const channel of analysis.channels) for (const reach of channel.reaches) for (const flow of reach.flows) counts[flow.status] = (counts[flow.status] ?? 0) + 1;
  return counts;
}

/** "3 reaches, 6 results: 4 pass, 1 warning, 1 fail". */
export function tallyText(analysis: DesignAnalysis): string {
  const reachCount = analysis.channels.reduce((sum, channel) => sum + channel.reaches.length, 0);
  const counts = statusCounts(analysis);
  const total = counts.pass + counts.information + counts.warning + counts.fail;
  const parts = (['pass', 'information', 'warning', 'fail'] as const).filter((status) => counts[status] > 0).map((status) => `${counts[status]} ${STATUS_WORDS[status]}`);
  return `${reachCount} ${reachCount === 1 ? 'reach' : 'reaches'}, ${total} ${total === 1 ? 'result' : 'results'} (reach and flow)${parts.length > 0 ? `: ${parts.join(', ')}` : ''}`;
}
