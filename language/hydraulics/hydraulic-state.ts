/**
 * Everything about a flow at one depth in one section, in SI: the geometry and the energy and momentum quantities.
 * Used for normal depth, critical depth and any profile depth alike, so every view shows the same numbers.
 */
import { froudeNumber, specificEnergyM, specificForceM3 } from './critical-flow.js';
import type { SectionGeometry } from './sections/section-geometry.js';

export interface HydraulicState {
  readonly depthM: number;
  readonly areaM2: number;
  readonly wettedPerimeterM: number;
  readonly topWidthM: number;
  readonly hydraulicRadiusM: number;
  /** A / T, m. */
  readonly hydraulicDepthM: number;
  readonly velocityMs: number;
  readonly froudeNumber: number;
  /** y + V^2 / 2g, m. */
  readonly specificEnergyM: number;
  /** Q^2 / (g A) + A ybar, m3. */
  readonly specificForceM3: number;
}

/**
 * The hydraulic state of discharge Q (m3/s, > 0) at depth y (m, > 0; for a conduit at most its full depth, where
 * T = 0 makes the hydraulic depth infinite and the Froude number 0: no free surface).
 */
export function hydraulicStateAt(section: SectionGeometry, depthM: number, dischargeM3s: number): HydraulicState {
  const areaM2 = section.areaM2(depthM);
  const wettedPerimeterM = section.wettedPerimeterM(depthM);
  const topWidthM = section.topWidthM(depthM);
  return {
    depthM,
    areaM2,
    wettedPerimeterM,
    topWidthM,
    hydraulicRadiusM: areaM2 / wettedPerimeterM,
    hydraulicDepthM: areaM2 / topWidthM,
    velocityMs: dischargeM3s / areaM2,
    froudeNumber: froudeNumber(section, depthM, dischargeM3s),
    specificEnergyM: specificEnergyM(section, depthM, dischargeM3s),
    specificForceM3: specificForceM3(section, depthM, dischargeM3s),
  };
}
