/** The analysis: document in, DesignAnalysis out. See model.ts for the contract and analyze-design.ts for the method. */
export * from './model.js';
export { analyzeDocument, forgetAnalysis, displayUnitsOf, statusOf } from './analyze-design.js';
export { CAUTION, DESIGN_ASSUMPTIONS, DESIGN_PROVENANCE, REACH_PROVENANCE, REFERENCES } from './provenance.js';
export { FINDING_CODES, FINDING_MESSAGES, type FindingCode } from './finding-messages.js';
export * from './criteria-defaults.js';
export {
  CRITERION_SETTINGS,
  CriteriaDefaultsSource,
  NO_CRITERIA_DEFAULTS,
  criteriaDefaultsKey,
  readCriteriaSettings,
  readCriterionSetting,
  type CriteriaDefaults,
  type CriteriaSettingTexts,
  type CriterionSetting,
  type CriterionSettingName,
} from './criteria-settings.js';
export { formatNumber, formatQuantity, formatInUnit, formatRatio, formatPercent } from './format-quantity.js';
