/**
 * Shared pieces of every drawing: linear scales, round-number ticks, axes with units, and SVG text helpers.
 * Drawings are SVG fragments inlined in the report's HTML (so no namespace URL is written); every element a test
 * needs carries a `data-role`, and ticks carry their value in `data-value`, so a test can read the scale back from
 * the drawing itself and check that geometry and labels agree.
 */
import { escapeHtml } from './escape.js';
import { formatPowerOfTen, POWER_OF_TEN_FROM } from '../analysis/format-quantity.js';

/** Where the plotting area lies inside the drawing, px (SVG user units). */
/** Options every drawing takes. */
export interface DrawingOptions {
  /** Unique id of the drawing in its document (used for its title and pattern ids). */
  readonly id: string;
  /** Design flow order, for consistent flow colours (see flow-colours.ts). */
  readonly flowOrder?: readonly string[];
}

export interface PlotArea {
  readonly left: number;
  readonly top: number;
  readonly width: number;
  readonly height: number;
}

/** A linear map from data values to px. */
export interface LinearScale {
  readonly domainMin: number;
  readonly domainMax: number;
  readonly rangeStart: number;
  readonly rangeEnd: number;
  map(value: number): number;
}

/** A linear scale; a degenerate or non-finite domain is widened to [0, 1] so nothing divides by zero. */
export function linearScale(domainMin: number, domainMax: number, rangeStart: number, rangeEnd: number): LinearScale {
  let low = domainMin;
  let high = domainMax;
  if (!Number.isFinite(low) || !Number.isFinite(high) || !(high > low)) {
    low = Number.isFinite(low) ? low : 0;
    high = low + 1;
  }
  const factor = (rangeEnd - rangeStart) / (high - low);
  return { domainMin: low, domainMax: high, rangeStart, rangeEnd, map: (value) => rangeStart + (value - low) * factor };
}

/** A round step (1, 2 or 5 times a power of ten) giving about `targetCount` intervals over `span`. */
export function niceStep(span: number, targetCount: number): number {
  if (!(span > 0) || !Number.isFinite(span)) return 1;
  const raw = span / Math.max(1, targetCount);
  const magnitude = 10 ** Math.floor(Math.log10(raw));
  const residual = raw / magnitude;
  const multiple = residual <= 1 ? 1 : residual <= 2 ? 2 : residual <= 5 ? 5 : 10;
  return multiple * magnitude;
}

/** The smallest multiple of a round step at or above `value` (for the top of an axis). */
export function niceCeiling(value: number, targetCount: number): number {
  if (!(value > 0) || !Number.isFinite(value)) return 1;
  const step = niceStep(value, targetCount);
  return Math.ceil(value / step - 1e-9) * step;
}

/** Tick values at multiples of a round step within [min, max], at most 40. */
export function niceTicks(min: number, max: number, targetCount: number): { readonly values: readonly number[]; readonly step: number } {
  if (!Number.isFinite(min) || !Number.isFinite(max) || !(max > min)) return { values: Number.isFinite(min) ? [min] : [], step: 1 };
  const step = niceStep(max - min, targetCount);
  const values: number[] = [];
  const decimals = tickDecimals(step);
  for (let multiple = Math.ceil(min / step - 1e-9); values.length < 40; multiple++) {
    const value = multiple * step;
    // Compared by difference: max plus a tolerance overflows to Infinity near the largest double (a reach 1e308 m long).
    if (!Number.isFinite(value) || value - max > step * 1e-9) break;
    values.push(Number(value.toFixed(decimals)));
  }
  return { values, step };
}

/** Decimals needed to print multiples of a round step exactly. */
export function tickDecimals(step: number): number {
  return Number.isFinite(step) && step > 0 ? Math.min(8, Math.max(0, -Math.floor(Math.log10(step) + 1e-9))) : 0;
}

