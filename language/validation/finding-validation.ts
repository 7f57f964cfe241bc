/**
 * The analysis findings (over-topping, supercritical flow, lining limits, ...) as diagnostics at the reach they
 * concern, so the editor, `runnel check` and CI all show one list. The analysis is the cached one for this
 * document version (language/analysis/analyze-design.ts): hints, hover and the report read the same result.
 *
 * `no-normal-depth` is not repeated here: validation already reports the slope that causes it, once, at the slope.
 */
import { AstUtils, type DiagnosticInfo, type ValidationAcceptor, type ValidationChecks, type ValidationSeverity } from 'langium';
import type { RunnelAstType, RunnelFile } from '../generated/ast.js';
import { analyzeDocument } from '../analysis/analyze-design.js';
import type { CriteriaDefaults, CriteriaDefaultsSource } from '../analysis/criteria-settings.js';
import { FINDING_CODES } from '../analysis/finding-messages.js';
import type { Finding, Severity } from '../analysis/model.js';

const SEVERITY: Readonly<Record<Severity, ValidationSeverity>> = { error: 'error', warning: 'warning', information: 'info' };

/** Findings whose cause validation reports by itself. */
const REPORTED_BY_VALIDATION: ReadonlySet<string> = new Set([FINDING_CODES.noNormalDepth]);

export function designShouldPassItsChecks(file: RunnelFile, accept: ValidationAcceptor, criteriaDefaults: CriteriaDefaults): void {
  const analysis = analyzeDocument(AstUtils.getDocument(file), criteriaDefaults);
  for (const finding of analysis.findings) {
    if (REPORTED_BY_VALIDATION.has(finding.code)) continue;
    accept(SEVERITY[finding.severity], finding.message, { node: file, ...diagnosticPartsOf(finding) });
  }
}

type DiagnosticParts = Pick<DiagnosticInfo<RunnelFile>, 'range' | 'code' | 'data' | 'relatedInformation'>;

/**
 * What a finding's diagnostic carries besides its message and severity, made once per finding: an edit keeps the
 * results of the channels it did not touch (analysis/channel-memo.ts), and with them their findings and these.
 */
const diagnosticParts = new WeakMap<Finding, DiagnosticParts>();

function diagnosticPartsOf(finding: Finding): DiagnosticParts {
  let parts = diagnosticParts.get(finding);
  if (parts === undefined) {
    parts = {
      range: finding.location.range,
      code: finding.code,
      data: { code: finding.code, source: 'analysis', channel: finding.channel, reach: finding.reach, flow: finding.flow, ...finding.data },
      relatedInformation: finding.related.map((related) => ({ message: related.message, location: { uri: related.location.uri, range: related.location.range } })),
    };
    diagnosticParts.set(finding, parts);
  }
  return parts;
}

/** The checks, judged with the criteria defaults in force when each document is validated. */
export function createFindingChecks(criteriaDefaults: CriteriaDefaultsSource): ValidationChecks<RunnelAstType> {
  return {
    RunnelFile: (file, accept) => designShouldPassItsChecks(file, accept, criteriaDefaults.forDocument(AstUtils.getDocument(file).uri.toString())),
  };
}
