/**
 * Runnel's report renderer: pure functions from the analysis model to HTML, SVG and Markdown strings. No editor
 * API, no file system, nothing random: the same analysis and options give the same text.
 */
export { renderReportHtml, MAX_DRAWN_REACHES, type ReportHtmlOptions } from './report-html.js';
export { renderReportMarkdown, renderResultsTableMarkdown, markdownTable, type ReportMarkdownOptions } from './report-markdown.js';
export { renderCrossSectionSvg, type CrossSectionOptions } from './cross-section-svg.js';
export { renderRatingCurveSvg, criticalDischargeM3s, type RatingCurveOptions } from './rating-curve-svg.js';
export { renderLongitudinalSvg, placeReaches, bedElevationAtM, type LongitudinalOptions, type ReachPlacement } from './longitudinal-svg.js';
export { drawnProfilesOf, type DrawnProfile, type DrawnProfilePoint, type DrawnJump } from './profile-overlay.js';
export { sectionGeometryFromResult, describeSection, SECTION_DIMENSION_KEYS, type SectionRebuild } from './section-from-result.js';
export { escapeHtml, escapeMarkdownInline } from './escape.js';
export { REPORT_STYLESHEET } from './report-styles.js';
