/**
 * Compares two versions of a design: which reaches, flows, sections and linings were added, removed, renamed or
 * changed; for each matched reach and flow, the inputs that changed, the results that changed significantly
 * (before -> after and the difference) and how each check's status moved (newly failing, newly passing, still
 * failing). Pure: analyses in, a ComparisonReport out; the CLI and the server read the files.
 */
import type { DesignAnalysis, DesignFlowResult, Finding, FlowResult, LiningResult, ReachResult, SectionResult, Severity } from '../analysis/model.js';
import {
  COMPARISON_SCHEMA_VERSION,
  type CheckChange,
  type ComparisonCounts,
  type ComparisonReport,
  type DefinitionChange,
  type DesignComparison,
  type DesignProblem,
  type FileChange,
  type FlowComparison,
  type FlowResultsSnapshot,
  type InputChange,
  type ReachComparison,
  type ResultChange,
  type Verdict,
} from './comparison-model.js';
import { COMPARED_CAPACITY, COMPARED_FLOW_RESULTS, directionContextOf, type ComparedQuantity, type DirectionContext } from './compared-quantities.js';
import {
  compareCriteria,
  compareLinings,
  compareReachInputs,
  compareSections,
  liningSignature,
  reachSignature,
  sectionSignature,
  valuesDiffer,
  type DefinitionRenames,
} from './compare-inputs.js';
import { CAUTION } from '../analysis/provenance.js';
import { matchItems } from './match-items.js';
import { DEFAULT_SIGNIFICANCE_THRESHOLDS, type SignificanceThresholds } from './thresholds.js';

/** One version of a design file: its analysis (null when it could not be analysed) and its parse/validation problems. */
export interface DesignVersion {
  readonly analysis: DesignAnalysis | null;
  readonly problems: readonly DesignProblem[];
}

/** The two versions of one design file; `before` is null for an added file, `after` for a removed one. */
export interface DesignPair {
  /** Workspace-relative path in the new version (the old one when removed). */
  readonly path: string;
  /** The old path when the file was renamed. */
  readonly previousPath: string | null;
  readonly before: DesignVersion | null;
  readonly after: DesignVersion | null;
}

export interface CompareOptions {
  readonly beforeLabel: string;
  readonly afterLabel: string;
  readonly thresholds?: SignificanceThresholds;
}

/** Compares every pair and sums the counts into a verdict. Pairs with no change are counted, not listed. */
export function compareDesignVersions(pairs: readonly DesignPair[], options: CompareOptions): ComparisonReport {
  const thresholds = options.thresholds ?? DEFAULT_SIGNIFICANCE_THRESHOLDS;
  const comparisons = [...pairs].sort((a, b) => a.path.localeCompare(b.path)).map((pair) => compareDesignPair(pair, thresholds));
  const changed = comparisons.filter((comparison) => comparison.fileChange !== 'unchanged');
  const counts = sumCounts(comparisons.map((comparison) => comparison.counts));
  const caution = pairs.flatMap((pair) => [pair.after?.analysis?.caution, pair.before?.analysis?.caution]).find((text) => text !== undefined) ?? CAUTION;
  return {
    schemaVersion: COMPARISON_SCHEMA_VERSION,
    beforeLabel: options.beforeLabel,
    afterLabel: options.afterLabel,
    verdict: verdictOf(counts, changed.length > 0),
    designs: changed,
    unchangedDesignCount: comparisons.length - changed.length,
    counts,
    thresholds,
    caution,
  };
}

