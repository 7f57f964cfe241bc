/**
 * The comparison model: what a change to a design did, reach by reach and flow by flow. `runnel diff` prints it
 * as a pull-request comment (Markdown) or as JSON, and the editor's "compare with the last commit" shows the same
 * Markdown. Numbers are SI; the unit is part of each quantity key (`freeboard_m`), as in the analysis model.
 * Pure data: built by compare-designs.ts, rendered by render-comparison-markdown.ts and render-comparison-json.ts.
 */
import type { CheckStatus, Severity, SourceLocation } from '../analysis/model.js';
import type { UnitSystem } from '../units/units.js';
import type { SignificanceThresholds } from './thresholds.js';

/** Version of the JSON document `runnel diff --format json` writes; raised on any incompatible change. */
export const COMPARISON_SCHEMA_VERSION = 1;

/**
 * How a quantity is measured, which picks its display unit and format: a dimension of the unit table, a side
 * slope written H:V, a ratio shown to two decimals (Froude number), a fraction shown as a percentage, a plain
 * number (Manning's n) or text (a name, a shape, a rule).
 */
export type QuantityKind =
  | 'length'
  | 'area'
  | 'discharge'
  | 'velocity'
  | 'slope'
  | 'shear'
  | 'side-slope'
  | 'ratio'
  | 'fraction'
  | 'number'
  | 'text';

/** Whether a change moves a result toward trouble, away from it, or neither. */
export type ChangeDirection = 'worse' | 'better' | 'neutral';

/** One input that differs between the two versions (a dimension, a slope, a lining limit, a criterion, a name). */
export interface InputChange {
  /** Stable path of the input, SI unit in the last segment, e.g. `section.dimensions.bottomWidth_m`, `slope`. */
  readonly field: string;
  /** Plain words, e.g. "section wide: bottom width". */
  readonly label: string;
  readonly kind: QuantityKind;
  /** SI number, text, or null when the input is absent in that version. */
  readonly before: number | string | null;
  readonly after: number | string | null;
}

/** One computed result compared between the versions. Only significant changes are recorded. */
export interface ResultChange {
  /** The result's key with its SI unit, as in the analysis model: `normalDepth_m`, `velocity_mps`, `froudeNumber`. */
  readonly quantity: string;
  /** Plain words, e.g. "freeboard". */
  readonly label: string;
  readonly kind: QuantityKind;
  readonly before: number | null;
  readonly after: number | null;
  /** after - before, SI; null when either side has no value. */
  readonly difference: number | null;
  /** (after - before) / |before|; null when either side has no value or before is zero. */
  readonly relativeDifference: number | null;
  readonly direction: ChangeDirection;
}

/**
 * How one check (a finding code at one flow of one reach) changed:
 * - `newly-failing`: an error or warning that the old version did not have;
 * - `newly-passing`: an error or warning of the old version that is gone;
 * - `still-failing`: an error or warning in both versions (`severityBefore` may differ from `severityAfter`);
 * - `new-notice` / `cleared-notice`: the same for information findings, which never fail a check.
 */
export type CheckChangeKind = 'newly-failing' | 'newly-passing' | 'still-failing' | 'new-notice' | 'cleared-notice';

export interface CheckChange {
  readonly change: CheckChangeKind;
  /** The finding's stable code, e.g. `freeboard-below-required`. */
  readonly code: string;
  /** The flow it concerns (its name in the new version when it exists there), or null for the whole reach. */
  readonly flow: string | null;
  readonly severityBefore: Severity | null;
  readonly severityAfter: Severity | null;
  /** The new version's message when the finding exists there, otherwise the old one's. */
  readonly message: string;
  /** Where it is: in the new version when it exists there, otherwise in the old one. */
  readonly location: SourceLocation;
}

export type ItemChange = 'added' | 'removed' | 'modified' | 'renamed';

/** One design flow in one reach. */
export interface FlowComparison {
  readonly change: ItemChange;
  /** Its name in the new version (the old one for a removed flow). */
  readonly flow: string;
  /** Its old name when it was renamed, otherwise null. */
  readonly previousFlow: string | null;
  readonly dischargeBefore_m3s: number | null;
  readonly dischargeAfter_m3s: number | null;
  readonly statusBefore: CheckStatus | null;
  readonly statusAfter: CheckStatus | null;
  /** Significant result changes (empty for an added or removed flow). */
  readonly resultChanges: readonly ResultChange[];
}

/** Before -> after values of one flow, for the details of a changed reach; null where a version lacks it. */
export interface FlowResultsSnapshot {
  readonly flow: string;
  readonly before: Readonly<Record<string, number | null>> | null;
  readonly after: Readonly<Record<string, number | null>> | null;
}

