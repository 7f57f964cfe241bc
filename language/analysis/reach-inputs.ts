/**
 * What the analysis of one reach reads from the design: its own text (slope, length, criteria), the section and
 * lining it names, the design's criteria and the discharge of each flow in it, resolved to numbers, names and source
 * locations. No syntax node is kept, so that a reach remembered between analyses (channel-memo.ts) does not keep an
 * old version's syntax tree alive.
 */
import type { AstNode } from 'langium';
import type { Reach } from '../generated/ast.js';
import { fullFlowCapacityM3s, manningDischargeM3s } from '../hydraulics/index.js';
import type { UnitSystem } from '../units/units.js';
import type { CriteriaDefaults } from './criteria-settings.js';
import {
  reachParts,
  resolveCriteria,
  resolveLining,
  resolveReachGeometry,
  resolveSection,
  type designCriteriaBlocks,
  type FlowDischarge,
  type ResolvedLining,
  type ResolvedSection,
} from './design-inputs.js';
import type { IncompleteReach, LiningResult, ReachFlowProfile, ResolvedCriteria, SectionResult, SourceLocation } from './model.js';
import type { FindingDraft } from './profile-findings.js';
import { locationOf, propertyLocationOf, sameLocation } from './source-locations.js';

/** One reach, resolved. */
export interface ReachInputs {
  readonly channelName: string;
  readonly reachName: string;
  /** The whole `reach ... { }` block, and its name (where findings point). */
  readonly reachLocation: SourceLocation;
  readonly reachNameLocation: SourceLocation;
  readonly sectionName: string;
  readonly sectionLocation: SourceLocation;
  readonly section: ResolvedSection;
  /** The section's shape and dimensions as one string: equal strings, equal sections (channel-profiles.ts). */
  readonly sectionKey: string;
  readonly sectionResult: SectionResult;
  readonly liningName: string;
  readonly liningLocation: SourceLocation;
  readonly lining: ResolvedLining;
  readonly liningResult: LiningResult;
  /** Bed slope, m/m (positive downhill), length, m, and the inverts when written, m. */
  readonly slope: number;
  readonly lengthM: number;
  readonly upstreamInvertM: number | null;
  readonly downstreamInvertM: number | null;
  readonly bankfullCapacityM3s: number | null;
  readonly criteria: ResolvedCriteria;
}

/** A reach resolved, or the reason it cannot be analysed. */
export type ReachResolution = { readonly ok: true; readonly inputs: ReachInputs } | { readonly ok: false; readonly incomplete: IncompleteReach };

/** The discharge of one flow in one reach, and where it was set. */
export interface ReachDischarge {
  readonly flowName: string;
  readonly description: string | null;
  readonly dischargeM3s: number;
  readonly flowLocation: SourceLocation;
}

/** What a reach's results at one flow read of the channel's profile at that flow. */
export interface ReachProfileShare {
  readonly reachProfile: ReachFlowProfile | null;
  /** Jump and profile findings drafted for this reach and flow (profile-findings.ts). */
  readonly drafts: readonly FindingDraft[];
  /** The class of the profile segment where the water is deepest ('M1', ...), null when none. */
  readonly maximumDepthClass: string | null;
}

export function resolveReachInputs(
  channelName: string,
  reach: Reach,
  designCriteria: ReturnType<typeof designCriteriaBlocks>,
  system: UnitSystem,
  criteriaDefaults: CriteriaDefaults,
): ReachResolution {
  const reachName = reach.name ?? '';
  const reachNameLocation = propertyLocationOf(reach, 'name');
  const incomplete = (reason: string): ReachResolution => ({ ok: false, incomplete: { channel: channelName, reach: reachName, reason, location: reachNameLocation } });
  const geometry = resolveReachGeometry(reach);
  if (!geometry.ok) return incomplete(geometry.reason);
  const section = resolveSection(geometry.value.section);
  if (!section.ok) return incomplete(section.reason);
  const lining = resolveLining(geometry.value.lining);
  if (!lining.ok) return incomplete(lining.reason);
  const sectionNode = geometry.value.section;
  const liningNode = geometry.value.lining;
  const sectionLocation = locationOf(sectionNode);
  const liningLocation = locationOf(liningNode);
  const resolvedSection = section.value;
  const resolvedLining = lining.value;
  const slope = geometry.value.slope;
  return {
    ok: true,
    inputs: {
      channelName,
      reachName,
      reachLocation: locationOf(reach),
      reachNameLocation,
      sectionName: sectionNode.name ?? '',
      sectionLocation,
      section: resolvedSection,
      sectionKey: `${resolvedSection.shape}${JSON.stringify(resolvedSection.dimensions)}`,
      sectionResult: {
        name: sectionNode.name ?? '',
        shape: resolvedSection.shape,
        dimensions: resolvedSection.dimensions,
        bankDepth_m: resolvedSection.fullDepthM === null ? resolvedSection.bankDepthM : null,
        fullDepth_m: resolvedSection.fullDepthM,
        location: sectionLocation,
        description: sectionNode.description ?? null,
      },
      liningName: liningNode.name ?? '',
      liningLocation,
      lining: resolvedLining,
      liningResult: {
        name: liningNode.name ?? '',
        manningN: resolvedLining.manningN,
        maxVelocity_mps: resolvedLining.maxVelocityMps,
        maxShear_Pa: resolvedLining.maxShearPa,
        description: liningNode.description ?? null,
        location: liningLocation,
        source: resolvedLining.source,
      },
      slope,
      lengthM: geometry.value.lengthM,
      upstreamInvertM: geometry.value.upstreamInvertM,
      downstreamInvertM: geometry.value.downstreamInvertM,
      bankfullCapacityM3s: bankfullCapacityM3s(resolvedSection, resolvedLining, slope),
      criteria: resolveCriteria(designCriteria, reachParts(reach).criteria, system, criteriaDefaults),
    },
  };
}

