/**
 * From the syntax tree to engine inputs in SI: sections, linings, reach slopes, flows and criteria. Validation
 * and analysis both read a design through these functions, so they agree on what a file means. Nothing here
 * throws on user input: what cannot be read is returned as a reason.
 */
import type { AstNode } from 'langium';
import {
  isBankHeight,
  isBedSlope,
  isBottomWidth,
  isChannel,
  isCriteria,
  isDiameter,
  isFlowChanges,
  isFlowTable,
  isFreeboardCriterion,
  isFroudeBandCriterion,
  isInverts,
  isLimitMarginCriterion,
  isLiningUse,
  isManningRoughness,
  isMinimumVelocityCriterion,
  isPermissibleShear,
  isPermissibleVelocity,
  isReach,
  isReachLength,
  isSectionUse,
  isSideSlopes,
  isSourceNote,
  isTopWidthAtDepth,
  type Channel,
  type Criteria,
  type Flow,
  type FlowChange,
  type Lining,
  type Reach,
  type RunnelFile,
  type Section,
  type SideSlope,
} from '../generated/ast.js';
import { SECTION_FACTORIES, type SectionGeometry, type SectionShape } from '../hydraulics/index.js';
import type { CriterionOrigin, ResolvedCriteria, SectionShapeName } from './model.js';
import type { CriteriaDefaults } from './criteria-settings.js';
import { quantitySI } from './quantities.js';
import {
  DEFAULT_FREEBOARD,
  DEFAULT_LIMIT_MARGIN,
  DEFAULT_NEAR_CRITICAL_FROUDE_BAND,
  defaultMinimumVelocityMps,
} from './criteria-defaults.js';
import type { UnitSystem } from '../units/units.js';

// ------------------------------------------------------------------------------------------------ sections

/** The section properties by AST type name. */
export type SectionPropertyType = 'BottomWidth' | 'SideSlopes' | 'BankHeight' | 'Diameter' | 'TopWidthAtDepth';

/** What each shape takes: required and optional properties (the one home of this rule). */
export const SHAPE_PROPERTIES: Readonly<Record<SectionShapeName, { readonly required: readonly SectionPropertyType[]; readonly optional: readonly SectionPropertyType[] }>> = {
  rectangle: { required: ['BottomWidth'], optional: ['BankHeight'] },
  trapezoid: { required: ['BottomWidth', 'SideSlopes'], optional: ['BankHeight'] },
  triangle: { required: ['SideSlopes'], optional: ['BankHeight'] },
  parabola: { required: ['TopWidthAtDepth'], optional: ['BankHeight'] },
  circle: { required: ['Diameter'], optional: [] },
};

export function isSectionShapeName(text: string | undefined): text is SectionShapeName {
  return text !== undefined && Object.prototype.hasOwnProperty.call(SHAPE_PROPERTIES, text);
}

export interface ResolvedSection {
  readonly shape: SectionShapeName;
  readonly geometry: SectionGeometry;
  /** SI with unit-suffixed keys, as in the analysis model. */
  readonly dimensions: Readonly<Record<string, number>>;
  readonly bankDepthM: number | null;
  readonly fullDepthM: number | null;
}

export type Resolution<T> = { readonly ok: true; readonly value: T } | { readonly ok: false; readonly reason: string };

/** Side slope H:V as z = H / V; undefined unless both parts are finite, H >= 0 and V > 0. */
export function sideSlopeRatio(slope: SideSlope | undefined): number | undefined {
  if (slope === undefined || typeof slope.horizontal !== 'number' || typeof slope.vertical !== 'number') return undefined;
  if (!(slope.vertical > 0) || !(slope.horizontal >= 0) || !Number.isFinite(slope.vertical)) return undefined;
  const ratio = slope.horizontal / slope.vertical;
  return Number.isFinite(ratio) ? ratio : undefined;
}

