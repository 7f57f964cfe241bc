/**
 * The analysis: a Runnel document in, a DesignAnalysis out (see model.ts). Each reach is checked at each design
 * flow in uniform flow with the engine; each channel's water-surface profile is computed at each design flow
 * (channel-profiles.ts), and over-topping and freeboard are judged on the deeper of the two; jumps and profiles
 * that cannot be computed give their own findings (profile-findings.ts).
 *
 * One computation per document version: `analyzeDocument` caches its result per document and recomputes only when
 * the text changed, a lining or section the design uses (possibly in another file) was replaced, or the criteria
 * defaults from settings (criteria-settings.ts) changed. Diagnostics, hints, hover, the report and the CLI all read
 * this one result. Nothing here throws on user input: a reach the file leaves incomplete is listed in
 * `incompleteReaches` and validation says why.
 */
import { AstUtils, DocumentState, isReference, type AstNode, type LangiumDocument } from 'langium';
import {
  isLibraryHeader,
  isNote,
  isOutlet,
  isReach,
  isRunnelFile,
  isUnitsSetting,
  type Channel,
  type Flow,
  type Outlet,
  type Reach,
  type RunnelFile,
} from '../generated/ast.js';
import {
  boundaryShear,
  classifyRegime,
  classifySlope,
  criticalSlope,
  fullFlowCapacityM3s,
  hydraulicStateAt,
  maximumUniformFlowCapacityM3s,
  NORMAL_DEPTH_BAND_RATIO,
  solveNormalDepth,
  type HydraulicState,
} from '../hydraulics/index.js';
import { findUnit, type UnitSystem } from '../units/units.js';
import { usbrFreeboardCoefficientM, usbrFreeboardM } from './criteria-defaults.js';
import { criteriaDefaultsKey, type CriteriaDefaults } from './criteria-settings.js';
import {
  channelFlowDischarges,
  designChannels,
  designCriteriaBlocks,
  designFlows,
  reachParts,
  resolveCriteria,
} from './design-inputs.js';
import { criterionFromSettingRemark, FINDING_CODES, FINDING_MESSAGES, LOWER_OF_TWO_DEPTHS_NOTE, MessageFormatter } from './finding-messages.js';
import { computeChannelProfiles, forgetChannelProfiles, keepProfileMemo, openProfileMemo, type ComputedFlowProfile, type ProfileMemo, type ProfileReachPlan } from './channel-profiles.js';
import {
  channelKey,
  designContextKey,
  forgetChannelMemos,
  keepChannelMemo,
  openChannelMemo,
  reachKey,
  referencesByChannel,
  type ChannelMemo,
  type RememberedChannel,
  type RememberedFlow,
  type RememberedReach,
} from './channel-memo.js';
import { reachDischarges, resolveReachInputs, sameDischarge, sameProfileShare, type ReachDischarge, type ReachInputs, type ReachProfileShare } from './reach-inputs.js';
import { profileFindingDrafts, type ReachForFindings } from './profile-findings.js';
import type {
  ChannelResult,
  CheckStatus,
  DesignAnalysis,
  DesignFlowResult,
  Finding,
  FlowResult,
  IncompleteReach,
  ProfileSegmentResult,
  SourceLocation,
  ReachResult,
  Severity,
  StateResult,
} from './model.js';
import { CAUTION, DESIGN_ASSUMPTIONS, DESIGN_PROVENANCE, REACH_PROVENANCE } from './provenance.js';
import { isQuantityNode, quantitySI } from './quantities.js';
import { locationOf } from './source-locations.js';

// ------------------------------------------------------------------------------------------------ public API

/**
 * The analysis of a Runnel document, computed once per document version, per set of linings and sections it
 * uses and per criteria defaults from settings (criteria-settings.ts; NO_CRITERIA_DEFAULTS for none). The document
 * should be built (linked) by the workspace's DocumentBuilder; unresolved references only make the reaches that
 * use them incomplete.
 */