/** The discharges of one reach in the order of the design's flows (flows without a discharge left out). */
export function reachDischarges(
  flows: readonly { readonly name?: string }[],
  discharges: ReadonlyMap<unknown, FlowDischarge> | undefined,
  /** Locations already made, by source node: most reaches share their discharges' sources. */
  locations: Map<AstNode, SourceLocation>,
): ReachDischarge[] {
  const result: ReachDischarge[] = [];
  if (discharges === undefined) return result;
  for (const flow of flows) {
    const discharge = discharges.get(flow);
    if (discharge === undefined) continue;
    result.push({
      flowName: discharge.flow.name ?? '',
      description: discharge.flow.description ?? null,
      dischargeM3s: discharge.dischargeM3s,
      flowLocation: locationOnce(discharge.source, locations),
    });
  }
  return result;
}

function locationOnce(node: AstNode, locations: Map<AstNode, SourceLocation>): SourceLocation {
  let location = locations.get(node);
  if (location === undefined) {
    location = locationOf(node);
    locations.set(node, location);
  }
  return location;
}

function bankfullCapacityM3s(section: ResolvedSection, lining: ResolvedLining, slope: number): number | null {
  if (!(slope > 0)) return null;
  let capacityM3s: number | undefined;
  if (section.fullDepthM !== null) capacityM3s = fullFlowCapacityM3s(section.geometry, lining.manningN, slope);
  else if (section.bankDepthM !== null) capacityM3s = manningDischargeM3s(section.geometry, section.bankDepthM, lining.manningN, slope);
  // Dimensions near the limits of double precision overflow here: no capacity rather than Infinity or NaN.
  return capacityM3s !== undefined && Number.isFinite(capacityM3s) ? capacityM3s : null;
}

/** Equal discharges, set at the same place. */
export function sameDischarge(left: ReachDischarge, right: ReachDischarge): boolean {
  return left.flowName === right.flowName && left.description === right.description && Object.is(left.dischargeM3s, right.dischargeM3s) && sameLocation(left.flowLocation, right.flowLocation);
}

/** Equal shares of the profile, value for value (sameData, with the common cases first). */
export function sameProfileShare(left: ReachProfileShare, right: ReachProfileShare): boolean {
  if (left.maximumDepthClass !== right.maximumDepthClass) return false;
  if (left.drafts.length !== right.drafts.length || (left.drafts.length > 0 && !sameData(left.drafts, right.drafts))) return false;
  const a = left.reachProfile;
  const b = right.reachProfile;
  if (a === b) return true;
  if (a === null || b === null) return false;
  for (const field of REACH_PROFILE_FIELDS) if (!sameData(a[field], b[field])) return false;
  return true;
}

/** Every field of a reach's profile; the type makes a field added to the model appear here. */
const REACH_PROFILE_FIELDS = Object.keys({
  startStation_m: true,
  endStation_m: true,
  maximumDepth_m: true,
  maximumDepthStation_m: true,
  minimumFreeboard_m: true,
  minimumFreeboardStation_m: true,
  overtoppedRanges: true,
  profileClasses: true,
} satisfies Record<keyof ReachFlowProfile, true>) as (keyof ReachFlowProfile)[];

/**
 * Equal plain data (numbers bit for bit, NaN equal to NaN; strings; arrays and plain objects member for member):
 * how a remembered reach's profile inputs are compared with this analysis' (channel-memo.ts).
 */
export function sameData(left: unknown, right: unknown): boolean {
  if (Object.is(left, right)) return true;
  if (typeof left !== 'object' || typeof right !== 'object' || left === null || right === null) return false;
  if (Array.isArray(left)) {
    if (!Array.isArray(right) || left.length !== right.length) return false;
    for (let index = 0; index < left.length; index++) if (!sameData(left[index], right[index])) return false;
    return true;
  }
  if (Array.isArray(right)) return false;
  const leftKeys = Object.keys(left);
  if (leftKeys.length !== Object.keys(right).length) return false;
  for (const key of leftKeys) {
    if (!Object.hasOwn(right, key) || !sameData((left as Record<string, unknown>)[key], (right as Record<string, unknown>)[key])) return false;
  }
  return true;
}