/** The section's geometry in SI, or why it cannot be built. */
export function resolveSection(section: Section): Resolution<ResolvedSection> {
  const shape = section.shape;
  if (!isSectionShapeName(shape)) return { ok: false, reason: `section '${section.name}' has no shape` };
  const properties = section.properties ?? [];
  const bottomWidthM = quantitySI(properties.find(isBottomWidth)?.value);
  const sideSlopes = properties.find(isSideSlopes);
  const leftHV = sideSlopeRatio(sideSlopes?.left);
  const rightHV = sideSlopes?.right === undefined ? leftHV : sideSlopeRatio(sideSlopes.right);
  const bankM = quantitySI(properties.find(isBankHeight)?.value);
  const diameterM = quantitySI(properties.find(isDiameter)?.value);
  const topWidthAtDepth = properties.find(isTopWidthAtDepth);
  const topWidthM = quantitySI(topWidthAtDepth?.value);
  const referenceDepthM = quantitySI(topWidthAtDepth?.depth);
  const bankDepthM = bankM !== undefined && bankM > 0 ? bankM : null;
  const incomplete = (what: string): Resolution<ResolvedSection> => ({ ok: false, reason: `section '${section.name}' has no valid ${what}` });
  switch (shape) {
    case 'rectangle':
      if (!(bottomWidthM !== undefined && bottomWidthM > 0)) return incomplete('bottom width');
      return built(shape, { bottomWidthM }, { bottomWidth_m: bottomWidthM }, bankDepthM, null);
    case 'trapezoid':
      if (!(bottomWidthM !== undefined && bottomWidthM > 0)) return incomplete('bottom width');
      if (leftHV === undefined || rightHV === undefined) return incomplete('side slopes');
      return built(
        shape,
        { bottomWidthM, leftSideSlopeHV: leftHV, rightSideSlopeHV: rightHV },
        { bottomWidth_m: bottomWidthM, leftSideSlope_HV: leftHV, rightSideSlope_HV: rightHV },
        bankDepthM,
        null,
      );
    case 'triangle':
      if (leftHV === undefined || rightHV === undefined || !(leftHV + rightHV > 0)) return incomplete('side slopes');
      return built(shape, { leftSideSlopeHV: leftHV, rightSideSlopeHV: rightHV }, { leftSideSlope_HV: leftHV, rightSideSlope_HV: rightHV }, bankDepthM, null);
    case 'parabola':
      if (!(topWidthM !== undefined && topWidthM > 0 && referenceDepthM !== undefined && referenceDepthM > 0)) return incomplete('top width at a depth');
      return built(shape, { topWidthM, atDepthM: referenceDepthM }, { topWidth_m: topWidthM, atDepth_m: referenceDepthM }, bankDepthM, null);
    case 'circle':
      if (!(diameterM !== undefined && diameterM > 0)) return incomplete('diameter');
      return built(shape, { diameterM }, { diameter_m: diameterM }, diameterM, diameterM);
  }
}

function built<S extends SectionShape>(
  shape: S,
  engineDimensions: Parameters<(typeof SECTION_FACTORIES)[S]>[0],
  dimensions: Record<string, number>,
  bankDepthM: number | null,
  fullDepthM: number | null,
): Resolution<ResolvedSection> {
  const factory = SECTION_FACTORIES[shape] as (dimensions: Parameters<(typeof SECTION_FACTORIES)[S]>[0]) => SectionGeometry;
  return { ok: true, value: { shape, geometry: factory(engineDimensions), dimensions, bankDepthM, fullDepthM } };
}

// ------------------------------------------------------------------------------------------------ linings

export interface ResolvedLining {
  readonly manningN: number;
  readonly maxVelocityMps: number | null;
  readonly maxShearPa: number | null;
  readonly source: string | null;
}

export function resolveLining(lining: Lining): Resolution<ResolvedLining> {
  const properties = lining.properties ?? [];
  const manningN = properties.find(isManningRoughness)?.value;
  if (!(typeof manningN === 'number' && manningN > 0 && Number.isFinite(manningN))) {
    return { ok: false, reason: `lining '${lining.name}' has no valid Manning's n` };
  }
  const maxVelocityMps = quantitySI(properties.find(isPermissibleVelocity)?.value);
  const maxShearPa = quantitySI(properties.find(isPermissibleShear)?.value);
  return {
    ok: true,
    value: {
      manningN,
      maxVelocityMps: maxVelocityMps !== undefined && maxVelocityMps > 0 ? maxVelocityMps : null,
      maxShearPa: maxShearPa !== undefined && maxShearPa > 0 ? maxShearPa : null,
      source: properties.find(isSourceNote)?.text ?? null,
    },
  };
}

// ------------------------------------------------------------------------------------------------ reaches