/** A tick label: the value with the decimals its step needs; from 1e15 up in powers of ten, as formatNumber. */
export function formatTick(value: number, step: number): string {
  if (Math.abs(value) >= POWER_OF_TEN_FROM) return formatPowerOfTen(value, 3);
  const text = value.toFixed(tickDecimals(step));
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

/** A coordinate in px with at most two decimals; non-finite values (never expected) become 0, never "NaN". */
export function px(value: number): string {
  if (!Number.isFinite(value)) return '0';
  // A coordinate millions of pixels off the drawing only means "far beyond this edge": clamp it, so that enormous
  // inputs (a width of 1e308 m) can neither overflow to Infinity below nor write absurd numbers into the page.
  const clamped = Math.min(Math.max(value, -FARTHEST_COORDINATE_PX), FARTHEST_COORDINATE_PX);
  const rounded = Math.round(clamped * 100) / 100;
  return (Object.is(rounded, -0) ? 0 : rounded).toString();
}

/** The farthest any drawn coordinate is written from the origin, px (drawings are about 720 px wide). */
const FARTHEST_COORDINATE_PX = 1e6;

/** An SVG path through points ("M x y L x y ..."), optionally closed. */
export function pathThrough(points: readonly { readonly x: number; readonly y: number }[], close: boolean): string {
  if (points.length === 0) return '';
  const commands = points.map((point, index) => `${index === 0 ? 'M' : 'L'}${px(point.x)} ${px(point.y)}`);
  return close ? `${commands.join(' ')} Z` : commands.join(' ');
}

/** One axis to draw: its scale, ticks (data values) and the label with unit. */
export interface AxisSpec {
  readonly scale: LinearScale;
  readonly ticks: readonly number[];
  readonly step: number;
  readonly label: string;
}

/**
 * Axes along the bottom and left of the plotting area, with ticks, tick labels, light grid lines across the plot
 * and the axis labels. Ticks carry `data-role="x-tick"` / `"y-tick"` and their value in `data-value`.
 */
export function renderAxes(plot: PlotArea, x: AxisSpec, y: AxisSpec): string {
  const bottom = plot.top + plot.height;
  const right = plot.left + plot.width;
  const parts: string[] = ['<g class="fig-axes">'];
  for (const value of x.ticks) {
    const position = px(x.scale.map(value));
    parts.push(`<line class="fig-grid" x1="${position}" y1="${px(plot.top)}" x2="${position}" y2="${px(bottom)}"/>`);
    parts.push(`<line class="fig-tick" data-role="x-tick" data-value="${value}" x1="${position}" y1="${px(bottom)}" x2="${position}" y2="${px(bottom + 5)}"/>`);
    parts.push(`<text class="fig-tick-label" data-role="x-tick-label" data-value="${value}" x="${position}" y="${px(bottom + 17)}" text-anchor="middle">${formatTick(value, x.step)}</text>`);
  }
  for (const value of y.ticks) {
    const position = px(y.scale.map(value));
    parts.push(`<line class="fig-grid" x1="${px(plot.left)}" y1="${position}" x2="${px(right)}" y2="${position}"/>`);
    parts.push(`<line class="fig-tick" data-role="y-tick" data-value="${value}" x1="${px(plot.left - 5)}" y1="${position}" x2="${px(plot.left)}" y2="${position}"/>`);
    parts.push(`<text class="fig-tick-label" data-role="y-tick-label" data-value="${value}" x="${px(plot.left - 8)}" y="${position}" dy="0.32em" text-anchor="end">${formatTick(value, y.step)}</text>`);
  }
  parts.push(`<path class="fig-axis-line" d="M${px(plot.left)} ${px(plot.top)} V${px(bottom)} H${px(right)}"/>`);
  parts.push(`<text class="fig-axis-label" data-role="x-axis-label" x="${px(plot.left + plot.width / 2)}" y="${px(bottom + 36)}" text-anchor="middle">${escapeHtml(x.label)}</text>`);
  const yLabelX = plot.left - 50;
  const yLabelY = plot.top + plot.height / 2;
  parts.push(`<text class="fig-axis-label" data-role="y-axis-label" x="${px(yLabelX)}" y="${px(yLabelY)}" text-anchor="middle" transform="rotate(-90 ${px(yLabelX)} ${px(yLabelY)})">${escapeHtml(y.label)}</text>`);
  parts.push('</g>');
  return parts.join('');
}

/** Opens a drawing: an accessible, scalable SVG with a title, a figure kind and extra data attributes. */
export function openSvg(options: {
  readonly id: string;
  readonly kind: string;
  readonly width: number;
  readonly height: number;
  readonly title: string;
  readonly data?: Readonly<Record<string, string | number>>;
}): string {
  const data = Object.entries(options.data ?? {})
    .map(([key, value]) => ` data-${key}="${escapeHtml(String(value))}"`)
    .join('');
  const titleId = `${options.id}-title`;
  return (
    `<svg class="fig fig-${options.kind}" id="${escapeHtml(options.id)}" data-figure="${options.kind}"${data} ` +
    `viewBox="0 0 ${px(options.width)} ${px(options.height)}" width="${px(options.width)}" height="${px(options.height)}" ` +
    `role="img" aria-labelledby="${escapeHtml(titleId)}"><title id="${escapeHtml(titleId)}">${escapeHtml(options.title)}</title>`
  );
}

/** A small drawing that says why a figure could not be drawn (bad or missing dimensions, nothing to plot). */
export function renderNotDrawnSvg(options: { readonly id: string; readonly kind: string; readonly title: string; readonly reason: string }): string {
  return (
    openSvg({ id: options.id, kind: options.kind, width: 720, height: 60, title: options.title, data: { 'not-drawn': 'true' } }) +
    `<rect class="fig-frame" x="0.5" y="0.5" width="719" height="59"/>` +
    `<text class="fig-note" data-role="not-drawn-reason" x="16" y="34">${escapeHtml(`Not drawn: ${options.reason}.`)}</text></svg>`
  );
}

/** Places labels near their wanted y positions without overlap, keeping them inside [minY, maxY]. */
export function spreadLabels(wanted: readonly number[], heights: readonly number[], minY: number, maxY: number): number[] {
  const order = wanted.map((y, index) => ({ y, index })).sort((a, b) => a.y - b.y);
  const placed = new Array<number>(wanted.length).fill(0);
  let cursor = minY;
  for (const { y, index } of order) {
    const position = Math.max(y, cursor);
    placed[index] = position;
    cursor = position + (heights[index] ?? 0);
  }
  // Push the stack back up if it ran past the bottom.
  let limit = maxY;
  for (let rank = order.length - 1; rank >= 0; rank--) {
    const index = order[rank]!.index;
    const height = heights[index] ?? 0;
    if (placed[index]! + height > limit) placed[index] = limit - height;
    limit = placed[index]!;
  }
  return placed;
}