export function analyzeDocument(document: LangiumDocument, criteriaDefaults: CriteriaDefaults): DesignAnalysis {
  const root = document.parseResult.value;
  const version = document.textDocument.version;
  const dependencies = isRunnelFile(root) ? resolvedDependencies(document, root) : [root];
  const criteriaKey = criteriaDefaultsKey(criteriaDefaults);
  const cached = analysisCache.get(document);
  if (cached !== undefined && cached.version === version && cached.criteriaKey === criteriaKey && sameNodes(cached.dependencies, dependencies)) return cached.analysis;
  const memo: AnalysisMemo = { profiles: openProfileMemo(document), channels: openChannelMemo(document) };
  const analysis = isRunnelFile(root)
    ? analyzeFile(root, document.uri.toString(), version, memo, criteriaDefaults, referencesByChannel(document))
    : emptyAnalysis(document.uri.toString(), version, criteriaDefaults);
  keepProfileMemo(document, memo.profiles);
  keepChannelMemo(document, memo.channels);
  analysisCache.set(document, { version, criteriaKey, dependencies, analysis });
  return analysis;
}

/**
 * Forgets a cached analysis, so the next call computes it again (tests and benchmarks use it to time a fresh
 * computation). The channels and profiles remembered from the previous version stay available, as they are to the
 * server after an edit, unless `everything` is set: then the next analysis computes the whole design from scratch.
 */
export function forgetAnalysis(document: LangiumDocument, { everything = false }: { everything?: boolean } = {}): void {
  analysisCache.delete(document);
  if (everything) {
    forgetChannelMemos();
    forgetChannelProfiles();
  }
}

/** What an analysis may take over from the document's previous one (channel-memo.ts, channel-profiles.ts). */
interface AnalysisMemo {
  readonly profiles: ProfileMemo;
  readonly channels: ChannelMemo;
}

/** Severity to status: the worst finding decides. */
export function statusOf(findings: readonly { readonly severity: Severity }[]): CheckStatus {
  if (findings.some((finding) => finding.severity === 'error')) return 'fail';
  if (findings.some((finding) => finding.severity === 'warning')) return 'warning';
  if (findings.some((finding) => finding.severity === 'information')) return 'information';
  return 'pass';
}

/** The display system of a file: its `units` setting if valid, else the system of most of its units (ties: SI). */
export function displayUnitsOf(file: RunnelFile): { system: UnitSystem; origin: 'setting' | 'inferred' } {
  const setting = (file.members ?? []).find(isUnitsSetting);
  if (setting?.system === 'SI' || setting?.system === 'US') return { system: setting.system, origin: 'setting' };
  let usCount = 0;
  let siCount = 0;
  for (const node of AstUtils.streamAst(file)) {
    if (!isQuantityNode(node) || node.unit === undefined) continue;
    const system = findUnit(node.unit)?.system;
    if (system === 'US') usCount++;
    else if (system === 'SI') siCount++;
  }
  return { system: usCount > siCount ? 'US' : 'SI', origin: 'inferred' };
}

// ------------------------------------------------------------------------------------------------ cache

interface CacheEntry {
  readonly version: number;
  /** criteriaDefaultsKey of the settings the analysis was computed with. */
  readonly criteriaKey: string;
  readonly dependencies: readonly AstNode[];
  readonly analysis: DesignAnalysis;
}

const analysisCache = new WeakMap<LangiumDocument, CacheEntry>();

/**
 * The root and every node the file's references resolve to (sections, linings, flows, possibly in other files): if
 * any of them is replaced, recompute. A linked document lists its references (Langium relinks it, and so refills the
 * list, whenever a file it uses changes); before linking, the reaches are asked one by one.
 */
function resolvedDependencies(document: LangiumDocument, file: RunnelFile): AstNode[] {
  const nodes: AstNode[] = [file];
  if (document.state >= DocumentState.Linked) {
    for (const reference of document.references) {
      const target = isReference(reference) ? reference.ref : undefined;
      if (target !== undefined) nodes.push(target);
    }
    return nodes;
  }
  for (const channel of designChannels(file)) {
    for (const member of channel.members ?? []) {
      if (!isReach(member)) continue;
      const parts = reachParts(member);
      const section = parts.sectionUse?.section?.ref;
      const lining = parts.liningUse?.lining?.ref;
      if (section !== undefined) nodes.push(section);
      if (lining !== undefined) nodes.push(lining);
    }
  }
  return nodes;
}

function sameNodes(left: readonly AstNode[], right: readonly AstNode[]): boolean {
  return left.length === right.length && left.every((node, index) => node === right[index]);
}

// ------------------------------------------------------------------------------------------------ design

