/** Helpers for analysis tests: analyse a design text, pick out a reach and a flow. */
import { expect } from 'vitest';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import type { DesignAnalysis, FlowResult, ReachResult } from '../../language/analysis/model.js';
import { buildText } from '../language/language-test-kit.js';
import { NO_CRITERIA_DEFAULTS, type CriteriaDefaults } from '../../language/analysis/criteria-settings.js';

export const FOOT_M = 0.3048;
export const CFS_M3S = FOOT_M ** 3;
/** 1 lbf/ft2 in Pa: 0.45359237 kg x 9.80665 m/s2 / 0.3048^2 m2 (exact definitions, NIST SP 811 App. B; derived). */
export const PSF_PA = (0.45359237 * 9.80665) / FOOT_M ** 2;

/** The analysis of a design text; `criteriaDefaults` stand for editor settings or command-line options. */
export async function analyse(text: string, otherFiles: Readonly<Record<string, string>> = {}, criteriaDefaults: CriteriaDefaults = NO_CRITERIA_DEFAULTS): Promise<DesignAnalysis> {
  return analyzeDocument(await buildText(text, otherFiles), criteriaDefaults);
}

export function reachOf(analysis: DesignAnalysis, channel: string, reach: string): ReachResult {
  const found = analysis.channels.find((candidate) => candidate.name === channel)?.reaches.find((candidate) => candidate.name === reach);
  expect(found, `reach ${channel}/${reach}; incomplete: ${JSON.stringify(analysis.incompleteReaches)}`).toBeDefined();
  return found as ReachResult;
}

export function flowOf(reach: ReachResult, flow: string): FlowResult {
  const found = reach.flows.find((candidate) => candidate.flow === flow);
  expect(found, `flow ${flow} in reach ${reach.name}`).toBeDefined();
  return found as FlowResult;
}

/** Asserts |actual - expected| <= tolerance, printing all three on failure. */
export function expectClose(actual: number | null | undefined, expected: number, tolerance: number, what: string): void {
  expect(actual, what).not.toBeNull();
  expect(actual, what).toBeDefined();
  const difference = Math.abs((actual as number) - expected);
  expect(difference, `${what}: got ${actual}, expected ${expected} +/- ${tolerance}`).toBeLessThanOrEqual(tolerance);
}

export function codesOf(flow: FlowResult): string[] {
  return flow.findings.map((finding) => finding.code);
}