/** Compares the two versions of one design file. */
export function compareDesignPair(pair: DesignPair, thresholds: SignificanceThresholds = DEFAULT_SIGNIFICANCE_THRESHOLDS): DesignComparison {
  const beforeAnalysis = pair.before?.analysis ?? null;
  const afterAnalysis = pair.after?.analysis ?? null;
  const problemsBefore = pair.before?.problems ?? [];
  const problemsAfter = pair.after?.problems ?? [];
  const newProblems = problemsMissingFrom(problemsAfter, problemsBefore);
  const resolvedProblems = problemsMissingFrom(problemsBefore, problemsAfter);
  // A version that exists but could not be analysed makes the comparison partial: listing its reaches as removed
  // (or added) would mislead, so reaches are compared only when every existing version was analysed.
  const incomplete = (pair.before !== null && beforeAnalysis === null) || (pair.after !== null && afterAnalysis === null);
  const reachesBefore = incomplete ? [] : allReaches(beforeAnalysis);
  const reachesAfter = incomplete ? [] : allReaches(afterAnalysis);

  const definitions = incomplete ? { changes: [], renames: NO_RENAMES } : compareDefinitions(beforeAnalysis, afterAnalysis, reachesBefore, reachesAfter);
  const reachMatch = matchItems(reachesBefore, reachesAfter, [
    reachKey,
    (reach) => reach.name,
    reachSignature,
  ]);

  const reaches: ReachComparison[] = [];
  let reachesUnchanged = 0;
  let stillFailingInUnchanged = 0;
  for (const { before, after, pass } of reachMatch.matched) {
    const comparison = compareMatchedReach(before, after, pass > 0, beforeAnalysis, afterAnalysis, definitions.renames, thresholds);
    if (comparison.changed) reaches.push(comparison.reach);
    else {
      reachesUnchanged += 1;
      stillFailingInUnchanged += comparison.reach.checkChanges.filter((check) => check.change === 'still-failing').length;
    }
  }
  const notAnalysedBefore = incompleteReachReasons(beforeAnalysis);
  const notAnalysedAfter = incompleteReachReasons(afterAnalysis);
  for (const after of reachMatch.added) {
    const reason = notAnalysedBefore.get(reachKey(after));
    reaches.push(addedReach(after, afterAnalysis, reason === undefined ? null : `The old version could not analyse it: ${reason}`));
  }
  for (const before of reachMatch.removed) {
    const reason = notAnalysedAfter.get(reachKey(before));
    reaches.push(reason === undefined ? removedReach(before, 'removed', null) : removedReach(before, 'not-analysed', `The new version cannot analyse it: ${reason}`));
  }

  const designCheckChanges = incomplete ? [] : compareChecks(designLevelFindings(beforeAnalysis), designLevelFindings(afterAnalysis), definitions.renames.flows);
  const checkChanges = [...reaches.flatMap((reach) => reach.checkChanges), ...designCheckChanges];
  const resultChanges = reaches.flatMap((reach) => [
    ...(reach.capacityChange ? [reach.capacityChange] : []),
    ...reach.flows.flatMap((flow) => flow.resultChanges),
  ]);
  const findingsAfter = afterAnalysis?.findings ?? [];
  const counts: ComparisonCounts = {
    newlyFailing: checkChanges.filter((check) => check.change === 'newly-failing').length,
    newErrors:
      checkChanges.filter((check) => check.severityAfter === 'error' && check.severityBefore !== 'error').length +
      newProblems.filter((problem) => problem.severity === 'error').length,
    newlyPassing: checkChanges.filter((check) => check.change === 'newly-passing').length,
    stillFailing: checkChanges.filter((check) => check.change === 'still-failing').length + stillFailingInUnchanged,
    resultsWorse: resultChanges.filter((change) => change.direction === 'worse').length,
    resultsBetter: resultChanges.filter((change) => change.direction === 'better').length,
    errorsAfter: [...findingsAfter, ...problemsAfter].filter((item) => item.severity === 'error').length,
    warningsAfter: [...findingsAfter, ...problemsAfter].filter((item) => item.severity === 'warning').length,
    reachesChanged: reaches.length,
    reachesUnchanged,
  };

  const anythingChanged =
    reaches.length > 0 ||
    definitions.changes.length > 0 ||
    designCheckChanges.some((check) => check.change !== 'still-failing') ||
    newProblems.length > 0 ||
    resolvedProblems.length > 0;
  const fileChange: FileChange =
    pair.before === null ? 'added' : pair.after === null ? 'removed' : pair.previousPath !== null ? 'renamed' : anythingChanged ? 'modified' : 'unchanged';
  const shown = afterAnalysis ?? beforeAnalysis;
  return {
    path: pair.path,
    previousPath: pair.previousPath,
    fileChange,
    title: shown?.title ?? pair.path,
    displayUnits: shown?.displayUnits ?? 'SI',
    definitions: definitions.changes,
    reaches,
    designCheckChanges,
    newProblems,
    resolvedProblems,
    incomplete,
    counts,
  };
}