export interface ResolvedReachGeometry {
  readonly section: Section;
  readonly lining: Lining;
  /** m/m, positive downhill. */
  readonly slope: number;
  readonly lengthM: number;
  readonly upstreamInvertM: number | null;
  readonly downstreamInvertM: number | null;
  /** The node that sets the slope (a `slope` or `inverts` line). */
  readonly slopeNode: AstNode;
}

/** The first property of each kind (validation reports repeats). */
export function reachParts(reach: Reach) {
  const properties = reach.properties ?? [];
  return {
    sectionUse: properties.find(isSectionUse),
    liningUse: properties.find(isLiningUse),
    bedSlope: properties.find(isBedSlope),
    inverts: properties.find(isInverts),
    length: properties.find(isReachLength),
    flowChanges: properties.filter(isFlowChanges),
    criteria: properties.filter(isCriteria),
  };
}

export function resolveReachGeometry(reach: Reach): Resolution<ResolvedReachGeometry> {
  const parts = reachParts(reach);
  const section = parts.sectionUse?.section?.ref;
  if (section === undefined) return { ok: false, reason: parts.sectionUse ? `its section '${parts.sectionUse.section?.$refText ?? ''}' is not defined` : 'it has no section' };
  const lining = parts.liningUse?.lining?.ref;
  if (lining === undefined) return { ok: false, reason: parts.liningUse ? `its lining '${parts.liningUse.lining?.$refText ?? ''}' is not defined` : 'it has no lining' };
  const lengthM = quantitySI(parts.length?.value);
  if (!(lengthM !== undefined && lengthM > 0)) return { ok: false, reason: 'it has no valid length' };
  if (parts.bedSlope !== undefined && parts.inverts !== undefined) return { ok: false, reason: 'it gives both a slope and inverts' };
  if (parts.bedSlope !== undefined) {
    const slope = quantitySI(parts.bedSlope.value);
    if (slope === undefined) return { ok: false, reason: 'its slope cannot be read' };
    return { ok: true, value: { section, lining, slope, lengthM, upstreamInvertM: null, downstreamInvertM: null, slopeNode: parts.bedSlope } };
  }
  if (parts.inverts !== undefined) {
    const upstreamInvertM = quantitySI(parts.inverts.upstream);
    const downstreamInvertM = quantitySI(parts.inverts.downstream);
    if (upstreamInvertM === undefined || downstreamInvertM === undefined) return { ok: false, reason: 'its inverts cannot be read' };
    const slope = (upstreamInvertM - downstreamInvertM) / lengthM;
    if (!Number.isFinite(slope)) return { ok: false, reason: 'its inverts and length give a slope too large to compute with' };
    return { ok: true, value: { section, lining, slope, lengthM, upstreamInvertM, downstreamInvertM, slopeNode: parts.inverts } };
  }
  return { ok: false, reason: 'it has neither a slope nor inverts' };
}

// ------------------------------------------------------------------------------------------------ flows

/** Every flow defined in the design's flow tables, in document order. */
export function designFlows(file: RunnelFile): Flow[] {
  return (file.members ?? []).filter(isFlowTable).flatMap((table) => table.flows ?? []);
}

/** Where a reach's discharge for a flow comes from: the flow table or a channel's or reach's `flows { }`. */
export interface FlowDischarge {
  readonly flow: Flow;
  readonly dischargeM3s: number;
  /** The flow definition or the change that set this value. */
  readonly source: Flow | FlowChange;
}

/**
 * The discharge of each flow in each reach of a channel. A flow's value in the flow table applies at the head of
 * every channel; a channel's `flows { }` replaces it for that channel; a reach's `flows { }` replaces it from that
 * reach downstream (flow does not fall back below an inflow). A flow with no value yet is absent from the map.
 */
export function channelFlowDischarges(channel: Channel, flows: readonly Flow[]): Map<Reach, Map<Flow, FlowDischarge>> {
  const current = new Map<Flow, FlowDischarge>();
  for (const flow of flows) {
    const dischargeM3s = quantitySI(flow.discharge);
    if (dischargeM3s !== undefined) current.set(flow, { flow, dischargeM3s, source: flow });
  }
  const applyChanges = (changes: readonly FlowChange[]): void => {
    for (const change of changes) {
      const flow = change.flow?.ref;
      const dischargeM3s = quantitySI(change.discharge);
      if (flow !== undefined && dischargeM3s !== undefined) current.set(flow, { flow, dischargeM3s, source: change });
    }
  };
  const byReach = new Map<Reach, Map<Flow, FlowDischarge>>();
  const members = channel.members ?? [];
  for (const member of members) if (isFlowChanges(member)) applyChanges(member.changes ?? []);
  for (const member of members) {
    if (!isReach(member)) continue;
    for (const changes of reachParts(member).flowChanges) applyChanges(changes.changes ?? []);
    byReach.set(member, new Map(current));
  }
  return byReach;
}

