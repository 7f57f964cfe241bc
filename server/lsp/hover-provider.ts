/**
 * Hover. On a reach's name, or on the section or lining a reach uses: the reach's results as one table with a
 * column per design flow (discharge, normal and critical depth, area, wetted perimeter, hydraulic radius, top
 * width, velocity, Froude number, regime, critical slope, specific energy, shears, freeboard, checks), its
 * bank-full capacity, the criteria that came from an editor setting rather than the file, its findings, and one
 * line on method and assumptions. On a flow's name: that flow in every reach it reaches. On a section or lining
 * definition: what it is and the reaches that use it. On a channel: its reaches and their status. On a number
 * with a unit: the value in the other unit system.
 * Everything comes from the document version's one analysis, in the display units the design or setting asks for.
 */
import { AstUtils, CstUtils, DocumentState, GrammarUtils, type AstNode, type LangiumDocument, type LangiumDocuments, type References } from 'langium';
import type { HoverProvider, LangiumServices } from 'langium/lsp';
import type { Hover, HoverParams } from 'vscode-languageserver';
import {
  isChannel,
  isFlow,
  isFlowChange,
  isLining,
  isLiningUse,
  isReach,
  isSection,
  isSectionUse,
  type Channel,
  type Flow,
  type FlowChange,
  type Lining,
  type Reach,
  type Section,
} from '../../language/generated/ast.js';
import { resolveLining, resolveSection } from '../../language/analysis/design-inputs.js';
import { formatNumber, formatQuantity, formatRatio } from '../../language/analysis/format-quantity.js';
import type { DesignAnalysis, FlowResult, ReachResult, SectionResult } from '../../language/analysis/model.js';
import { isQuantityNode, QUANTITY_DIMENSIONS, readQuantity, type QuantityNode } from '../../language/analysis/quantities.js';
import { locationOf, sameLocation } from '../../language/analysis/source-locations.js';
import { CRITERION_FROM_SETTING } from '../../language/analysis/criteria-defaults.js';
import { criteriaFromSettings } from '../../language/report/results-table.js';
import { describeSection } from '../../language/report/section-from-result.js';
import { escapeMarkdownInline } from '../../language/report/escape.js';
import { DISPLAY_UNITS, fromSI, unitsOfDimension, type UnitSystem } from '../../language/units/units.js';
import { reachesWithFlow, reachResultOf, type DocumentAnalyses } from './document-analysis.js';
import { failedCheckNames, HOVER_ROWS, SEVERITY_MARKERS, STATUS_MARKERS } from './result-text.js';
import type { RunnelSettings } from './runnel-settings.js';

/** Rows of a per-reach list before "and N more". */
const LISTED_REACHES = 12;

export class RunnelHoverProvider implements HoverProvider {
  private readonly references: References;
  private readonly documents: LangiumDocuments;

  constructor(
    services: LangiumServices,
    private readonly settings: RunnelSettings,
    private readonly analyses: DocumentAnalyses,
  ) {
    this.references = services.references.References;
    this.documents = services.shared.workspace.LangiumDocuments;
  }

  async getHoverContent(document: LangiumDocument, params: HoverParams): Promise<Hover | undefined> {
    const rootCst = document.parseResult.value.$cstNode;
    if (rootCst === undefined) return undefined;
    const offset = document.textDocument.offsetAt(params.position);
    const leaf = CstUtils.findLeafNodeAtOffset(rootCst, offset);
    if (leaf === undefined || leaf.hidden) return undefined;
    const settings = await this.settings.current(document.uri.toString());
    const markdown = this.contentFor(document, leaf.astNode, offset, settings.displayUnits === 'auto' ? undefined : settings.displayUnits);
    if (markdown === undefined) return undefined;
    return { contents: { kind: 'markdown', value: markdown }, range: leaf.range };
  }