const NO_RENAMES: DefinitionRenames = { sections: new Map(), linings: new Map(), flows: new Map() };

function reachKey(reach: { readonly channel: string; readonly name: string }): string {
  return `${reach.channel}\u0000${reach.name}`;
}

/** Reaches a version has but could not analyse, by reach key, with the reason. */
function incompleteReachReasons(analysis: DesignAnalysis | null): Map<string, string> {
  return new Map((analysis?.incompleteReaches ?? []).map((reach) => [reachKey({ channel: reach.channel, name: reach.reach }), reach.reason]));
}

function allReaches(analysis: DesignAnalysis | null): ReachResult[] {
  return analysis === null ? [] : analysis.channels.flatMap((channel) => channel.reaches);
}

/** Problems of `from` that `other` does not have, compared by code and message (lines move with every edit). */
function problemsMissingFrom(from: readonly DesignProblem[], other: readonly DesignProblem[]): DesignProblem[] {
  const remaining = new Map<string, number>();
  for (const problem of other) {
    const key = `${problem.code}\u0000${problem.message}`;
    remaining.set(key, (remaining.get(key) ?? 0) + 1);
  }
  return from.filter((problem) => {
    const key = `${problem.code}\u0000${problem.message}`;
    const count = remaining.get(key) ?? 0;
    if (count === 0) return true;
    remaining.set(key, count - 1);
    return false;
  });
}

// ---------------------------------------------------------------------------------------------------------------
// Definitions: sections, linings and flows, as the reaches use them.

/** Each definition once, by name, in document order (the first reach using it). */
function uniqueByName<T extends { readonly name: string }>(items: readonly T[]): T[] {
  const seen = new Map<string, T>();
  for (const item of items) if (!seen.has(item.name)) seen.set(item.name, item);
  return [...seen.values()];
}

function compareDefinitionKind<T extends { readonly name: string }>(
  kind: DefinitionChange['kind'],
  before: readonly T[],
  after: readonly T[],
  signature: (item: T) => string,
  compareFields: (before: T, after: T) => DefinitionChange['inputChanges'],
): { changes: DefinitionChange[]; renames: Map<string, string> } {
  const match = matchItems(before, after, [(item) => item.name, signature]);
  const changes: DefinitionChange[] = [];
  const renames = new Map<string, string>();
  for (const pair of match.matched) {
    if (pair.pass > 0) {
      renames.set(pair.before.name, pair.after.name);
      changes.push({ kind, change: 'renamed', name: pair.after.name, previousName: pair.before.name, inputChanges: [] });
      continue;
    }
    const inputChanges = compareFields(pair.before, pair.after);
    if (inputChanges.length > 0) changes.push({ kind, change: 'modified', name: pair.after.name, previousName: null, inputChanges });
  }
  for (const item of match.added) changes.push({ kind, change: 'added', name: item.name, previousName: null, inputChanges: [] });
  for (const item of match.removed) changes.push({ kind, change: 'removed', name: item.name, previousName: null, inputChanges: [] });
  return { changes, renames };
}

/**
 * Sections and linings as the reaches use them (a definition no reach uses has no consequence to show), the
 * design's named flows, and the design-wide criteria.
 */
function compareDefinitions(
  beforeAnalysis: DesignAnalysis | null,
  afterAnalysis: DesignAnalysis | null,
  reachesBefore: readonly ReachResult[],
  reachesAfter: readonly ReachResult[],
): { changes: DefinitionChange[]; renames: DefinitionRenames } {
  const sections = compareDefinitionKind<SectionResult>(
    'section',
    uniqueByName(reachesBefore.map((reach) => reach.section)),
    uniqueByName(reachesAfter.map((reach) => reach.section)),
    sectionSignature,
    (before, after) => compareSections(before, after, '', ''),
  );
  const linings = compareDefinitionKind<LiningResult>(
    'lining',
    uniqueByName(reachesBefore.map((reach) => reach.lining)),
    uniqueByName(reachesAfter.map((reach) => reach.lining)),
    liningSignature,
    (before, after) => compareLinings(before, after, '', ''),
  );
  const flows = compareDefinitionKind<DesignFlowResult>(
    'flow',
    beforeAnalysis?.flows ?? [],
    afterAnalysis?.flows ?? [],
    (flow) => JSON.stringify([flow.discharge_m3s, flow.description]),
    compareFlowDefinitions,
  );
  const criteria =
    beforeAnalysis !== null && afterAnalysis !== null ? compareCriteria(beforeAnalysis.criteria, afterAnalysis.criteria) : [];
  const criteriaChanges: DefinitionChange[] =
    criteria.length > 0 ? [{ kind: 'criteria', change: 'modified', name: 'design', previousName: null, inputChanges: criteria }] : [];
  return {
    changes: [...criteriaChanges, ...sections.changes, ...linings.changes, ...flows.changes],
    renames: { sections: sections.renames, linings: linings.renames, flows: flows.renames },
  };
}

