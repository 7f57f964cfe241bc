/**
 * The longitudinal view of one channel: distance from its upstream end against elevation, with the bed, the bank
 * tops (or conduit crowns), and for each design flow its normal-depth line (solid) and critical-depth line
 * (dashed) over every reach, reach boundaries and names, and the outlet condition; over them the computed
 * water surface of each flow (ChannelResult.profiles, through profile-overlay.ts) with its hydraulic jumps.
 * Elevations come from the reach inverts where given; otherwise the bed is built from slopes and lengths and
 * plotted relative to the outlet invert, which the axis label says. The bed is placed by the same function the
 * profiles were computed on (language/analysis/channel-bed.ts), so the water surface stands on the drawn bed.
 */
import { channelBed } from '../analysis/channel-bed.js';
import type { ChannelResult, ReachResult } from '../analysis/model.js';
import type { UnitSystem } from '../units/units.js';
import { escapeHtml, truncateLabel } from './escape.js';
import { flowColourClass } from './flow-colours.js';
import { displayUnit, displayValue, formatElevation, formatSignificant } from './format.js';
import { drawnProfilesOf } from './profile-overlay.js';
import { DRAWING_WORDS } from './report-wording.js';
import { linearScale, niceTicks, openSvg, pathThrough, px, renderAxes, renderNotDrawnSvg, type DrawingOptions, type PlotArea } from './svg-scale.js';

export type LongitudinalOptions = DrawingOptions;

const DRAWING_WIDTH = 960;
const PLOT: PlotArea = { left: 78, top: 34, width: DRAWING_WIDTH - 78 - 40, height: 250 };
const LEGEND_TOP_GAP = 56;
const LEGEND_ROW_HEIGHT = 17;
/** Approximate width of one label character at the drawing's font size, px (for fitting reach names). */
const CHARACTER_WIDTH = 6.2;

/** Where a reach lies along the channel and its bed elevations, m. */
export interface ReachPlacement {
  readonly reach: ReachResult;
  readonly startStationM: number;
  readonly endStationM: number;
  readonly upstreamBedM: number;
  readonly downstreamBedM: number;
}

/**
 * Places every reach along the channel (channel-bed.ts): inverts given in the design are used as they are (a
 * difference at a junction is a drop); a reach given only a slope continues the bed of the reach below it. With no
 * invert anywhere the outlet invert is taken as zero and `datum` is 'relative-to-outlet'.
 */
export function placeReaches(channel: ChannelResult): { readonly placements: readonly ReachPlacement[]; readonly datum: 'absolute' | 'relative-to-outlet' } {
  const reaches = channel.reaches;
  const lengths = reaches.map((reach) => (Number.isFinite(reach.length_m) && reach.length_m > 0 ? reach.length_m : 0));
  const bed = channelBed(reaches);
  let stationM = 0;
  const placements = reaches.map((reach, index) => {
    const placement: ReachPlacement = {
      reach,
      startStationM: stationM,
      endStationM: stationM + (lengths[index] ?? 0),
      upstreamBedM: bed.upstreamInvertsM[index] ?? 0,
      downstreamBedM: bed.downstreamInvertsM[index] ?? 0,
    };
    stationM += lengths[index] ?? 0;
    return placement;
  });
  return { placements, datum: bed.datum };
}

/** Bed elevation at a station, m (linear within a reach; the first reach containing the station). */
export function bedElevationAtM(placements: readonly ReachPlacement[], stationM: number): number | undefined {
  for (const placement of placements) {
    if (stationM >= placement.startStationM && stationM <= placement.endStationM) {
      const length = placement.endStationM - placement.startStationM;
      const fraction = length > 0 ? (stationM - placement.startStationM) / length : 0;
      return placement.upstreamBedM + fraction * (placement.downstreamBedM - placement.upstreamBedM);
    }
  }
  return undefined;
}