  private contentFor(document: LangiumDocument, node: AstNode, offset: number, forcedSystem: UnitSystem | undefined): string | undefined {
    const quantity = AstUtils.getContainerOfType(node, isQuantityNode);
    if (quantity !== undefined) return quantityHover(quantity);
    let analysed: DesignAnalysis | undefined;
    const analysis = (): DesignAnalysis => (analysed ??= this.analyses.of(document));
    const system = (): UnitSystem => forcedSystem ?? analysis().displayUnits;
    const within = (property: string): boolean => {
      const cst = GrammarUtils.findNodeForProperty(node.$cstNode, property);
      return cst !== undefined && cst.offset <= offset && offset <= cst.end;
    };
    if (isReach(node) && within('name')) {
      const result = reachResultOf(analysis(), node);
      return result === undefined ? incompleteReachHover(analysis(), node) : reachHover(result, system());
    }
    if (isSectionUse(node) && within('section')) {
      const section = node.section?.ref;
      const reach = AstUtils.getContainerOfType(node, isReach);
      if (section === undefined) return undefined;
      const result = reach === undefined ? undefined : reachResultOf(analysis(), reach);
      return [sectionSummary(section, system()), result === undefined ? undefined : reachHover(result, system())].filter(isText).join('\n\n---\n\n');
    }
    if (isLiningUse(node) && within('lining')) {
      const lining = node.lining?.ref;
      const reach = AstUtils.getContainerOfType(node, isReach);
      if (lining === undefined) return undefined;
      const result = reach === undefined ? undefined : reachResultOf(analysis(), reach);
      return [liningSummary(lining, system()), result === undefined ? undefined : reachHover(result, system())].filter(isText).join('\n\n---\n\n');
    }
    if (isFlow(node) && within('name')) return flowHover(analysis(), node, undefined, system());
    if (isFlowChange(node) && within('flow')) {
      const flow = node.flow?.ref;
      return flow === undefined ? undefined : flowHover(analysis(), flow, node, system());
    }
    if (isSection(node) && within('name')) return [sectionSummary(node, system()), this.usersOf(node, system())].filter(isText).join('\n\n');
    if (isLining(node) && within('name')) return [liningSummary(node, system()), this.usersOf(node, system())].filter(isText).join('\n\n');
    if (isChannel(node) && within('name')) return channelHover(analysis(), node, system());
    return undefined;
  }

  /** The reaches of the workspace that use a section or lining, with their status. */
  private usersOf(definition: Section | Lining, system: UnitSystem): string | undefined {
    const rows: string[] = [];
    let total = 0;
    for (const reference of this.references.findReferences(definition, { includeDeclaration: false })) {
      const document = this.documents.getDocument(reference.sourceUri);
      if (document === undefined) continue;
      const rootCst = document.parseResult.value.$cstNode;
      const leaf = rootCst === undefined ? undefined : CstUtils.findLeafNodeAtOffset(rootCst, reference.segment.offset);
      const reach = leaf === undefined ? undefined : AstUtils.getContainerOfType(leaf.astNode, isReach);
      if (reach === undefined) continue;
      total++;
      if (rows.length >= LISTED_REACHES) continue;
      // A file the workspace build has not linked yet is not analysed from here (it would link it out of turn).
      const result = document.state >= DocumentState.Linked ? reachResultOf(this.analyses.of(document), reach) : undefined;
      const file = document.uri.toString() === AstUtils.getDocument(definition).uri.toString() ? '' : ` (${escapeMarkdownInline(fileName(document.uri.toString()))})`;
      rows.push(`- reach \`${reach.name ?? ''}\`${file}: ${result === undefined ? 'not analysed (incomplete, or not built yet)' : reachStatusText(result, system)}`);
    }
    if (total === 0) return 'Not used by any reach in the open workspace.';
    return [`**Used by ${total} reach${total === 1 ? '' : 'es'}**`, ...rows, ...(total > rows.length ? [`- … and ${total - rows.length} more`] : [])].join('\n');
  }
}

function isText(value: string | undefined): value is string {
  return value !== undefined && value !== '';
}

function fileName(uri: string): string {
  return decodeURIComponent(uri.split('/').pop() ?? uri);
}

// ------------------------------------------------------------------------------------------------ reaches

/** The full results of a reach: one column per flow. */
export function reachHover(reach: ReachResult, system: UnitSystem): string {
  const lines: string[] = [];
  const marker = STATUS_MARKERS[reach.status];
  lines.push(
    `**Reach \`${reach.name}\`** in channel \`${reach.channel}\`${marker === '' ? ' — all checks pass' : ` — ${marker} ${reach.status === 'fail' ? 'fails' : reach.status}`}`,
    '',
    `${escapeMarkdownInline(describeSection(reach.section, system))} (\`${reach.section.name}\`); lining \`${reach.lining.name}\`, n = ${reach.lining.manningN}; ` +
      `slope ${formatQuantity(reach.slope, 'slope', system)}; length ${formatQuantity(reach.length_m, 'length', system)}`,
  );
  if (reach.flows.length > 0) {
    lines.push('', `| | ${reach.flows.map((flow) => `**${flow.flow}**`).join(' | ')} |`, `|---|${reach.flows.map(() => '--:').join('|')}|`);
    for (const row of HOVER_ROWS) lines.push(`| ${row.label} | ${reach.flows.map((flow) => escapeMarkdownInline(row.cell(flow, reach, system))).join(' | ')} |`);
  } else {
    lines.push('', 'No design flow reaches this reach.');
  }
  const capacity = reach.bankfullCapacity_m3s;
  if (capacity !== null) lines.push('', `${reach.section.fullDepth_m === null ? 'Bank-full' : 'Full-pipe'} capacity: ${formatQuantity(capacity, 'discharge', system)}`);
  // A criterion the file does not state is named, so the file alone is not taken to explain the checks.
  const fromSettings = settingCriteriaLine([reach], system);
  if (fromSettings !== undefined) lines.push('', fromSettings);
  const findings = reach.flows.flatMap((flow) => flow.findings);
  if (findings.length > 0) {
    lines.push('', '**Findings**');
    for (const finding of findings) lines.push(`- ${SEVERITY_MARKERS[finding.severity]} ${escapeMarkdownInline(finding.message)}`);
  }
  lines.push('', `_${escapeMarkdownInline(methodLine(reach))}_`);
  return lines.join('\n');
}

