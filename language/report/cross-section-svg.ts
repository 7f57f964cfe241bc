/**
 * The cross-section drawing of one reach, to scale: the section outline with its ground, the bank top (or the
 * conduit crown), the water surface of every design flow at its normal depth, the required freeboard limit, and
 * labels with each flow's depth and top width. Horizontal and vertical scales are equal unless the section is
 * too flat to read, in which case the vertical scale is exaggerated by a round factor that the drawing states.
 */
import type { ReachResult } from '../analysis/model.js';
import type { UnitSystem } from '../units/units.js';
import { escapeHtml, truncateLabel } from './escape.js';
import { flowColourClass } from './flow-colours.js';
import { displayUnit, displayValue, formatQuantity } from './format.js';
import { DRAWING_WORDS } from './report-wording.js';
import { sectionGeometryFromResult } from './section-from-result.js';
import { clipPolygonBelow, sectionBoundaryM, surfaceEdgesM, type PointM } from './section-outline.js';
import { linearScale, niceTicks, openSvg, pathThrough, px, renderAxes, renderNotDrawnSvg, spreadLabels, type DrawingOptions, type PlotArea } from './svg-scale.js';

export type CrossSectionOptions = DrawingOptions;

const DRAWING_WIDTH = 720;
const PLOT_LEFT = 70;
const PLOT_TOP = 22;
const LABEL_COLUMN_WIDTH = 196;
const AVAILABLE_PLOT_WIDTH = DRAWING_WIDTH - PLOT_LEFT - LABEL_COLUMN_WIDTH - 16;
const MIN_PLOT_HEIGHT = 100;
const MAX_PLOT_HEIGHT = 300;
const BOTTOM_MARGIN = 46;
/** Round vertical exaggeration factors tried, in order, for sections too flat to read at equal scales. */
const EXAGGERATION_STEPS = [1, 2, 5, 10, 20, 50, 100] as const;
const LABEL_LINE_HEIGHT = 13;

interface WaterLevel {
  readonly flowName: string;
  readonly description: string | null;
  readonly depthM: number;
  readonly colourClass: string;
}