function emptyAnalysis(uri: string, version: number, criteriaDefaults: CriteriaDefaults): DesignAnalysis {
  const criteria = resolveCriteria([], [], 'SI', criteriaDefaults);
  return {
    uri,
    title: titleFromUri(uri),
    notes: [],
    displayUnits: 'SI',
    channels: [],
    findings: [],
    caution: CAUTION,
    assumptions: DESIGN_ASSUMPTIONS,
    provenance: DESIGN_PROVENANCE,
    version,
    kind: 'design',
    displayUnitsOrigin: 'inferred',
    flows: [],
    criteria,
    incompleteReaches: [],
  };
}

function analyzeFile(
  file: RunnelFile,
  uri: string,
  version: number,
  memo: AnalysisMemo,
  criteriaDefaults: CriteriaDefaults,
  channelReferences: ReturnType<typeof referencesByChannel>,
): DesignAnalysis {
  const { system, origin } = displayUnitsOf(file);
  const formatter = new MessageFormatter(system);
  const criteriaBlocks = designCriteriaBlocks(file);
  const flows = designFlows(file);
  const incompleteReaches: IncompleteReach[] = [];
  // The criteria defaults from settings feed every channel's criteria: they are part of every channel's key.
  const contextKey = designContextKey(file, system, criteriaDefaultsKey(criteriaDefaults));
  const channelFindings: (readonly Finding[])[] = [];
  const reachMemo = memo.channels.reaches;
  const channels = designChannels(file).map((channel) => {
    // A channel whose inputs did not change since the previous version keeps its results (channel-memo.ts).
    const references = channelReferences?.get(channel);
    const key = channelKey(channel, contextKey, memo.channels, channelReferences === undefined ? undefined : (references ?? []));
    let remembered = memo.channels.previous?.get(key) ?? memo.channels.next.get(key);
    if (remembered === undefined) {
      const reachKeyOf = (reach: Reach): string | undefined => (channelReferences === undefined ? undefined : reachKey(reach, contextKey, channel.name ?? '', memo.channels, channelReferences.get(reach) ?? []));
      remembered = analyzeChannel(channel, flows, criteriaBlocks, system, formatter, memo, criteriaDefaults, reachKeyOf);
    }
    memo.channels.next.set(key, remembered);
    for (const [reachKeyText, reach] of remembered.reaches) reachMemo.next.set(reachKeyText, reach);
    incompleteReaches.push(...remembered.incompleteReaches);
    channelFindings.push(remembered.findings);
    return remembered.result;
  });
  const findings = channelFindings.flat();
  const header = file.header;
  return {
    uri,
    title: header?.title ?? titleFromUri(uri),
    notes: (file.members ?? []).filter(isNote).map((note) => note.text ?? ''),
    displayUnits: system,
    channels,
    findings,
    caution: CAUTION,
    assumptions: DESIGN_ASSUMPTIONS,
    provenance: DESIGN_PROVENANCE,
    version,
    kind: isLibraryHeader(header) ? 'library' : 'design',
    displayUnitsOrigin: origin,
    flows: flows.map(flowSummary),
    criteria: resolveCriteria(criteriaBlocks, [], system, criteriaDefaults),
    incompleteReaches,
  };
}

function flowSummary(flow: Flow): DesignFlowResult {
  return {
    name: flow.name ?? '',
    description: flow.description ?? null,
    discharge_m3s: quantitySI(flow.discharge) ?? null,
    location: locationOf(flow),
  };
}

function titleFromUri(uri: string): string {
  const lastSegment = uri.split('/').pop() ?? uri;
  return decodeURIComponent(lastSegment).replace(/\.runnel$/, '');
}

// ------------------------------------------------------------------------------------------------ channels