function compareFlowDefinitions(before: DesignFlowResult, after: DesignFlowResult): InputChange[] {
  const changes: InputChange[] = [];
  if (valuesDiffer(before.discharge_m3s, after.discharge_m3s)) {
    changes.push({ field: 'discharge_m3s', label: 'discharge', kind: 'discharge', before: before.discharge_m3s, after: after.discharge_m3s });
  }
  if (before.description !== after.description) {
    changes.push({ field: 'description', label: 'description', kind: 'text', before: before.description, after: after.description });
  }
  return changes;
}

// ---------------------------------------------------------------------------------------------------------------
// Reaches and flows.

function compareQuantity(
  quantity: Pick<ComparedQuantity, 'key' | 'label' | 'kind'> & {
    readonly threshold: (thresholds: SignificanceThresholds) => number;
    readonly direction: (before: number, after: number, context: DirectionContext) => ResultChange['direction'];
  },
  before: number | null,
  after: number | null,
  thresholds: SignificanceThresholds,
  context: DirectionContext,
): ResultChange | null {
  if (before === null && after === null) return null;
  const base = { quantity: quantity.key, label: quantity.label, kind: quantity.kind, before, after };
  if (before === null || after === null) {
    return { ...base, difference: null, relativeDifference: null, direction: 'neutral' };
  }
  const difference = after - before;
  const magnitude = Math.abs(difference);
  if (magnitude === 0 || magnitude < quantity.threshold(thresholds) || magnitude < thresholds.relative * Math.abs(before)) return null;
  return {
    ...base,
    difference,
    relativeDifference: before === 0 ? null : difference / Math.abs(before),
    direction: quantity.direction(before, after, context),
  };
}

function snapshotOf(flow: FlowResult | undefined): Record<string, number | null> | null {
  if (flow === undefined) return null;
  return Object.fromEntries(COMPARED_FLOW_RESULTS.map((quantity) => [quantity.key, quantity.read(flow)]));
}

function compareFlows(
  before: ReachResult,
  after: ReachResult,
  flowRenames: ReadonlyMap<string, string>,
  thresholds: SignificanceThresholds,
): { changed: FlowComparison[]; unchanged: number; snapshots: FlowResultsSnapshot[] } {
  const context = directionContextOf(after);
  const newNameOf = (flow: FlowResult): string => flowRenames.get(flow.flow) ?? flow.flow;
  const match = matchItems(before.flows, after.flows, [newNameOf]);
  const changed: FlowComparison[] = [];
  const snapshots: FlowResultsSnapshot[] = [];
  let unchanged = 0;
  for (const pair of match.matched) {
    const resultChanges = COMPARED_FLOW_RESULTS.flatMap((quantity) => {
      const change = compareQuantity(quantity, quantity.read(pair.before), quantity.read(pair.after), thresholds, context);
      return change ? [change] : [];
    });
    const renamed = pair.before.flow !== pair.after.flow;
    const dischargeChanged = valuesDiffer(pair.before.discharge_m3s, pair.after.discharge_m3s);
    snapshots.push({ flow: pair.after.flow, before: snapshotOf(pair.before), after: snapshotOf(pair.after) });
    if (resultChanges.length === 0 && !dischargeChanged && pair.before.status === pair.after.status) {
      unchanged += 1;
      continue;
    }
    changed.push({
      change: 'modified',
      flow: pair.after.flow,
      previousFlow: renamed ? pair.before.flow : null,
      dischargeBefore_m3s: pair.before.discharge_m3s,
      dischargeAfter_m3s: pair.after.discharge_m3s,
      statusBefore: pair.before.status,
      statusAfter: pair.after.status,
      resultChanges,
    });
  }
  for (const flow of match.added) {
    changed.push(addedFlow(flow));
    snapshots.push({ flow: flow.flow, before: null, after: snapshotOf(flow) });
  }
  for (const flow of match.removed) {
    changed.push(removedFlow(flow));
    snapshots.push({ flow: flow.flow, before: snapshotOf(flow), after: null });
  }
  return { changed, unchanged, snapshots };
}