/** The cross-section drawing of a reach as an SVG fragment; see the module comment. */
export function renderCrossSectionSvg(reach: ReachResult, system: UnitSystem, options: CrossSectionOptions): string {
  const title = `Cross-section of reach ${reach.name}`;
  const rebuilt = sectionGeometryFromResult(reach.section);
  if (!rebuilt.ok) return renderNotDrawnSvg({ id: options.id, kind: 'cross-section', title, reason: rebuilt.reason });
  const geometry = rebuilt.geometry;
  const section = reach.section;
  const isConduit = geometry.fullDepthM !== undefined;
  const bankM = isConduit ? geometry.fullDepthM : positiveOrUndefined(section.bankDepth_m);

  const waterLevels: WaterLevel[] = [];
  const withoutNormalDepth: string[] = [];
  reach.flows.forEach((flow, index) => {
    const depthM = flow.normal?.depth_m;
    if (depthM !== undefined && Number.isFinite(depthM) && depthM > 0) {
      waterLevels.push({ flowName: flow.flow, description: flow.description, depthM, colourClass: flowColourClass(flow.flow, options.flowOrder, index) });
    } else {
      withoutNormalDepth.push(flow.flow);
    }
  });
  const deepestM = Math.max(0, ...waterLevels.map((level) => level.depthM));

  const requiredFreeboards = reach.flows
    .map((flow) => ({ flow: flow.flow, requiredM: flow.requiredFreeboard_m }))
    .filter((entry): entry is { flow: string; requiredM: number } => entry.requiredM !== null && Number.isFinite(entry.requiredM) && entry.requiredM > 0);
  const governingFreeboard = requiredFreeboards.reduce<{ flow: string; requiredM: number } | undefined>(
    (largest, entry) => (largest === undefined || entry.requiredM > largest.requiredM ? entry : largest),
    undefined,
  );
  const freeboardLimitM =
    !isConduit && bankM !== undefined && governingFreeboard !== undefined && bankM - governingFreeboard.requiredM > 0 ? bankM - governingFreeboard.requiredM : undefined;

  // How high the drawing goes: the bank (or crown), and above it when a flow over-tops.
  let topM: number;
  if (isConduit) topM = geometry.fullDepthM ?? 0;
  else if (bankM !== undefined) topM = deepestM > bankM ? deepestM * 1.08 : bankM;
  else topM = deepestM > 0 ? deepestM * 1.3 : referenceDrawingDepthM(reach);
  if (!(topM > 0) || !Number.isFinite(topM)) {
    return renderNotDrawnSvg({ id: options.id, kind: 'cross-section', title, reason: 'the section has no drawable height' });
  }
  const outlineTopM = isConduit ? topM : (bankM ?? topM);
  const fullBoundary = sectionBoundaryM(section, geometry, topM);
  const drawnBoundary = sectionBoundaryM(section, geometry, Math.min(outlineTopM, topM));
  const edgesAtTop = isConduit ? { leftM: -topM / 2, rightM: topM / 2 } : surfaceEdgesM(section, geometry, topM);
  const widthAtTopM = edgesAtTop.rightM - edgesAtTop.leftM;
  const shoulderM = isConduit ? 0.15 * topM : Math.max(0.1 * widthAtTopM, 0.25 * topM);
  const groundM = isConduit ? 0.08 * topM : 0.14 * topM;
  const xMinM = edgesAtTop.leftM - shoulderM;
  const xMaxM = edgesAtTop.rightM + shoulderM;
  const yMinM = -groundM;
  const headroomM = 0.04 * topM;

  // Scales, in display length units per px: equal unless the section is too flat to read.
  const toDisplay = (metres: number): number => displayValue(metres, 'length', system);
  const spanX = toDisplay(xMaxM - xMinM);
  const spanY = toDisplay(topM + headroomM - yMinM);
  let pxPerUnitX = AVAILABLE_PLOT_WIDTH / spanX;
  let exaggeration: number = EXAGGERATION_STEPS[0];
  for (const step of EXAGGERATION_STEPS) {
    exaggeration = step;
    if (spanY * pxPerUnitX * step >= MIN_PLOT_HEIGHT) break;
  }
  if (spanY * pxPerUnitX * exaggeration > MAX_PLOT_HEIGHT) pxPerUnitX = MAX_PLOT_HEIGHT / (spanY * exaggeration);
  const pxPerUnitY = pxPerUnitX * exaggeration;
  const plot: PlotArea = { left: PLOT_LEFT, top: PLOT_TOP, width: spanX * pxPerUnitX, height: spanY * pxPerUnitY };
  const xScale = linearScale(toDisplay(xMinM), toDisplay(xMaxM), plot.left, plot.left + plot.width);
  const yScale = linearScale(toDisplay(yMinM), toDisplay(topM + headroomM), plot.top + plot.height, plot.top);
  const X = (metres: number): number => xScale.map(toDisplay(metres));
  const Y = (metres: number): number => yScale.map(toDisplay(metres));
  const toPx = (point: PointM): { x: number; y: number } => ({ x: X(point.x), y: Y(point.y) });

  const unit = displayUnit('length', system);
  const xTicks = niceTicks(toDisplay(xMinM), toDisplay(xMaxM), Math.max(2, Math.round(plot.width / 70)));
  const yTicks = niceTicks(0, toDisplay(topM), Math.max(2, Math.round(plot.height / 38)));

  // Labels in the column right of the section, each tied to a height by a leader line.
  interface Label {
    readonly targetY: number;
    readonly fromX: number;
    readonly lines: readonly (readonly LabelSpan[])[];
    readonly className: string;
  }
  const labels: Label[] = [];
  const parts: string[] = [];
  const hatchId = `${options.id}-hatch`;
  parts.push(
    `<defs><pattern id="${escapeHtml(hatchId)}" patternUnits="userSpaceOnUse" width="6" height="6" patternTransform="rotate(45)">` +
      `<line class="ground-hatch" x1="0" y1="0" x2="0" y2="6"/></pattern></defs>`,
  );
  parts.push(renderAxes(plot, { scale: xScale, ticks: xTicks.values, step: xTicks.step, label: `${DRAWING_WORDS.offsetAxis} (${unit})` }, {
    scale: yScale,
    ticks: yTicks.values,
    step: yTicks.step,
    label: `${DRAWING_WORDS.heightAxis} (${unit})`,
  }));

  // Water: the deepest flow's area is shaded; every flow's surface is a line.
  if (deepestM > 0) {
    const waterPolygon = clipPolygonBelow(fullBoundary.points, deepestM);
    parts.push(`<path class="water-fill" data-role="water-area" d="${pathThrough(waterPolygon.map(toPx), true)}"/>`);
  }

  // The section and its ground.
  if (isConduit) {
    const radiusM = topM / 2;
    parts.push(
      `<circle class="section-line conduit-wall" data-role="section-outline" data-shape="circle" cx="${px(X(0))}" cy="${px(Y(radiusM))}" r="${px(radiusM * toDisplay(1) * pxPerUnitX)}"` +
        `${exaggeration === 1 ? '' : ` transform="translate(${px(X(0))} ${px(Y(radiusM))}) scale(1 ${exaggeration}) translate(${px(-X(0))} ${px(-Y(radiusM))})"`}/>`,
    );
  } else {
    const outline = drawnBoundary.points;
    const first = outline[0];
    const last = outline[outline.length - 1];
    if (first !== undefined && last !== undefined) {
      const groundPolygon: PointM[] = [
        { x: xMinM, y: first.y },
        ...outline,
        { x: xMaxM, y: last.y },
        { x: xMaxM, y: yMinM },
        { x: xMinM, y: yMinM },
      ];
      parts.push(`<path class="ground" fill="url(#${escapeHtml(hatchId)})" data-role="ground" d="${pathThrough(groundPolygon.map(toPx), true)}"/>`);
      const surfaceLine = bankM !== undefined ? [{ x: xMinM, y: first.y }, ...outline, { x: xMaxM, y: last.y }] : outline;
      parts.push(`<path class="section-line" data-role="section-outline" data-shape="${section.shape}" d="${pathThrough(surfaceLine.map(toPx), false)}"/>`);
    }
    if (topM > outlineTopM) {
      // The prism extended above the bank, on which the engine solves an over-topping flow.
      const edgesAtDrawingTop = surfaceEdgesM(section, geometry, topM);
      const edgesAtBank = surfaceEdgesM(section, geometry, outlineTopM);
      parts.push(
        `<path class="section-extension" data-role="section-extension" d="M${px(X(edgesAtBank.leftM))} ${px(Y(outlineTopM))} L${px(X(edgesAtDrawingTop.leftM))} ${px(Y(topM))} ` +
          `M${px(X(edgesAtBank.rightM))} ${px(Y(outlineTopM))} L${px(X(edgesAtDrawingTop.rightM))} ${px(Y(topM))}"/>`,
      );
    }
  }

  // Bank top (or crown).
  if (bankM !== undefined) {
    const edges = isConduit ? { leftM: -topM / 2, rightM: topM / 2 } : surfaceEdgesM(section, geometry, bankM);
    const extensionM = isConduit ? 0.12 * topM : 0;
    parts.push(
      `<line class="bank-top" data-role="bank-top" data-kind="${isConduit ? 'crown' : 'bank'}" data-depth-m="${bankM}" ` +
        `x1="${px(X(edges.leftM - extensionM))}" y1="${px(Y(bankM))}" x2="${px(X(edges.rightM + extensionM))}" y2="${px(Y(bankM))}"/>`,
    );
    labels.push({
      targetY: Y(bankM),
      fromX: X(edges.rightM + extensionM),
      lines: [[{ text: `${isConduit ? DRAWING_WORDS.crown : DRAWING_WORDS.bankTop}: ${formatQuantity(bankM, 'length', system)}` }]],
      className: 'label-bank',
    });
  }

  // Required freeboard limit: the highest water surface the criterion allows.
  if (freeboardLimitM !== undefined && governingFreeboard !== undefined) {
    const edges = surfaceEdgesM(section, geometry, freeboardLimitM);
    parts.push(
      `<line class="freeboard-limit" data-role="freeboard-limit" data-depth-m="${freeboardLimitM}" data-required-m="${governingFreeboard.requiredM}" ` +
        `x1="${px(X(edges.leftM) - 10)}" y1="${px(Y(freeboardLimitM))}" x2="${px(X(edges.rightM) + 10)}" y2="${px(Y(freeboardLimitM))}"/>`,
    );
    labels.push({
      targetY: Y(freeboardLimitM),
      fromX: X(edges.rightM) + 10,
      lines: [
        [{ text: `${DRAWING_WORDS.freeboardLimit}:` }],
        [{ text: `${formatQuantity(governingFreeboard.requiredM, 'length', system)} below bank top`, role: 'freeboard-label', value: governingFreeboard.requiredM }],
      ],
      className: 'label-limit',
    });
  }

  // Water surfaces, deepest first so the shallower lines draw on top.
  const sortedLevels = [...waterLevels].sort((a, b) => b.depthM - a.depthM);
  for (const level of sortedLevels) {
    const edges = surfaceEdgesM(section, geometry, level.depthM);
    const topWidthM = edges.rightM - edges.leftM;
    const y = Y(level.depthM);
    parts.push(
      `<line class="water-line ${level.colourClass}" data-role="water-surface" data-flow="${escapeHtml(level.flowName)}" data-depth-m="${level.depthM}" ` +
        `data-top-width-m="${topWidthM}" x1="${px(X(edges.leftM))}" y1="${px(y)}" x2="${px(X(edges.rightM))}" y2="${px(y)}"/>`,
    );
    // The water-surface mark: a small downward triangle standing on the line.
    const markX = X(edges.leftM + 0.72 * topWidthM);
    parts.push(`<path class="water-mark ${level.colourClass}" d="M${px(markX - 5)} ${px(y - 8)} L${px(markX + 5)} ${px(y - 8)} L${px(markX)} ${px(y - 1)} Z"/>`);
    labels.push({
      targetY: y,
      fromX: X(edges.rightM),
      lines: [
        [{ text: `${truncateLabel(level.flowName, 18)}${level.description ? ` (${truncateLabel(level.description, 16)})` : ''}`, role: 'flow-label', flow: level.flowName }],
        [
          { text: `depth ${formatQuantity(level.depthM, 'length', system)}`, role: 'depth-label', flow: level.flowName, value: level.depthM },
          { text: ', ' },
          { text: `top width ${formatQuantity(topWidthM, 'length', system)}`, role: 'top-width-label', flow: level.flowName, value: topWidthM },
        ],
      ],
      className: `label-flow ${level.colourClass}`,
    });
  }

  // A depth dimension for the deepest flow, on the bed centre line.
  const deepest = sortedLevels[0];
  if (deepest !== undefined) {
    const x = X(0);
    parts.push(
      `<g class="dimension" data-role="depth-dimension" data-flow="${escapeHtml(deepest.flowName)}">` +
        `<line x1="${px(x)}" y1="${px(Y(0))}" x2="${px(x)}" y2="${px(Y(deepest.depthM))}"/>` +
        `<line x1="${px(x - 4)}" y1="${px(Y(0))}" x2="${px(x + 4)}" y2="${px(Y(0))}"/>` +
        `<line x1="${px(x - 4)}" y1="${px(Y(deepest.depthM))}" x2="${px(x + 4)}" y2="${px(Y(deepest.depthM))}"/></g>`,
    );
  }
  if (bankM === undefined && !isConduit) {
    labels.push({ targetY: Y(topM), fromX: Number.NaN, lines: [[{ text: DRAWING_WORDS.bankHeightNotGiven }]], className: 'label-note' });
  }
  for (const flowName of withoutNormalDepth) {
    labels.push({ targetY: plot.top + plot.height, fromX: Number.NaN, lines: [[{ text: `${truncateLabel(flowName, 18)}: ${DRAWING_WORDS.noNormalDepth}`, role: 'no-normal-depth-label', flow: flowName }]], className: 'label-note' });
  }

  // Lay out the label column.
  const labelX = plot.left + plot.width + 22;
  const heights = labels.map((label) => label.lines.length * LABEL_LINE_HEIGHT + 5);
  const labelsHeight = heights.reduce((sum, height) => sum + height, 0);
  const drawingHeight = Math.max(plot.top + plot.height + BOTTOM_MARGIN, plot.top + labelsHeight + 12);
  const placed = spreadLabels(
    labels.map((label) => label.targetY - LABEL_LINE_HEIGHT / 2),
    heights,
    4,
    drawingHeight - 4,
  );
  labels.forEach((label, index) => {
    const top = placed[index] ?? label.targetY;
    if (Number.isFinite(label.fromX)) {
      parts.push(`<path class="leader" d="M${px(label.fromX + 2)} ${px(label.targetY)} L${px(labelX - 4)} ${px(top + LABEL_LINE_HEIGHT / 2)}"/>`);
    }
    const lines = label.lines
      .map((line, lineIndex) => `<tspan x="${px(labelX)}" dy="${lineIndex === 0 ? '0' : LABEL_LINE_HEIGHT}">${line.map(renderSpan).join('')}</tspan>`)
      .join('');
    parts.push(`<text class="fig-label ${label.className}" x="${px(labelX)}" y="${px(top + LABEL_LINE_HEIGHT - 3)}">${lines}</text>`);
  });
  const scaleNote = exaggeration === 1 ? DRAWING_WORDS.equalScales : DRAWING_WORDS.verticalExaggeration(String(exaggeration));
  parts.push(`<text class="fig-note" data-role="scale-note" x="${px(plot.left + 4)}" y="${px(plot.top - 8)}">${escapeHtml(scaleNote)}</text>`);

  return (
    openSvg({
      id: options.id,
      kind: 'cross-section',
      width: DRAWING_WIDTH,
      height: drawingHeight,
      title,
      data: { 'vertical-exaggeration': exaggeration, 'length-unit': unit },
    }) +
    parts.join('') +
    '</svg>'
  );
}

/** A run of label text; a span with a role carries its flow and SI value for tests and tools. */
interface LabelSpan {
  readonly text: string;
  readonly role?: string;
  readonly flow?: string;
  readonly value?: number;
}

function renderSpan(span: LabelSpan): string {
  if (span.role === undefined) return escapeHtml(span.text);
  const flow = span.flow === undefined ? '' : ` data-flow="${escapeHtml(span.flow)}"`;
  const value = span.value === undefined ? '' : ` data-value="${span.value}"`;
  return `<tspan data-role="${span.role}"${flow}${value}>${escapeHtml(span.text)}</tspan>`;
}

function positiveOrUndefined(value: number | null): number | undefined {
  return value !== null && Number.isFinite(value) && value > 0 ? value : undefined;
}

/** How deep to draw a section with neither a bank height nor a flow: its own reference size. */
function referenceDrawingDepthM(reach: ReachResult): number {
  const dimensions = reach.section.dimensions;
  const candidates = [dimensions['atDepth_m'], dimensions['bottomWidth_m'] !== undefined ? dimensions['bottomWidth_m'] / 2 : undefined, 1];
  return candidates.find((value): value is number => value !== undefined && Number.isFinite(value) && value > 0) ?? 1;
}