function analyzeChannel(
  channel: Channel,
  flows: readonly Flow[],
  designCriteria: ReturnType<typeof designCriteriaBlocks>,
  system: UnitSystem,
  formatter: MessageFormatter,
  memo: AnalysisMemo,
  criteriaDefaults: CriteriaDefaults,
  reachKeyOf: (reach: Reach) => string | undefined,
): RememberedChannel {
  const channelName = channel.name ?? '';
  const dischargesByReach = channelFlowDischarges(channel, flows);
  const outletNode = (channel.members ?? []).find(isOutlet);
  const outlet = outletOf(outletNode);
  const reachMemo = memo.channels.reaches;

  // Resolve every reach first: the water-surface profile runs through all of them. A reach whose text, place and
  // referenced nodes are unchanged keeps its resolution, and later its results where its share of the profile is
  // unchanged too (channel-memo.ts).
  const analysed: { readonly inputs: ReachInputs; readonly discharges: readonly ReachDischarge[]; readonly key: string | undefined; readonly remembered: RememberedReach | undefined }[] = [];
  const incompleteReaches: IncompleteReach[] = [];
  const reachEntries: (readonly [string, RememberedReach])[] = [];
  const leftOut: string[] = [];
  const sourceLocations = new Map<AstNode, SourceLocation>();
  for (const member of channel.members ?? []) {
    if (!isReach(member)) continue;
    const key = reachKeyOf(member);
    const remembered = key === undefined ? undefined : (reachMemo.previous?.get(key) ?? reachMemo.next.get(key));
    const resolution = remembered?.resolution ?? resolveReachInputs(channelName, member, designCriteria, system, criteriaDefaults);
    if (!resolution.ok) {
      incompleteReaches.push(resolution.incomplete);
      leftOut.push(resolution.incomplete.reach);
      if (key !== undefined) reachEntries.push([key, remembered ?? { resolution, flows: [], result: null }]);
      continue;
    }
    analysed.push({ inputs: resolution.inputs, discharges: reachDischarges(flows, dischargesByReach.get(member), sourceLocations), key, remembered });
  }

  // One profile per design flow through the whole channel.
  const profileReaches: ProfileReachPlan[] = analysed.map(({ inputs, discharges }) => ({
    name: inputs.reachName,
    section: inputs.section.geometry,
    sectionKey: inputs.sectionKey,
    manningN: inputs.lining.manningN,
    slope: inputs.slope,
    lengthM: inputs.lengthM,
    bankHeightM: inputs.section.fullDepthM === null ? inputs.section.bankDepthM : null,
    upstreamInvertM: inputs.upstreamInvertM,
    downstreamInvertM: inputs.downstreamInvertM,
    dischargesM3s: new Map(discharges.map((discharge) => [discharge.flowName, discharge.dischargeM3s])),
    nearCriticalFroudeHigh: inputs.criteria.avoidFroude.high,
  }));
  const silentObstacle =
    leftOut.length > 0 ? `Reach${leftOut.length > 1 ? 'es' : ''} ${leftOut.map((name) => `'${name}'`).join(', ')} could not be analysed, so the channel has no continuous profile.` : analysed.length === 0 ? 'The channel has no reach to compute.' : null;
  const profiles = computeChannelProfiles({ reaches: profileReaches, outlet, silentObstacle }, uniqueNames(flows), memo.profiles);
  const profileByFlow = new Map(profiles.map((profile) => [profile.model.flow, profile]));
  const findingReaches: ReachForFindings[] = analysed.map(({ inputs }) => ({
    name: inputs.reachName,
    sectionName: inputs.sectionName,
    section: inputs.section.geometry,
    sectionLocation: inputs.sectionLocation,
    manningN: inputs.lining.manningN,
    liningName: inputs.liningName,
    liningLocation: inputs.liningLocation,
    maxVelocityMps: inputs.lining.maxVelocityMps,
    maxShearPa: inputs.lining.maxShearPa,
  }));
  const outletLocation = outletNode === undefined ? null : locationOf(outletNode);
  const draftsByFlow = new Map(profiles.map((profile) => [profile.model.flow, profileFindingDrafts(findingReaches, profile, formatter, outletLocation)]));
  const segmentsByFlow = new Map(profiles.map((profile) => [profile.model.flow, segmentsByReach(profile)]));

  const reaches: ReachResult[] = analysed.map(({ inputs, discharges, key, remembered }, reachIndex) => {
    let allTakenOver = remembered?.result !== undefined && remembered.result !== null && remembered.flows.length === discharges.length;
    const flowEntries: RememberedFlow[] = discharges.map((discharge, flowIndex) => {
      const profile = profileByFlow.get(discharge.flowName);
      const reachProfile = profile?.reachProfiles[reachIndex] ?? null;
      const share: ReachProfileShare = {
        reachProfile,
        drafts: draftsByFlow.get(discharge.flowName)?.get(reachIndex) ?? [],
        maximumDepthClass: reachProfile === null ? null : profileClassAt(segmentsByFlow.get(discharge.flowName)?.get(inputs.reachName), reachProfile.maximumDepthStation_m),
      };
      const before = remembered?.flows[flowIndex];
      if (before !== undefined && sameDischarge(before.discharge, discharge) && sameProfileShare(before.share, share)) return before;
      allTakenOver = false;
      return { discharge, share, result: analyzeFlow(inputs, discharge, share, formatter) };
    });
    const result: ReachResult =
      allTakenOver && remembered?.result
        ? remembered.result
        : {
            channel: channelName,
            name: inputs.reachName,
            location: inputs.reachLocation,
            nameLocation: inputs.reachNameLocation,
            section: inputs.sectionResult,
            lining: inputs.liningResult,
            slope: inputs.slope,
            length_m: inputs.lengthM,
            upstreamInvert_m: inputs.upstreamInvertM,
            downstreamInvert_m: inputs.downstreamInvertM,
            bankfullCapacity_m3s: inputs.bankfullCapacityM3s,
            criteria: inputs.criteria,
            flows: flowEntries.map((entry) => entry.result),
            status: statusOf(flowEntries.flatMap((entry) => entry.result.findings)),
            provenance: REACH_PROVENANCE,
          };
    if (key !== undefined) reachEntries.push([key, allTakenOver && remembered !== undefined ? remembered : { resolution: { ok: true, inputs }, flows: flowEntries, result }]);
    return result;
  });
  const result: ChannelResult = { name: channelName, location: locationOf(channel), description: channel.description ?? null, outlet, reaches, profiles: profiles.map((profile) => profile.model) };
  return { result, incompleteReaches, findings: reaches.flatMap((reach) => reach.flows.flatMap((flow) => flow.findings)), reaches: reachEntries };
}