/**
 * What happened to a reach: `renamed` when it moved unchanged to a new name or channel, `modified` otherwise when
 * matched; `not-analysed` when the new version still has it but cannot analyse it (the file is incomplete there).
 */
export type ReachChange = ItemChange | 'not-analysed';

export interface ReachComparison {
  readonly change: ReachChange;
  /** Channel and reach names in the new version (the old ones for a removed reach). */
  readonly channel: string;
  readonly reach: string;
  /** Old channel and reach names when they differ from the new ones. */
  readonly previous: { readonly channel: string; readonly reach: string } | null;
  /** The reach in the new version, or in the old one for a removed reach. */
  readonly location: SourceLocation;
  readonly statusBefore: CheckStatus | null;
  readonly statusAfter: CheckStatus | null;
  readonly inputChanges: readonly InputChange[];
  /** Bank-full or full-pipe capacity, when it changed significantly. */
  readonly capacityChange: ResultChange | null;
  /** Flows that changed (inputs, results or presence). */
  readonly flows: readonly FlowComparison[];
  /** Flows present in both versions with no significant change. */
  readonly unchangedFlowCount: number;
  readonly checkChanges: readonly CheckChange[];
  /** Every flow's main results before and after, for the collapsed details. */
  readonly results: readonly FlowResultsSnapshot[];
  /** Why a version could not analyse the reach (see `not-analysed`), or null. */
  readonly note: string | null;
}

/**
 * A section, lining or design flow whose definition changed, appeared, disappeared or was renamed, or the
 * design-wide criteria (kind `criteria`, name `design`) when they changed.
 */
export interface DefinitionChange {
  readonly kind: 'section' | 'lining' | 'flow' | 'criteria';
  readonly change: ItemChange;
  /** Its name in the new version (the old one when removed). */
  readonly name: string;
  readonly previousName: string | null;
  readonly inputChanges: readonly InputChange[];
}

/** A parse or validation problem of one version (not an analysis finding), for the policy and the verdict. */
export interface DesignProblem {
  readonly severity: Severity;
  readonly code: string;
  readonly message: string;
  /** 1-based line of the problem in that version. */
  readonly line: number;
}

export type FileChange = 'added' | 'removed' | 'modified' | 'renamed' | 'unchanged';

/** Counts that decide the verdict and the exit status. */
export interface ComparisonCounts {
  readonly newlyFailing: number;
  /** Newly failing checks of severity error, checks raised to error, and new parse or validation errors. */
  readonly newErrors: number;
  readonly newlyPassing: number;
  readonly stillFailing: number;
  /** Significant result changes toward trouble / away from it. */
  readonly resultsWorse: number;
  readonly resultsBetter: number;
  /** Errors and warnings of the new version (findings and problems), changed or not. */
  readonly errorsAfter: number;
  readonly warningsAfter: number;
  readonly reachesChanged: number;
  readonly reachesUnchanged: number;
}

export interface DesignComparison {
  /** Workspace-relative path of the design in the new version (the old one when removed). */
  readonly path: string;
  /** Its old path when the file was renamed, otherwise null. */
  readonly previousPath: string | null;
  readonly fileChange: FileChange;
  readonly title: string;
  readonly displayUnits: UnitSystem;
  readonly definitions: readonly DefinitionChange[];
  /** Changed reaches only; unchanged ones are counted in `counts.reachesUnchanged`. */
  readonly reaches: readonly ReachComparison[];
  /** Findings that belong to no reach, compared the same way as a reach's checks. */
  readonly designCheckChanges: readonly CheckChange[];
  /** Parse and validation problems that the new version has and the old one did not. */
  readonly newProblems: readonly DesignProblem[];
  /** Parse and validation problems of the old version that are gone. */
  readonly resolvedProblems: readonly DesignProblem[];
  /** True when a version could not be analysed (syntax errors), so the comparison is partial. */
  readonly incomplete: boolean;
  readonly counts: ComparisonCounts;
}

export type Verdict = 'worse' | 'better' | 'mixed' | 'changed' | 'unchanged';

/** Everything `runnel diff` reports: one comparison per design file. */
export interface ComparisonReport {
  readonly schemaVersion: number;
  /** What the old and new versions are, e.g. "main" and "working tree", or two file names. */
  readonly beforeLabel: string;
  readonly afterLabel: string;
  readonly verdict: Verdict;
  /** Designs with any change, in path order. */
  readonly designs: readonly DesignComparison[];
  /** Designs compared and found unchanged (counted, not listed). */
  readonly unchangedDesignCount: number;
  readonly counts: ComparisonCounts;
  readonly thresholds: SignificanceThresholds;
  /** The caution every output carries (from the analysis). */
  readonly caution: string;
}
