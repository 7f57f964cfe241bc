/**
 * The rating curve of one reach: discharge against normal depth in uniform flow (Manning's equation), and the
 * critical depth of each discharge (Q^2 T = g A^3, i.e. Q = sqrt(g A^3 / T)), both from the engine's section
 * geometry, with each design flow marked at its discharge. Depth is plotted upwards, discharge to the right. A
 * conduit's curve runs to the crown and shows its capacity peak below it.
 */
import { GRAVITY_MS2, manningDischargeM3s, type SectionGeometry } from '../hydraulics/index.js';
import type { ReachResult } from '../analysis/model.js';
import type { UnitSystem } from '../units/units.js';
import { escapeHtml, truncateLabel } from './escape.js';
import { flowColourClass } from './flow-colours.js';
import { displayUnit, displayValue, formatQuantity } from './format.js';
import { DRAWING_WORDS } from './report-wording.js';
import { sectionGeometryFromResult } from './section-from-result.js';
import { linearScale, niceCeiling, niceTicks, openSvg, pathThrough, px, renderAxes, renderNotDrawnSvg, type DrawingOptions, type PlotArea } from './svg-scale.js';

export type RatingCurveOptions = DrawingOptions;

const DRAWING_WIDTH = 720;
const PLOT: PlotArea = { left: 72, top: 16, width: DRAWING_WIDTH - 72 - 26, height: 250 };
const LEGEND_TOP_GAP = 56;
const LEGEND_ROW_HEIGHT = 17;
const LEGEND_COLUMN_WIDTH = 311;
/** Depths sampled along each curve; enough for a smooth line at report scale. */
const CURVE_SAMPLES = 120;
/** Room above the largest design value, as a fraction. */
const HEADROOM = 1.1;

interface CurvePoint {
  readonly dischargeM3s: number;
  readonly depthM: number;
}