function addedFlow(flow: FlowResult): FlowComparison {
  return {
    change: 'added',
    flow: flow.flow,
    previousFlow: null,
    dischargeBefore_m3s: null,
    dischargeAfter_m3s: flow.discharge_m3s,
    statusBefore: null,
    statusAfter: flow.status,
    resultChanges: [],
  };
}

function removedFlow(flow: FlowResult): FlowComparison {
  return {
    change: 'removed',
    flow: flow.flow,
    previousFlow: null,
    dischargeBefore_m3s: flow.discharge_m3s,
    dischargeAfter_m3s: null,
    statusBefore: flow.status,
    statusAfter: null,
    resultChanges: [],
  };
}

function compareMatchedReach(
  before: ReachResult,
  after: ReachResult,
  matchedAsRename: boolean,
  beforeAnalysis: DesignAnalysis | null,
  afterAnalysis: DesignAnalysis | null,
  renames: DefinitionRenames,
  thresholds: SignificanceThresholds,
): { reach: ReachComparison; changed: boolean } {
  const inputChanges = compareReachInputs(before, after, renames);
  const capacityChange = compareQuantity(COMPARED_CAPACITY, before.bankfullCapacity_m3s, after.bankfullCapacity_m3s, thresholds, directionContextOf(after));
  const flows = compareFlows(before, after, renames.flows, thresholds);
  const checkChanges = compareChecks(findingsOfReach(beforeAnalysis, before), findingsOfReach(afterAnalysis, after), renames.flows);
  const moved = before.channel !== after.channel || before.name !== after.name;
  const changed =
    moved ||
    inputChanges.length > 0 ||
    capacityChange !== null ||
    flows.changed.length > 0 ||
    checkChanges.some((check) => check.change !== 'still-failing' || check.severityBefore !== check.severityAfter);
  return {
    changed,
    reach: {
      change: matchedAsRename && inputChanges.length === 0 ? 'renamed' : 'modified',
      channel: after.channel,
      reach: after.name,
      previous: moved ? { channel: before.channel, reach: before.name } : null,
      location: after.location,
      statusBefore: before.status,
      statusAfter: after.status,
      inputChanges,
      capacityChange,
      flows: flows.changed,
      unchangedFlowCount: flows.unchanged,
      checkChanges,
      results: flows.snapshots,
      note: null,
    },
  };
}

function addedReach(reach: ReachResult, analysis: DesignAnalysis | null, note: string | null): ReachComparison {
  return {
    change: 'added',
    channel: reach.channel,
    reach: reach.name,
    previous: null,
    location: reach.location,
    statusBefore: null,
    statusAfter: reach.status,
    inputChanges: [],
    capacityChange: null,
    flows: reach.flows.map(addedFlow),
    unchangedFlowCount: 0,
    checkChanges: compareChecks([], findingsOfReach(analysis, reach), NO_RENAMES.flows),
    results: reach.flows.map((flow) => ({ flow: flow.flow, before: null, after: snapshotOf(flow) })),
    note,
  };
}

/**
 * A reach of the old version that the new one lacks or cannot analyse. Its failing checks are not "newly passing"
 * (they are gone with it, or cannot be checked), so none are listed.
 */