/** The longitudinal view of a channel as an SVG fragment; see the module comment. */
export function renderLongitudinalSvg(channel: ChannelResult, system: UnitSystem, options: LongitudinalOptions): string {
  const title = `Longitudinal view of channel ${channel.name}`;
  const { placements, datum } = placeReaches(channel);
  const last = placements[placements.length - 1];
  const totalLengthM = last?.endStationM ?? 0;
  if (last === undefined || !(totalLengthM > 0)) {
    return renderNotDrawnSvg({ id: options.id, kind: 'longitudinal', title, reason: 'the channel has no reach with a length' });
  }
  const profiles = drawnProfilesOf(channel);

  // Flow names in order, with their colours.
  const flowNames: string[] = [];
  for (const placement of placements) for (const flow of placement.reach.flows) if (!flowNames.includes(flow.flow)) flowNames.push(flow.flow);
  for (const profile of profiles) if (!flowNames.includes(profile.flow)) flowNames.push(profile.flow);
  const colourOf = (flowName: string): string => flowColourClass(flowName, options.flowOrder, flowNames.indexOf(flowName));

  // Vertical extent: every bed, bank top and water line.
  const elevations: number[] = [];
  for (const placement of placements) {
    const tops = [bankOrCrownM(placement.reach), ...placement.reach.flows.flatMap((flow) => [flow.normal?.depth_m, flow.critical?.depth_m])].filter(isPositiveFinite);
    for (const bed of [placement.upstreamBedM, placement.downstreamBedM]) {
      elevations.push(bed);
      for (const top of tops) elevations.push(bed + top);
    }
  }
  for (const profile of profiles) for (const point of profile.points) elevations.push(point.waterSurface_m);
  if (channel.outlet?.kind === 'water-level' && datum === 'absolute' && Number.isFinite(channel.outlet.elevation_m)) elevations.push(channel.outlet.elevation_m);
  const finiteElevations = elevations.filter(Number.isFinite);
  let lowM = Math.min(...finiteElevations);
  let highM = Math.max(...finiteElevations);
  if (!(highM > lowM)) {
    lowM -= 0.5;
    highM += 0.5;
  }
  const paddingM = 0.08 * (highM - lowM);
  const toDisplayLength = (metres: number): number => displayValue(metres, 'length', system);
  const yTicks = niceTicks(toDisplayLength(lowM - paddingM), toDisplayLength(highM + paddingM), 6);
  const xTicks = niceTicks(0, toDisplayLength(totalLengthM), 8);
  const xScale = linearScale(0, toDisplayLength(totalLengthM), PLOT.left, PLOT.left + PLOT.width);
  const yScale = linearScale(toDisplayLength(lowM - paddingM), toDisplayLength(highM + paddingM), PLOT.top + PLOT.height, PLOT.top);
  const X = (stationM: number): number => xScale.map(toDisplayLength(stationM));
  const Y = (elevationM: number): number => yScale.map(toDisplayLength(elevationM));
  const exaggeration = (PLOT.height / (yScale.domainMax - yScale.domainMin)) / (PLOT.width / (xScale.domainMax - xScale.domainMin));

  const unit = displayUnit('length', system);
  const parts: string[] = [];
  parts.push(
    renderAxes(
      PLOT,
      { scale: xScale, ticks: xTicks.values, step: xTicks.step, label: `${DRAWING_WORDS.stationAxis} (${unit})` },
      { scale: yScale, ticks: yTicks.values, step: yTicks.step, label: `${datum === 'absolute' ? DRAWING_WORDS.elevationAxis : DRAWING_WORDS.relativeElevationAxis} (${unit})` },
    ),
  );

  // Reach boundaries and names above the plot.
  placements.forEach((placement, index) => {
    if (index > 0) {
      parts.push(`<line class="reach-boundary" data-role="reach-boundary" data-station-m="${placement.startStationM}" x1="${px(X(placement.startStationM))}" y1="${px(PLOT.top)}" x2="${px(X(placement.startStationM))}" y2="${px(PLOT.top + PLOT.height)}"/>`);
    }
    const widthPx = X(placement.endStationM) - X(placement.startStationM);
    const fitting = Math.floor((widthPx - 4) / CHARACTER_WIDTH);
    if (fitting >= 3) {
      parts.push(
        `<text class="fig-label reach-name" data-role="reach-name" x="${px((X(placement.startStationM) + X(placement.endStationM)) / 2)}" y="${px(PLOT.top - 10)}" text-anchor="middle">${escapeHtml(truncateLabel(placement.reach.name, fitting))}</text>`,
      );
    }
  });

  // Bed and bank tops: one path each, a segment per reach (a drop at a junction shows as a vertical step).
  const bedPoints = placements.flatMap((placement) => [
    { x: X(placement.startStationM), y: Y(placement.upstreamBedM) },
    { x: X(placement.endStationM), y: Y(placement.downstreamBedM) },
  ]);
  const lowestPx = PLOT.top + PLOT.height;
  parts.push(`<path class="bed-fill" d="${pathThrough([{ x: X(0), y: lowestPx }, ...bedPoints, { x: X(totalLengthM), y: lowestPx }], true)}"/>`);
  parts.push(`<path class="bed-line" data-role="bed" d="${pathThrough(bedPoints, false)}"/>`);
  parts.push(segmentsPath('bank-top-line', 'bank-top', '', placements, (placement) => bankOrCrownM(placement.reach), X, Y));

  // Normal and critical depth lines of each flow.
  for (const flowName of flowNames) {
    const colour = colourOf(flowName);
    const depthOf = (kind: 'normal' | 'critical') => (placement: ReachPlacement): number | undefined => {
      const flow = placement.reach.flows.find((candidate) => candidate.flow === flowName);
      const depth = kind === 'normal' ? flow?.normal?.depth_m : flow?.critical?.depth_m;
      return isPositiveFinite(depth) ? depth : undefined;
    };
    parts.push(segmentsPath(`critical-line ${colour}`, 'critical-depth-line', flowName, placements, depthOf('critical'), X, Y));
    parts.push(segmentsPath(`normal-line ${colour}`, 'normal-depth-line', flowName, placements, depthOf('normal'), X, Y));
  }

  // The computed water surface of each flow, and its jumps (their labels laid out clear of each other).
  const jumpLabels = new JumpLabelLayout();
  profiles.forEach((profile) => {
    const colour = colourOf(profile.flow);
    const points = profile.points.map((point) => ({ x: X(point.station_m), y: Y(point.waterSurface_m) }));
    if (points.length > 1) parts.push(`<path class="profile-line ${colour}" data-role="water-surface-profile" data-flow="${escapeHtml(profile.flow)}" d="${pathThrough(points, false)}"/>`);
    for (const jump of profile.jumps) {
      const bed = jump.invert_m;
      const x = X(jump.station_m);
      const yLow = Y(bed + jump.upstreamDepth_m);
      const yHigh = Y(bed + jump.downstreamDepth_m);
      const label = jumpLabels.place(x, yHigh);
      parts.push(
        `<g class="jump-mark ${colour}" data-role="hydraulic-jump" data-flow="${escapeHtml(profile.flow)}" data-station-m="${jump.station_m}" ` +
          `data-upstream-depth-m="${jump.upstreamDepth_m}" data-downstream-depth-m="${jump.downstreamDepth_m}">` +
          `<path d="M${px(x)} ${px(yLow)} L${px(x)} ${px(yHigh)} M${px(x - 4)} ${px(yHigh + 6)} L${px(x)} ${px(yHigh)} L${px(x + 4)} ${px(yHigh + 6)}"/>` +
          `<text class="fig-label" x="${px(label.x)}" y="${px(label.y)}"${label.anchor === 'end' ? ' text-anchor="end"' : ''}>${escapeHtml(DRAWING_WORDS.hydraulicJump)}</text></g>`,
      );
    }
  });

  // The outlet condition at the downstream end.
  const outletX = X(totalLengthM);
  const outlet = channel.outlet;
  let outletText: string | undefined;
  if (outlet?.kind === 'free-fall') {
    outletText = DRAWING_WORDS.outletFreeFall;
    parts.push(`<path class="outlet-mark" data-role="outlet-free-fall" d="M${px(outletX)} ${px(Y(last.downstreamBedM))} v18 m-4 -6 l4 6 l4 -6"/>`);
  } else if (outlet?.kind === 'normal-depth') {
    outletText = DRAWING_WORDS.outletNormalDepth;
  } else if (outlet?.kind === 'water-level') {
    outletText = DRAWING_WORDS.outletWaterLevel(formatElevation(outlet.elevation_m, system));
    if (datum === 'absolute' && Number.isFinite(outlet.elevation_m)) {
      const y = Y(outlet.elevation_m);
      parts.push(`<line class="outlet-level" data-role="outlet-water-level" data-elevation-m="${outlet.elevation_m}" x1="${px(outletX)}" y1="${px(y)}" x2="${px(outletX + 26)}" y2="${px(y)}"/>`);
    }
  }
  if (outletText !== undefined) {
    parts.push(`<text class="fig-note" data-role="outlet-label" x="${px(outletX - 6)}" y="${px(PLOT.top + 14)}" text-anchor="end">${escapeHtml(outletText)}</text>`);
  }
  const exaggerationText = formatSignificant(exaggeration, 2);
  parts.push(`<text class="fig-note" data-role="scale-note" x="${px(PLOT.left)}" y="${px(PLOT.top - 24)}">${escapeHtml(DRAWING_WORDS.verticalExaggeration(exaggerationText))}</text>`);

  // Legend: the fixed lines in the left column, one row per flow in the right column.
  const fixedRows: string[] = [
    `<path class="bed-line" d="M0 -4 H22"/><text class="fig-label" x="30" y="0">${escapeHtml(DRAWING_WORDS.bed)}</text>`,
    `<path class="bank-top-line" d="M0 -4 H22"/><text class="fig-label" x="30" y="0">${escapeHtml(DRAWING_WORDS.bankTopOrCrown)}</text>`,
    ...(profiles.some((profile) => profile.jumps.length > 0)
      ? [`<path class="jump-legend" d="M11 2 V-10 M7 -4 L11 -10 L15 -4"/><text class="fig-label" x="30" y="0">${escapeHtml(DRAWING_WORDS.hydraulicJump)}</text>`]
      : []),
  ];
  const profiledFlows = new Set(profiles.map((profile) => profile.flow));
  const flowRows = flowNames.map(
    (flowName) =>
      `<path class="normal-line ${colourOf(flowName)}" d="M0 -4 H22"/><text class="fig-label" x="30" y="0">${escapeHtml(`${truncateLabel(flowName, 18)}: ${DRAWING_WORDS.normalDepthLine}`)}</text>` +
      `<path class="critical-line ${colourOf(flowName)}" d="M210 -4 H232"/><text class="fig-label" x="240" y="0">${escapeHtml(DRAWING_WORDS.criticalDepthLine)}</text>` +
      (profiledFlows.has(flowName)
        ? `<path class="profile-line ${colourOf(flowName)}" d="M340 -4 H362"/><text class="fig-label" x="370" y="0">${escapeHtml(DRAWING_WORDS.computedWaterSurface)}</text>`
        : ''),
  );
  const legendTop = PLOT.top + PLOT.height + LEGEND_TOP_GAP;
  fixedRows.forEach((row, index) => {
    parts.push(`<g class="legend-row" transform="translate(${PLOT.left} ${legendTop + index * LEGEND_ROW_HEIGHT})">${row}</g>`);
  });
  flowRows.forEach((row, index) => {
    parts.push(`<g class="legend-row" data-role="legend-flow" transform="translate(${PLOT.left + 330} ${legendTop + index * LEGEND_ROW_HEIGHT})">${row}</g>`);
  });
  const height = legendTop + Math.max(fixedRows.length, flowRows.length) * LEGEND_ROW_HEIGHT;
  return (
    openSvg({
      id: options.id,
      kind: 'longitudinal',
      width: DRAWING_WIDTH,
      height,
      title,
      data: { 'vertical-exaggeration': exaggerationText, datum, 'length-unit': unit },
    }) +
    parts.join('') +
    '</svg>'
  );
}