/** Flow names in order, each once (a repeated name is reported by validation). */
function uniqueNames(flows: readonly Flow[]): string[] {
  return [...new Set(flows.map((flow) => flow.name ?? ''))];
}

function outletOf(outlet: Outlet | undefined): ChannelResult['outlet'] {
  if (outlet === undefined) return null;
  switch (outlet.kind) {
    case 'free':
      return { kind: 'free-fall' };
    case 'normal':
      return { kind: 'normal-depth' };
    case 'water': {
      const elevationM = quantitySI(outlet.level);
      return elevationM === undefined ? null : { kind: 'water-level', elevation_m: elevationM };
    }
    default:
      return null;
  }
}

// ------------------------------------------------------------------------------------------------ one flow

/**
 * The computed water surface governs the over-topping and freeboard checks where it stands above normal depth by
 * more than this fraction: below it the two are the same water surface up to the rounding of the step solution
 * (each step's energy equation is solved to 1e-9 m).
 */
const PROFILE_ABOVE_NORMAL_RATIO = 1e-6;

/** One reach at one flow: uniform-flow states and every check, with the reach's share of the channel's profile. */
function analyzeFlow(context: ReachInputs, discharge: ReachDischarge, profileShare: ReachProfileShare, f: MessageFormatter): FlowResult {
  const { section, lining, slope, criteria } = context;
  const reachProfile = profileShare.reachProfile;
  const { flowName, dischargeM3s, flowLocation } = discharge;
  const findings: Finding[] = [];
  const report = (code: string, severity: Severity, message: string, data: Record<string, number | string>, related: Finding['related'] = [], location = context.reachNameLocation): void => {
    findings.push({
      code,
      severity,
      message: message + criterionFromSettingRemark(code, criteria.origin),
      location,
      channel: context.channelName,
      reach: context.reachName,
      flow: flowName,
      related: [{ message: `Discharge of ${flowName} set here`, location: flowLocation }, ...related],
      data: { discharge_m3s: dischargeM3s, ...data },
    });
  };
  const sectionRelated = { message: `Section '${context.sectionName}'`, location: context.sectionLocation };
  const liningRelated = { message: `Lining '${context.liningName}'`, location: context.liningLocation };

  // Critical depth does not depend on slope or roughness; critical slope does.
  const critical = criticalSlope(section.geometry, dischargeM3s, lining.manningN);
  const criticalState = critical.converged ? stateResult(hydraulicStateAt(section.geometry, critical.criticalDepthM, dischargeM3s)) : null;
  if (!critical.converged) report(FINDING_CODES.depthSolveFailed, 'error', FINDING_MESSAGES.depthSolveFailed(f, { flow: flowName, detail: critical.message }), { reason: critical.reason });

  let normal: StateResult | null = null;
  let normalDepthNote: string | null = null;
  if (!(slope > 0)) {
    normalDepthNote = FINDING_MESSAGES.noNormalDepth(f, { flow: flowName, slope });
    report(FINDING_CODES.noNormalDepth, 'information', normalDepthNote, { slope });
  } else {
    const solution = solveNormalDepth(section.geometry, { dischargeM3s, manningN: lining.manningN, bedSlope: slope });
    if (solution.converged) {
      normal = stateResult(hydraulicStateAt(section.geometry, solution.depthM, dischargeM3s));
      if (solution.branch === 'lower-of-two') {
        normalDepthNote = LOWER_OF_TWO_DEPTHS_NOTE;
        const fullCapacityM3s = fullFlowCapacityM3s(section.geometry, lining.manningN, slope) ?? Number.NaN;
        const peakCapacityM3s = maximumUniformFlowCapacityM3s(section.geometry, lining.manningN, slope) ?? Number.NaN;
        report(
          FINDING_CODES.conduitTwoDepthZone,
          'warning',
          FINDING_MESSAGES.conduitTwoDepthZone(f, { flow: flowName, dischargeM3s, section: context.sectionName, normalDepthM: solution.depthM, fullCapacityM3s, peakCapacityM3s }),
          { normalDepth_m: solution.depthM, fullCapacity_m3s: fullCapacityM3s, peakCapacity_m3s: peakCapacityM3s },
          [sectionRelated],
        );
      }
    } else if (solution.reason === 'exceeds-capacity') {
      const peakCapacityM3s = solution.capacityM3s ?? maximumUniformFlowCapacityM3s(section.geometry, lining.manningN, slope) ?? Number.NaN;
      const fullCapacityM3s = fullFlowCapacityM3s(section.geometry, lining.manningN, slope) ?? null;
      normalDepthNote = FINDING_MESSAGES.conduitOverCapacity(f, { flow: flowName, dischargeM3s, section: context.sectionName, peakCapacityM3s, fullCapacityM3s });
      report(FINDING_CODES.conduitOverCapacity, 'error', normalDepthNote, { peakCapacity_m3s: peakCapacityM3s, ...(fullCapacityM3s === null ? {} : { fullCapacity_m3s: fullCapacityM3s }) }, [sectionRelated]);
    } else {
      normalDepthNote = FINDING_MESSAGES.depthSolveFailed(f, { flow: flowName, detail: solution.message });
      report(FINDING_CODES.depthSolveFailed, 'error', normalDepthNote, { reason: solution.reason });
    }
  }

  const regime = normal === null ? null : classifyRegime(normal.froudeNumber);
  const slopeClass = critical.converged
    ? classifySlope(slope, normal?.depth_m, critical.criticalDepthM)
    : classifySlope(slope, normal?.depth_m, regime === 'supercritical' ? Number.POSITIVE_INFINITY : 0);
  const shear = normal === null ? null : boundaryShear(normal.depth_m, normal.hydraulicRadius_m, slope);

  // Freeboard: bank (or crown) above normal depth. Closed conduits are judged by capacity, not freeboard.
  const rimDepthM = section.fullDepthM ?? section.bankDepthM;
  const freeboardM = normal === null || rimDepthM === null ? null : rimDepthM - normal.depth_m;
  const freeboardRule = section.fullDepthM === null ? criteria.freeboard : null;
  const usbrCoefficientM = freeboardRule?.kind === 'usbr-rule' ? (freeboardRule.coefficientC_SI ?? usbrFreeboardCoefficientM(dischargeM3s)) : null;
  const requiredFreeboardAtM = (depthM: number): number | null => {
    if (freeboardRule === null) return null;
    if (freeboardRule.kind === 'fixed') return freeboardRule.height_m;
    return usbrFreeboardM(usbrCoefficientM ?? usbrFreeboardCoefficientM(dischargeM3s), depthM);
  };
  const requiredFreeboardM = normal === null ? null : requiredFreeboardAtM(normal.depth_m);

  // Over-topping and freeboard on the deeper of normal depth and the computed water surface (provenance.ts, OVERTOPPING_BASIS).
  const profileGoverns = reachProfile !== null && (normal === null || reachProfile.maximumDepth_m > normal.depth_m * (1 + PROFILE_ABOVE_NORMAL_RATIO));
  const bankDepthM = section.fullDepthM === null ? section.bankDepthM : null;
  if (bankDepthM !== null && reachProfile !== null && profileGoverns) {
    const depthM = reachProfile.maximumDepth_m;
    const stationM = reachProfile.maximumDepthStation_m;
    const normalData: Record<string, number> = normal === null ? {} : { normalDepth_m: normal.depth_m };
    if (depthM > bankDepthM) {
      const firstRange = reachProfile.overtoppedRanges[0];
      report(
        FINDING_CODES.overtopping,
        'error',
        FINDING_MESSAGES.overtoppingByProfile(f, {
          flow: flowName,
          depthM,
          stationM,
          bankDepthM,
          section: context.sectionName,
          ranges: reachProfile.overtoppedRanges,
          normalDepthM: normal?.depth_m ?? null,
          profileClass: profileShare.maximumDepthClass,
        }),
        {
          depth_m: depthM,
          station_m: stationM,
          bankDepth_m: bankDepthM,
          judgedOn: 'profile',
          ...normalData,
          ...(firstRange === undefined ? {} : { fromStation_m: firstRange.fromStation_m, toStation_m: firstRange.toStation_m }),
        },
        [sectionRelated],
      );
    } else {
      const requiredM = requiredFreeboardAtM(depthM);
      const actualM = bankDepthM - depthM;
      if (requiredM !== null && actualM < requiredM) {
        report(
          FINDING_CODES.freeboardBelowRequired,
          'warning',
          FINDING_MESSAGES.freeboardBelowRequiredByProfile(f, {
            flow: flowName,
            freeboardM: actualM,
            requiredM,
            depthM,
            stationM,
            normalDepthM: normal?.depth_m ?? null,
            profileClass: profileShare.maximumDepthClass,
            usbrCoefficientM,
          }),
          {
            actual_m: actualM,
            required_m: requiredM,
            depth_m: depthM,
            station_m: stationM,
            judgedOn: 'profile',
            ...normalData,
            ...(usbrCoefficientM === null ? {} : { usbrCoefficient_m: usbrCoefficientM }),
          },
          [sectionRelated],
        );
      }
    }
  } else if (normal !== null && bankDepthM !== null) {
    if (normal.depth_m > bankDepthM) {
      // Say where the computed water surface stands only where it is drawn down clearly below normal depth.
      const drawnDown = reachProfile !== null && reachProfile.maximumDepth_m < normal.depth_m * (1 - NORMAL_DEPTH_BAND_RATIO);
      report(
        FINDING_CODES.overtopping,
        'error',
        FINDING_MESSAGES.overtopping(f, {
          flow: flowName,
          normalDepthM: normal.depth_m,
          bankDepthM,
          section: context.sectionName,
          profileMaximum: drawnDown && reachProfile !== null ? { depthM: reachProfile.maximumDepth_m, stationM: reachProfile.maximumDepthStation_m } : null,
        }),
        { normalDepth_m: normal.depth_m, bankDepth_m: bankDepthM, judgedOn: 'normal-depth' },
        [sectionRelated],
      );
    } else if (freeboardM !== null && requiredFreeboardM !== null && freeboardM < requiredFreeboardM) {
      report(
        FINDING_CODES.freeboardBelowRequired,
        'warning',
        FINDING_MESSAGES.freeboardBelowRequired(f, { flow: flowName, freeboardM, requiredM: requiredFreeboardM, normalDepthM: normal.depth_m, usbrCoefficientM }),
        { actual_m: freeboardM, required_m: requiredFreeboardM, normalDepth_m: normal.depth_m, judgedOn: 'normal-depth', ...(usbrCoefficientM === null ? {} : { usbrCoefficient_m: usbrCoefficientM }) },
        [sectionRelated],
      );
    }
  }

  if (normal !== null) {
    const froude = normal.froudeNumber;
    const band = criteria.avoidFroude;
    if (froude >= band.low && froude <= band.high) {
      report(
        FINDING_CODES.nearCriticalFlow,
        'warning',
        FINDING_MESSAGES.nearCriticalFlow(f, { flow: flowName, froude, low: band.low, high: band.high, bandOrigin: criteria.origin['avoidFroude'] ?? 'default' }),
        { froudeNumber: froude, bandLow: band.low, bandHigh: band.high },
      );
    } else if (regime === 'supercritical') {
      report(
        FINDING_CODES.supercriticalFlow,
        'warning',
        FINDING_MESSAGES.supercriticalFlow(f, { flow: flowName, froude, normalDepthM: normal.depth_m, criticalDepthM: criticalState?.depth_m ?? Number.NaN }),
        { froudeNumber: froude, normalDepth_m: normal.depth_m, ...(criticalState === null ? {} : { criticalDepth_m: criticalState.depth_m }) },
      );
    }

    const margin = criteria.limitMargin;
    if (lining.maxVelocityMps !== null && normal.velocity_mps > lining.maxVelocityMps) {
      report(
        FINDING_CODES.velocityAbovePermissible,
        normal.velocity_mps > lining.maxVelocityMps * (1 + margin) ? 'error' : 'warning',
        FINDING_MESSAGES.velocityAbovePermissible(f, { flow: flowName, velocityMps: normal.velocity_mps, permissibleMps: lining.maxVelocityMps, lining: context.liningName, margin }),
        { velocity_mps: normal.velocity_mps, permissible_mps: lining.maxVelocityMps, limitMargin: margin },
        [liningRelated],
      );
    }
    if (shear !== null && lining.maxShearPa !== null && shear.maximumPa > lining.maxShearPa) {
      report(
        FINDING_CODES.shearAbovePermissible,
        shear.maximumPa > lining.maxShearPa * (1 + margin) ? 'error' : 'warning',
        FINDING_MESSAGES.shearAbovePermissible(f, { flow: flowName, shearPa: shear.maximumPa, permissiblePa: lining.maxShearPa, lining: context.liningName, margin }),
        { maxShear_Pa: shear.maximumPa, permissible_Pa: lining.maxShearPa, limitMargin: margin },
        [liningRelated],
      );
    }
    if (criteria.minVelocity_mps !== null && normal.velocity_mps < criteria.minVelocity_mps) {
      report(
        FINDING_CODES.velocityBelowSelfCleansing,
        'information',
        FINDING_MESSAGES.velocityBelowSelfCleansing(f, { flow: flowName, velocityMps: normal.velocity_mps, minimumMps: criteria.minVelocity_mps }),
        { velocity_mps: normal.velocity_mps, minimum_mps: criteria.minVelocity_mps },
      );
    }
  }

  // Jumps and profile failures drafted for this reach; a surcharge already reported as over capacity is not repeated.
  const overCapacity = findings.some((finding) => finding.code === FINDING_CODES.conduitOverCapacity);
  for (const draft of profileShare.drafts) {
    if (draft.code === FINDING_CODES.conduitSurcharged && overCapacity) continue;
    report(draft.code, draft.severity, draft.message, draft.data, draft.related, draft.location);
  }

  return {
    flow: flowName,
    description: discharge.description,
    discharge_m3s: dischargeM3s,
    flowLocation,
    normal,
    normalDepthNote,
    critical: criticalState,
    criticalSlope: critical.converged ? critical.slope : null,
    regime,
    slopeClass,
    maxShear_Pa: shear?.maximumPa ?? null,
    averageShear_Pa: shear?.averagePa ?? null,
    freeboard_m: freeboardM,
    requiredFreeboard_m: requiredFreeboardM,
    status: statusOf(findings),
    findings,
    profile: reachProfile,
  };
}

