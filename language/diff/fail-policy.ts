/**
 * When `runnel diff` exits with status 1, so a CI job can block a change: the `--fail-on` policy.
 */
import type { ComparisonReport } from './comparison-model.js';

/** The policies, in the order help lists them; the first is the default. */
export const FAIL_POLICIES = ['new-errors', 'errors', 'warnings', 'never'] as const;
export type FailPolicy = (typeof FAIL_POLICIES)[number];
export const DEFAULT_FAIL_POLICY: FailPolicy = 'new-errors';

/** What each policy means, for `--help` and the Markdown footer. */
export const FAIL_POLICY_DESCRIPTIONS: Readonly<Record<FailPolicy, string>> = {
  'new-errors': 'fail when the change adds an error: a check newly failing as an error, a check raised to an error, or a new parse or validation error',
  errors: 'fail when the new version has any error, new or not',
  warnings: 'fail when the new version has any error or warning, new or not',
  never: 'never fail (report only)',
};

/** Whether the comparison fails under `policy`, and why in a few words (null when it passes). */
export function failureReason(report: ComparisonReport, policy: FailPolicy): string | null {
  const { newErrors, errorsAfter, warningsAfter } = report.counts;
  switch (policy) {
    case 'new-errors':
      return newErrors > 0 ? `${plural(newErrors, 'new error')} (--fail-on new-errors)` : null;
    case 'errors':
      return errorsAfter > 0 ? `${plural(errorsAfter, 'error')} in the new version (--fail-on errors)` : null;
    case 'warnings':
      return errorsAfter + warningsAfter > 0
        ? `${plural(errorsAfter, 'error')} and ${plural(warningsAfter, 'warning')} in the new version (--fail-on warnings)`
        : null;
    case 'never':
      return null;
  }
}

/** "1 check", "2 checks"; `pluralNoun` for irregular words ("reaches"). */
export function plural(count: number, noun: string, pluralNoun = `${noun}s`): string {
  return `${count} ${count === 1 ? noun : pluralNoun}`;
}