/**
 * One path with a straight segment per reach at `height(reach)` above the bed; reaches without a value are left
 * out. `data-reach-indices` lists, in order, the reach of each "M ... L ..." segment.
 */
function segmentsPath(
  className: string,
  role: string,
  flowName: string,
  placements: readonly ReachPlacement[],
  height: (placement: ReachPlacement) => number | undefined,
  X: (stationM: number) => number,
  Y: (elevationM: number) => number,
): string {
  const segments: string[] = [];
  const indices: number[] = [];
  placements.forEach((placement, index) => {
    const value = height(placement);
    if (value === undefined) return;
    segments.push(`M${px(X(placement.startStationM))} ${px(Y(placement.upstreamBedM + value))} L${px(X(placement.endStationM))} ${px(Y(placement.downstreamBedM + value))}`);
    indices.push(index);
  });
  if (segments.length === 0) return '';
  const flowAttribute = flowName === '' ? '' : ` data-flow="${escapeHtml(flowName)}"`;
  return `<path class="${className}" data-role="${role}"${flowAttribute} data-reach-indices="${indices.join(' ')}" d="${segments.join(' ')}"/>`;
}

function bankOrCrownM(reach: ReachResult): number | undefined {
  const candidates = [reach.section.fullDepth_m, reach.section.bankDepth_m, reach.section.shape === 'circle' ? reach.section.dimensions['diameter_m'] : undefined];
  return candidates.find(isPositiveFinite);
}