function removedReach(reach: ReachResult, change: 'removed' | 'not-analysed', note: string | null): ReachComparison {
  return {
    change,
    channel: reach.channel,
    reach: reach.name,
    previous: null,
    location: reach.location,
    statusBefore: reach.status,
    statusAfter: null,
    inputChanges: [],
    capacityChange: null,
    flows: reach.flows.map(removedFlow),
    unchangedFlowCount: 0,
    checkChanges: [],
    results: reach.flows.map((flow) => ({ flow: flow.flow, before: snapshotOf(flow), after: null })),
    note,
  };
}

// ---------------------------------------------------------------------------------------------------------------
// Checks: findings keyed by code and flow.

const SEVERITY_RANK: Readonly<Record<Severity, number>> = { information: 1, warning: 2, error: 3 };

function isFailing(severity: Severity | null): boolean {
  return severity === 'error' || severity === 'warning';
}

function findingsOfReach(analysis: DesignAnalysis | null, reach: ReachResult): Finding[] {
  if (analysis === null) return [];
  return analysis.findings.filter((finding) => finding.channel === reach.channel && finding.reach === reach.name);
}

function designLevelFindings(analysis: DesignAnalysis | null): Finding[] {
  return analysis === null ? [] : analysis.findings.filter((finding) => finding.reach === null);
}

/** The worst finding per check (code, channel and flow, old flow names mapped to new ones). */
function worstByCheck(findings: readonly Finding[], flowRenames: ReadonlyMap<string, string>): Map<string, Finding> {
  const byKey = new Map<string, Finding>();
  for (const finding of findings) {
    const flow = finding.flow === null ? null : (flowRenames.get(finding.flow) ?? finding.flow);
    const key = JSON.stringify([finding.code, finding.reach === null ? finding.channel : null, flow]);
    const current = byKey.get(key);
    if (current === undefined || SEVERITY_RANK[finding.severity] > SEVERITY_RANK[current.severity]) byKey.set(key, { ...finding, flow });
  }
  return byKey;
}

function compareChecks(before: readonly Finding[], after: readonly Finding[], flowRenames: ReadonlyMap<string, string>): CheckChange[] {
  const worstBefore = worstByCheck(before, flowRenames);
  const worstAfter = worstByCheck(after, new Map());
  const changes: CheckChange[] = [];
  for (const key of new Set([...worstAfter.keys(), ...worstBefore.keys()])) {
    const old = worstBefore.get(key);
    const current = worstAfter.get(key);
    const shown = current ?? old;
    if (shown === undefined) continue;
    const severityBefore = old?.severity ?? null;
    const severityAfter = current?.severity ?? null;
    const change = checkChangeKind(severityBefore, severityAfter);
    if (change === null) continue;
    changes.push({ change, code: shown.code, flow: shown.flow, severityBefore, severityAfter, message: shown.message, location: shown.location });
  }
  return changes;
}

function checkChangeKind(before: Severity | null, after: Severity | null): CheckChange['change'] | null {
  if (isFailing(after)) return isFailing(before) ? 'still-failing' : 'newly-failing';
  if (isFailing(before)) return 'newly-passing';
  if (after !== null && before === null) return 'new-notice';
  if (before !== null && after === null) return 'cleared-notice';
  return null;
}

// ---------------------------------------------------------------------------------------------------------------
// Counts and verdict.

const ZERO_COUNTS: ComparisonCounts = {
  newlyFailing: 0,
  newErrors: 0,
  newlyPassing: 0,
  stillFailing: 0,
  resultsWorse: 0,
  resultsBetter: 0,
  errorsAfter: 0,
  warningsAfter: 0,
  reachesChanged: 0,
  reachesUnchanged: 0,
};

function sumCounts(all: readonly ComparisonCounts[]): ComparisonCounts {
  const total: { -readonly [K in keyof ComparisonCounts]: number } = { ...ZERO_COUNTS };
  for (const counts of all) {
    for (const key of Object.keys(total) as (keyof ComparisonCounts)[]) total[key] += counts[key];
  }
  return total;
}

function verdictOf(counts: ComparisonCounts, anythingChanged: boolean): Verdict {
  const worse = counts.newlyFailing + counts.resultsWorse + counts.newErrors > 0;
  const better = counts.newlyPassing + counts.resultsBetter > 0;
  if (worse && better) return 'mixed';
  if (worse) return 'worse';
  if (better) return 'better';
  return anythingChanged ? 'changed' : 'unchanged';
}
