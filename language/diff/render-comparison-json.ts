/**
 * The comparison as one JSON document (`runnel diff --format json`): the comparison model as it is, SI numbers
 * with the unit in each key, plus the exit policy's outcome so a CI script need not recompute it.
 */
import type { ComparisonReport } from './comparison-model.js';
import { failureReason, type FailPolicy } from './fail-policy.js';

export interface ComparisonJsonDocument extends ComparisonReport {
  readonly policy: { readonly failOn: FailPolicy; readonly fails: boolean; readonly reason: string | null };
}

export function comparisonJsonDocument(report: ComparisonReport, failOn: FailPolicy): ComparisonJsonDocument {
  const reason = failureReason(report, failOn);
  return { ...report, policy: { failOn, fails: reason !== null, reason } };
}

export function renderComparisonJson(report: ComparisonReport, failOn: FailPolicy): string {
  return `${JSON.stringify(comparisonJsonDocument(report, failOn), null, 2)}\n`;
}
