/**
 * Trapezoidal open channel with independent side slopes: bottom width b (m), left side zL and right side zR
 * horizontal per 1 vertical. A = b y + (zL + zR) y^2 / 2, P = b + y (sqrt(1 + zL^2) + sqrt(1 + zR^2)),
 * T = b + (zL + zR) y (Chow 1959, Table 2-1, generalised to unequal sides).
 */
import type { SectionGeometry } from './section-geometry.js';

export interface TrapezoidDimensions {
  readonly bottomWidthM: number;
  readonly leftSideSlopeHV: number;
  readonly rightSideSlopeHV: number;
}

export function trapezoidSection(dimensions: TrapezoidDimensions): SectionGeometry {
  const { bottomWidthM, leftSideSlopeHV, rightSideSlopeHV } = dimensions;
  const sideSlopeSum = leftSideSlopeHV + rightSideSlopeHV;
  const sideLengthPerDepth = Math.hypot(1, leftSideSlopeHV) + Math.hypot(1, rightSideSlopeHV);
  return {
    shape: 'trapezoid',
    description: `trapezoid, bottom ${Number(bottomWidthM.toPrecision(4))} m, sides ${leftSideSlopeHV}:1 and ${rightSideSlopeHV}:1 (H:V)`,
    fullDepthM: undefined,
    areaM2: (y) => y * (bottomWidthM + (sideSlopeSum * y) / 2),
    wettedPerimeterM: (y) => bottomWidthM + sideLengthPerDepth * y,
    topWidthM: (y) => bottomWidthM + sideSlopeSum * y,
    // Rectangle part b y^2/2 plus the two side triangles, each z y^2/2 with centroid y/3 below the surface.
    firstMomentM3: (y) => (bottomWidthM * y * y) / 2 + (sideSlopeSum * y * y * y) / 6,
    wettedPerimeterSlope: () => sideLengthPerDepth,
    topWidthSlope: () => sideSlopeSum,
  };
}