/**
 * The criteria in force for these reaches that came from an editor setting rather than the file, each once; none
 * when the file states them all.
 */
function settingCriteriaLine(reaches: readonly ReachResult[], system: UnitSystem): string | undefined {
  const texts = new Map<string, string>();
  for (const reach of reaches) for (const criterion of criteriaFromSettings(reach.criteria, system)) if (!texts.has(criterion.key)) texts.set(criterion.key, criterion.text);
  return texts.size === 0 ? undefined : `Criteria ${CRITERION_FROM_SETTING}: ${escapeMarkdownInline([...texts.values()].join('; '))}.`;
}

/** One line on method and assumptions, from the reach's provenance (the same words as the report). */
export function methodLine(reach: ReachResult): string {
  const assumption = reach.provenance.assumptions[0] ?? '';
  return `Method: ${reach.provenance.method} Assumes: ${assumption}`;
}

function reachStatusText(reach: ReachResult, system: UnitSystem): string {
  const flows = reach.flows.map((flow) => `${flow.flow} yn ${flow.normal === null ? '—' : formatQuantity(flow.normal.depth_m, 'length', system)}`).join(', ');
  const failed = failedCheckNames(reach.flows.flatMap((flow) => flow.findings));
  return `${reach.status === 'pass' ? 'pass' : `${STATUS_MARKERS[reach.status]} ${failed.join(', ')}`}${flows === '' ? '' : ` (${flows})`}`;
}

function incompleteReachHover(analysis: DesignAnalysis, reach: Reach): string {
  const entry = analysis.incompleteReaches.find((candidate) => candidate.reach === reach.name);
  return `**Reach \`${reach.name ?? ''}\`** is not analysed: ${escapeMarkdownInline(entry?.reason ?? 'the file is incomplete here')}.`;
}

// ------------------------------------------------------------------------------------------------ flows

function flowHover(analysis: DesignAnalysis, flow: Flow, change: FlowChange | undefined, system: UnitSystem): string {
  const name = flow.name ?? '';
  const heading = `**Flow \`${name}\`**${flow.description ? ` — ${escapeMarkdownInline(flow.description)}` : ''}`;
  let rows = reachesWithFlow(analysis, name);
  if (change !== undefined) {
    const changeLocation = locationOf(change);
    rows = rows.filter((row) => sameLocation(row.flow.flowLocation, changeLocation));
  }
  if (rows.length === 0) return `${heading}\n\nNo analysed reach carries this flow${change === undefined ? '' : ' from here'}.`;
  const lines = [
    heading,
    '',
    '| Reach | Discharge | Normal depth | Critical depth | Velocity | Froude | Checks |',
    '|---|--:|--:|--:|--:|--:|---|',
    ...rows.slice(0, LISTED_REACHES).map(({ reach, flow: result }) => flowRow(reach, result, system)),
  ];
  if (rows.length > LISTED_REACHES) lines.push('', `… and ${rows.length - LISTED_REACHES} more reaches (see the report).`);
  const fromSettings = settingCriteriaLine(rows.map((row) => row.reach), system);
  if (fromSettings !== undefined) lines.push('', fromSettings);
  return lines.join('\n');
}

function flowRow(reach: ReachResult, flow: FlowResult, system: UnitSystem): string {
  const cells = [
    `\`${reach.channel}\` › \`${reach.name}\``,
    formatQuantity(flow.discharge_m3s, 'discharge', system),
    flow.normal === null ? '—' : formatQuantity(flow.normal.depth_m, 'length', system),
    flow.critical === null ? '—' : formatQuantity(flow.critical.depth_m, 'length', system),
    flow.normal === null ? '—' : formatQuantity(flow.normal.velocity_mps, 'velocity', system),
    flow.normal === null ? '—' : formatRatio(flow.normal.froudeNumber),
    flow.status === 'pass' ? 'pass' : `${STATUS_MARKERS[flow.status]} ${escapeMarkdownInline(failedCheckNames(flow.findings).join(', '))}`,
  ];
  return `| ${cells.join(' | ')} |`;
}

// ------------------------------------------------------------------------------------------------ definitions