/** The rating-curve drawing of a reach as an SVG fragment; see the module comment. */
export function renderRatingCurveSvg(reach: ReachResult, system: UnitSystem, options: RatingCurveOptions): string {
  const title = `Rating curve of reach ${reach.name}`;
  const rebuilt = sectionGeometryFromResult(reach.section);
  if (!rebuilt.ok) return renderNotDrawnSvg({ id: options.id, kind: 'rating-curve', title, reason: rebuilt.reason });
  const geometry = rebuilt.geometry;
  const isConduit = geometry.fullDepthM !== undefined;
  const bankM = isConduit ? geometry.fullDepthM : positiveOrUndefined(reach.section.bankDepth_m);
  const manningN = reach.lining.manningN;
  const hasUniformFlow = reach.slope > 0 && Number.isFinite(reach.slope) && manningN > 0 && Number.isFinite(manningN);

  const designDepthsM = reach.flows.flatMap((flow) => [flow.normal?.depth_m, flow.critical?.depth_m]).filter(isPositiveFinite);
  const designDischarges = reach.flows.map((flow) => flow.discharge_m3s).filter(isPositiveFinite);
  const toDisplayLength = (metres: number): number => displayValue(metres, 'length', system);
  const toDisplayDischarge = (m3s: number): number => displayValue(m3s, 'discharge', system);

  // Depth axis: to the crown of a conduit; for an open channel past the bank and every design depth.
  const highestM = isConduit ? (geometry.fullDepthM ?? 0) : Math.max(bankM ?? 0, ...designDepthsM.map((depth) => depth * HEADROOM));
  if (!(highestM > 0) || !Number.isFinite(highestM)) {
    return renderNotDrawnSvg({ id: options.id, kind: 'rating-curve', title, reason: 'there is no depth to plot (no bank height and no design depth)' });
  }
  // The top of the depth axis: the next round value, on a finer step than the ticks so little height is wasted.
  const depthAxisTop = niceCeiling(toDisplayLength(highestM) * (isConduit ? 1.02 : 1), 10);
  const curveTopM = isConduit ? highestM : depthAxisTop / toDisplayLength(1);

  const normalCurve = hasUniformFlow ? sampleCurve(curveTopM, (depthM) => manningDischargeM3s(geometry, depthM, manningN, reach.slope)) : [];
  const criticalTopM = isConduit ? curveTopM * (1 - 1e-3) : curveTopM;
  const criticalCurve = sampleCurve(criticalTopM, (depthM) => criticalDischargeM3s(geometry, depthM));

  const largestDischargeM3s = Math.max(
    ...normalCurve.map((point) => point.dischargeM3s),
    ...designDischarges.map((discharge) => discharge * HEADROOM),
    ...(normalCurve.length === 0 ? criticalCurve.map((point) => point.dischargeM3s) : []),
    0,
  );
  if (!(largestDischargeM3s > 0) || !Number.isFinite(largestDischargeM3s)) {
    return renderNotDrawnSvg({ id: options.id, kind: 'rating-curve', title, reason: 'there is no discharge to plot' });
  }
  const dischargeAxisTop = niceCeiling(toDisplayDischarge(largestDischargeM3s), 6);
  const xScale = linearScale(0, dischargeAxisTop, PLOT.left, PLOT.left + PLOT.width);
  const yScale = linearScale(0, depthAxisTop, PLOT.top + PLOT.height, PLOT.top);
  const X = (m3s: number): number => xScale.map(toDisplayDischarge(m3s));
  const Y = (metres: number): number => yScale.map(toDisplayLength(metres));
  const curvePath = (curve: readonly CurvePoint[]): string =>
    pathThrough(clipToDischarge(curve, dischargeAxisTop / toDisplayDischarge(1)).map((point) => ({ x: X(point.dischargeM3s), y: Y(point.depthM) })), false);

  const xTicks = niceTicks(0, dischargeAxisTop, 6);
  const yTicks = niceTicks(0, depthAxisTop, 5);
  const parts: string[] = [];
  parts.push(
    renderAxes(
      PLOT,
      { scale: xScale, ticks: xTicks.values, step: xTicks.step, label: `${DRAWING_WORDS.dischargeAxis} (${displayUnit('discharge', system)})` },
      { scale: yScale, ticks: yTicks.values, step: yTicks.step, label: `${DRAWING_WORDS.depthAxis} (${displayUnit('length', system)})` },
    ),
  );
  if (bankM !== undefined) {
    parts.push(
      `<line class="bank-top" data-role="bank-top" data-kind="${isConduit ? 'crown' : 'bank'}" data-depth-m="${bankM}" x1="${px(PLOT.left)}" y1="${px(Y(bankM))}" x2="${px(PLOT.left + PLOT.width)}" y2="${px(Y(bankM))}"/>`,
    );
    parts.push(
      `<text class="fig-note" x="${px(PLOT.left + PLOT.width - 6)}" y="${px(Y(bankM) - 5)}" text-anchor="end">${escapeHtml(isConduit ? DRAWING_WORDS.crown : DRAWING_WORDS.bankTop)}</text>`,
    );
  }
  if (criticalCurve.length > 1) parts.push(`<path class="curve critical-curve" data-role="critical-depth-curve" d="${curvePath(criticalCurve)}"/>`);
  if (normalCurve.length > 1) parts.push(`<path class="curve normal-curve" data-role="normal-depth-curve" d="${curvePath(normalCurve)}"/>`);
  if (!hasUniformFlow) {
    parts.push(`<text class="fig-note" data-role="no-uniform-flow" x="${px(PLOT.left + 12)}" y="${px(PLOT.top + 18)}">${escapeHtml(DRAWING_WORDS.noUniformFlow)}</text>`);
  }

  // Design flows: a guide at each discharge, a filled dot at normal depth, an open diamond at critical depth.
  const legendRows: string[] = [];
  reach.flows.forEach((flow, index) => {
    if (!isPositiveFinite(flow.discharge_m3s)) return;
    const colourClass = flowColourClass(flow.flow, options.flowOrder, index);
    const x = X(flow.discharge_m3s);
    const normalDepthM = flow.normal?.depth_m;
    const criticalDepthM = flow.critical?.depth_m;
    const markedDepths = [normalDepthM, criticalDepthM].filter(isPositiveFinite);
    const guideTop = markedDepths.length > 0 ? Y(Math.max(...markedDepths)) : PLOT.top;
    parts.push(`<line class="design-guide ${colourClass}" data-role="design-flow-guide" data-flow="${escapeHtml(flow.flow)}" x1="${px(x)}" y1="${px(PLOT.top + PLOT.height)}" x2="${px(x)}" y2="${px(guideTop)}"/>`);
    if (isPositiveFinite(criticalDepthM)) {
      const y = Y(criticalDepthM);
      parts.push(
        `<path class="critical-point ${colourClass}" data-role="critical-point" data-flow="${escapeHtml(flow.flow)}" data-discharge-m3s="${flow.discharge_m3s}" data-depth-m="${criticalDepthM}" ` +
          `data-cx="${px(x)}" data-cy="${px(y)}" d="M${px(x)} ${px(y - 5)} L${px(x + 5)} ${px(y)} L${px(x)} ${px(y + 5)} L${px(x - 5)} ${px(y)} Z"/>`,
      );
    }
    if (isPositiveFinite(normalDepthM)) {
      parts.push(
        `<circle class="design-point ${colourClass}" data-role="design-point" data-flow="${escapeHtml(flow.flow)}" data-discharge-m3s="${flow.discharge_m3s}" data-depth-m="${normalDepthM}" ` +
          `cx="${px(x)}" cy="${px(Y(normalDepthM))}" r="4.5"/>`,
      );
    }
    parts.push(
      `<text class="fig-label ${colourClass}" data-role="design-flow-label" data-flow="${escapeHtml(flow.flow)}" x="${px(x + 6)}" y="${px(guideTop - 8)}">${escapeHtml(truncateLabel(flow.flow, 14))}</text>`,
    );
    const normalText = isPositiveFinite(normalDepthM) ? `normal ${formatQuantity(normalDepthM, 'length', system)}` : DRAWING_WORDS.noNormalDepth;
    const criticalText = isPositiveFinite(criticalDepthM) ? `critical ${formatQuantity(criticalDepthM, 'length', system)}` : '';
    legendRows.push(
      `<g class="${colourClass}"><circle class="design-point" cx="6" cy="-4" r="4"/><text class="fig-label" x="16" y="0">` +
        `${escapeHtml(`${truncateLabel(flow.flow, 14)}: ${formatQuantity(flow.discharge_m3s, 'discharge', system)}, ${normalText}${criticalText ? `, ${criticalText}` : ''}`)}</text></g>`,
    );
  });

  const keyRows = [
    ...(normalCurve.length > 1 ? [`<line class="curve normal-curve" x1="0" y1="-4" x2="22" y2="-4"/><text class="fig-label" x="30" y="0">${escapeHtml(DRAWING_WORDS.normalDepthCurve)}</text>`] : []),
    `<line class="curve critical-curve" x1="0" y1="-4" x2="22" y2="-4"/><text class="fig-label" x="30" y="0">${escapeHtml(DRAWING_WORDS.criticalDepthCurve)}</text>`,
  ];
  const legendTop = PLOT.top + PLOT.height + LEGEND_TOP_GAP;
  const rowCount = Math.max(keyRows.length, legendRows.length);
  keyRows.forEach((row, index) => {
    parts.push(`<g class="legend-row" transform="translate(${PLOT.left} ${legendTop + index * LEGEND_ROW_HEIGHT})">${row}</g>`);
  });
  legendRows.forEach((row, index) => {
    parts.push(`<g class="legend-row" data-role="legend-flow" transform="translate(${PLOT.left + LEGEND_COLUMN_WIDTH - 120} ${legendTop + index * LEGEND_ROW_HEIGHT})">${row}</g>`);
  });
  const height = legendTop + rowCount * LEGEND_ROW_HEIGHT;
  return (
    openSvg({ id: options.id, kind: 'rating-curve', width: DRAWING_WIDTH, height, title }) + parts.join('') + '</svg>'
  );
}