/** Each reach's profile segments, by reach name, in flow order. */
function segmentsByReach(profile: ComputedFlowProfile): Map<string, ProfileSegmentResult[]> {
  const byReach = new Map<string, ProfileSegmentResult[]>();
  for (const segment of profile.model.segments) {
    const list = byReach.get(segment.reach);
    if (list === undefined) byReach.set(segment.reach, [segment]);
    else list.push(segment);
  }
  return byReach;
}

/** The class of the profile segment of a reach that contains a station ('M1', ...); null when not found. */
function profileClassAt(reachSegments: readonly ProfileSegmentResult[] | undefined, stationM: number): string | null {
  const segment = reachSegments?.find((candidate) => stationM >= candidate.fromStation_m && stationM <= candidate.toStation_m && candidate.profileClass !== 'uniform');
  return segment?.profileClass ?? null;
}

function stateResult(state: HydraulicState): StateResult {
  return {
    depth_m: state.depthM,
    area_m2: state.areaM2,
    wettedPerimeter_m: state.wettedPerimeterM,
    topWidth_m: state.topWidthM,
    hydraulicRadius_m: state.hydraulicRadiusM,
    hydraulicDepth_m: state.hydraulicDepthM,
    velocity_mps: state.velocityMs,
    froudeNumber: state.froudeNumber,
    specificEnergy_m: state.specificEnergyM,
    specificForce_m3: state.specificForceM3,
  };
}
