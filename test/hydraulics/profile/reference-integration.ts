/**
 * Independent references for the profile tests, written from the governing equations with no code shared with
 * language/hydraulics/profile: the gradually-varied-flow equation integrated accurately, and unit conversions
 * for the US-customary worked examples.
 *
 * dx/dy = (1 - alpha Q^2 T / (g A^3)) / (S0 - Sf(y)),  Sf = (Q n / (A R^(2/3)))^2   (Chow 1959, Ch. 9; SI, k = 1)
 *
 * integrated over depth by composite Simpson's rule, which is exact to rounding for the smooth integrands met
 * between a control and a depth short of normal depth.
 */
import { GRAVITY_MS2 } from '../../../language/hydraulics/constants.js';
import type { SectionGeometry } from '../../../language/hydraulics/sections/section-geometry.js';

export interface GvfChannel {
  readonly section: SectionGeometry;
  readonly manningN: number;
  readonly bedSlope: number;
  readonly dischargeM3s: number;
  readonly alpha?: number;
}

/** dx/dy of the gradually-varied-flow equation, m per m of depth (x positive downstream). */
export function distancePerDepth(channel: GvfChannel, depthM: number): number {
  const { section, manningN, bedSlope, dischargeM3s } = channel;
  const alpha = channel.alpha ?? 1;
  const area = section.areaM2(depthM);
  const radius = area / section.wettedPerimeterM(depthM);
  const frictionSlope = ((dischargeM3s * manningN) / (area * radius ** (2 / 3))) ** 2;
  const froudeSquared = (alpha * dischargeM3s * dischargeM3s * section.topWidthM(depthM)) / (GRAVITY_MS2 * area ** 3);
  return (1 - froudeSquared) / (bedSlope - frictionSlope);
}

/** Distance from the section of depth fromDepthM to that of toDepthM, m, positive downstream (Simpson, `intervals` even). */
export function gvfDistanceM(channel: GvfChannel, fromDepthM: number, toDepthM: number, intervals = 20_000): number {
  const h = (toDepthM - fromDepthM) / intervals;
  let sum = distancePerDepth(channel, fromDepthM) + distancePerDepth(channel, toDepthM);
  for (let i = 1; i < intervals; i++) sum += (i % 2 === 1 ? 4 : 2) * distancePerDepth(channel, fromDepthM + i * h);
  return (sum * h) / 3;
}

/** 1 ft in m (exact, international foot). */
export const FOOT_M = 0.3048;

/**
 * Manning's n to use in Runnel's SI equation (k = 1) so that it reproduces a US-customary example worked with
 * k = 1.49: Runnel's k in US units is (1/0.3048)^(1/3) = 1.4859, so n_SI = n (1/0.3048)^(1/3) / 1.49.
 */
export function nReproducingK149(manningN: number): number {
  return (manningN * (1 / FOOT_M) ** (1 / 3)) / 1.49;
}

/** Station (m) at which a profile's depth first equals targetDepthM, walking from its downstream end upstream; linear between points. */
export function stationOfDepthFromDownstream(points: readonly { stationM: number; depthM: number }[], targetDepthM: number): number | undefined {
  for (let i = points.length - 1; i > 0; i--) {
    const lower = points[i];
    const upper = points[i - 1];
    if (lower === undefined || upper === undefined) continue;
    if ((lower.depthM - targetDepthM) * (upper.depthM - targetDepthM) <= 0 && lower.depthM !== upper.depthM) {
      return lower.stationM + ((targetDepthM - lower.depthM) / (upper.depthM - lower.depthM)) * (upper.stationM - lower.stationM);
    }
  }
  return undefined;
}

/** Depth of a profile at a station, m, linear between points (the first match in flow order). */
export function depthAtStation(points: readonly { stationM: number; depthM: number }[], stationM: number): number | undefined {
  for (let i = 1; i < points.length; i++) {
    const upper = points[i - 1];
    const lower = points[i];
    if (upper === undefined || lower === undefined) continue;
    if (upper.stationM <= stationM && stationM <= lower.stationM && lower.stationM > upper.stationM) {
      return upper.depthM + ((stationM - upper.stationM) / (lower.stationM - upper.stationM)) * (lower.depthM - upper.depthM);
    }
  }
  return undefined;
}

/** Belanger's sequent-depth ratio for a rectangular channel, y2/y1 = (sqrt(1 + 8 Fr1^2) - 1) / 2. */
export function belangerRatio(froude: number): number {
  return (Math.sqrt(1 + 8 * froude * froude) - 1) / 2;
}

/** Critical depth of a rectangle, (q^2 / g)^(1/3) with q = Q / b (closed form). */
export function rectangleCriticalDepthM(dischargeM3s: number, widthM: number): number {
  const q = dischargeM3s / widthM;
  return Math.cbrt((q * q) / GRAVITY_MS2);
}

/**
 * Distance from the control (depth fromDepthM) to any depth between it and toDepthM, m, positive downstream:
 * a table of the accurate integration on a fine, even grid of depths (Simpson on each pair of intervals,
 * trapezoid-corrected between), read by linear interpolation.
 */
export function gvfDistanceTable(channel: GvfChannel, fromDepthM: number, toDepthM: number, intervals = 20_000): (depthM: number) => number {
  const h = (toDepthM - fromDepthM) / intervals;
  const distances = new Float64Array(intervals + 1);
  let previousRate = distancePerDepth(channel, fromDepthM);
  for (let i = 1; i <= intervals; i++) {
    // Simpson's rule on each interval with its midpoint.
    const middleRate = distancePerDepth(channel, fromDepthM + (i - 0.5) * h);
    const rate = distancePerDepth(channel, fromDepthM + i * h);
    distances[i] = (distances[i - 1] ?? 0) + (h / 6) * (previousRate + 4 * middleRate + rate);
    previousRate = rate;
  }
  return (depthM: number): number => {
    const position = Math.min(Math.max((depthM - fromDepthM) / h, 0), intervals);
    const index = Math.min(Math.floor(position), intervals - 1);
    const fraction = position - index;
    return (distances[index] ?? 0) * (1 - fraction) + (distances[index + 1] ?? 0) * fraction;
  };
}