/**
 * The discharge whose critical depth is `depthM`, m3/s: from Q^2 T = g A^3 (alpha = 1; Chow 1959, Sec. 4-2).
 * Zero where the section has no free surface.
 */
export function criticalDischargeM3s(geometry: SectionGeometry, depthM: number): number {
  const areaM2 = geometry.areaM2(depthM);
  const topWidthM = geometry.topWidthM(depthM);
  if (!(topWidthM > 0)) return 0;
  return Math.sqrt((GRAVITY_MS2 * areaM2 ** 3) / topWidthM);
}

function sampleCurve(topDepthM: number, discharge: (depthM: number) => number): CurvePoint[] {
  const points: CurvePoint[] = [{ dischargeM3s: 0, depthM: 0 }];
  for (let index = 1; index <= CURVE_SAMPLES; index++) {
    const depthM = (topDepthM * index) / CURVE_SAMPLES;
    const dischargeM3s = discharge(depthM);
    if (Number.isFinite(dischargeM3s) && dischargeM3s >= 0) points.push({ dischargeM3s, depthM });
  }
  return points;
}

/** Keeps a curve's points up to the right edge of the plot, ending exactly on it where the curve leaves. */
function clipToDischarge(curve: readonly CurvePoint[], maxDischargeM3s: number): CurvePoint[] {
  const kept: CurvePoint[] = [];
  for (const point of curve) {
    if (point.dischargeM3s <= maxDischargeM3s) {
      kept.push(point);
      continue;
    }
    const previous = kept[kept.length - 1];
    if (previous !== undefined) {
      const fraction = (maxDischargeM3s - previous.dischargeM3s) / (point.dischargeM3s - previous.dischargeM3s);
      kept.push({ dischargeM3s: maxDischargeM3s, depthM: previous.depthM + fraction * (point.depthM - previous.depthM) });
    }
    break;
  }
  return kept;
}

function isPositiveFinite(value: number | null | undefined): value is number {
  return value !== null && value !== undefined && Number.isFinite(value) && value > 0;
}

function positiveOrUndefined(value: number | null): number | undefined {
  return isPositiveFinite(value) ? value : undefined;
}
