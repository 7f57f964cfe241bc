/** What a change to a design did: comparison of two analyses and its Markdown and JSON renderings. Pure. */
export * from './comparison-model.js';
export { compareDesignVersions, compareDesignPair, type CompareOptions, type DesignPair, type DesignVersion } from './compare-designs.js';
export { DEFAULT_FAIL_POLICY, FAIL_POLICIES, FAIL_POLICY_DESCRIPTIONS, failureReason, type FailPolicy } from './fail-policy.js';
export { renderComparisonJson, comparisonJsonDocument, type ComparisonJsonDocument } from './render-comparison-json.js';
export { renderComparisonMarkdown, type MarkdownOptions } from './render-comparison-markdown.js';
export { renderSingleFileComparison, type SingleFileComparisonInput } from './single-file-comparison.js';
export { DEFAULT_SIGNIFICANCE_THRESHOLDS, type SignificanceThresholds } from './thresholds.js';