// ------------------------------------------------------------------------------------------------ criteria

/**
 * The criteria in force: the built-in defaults, then the defaults from settings (editor settings or command-line
 * options, criteria-settings.ts), then the design's `criteria { }` blocks, then the reach's own. `fromSettings` is
 * required so that every caller says which settings it analyses with (NO_CRITERIA_DEFAULTS for none).
 */
export function resolveCriteria(designCriteria: readonly Criteria[], reachCriteria: readonly Criteria[], displayUnits: UnitSystem, fromSettings: CriteriaDefaults): ResolvedCriteria {
  let freeboard: ResolvedCriteria['freeboard'] = DEFAULT_FREEBOARD;
  let avoidFroude: ResolvedCriteria['avoidFroude'] = { low: DEFAULT_NEAR_CRITICAL_FROUDE_BAND.low, high: DEFAULT_NEAR_CRITICAL_FROUDE_BAND.high };
  let minVelocityMps: number | null = defaultMinimumVelocityMps(displayUnits);
  let limitMargin: number = DEFAULT_LIMIT_MARGIN.fraction;
  const origin: Record<string, CriterionOrigin> = { freeboard: 'default', avoidFroude: 'default', minVelocity: 'default', limitMargin: 'default' };
  if (fromSettings.freeboard !== undefined) {
    freeboard = fromSettings.freeboard;
    origin['freeboard'] = 'setting';
  }
  if (fromSettings.avoidFroude !== undefined) {
    avoidFroude = fromSettings.avoidFroude;
    origin['avoidFroude'] = 'setting';
  }
  if (fromSettings.minVelocity_mps !== undefined) {
    minVelocityMps = fromSettings.minVelocity_mps;
    origin['minVelocity'] = 'setting';
  }
  if (fromSettings.limitMargin !== undefined) {
    limitMargin = fromSettings.limitMargin;
    origin['limitMargin'] = 'setting';
  }
  const apply = (blocks: readonly Criteria[], from: CriterionOrigin): void => {
    for (const block of blocks) {
      for (const item of block.items ?? []) {
        if (isFreeboardCriterion(item)) {
          if (item.none) freeboard = null;
          else if (item.rule === 'usbr') {
            const coefficientM = item.coefficient === undefined ? null : quantitySI(item.coefficient);
            if (coefficientM === undefined || (coefficientM !== null && !(coefficientM > 0))) continue;
            freeboard = { kind: 'usbr-rule', coefficientC_SI: coefficientM };
          } else {
            const heightM = quantitySI(item.height);
            if (heightM === undefined || heightM < 0) continue;
            freeboard = { kind: 'fixed', height_m: heightM };
          }
          origin['freeboard'] = from;
        } else if (isFroudeBandCriterion(item)) {
          if (!(typeof item.low === 'number' && typeof item.high === 'number' && item.low >= 0 && item.high > item.low && Number.isFinite(item.high))) continue;
          avoidFroude = { low: item.low, high: item.high };
          origin['avoidFroude'] = from;
        } else if (isMinimumVelocityCriterion(item)) {
          const velocityMps = quantitySI(item.value);
          if (velocityMps === undefined || velocityMps < 0) continue;
          minVelocityMps = velocityMps;
          origin['minVelocity'] = from;
        } else if (isLimitMarginCriterion(item)) {
          if (!(typeof item.percent === 'number' && item.percent >= 0 && Number.isFinite(item.percent))) continue;
          limitMargin = item.percent / 100;
          origin['limitMargin'] = from;
        }
      }
    }
  };
  apply(designCriteria, 'design');
  apply(reachCriteria, 'reach');
  return { freeboard, avoidFroude, minVelocity_mps: minVelocityMps, limitMargin, origin };
}

/** The design-level criteria blocks of a file. */
export function designCriteriaBlocks(file: RunnelFile): Criteria[] {
  return (file.members ?? []).filter(isCriteria);
}

/** The channels of a file, in order. */
export function designChannels(file: RunnelFile): Channel[] {
  return (file.members ?? []).filter(isChannel);
}
