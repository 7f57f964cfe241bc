/**
 * Boundary shear stress in uniform flow, Pa: average tau = gamma R S over the wetted perimeter, and the maximum on
 * the bed tau_d = gamma y S at the deepest point (FHWA HEC-15, 3rd ed., 2005, Eq. 3.1). gamma = 9,810 N/m3.
 */
import { UNIT_WEIGHT_OF_WATER_NM3 } from './constants.js';

export interface BoundaryShear {
  /** gamma R S, Pa. */
  readonly averagePa: number;
  /** gamma y S at the deepest point of the bed, Pa. */
  readonly maximumPa: number;
}

/**
 * Average and maximum boundary shear, Pa, for a depth y (m, the deepest point of the section), hydraulic radius R (m)
 * and slope S (m/m; the bed slope in uniform flow, or the friction slope in varied flow). Plain formulas: no
 * side-slope factor (HEC-15's K1 for shear on the banks belongs to the lining check).
 */
export function boundaryShear(depthM: number, hydraulicRadiusM: number, bedSlope: number): BoundaryShear {
  return {
    averagePa: UNIT_WEIGHT_OF_WATER_NM3 * hydraulicRadiusM * bedSlope,
    maximumPa: UNIT_WEIGHT_OF_WATER_NM3 * depthM * bedSlope,
  };
}