function sectionSummary(section: Section, system: UnitSystem): string {
  const heading = `**Section \`${section.name ?? ''}\`**${section.description ? ` — ${escapeMarkdownInline(section.description)}` : ''}`;
  const resolved = resolveSection(section);
  if (!resolved.ok) return `${heading}\n\nIncomplete: ${escapeMarkdownInline(resolved.reason)}.`;
  const result: SectionResult = {
    name: section.name ?? '',
    shape: resolved.value.shape,
    dimensions: resolved.value.dimensions,
    bankDepth_m: resolved.value.fullDepthM === null ? resolved.value.bankDepthM : null,
    fullDepth_m: resolved.value.fullDepthM,
    location: locationOf(section),
  };
  const bank = result.bankDepth_m === null ? (result.fullDepth_m === null ? '; no bank height (over-topping not checked)' : '') : `; bank height ${formatQuantity(result.bankDepth_m, 'length', system)}`;
  return `${heading}\n\n${escapeMarkdownInline(describeSection(result, system))}${bank}`;
}

function liningSummary(lining: Lining, system: UnitSystem): string {
  const heading = `**Lining \`${lining.name ?? ''}\`**${lining.description ? ` — ${escapeMarkdownInline(lining.description)}` : ''}`;
  const resolved = resolveLining(lining);
  if (!resolved.ok) return `${heading}\n\nIncomplete: ${escapeMarkdownInline(resolved.reason)}.`;
  const value = resolved.value;
  const limits = [
    `Manning's n = ${value.manningN}`,
    value.maxVelocityMps === null ? undefined : `permissible velocity ${formatQuantity(value.maxVelocityMps, 'velocity', system)}`,
    value.maxShearPa === null ? undefined : `permissible shear ${formatQuantity(value.maxShearPa, 'shear', system)}`,
  ].filter(isText);
  return [heading, '', limits.join('; '), ...(value.source === null ? [] : ['', `Source: ${escapeMarkdownInline(value.source)}`])].join('\n');
}

function channelHover(analysis: DesignAnalysis, channel: Channel, system: UnitSystem): string {
  const result = analysis.channels.find((candidate) => candidate.name === channel.name && sameLocation(candidate.location, locationOf(channel)));
  const heading = `**Channel \`${channel.name ?? ''}\`**${channel.description ? ` — ${escapeMarkdownInline(channel.description)}` : ''}`;
  if (result === undefined || result.reaches.length === 0) return `${heading}\n\nNo analysed reaches.`;
  const rows = result.reaches.slice(0, LISTED_REACHES).map((reach) => `- \`${reach.name}\`: ${reachStatusText(reach, system)}`);
  const more = result.reaches.length > LISTED_REACHES ? [`- … and ${result.reaches.length - LISTED_REACHES} more`] : [];
  const outlet = result.outlet === null ? 'no outlet condition' : result.outlet.kind === 'water-level' ? `outlet water level ${formatQuantity(result.outlet.elevation_m, 'length', system)}` : `outlet ${result.outlet.kind.replace('-', ' ')}`;
  const fromSettings = settingCriteriaLine(result.reaches, system);
  return [heading, '', `${result.reaches.length} reach${result.reaches.length === 1 ? '' : 'es'}; ${outlet}`, '', ...rows, ...more, ...(fromSettings === undefined ? [] : ['', fromSettings])].join('\n');
}

// ------------------------------------------------------------------------------------------------ quantities

/**
 * A number with its unit in the other unit system: `4 ft` shows 1.219 m; `900 L/s` shows 31.78 cfs and 0.9 m3/s;
 * slopes show m/m and per mille or percent. Nothing for a number whose unit is missing or wrong (validation says).
 */
export function quantityHover(node: QuantityNode): string | undefined {
  const reading = readQuantity(node);
  if (!reading.ok) return undefined;
  const dimension = QUANTITY_DIMENSIONS[node.$type];
  const written = `${formatNumber(node.value, 6)} ${reading.unit.symbol}`;
  const targets = new Set<string>();
  if (dimension === 'slope') {
    for (const symbol of ['m/m', '%', 'permille']) if (symbol !== reading.unit.symbol) targets.add(symbol);
    if (reading.unit.symbol === 'ft/ft') targets.delete('m/m');
  } else {
    const other: UnitSystem = reading.unit.system === 'US' ? 'SI' : 'US';
    targets.add(DISPLAY_UNITS[other][dimension]);
    const siBase = unitsOfDimension(dimension).find((unit) => unit.toSI === 1)?.symbol;
    if (siBase !== undefined && siBase !== reading.unit.symbol) targets.add(siBase);
    targets.delete(reading.unit.symbol);
  }
  const conversions = [...targets].map((symbol) => `${formatNumber(fromSI(reading.valueSI, symbol), 4)} ${symbol}`);
  return `**${escapeMarkdownInline(written)}** (${reading.unit.name}) = ${conversions.map(escapeMarkdownInline).join(' = ')}`;
}