function isPositiveFinite(value: number | null | undefined): value is number {
  return value !== null && value !== undefined && Number.isFinite(value) && value > 0;
}


/** Height of one line of label text, px (11 px type with its leading). */
const LABEL_LINE_PX = 13;

/**
 * Places the jumps' labels: beside the top of the jump (to its left where the text would run past the drawing's
 * right edge), moved up a line at a time, then down, until it is clear of every label already placed, so that the
 * jumps of several flows at nearly the same station stay readable. Widths are estimated from the character count.
 */
class JumpLabelLayout {
  private readonly placed: { readonly left: number; readonly right: number; readonly baseline: number }[] = [];
  private readonly widthPx = DRAWING_WORDS.hydraulicJump.length * CHARACTER_WIDTH * 1.1; // the label is bold

  place(x: number, yHigh: number): { readonly x: number; readonly y: number; readonly anchor: 'start' | 'end' } {
    const anchor = x + 6 + this.widthPx > DRAWING_WIDTH - 4 ? 'end' : 'start';
    const left = anchor === 'end' ? x - 6 - this.widthPx : x + 6;
    const right = left + this.widthPx;
    const clear = (baseline: number): boolean =>
      this.placed.every((label) => label.right <= left || right <= label.left || Math.abs(label.baseline - baseline) >= LABEL_LINE_PX);
    // Inside the plot whatever the numbers (a non-finite or far-off top would leave nothing to step through).
    const top = PLOT.top + LABEL_LINE_PX;
    const bottom = PLOT.top + PLOT.height;
    const first = Number.isFinite(yHigh) ? Math.min(Math.max(yHigh - 4, top), bottom) : top;
    const candidates: number[] = [];
    for (let baseline = first; baseline >= top; baseline -= LABEL_LINE_PX) candidates.push(baseline);
    for (let baseline = first + LABEL_LINE_PX; baseline <= bottom; baseline += LABEL_LINE_PX) candidates.push(baseline);
    const baseline = candidates.find(clear) ?? first;
    this.placed.push({ left, right, baseline });
    return { x: anchor === 'end' ? x - 6 : x + 6, y: baseline, anchor };
  }
}
